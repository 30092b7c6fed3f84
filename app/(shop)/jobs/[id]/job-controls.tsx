"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";

import { Field, FormAlert, buttonClass, inputClass, str, useApiForm } from "@/components/form";
import { JobPlanFields } from "@/components/job-fields";
import { type MoveRefusal, refusalOf, sendMove } from "@/components/move-job";
import { RefusalNote } from "@/components/refusal-note";
import type { JobScope, Role, Stage } from "@/db/schema";
import { STAGE_LABELS, stagesFor } from "@/server/jobs/stages";
import type { JobDetail } from "@/server/jobs/queries";

export function MoveControl({ job, role }: { job: { id: number; stage: Stage; version: number; scope: JobScope }; role: Role }) {
  const router = useRouter();
  const route = stagesFor(job.scope);
  const [to, setTo] = useState<Stage>(route[Math.min(route.indexOf(job.stage) + 1, route.length - 1)]);
  const [note, setNote] = useState("");
  const [refusal, setRefusal] = useState<MoveRefusal | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  async function go(override?: string) {
    setPending(true);
    setRefusal(null);
    setDone(null);
    try {
      await sendMove(job.id, { toStage: to, version: job.version, note: note || undefined, override: override ? { reason: override } : undefined });
      setDone(`Moved to ${STAGE_LABELS[to]}.`);
      setNote("");
      // The form offers the step after the one just reached, as it did on opening the page.
      setTo(route[Math.min(route.indexOf(to) + 1, route.length - 1)]);
      router.refresh();
    } catch (err) {
      const r = refusalOf(err, to);
      setRefusal({ ...r, canOverride: r.canOverride && role === "owner" });
      if (r.kind === "stale") router.refresh();
    } finally {
      setPending(false);
    }
  }

  return (
    <div className="space-y-3">
      <p>
        Now in <strong>{STAGE_LABELS[job.stage]}</strong>.
      </p>
      <label className="block text-sm font-semibold">
        Move to
        <select value={to} onChange={(e) => setTo(e.target.value as Stage)} className={`${inputClass} mt-1`}>
          {route.map((s) => (
            <option key={s} value={s} disabled={s === job.stage}>
              {STAGE_LABELS[s]}
              {route.indexOf(s) < route.indexOf(job.stage) ? " (back)" : ""}
            </option>
          ))}
        </select>
      </label>
      <label className="block text-sm font-semibold">
        Note (optional)
        <input value={note} onChange={(e) => setNote(e.target.value)} maxLength={1000} className={`${inputClass} mt-1`} placeholder="What happened" />
      </label>
      <button type="button" className={`${buttonClass.primary} w-full`} disabled={pending || to === job.stage} onClick={() => go()}>
        {pending ? "Moving…" : `Move to ${STAGE_LABELS[to]}`}
      </button>
      {done && <p role="status" className="rounded-md bg-ok-100 px-3 py-2 text-sm font-medium text-ok-700">✓ {done}</p>}
      {refusal && <RefusalNote refusal={refusal} onOverride={(reason) => go(reason)} jobHref="" />}
    </div>
  );
}

export function JobEditor({ job, techs, role }: { job: JobDetail; techs: { id: string; name: string; role: Role }[]; role: Role }) {
  const router = useRouter();
  const [saved, setSaved] = useState(false);
  const [stale, setStale] = useState(false);
  const techOnly = role === "tech";
  const form = useApiForm(
    (v) => ({
      path: `/api/jobs/${job.id}`,
      method: "PATCH",
      body: techOnly
        ? { version: job.version, notes: str(v.notes) }
        : {
            version: job.version,
            description: str(v.description),
            scope: str(v.scope),
            dueOn: str(v.dueOn) || null,
            assignedTechId: str(v.assignedTechId) || null,
            priority: str(v.priority),
            notes: str(v.notes),
          },
    }),
    () => {
      setSaved(true);
      setStale(false);
      router.refresh();
    },
  );
  const isStale = form.failure?.code === "stale";
  return (
    <form onSubmit={form.onSubmit} className="space-y-3" noValidate key={job.version}>
      <FormAlert failure={form.failure} />
      {(isStale || stale) && (
        <button type="button" className={buttonClass.secondary} onClick={() => { setStale(false); router.refresh(); }}>
          Load the current job
        </button>
      )}
      {!techOnly && (
        <>
          <Field label="Work description" name="description" errors={form.fields.description}>{(p) => <textarea {...p} rows={2} defaultValue={job.description} className={inputClass} />}</Field>
          <JobPlanFields fields={form.fields} techs={techs} initial={job} />
        </>
      )}
      <Field label="Notes (staff only, never shown to the customer)" name="notes" errors={form.fields.notes}>{(p) => <textarea {...p} rows={4} defaultValue={job.notes} className={inputClass} />}</Field>
      <button type="submit" className={buttonClass.primary} disabled={form.pending}>{form.pending ? "Saving…" : "Save"}</button>
      {saved && !form.failure && <p role="status" className="text-sm font-medium text-ok-700">✓ Saved.</p>}
    </form>
  );
}

