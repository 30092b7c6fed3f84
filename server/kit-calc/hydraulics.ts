import {
  CUBIC_INCHES_PER_GALLON,
  GPM_PSI_PER_HORSEPOWER,
  INCHES_PER_FOOT,
  SECONDS_PER_MINUTE,
} from "./units";

// Fluid-power textbook: PTO output speed = engine speed × PTO ratio (ratio as % of engine speed).
export function pumpShaftRpm(engineRpm: number, ptoRatioPercent: number): number {
  return (engineRpm * ptoRatioPercent) / 100;
}

// Fluid-power textbook (Fluid Power with Applications, ch. 5): Q [gpm] = D [in³/rev] × N [rpm] / 231.
export function theoreticalFlowGpm(displacementCuIn: number, shaftRpm: number): number {
  return (displacementCuIn * shaftRpm) / CUBIC_INCHES_PER_GALLON;
}

// Fluid-power textbook: HP = gpm × psi / 1714 (exact constant 1714.2857).
export function hydraulicHorsepower(flowGpm: number, pressurePsi: number): number {
  return (flowGpm * pressurePsi) / GPM_PSI_PER_HORSEPOWER;
}

// Fluid-power textbook: T [lb·in] = psi × D / (2π) theoretical, ÷ ηm actual; ÷ 12 for lb·ft.
export function pumpTorqueLbFt(pressurePsi: number, displacementCuIn: number, mechanicalEfficiency: number): number {
  return (pressurePsi * displacementCuIn) / (2 * Math.PI) / mechanicalEfficiency / INCHES_PER_FOOT;
}

// Fluid-power textbook: v [ft/s] = (231/720) × gpm / A [in²] = 0.4085 × gpm / d²; 231/720 turns in³/min per in² into ft/s.
const FPS_IN2_PER_GPM = CUBIC_INCHES_PER_GALLON / (INCHES_PER_FOOT * SECONDS_PER_MINUTE);
export const LINE_VELOCITY_FACTOR = FPS_IN2_PER_GPM / (Math.PI / 4);

// Fluid-power textbook (ch. 10): v = 0.4085 × gpm / d² with d the inside diameter in inches.
export function lineVelocityFps(flowGpm: number, insideDiameterIn: number): number {
  return (LINE_VELOCITY_FACTOR * flowGpm) / (insideDiameterIn * insideDiameterIn);
}

// Fluid-power textbook (ch. 10): smallest inside diameter for a velocity limit, d = √(0.4085 × gpm / v).
export function minInsideDiameterIn(flowGpm: number, maxVelocityFps: number): number {
  return Math.sqrt((LINE_VELOCITY_FACTOR * flowGpm) / maxVelocityFps);
}
