"use client";

import { useRouter } from "next/navigation";
import { useRef, useState } from "react";
import { Field, FormAlert, buttonClass, inputClass, num, str, useApiForm } from "@/components/form";
import { TRUCK_LIMITS } from "@/server/trucks/limits";
import type { TruckView } from "@/server/trucks/schemas";
import { VIN_MESSAGES, vinProblem } from "@/server/vehicles/vin";
import { bannerFor, useFocusFirstProblem } from "../customers/controls";

const VIN_HINT = "17 characters; the 9th is a check digit.";

interface CustomerChoice {
  id: number;
  name: string;
}

/** Live word on the VIN as it is typed, so a misread character shows before saving. */
function vinNote(raw: string): string {
  const vin = raw.trim().toUpperCase();
  if (vin.length < 17) return `${VIN_HINT} ${vin.length} of 17 typed.`;
  const problem = vinProblem(vin);
  return problem ? `⚠ ${VIN_MESSAGES[problem]}` : "✓ 17 characters; the check digit matches.";
}

/** New truck when `saved` is absent; otherwise edits it. */
export function TruckForm({ saved: first, customers, customerId }: { saved?: TruckView; customers: CustomerChoice[]; customerId?: number }) {
  const router = useRouter();
  const [saved, setSaved] = useState(first);
  const [version, setVersion] = useState(0);
  const [notice, setNotice] = useState<string | null>(null);
  const [vinHint, setVinHint] = useState(first ? vinNote(first.vin) : VIN_HINT);

  const form = useApiForm<{ truck: TruckView }>(
    (v) => {
      setNotice(null);
      const body = {
        customerId: num(v.customerId),
        unitNumber: str(v.unitNumber),
        vin: str(v.vin),
        year: num(v.year),
        description: str(v.description),
        make: str(v.make),
        model: str(v.model),
        transmission: str(v.transmission),
        ptoOpening: str(v.ptoOpening),
        // An emptied box clears a known engine speed rather than leaving the old one.
        workEngineRpm: num(v.workEngineRpm) ?? null,
      };
      return saved ? { path: `/api/trucks/${saved.id}`, method: "PATCH", body } : { path: "/api/trucks", body };
    },
    ({ truck }) => {
      if (!saved) {
        router.push(`/trucks/${truck.id}`);
        return;
      }
      setSaved(truck);
      setVinHint(vinNote(truck.vin));
      setVersion((n) => n + 1);
      setNotice("Truck saved.");
      router.refresh();
    },
  );
  const f = form.fields;
  const formRef = useRef<HTMLFormElement>(null);
  useFocusFirstProblem(formRef, form.failure);

  return (
    <form ref={formRef} key={version} onSubmit={form.onSubmit} noValidate className="space-y-4 rounded-lg border border-line bg-panel p-4">
      <FormAlert failure={bannerFor(form.failure)} />
      {notice && (
        <p role="status" className="rounded-md bg-ok-100 px-3 py-2 text-sm font-medium text-ok-700">
          ✓ {notice}
        </p>
      )}
      <Field label={saved ? "Owner" : "Customer"} name="customerId" errors={f.customerId} hint={saved ? "Change only when the truck has gone to another customer; its past jobs stay with the old one." : undefined}>
        {(p) => (
          <select {...p} defaultValue={saved?.customerId ?? customerId ?? ""} className={inputClass}>
            {!saved && !customerId && <option value="">Choose the customer…</option>}
            {customers.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name}
              </option>
            ))}
          </select>
        )}
      </Field>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Unit number" name="unitNumber" errors={f.unitNumber} hint="The number the fleet paints on the truck.">
          {(p) => <input {...p} defaultValue={saved?.unitNumber} maxLength={TRUCK_LIMITS.unitNumber} autoComplete="off" className={inputClass} />}
        </Field>
        <Field label="Model year" name="year" errors={f.year}>
          {(p) => <input {...p} defaultValue={saved?.year} inputMode="numeric" maxLength={4} placeholder="2024" autoComplete="off" className={inputClass} />}
        </Field>
      </div>
      <Field label="VIN" name="vin" errors={f.vin} hint={vinHint}>
        {(p) => (
          <input
            {...p}
            defaultValue={saved?.vin}
            maxLength={20}
            autoComplete="off"
            autoCapitalize="characters"
            spellCheck={false}
            onChange={(e) => setVinHint(vinNote(e.currentTarget.value))}
            className={`${inputClass} uppercase tracking-wider`}
          />
        )}
      </Field>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Make" name="make" errors={f.make} hint="As on the truck's title or door sticker.">
          {(p) => <input {...p} defaultValue={saved?.make} maxLength={TRUCK_LIMITS.make} autoComplete="off" className={inputClass} />}
        </Field>
        <Field label="Model" name="model" errors={f.model}>
          {(p) => <input {...p} defaultValue={saved?.model} maxLength={TRUCK_LIMITS.model} autoComplete="off" className={inputClass} />}
        </Field>
      </div>
      <Field label="Description" name="description" errors={f.description} hint="Plain words for the body and cab: e.g. tandem-axle day cab, sleeper tractor.">
        {(p) => <input {...p} defaultValue={saved?.description} maxLength={TRUCK_LIMITS.description} placeholder="Tandem-axle day cab" className={inputClass} />}
      </Field>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Transmission" name="transmission" errors={f.transmission} hint="The PTO is chosen for it; e.g. 18-speed manual.">
          {(p) => <input {...p} defaultValue={saved?.transmission} maxLength={TRUCK_LIMITS.transmission} placeholder="18-speed manual" className={inputClass} />}
        </Field>
        <Field label="PTO opening" name="ptoOpening" errors={f.ptoOpening} hint="Where the PTO mounts on the transmission: bolt pattern and side.">
          {(p) => <input {...p} defaultValue={saved?.ptoOpening} maxLength={TRUCK_LIMITS.ptoOpening} placeholder="6-bolt, left side" autoComplete="off" className={inputClass} />}
        </Field>
        <Field
          label="Engine speed at work (rpm)"
          name="workEngineRpm"
          errors={f.workEngineRpm}
          hint={`Engine rpm while the PTO drives the pump, ${TRUCK_LIMITS.rpmMin}–${TRUCK_LIMITS.rpmMax}. Leave empty if not known yet.`}
        >
          {(p) => <input {...p} defaultValue={saved?.workEngineRpm ?? ""} inputMode="numeric" maxLength={4} placeholder="1300" autoComplete="off" className={inputClass} />}
        </Field>
      </div>
      <button type="submit" className={`${buttonClass.primary} w-full sm:w-auto`} disabled={form.pending}>
        {form.pending ? "Saving…" : saved ? "Save truck" : "Add truck"}
      </button>
    </form>
  );
}
