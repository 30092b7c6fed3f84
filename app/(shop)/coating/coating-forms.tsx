"use client";

import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { Field, FormAlert, buttonClass, inputClass, num, str, useApiForm } from "@/components/form";
import { formatCents, parseDollars } from "@/components/money";
import { IconStop } from "@/components/icons";
import { collapseListErrors, fieldErrorSummary } from "@/server/records/form-errors";
import type { CoatingCandidate, VendorView } from "@/server/records/queries";
import type { RunJobMove, RunMoveOffer } from "@/server/records/run-moves";
import { stageIndex } from "@/server/jobs/stages";
import { MoveJobChoices, useRunOutcome } from "./run-moves";
import { GLOSS_LEVELS, glossLabels } from "@/server/records/labels";
import { addBusinessDaysTo } from "@/server/records/turnaround";

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

/** Sends parts from one or more jobs out to a coater on a new run. */
export function SendRunForm({ vendors, candidates, today }: { vendors: VendorView[]; candidates: CoatingCandidate[]; today: string }) {
  const router = useRouter();
  const [picked, setVendorId] = useState<string>(vendors[0] ? String(vendors[0].id) : "");
  // The list can grow under the form (the shop's first coater, added on this page): the choice is
  // always one on the list, the first when none was picked, never a blank the select does not show.
  const vendorId = vendors.some((v) => String(v.id) === picked) ? picked : vendors[0] ? String(vendors[0].id) : "";
  const [sentOn, setSentOn] = useState(today);
  const [promisedOn, setPromisedOn] = useState<string | null>(null);
  const [chosen, setChosen] = useState<number[]>([]);
  const [keepInPlace, setKeepInPlace] = useState<number[]>([]);
  const showOutcome = useRunOutcome();
  // Each run sent starts the next one blank: the last customer's color is not the next one's.
  const [runsSent, setRunsSent] = useState(0);
  const vendor = vendors.find((v) => String(v.id) === vendorId);
  // The promise follows the coater's usual turnaround until someone types the date they were actually given.
  const suggested = vendor && ISO_DATE.test(sentOn) ? addBusinessDaysTo(sentOn, vendor.usualTurnaroundDays) : "";
  const promised = promisedOn ?? suggested;

  // A job moves with the run when every part of it still waiting for coating goes out on it
  // (parts already back from a run since their last rework count as gone out).
  const movable = [...new Map(candidates.map((c) => [c.jobId, c])).values()].filter(
    (job) =>
      stageIndex(job.jobStage) < stageIndex("coating") &&
      candidates.some((c) => c.jobId === job.jobId && chosen.includes(c.id)) &&
      candidates.filter((c) => c.jobId === job.jobId && c.lastRunId === null).every((c) => chosen.includes(c.id)),
  );
  const moveJobIds = movable.map((j) => j.jobId).filter((id) => !keepInPlace.includes(id));

  const form = useApiForm<{ run: { id: number; vendorName: string; parts: unknown[] }; moves: RunJobMove[] }>(
    (v) => ({
      path: "/api/coating-runs",
      body: {
        vendorId: num(vendorId),
        finish: { colour: str(v.colour), gloss: str(v.gloss) || undefined },
        sentOn,
        promisedOn: promised,
        priceCents: parseDollars(str(v.price)),
        partIds: chosen,
        moveJobIds,
      },
    }),
    ({ run, moves }) => {
      showOutcome({ headline: `Run ${run.id} is out to ${run.vendorName} with ${run.parts.length} ${run.parts.length === 1 ? "part" : "parts"}.`, moves });
      setChosen([]);
      setKeepInPlace([]);
      setRunsSent((n) => n + 1);
      setPromisedOn(null);
      router.refresh();
    },
  );

  if (vendors.length === 0)
    return (
      <p className="text-ink-soft">
        Parts go out to a coater on the shop&apos;s list: <a href="#vendors" className="inline-flex min-h-11 items-center font-semibold text-bay-900 underline">add a coater first</a>.
      </p>
    );

  const partError = (partId: number) => {
    const index = chosen.indexOf(partId);
    return index < 0 ? undefined : form.fields[`partIds.${index}`];
  };
  const fresh = candidates.filter((c) => c.lastRunId === null);
  const recoats = candidates.filter((c) => c.lastRunId !== null);
  const groups = (parts: CoatingCandidate[]) => {
    const byJob = new Map<number, CoatingCandidate[]>();
    for (const c of parts) byJob.set(c.jobId, [...(byJob.get(c.jobId) ?? []), c]);
    return [...byJob.values()].map((jobParts) => (
      <div key={jobParts[0].jobId} className="rounded-md border border-line p-2">
        <p className="text-sm font-semibold">
          {jobParts[0].workOrder} · {jobParts[0].customerName} · unit {jobParts[0].unitNumber}
        </p>
        <ul>
          {jobParts.map((part) => {
            const blocked = part.needsLeakTest && !part.leakPassed;
            const errors = partError(part.id);
            return (
              <li key={part.id}>
                <label className={`flex min-h-11 items-center gap-3 ${blocked ? "cursor-not-allowed text-ink-soft" : "cursor-pointer"}`}>
                  <input
                    type="checkbox"
                    checked={chosen.includes(part.id)}
                    disabled={blocked}
                    onChange={(e) => setChosen((ids) => (e.target.checked ? [...ids, part.id] : ids.filter((id) => id !== part.id)))}
                    className="h-5 w-5 shrink-0 accent-bay-700"
                  />
                  <span>
                    {part.name}
                    {part.lastRunId !== null && <span className="block text-sm text-ink-soft">Coated on run {part.lastRunId}: sending it again recoats it.</span>}
                    {blocked && (
                      <span className="flex items-center gap-1 text-sm font-semibold text-stop-700">
                        <IconStop /> No passing leak test yet: test it before coating.
                      </span>
                    )}
                  </span>
                </label>
                {errors && <p className="ml-8 text-sm font-medium text-stop-700">⚠ {errors.join(" ")}</p>}
              </li>
            );
          })}
        </ul>
      </div>
    ));
  };

  return (
    <form key={runsSent} onSubmit={form.onSubmit} noValidate className="space-y-3" aria-label="Send parts out for coating">
      <FormAlert failure={form.failure} />
      <Field label="Coater" name="vendorId" errors={form.fields.vendorId}>
        {(p) => (
          <select {...p} value={vendorId} onChange={(e) => setVendorId(e.target.value)} className={inputClass}>
            {vendors.map((v) => (
              <option key={v.id} value={v.id}>
                {v.name} (usually {v.usualTurnaroundDays} business days)
              </option>
            ))}
          </select>
        )}
      </Field>
      <div className="grid grid-cols-2 gap-3">
        <Field label="Color" name="colour" errors={form.fields["finish.colour"]} hint="As the customer chose it; the gloss goes beside it.">
          {(p) => <input {...p} className={inputClass} placeholder="e.g. Black, Safety yellow" />}
        </Field>
        <Field label="Gloss" name="gloss" errors={form.fields["finish.gloss"]}>
          {(p) => (
            <select {...p} defaultValue="gloss" className={inputClass}>
              {GLOSS_LEVELS.map((g) => (
                <option key={g} value={g}>{glossLabels[g]}</option>
              ))}
            </select>
          )}
        </Field>
        <Field label="Sent on" name="sentOn" errors={form.fields.sentOn}>
          {(p) => <input {...p} type="date" max={today} value={sentOn} onChange={(e) => setSentOn(e.target.value)} className={inputClass} />}
        </Field>
        <Field label="Promised by" name="promisedOn" errors={form.fields.promisedOn} hint={promisedOn === null && suggested ? "The coater's usual turnaround; change it to the date they gave." : undefined}>
          {(p) => <input {...p} type="date" min={sentOn} value={promised} onChange={(e) => setPromisedOn(e.target.value)} className={inputClass} />}
        </Field>
        <Field label="Coater's price for the run ($, optional)" name="price" errors={form.fields.priceCents} hint="Leave empty until the coater prices it; job cost splits it over the parts.">
          {(p) => <input {...p} inputMode="decimal" autoComplete="off" placeholder="480.00" className={inputClass} />}
        </Field>
      </div>
      <fieldset className="space-y-2">
        <legend className="text-sm font-semibold">Parts going out ({chosen.length} chosen)</legend>
        {form.fields.partIds && <p className="text-sm font-medium text-stop-700">⚠ {form.fields.partIds.join(" ")}</p>}
        {fresh.length === 0 && <p className="text-ink-soft">No part is waiting for coating: parts marked for coating appear here until they go out.</p>}
        {groups(fresh)}
        {recoats.length > 0 && (
          <details open={recoats.some((c) => chosen.includes(c.id))}>
            <summary className="flex min-h-11 cursor-pointer items-center text-sm font-semibold text-bay-800">Send a coated part again, for a recoat ({recoats.length})</summary>
            <div className="space-y-2">{groups(recoats)}</div>
          </details>
        )}
      </fieldset>
      <MoveJobChoices
        jobs={movable.map((c) => ({ jobId: c.jobId, workOrder: c.workOrder, customerName: c.customerName, unitNumber: c.unitNumber }))}
        toStage="coating"
        skipped={keepInPlace}
        onToggle={(jobId, move) => setKeepInPlace((ids) => (move ? ids.filter((id) => id !== jobId) : [...ids, jobId]))}
      />
      <button type="submit" className={`${buttonClass.primary} w-full`} disabled={form.pending || chosen.length === 0}>
        {form.pending ? "Sending…" : chosen.length ? `Send ${chosen.length} ${chosen.length === 1 ? "part" : "parts"} out` : "Choose the parts to send"}
      </button>
    </form>
  );
}

/** Marks a run received: its parts are back in the shop. */
export function ReceiveForm({ runId, sentOn, today }: { runId: number; sentOn: string; today: string }) {
  const router = useRouter();
  const form = useApiForm(
    (v) => ({ path: `/api/coating-runs/${runId}`, method: "PATCH", body: { receivedOn: str(v.receivedOn) } }),
    () => router.refresh(),
  );
  return (
    <form onSubmit={form.onSubmit} noValidate className="flex flex-wrap items-end gap-2" aria-label={`Mark run ${runId} received`}>
      <div className="min-w-40">
        <Field label="Received on" name="receivedOn" errors={form.fields.receivedOn}>
          {(p) => <input {...p} type="date" min={sentOn} max={today} defaultValue={today} className={inputClass} />}
        </Field>
      </div>
      <button type="submit" className={`${buttonClass.primary} mb-6`} disabled={form.pending}>
        {form.pending ? "Saving…" : "Mark received"}
      </button>
      {form.failure && !form.fields.receivedOn && (
        <div className="w-full">
          <FormAlert failure={form.failure} />
        </div>
      )}
    </form>
  );
}

/** The office records or corrects what the coater charged for a run. */
export function RunPriceForm({ runId, priceCents }: { runId: number; priceCents: number | null }) {
  const router = useRouter();
  const [editing, setEditing] = useState(false);
  const form = useApiForm(
    (v) => ({ path: `/api/coating-runs/${runId}`, method: "PATCH", body: { priceCents: parseDollars(str(v.price)) ?? null } }),
    () => {
      setEditing(false);
      router.refresh();
    },
  );
  if (!editing) {
    return (
      <p className="flex flex-wrap items-center gap-2 text-sm">
        <span>
          <span className="font-semibold text-ink-soft">Coater&apos;s price: </span>
          <span data-run-price>{priceCents === null ? "not recorded" : formatCents(priceCents)}</span>
        </span>
        <button type="button" className={buttonClass.secondary} onClick={() => setEditing(true)} aria-label={`${priceCents === null ? "Record" : "Change"} the price of run ${runId}`}>
          {priceCents === null ? "Record the price" : "Change"}
        </button>
      </p>
    );
  }
  return (
    <form onSubmit={form.onSubmit} noValidate className="flex flex-wrap items-end gap-2" aria-label={`Price of run ${runId}`}>
      <div className="min-w-40">
        <Field label="Coater's price for the run ($)" name="price" errors={form.fields.priceCents} hint="Empty clears it.">
          {(p) => <input {...p} inputMode="decimal" autoComplete="off" defaultValue={priceCents === null ? "" : (priceCents / 100).toFixed(2)} className={inputClass} />}
        </Field>
      </div>
      <button type="submit" className={`${buttonClass.primary} mb-6`} disabled={form.pending}>
        {form.pending ? "Saving…" : "Save the price"}
      </button>
      <button type="button" className={`${buttonClass.secondary} mb-6`} onClick={() => setEditing(false)}>
        Cancel
      </button>
      {form.failure && !form.fields.priceCents && (
        <div className="w-full">
          <FormAlert failure={form.failure} />
        </div>
      )}
    </form>
  );
}

const INSPECTION_ORDER = ["inspection.dftReadingsMils", "inspection.adhesionOk", "inspection.defects"] as const;
const INSPECTION_NAMES: Record<string, string> = {
  "inspection.dftReadingsMils": "Film-thickness readings",
  "inspection.adhesionOk": "Adhesion check",
  "inspection.defects": "Defects",
};

/** The receiving inspection: film thickness in mils, adhesion, defects. */
export function InspectionForm({ runId, offers = [] }: { runId: number; offers?: RunMoveOffer[] }) {
  const router = useRouter();
  const id = useId();
  const [readings, setReadings] = useState("");
  const [keepInPlace, setKeepInPlace] = useState<number[]>([]);
  const showOutcome = useRunOutcome();
  const form = useApiForm<{ moves: RunJobMove[] }>(
    (v) => {
      const values = readings
        .split(/[\s,;]+/)
        .filter(Boolean)
        .map((r) => (Number.isFinite(Number(r)) ? Number(r) : r));
      return {
        path: `/api/coating-runs/${runId}`,
        method: "PATCH",
        body: {
          inspection: { dftReadingsMils: values, adhesionOk: v.adhesion === "ok" ? true : v.adhesion === "failed" ? false : undefined, defects: str(v.defects) },
          moveJobIds: offers.map((o) => o.jobId).filter((jobId) => !keepInPlace.includes(jobId)),
        },
      };
    },
    ({ moves }) => {
      showOutcome({ headline: `Receiving inspection of run ${runId} recorded.`, moves });
      router.refresh();
    },
  );
  const sent = readings.split(/[\s,;]+/).filter(Boolean);
  // Three readings in µm get one line naming all three, not the same message three times.
  const readingErrors = collapseListErrors(form.fields, "inspection.dftReadingsMils", { one: "Reading", many: "Readings" }, (i) => sent[i]);
  const alert =
    form.failure && Object.keys(form.fields).length
      ? { ...form.failure, message: `Not recorded. ${fieldErrorSummary(form.fields, INSPECTION_ORDER, (key) => INSPECTION_NAMES[key.split(".").slice(0, 2).join(".")] ?? null)}` }
      : form.failure;
  return (
    <form onSubmit={form.onSubmit} noValidate className="space-y-3" aria-label={`Receiving inspection of run ${runId}`}>
      <FormAlert failure={alert} />
      <Field
        label="Dry film thickness readings (mils)"
        name="dftReadings"
        errors={readingErrors.length ? readingErrors : undefined}
        hint="Separate readings with commas. Powder coat is commonly 2–3 mils; read with a magnetic or eddy-current gauge (ASTM D7091)."
      >
        {(p) => <input {...p} value={readings} onChange={(e) => setReadings(e.target.value)} inputMode="decimal" autoComplete="off" placeholder="2.4, 2.7, 3.0" className={inputClass} />}
      </Field>
      <fieldset>
        <legend className="text-sm font-semibold">Adhesion check</legend>
        <p className="mb-1 text-sm text-ink-soft">A failed check holds the parts out of Install until they are recoated or pass a recheck.</p>
        <div className="flex flex-wrap gap-2">
          {[
            ["ok", "Passed"],
            ["failed", "Failed"],
          ].map(([value, label]) => (
            <label key={value} className="flex min-h-11 cursor-pointer items-center gap-2 rounded-md border border-line px-3">
              <input type="radio" name="adhesion" value={value} id={`${id}-${value}`} className="h-5 w-5 accent-bay-700" />
              {label}
            </label>
          ))}
        </div>
        {form.fields["inspection.adhesionOk"] && <p className="text-sm font-medium text-stop-700">⚠ {form.fields["inspection.adhesionOk"].join(" ")}</p>}
      </fieldset>
      <Field
        label="Defects (runs, thin spots, damage), or leave empty"
        name="defects"
        errors={form.fields["inspection.defects"]}
        hint="Defects are noted on the record and do not hold the parts: recording a passing inspection accepts them. If one is not acceptable, send the part back for a recoat."
      >
        {(p) => <textarea {...p} rows={2} className={inputClass} />}
      </Field>
      <MoveJobChoices
        jobs={offers}
        toStage="install"
        skipped={keepInPlace}
        onToggle={(jobId, move) => setKeepInPlace((ids) => (move ? ids.filter((i) => i !== jobId) : [...ids, jobId]))}
      />
      <button type="submit" className={buttonClass.primary} disabled={form.pending}>
        {form.pending ? "Saving…" : "Record the inspection"}
      </button>
    </form>
  );
}

/** Adds a coater to the shop's list. */
export function VendorForm() {
  const router = useRouter();
  const [added, setAdded] = useState<string | null>(null);
  const form = useApiForm<{ vendor: VendorView }>(
    (v) => ({
      path: "/api/vendors",
      body: { name: str(v.name), contact: str(v.contact), phone: str(v.phone), email: str(v.email), usualTurnaroundDays: num(v.usualTurnaroundDays), notes: str(v.notes) },
    }),
    ({ vendor }) => {
      setAdded(vendor.name);
      router.refresh();
    },
  );
  return (
    <form onSubmit={form.onSubmit} noValidate className="space-y-3" aria-label="Add a coater" key={added ?? "new"}>
      <FormAlert failure={form.failure} />
      {added && <p role="status" className="rounded-md bg-ok-100 px-3 py-2 text-sm font-medium text-ok-700">✓ {added} added.</p>}
      <Field label="Coater" name="name" errors={form.fields.name}>{(p) => <input {...p} className={inputClass} />}</Field>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Contact" name="contact" errors={form.fields.contact}>{(p) => <input {...p} className={inputClass} />}</Field>
        <Field label="Phone" name="phone" errors={form.fields.phone}>{(p) => <input {...p} type="tel" className={inputClass} />}</Field>
        <Field label="E-mail" name="email" errors={form.fields.email}>{(p) => <input {...p} type="email" className={inputClass} />}</Field>
        <Field label="Usual turnaround (business days)" name="usualTurnaroundDays" errors={form.fields.usualTurnaroundDays}>
          {(p) => <input {...p} type="text" inputMode="numeric" className={inputClass} />}
        </Field>
      </div>
      <Field label="Notes" name="notes" errors={form.fields.notes}>{(p) => <textarea {...p} rows={2} className={inputClass} />}</Field>
      <button type="submit" className={buttonClass.secondary} disabled={form.pending}>
        {form.pending ? "Adding…" : "Add the coater"}
      </button>
    </form>
  );
}
