"use client";

import { useState } from "react";
import { pastDueWarning } from "@/server/jobs/due-date";
import { Field, inputClass } from "./form";

/**
 * The kind of work (`scope`), due date, assignment and priority of a job: the same fields when opening and editing one.
 * Given the shop's today, a due date already past is said under the field before saving (it still saves).
 */
export function JobPlanFields({ fields, techs, initial, today }: { fields: Record<string, string[]>; techs: { id: string; name: string }[]; initial?: { scope: string; dueOn: string | null; assignedTechId: string | null; priority: string }; today?: string }) {
  const [dueOn, setDueOn] = useState(initial?.dueOn ?? "");
  const dueWarning = today ? pastDueWarning(dueOn, today) : null;
  return (
    <>
      <Field label="Work" name="scope" errors={fields.scope}>
        {(p) => (
          <select {...p} defaultValue={initial?.scope ?? "fabrication"} className={inputClass}>
            <option value="fabrication">Fabricated parts: fabricate, pressure test, outside coating, install, wire</option>
            <option value="install_only">Install only: no fabricated parts (skips fabricate, pressure test, coating)</option>
          </select>
        )}
      </Field>
      <div className="grid gap-3 sm:grid-cols-3 lg:grid-cols-1">
        <Field label="Due" name="dueOn" errors={fields.dueOn} hint={dueWarning ?? undefined} hintTone={dueWarning ? "warn" : undefined}>
          {(p) => <input {...p} type="date" defaultValue={initial?.dueOn ?? ""} onChange={(e) => setDueOn(e.target.value)} className={inputClass} />}
        </Field>
        <Field label="Assigned to" name="assignedTechId" errors={fields.assignedTechId}>
          {(p) => (
            <select {...p} defaultValue={initial?.assignedTechId ?? ""} className={inputClass}>
              <option value="">Nobody yet</option>
              {techs.map((t) => (
                <option key={t.id} value={t.id}>{t.name}</option>
              ))}
            </select>
          )}
        </Field>
        <Field label="Priority" name="priority" errors={fields.priority}>
          {(p) => (
            <select {...p} defaultValue={initial?.priority ?? "normal"} className={inputClass}>
              <option value="normal">Normal</option>
              <option value="rush">Rush</option>
            </select>
          )}
        </Field>
      </div>
    </>
  );
}
