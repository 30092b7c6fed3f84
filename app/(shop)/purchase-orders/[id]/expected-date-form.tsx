"use client";

import { useRouter } from "next/navigation";
import { buttonClass, Field, FormAlert, inputClass, str, useApiForm } from "@/components/form";

/** The supplier's new delivery date, for every line of the order still to come. */
export function ExpectedDateForm({ id, expectedOn }: { id: number; expectedOn: string | null }) {
  const router = useRouter();
  const form = useApiForm((v) => ({ path: `/api/purchase-orders/${id}`, method: "PATCH", body: { expectedOn: str(v.expectedOn) || null } }), () => router.refresh());
  return (
    <form onSubmit={form.onSubmit} className="flex flex-wrap items-end gap-2">
      <FormAlert failure={form.failure} />
      <Field label="Expected on" name="expectedOn" errors={form.fields.expectedOn}>
        {(p) => <input {...p} type="date" defaultValue={expectedOn ?? ""} className={inputClass} />}
      </Field>
      <button type="submit" className={buttonClass.secondary} disabled={form.pending}>{form.pending ? "Saving…" : "Change the expected date"}</button>
    </form>
  );
}
