import { velocityBandSources } from "./bands";
import { OIL_POUNDS_PER_GALLON, RESERVOIR_MIN_MINUTES_OF_FLOW, TANK_HEAT_SHED_BTU_PER_HR_SQFT_F, practiceSources } from "./practice";
import { sources } from "./sources";

export interface KitFormula {
  id: KitFormulaId;
  label: string;
  formula: string;
  source: string;
}

const bandSourceText = [
  velocityBandSources.suction,
  velocityBandSources.return,
  velocityBandSources.pressure,
  velocityBandSources.lowPressure,
].join("; ");

// Shown beside each result as "formula and source". Line entries serve the suction, return and pressure lines alike.
const entries = {
  pumpShaftRpm: {
    label: "Pump shaft speed",
    formula: "rpm = engine rpm × PTO ratio % / 100",
    source: sources.fluidPowerPump,
  },
  theoreticalFlowGpm: {
    label: "Theoretical pump flow",
    formula: "gpm = displacement in³/rev × shaft rpm / 231",
    source: `${sources.fluidPowerPump}; 231 in³ per gallon from ${sources.nistUnits}`,
  },
  flowGpm: {
    label: "Pump flow",
    formula: "gpm = theoretical gpm × volumetric efficiency",
    source: sources.fluidPowerPump,
  },
  hydraulicHp: {
    label: "Hydraulic power",
    formula: "hp = gpm × psi / 1714.29 (12 × 33,000 / 231; often rounded to 1714)",
    source: sources.fluidPowerPump,
  },
  inputHp: {
    label: "Power into the pump",
    formula: "hp = hydraulic hp / (volumetric efficiency × mechanical efficiency)",
    source: sources.fluidPowerPump,
  },
  pumpTorqueLbFt: {
    label: "Pump torque on the PTO",
    formula: "lb·ft = psi × displacement in³/rev / (2π) / mechanical efficiency / 12 (same as input hp × 5252 / rpm)",
    source: sources.fluidPowerPump,
  },
  "tank.totalGal": {
    label: "Tank capacity",
    formula: "round: π r² L; box: L × W × H; gal = in³ / 231; plus the sump",
    source: `${sources.solidGeometry}; ${sources.nistUnits}`,
  },
  "tank.oilGal": {
    label: "Oil in the tank",
    formula: "round: L × (r² acos((r−h)/r) − (r−h)√(2rh − h²)); box: L × W × h; gal = in³ / 231; plus the sump",
    source: `${sources.segmentGeometry}; ${sources.nistUnits}`,
  },
  "tank.airSpacePercent": {
    label: "Air space",
    formula: "% = (capacity − oil) / capacity × 100; default fill leaves 10 %",
    source: practiceSources.airSpace,
  },
  "tank.wettedAreaSqFt": {
    label: "Wetted tank area",
    formula: "round: wetted arc 2r acos((r−h)/r) × L + 2 end segments; box: L × W + 2h(L + W); ft² = in² / 144",
    source: `${sources.segmentGeometry}; ${sources.solidGeometry}`,
  },
  "tank.oilWeightLb": {
    label: "Oil weight",
    formula: `lb = oil gal × ${OIL_POUNDS_PER_GALLON}`,
    source: practiceSources.oilWeight,
  },
  reservoirMinutesOfFlow: {
    label: "Reservoir, minutes of pump flow",
    formula: `minutes = oil gal / pump gpm (warn under ${RESERVOIR_MIN_MINUTES_OF_FLOW})`,
    source: practiceSources.reservoirMinutes,
  },
  "lines.velocityFps": {
    label: "Oil velocity in the line",
    formula: "ft/s = 0.4085 × gpm / d² (exactly (231/720) / (π/4))",
    source: sources.fluidPowerLines,
  },
  "lines.bandFps": {
    label: "Recommended velocity range",
    formula: "suction 2–4 ft/s; return 10–15 ft/s; pressure 15–20 ft/s from 500 psi, 10–15 ft/s below",
    source: bandSourceText,
  },
  "lines.status": {
    label: "Velocity against the range",
    formula: "low below the range, high above it, ok inside it",
    source: bandSourceText,
  },
  "lines.minInsideDiameterIn": {
    label: "Smallest inside diameter",
    formula: "in = √(0.4085 × gpm / top of the range in ft/s)",
    source: sources.fluidPowerLines,
  },
  "heat.dissipationBtuPerHr": {
    label: "Heat the tank sheds (estimate)",
    formula: `Btu/h = wetted ft² × ${TANK_HEAT_SHED_BTU_PER_HR_SQFT_F.toFixed(1)} × oil-to-air °F`,
    source: practiceSources.heatShed,
  },
  "heat.dissipationHp": {
    label: "Heat the tank sheds, in horsepower (estimate)",
    formula: "hp = Btu/h / 2544",
    source: `${practiceSources.heatShed}; 1 hp = 2544 Btu/h (rounded; ${sources.nistSp811})`,
  },
  "metric.flowLpm": {
    label: "Pump flow (metric)",
    formula: "L/min = gpm × 3.785411784",
    source: sources.nistUnits,
  },
  "metric.pressureBar": {
    label: "Working pressure (metric)",
    formula: "bar = psi × 6894.757 / 100,000",
    source: sources.nistSp811,
  },
  "metric.hydraulicKw": {
    label: "Hydraulic power (metric)",
    formula: "kW = L/min × bar / 600",
    source: sources.fluidPowerPump,
  },
  "metric.tankL": {
    label: "Tank capacity (metric)",
    formula: "L = capacity gal × 3.785411784",
    source: sources.nistUnits,
  },
} as const satisfies Record<string, Omit<KitFormula, "id">>;

export type KitFormulaId = keyof typeof entries;

export const formulas = Object.fromEntries(
  Object.entries(entries).map(([id, entry]) => [id, { id, ...entry }]),
) as { readonly [Id in KitFormulaId]: KitFormula };

export const formulaList: readonly KitFormula[] = Object.values(formulas);

// A result's path in KitSpec ("lines.suction.velocityFps") to the formula shown beside it ("lines.velocityFps").
export function formulaForResult(path: string): KitFormula | undefined {
  const id = path.replace(/^lines\.(suction|return|pressure)\./, "lines.").replace(/\.\d+$/, "");
  return (formulas as Record<string, KitFormula>)[id];
}
