import type { KitCalcInput, KitSpec, KitWarning } from "@/server/kit-calc";
import { BTU_PER_HOUR_PER_HORSEPOWER } from "@/server/kit-calc/units";
import { KitCautions } from "./cautions";
import { FormulaToggle, ResultFigure } from "./figure";
import { fmt, metric } from "./format";
import { BandSources, LINE_NAMES, LineFacts, lineEntries } from "./lines";
import { TankDrawing } from "./tank-drawing";

// Shown as a note, not a warning: it is always there and says what kind of number the heat figure is.
const NOTE_CODES = new Set(["heat_is_estimate"]);

export function KitWarnings({ warnings }: { warnings: KitWarning[] }) {
  const problems = warnings.filter((w) => !NOTE_CODES.has(w.code));
  const notes = warnings.filter((w) => NOTE_CODES.has(w.code));
  return (
    <div className="space-y-2">
      {problems.length === 0 ? (
        <p className="rounded-md bg-ok-100 px-3 py-2 font-semibold text-ok-700">
          <span aria-hidden="true">✓</span> No warnings for these inputs.
        </p>
      ) : (
        <ul className="space-y-2" aria-label="Warnings">
          {problems.map((w) => (
            <li key={w.code} data-warning={w.code} className="rounded-md border-l-4 border-warn-700 bg-warn-100 px-3 py-2 text-sm text-ink print:break-inside-avoid">
              <span aria-hidden="true" className="font-bold text-warn-700">
                ⚠{" "}
              </span>
              {w.message}
            </li>
          ))}
        </ul>
      )}
      {notes.map((w) => (
        <p key={w.code} data-warning={w.code} className="text-sm text-ink-soft">
          <span aria-hidden="true">≈ </span>
          {w.message}
        </p>
      ))}
    </div>
  );
}

function Heading({ children }: { children: React.ReactNode }) {
  return <h3 className="text-base font-bold uppercase tracking-wide text-bay-800">{children}</h3>;
}

/** Every result of the calculator for one set of inputs, each with its formula and source a click away. */
export function KitCalcResults({ input, spec }: { input: KitCalcInput; spec: KitSpec }) {
  const grid = "grid grid-cols-2 gap-2 @xl:grid-cols-3 @4xl:grid-cols-4";
  return (
    <div className="@container space-y-5">
      <section aria-label="Pump and PTO" className="space-y-2">
        <Heading>Pump and PTO</Heading>
        <div className={grid}>
          <ResultFigure path="flowGpm" value={fmt(spec.flowGpm, 1)} unit="gpm" metric={metric.lpm(spec.flowGpm)} extraPaths={["metric.flowLpm"]} />
          <ResultFigure path="pumpShaftRpm" value={fmt(spec.pumpShaftRpm, 0)} unit="rpm" />
          <ResultFigure path="hydraulicHp" value={fmt(spec.hydraulicHp, 1)} unit="hp" metric={`${fmt(spec.metric.hydraulicKw, 1)} kW at ${fmt(spec.metric.pressureBar, 0)} bar`} extraPaths={["metric.hydraulicKw", "metric.pressureBar"]} />
          <ResultFigure path="inputHp" value={fmt(spec.inputHp, 1)} unit="hp" metric={metric.kW(spec.inputHp)} />
          <ResultFigure path="pumpTorqueLbFt" label="PTO torque" value={fmt(spec.pumpTorqueLbFt, 0)} unit="lb·ft" metric={metric.newtonMetres(spec.pumpTorqueLbFt)} />
          <ResultFigure path="theoreticalFlowGpm" value={fmt(spec.theoreticalFlowGpm, 1)} unit="gpm" metric={metric.lpm(spec.theoreticalFlowGpm)} />
        </div>
      </section>

      <section aria-label="Warnings" className="space-y-2">
        <Heading>Check these</Heading>
        <KitWarnings warnings={spec.warnings} />
      </section>

      <section aria-label="Reservoir" className="space-y-2">
        <Heading>Reservoir</Heading>
        <div className="grid gap-3 @2xl:grid-cols-[minmax(0,380px)_minmax(0,1fr)]">
          <TankDrawing input={input} />
          <div className="grid grid-cols-2 content-start gap-2 @4xl:grid-cols-3">
            <ResultFigure path="tank.totalGal" value={fmt(spec.tank.totalGal, 1)} unit="gal" metric={`${fmt(spec.metric.tankL, 0)} L`} extraPaths={["metric.tankL"]} />
            <ResultFigure path="tank.oilGal" value={fmt(spec.tank.oilGal, 1)} unit="gal" metric={metric.litres(spec.tank.oilGal)} />
            <ResultFigure path="reservoirMinutesOfFlow" label="Minutes of pump flow" value={fmt(spec.reservoirMinutesOfFlow, 2)} unit="min" />
            <ResultFigure path="tank.airSpacePercent" value={fmt(spec.tank.airSpacePercent, 1)} unit="%" />
            <ResultFigure path="tank.wettedAreaSqFt" value={fmt(spec.tank.wettedAreaSqFt, 1)} unit="ft²" metric={metric.squareMetres(spec.tank.wettedAreaSqFt)} />
            <ResultFigure path="tank.oilWeightLb" label="Oil weight, full" value={fmt(spec.tank.oilWeightLb, 0)} unit="lb" metric={metric.kg(spec.tank.oilWeightLb)} />
            <ResultFigure
              path="heat.dissipationBtuPerHr"
              label="Heat shed"
              estimate
              value={fmt(Math.round(spec.heat.dissipationBtuPerHr / 10) * 10, 0)}
              unit="Btu/h"
              metric={`${fmt(spec.heat.dissipationHp, 2)} hp · ${metric.watts(spec.heat.dissipationBtuPerHr, BTU_PER_HOUR_PER_HORSEPOWER)}`}
              extraPaths={["heat.dissipationHp"]}
            />
          </div>
        </div>
      </section>

      <section aria-label="Lines" className="space-y-2">
        <Heading>Line velocities</Heading>
        <div className="grid gap-2 @2xl:grid-cols-2 @5xl:grid-cols-3">
          {lineEntries(input, spec).map(({ name, line, insideDiameterIn, lengthFt }) => (
            <div key={name} data-line={name} className="space-y-1 rounded-md border border-line bg-panel px-3 py-2 print:break-inside-avoid">
              <p className="font-semibold">{LINE_NAMES[name]}</p>
              <LineFacts line={line} insideDiameterIn={insideDiameterIn} lengthFt={lengthFt} />
            </div>
          ))}
        </div>
        <FormulaToggle paths={["lines.velocityFps", "lines.minInsideDiameterIn", "lines.bandFps", "lines.status"]} label="Line formulas and sources" />
        <BandSources workingPressurePsi={input.workingPressurePsi} withPressure={Boolean(spec.lines.pressure)} />
      </section>

      <KitCautions />
    </div>
  );
}
