"use client";

import type { KitCalcInput, KitSpec } from "@/server/kit-calc";
import { fmt } from "./format";
import type { FormFieldErrors } from "./form-state";
import { KitCalcForm } from "./kit-calc-form";
import { KitCalcResults } from "./results";
import { useKitCalc } from "./use-kit-calc";

export type KitCalc = ReturnType<typeof useKitCalc>;

/** Form beside results (form above them on a phone); results follow the typing after a short pause. */
export function KitCalculatorView({ calc, errors, actions }: { calc: KitCalc; errors?: FormFieldErrors; actions?: React.ReactNode }) {
  const shownErrors = { ...calc.errors, ...errors };
  const resultsId = "kit-results";
  const answer = calc.answer;
  return (
    <div className="@container">
      <div className="grid gap-4 @3xl:grid-cols-[minmax(0,380px)_minmax(0,1fr)] @6xl:grid-cols-[minmax(0,440px)_minmax(0,1fr)]">
        <section aria-label="Kit inputs" className="space-y-3">
          <KitCalcForm form={calc.form} errors={shownErrors} onField={calc.setField} onShape={calc.setShape} />
          {actions}
          {answer && <KeyFiguresBar spec={answer.spec} resultsId={resultsId} updating={calc.updating} hasErrors={calc.inputsHaveErrors} />}
        </section>
        <section id={resultsId} aria-label="Kit results" className="min-w-0 scroll-mt-2 space-y-3">
          <p role="status" className="flex min-h-6 flex-wrap items-center gap-2 text-sm font-semibold">
            {calc.inputsHaveErrors ? (
              <span className="rounded bg-warn-100 px-2 py-0.5 text-warn-700">⚠ Fix the marked boxes. The results below are for the last complete inputs.</span>
            ) : calc.updating ? (
              <span className="text-ink-soft">↻ Working it out…</span>
            ) : answer && !calc.failure ? (
              <span className="text-ok-700">✓ Results match the inputs</span>
            ) : null}
          </p>
          {calc.failure && (
            <p role="alert" className="rounded-md bg-stop-100 px-3 py-2 text-sm font-medium text-stop-700">
              ⚠ {calc.failure.message}
            </p>
          )}
          {answer ? (
            <div className={calc.inputsHaveErrors ? "opacity-70" : undefined}>
              <KitCalcResults input={answer.input} spec={answer.spec} />
            </div>
          ) : (
            !calc.failure && <p className="text-ink-soft">Fill in the boxes to see the kit worked out.</p>
          )}
        </section>
      </div>
    </div>
  );
}

// On a phone the results sit below a long form: this strip follows the thumb down the form with the figures that
// matter most, and goes back to its place (and away, beside the form) once the results are in view.
function KeyFiguresBar({ spec, resultsId, updating, hasErrors }: { spec: KitSpec; resultsId: string; updating: boolean; hasErrors: boolean }) {
  const problems = spec.warnings.filter((w) => w.code !== "heat_is_estimate").length;
  return (
    <div className="sticky bottom-0 z-10 -mx-1 flex items-center justify-between gap-2 rounded-t-lg border border-b-0 border-bay-700 bg-bay-900 px-3 py-1 text-white shadow-lg @3xl:hidden print:hidden">
      <p className="text-sm leading-snug" aria-hidden="true">
        <strong className="text-base">{fmt(spec.flowGpm, 1)} gpm</strong> · {fmt(spec.inputHp, 1)} hp in · {fmt(spec.tank.totalGal, 1)} gal
        <span className="block text-xs text-bay-100">
          {hasErrors ? "⚠ last complete inputs" : updating ? "↻ working it out…" : problems ? `⚠ ${problems} warning${problems > 1 ? "s" : ""}` : "✓ no warnings"}
        </span>
      </p>
      <a href={`#${resultsId}`} className="inline-flex min-h-11 shrink-0 items-center rounded-md bg-panel px-3 font-semibold text-bay-900">
        All results ↓
      </a>
    </div>
  );
}

export function KitCalculator({ start, startAnswer }: { start: KitCalcInput; startAnswer?: KitSpec }) {
  const calc = useKitCalc(start, startAnswer);
  return <KitCalculatorView calc={calc} />;
}
