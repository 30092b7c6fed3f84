"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { buttonClass, Field, FormActions, FormAlert, inputClass, str, useApiForm } from "@/components/form";
import { instantFromShopWallClock, shopWallClockValue } from "@/server/records/calendar";

/**
 * The office corrects a clock entry's times, with the reason kept beside it. The times are typed
 * and shown on the shop's clock, whatever time zone the computer at the desk is set to.
 */
export function CorrectEntry({ id, startedAt, endedAt, timeZone }: { id: number; startedAt: string; endedAt: string | null; timeZone: string }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const toInstant = (value: string) => (value ? (instantFromShopWallClock(value, timeZone) ?? "") : "");
  const form = useApiForm(
    (v) => ({ path: `/api/clock-entries/${id}`, method: "PATCH", body: { startedAt: toInstant(str(v.startedAt)), endedAt: toInstant(str(v.endedAt)), reason: str(v.reason) } }),
    () => {
      setOpen(false);
      router.refresh();
    },
  );
  if (!open) return <button type="button" className={`${buttonClass.secondary} mt-1`} onClick={() => setOpen(true)}>Correct</button>;
  const hint = `Shop time (${timeZone})`;
  return (
    <form onSubmit={form.onSubmit} className="mt-1 grid gap-2 rounded-md bg-bay-50 p-2" aria-label="Correct the clock entry">
      <FormAlert failure={form.failure} />
      <Field label="Started" name="startedAt" errors={form.fields.startedAt} hint={hint}>
        {(p) => <input {...p} type="datetime-local" defaultValue={shopWallClockValue(startedAt, timeZone)} className={`${inputClass} min-w-64`} />}
      </Field>
      <Field label="Ended" name="endedAt" errors={form.fields.endedAt} hint={hint}>
        {(p) => <input {...p} type="datetime-local" defaultValue={endedAt ? shopWallClockValue(endedAt, timeZone) : ""} className={`${inputClass} min-w-64`} />}
      </Field>
      <Field label="Why (kept with the entry)" name="reason" errors={form.fields.reason}>
        {(p) => <input {...p} maxLength={500} className={inputClass} placeholder="Clock left on overnight; left at 16:30" />}
      </Field>
      <FormActions pending={form.pending} label="Save the correction" pendingLabel="Saving…" onCancel={() => setOpen(false)} />
    </form>
  );
}
