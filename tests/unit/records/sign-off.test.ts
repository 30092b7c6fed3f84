import { describe, expect, it } from "vitest";
import { wiringSignOffSchema, type WiringSignOff } from "@/server/records/schemas";
import {
  isSignOffComplete,
  SIGN_OFF_CHECK_KEYS,
  signOffChecks,
  signOffMissing,
  wiringCautions,
} from "@/server/records/sign-off";

const allChecked = Object.fromEntries(SIGN_OFF_CHECK_KEYS.map((key) => [key, true]));

function complete(): WiringSignOff {
  return wiringSignOffSchema.parse({
    indicatorSource: "pto_feedback",
    indicatorInput: "ground_active",
    checks: allChecked,
    reliefPressurePsi: 2500,
    timedRunMinutes: 20,
    signedBy: "Tobiah Renn",
  });
}

describe("wiring & run-test sign-off", () => {
  it("keeps its check keys stable (they are stored with every sign-off)", () => {
    expect(SIGN_OFF_CHECK_KEYS).toEqual([
      "indicator_follows_pto",
      "pto_engages_per_procedure",
      "breakaways_secured_capped",
      "pump_no_cavitation",
      "relief_pressure_recorded",
      "no_leaks_after_timed_run",
      "oil_at_sight_gauge_cold",
    ]);
    expect(signOffChecks.map((check) => check.key)).toEqual(SIGN_OFF_CHECK_KEYS);
  });

  it("saves an empty draft and lists everything still missing", () => {
    const draft = wiringSignOffSchema.parse({});
    const missing = signOffMissing(draft);
    expect(missing).toHaveLength(2 + SIGN_OFF_CHECK_KEYS.length + 1);
    expect(missing[0]).toMatch(/indicator source/);
    expect(missing[1]).toMatch(/indicator input/);
    expect(missing).toContain("Not checked yet: Pump runs without cavitation noise.");
    expect(missing.at(-1)).toMatch(/^Sign off/);
    expect(isSignOffComplete(draft)).toBe(false);
  });

  it("is complete when every check is ticked, the numbers are in and someone signed", () => {
    expect(signOffMissing(complete())).toEqual([]);
    expect(isSignOffComplete(complete())).toBe(true);
  });

  it("wants the relief pressure as a number in psi, not only a tick", () => {
    const record = { ...complete(), reliefPressurePsi: null };
    expect(signOffMissing(record)).toEqual(["Enter the measured relief pressure in psi."]);
  });

  it("wants the timed run's minutes", () => {
    const record = { ...complete(), timedRunMinutes: undefined };
    expect(signOffMissing(record)).toEqual(["Enter how many minutes the timed run lasted."]);
  });

  it("asks for the tick itself when only the number was entered", () => {
    const record = { ...complete(), checks: { ...complete().checks, relief_pressure_recorded: false } };
    expect(signOffMissing(record)).toEqual(["Not checked yet: Relief pressure measured and recorded."]);
  });

  it("does not take a blank name as a signature", () => {
    const record = wiringSignOffSchema.parse({ ...complete(), signedBy: "   " });
    expect(signOffMissing(record)).toEqual(["Sign off: enter the name of the person who did the run test."]);
  });

  it("needs the indicator source and input chosen", () => {
    expect(signOffMissing({ ...complete(), indicatorSource: null })).toHaveLength(1);
    expect(signOffMissing({ ...complete(), indicatorInput: undefined })).toHaveLength(1);
  });

  it("shows the electrical and hydraulic cautions", () => {
    const text = wiringCautions.map((c) => c.text).join(" ");
    expect(text).toMatch(/PTO and transmission makers/);
    expect(text).toMatch(/qualified person/);
    expect(text).toMatch(/skin/);
    expect(text).toMatch(/Fuse the indicator circuit/);
    expect(text).toMatch(/local codes/);
  });
});
