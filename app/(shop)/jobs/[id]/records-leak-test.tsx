"use client";

import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { Field, FormAlert, buttonClass, inputClass, num, str, useApiForm } from "@/components/form";
import { IconCheck, IconStop, IconWarn } from "@/components/icons";
import { type MoveRefusal, refusalOf, sendMove } from "@/components/move-job";
import { RefusalNote } from "@/components/refusal-note";
import type { Stage } from "@/db/schema";
import type { PartShape } from "@/db/tables/records";
import { stageIndex } from "@/server/jobs/stages";
import {
  ASME_GAUGE_FULL_SCALE_RATIO,
  ASME_MIN_HOLD_MINUTES,
  type LeakTestResult,
  type LeakTestWarning,
  SEA_LEVEL_PSIA,
  UL142_TEST_PRESSURE_PSIG,
  pneumaticTestCautions,
} from "@/server/records/leak-test";
import type { LeakTestMethod } from "@/server/records/schemas";

export interface LeakTestJob {
  id: number;
  stage: Stage;
  version: number;
  workOrder: string;
}

export interface LeakTestPart {
  id: number;
  name: string;
  kind: string;
  shape: PartShape;
}

interface LeakTestAnswer {
  correctedDropPsi: number;
  result: LeakTestResult;
  warnings: LeakTestWarning[];
  test: { rawDropPsi: number; allowedDropPsi: number; holdMinutes: number; seams: { location: string; result: "pass" | "leak" }[] };
}

type SeamRow = { key: number; location: string; result: "" | "pass" | "leak" };

const METHODS: { value: LeakTestMethod; label: string; hint: string }[] = [
  { value: "both", label: "Soap and pressure decay", hint: "Bubbles on every seam, and the gauge over the hold." },
  { value: "soap", label: "Soap solution only", hint: "Bubbles on every seam." },
  { value: "decay", label: "Pressure decay only", hint: "The gauge over the hold." },
];

// Where a fabricated reservoir usually leaks, offered as rows to check; each still needs its own pass or leak.
const RESERVOIR_SEAMS = ["Sump to shell", "Fill neck", "Suction port", "Return port", "End caps"];

const fmt = (psi: number, digits = 3) => Number(psi.toFixed(digits)).toString();

function bandHint(shape: PartShape) {
  if (shape === "round" || shape === "box") {
    const band = UL142_TEST_PRESSURE_PSIG[shape];
    return `Usual for ${band.tank}: ${band.min}–${band.max} psig (UL 142 §42.2.1).`;
  }
  return "No published band for this shape: use the lowest pressure that finds a leak.";
}

export function LeakTestForm({
  job,
  part,
  allowedDropPsi,
  today,
  tester,
  lastGauge,
  onClose,
}: {
  job: LeakTestJob;
  part: LeakTestPart;
  allowedDropPsi: number;
  today: string;
  tester: string;
  lastGauge: { fullScalePsi: number; calibratedOn: string } | null;
  onClose: () => void;
}) {
  const router = useRouter();
  const formId = useId();
  const [method, setMethod] = useState<LeakTestMethod>(part.shape === "box" ? "soap" : "both");
  const [testPressure, setTestPressure] = useState("");
  const [seams, setSeams] = useState<SeamRow[]>(() =>
    (part.kind === "reservoir" ? RESERVOIR_SEAMS : [""]).map((location, key) => ({ key, location, result: "" as const })),
  );
  const [answer, setAnswer] = useState<LeakTestAnswer | null>(null);
  // Which seam row each sent seam came from, so the server's "seams.2.result" lands beside the right row.
  const [sentRows, setSentRows] = useState<number[]>([]);

  const usesSoap = method !== "decay";
  const form = useApiForm<LeakTestAnswer>(
    (v) => {
      const rows = seams.filter((s) => s.location.trim() !== "" || s.result !== "");
      const sent = usesSoap ? rows : rows.filter((s) => s.result !== "");
      setSentRows(sent.map((s) => s.key));
      return {
        path: `/api/parts/${part.id}/leak-tests`,
        body: {
          jobId: job.id,
          method,
          testPressurePsig: num(v.testPressurePsig),
          gaugeFullScalePsi: num(v.gaugeFullScalePsi),
          gaugeCalibratedOn: str(v.gaugeCalibratedOn),
          holdMinutes: num(v.holdMinutes),
          startPressurePsig: num(v.startPressurePsig),
          endPressurePsig: num(v.endPressurePsig),
          startTempF: num(v.startTempF),
          endTempF: num(v.endTempF),
          barometricPsia: num(v.barometricPsia),
          seams: sent.map((s) => ({ location: s.location, result: s.result === "" ? undefined : s.result })),
          tester: str(v.tester),
        },
      };
    },
    (result) => {
      setAnswer(result);
      router.refresh();
    },
  );

  const seamErrors = (key: number, field: "location" | "result") => {
    const index = sentRows.indexOf(key);
    return index < 0 ? undefined : form.fields[`seams.${index}.${field}`];
  };
  const pressure = Number(testPressure);
  const gaugeHint =
    testPressure !== "" && Number.isFinite(pressure) && pressure > 0
      ? `For ${fmt(pressure)} psig: a gauge of ${fmt(ASME_GAUGE_FULL_SCALE_RATIO.min * pressure)}–${fmt(ASME_GAUGE_FULL_SCALE_RATIO.max * pressure)} psi full scale, about ${fmt(2 * pressure)} (ASME BPVC Section V, Article 10).`
      : "About twice the test pressure; never under 1.5× nor over 4× (ASME BPVC Section V, Article 10).";

  if (answer) return <LeakTestOutcome job={job} part={part} answer={answer} onAgain={() => setAnswer(null)} onClose={onClose} />;

  const numberInput = (p: object, extra: Record<string, unknown> = {}) => <input {...p} type="text" inputMode="decimal" autoComplete="off" className={inputClass} {...extra} />;

  return (
    <form onSubmit={form.onSubmit} noValidate className="space-y-4" aria-label={`Leak test of ${part.name}`}>
      <aside aria-label="Pneumatic test cautions" className="rounded-md border-2 border-warn-700/50 bg-warn-100 p-3 text-sm text-ink">
        <p className="flex items-center gap-2 font-bold text-warn-700">
          <IconWarn /> Before you pressurise the tank
        </p>
        <ul className="mt-1 list-disc space-y-0.5 pl-5">
          {pneumaticTestCautions.map((c) => (
            <li key={c.key}>{c.text}</li>
          ))}
        </ul>
      </aside>

      <FormAlert failure={form.failure} />

      <fieldset className="space-y-2">
        <legend className="text-sm font-semibold">Method</legend>
        <div className="grid gap-2 sm:grid-cols-3">
          {METHODS.map((m) => (
            <label key={m.value} className={`flex min-h-11 cursor-pointer items-start gap-2 rounded-md border p-2 ${method === m.value ? "border-bay-700 bg-bay-50" : "border-line"}`}>
              <input type="radio" name={`${formId}-method`} value={m.value} checked={method === m.value} onChange={() => setMethod(m.value)} className="mt-1 h-5 w-5 accent-bay-700" />
              <span>
                <span className="block font-semibold">{m.label}</span>
                <span className="block text-sm text-ink-soft">{m.hint}</span>
              </span>
            </label>
          ))}
        </div>
        {form.fields.method && <p className="text-sm font-medium text-stop-700">⚠ {form.fields.method.join(" ")}</p>}
        {part.shape === "box" && method !== "soap" && (
          <p className="flex gap-2 text-sm font-medium text-warn-700">
            <IconWarn /> A box tank&apos;s flat walls flex, so pressure decay cannot be trusted on it: check every seam with soap.
          </p>
        )}
      </fieldset>

      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Test pressure (psig)" name="testPressurePsig" errors={form.fields.testPressurePsig} hint={bandHint(part.shape)}>
          {(p) => numberInput(p, { value: testPressure, onChange: (e: React.ChangeEvent<HTMLInputElement>) => setTestPressure(e.target.value) })}
        </Field>
        <Field label="Hold (minutes)" name="holdMinutes" errors={form.fields.holdMinutes} hint={`At least ${ASME_MIN_HOLD_MINUTES} min before examining (ASME BPVC Section V, Article 10).`}>
          {(p) => numberInput(p)}
        </Field>
        <Field label="Gauge full scale (psi)" name="gaugeFullScalePsi" errors={form.fields.gaugeFullScalePsi} hint={gaugeHint}>
          {(p) => numberInput(p, { defaultValue: lastGauge ? String(lastGauge.fullScalePsi) : "" })}
        </Field>
        <Field label="Gauge last calibrated" name="gaugeCalibratedOn" errors={form.fields.gaugeCalibratedOn} hint="The date on the gauge's calibration tag.">
          {(p) => <input {...p} type="date" max={today} defaultValue={lastGauge?.calibratedOn ?? ""} className={inputClass} />}
        </Field>
      </div>

      <fieldset className="space-y-3 rounded-md border border-line p-3">
        <legend className="px-1 text-sm font-semibold">Readings at the start and end of the hold</legend>
        {(
          [
            ["Gauge pressure (psig)", "pressure (psig)", "startPressurePsig", "endPressurePsig"],
            ["Temperature (°F), air or tank shell, same spot both times", "temperature (°F)", "startTempF", "endTempF"],
          ] as const
        ).map(([heading, spoken, start, end]) => (
          <div key={start}>
            <p className="text-sm font-semibold text-ink-soft">{heading}</p>
            <div className="grid grid-cols-2 gap-3">
              <Reading label="Start" spoken={spoken} name={start} errors={form.fields[start]} />
              <Reading label="End" spoken={spoken} name={end} errors={form.fields[end]} />
            </div>
          </div>
        ))}
        <Field label="Barometric pressure (psia)" name="barometricPsia" errors={form.fields.barometricPsia} hint={`${SEA_LEVEL_PSIA} psia at sea level; lower at a high-altitude shop.`}>
          {(p) => numberInput(p, { defaultValue: String(SEA_LEVEL_PSIA) })}
        </Field>
        <p className="text-sm text-ink-soft">
          The server corrects the end pressure to the start temperature (ideal gas law, absolute units) and compares the drop with the shop&apos;s allowed {fmt(allowedDropPsi)} psi.
        </p>
      </fieldset>

      <fieldset className="space-y-2 rounded-md border border-line p-3">
        <legend className="px-1 text-sm font-semibold">Soap check, seam by seam{usesSoap ? "" : " (optional with pressure decay)"}</legend>
        {form.fields.seams && <p className="text-sm font-medium text-stop-700">⚠ {form.fields.seams.join(" ")}</p>}
        <ul className="space-y-2">
          {seams.map((seam, i) => {
            const locationErrors = seamErrors(seam.key, "location");
            const resultErrors = seamErrors(seam.key, "result");
            const update = (change: Partial<SeamRow>) => setSeams((rows) => rows.map((r) => (r.key === seam.key ? { ...r, ...change } : r)));
            return (
              <li key={seam.key} className="rounded-md border border-line p-2">
                <div className="flex flex-wrap items-end gap-2">
                  <label className="min-w-0 flex-1 text-sm font-semibold">
                    Seam {i + 1}
                    <input value={seam.location} onChange={(e) => update({ location: e.target.value })} aria-invalid={Boolean(locationErrors)} placeholder="Where on the tank" className={`${inputClass} mt-1`} />
                  </label>
                  <button
                    type="button"
                    className="grid h-11 w-11 place-items-center rounded-md border border-line text-xl text-ink-soft hover:bg-bay-50"
                    onClick={() => setSeams((rows) => rows.filter((r) => r.key !== seam.key))}
                    aria-label={`Remove seam ${i + 1}`}
                    title="Remove this seam"
                  >
                    <span aria-hidden="true">×</span>
                  </button>
                </div>
                <div className="mt-2">
                  <div role="radiogroup" aria-label={`Seam ${i + 1} result`} className="grid grid-cols-2 gap-2 sm:flex">
                    {(["pass", "leak"] as const).map((r) => (
                      <label key={r} className={`flex min-h-11 min-w-20 cursor-pointer items-center justify-center gap-1 rounded-md border px-2 font-semibold ${seam.result === r ? (r === "pass" ? "border-ok-700 bg-ok-100 text-ok-700" : "border-stop-700 bg-stop-100 text-stop-700") : "border-line"}`}>
                        <input type="radio" name={`${formId}-seam-${seam.key}`} checked={seam.result === r} onChange={() => update({ result: r })} className="sr-only" />
                        {r === "pass" ? <IconCheck /> : <IconStop />} {r === "pass" ? "No bubbles" : "Leak"}
                      </label>
                    ))}
                  </div>
                </div>
                {(locationErrors || resultErrors) && <p className="mt-1 text-sm font-medium text-stop-700">⚠ {[...(locationErrors ?? []), ...(resultErrors ?? [])].join(" ")}</p>}
              </li>
            );
          })}
        </ul>
        <button type="button" className={buttonClass.secondary} onClick={() => setSeams((rows) => [...rows, { key: Math.max(-1, ...rows.map((r) => r.key)) + 1, location: "", result: "" }])}>
          + Add a seam
        </button>
      </fieldset>

      <Field label="Tester" name="tester" errors={form.fields.tester}>{(p) => <input {...p} defaultValue={tester} autoComplete="name" className={inputClass} />}</Field>

      <div className="flex flex-wrap gap-2">
        <button type="submit" className={`${buttonClass.primary} flex-1 sm:flex-none`} disabled={form.pending}>
          {form.pending ? "Recording…" : "Record the test"}
        </button>
        <button type="button" className={buttonClass.secondary} onClick={onClose}>
          Cancel
        </button>
      </div>
    </form>
  );
}

/** A start or end reading: a short visible label, the full name for screen readers. */
function Reading({ label, spoken, name, errors }: { label: string; spoken: string; name: string; errors?: string[] }) {
  const id = useId();
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-sm font-semibold">
        {label}
        <span className="sr-only"> {spoken}</span>
      </label>
      <input id={id} name={name} type="text" inputMode="decimal" autoComplete="off" aria-invalid={Boolean(errors?.length)} aria-describedby={`${id}-msg`} className={inputClass} />
      <p id={`${id}-msg`} aria-live="polite" className="text-sm font-medium text-stop-700">
        {errors?.length ? `⚠ ${errors.join(" ")}` : ""}
      </p>
    </div>
  );
}

function LeakTestOutcome({ job, part, answer, onAgain, onClose }: { job: LeakTestJob; part: LeakTestPart; answer: LeakTestAnswer; onAgain: () => void; onClose: () => void }) {
  const router = useRouter();
  const [moved, setMoved] = useState(false);
  const [refusal, setRefusal] = useState<MoveRefusal | null>(null);
  const [pending, setPending] = useState(false);
  const pass = answer.result === "pass";
  const canSendBack = !pass && stageIndex(job.stage) > stageIndex("fabricate") && job.stage !== "delivered";
  const leaks = answer.test.seams.filter((s) => s.result === "leak").map((s) => s.location);

  async function sendBack() {
    setPending(true);
    setRefusal(null);
    try {
      const why = leaks.length ? `leak at ${leaks.join(", ")}` : `corrected drop ${fmt(answer.correctedDropPsi)} psi`;
      await sendMove(job.id, { toStage: "fabricate", version: job.version, note: `Leak test failed on ${part.name}: ${why}.` });
      setMoved(true);
      router.refresh();
    } catch (err) {
      setRefusal(refusalOf(err));
      router.refresh();
    } finally {
      setPending(false);
    }
  }

  return (
    <div role="status" aria-live="polite" className={`space-y-2 rounded-md border-2 p-3 ${pass ? "border-ok-700 bg-ok-100" : "border-stop-700 bg-stop-100"}`}>
      <p className={`flex items-center gap-2 text-xl font-bold ${pass ? "text-ok-700" : "text-stop-700"}`}>
        {pass ? <IconCheck className="h-6 w-6" /> : <IconStop className="h-6 w-6" />}
        {pass ? "Pass" : "Fail"} — {part.name}
      </p>
      <p className="text-ink">
        Corrected drop <strong>{fmt(answer.correctedDropPsi, 4)} psi</strong> over {fmt(answer.test.holdMinutes, 1)} min; the shop allows {fmt(answer.test.allowedDropPsi)} psi. The gauge itself fell {fmt(answer.test.rawDropPsi, 4)} psi before the temperature correction.
      </p>
      {leaks.length > 0 && <p className="font-semibold text-stop-700">Leak seen at: {leaks.join(", ")}.</p>}
      {answer.warnings.length > 0 && (
        <ul className="space-y-1">
          {answer.warnings.map((w) => (
            <li key={w.code} className="flex gap-2 rounded bg-warn-100 px-2 py-1 text-sm text-warn-700">
              <IconWarn className="mt-0.5 h-4 w-4 shrink-0" /> <span>{w.message}</span>
            </li>
          ))}
        </ul>
      )}
      {!pass && <p className="text-sm text-ink">Repair it, mark the part reworked, and record a new test: a failed tank cannot go out for coating.</p>}
      {canSendBack && !moved && (
        <button type="button" className={`${buttonClass.danger} w-full sm:w-auto`} disabled={pending} onClick={sendBack}>
          {pending ? "Moving…" : `Send ${job.workOrder} back to Fabricate`}
        </button>
      )}
      {moved && <p className="font-semibold text-ink">✓ {job.workOrder} is back in Fabricate.</p>}
      {refusal && <RefusalNote refusal={refusal} />}
      <div className="flex flex-wrap gap-2">
        <button type="button" className={buttonClass.secondary} onClick={onAgain}>
          Record another test
        </button>
        <button type="button" className={buttonClass.secondary} onClick={onClose}>
          Close
        </button>
      </div>
    </div>
  );
}
