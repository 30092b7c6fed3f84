"use client";

import { useId } from "react";
import { inputClass } from "@/components/form";
import { FIELD_SPECS, MORE_FIELDS, type FormFieldErrors, type KitField, type KitFormState, type TankShape, typedNumber } from "./form-state";

// Label, box and message share row tracks with the neighbouring field (CSS subgrid), so boxes side by side line up
// even when one label wraps to two lines.
function NumberField({ field, form, errors, onChange }: { field: KitField; form: KitFormState; errors: FormFieldErrors; onChange: (field: KitField, value: string) => void }) {
  const id = useId();
  const spec = FIELD_SPECS[field];
  const value = form[field];
  const typed = typedNumber(value);
  const problems = errors[field];
  const metricText = typeof typed === "number" && spec.metric ? `= ${spec.metric(typed)}` : null;
  const hint = spec.optional && value.trim() === "" ? (spec.blankMeans ?? "Optional") : metricText;
  return (
    <div className="row-span-3 grid grid-rows-subgrid gap-1">
      <label htmlFor={id} className="self-end text-sm font-semibold text-ink">
        {spec.label}
      </label>
      <input
        id={id}
        name={field}
        type="text"
        inputMode="decimal"
        autoComplete="off"
        enterKeyHint="next"
        aria-invalid={Boolean(problems?.length)}
        aria-describedby={`${id}-msg`}
        className={inputClass}
        value={value}
        placeholder={spec.placeholder}
        onChange={(e) => onChange(field, e.target.value)}
      />
      <div id={`${id}-msg`} className="pb-2 text-sm">
        <p aria-live="polite" className="font-medium text-stop-700">
          {problems?.length ? `⚠ ${problems.join(" ")}` : ""}
        </p>
        {hint && <p className="text-ink-soft">{hint}</p>}
      </div>
    </div>
  );
}

function Group({ legend, children, note }: { legend: string; children: React.ReactNode; note?: string }) {
  return (
    <fieldset className="space-y-2 rounded-lg border border-line bg-panel p-3">
      <legend className="px-1 text-base font-bold">{legend}</legend>
      {note && <p className="text-sm text-ink-soft">{note}</p>}
      <div className="grid grid-cols-2 gap-x-3 gap-y-1">{children}</div>
    </fieldset>
  );
}

function ShapeChoice({ shape, onShape }: { shape: TankShape; onShape: (shape: TankShape) => void }) {
  const options: { value: TankShape; label: string }[] = [
    { value: "round", label: "◯ Round" },
    { value: "box", label: "▭ Box" },
    { value: "d", label: "◗ D-shape" },
  ];
  return (
    <div role="radiogroup" aria-label="Tank shape" className="col-span-2 mb-2 grid grid-cols-3 gap-2">
      {options.map((o) => (
        <label
          key={o.value}
          className={`flex min-h-11 cursor-pointer items-center justify-center gap-1 rounded-md border px-2 text-center font-semibold has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-spark-500 ${shape === o.value ? "border-bay-700 bg-bay-700 text-white" : "border-line bg-panel text-ink hover:bg-bay-50"}`}
        >
          <input type="radio" name="tank-shape" value={o.value} checked={shape === o.value} onChange={() => onShape(o.value)} className="sr-only" />
          {o.label}
          {shape === o.value && <span className="sr-only">(chosen)</span>}
        </label>
      ))}
    </div>
  );
}

/** The calculator's inputs in US units, metric shown under each box; blank optional boxes use the shown default. */
export function KitCalcForm({
  form,
  errors,
  onField,
  onShape,
}: {
  form: KitFormState;
  errors: FormFieldErrors;
  onField: (field: KitField, value: string) => void;
  onShape: (shape: TankShape) => void;
}) {
  const f = (field: KitField) => <NumberField key={field} field={field} form={form} errors={errors} onChange={onField} />;
  return (
    <div className="space-y-3">
      {errors._ && (
        <p role="alert" className="rounded-md bg-stop-100 px-3 py-2 text-sm font-medium text-stop-700">
          ⚠ {errors._.join(" ")}
        </p>
      )}
      <Group legend="Engine, PTO and pump">
        {f("engineRpm")}
        {f("ptoRatioPercent")}
        {f("pumpDisplacementCuIn")}
        {f("ptoTorqueRatingLbFt")}
        {f("volumetricEfficiency")}
        {f("mechanicalEfficiency")}
      </Group>
      <Group legend="Pressure">
        {f("workingPressurePsi")}
        {f("reliefPressurePsi")}
      </Group>
      <Group legend="Reservoir">
        <ShapeChoice shape={form.shape} onShape={onShape} />
        {form.shape === "d" && (
          <p className="col-span-2 mb-1 text-sm text-ink-soft">
            D-shape: flat side of the full height against the frame rail, a half-round of that height outboard. Width runs from the rail to the
            crown of the curve.
          </p>
        )}
        {form.shape === "round" ? f("tankDiameterIn") : f("tankHeightIn")}
        {f("tankLengthIn")}
        {form.shape !== "round" && f("tankWidthIn")}
        {f("fillDepthIn")}
        {f("sumpGal")}
        {f("trailerOilNeedGal")}
        {f("oilToAirDeltaF")}
      </Group>
      <Group legend="Lines" note="Inside diameter (ID) and length of each line. The pressure line is optional.">
        {f("suctionIdIn")}
        {f("suctionLengthFt")}
        {f("returnIdIn")}
        {f("returnLengthFt")}
        {f("pressureIdIn")}
        {f("pressureLengthFt")}
      </Group>
      <MoreAboutThisKit form={form} errors={errors} field={f} />
    </div>
  );
}

/**
 * Ratings, duty, oil and trailer details, folded away: the kit above is worked out without them, and each one
 * adds a check. Opens by itself when one of its boxes has a problem, so an error is never hidden.
 */
function MoreAboutThisKit({ form, errors, field }: { form: KitFormState; errors: FormFieldErrors; field: (name: KitField) => React.ReactNode }) {
  const hasProblem = MORE_FIELDS.some((name) => errors[name]?.length);
  const filled = MORE_FIELDS.filter((name) => form[name].trim() !== "").length;
  return (
    <details open={hasProblem || undefined} className="group rounded-lg border border-line bg-panel" data-testid="more-about-kit">
      <summary className="flex min-h-11 cursor-pointer list-none items-center justify-between gap-2 px-3 py-2 font-bold [&::-webkit-details-marker]:hidden">
        <span>
          <span aria-hidden="true" className="mr-1 inline-block transition-transform group-open:rotate-90">
            ▸
          </span>
          More about this kit
        </span>
        <span className="text-sm font-semibold text-ink-soft">{filled === 0 ? "ratings, duty, oil, trailer" : `${filled} filled in`}</span>
      </summary>
      <div className="space-y-3 border-t border-line p-2">
        <Group legend="PTO and pump ratings" note="From the makers' data. Each one you fill in is checked against the kit.">
          {field("ptoIntermittentTorqueLbFt")}
          {field("ptoHpRating")}
          {field("pumpMaxRpm")}
          {field("governedEngineRpm")}
        </Group>
        <Group legend="Rated pressures" note="The relief setting must stay at or below the lowest rating in the circuit.">
          {field("pumpRatedPsi")}
          {field("hoseRatedPsi")}
          {field("trailerRatedPsi")}
        </Group>
        <Group legend="Duty and heat" note="Share of the running time the pump spends at working pressure and with oil going over the relief.">
          {field("dutyAtWorkingPercent")}
          {field("dutyOverReliefPercent")}
        </Group>
        <Group legend="Oil and suction">
          {field("oilViscosityColdCst")}
          {field("oilViscosityWorkingCst")}
          {field("oilSpecificGravity")}
          {field("pumpInletLimitInHg")}
          {field("suctionFittingsEquivalentFt")}
          {field("pickupHeightIn")}
        </Group>
        <Group legend="Trailer" note="Target flow gives the engine speed to ask for; a cylinder gives the time to fill it.">
          {field("targetFlowGpm")}
          {field("cylinderCount")}
          {field("cylinderBoreIn")}
          {field("cylinderRodIn")}
          {field("cylinderStrokeIn")}
        </Group>
      </div>
    </details>
  );
}
