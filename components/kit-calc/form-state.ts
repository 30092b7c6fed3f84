import type { z } from "zod";
import { fieldErrors } from "@/server/http/errors";
import { kitCalcDefaults, kitCalcInputSchema, type KitCalcInput } from "@/server/kit-calc";
import {
  DEFAULT_OIL_SPECIFIC_GRAVITY,
  DEFAULT_OIL_VISCOSITY_CST,
  DEFAULT_PICKUP_HEIGHT_IN,
  DEFAULT_PUMP_INLET_LIMIT_IN_HG,
} from "@/server/kit-calc/practice";
import { metric } from "./format";

// The form keeps what was typed, as text, so "0." or a half-typed number is never lost; it becomes the API's
// input only when sent. Each key names the API path its errors come back under.
export const FIELD_PATHS = {
  engineRpm: "engineRpm",
  ptoRatioPercent: "ptoRatioPercent",
  pumpDisplacementCuIn: "pumpDisplacementCuIn",
  volumetricEfficiency: "volumetricEfficiency",
  mechanicalEfficiency: "mechanicalEfficiency",
  ptoTorqueRatingLbFt: "ptoTorqueRatingLbFt",
  workingPressurePsi: "workingPressurePsi",
  reliefPressurePsi: "reliefPressurePsi",
  tankDiameterIn: "tank.insideDiameterIn",
  tankLengthIn: "tank.lengthIn",
  tankWidthIn: "tank.widthIn",
  tankHeightIn: "tank.heightIn",
  fillDepthIn: "fillDepthIn",
  sumpGal: "sumpGal",
  trailerOilNeedGal: "trailerOilNeedGal",
  oilToAirDeltaF: "oilToAirDeltaF",
  suctionIdIn: "suctionLine.insideDiameterIn",
  suctionLengthFt: "suctionLine.lengthFt",
  returnIdIn: "returnLine.insideDiameterIn",
  returnLengthFt: "returnLine.lengthFt",
  pressureIdIn: "pressureLine.insideDiameterIn",
  pressureLengthFt: "pressureLine.lengthFt",
  // "More about this kit": ratings, duty, oil, pick-up, target flow and cylinder.
  ptoIntermittentTorqueLbFt: "ptoIntermittentTorqueLbFt",
  ptoHpRating: "ptoHpRating",
  pumpMaxRpm: "pumpMaxRpm",
  governedEngineRpm: "governedEngineRpm",
  pumpRatedPsi: "pumpRatedPsi",
  hoseRatedPsi: "hoseRatedPsi",
  trailerRatedPsi: "trailerRatedPsi",
  dutyAtWorkingPercent: "dutyAtWorkingPercent",
  dutyOverReliefPercent: "dutyOverReliefPercent",
  oilViscosityColdCst: "oilViscosityCst.cold",
  oilViscosityWorkingCst: "oilViscosityCst.working",
  oilSpecificGravity: "oilSpecificGravity",
  suctionFittingsEquivalentFt: "suctionFittingsEquivalentFt",
  pumpInletLimitInHg: "pumpInletLimitInHg",
  pickupHeightIn: "pickupHeightIn",
  targetFlowGpm: "targetFlowGpm",
  cylinderBoreIn: "cylinder.boreIn",
  cylinderRodIn: "cylinder.rodIn",
  cylinderStrokeIn: "cylinder.strokeIn",
  cylinderCount: "cylinder.count",
} as const;

export type KitField = keyof typeof FIELD_PATHS;
export type TankShape = "round" | "box" | "d";
export type KitFormState = Record<KitField, string> & { shape: TankShape };

export interface FieldSpec {
  label: string;
  /** Shown in the empty box: the value used when it is left blank. */
  placeholder?: string;
  optional?: boolean;
  /** Said under an empty optional box. */
  blankMeans?: string;
  /** The typed value in metric, shown under the box. */
  metric?: (value: number) => string;
}

export const FIELD_SPECS: Record<KitField, FieldSpec> = {
  engineRpm: { label: "Engine speed at work, rpm" },
  ptoRatioPercent: { label: "PTO ratio, % of engine speed" },
  pumpDisplacementCuIn: { label: "Pump displacement, in³/rev", metric: metric.cc },
  volumetricEfficiency: { label: "Volumetric efficiency, 0–1", placeholder: kitCalcDefaults.volumetricEfficiency.toFixed(2), optional: true, blankMeans: `Blank: ${kitCalcDefaults.volumetricEfficiency.toFixed(2)}` },
  mechanicalEfficiency: { label: "Mechanical efficiency, 0–1", placeholder: kitCalcDefaults.mechanicalEfficiency.toFixed(2), optional: true, blankMeans: `Blank: ${kitCalcDefaults.mechanicalEfficiency.toFixed(2)}` },
  ptoTorqueRatingLbFt: { label: "PTO torque rating, lb·ft", optional: true, metric: metric.newtonMetres },
  workingPressurePsi: { label: "Working pressure, psi", metric: metric.bar },
  reliefPressurePsi: { label: "Relief setting, psi", optional: true, metric: metric.bar },
  tankDiameterIn: { label: "Inside diameter, in", metric: metric.mm },
  tankLengthIn: { label: "Length, in", metric: metric.mm },
  tankWidthIn: { label: "Width, in", metric: metric.mm },
  tankHeightIn: { label: "Height, in", metric: metric.mm },
  fillDepthIn: { label: "Oil depth, in", optional: true, blankMeans: "Blank: 90 % full", metric: metric.mm },
  sumpGal: { label: "Sump, gal", optional: true, blankMeans: "Blank: no sump", metric: metric.litres },
  trailerOilNeedGal: { label: "Trailer cylinders draw, gal", optional: true, metric: metric.litres },
  oilToAirDeltaF: { label: "Oil above air, °F", placeholder: String(kitCalcDefaults.oilToAirDeltaF), optional: true, blankMeans: `Blank: ${kitCalcDefaults.oilToAirDeltaF} °F`, metric: metric.kelvinDifference },
  suctionIdIn: { label: "Suction ID, in", metric: metric.mm },
  suctionLengthFt: { label: "Suction length, ft", metric: metric.m },
  returnIdIn: { label: "Return ID, in", metric: metric.mm },
  returnLengthFt: { label: "Return length, ft", metric: metric.m },
  pressureIdIn: { label: "Pressure ID, in", optional: true, metric: metric.mm },
  pressureLengthFt: { label: "Pressure length, ft", optional: true, metric: metric.m },
  ptoIntermittentTorqueLbFt: { label: "PTO intermittent torque, lb·ft", optional: true, metric: metric.newtonMetres },
  ptoHpRating: { label: "PTO power rating, hp", optional: true, metric: metric.kW },
  pumpMaxRpm: { label: "Pump maximum speed, rpm", optional: true },
  governedEngineRpm: { label: "Governed engine speed, rpm", optional: true },
  pumpRatedPsi: { label: "Pump rated pressure, psi", optional: true, metric: metric.bar },
  hoseRatedPsi: { label: "Hose rated pressure, psi", optional: true, metric: metric.bar },
  trailerRatedPsi: { label: "Trailer circuit rated, psi", optional: true, metric: metric.bar },
  dutyAtWorkingPercent: { label: "Time at working pressure, %", optional: true, blankMeans: "Blank: all the time not over the relief" },
  dutyOverReliefPercent: { label: "Time over the relief, %", placeholder: "0", optional: true, blankMeans: "Blank: 0 %" },
  oilViscosityColdCst: { label: "Oil viscosity cold, cSt", placeholder: String(DEFAULT_OIL_VISCOSITY_CST.cold), optional: true, blankMeans: `Blank: ${DEFAULT_OIL_VISCOSITY_CST.cold} cSt` },
  oilViscosityWorkingCst: { label: "Oil viscosity working, cSt", placeholder: String(DEFAULT_OIL_VISCOSITY_CST.working), optional: true, blankMeans: `Blank: ${DEFAULT_OIL_VISCOSITY_CST.working} cSt (ISO VG 46)` },
  oilSpecificGravity: { label: "Oil specific gravity", placeholder: String(DEFAULT_OIL_SPECIFIC_GRAVITY), optional: true, blankMeans: `Blank: ${DEFAULT_OIL_SPECIFIC_GRAVITY}` },
  suctionFittingsEquivalentFt: { label: "Suction fittings and strainer, ft of line", placeholder: "0", optional: true, blankMeans: "Blank: none", metric: metric.m },
  pumpInletLimitInHg: { label: "Pump inlet limit, inHg", placeholder: String(DEFAULT_PUMP_INLET_LIMIT_IN_HG), optional: true, blankMeans: `Blank: ${DEFAULT_PUMP_INLET_LIMIT_IN_HG} inHg` },
  pickupHeightIn: { label: "Pick-up above the bottom, in", placeholder: String(DEFAULT_PICKUP_HEIGHT_IN), optional: true, blankMeans: `Blank: ${DEFAULT_PICKUP_HEIGHT_IN} in`, metric: metric.mm },
  targetFlowGpm: { label: "Target flow, gpm", optional: true, metric: metric.lpm },
  cylinderBoreIn: { label: "Cylinder bore, in", optional: true, metric: metric.mm },
  cylinderRodIn: { label: "Cylinder rod, in", optional: true, metric: metric.mm },
  cylinderStrokeIn: { label: "Cylinder stroke, in", optional: true, metric: metric.mm },
  cylinderCount: { label: "Number of cylinders", placeholder: "1", optional: true, blankMeans: "Blank: 1" },
};

/** The boxes folded under "More about this kit". */
export const MORE_FIELDS: readonly KitField[] = [
  "ptoIntermittentTorqueLbFt", "ptoHpRating", "pumpMaxRpm", "governedEngineRpm", "pumpRatedPsi", "hoseRatedPsi", "trailerRatedPsi",
  "dutyAtWorkingPercent", "dutyOverReliefPercent", "oilViscosityColdCst", "oilViscosityWorkingCst", "oilSpecificGravity",
  "suctionFittingsEquivalentFt", "pumpInletLimitInHg", "pickupHeightIn", "targetFlowGpm", "cylinderBoreIn", "cylinderRodIn",
  "cylinderStrokeIn", "cylinderCount",
];

const text = (value: number | undefined) => (value === undefined ? "" : String(value));

export function formStateFromInput(input: KitCalcInput): KitFormState {
  const tank = input.tank;
  return {
    engineRpm: text(input.engineRpm),
    ptoRatioPercent: text(input.ptoRatioPercent),
    pumpDisplacementCuIn: text(input.pumpDisplacementCuIn),
    volumetricEfficiency: text(input.volumetricEfficiency),
    mechanicalEfficiency: text(input.mechanicalEfficiency),
    ptoTorqueRatingLbFt: text(input.ptoTorqueRatingLbFt),
    workingPressurePsi: text(input.workingPressurePsi),
    reliefPressurePsi: text(input.reliefPressurePsi),
    shape: tank.shape,
    tankDiameterIn: text(tank.shape === "round" ? tank.insideDiameterIn : undefined),
    tankLengthIn: text(tank.lengthIn),
    tankWidthIn: text(tank.shape !== "round" ? tank.widthIn : undefined),
    tankHeightIn: text(tank.shape !== "round" ? tank.heightIn : undefined),
    fillDepthIn: text(input.fillDepthIn),
    sumpGal: text(input.sumpGal),
    trailerOilNeedGal: text(input.trailerOilNeedGal),
    oilToAirDeltaF: text(input.oilToAirDeltaF),
    suctionIdIn: text(input.suctionLine.insideDiameterIn),
    suctionLengthFt: text(input.suctionLine.lengthFt),
    returnIdIn: text(input.returnLine.insideDiameterIn),
    returnLengthFt: text(input.returnLine.lengthFt),
    pressureIdIn: text(input.pressureLine?.insideDiameterIn),
    pressureLengthFt: text(input.pressureLine?.lengthFt),
    ptoIntermittentTorqueLbFt: text(input.ptoIntermittentTorqueLbFt),
    ptoHpRating: text(input.ptoHpRating),
    pumpMaxRpm: text(input.pumpMaxRpm),
    governedEngineRpm: text(input.governedEngineRpm),
    pumpRatedPsi: text(input.pumpRatedPsi),
    hoseRatedPsi: text(input.hoseRatedPsi),
    trailerRatedPsi: text(input.trailerRatedPsi),
    dutyAtWorkingPercent: text(input.dutyAtWorkingPercent),
    dutyOverReliefPercent: text(input.dutyOverReliefPercent),
    oilViscosityColdCst: text(input.oilViscosityCst?.cold),
    oilViscosityWorkingCst: text(input.oilViscosityCst?.working),
    oilSpecificGravity: text(input.oilSpecificGravity),
    suctionFittingsEquivalentFt: text(input.suctionFittingsEquivalentFt),
    pumpInletLimitInHg: text(input.pumpInletLimitInHg),
    pickupHeightIn: text(input.pickupHeightIn),
    targetFlowGpm: text(input.targetFlowGpm),
    cylinderBoreIn: text(input.cylinder?.boreIn),
    cylinderRodIn: text(input.cylinder?.rodIn),
    cylinderStrokeIn: text(input.cylinder?.strokeIn),
    cylinderCount: text(input.cylinder?.count),
  };
}

/** Blank is "not given"; a number is sent as a number; anything else is sent as typed, for the schema to name. */
export function typedNumber(raw: string): number | string | undefined {
  const trimmed = raw.trim();
  if (trimmed === "") return undefined;
  const value = Number(trimmed);
  return Number.isFinite(value) ? value : trimmed;
}

function withoutBlanks(object: Record<string, unknown>) {
  return Object.fromEntries(Object.entries(object).filter(([, value]) => value !== undefined));
}

/** The API's input object, not yet checked. */
export function inputFromFormState(state: KitFormState): unknown {
  const n = (key: KitField) => typedNumber(state[key]);
  const pressureGiven = state.pressureIdIn.trim() !== "" || state.pressureLengthFt.trim() !== "";
  const given = (...keys: KitField[]) => keys.some((key) => state[key].trim() !== "");
  // Either viscosity alone is completed with the other's default, so one box can be changed by itself.
  const viscosityGiven = given("oilViscosityColdCst", "oilViscosityWorkingCst");
  const cylinderGiven = given("cylinderBoreIn", "cylinderRodIn", "cylinderStrokeIn", "cylinderCount");
  const input: Record<string, unknown> = {
    engineRpm: n("engineRpm"),
    ptoRatioPercent: n("ptoRatioPercent"),
    pumpDisplacementCuIn: n("pumpDisplacementCuIn"),
    volumetricEfficiency: n("volumetricEfficiency"),
    mechanicalEfficiency: n("mechanicalEfficiency"),
    ptoTorqueRatingLbFt: n("ptoTorqueRatingLbFt"),
    workingPressurePsi: n("workingPressurePsi"),
    reliefPressurePsi: n("reliefPressurePsi"),
    tank:
      state.shape === "round"
        ? { shape: "round", insideDiameterIn: n("tankDiameterIn"), lengthIn: n("tankLengthIn") }
        : { shape: state.shape, lengthIn: n("tankLengthIn"), widthIn: n("tankWidthIn"), heightIn: n("tankHeightIn") },
    fillDepthIn: n("fillDepthIn"),
    sumpGal: n("sumpGal"),
    trailerOilNeedGal: n("trailerOilNeedGal"),
    oilToAirDeltaF: n("oilToAirDeltaF"),
    suctionLine: { insideDiameterIn: n("suctionIdIn"), lengthFt: n("suctionLengthFt") },
    returnLine: { insideDiameterIn: n("returnIdIn"), lengthFt: n("returnLengthFt") },
    pressureLine: pressureGiven ? { insideDiameterIn: n("pressureIdIn"), lengthFt: n("pressureLengthFt") } : undefined,
    ptoIntermittentTorqueLbFt: n("ptoIntermittentTorqueLbFt"),
    ptoHpRating: n("ptoHpRating"),
    pumpMaxRpm: n("pumpMaxRpm"),
    governedEngineRpm: n("governedEngineRpm"),
    pumpRatedPsi: n("pumpRatedPsi"),
    hoseRatedPsi: n("hoseRatedPsi"),
    trailerRatedPsi: n("trailerRatedPsi"),
    dutyAtWorkingPercent: n("dutyAtWorkingPercent"),
    dutyOverReliefPercent: n("dutyOverReliefPercent"),
    oilViscosityCst: viscosityGiven
      ? { cold: n("oilViscosityColdCst") ?? DEFAULT_OIL_VISCOSITY_CST.cold, working: n("oilViscosityWorkingCst") ?? DEFAULT_OIL_VISCOSITY_CST.working }
      : undefined,
    oilSpecificGravity: n("oilSpecificGravity"),
    suctionFittingsEquivalentFt: n("suctionFittingsEquivalentFt"),
    pumpInletLimitInHg: n("pumpInletLimitInHg"),
    pickupHeightIn: n("pickupHeightIn"),
    targetFlowGpm: n("targetFlowGpm"),
    cylinder: cylinderGiven
      ? withoutBlanks({ boreIn: n("cylinderBoreIn"), rodIn: n("cylinderRodIn"), strokeIn: n("cylinderStrokeIn"), count: n("cylinderCount") })
      : undefined,
  };
  for (const key of Object.keys(input)) if (input[key] === undefined) delete input[key];
  return input;
}

export type FormFieldErrors = Partial<Record<KitField | "_", string[]>>;

const FIELD_BY_PATH = new Map<string, KitField>(Object.entries(FIELD_PATHS).map(([field, path]) => [path, field as KitField]));

// A whole-object error ("Suction line needs an inside diameter and a length.") is shown on the object's first box.
const OBJECT_FIELD: Record<string, KitField> = {
  tank: "tankLengthIn",
  suctionLine: "suctionIdIn",
  returnLine: "returnIdIn",
  pressureLine: "pressureIdIn",
  "tank.shape": "tankLengthIn",
  cylinder: "cylinderBoreIn",
  oilViscosityCst: "oilViscosityColdCst",
};

/** API field errors ("tank.lengthIn", or "inputs.tank.lengthIn" from the kit-spec route) onto the form's boxes. */
export function formErrorsFromApi(fields: Record<string, string[]>, prefix = ""): FormFieldErrors {
  const out: FormFieldErrors = {};
  for (const [rawPath, messages] of Object.entries(fields)) {
    const path = prefix && rawPath.startsWith(prefix) ? rawPath.slice(prefix.length) : rawPath;
    const field = FIELD_BY_PATH.get(path) ?? OBJECT_FIELD[path] ?? "_";
    (out[field] ??= []).push(...messages);
  }
  return out;
}

export type ParsedForm = { ok: true; input: KitCalcInput } | { ok: false; errors: FormFieldErrors };

/** The same schema the server parses with, so the form can say what is wrong before anything is sent. */
export function parseForm(state: KitFormState): ParsedForm {
  const result = kitCalcInputSchema.safeParse(inputFromFormState(state));
  if (result.success) return { ok: true, input: result.data };
  return { ok: false, errors: formErrorsFromApi(fieldErrors(result.error as z.ZodError)) };
}
