import { describe, expect, it } from "vitest";
import { PUBLISHED_PROCEDURE, procedureBreaches } from "@/server/records/procedure";

const round = { partShape: "round" as const, procedure: PUBLISHED_PROCEDURE, today: "2026-03-10" };
const codes = (list: { code: string }[]) => list.map((b) => b.code);

describe("procedure flags while the form is typed", () => {
  it("says nothing about numbers not typed yet", () => {
    expect(procedureBreaches({}, round)).toEqual([]);
    // A gauge alone cannot be judged without the test pressure.
    expect(procedureBreaches({ gaugeFullScalePsi: 30 }, round)).toEqual([]);
  });

  it("flags each breach beside its own field", () => {
    const flags = procedureBreaches({ testPressurePsig: 3, gaugeFullScalePsi: 30, holdMinutes: 10, gaugeCalibratedOn: "2024-01-02" }, round);
    expect(flags.map((f) => [f.code, f.field])).toEqual([
      ["hold_too_short", "holdMinutes"],
      ["gauge_range", "gaugeFullScalePsi"],
      ["gauge_calibration_old", "gaugeCalibratedOn"],
    ]);
  });

  it("uses the published figures by default: ASME BPVC Section V, Article 10; UL 142 §42.2.1", () => {
    // 3 psig × 1.5 = 4.5 psi and × 4 = 12 psi are the edges of the gauge range, both allowed.
    expect(codes(procedureBreaches({ testPressurePsig: 3, gaugeFullScalePsi: 4.5 }, round))).toEqual([]);
    expect(codes(procedureBreaches({ testPressurePsig: 3, gaugeFullScalePsi: 12 }, round))).toEqual([]);
    expect(codes(procedureBreaches({ testPressurePsig: 3, gaugeFullScalePsi: 4.4 }, round))).toEqual(["gauge_range"]);
    expect(codes(procedureBreaches({ testPressurePsig: 3, gaugeFullScalePsi: 12.1 }, round))).toEqual(["gauge_range"]);
    expect(codes(procedureBreaches({ holdMinutes: 15 }, round))).toEqual([]);
    expect(codes(procedureBreaches({ holdMinutes: 14.9 }, round))).toEqual(["hold_too_short"]);
    expect(codes(procedureBreaches({ testPressurePsig: 5.5 }, round))).toEqual(["test_pressure_outside_band"]);
    expect(codes(procedureBreaches({ testPressurePsig: 2.5 }, { ...round, partShape: "box" }))).toEqual([]);
    expect(codes(procedureBreaches({ testPressurePsig: 2.5 }, { ...round, partShape: "d" }))).toEqual([]);
    expect(codes(procedureBreaches({ testPressurePsig: 4 }, { ...round, partShape: "d" }))).toEqual(["test_pressure_outside_band"]);
    expect(codes(procedureBreaches({ method: "decay" }, { ...round, partShape: "d" }))).toEqual(["decay_on_box_tank"]);
    expect(procedureBreaches({ holdMinutes: 10 }, round)[0].message).toContain("ASME BPVC Section V, Article 10");
  });

  it("follows the shop's own figures once the owner changes them, and names them as the shop's", () => {
    const strict = { ...round, procedure: { ...PUBLISHED_PROCEDURE, minHoldMinutes: 30, calibrationMonths: 6 } };
    const flags = procedureBreaches({ holdMinutes: 20, gaugeCalibratedOn: "2025-09-01" }, strict);
    expect(codes(flags)).toEqual(["hold_too_short", "gauge_calibration_old"]);
    expect(flags[0].message).toContain("at least 30 min");
    expect(flags[0].message).toContain("(the shop's procedure)");
    expect(flags[1].message).toContain("more than 6 months ago");
  });

  it("accepts a gauge calibrated exactly a year ago and refuses the day before", () => {
    expect(codes(procedureBreaches({ gaugeCalibratedOn: "2025-03-10" }, round))).toEqual([]);
    expect(codes(procedureBreaches({ gaugeCalibratedOn: "2025-03-09" }, round))).toEqual(["gauge_calibration_old"]);
    expect(codes(procedureBreaches({ gaugeCalibratedOn: "2026-03-11" }, round))).toEqual(["gauge_calibration_future"]);
  });
});
