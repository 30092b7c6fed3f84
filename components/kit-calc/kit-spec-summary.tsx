import type { KitCalcInput, KitSpec } from "@/server/kit-calc";
import { KitCautions } from "./cautions";
import { fmt, metric } from "./format";
import { KitWarnings } from "./results";
import { LINE_NAMES, LineStatusBadge, bandText, lineEntries } from "./lines";

function Tile({ label, value, unit, sub, testId }: { label: string; value: string; unit: string; sub?: string; testId?: string }) {
  return (
    <div className="rounded-md border border-line bg-panel px-3 py-2 print:break-inside-avoid print:px-2 print:py-1">
      <p className="text-sm font-semibold text-ink-soft">{label}</p>
      <p className="text-xl font-bold leading-tight print:text-lg" data-testid={testId}>
        {value} <span className="text-base font-semibold">{unit}</span>
      </p>
      {sub && <p className="text-sm text-ink-soft">{sub}</p>}
    </div>
  );
}

function tankWords(input: KitCalcInput) {
  const t = input.tank;
  const size =
    t.shape === "round"
      ? `Round tube ${fmt(t.insideDiameterIn, 1)} in ID × ${fmt(t.lengthIn, 1)} in long`
      : t.shape === "d"
        ? `D-shape ${fmt(t.lengthIn, 1)} in long × ${fmt(t.widthIn, 1)} in wide × ${fmt(t.heightIn, 1)} in high (flat side on the rail)`
        : `Box ${fmt(t.lengthIn, 1)} × ${fmt(t.widthIn, 1)} × ${fmt(t.heightIn, 1)} in high`;
  const sump = input.sumpGal ? `, ${fmt(input.sumpGal, 1)} gal sump` : "";
  const fill = input.fillDepthIn !== undefined ? `, oil ${fmt(input.fillDepthIn, 1)} in deep` : ", filled 90 % by volume";
  return size + sump + fill;
}

/** A saved kit spec, read-only: what it was built for, the figures a tech builds to, and its warnings. Prints on the shop sheet. */
export function KitSpecSummary({ inputs, results }: { inputs: KitCalcInput; results: KitSpec }) {
  return (
    <div className="space-y-4 print:space-y-2">
      <dl className="grid gap-x-4 gap-y-1 text-sm sm:grid-cols-[auto_1fr]">
        <dt className="font-semibold">Drive</dt>
        <dd>
          Engine {fmt(inputs.engineRpm, 0)} rpm at work × PTO {fmt(inputs.ptoRatioPercent, 0)} % · pump {fmt(inputs.pumpDisplacementCuIn, 2)} in³/rev ({metric.cc(inputs.pumpDisplacementCuIn)})
          {inputs.ptoTorqueRatingLbFt !== undefined && <> · PTO rated {fmt(inputs.ptoTorqueRatingLbFt, 0)} lb·ft</>}
        </dd>
        <dt className="font-semibold">Pressure</dt>
        <dd>
          Working {fmt(inputs.workingPressurePsi, 0)} psi ({metric.bar(inputs.workingPressurePsi)})
          {inputs.reliefPressurePsi !== undefined ? <> · relief {fmt(inputs.reliefPressurePsi, 0)} psi ({metric.bar(inputs.reliefPressurePsi)})</> : " · relief not given"}
        </dd>
        <dt className="font-semibold">Reservoir</dt>
        <dd>{tankWords(inputs)}</dd>
      </dl>

      <div className="grid grid-cols-2 gap-2 sm:grid-cols-3 print:grid-cols-4">
        <Tile label="Pump flow" value={fmt(results.flowGpm, 1)} unit="gpm" sub={metric.lpm(results.flowGpm)} testId="spec-flow" />
        <Tile label="Pump shaft speed" value={fmt(results.pumpShaftRpm, 0)} unit="rpm" />
        <Tile label="Hydraulic / input power" value={`${fmt(results.hydraulicHp, 1)} / ${fmt(results.inputHp, 1)}`} unit="hp" sub={`${metric.kW(results.hydraulicHp)} / ${metric.kW(results.inputHp)}`} />
        <Tile label="PTO torque" value={fmt(results.pumpTorqueLbFt, 0)} unit="lb·ft" sub={metric.newtonMetres(results.pumpTorqueLbFt)} />
        <Tile label="Reservoir, total / oil" value={`${fmt(results.tank.totalGal, 1)} / ${fmt(results.tank.oilGal, 1)}`} unit="gal" sub={`${metric.litres(results.tank.totalGal)} / ${metric.litres(results.tank.oilGal)}`} />
        <Tile label="Oil held" value={fmt(results.reservoirMinutesOfFlow, 2)} unit="min of flow" />
        {/* Specs saved before the heat and usable-oil checks carry neither figure. */}
        {results.tank.usableGal !== undefined && <Tile label="Oil above the pick-up" value={fmt(results.tank.usableGal, 1)} unit="gal" sub={metric.litres(results.tank.usableGal)} />}
        {results.heat.generatedBtuPerHr !== undefined && (
          <Tile
            label="Heat made / shed (estimate)"
            value={`${fmt(Math.round(results.heat.generatedBtuPerHr / 10) * 10, 0)} / ${fmt(Math.round(results.heat.shedBtuPerHr / 10) * 10, 0)}`}
            unit="Btu/h"
            sub={results.heat.coolerAdvised ? `cooler of at least ${fmt(Math.round(results.heat.coolerBtuPerHr / 10) * 10, 0)} Btu/h` : "no cooler needed"}
          />
        )}
      </div>

      <div className="overflow-x-auto">
        <table className="w-full min-w-[20rem] border-collapse text-sm">
          <caption className="mb-1 text-left font-semibold">Line velocities</caption>
          <thead>
            <tr className="border-b border-line text-left">
              <th scope="col" className="py-1 pr-2">Line</th>
              <th scope="col" className="py-1 pr-2">ID × length</th>
              <th scope="col" className="py-1 pr-2">Velocity</th>
              <th scope="col" className="py-1">Against range</th>
            </tr>
          </thead>
          <tbody>
            {lineEntries(inputs, results).map(({ name, line, insideDiameterIn, lengthFt }) => (
              <tr key={name} className="border-b border-line/60 align-top" data-line={name}>
                <th scope="row" className="py-1.5 pr-2 text-left font-semibold">{LINE_NAMES[name].replace(" line", "")}</th>
                <td className="py-1.5 pr-2">
                  {fmt(insideDiameterIn, 2)} in × {fmt(lengthFt, 1)} ft
                </td>
                <td className="py-1.5 pr-2 whitespace-nowrap">
                  {fmt(line.velocityFps, 1)} ft/s
                  <span className="block text-ink-soft">{metric.mPerS(line.velocityFps)}</span>
                </td>
                <td className="py-1.5">
                  <LineStatusBadge status={line.status} />
                  <span className="block text-ink-soft">
                    {bandText(line)}; min ID {fmt(line.minInsideDiameterIn, 2)} in
                  </span>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>

      <KitWarnings warnings={results.warnings} />
      <KitCautions />
    </div>
  );
}
