"use client";

import { useState } from "react";
import { Field, FormAlert, buttonClass, inputClass, num, useApiForm } from "@/components/form";
import type { LeakTestProcedure } from "@/server/records/procedure";

type Key = keyof LeakTestProcedure;

const FIELDS: { key: Key; label: string; unit: string; source: string }[] = [
  { key: "minHoldMinutes", label: "Shortest hold", unit: "min", source: "ASME BPVC Section V, Article 10" },
  { key: "gaugeRatioMin", label: "Gauge full scale, lowest", unit: "× test pressure", source: "ASME BPVC Section V, Article 10" },
  { key: "gaugeRatioMax", label: "Gauge full scale, highest", unit: "× test pressure", source: "ASME BPVC Section V, Article 10" },
  { key: "roundMinPsig", label: "Round tank, lowest test pressure", unit: "psig", source: "UL 142 §42.2.1" },
  { key: "roundMaxPsig", label: "Round tank, highest test pressure", unit: "psig", source: "UL 142 §42.2.1" },
  { key: "boxMinPsig", label: "Box tank, lowest test pressure", unit: "psig", source: "UL 142 §42.2.1" },
  { key: "boxMaxPsig", label: "Box tank, highest test pressure", unit: "psig", source: "UL 142 §42.2.1" },
  { key: "calibrationMonths", label: "Oldest gauge calibration", unit: "months", source: "common practice, no published source" },
];

/** The owner's leak-test procedure: a test outside these figures is saved as invalid. */
export function ProcedureForm({ initial, published }: { initial: LeakTestProcedure; published: LeakTestProcedure }) {
  const [saved, setSaved] = useState(initial);
  const [round, setRound] = useState(0);
  const [notice, setNotice] = useState<string | null>(null);
  const form = useApiForm<{ procedure: LeakTestProcedure }>(
    (v) => {
      setNotice(null);
      return { path: "/api/shop-settings/leak-test-procedure", method: "PATCH", body: Object.fromEntries(FIELDS.map((f) => [f.key, num(v[f.key])])) };
    },
    ({ procedure }) => {
      setSaved(procedure);
      setRound((n) => n + 1);
      setNotice("Procedure saved. Tests already recorded keep the result they were saved with.");
    },
  );
  return (
    <form key={round} onSubmit={form.onSubmit} noValidate className="space-y-3" aria-label="Leak-test procedure">
      <p className="text-sm text-ink-soft">
        A leak test outside these figures is saved as invalid: it counts as no test, and the part is tested again before it goes out for coating. The
        starting figures are the published ones named beside each.
      </p>
      <FormAlert failure={form.failure} />
      {notice && (
        <p role="status" className="rounded-md bg-ok-100 px-3 py-2 text-sm font-medium text-ok-700">
          ✓ {notice}
        </p>
      )}
      <div className="grid gap-3 sm:grid-cols-2">
        {FIELDS.map((f) => (
          <Field
            key={f.key}
            label={`${f.label} (${f.unit})`}
            name={f.key}
            errors={form.fields[f.key]}
            hint={saved[f.key] === published[f.key] ? `The usual figure (${f.source}).` : `The usual figure: ${published[f.key]} ${f.unit} (${f.source}).`}
          >
            {(p) => <input {...p} type="text" inputMode="decimal" autoComplete="off" defaultValue={String(saved[f.key])} className={inputClass} />}
          </Field>
        ))}
      </div>
      <button type="submit" className={buttonClass.primary} disabled={form.pending}>
        {form.pending ? "Saving…" : "Save the procedure"}
      </button>
    </form>
  );
}
