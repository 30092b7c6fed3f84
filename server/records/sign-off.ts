import type { WiringSignOff } from "./schemas";

export const INDICATOR_SOURCES = ["switch", "pto_feedback"] as const;
export type IndicatorSource = (typeof INDICATOR_SOURCES)[number];

export const INDICATOR_INPUTS = ["ground_active", "voltage_active"] as const;
export type IndicatorInput = (typeof INDICATOR_INPUTS)[number];

export const indicatorSourceLabels: Record<IndicatorSource, string> = {
  switch: "Dash switch position",
  pto_feedback: "Engagement feedback from the PTO",
};

export const indicatorInputLabels: Record<IndicatorInput, string> = {
  ground_active: "Ground-active",
  voltage_active: "Voltage-active",
};

// The keys are stored with each sign-off: never rename one, add a new key instead.
export const SIGN_OFF_CHECK_KEYS = [
  "indicator_follows_pto",
  "pto_engages_per_procedure",
  "breakaways_secured_capped",
  "pump_no_cavitation",
  "relief_pressure_recorded",
  "no_leaks_after_timed_run",
  "oil_at_sight_gauge_cold",
] as const;
export type SignOffCheckKey = (typeof SIGN_OFF_CHECK_KEYS)[number];

// Run-test items: common practice, no published source; each maker's instructions govern.
export const signOffChecks: readonly { key: SignOffCheckKey; label: string }[] = [
  { key: "indicator_follows_pto", label: "Indicator lit with the PTO engaged and dark when it is disengaged" },
  { key: "pto_engages_per_procedure", label: "PTO engages only as the transmission maker's procedure says" },
  { key: "breakaways_secured_capped", label: "Breakaway air and hydraulic connections secured and capped" },
  { key: "pump_no_cavitation", label: "Pump runs without cavitation noise" },
  { key: "relief_pressure_recorded", label: "Relief pressure measured and recorded" },
  { key: "no_leaks_after_timed_run", label: "No leaks after a timed run" },
  { key: "oil_at_sight_gauge_cold", label: "Oil at the sight-gauge mark when cold" },
];

/**
 * What still stands between this sign-off and complete, in plain words, in form order. Complete
 * means: indicator source and input chosen, every check ticked, the relief pressure reading in
 * psi and the timed run's minutes entered, and someone's name signed. Empty when complete.
 */
export function signOffMissing(record: WiringSignOff): string[] {
  const missing: string[] = [];
  if (!record.indicatorSource) {
    missing.push("Choose the indicator source: dash switch position or engagement feedback from the PTO.");
  }
  if (!record.indicatorInput) {
    missing.push("Choose the indicator input: ground-active or voltage-active.");
  }
  for (const check of signOffChecks) {
    if (record.checks?.[check.key] !== true) {
      missing.push(`Not checked yet: ${check.label}.`);
    } else if (check.key === "relief_pressure_recorded" && record.reliefPressurePsi == null) {
      missing.push("Enter the measured relief pressure in psi.");
    } else if (check.key === "no_leaks_after_timed_run" && record.timedRunMinutes == null) {
      missing.push("Enter how many minutes the timed run lasted.");
    }
  }
  if (!record.signedBy?.trim()) {
    missing.push("Sign off: enter the name of the person who did the run test.");
  }
  return missing;
}

export function isSignOffComplete(record: WiringSignOff): boolean {
  return signOffMissing(record).length === 0;
}

/** Shown on the wiring & run-test form. */
export const wiringCautions: readonly { key: string; text: string }[] = [
  {
    key: "maker_instructions",
    text: "Wire, engage and run the PTO as the PTO and transmission makers' instructions say.",
  },
  { key: "relief_qualified", text: "Relief valves are set by a qualified person, with a gauge on the pressure line." },
  {
    key: "injection",
    text: "Oil under pressure can inject through skin: never feel for a leak by hand; use cardboard. An injection injury needs a doctor at once, even if it looks small.",
  },
  { key: "fuse_indicator", text: "Fuse the indicator circuit at its power source." },
  { key: "codes", text: "Follow local codes and the component makers' instructions." },
];
