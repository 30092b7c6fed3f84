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

function hasRatings(spec: KitSpec) {
  return Boolean(spec.relief.pump || spec.relief.hose || spec.relief.trailer);
}

const RATING_NAMES = { pump: "Pump", hose: "Hoses", trailer: "Trailer circuit" } as const;

function ReliefSection({ input, spec }: { input: KitCalcInput; spec: KitSpec }) {
  const rows = (["pump", "hose", "trailer"] as const).flatMap((key) => {
    const margin = spec.relief[key];
    return margin ? [{ key, margin }] : [];
  });
  return (
    <section aria-label="Relief against ratings" className="space-y-2">
      <Heading>Relief against ratings</Heading>
      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-sm">
          <caption className="mb-1 text-left text-ink-soft">Relief set at {fmt(input.reliefPressurePsi ?? 0, 0)} psi ({metric.bar(input.reliefPressurePsi ?? 0)})</caption>
          <thead>
            <tr className="border-b border-line text-left">
              <th scope="col" className="py-1 pr-2">Rating</th>
              <th scope="col" className="py-1 pr-2 text-right">Rated</th>
              <th scope="col" className="py-1 text-right">Room</th>
            </tr>
          </thead>
          <tbody>
            {rows.map(({ key, margin }) => (
              <tr key={key} data-rating={key} className="border-b border-line">
                <th scope="row" className="py-1 pr-2 text-left font-semibold">{RATING_NAMES[key]}</th>
                <td className="py-1 pr-2 text-right">{fmt(margin.ratedPsi, 0)} psi</td>
                <td className={`py-1 text-right font-bold ${margin.marginPsi < 0 ? "text-stop-700" : "text-ok-700"}`}>
                  {margin.marginPsi < 0 ? "▲ " : "✓ "}
                  {fmt(margin.marginPsi, 0)} psi ({fmt(margin.marginPercent, 1)} %)
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <FormulaToggle paths={["relief.ratedPsi", "relief.marginPsi", "relief.marginPercent"]} label="Relief formulas and sources" />
    </section>
  );
}

function HeatSection({ spec }: { spec: KitSpec }) {
  const round10 = (btu: number) => fmt(Math.round(btu / 10) * 10, 0);
  return (
    <section aria-label="Heat" className="space-y-2">
      <Heading>Heat</Heading>
      <p data-testid="heat-margin" className={`rounded-md px-3 py-2 text-sm font-medium ${spec.heat.coolerAdvised ? "bg-warn-100 text-ink" : "bg-ok-100 text-ok-700"}`}>
        <span aria-hidden="true">{spec.heat.coolerAdvised ? "⚠ " : "✓ "}</span>
        {spec.heat.margin}
      </p>
      <div className="grid grid-cols-2 gap-2 @xl:grid-cols-3">
        <ResultFigure path="heat.generatedBtuPerHr" label="Heat made" estimate value={round10(spec.heat.generatedBtuPerHr)} unit="Btu/h" metric={metric.watts(spec.heat.generatedBtuPerHr, BTU_PER_HOUR_PER_HORSEPOWER)} />
        <ResultFigure path="heat.shedBtuPerHr" label="Heat the tank sheds" estimate value={round10(spec.heat.shedBtuPerHr)} unit="Btu/h" metric={metric.watts(spec.heat.shedBtuPerHr, BTU_PER_HOUR_PER_HORSEPOWER)} />
        <ResultFigure
          path="heat.coolerBtuPerHr"
          label="Cooler to add"
          estimate
          value={spec.heat.coolerAdvised ? round10(spec.heat.coolerBtuPerHr) : "None"}
          unit={spec.heat.coolerAdvised ? "Btu/h" : ""}
          metric={spec.heat.coolerAdvised ? metric.watts(spec.heat.coolerBtuPerHr, BTU_PER_HOUR_PER_HORSEPOWER) : "the tank keeps up"}
        />
      </div>
    </section>
  );
}

function SuctionInletFacts({ suction }: { suction: KitSpec["lines"]["suction"] }) {
  // Saved specs from before the inlet check have no inlet figures.
  if (suction.inletInHg === undefined || !suction.cold) return null;
  const rows = [
    { key: "working", label: "Working", inlet: suction },
    { key: "cold", label: "Cold start", inlet: suction.cold },
  ];
  return (
    <div className="mt-1 border-t border-line pt-1 text-sm" data-testid="suction-inlet">
      <p className="font-semibold">
        Vacuum at the pump inlet (limit {fmt(suction.inletLimitInHg, 1)} inHg{suction.equivalentLengthFt > 0 ? `; fittings as ${fmt(suction.equivalentLengthFt, 1)} ft of line` : ""})
      </p>
      <ul className="space-y-0.5">
        {rows.map(({ key, label, inlet }) => {
          const over = inlet.inletInHg > suction.inletLimitInHg;
          return (
            <li key={key} data-inlet={key} className="flex flex-wrap gap-x-2">
              <span className="w-20 text-ink-soft">{label}</span>
              <strong className={over ? "text-stop-700" : undefined}>
                {over ? "▲ " : ""}
                {fmt(inlet.inletInHg, 1)} inHg
              </strong>
              <span className="text-ink-soft">
                {fmt(inlet.viscosityCst, 0)} cSt, {inlet.regime}, Re {fmt(inlet.reynolds, 0)}, friction {fmt(inlet.pressureDropPsi, 2)} psi
              </span>
            </li>
          );
        })}
      </ul>
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
          {spec.limits.torqueAtReliefLbFt !== undefined && (
            <ResultFigure
              path="limits.torqueAtReliefLbFt"
              label="PTO torque at relief"
              value={fmt(spec.limits.torqueAtReliefLbFt, 0)}
              unit="lb·ft"
              metric={input.ptoIntermittentTorqueLbFt !== undefined ? `PTO intermittent ${fmt(input.ptoIntermittentTorqueLbFt, 0)} lb·ft` : metric.newtonMetres(spec.limits.torqueAtReliefLbFt)}
            />
          )}
          {spec.limits.pumpRpmAtGovernedEngine !== undefined && (
            <ResultFigure
              path="limits.pumpRpmAtGovernedEngine"
              label="Pump speed, engine governed"
              value={fmt(spec.limits.pumpRpmAtGovernedEngine, 0)}
              unit="rpm"
              metric={input.pumpMaxRpm !== undefined ? `pump maximum ${fmt(input.pumpMaxRpm, 0)} rpm` : undefined}
            />
          )}
          {spec.engineRpmForTargetFlow !== undefined && (
            <ResultFigure
              path="engineRpmForTargetFlow"
              label={`Engine speed for ${fmt(input.targetFlowGpm ?? 0, 1)} gpm`}
              value={fmt(spec.engineRpmForTargetFlow, 0)}
              unit="rpm"
              metric={input.governedEngineRpm !== undefined ? `governed ${fmt(input.governedEngineRpm, 0)} rpm` : undefined}
            />
          )}
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
            <ResultFigure path="tank.usableGal" label="Oil above the pick-up" value={fmt(spec.tank.usableGal, 1)} unit="gal" metric={metric.litres(spec.tank.usableGal)} />
            {spec.tank.leftAfterTrailerGal !== undefined && (
              <ResultFigure
                path="tank.leftAfterTrailerGal"
                label="Left when the trailer is full"
                value={fmt(spec.tank.leftAfterTrailerGal, 1)}
                unit="gal"
                metric={spec.tank.leftAfterTrailerGal < 0 ? "⚠ the pump draws air" : metric.litres(spec.tank.leftAfterTrailerGal)}
              />
            )}
            <ResultFigure
              path="tank.expansionGal"
              label="Oil growth when warm"
              value={fmt(spec.tank.expansionGal, 2)}
              unit="gal"
              metric={`room above the oil ${fmt(spec.tank.airGal, 2)} gal`}
              extraPaths={["tank.airGal"]}
            />
          </div>
        </div>
      </section>

      <HeatSection spec={spec} />

      {hasRatings(spec) && <ReliefSection input={input} spec={spec} />}

      {spec.cylinder && (
        <section aria-label="Cylinders" className="space-y-2">
          <Heading>Trailer cylinders</Heading>
          <p className="text-sm text-ink-soft">
            {input.cylinder?.count ?? 1} × {fmt(input.cylinder?.boreIn ?? 0, 2)} in bore, {fmt(input.cylinder?.rodIn ?? 0, 2)} in rod, {fmt(input.cylinder?.strokeIn ?? 0, 1)} in stroke, at {fmt(spec.flowGpm, 1)} gpm
          </p>
          <div className={grid}>
            <ResultFigure path="cylinder.extendGal" label="Oil out to extend" value={fmt(spec.cylinder.extendGal, 2)} unit="gal" metric={metric.litres(spec.cylinder.extendGal)} />
            <ResultFigure path="cylinder.extendSeconds" label="Time to extend" value={fmt(spec.cylinder.extendSeconds, 1)} unit="s" />
            <ResultFigure path="cylinder.retractGal" label="Oil to retract" value={fmt(spec.cylinder.retractGal, 2)} unit="gal" metric={metric.litres(spec.cylinder.retractGal)} />
            <ResultFigure path="cylinder.retractSeconds" label="Time to retract" value={fmt(spec.cylinder.retractSeconds, 1)} unit="s" />
          </div>
        </section>
      )}

      <section aria-label="Lines" className="space-y-2">
        <Heading>Line velocities</Heading>
        <div className="grid gap-2 @2xl:grid-cols-2 @5xl:grid-cols-3">
          {lineEntries(input, spec).map(({ name, line, insideDiameterIn, lengthFt }) => (
            <div key={name} data-line={name} className="space-y-1 rounded-md border border-line bg-panel px-3 py-2 print:break-inside-avoid">
              <p className="font-semibold">{LINE_NAMES[name]}</p>
              <LineFacts line={line} insideDiameterIn={insideDiameterIn} lengthFt={lengthFt} />
              {name === "suction" && <SuctionInletFacts suction={spec.lines.suction} />}
            </div>
          ))}
        </div>
        <FormulaToggle
          paths={["lines.velocityFps", "lines.minInsideDiameterIn", "lines.bandFps", "lines.status", "lines.reynolds", "lines.pressureDropPsi", "lines.inletInHg", "lines.viscosityCst", "lines.inletLimitInHg", "lines.equivalentLengthFt"]}
          label="Line formulas and sources"
        />
        <BandSources workingPressurePsi={input.workingPressurePsi} withPressure={Boolean(spec.lines.pressure)} />
      </section>

      <KitCautions />
    </div>
  );
}
