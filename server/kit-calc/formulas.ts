import { velocityBandSources } from "./bands";
import {
  DEFAULT_PICKUP_HEIGHT_IN,
  DEFAULT_PUMP_INLET_LIMIT_IN_HG,
  OIL_POUNDS_PER_GALLON,
  RESERVOIR_MIN_MINUTES_OF_FLOW,
  TANK_HEAT_SHED_BTU_PER_HR_SQFT_F,
  practiceSources,
} from "./practice";
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
    formula: "round: π r² L; box: L × W × H; D: ((W − h/2) h + π h²/8) L; gal = in³ / 231; plus the sump",
    source: `${sources.solidGeometry}; ${sources.nistUnits}`,
  },
  "tank.oilGal": {
    label: "Oil in the tank",
    formula: "round: L × (r² acos((r−h)/r) − (r−h)√(2rh − h²)); box: L × W × h; D: L × ((W − r) y + half the circle's segment of depth y), r = h/2; gal = in³ / 231; plus the sump",
    source: `${sources.segmentGeometry}; ${sources.nistUnits}`,
  },
  "tank.airSpacePercent": {
    label: "Air space",
    formula: "% = (capacity − oil) / capacity × 100; default fill leaves 10 %",
    source: practiceSources.airSpace,
  },
  "tank.wettedAreaSqFt": {
    label: "Wetted tank area",
    formula: "round: wetted arc 2r acos((r−h)/r) × L + 2 end segments; box: L × W + 2h(L + W); D: (W − r + y + half the wetted arc) × L + 2 end sections; ft² = in² / 144",
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
  "tank.usableGal": {
    label: "Oil above the pick-up",
    formula: `gal = oil at the fill depth − oil below the pick-up (same geometry; pick-up ${DEFAULT_PICKUP_HEIGHT_IN} in off the bottom unless entered; with a sump, the tank's oil only)`,
    source: `${sources.segmentGeometry}; ${sources.solidGeometry}; pick-up height from the trade reference's reservoir layout`,
  },
  "tank.leftAfterTrailerGal": {
    label: "Left above the pick-up with the trailer's cylinders full",
    formula: "gal = oil above the pick-up − oil the trailer's cylinders draw",
    source: `${sources.segmentGeometry}; ${sources.solidGeometry}`,
  },
  "tank.expansionGal": {
    label: "Oil growth as it warms",
    formula: "gal = oil gal × 0.0007 per °C × 5/9 × oil-to-air °F (warming from the fill temperature to working)",
    source: sources.oilExpansion,
  },
  "tank.airGal": {
    label: "Room above the oil",
    formula: "gal = capacity − oil",
    source: sources.solidGeometry,
  },
  "heat.generatedBtuPerHr": {
    label: "Heat the kit makes (estimate)",
    formula:
      "Btu/h = 2544 × (share at working pressure × (input hp − hydraulic hp) + share over the relief × gpm × relief psi / 1714.29 / (ηv ηm)); blank shares: all the time at working pressure",
    source: `${sources.fluidPowerPump} (energy balance: what the pump takes in and does not deliver is heat; oil over a relief turns all its power into heat); ${practiceSources.dutyDefault}`,
  },
  "heat.shedBtuPerHr": {
    label: "Heat the tank sheds (estimate)",
    formula: `Btu/h = wetted ft² × ${TANK_HEAT_SHED_BTU_PER_HR_SQFT_F.toFixed(1)} × oil-to-air °F (the same figure as the heat shed above)`,
    source: practiceSources.heatShed,
  },
  "heat.coolerBtuPerHr": {
    label: "Cooler to close the gap (estimate)",
    formula: "Btu/h = heat made − heat shed, when that is more than 0",
    source: `${practiceSources.heatShed}; ${sources.fluidPowerPump}`,
  },
  "limits.torqueAtReliefLbFt": {
    label: "PTO torque when the relief opens",
    formula: "lb·ft = relief psi × displacement in³/rev / (2π) / mechanical efficiency / 12",
    source: sources.fluidPowerPump,
  },
  "limits.pumpRpmAtGovernedEngine": {
    label: "Pump speed at governed engine speed",
    formula: "rpm = governed engine rpm × PTO ratio % / 100",
    source: sources.fluidPowerPump,
  },
  "relief.ratedPsi": {
    label: "Rated pressure",
    formula: "as entered from the maker's data (pump, hose or trailer circuit)",
    source: "The maker's rating as entered; from memory, the relief should open at or below the lowest rating in the circuit",
  },
  "relief.marginPsi": {
    label: "Room between relief and rating",
    formula: "psi = rated psi − relief psi (negative: the relief lets the pressure past the rating)",
    source: "Arithmetic on the maker's rating; from memory, the relief should open at or below the lowest rating in the circuit",
  },
  "relief.marginPercent": {
    label: "Room between relief and rating, share",
    formula: "% = (rated − relief) / rated × 100",
    source: "Arithmetic on the maker's rating; from memory, the relief should open at or below the lowest rating in the circuit",
  },
  "lines.viscosityCst": {
    label: "Oil viscosity",
    formula: "cSt as entered; blank: 500 cold, 46 working (ISO VG 46)",
    source: sources.viscosity,
  },
  "lines.reynolds": {
    label: "Reynolds number",
    formula: "Re = v × d / ν (SI units); laminar below 2000, turbulent above 4000",
    source: sources.fluidFriction,
  },
  "lines.pressureDropPsi": {
    label: "Suction line friction",
    formula: "Δp = f × (L + fittings) / d × ρ v² / 2; f = the larger of 64/Re and 0.316/Re^0.25; ρ = specific gravity × 1000 kg/m³",
    source: `${sources.fluidFriction}; taking the larger f: ${sources.commonPractice}`,
  },
  "lines.inletInHg": {
    label: "Vacuum at the pump inlet",
    formula: "inHg = (friction Δp + ρ v² / 2) / 3386.39 Pa, oil level with the pump inlet",
    source: `${sources.fluidFriction}; Bernoulli for the velocity head; 1 inHg = 3386.389 Pa (${sources.nistSp811})`,
  },
  "lines.inletLimitInHg": {
    label: "Pump inlet limit",
    formula: `inHg as entered from the pump's data sheet; blank: ${DEFAULT_PUMP_INLET_LIMIT_IN_HG}`,
    source: sources.inletLimit,
  },
  "lines.equivalentLengthFt": {
    label: "Fittings and strainer as line length",
    formula: "ft of straight line that loses as much as the fittings and strainer (from the makers' tables); blank: 0",
    source: sources.fluidFriction,
  },
  engineRpmForTargetFlow: {
    label: "Engine speed for the target flow",
    formula: "rpm = target gpm × 231 / (displacement × volumetric efficiency) × 100 / PTO ratio %",
    source: `${sources.fluidPowerPump}; 231 in³ per gallon from ${sources.nistUnits}`,
  },
  "cylinder.extendGal": {
    label: "Oil to extend the cylinders",
    formula: "gal = π/4 × bore² × stroke × count / 231",
    source: `${sources.solidGeometry}; ${sources.nistUnits}`,
  },
  "cylinder.retractGal": {
    label: "Oil to retract the cylinders",
    formula: "gal = π/4 × (bore² − rod²) × stroke × count / 231",
    source: `${sources.solidGeometry}; ${sources.nistUnits}`,
  },
  "cylinder.extendSeconds": {
    label: "Time to extend at pump flow",
    formula: "s = extend gal / pump gpm × 60",
    source: sources.solidGeometry,
  },
  "cylinder.retractSeconds": {
    label: "Time to retract at pump flow",
    formula: "s = retract gal / pump gpm × 60",
    source: sources.solidGeometry,
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
  const id = path
    .replace(/^lines\.(suction|return|pressure)\.(cold\.)?/, "lines.")
    .replace(/^relief\.(pump|hose|trailer)\./, "relief.")
    .replace(/\.\d+$/, "");
  return (formulas as Record<string, KitFormula>)[id];
}
