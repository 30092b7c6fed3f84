import { formulaForResult } from "@/server/kit-calc";

/** The formula and source behind a result, one click away. */
export function FormulaNote({ paths }: { paths: string[] }) {
  const formulas = paths.map((path) => formulaForResult(path)).filter((f) => f !== undefined);
  return (
    <div className="space-y-2 text-sm">
      {formulas.map((f) => (
        <div key={f.id}>
          <p className="font-semibold">{f.label}</p>
          <p>
            <code className="rounded bg-paper px-1 py-0.5 break-words">{f.formula}</code>
          </p>
          <p className="text-ink-soft">Source: {f.source}</p>
        </div>
      ))}
    </div>
  );
}

const summaryClass = "flex min-h-11 cursor-pointer list-none flex-col gap-0.5 px-3 py-2 [&::-webkit-details-marker]:hidden";

/** A result: label, value with its unit, metric beside; opens to show how it is worked out. */
export function ResultFigure({
  path,
  label,
  value,
  unit,
  metric,
  estimate = false,
  extraPaths = [],
}: {
  path: string;
  label?: string;
  value: string;
  unit: string;
  metric?: string;
  estimate?: boolean;
  extraPaths?: string[];
}) {
  const formula = formulaForResult(path);
  return (
    <details className="group rounded-md border border-line bg-panel open:col-span-full open:border-bay-600 print:break-inside-avoid">
      <summary className={summaryClass}>
        <span className="text-sm font-semibold text-ink-soft">
          {label ?? formula?.label}
          {estimate && <span className="ml-1 whitespace-nowrap rounded bg-warn-100 px-1 text-xs font-bold text-warn-700">≈ estimate</span>}
        </span>
        <span className="text-xl font-bold leading-tight" data-testid={`result-${path}`}>
          {value} <span className="text-base font-semibold">{unit}</span>
        </span>
        {metric && <span className="text-sm text-ink-soft">{metric}</span>}
        <span className="mt-1 text-xs text-bay-700 print:hidden">
          <span aria-hidden="true" className="inline-block transition-transform group-open:rotate-90">▸</span> Formula, source
        </span>
      </summary>
      <div className="border-t border-line px-3 py-2">
        <FormulaNote paths={[path, ...extraPaths]} />
      </div>
    </details>
  );
}

/** A one-line toggle for the formulas behind a group of results. */
export function FormulaToggle({ paths, label = "Formula and source" }: { paths: string[]; label?: string }) {
  return (
    <details className="group print:hidden">
      <summary className="inline-flex min-h-11 cursor-pointer list-none items-center gap-1 text-sm font-semibold text-bay-700 [&::-webkit-details-marker]:hidden">
        <span aria-hidden="true" className="inline-block transition-transform group-open:rotate-90">▸</span> {label}
      </summary>
      <div className="rounded-md border border-line bg-paper/60 p-2">
        <FormulaNote paths={paths} />
      </div>
    </details>
  );
}
