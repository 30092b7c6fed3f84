import { sources } from "./sources";

// Recommended oil velocities in hydraulic lines. These are guidance from hose and component makers' sizing
// guides (and, for suction and pressure lines, fluid-power textbooks), not a standard: no SAE or ISO number gives
// them. The return-line band is found in makers' guides only. All three are from memory. Kept as configuration so the
// shop can see (and the UI can print) where each band comes from.

export interface VelocityBand {
  minFps: number;
  maxFps: number;
  source: string;
}

export const velocityBandSources = {
  suction:
    "Hose makers' sizing guides and fluid-power textbooks, from memory: suction lines 2–4 ft/s (guidance, not a standard)",
  return:
    "Hose and component makers' sizing guides, from memory: return lines 10–15 ft/s (makers' guidance only, not a standard)",
  pressure:
    "Hose makers' sizing guides and fluid-power textbooks, from memory: pressure lines 15–20 ft/s at 500–3000 psi (guidance, not a standard)",
  lowPressure: `${sources.commonPractice}: below 500 psi a pressure line is held to the return-line band, 10–15 ft/s, because its friction loss is a larger share of the little pressure there is`,
} as const;

// The pressure band applies from this working pressure up; the guidance tops out at 3000 psi and the
// calculator keeps 15–20 ft/s above it rather than extrapolate.
export const PRESSURE_BAND_FROM_PSI = 500;

export const velocityBands = {
  suction: { minFps: 2, maxFps: 4, source: velocityBandSources.suction },
  return: { minFps: 10, maxFps: 15, source: velocityBandSources.return },
  pressure: { minFps: 15, maxFps: 20, source: velocityBandSources.pressure },
  pressureBelow500Psi: { minFps: 10, maxFps: 15, source: velocityBandSources.lowPressure },
} as const satisfies Record<string, VelocityBand>;

export function pressureLineBand(workingPressurePsi: number): VelocityBand {
  return workingPressurePsi < PRESSURE_BAND_FROM_PSI ? velocityBands.pressureBelow500Psi : velocityBands.pressure;
}
