/**
 * Fit checks of bought-in parts against the truck and the job's kit spec. Transmissions are
 * written as the shop writes them ("18-speed manual"), so they are compared without case, spaces
 * or punctuation; anything else that differs is flagged for a person to look at, never fixed.
 */

export interface FitTruck {
  transmission: string;
}

export interface FitSpec {
  /** PTO output, % of engine speed, as the calculator takes it. */
  ptoRatioPercent: number | null;
  /** Pump displacement, cu in per revolution. */
  pumpDisplacementCuIn: number | null;
}

export interface FitLine {
  kind: string;
  fitsTransmission: string;
  ratioPercent: number | null;
  displacementCuIn: number | null;
}

export interface FitFlag {
  code: "transmission_missing" | "transmission_unknown" | "transmission_mismatch" | "ratio_differs" | "ratio_missing" | "displacement_differs" | "displacement_missing";
  message: string;
}

// A PTO's ratio is catalogued to the whole percent (1.22 = 122 %) and a pump's displacement to
// the hundredth of a cubic inch (common practice, no published source): closer than half of that
// is the same figure written differently.
const RATIO_TOLERANCE_PERCENT = 0.5;
const DISPLACEMENT_TOLERANCE_CU_IN = 0.005;

export function normaliseTransmission(text: string) {
  return text.toLowerCase().replace(/[^a-z0-9]/g, "");
}

export function fitFlags(line: FitLine, truck: FitTruck, spec: FitSpec | null): FitFlag[] {
  const flags: FitFlag[] = [];
  if (line.kind === "pto") {
    if (!line.fitsTransmission.trim()) {
      flags.push({ code: "transmission_missing", message: "Record the transmission this PTO fits, to check it against the truck." });
    } else if (!truck.transmission.trim()) {
      flags.push({ code: "transmission_unknown", message: "The truck's transmission is not recorded: add it on the truck to check this PTO." });
    } else if (normaliseTransmission(line.fitsTransmission) !== normaliseTransmission(truck.transmission)) {
      flags.push({ code: "transmission_mismatch", message: `Fits ${line.fitsTransmission}, but the truck has ${truck.transmission}.` });
    }
    if (spec?.ptoRatioPercent != null) {
      if (line.ratioPercent === null) flags.push({ code: "ratio_missing", message: `Record this PTO's ratio; the kit spec calls for ${spec.ptoRatioPercent} %.` });
      else if (Math.abs(line.ratioPercent - spec.ptoRatioPercent) >= RATIO_TOLERANCE_PERCENT) {
        flags.push({ code: "ratio_differs", message: `Ratio ${line.ratioPercent} % differs from the kit spec's ${spec.ptoRatioPercent} %.` });
      }
    }
  }
  if (line.kind === "pump" && spec?.pumpDisplacementCuIn != null) {
    if (line.displacementCuIn === null) flags.push({ code: "displacement_missing", message: `Record this pump's displacement; the kit spec calls for ${spec.pumpDisplacementCuIn} cu in/rev.` });
    else if (Math.abs(line.displacementCuIn - spec.pumpDisplacementCuIn) >= DISPLACEMENT_TOLERANCE_CU_IN) {
      flags.push({ code: "displacement_differs", message: `Displacement ${line.displacementCuIn} cu in/rev differs from the kit spec's ${spec.pumpDisplacementCuIn} cu in/rev.` });
    }
  }
  return flags;
}
