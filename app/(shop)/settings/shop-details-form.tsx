"use client";

import { useEffect, useState } from "react";
import { Field, FormAlert, buttonClass, inputClass, num, str, useApiForm } from "@/components/form";
import type { ShopDetails } from "@/server/shop/settings";

/** Holidays are typed one a line: "2026-12-24 Shop closed". */
function readHolidays(text: string) {
  return text
    .split(/\r?\n/)
    .map((line) => line.trim())
    .filter(Boolean)
    .map((line) => {
      const [day, ...rest] = line.split(/\s+/);
      return { day, name: rest.join(" ") };
    });
}
const holidayText = (list: ShopDetails["holidays"]) => list.map((h) => `${h.day}${h.name ? ` ${h.name}` : ""}`).join("\n");

/** The owner's form for the shop's own details; the office sees the same figures read-only. */
export function ShopDetailsForm({ initial, canEdit }: { initial: ShopDetails; canEdit: boolean }) {
  const [saved, setSaved] = useState(initial);
  const [round, setRound] = useState(0);
  const [notice, setNotice] = useState<string | null>(null);
  const form = useApiForm<{ settings: ShopDetails }>(
    (v) => {
      setNotice(null);
      return {
        path: "/api/shop-settings/shop",
        method: "PUT",
        body: {
          version: saved.version,
          name: str(v.name),
          phone: str(v.phone),
          address: str(v.address),
          timeZone: str(v.timeZone),
          workOrderPrefix: str(v.workOrderPrefix),
          holidays: readHolidays(str(v.holidays)),
          showPredictedDate: v.showPredictedDate === "on",
          leakAllowedDropPsi: num(v.leakAllowedDropPsi),
        },
      };
    },
    ({ settings }) => {
      setSaved(settings);
      setRound((n) => n + 1);
      setNotice("Saved. Every page uses the new settings from now on.");
    },
  );
  // A stale form gets the settings someone else saved, so the next save starts from them.
  const current = (form.failure?.details as { settings?: ShopDetails } | undefined)?.settings;
  useEffect(() => {
    if (current && current.version !== saved.version) {
      setSaved(current);
      setRound((n) => n + 1);
    }
  }, [current, saved.version]);
  const holidayErrors = Object.entries(form.fields).filter(([k]) => k.startsWith("holidays")).flatMap(([k, m]) => {
    const line = /^holidays\.(\d+)/.exec(k);
    return m.map((msg) => (line ? `Line ${Number(line[1]) + 1}: ${msg}` : msg));
  });

  return (
    <form key={round} onSubmit={form.onSubmit} noValidate className="space-y-3" aria-label="Shop details">
      <FormAlert failure={form.failure} />
      {notice && (
        <p role="status" className="rounded-md bg-ok-100 px-3 py-2 text-sm font-medium text-ok-700">
          ✓ {notice}
        </p>
      )}
      <fieldset disabled={!canEdit} className="space-y-3">
        <div className="grid gap-3 sm:grid-cols-2">
          <Field label="Shop name" name="name" errors={form.fields.name}>
            {(p) => <input {...p} defaultValue={saved.name} autoComplete="organization" className={inputClass} />}
          </Field>
          <Field label="Phone" name="phone" errors={form.fields.phone}>
            {(p) => <input {...p} type="tel" defaultValue={saved.phone} autoComplete="tel" className={inputClass} />}
          </Field>
          <Field label="Address" name="address" errors={form.fields.address} hint="Printed on the shop sheet.">
            {(p) => <textarea {...p} rows={2} defaultValue={saved.address} autoComplete="street-address" className={inputClass} />}
          </Field>
          <Field label="Time zone" name="timeZone" errors={form.fields.timeZone} hint="The shop's clock: days, due dates and reports follow it (for example US/Central).">
            {(p) => <input {...p} defaultValue={saved.timeZone} autoComplete="off" className={inputClass} />}
          </Field>
          <Field label="Work-order prefix" name="workOrderPrefix" errors={form.fields.workOrderPrefix} hint="New jobs are numbered PREFIX-YY-0001; jobs already made keep theirs.">
            {(p) => <input {...p} defaultValue={saved.workOrderPrefix} autoComplete="off" className={inputClass} />}
          </Field>
          <Field label="Allowed leak-test drop (psi)" name="leakAllowedDropPsi" errors={form.fields.leakAllowedDropPsi} hint="Tests already recorded keep the allowance they were decided on.">
            {(p) => <input {...p} type="text" inputMode="decimal" defaultValue={String(saved.leakAllowedDropPsi)} autoComplete="off" className={inputClass} />}
          </Field>
        </div>
        <Field
          label="Holidays (the shop is closed)"
          name="holidays"
          errors={holidayErrors.length ? holidayErrors : undefined}
          hint="One a line, the day then a name: 2026-12-24 Shop closed. Business days skip them everywhere: due dates, reports, days late."
        >
          {(p) => <textarea {...p} rows={4} defaultValue={holidayText(saved.holidays)} className={`${inputClass} font-mono`} />}
        </Field>
        <label className="flex min-h-11 items-center gap-3">
          <input type="checkbox" name="showPredictedDate" defaultChecked={saved.showPredictedDate} className="h-5 w-5" />
          <span>Show the customer &ldquo;likely ready around …&rdquo; on the status page (said to be an estimate)</span>
        </label>
        {canEdit && (
          <button type="submit" className={buttonClass.primary} disabled={form.pending}>
            {form.pending ? "Saving…" : "Save shop details"}
          </button>
        )}
      </fieldset>
    </form>
  );
}
