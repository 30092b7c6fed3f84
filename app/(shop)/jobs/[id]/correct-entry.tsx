"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { buttonClass, Field, FormActions, FormAlert, inputClass, str, useApiForm } from "@/components/form";

/** A datetime-local value (the browser's own clock) from an instant. */
function localValue(iso: string | null) {
  if (!iso) return "";
  const d = new Date(iso);
  const pad = (n: number) => String(n).padStart(2, "0");
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

const toInstant = (local: string) => (local ? new Date(local).toISOString() : "");

/** The office corrects a clock entry's times, with the reason kept beside it. */
export function CorrectEntry({ id, startedAt, endedAt }: { id: number; startedAt: string; endedAt: string | null }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const form = useApiForm(
    (v) => ({ path: `/api/clock-entries/${id}`, method: "PATCH", body: { startedAt: toInstant(str(v.startedAt)), endedAt: toInstant(str(v.endedAt)), reason: str(v.reason) } }),
    () => {
      setOpen(false);
      router.refresh();
    },
  );
  if (!open) return <button type="button" className={`${buttonClass.secondary} mt-1`} onClick={() => setOpen(true)}>Correct</button>;
  return (
    <form onSubmit={form.onSubmit} className="mt-1 grid gap-2 rounded-md bg-bay-50 p-2 sm:grid-cols-2" aria-label="Correct the clock entry">
      <div className="sm:col-span-2"><FormAlert failure={form.failure} /></div>
      <Field label="Started" name="startedAt" errors={form.fields.startedAt}>
        {(p) => <input {...p} type="datetime-local" defaultValue={localValue(startedAt)} className={inputClass} />}
      </Field>
      <Field label="Ended" name="endedAt" errors={form.fields.endedAt}>
        {(p) => <input {...p} type="datetime-local" defaultValue={localValue(endedAt)} className={inputClass} />}
      </Field>
      <div className="sm:col-span-2">
        <Field label="Why (kept with the entry)" name="reason" errors={form.fields.reason}>
          {(p) => <input {...p} maxLength={500} className={inputClass} placeholder="Clock left on overnight; left at 16:30" />}
        </Field>
      </div>
      <div className="sm:col-span-2"><FormActions pending={form.pending} label="Save the correction" pendingLabel="Saving…" onCancel={() => setOpen(false)} /></div>
    </form>
  );
}
