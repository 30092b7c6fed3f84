"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { Field, FormAlert, buttonClass, inputClass, str, useApiForm } from "@/components/form";
import { JobPlanFields } from "@/components/job-fields";

interface Props {
  customers: { id: number; name: string }[];
  trucks: { id: number; customerId: number; unitNumber: string; description: string }[];
  techs: { id: string; name: string }[];
  preset: { customerId?: number; truckId?: number };
  /** The shop's today (its time zone), so a due date already past is said before saving. */
  today: string;
}

export function NewJobForm({ customers, trucks, techs, preset, today }: Props) {
  const router = useRouter();
  const presetTruck = trucks.find((t) => t.id === preset.truckId);
  const [customerId, setCustomerId] = useState<number | "">(presetTruck?.customerId ?? preset.customerId ?? "");
  const theirTrucks = trucks.filter((t) => t.customerId === customerId);
  const form = useApiForm<{ job: { id: number } }>(
    (v) => ({
      path: "/api/jobs",
      body: {
        customerId: Number(str(v.customerId)) || undefined,
        truckId: Number(str(v.truckId)) || undefined,
        scope: str(v.scope),
        description: str(v.description),
        dueOn: str(v.dueOn) || null,
        assignedTechId: str(v.assignedTechId) || null,
        priority: str(v.priority) || "normal",
        notes: str(v.notes),
      },
    }),
    (res) => router.push(`/jobs/${res.job.id}`),
  );
  return (
    <form onSubmit={form.onSubmit} className="space-y-3 rounded-lg border border-line bg-panel p-4" noValidate>
      <FormAlert failure={form.failure} />
      <Field label="Customer" name="customerId" errors={form.fields.customerId}>
        {(p) => (
          <select {...p} value={customerId} onChange={(e) => setCustomerId(e.target.value ? Number(e.target.value) : "")} className={inputClass}>
            <option value="">Choose the customer</option>
            {customers.map((c) => (
              <option key={c.id} value={c.id}>{c.name}</option>
            ))}
          </select>
        )}
      </Field>
      <Field label="Truck" name="truckId" errors={form.fields.truckId} hint={customerId && theirTrucks.length === 0 ? undefined : "The customer's trucks"}>
        {(p) => (
          <select {...p} key={String(customerId)} defaultValue={presetTruck?.id ?? ""} className={inputClass}>
            <option value="">{customerId ? "Choose the truck" : "Choose the customer first"}</option>
            {theirTrucks.map((t) => (
              <option key={t.id} value={t.id}>Unit {t.unitNumber} — {t.description}</option>
            ))}
          </select>
        )}
      </Field>
      {customerId !== "" && theirTrucks.length === 0 && (
        <p className="text-sm">
          This customer has no truck on file. <Link className="underline" href={`/trucks/new?customerId=${customerId}`}>Add their truck</Link>.
        </p>
      )}
      <Field label="Work description" name="description" errors={form.fields.description} hint="For example: wet kit, 40 gal aluminum round reservoir between the rails">
        {(p) => <textarea {...p} rows={3} className={inputClass} />}
      </Field>
      <JobPlanFields fields={form.fields} techs={techs} today={today} />
      <Field label="Notes (staff only)" name="notes" errors={form.fields.notes}>{(p) => <textarea {...p} rows={3} className={inputClass} />}</Field>
      <button type="submit" className={buttonClass.primary} disabled={form.pending}>{form.pending ? "Opening…" : "Open the job"}</button>
    </form>
  );
}
