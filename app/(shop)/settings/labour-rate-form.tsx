"use client";

import { useRouter } from "next/navigation";
import { buttonClass, Field, FormAlert, inputClass, str, useApiForm } from "@/components/form";
import { parseDollars } from "@/components/money";

/** The shop's hourly labour rate, used for each job's cost until a price list exists. */
export function LabourRateForm({ cents }: { cents: number }) {
  const router = useRouter();
  const form = useApiForm((v) => ({ path: "/api/shop-settings/labour-rate", method: "PATCH", body: { labourRateCents: parseDollars(str(v.rate)) ?? null } }), () => router.refresh());
  return (
    <form onSubmit={form.onSubmit} className="flex flex-wrap items-end gap-2">
      <FormAlert failure={form.failure} />
      <Field label="Labour rate ($ an hour)" name="rate" errors={form.fields.labourRateCents} hint={cents ? undefined : "Not set yet: job cost counts hours only until it is."}>
        {(p) => <input {...p} defaultValue={cents ? (cents / 100).toFixed(2) : ""} inputMode="decimal" className={`${inputClass} w-40`} placeholder="125.00" />}
      </Field>
      <button type="submit" className={buttonClass.primary} disabled={form.pending}>{form.pending ? "Saving…" : "Save the rate"}</button>
    </form>
  );
}
