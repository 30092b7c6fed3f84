"use client";

import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { Field, FormActions, FormAlert, inputClass, num, str, useApiForm } from "@/components/form";
import type { PartKind, PartMaterial, PartShape } from "@/db/tables/records";
import type { PartView } from "@/server/records/queries";
import { PART_KINDS, PART_MATERIALS, PART_SHAPES, kindDefaults, partKindLabels, partMaterialLabels, partShapeLabels } from "@/server/records/labels";

/**
 * Adds a part to the job, or edits one. A reservoir may carry its geometry (inside dimensions,
 * inches). A tech may not change a part's kind or take it off the leak-test or coating list (the
 * server refuses it too), and an install-only job takes no part that needs either.
 */
export function PartForm({
  jobId,
  part,
  canEditGates,
  installOnly,
  onDone,
  onCancel,
}: {
  jobId: number;
  part?: PartView;
  canEditGates: boolean;
  installOnly: boolean;
  onDone: () => void;
  onCancel: () => void;
}) {
  const router = useRouter();
  const id = useId();
  const [kind, setKind] = useState<PartKind>(part?.kind ?? (installOnly ? "bracket" : "reservoir"));
  const [shape, setShape] = useState<PartShape>(part?.shape ?? (installOnly ? "other" : "round"));
  const [needsLeakTest, setNeedsLeakTest] = useState(part?.needsLeakTest ?? (installOnly ? false : kindDefaults(installOnly ? "bracket" : "reservoir").needsLeakTest));
  const [needsCoating, setNeedsCoating] = useState(part?.needsCoating ?? !installOnly);
  const geometry = part?.geometry;
  const kindLocked = Boolean(part) && !canEditGates;
  const leakLocked = kind === "reservoir" || (installOnly && !part?.needsLeakTest) || (!canEditGates && part?.needsLeakTest === true);
  const coatingLocked = (installOnly && !part?.needsCoating) || (!canEditGates && part?.needsCoating === true);
  // A reservoir is always leak-tested, so an install-only job is not offered one.
  const kinds = PART_KINDS.filter((k) => !installOnly || k !== "reservoir" || part?.kind === "reservoir");

  const form = useApiForm(
    (v) => {
      const dims =
        shape === "round"
          ? { insideDiameterIn: num(v.insideDiameterIn), lengthIn: num(v.lengthIn) }
          : { lengthIn: num(v.lengthIn), widthIn: num(v.widthIn), heightIn: num(v.heightIn) };
      const anyDim = Object.values(dims).some((d) => d !== undefined);
      const body = {
        name: str(v.name),
        kind,
        material: str(v.material),
        shape: kind === "reservoir" || kind === "box" ? shape : "other",
        geometry: kind === "reservoir" && shape !== "other" && anyDim ? { shape, ...dims } : null,
        needsLeakTest: kind === "reservoir" ? true : needsLeakTest,
        needsCoating,
        notes: str(v.notes),
      };
      return part ? { path: `/api/parts/${part.id}`, method: "PATCH", body } : { path: `/api/jobs/${jobId}/parts`, body };
    },
    () => {
      router.refresh();
      onDone();
    },
  );

  const dimension = (name: "insideDiameterIn" | "lengthIn" | "widthIn" | "heightIn", label: string) => (
    <Field label={label} name={name} errors={form.fields[`geometry.${name}`]}>
      {(p) => <input {...p} type="text" inputMode="decimal" autoComplete="off" defaultValue={geometry && name in geometry ? String((geometry as unknown as Record<string, number>)[name]) : ""} className={inputClass} />}
    </Field>
  );

  return (
    <form onSubmit={form.onSubmit} noValidate className="space-y-3 rounded-md border border-line bg-paper p-3" aria-label={part ? `Edit ${part.name}` : "Add a part"}>
      <FormAlert failure={form.failure} />
      <Field label="Part" name="name" errors={form.fields.name} hint="As the shop calls it, e.g. 40 gal round reservoir.">
        {(p) => <input {...p} defaultValue={part?.name ?? ""} className={inputClass} />}
      </Field>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Kind" name="kind" errors={form.fields.kind}>
          {(p) => (
            <select
              {...p}
              value={kind}
              disabled={kindLocked}
              onChange={(e) => {
                const next = e.target.value as PartKind;
                // A new kind brings its own defaults, as the server does: a bracket is not leak-tested unless ticked.
                const fresh = kindDefaults(next, shape === "other" ? "round" : shape);
                setKind(next);
                setShape(fresh.shape);
                if (!installOnly) setNeedsLeakTest(fresh.needsLeakTest);
              }}
              className={`${inputClass} disabled:bg-line disabled:text-ink-soft`}
            >
              {kinds.map((k) => (
                <option key={k} value={k}>{partKindLabels[k]}</option>
              ))}
            </select>
          )}
        </Field>
        <Field label="Material" name="material" errors={form.fields.material}>
          {(p) => (
            <select {...p} defaultValue={part?.material ?? "aluminum"} className={inputClass}>
              {PART_MATERIALS.map((m: PartMaterial) => (
                <option key={m} value={m}>{partMaterialLabels[m]}</option>
              ))}
            </select>
          )}
        </Field>
      </div>
      {(kind === "reservoir" || kind === "box") && (
        <Field
          label="Shape"
          name="shape"
          errors={form.fields.shape}
          hint={
            shape === "box"
              ? "Flat walls flex: a box tank is checked with soap on every seam, at the box tank's test pressure."
              : shape === "d"
                ? "A flat side against the rail and a half round outboard. Its flat walls flex: it is checked with soap on every seam, at the box tank's test pressure."
                : shape === "round"
                ? "A round tank is tested at the round tank's pressure, with soap, pressure decay or both."
                : "No set test pressure for this shape: the tester uses the lowest pressure that finds a leak."
          }
        >
          {(p) => (
            <select {...p} value={shape} onChange={(e) => setShape(e.target.value as PartShape)} className={inputClass}>
              {PART_SHAPES.map((s) => (
                <option key={s} value={s}>{partShapeLabels[s]}</option>
              ))}
            </select>
          )}
        </Field>
      )}
      {kind === "reservoir" && shape !== "other" && (
        <fieldset className="grid gap-3 rounded-md border border-line p-3 sm:grid-cols-3">
          <legend className="px-1 text-sm font-semibold">Tank geometry, inside dimensions (optional)</legend>
          {form.fields.geometry && <p className="text-sm font-medium text-stop-700 sm:col-span-3">⚠ {form.fields.geometry.join(" ")}</p>}
          {shape === "round" ? (
            <>
              {dimension("insideDiameterIn", "Inside diameter (in)")}
              {dimension("lengthIn", "Length (in)")}
            </>
          ) : (
            <>
              {dimension("lengthIn", "Length (in)")}
              {dimension("widthIn", shape === "d" ? "Width, rail to crown (in)" : "Width (in)")}
              {dimension("heightIn", shape === "d" ? "Height of the flat side (in)" : "Height (in)")}
            </>
          )}
        </fieldset>
      )}
      <div className="space-y-2">
        {installOnly && (
          <p className="text-sm text-ink-soft">This job is install only: its parts get no leak test and no outside coating. Change the job&apos;s Work to fabricated parts first if the shop builds parts for it.</p>
        )}
        <label className="flex min-h-11 items-center gap-3">
          <input
            type="checkbox"
            id={`${id}-leak`}
            checked={kind === "reservoir" ? true : needsLeakTest}
            disabled={leakLocked}
            onChange={(e) => setNeedsLeakTest(e.target.checked)}
            className="h-5 w-5 accent-bay-700"
          />
          <span>
            Needs a leak test {kind === "reservoir" && <span className="text-sm text-ink-soft">(always, for a reservoir)</span>}
          </span>
        </label>
        {form.fields.needsLeakTest && <p className="text-sm font-medium text-stop-700">⚠ {form.fields.needsLeakTest.join(" ")}</p>}
        <label className="flex min-h-11 items-center gap-3">
          <input
            type="checkbox"
            name="needsCoating"
            checked={needsCoating}
            disabled={coatingLocked}
            onChange={(e) => setNeedsCoating(e.target.checked)}
            className="h-5 w-5 accent-bay-700"
          />
          <span>Goes out for coating</span>
        </label>
        {form.fields.needsCoating && <p className="text-sm font-medium text-stop-700">⚠ {form.fields.needsCoating.join(" ")}</p>}
        {part && !canEditGates && (
          <p className="text-sm text-ink-soft">Only the office or the owner can change a part&apos;s kind or take it off the leak-test or coating list.</p>
        )}
      </div>
      <Field label="Notes" name="notes" errors={form.fields.notes}>
        {(p) => <textarea {...p} rows={2} defaultValue={part?.notes ?? ""} className={inputClass} />}
      </Field>
      <FormActions pending={form.pending} label={part ? "Save the part" : "Add the part"} pendingLabel="Saving…" onCancel={onCancel} />
    </form>
  );
}
