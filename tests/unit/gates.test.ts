import { describe, expect, it } from "vitest";
import { type GateRecords, NO_RECORDS, checkMove, gateUnmet, nextGateState, waivedGatesOf } from "@/server/jobs/gates";
import { stagesFor } from "@/server/jobs/stages";

const tank = (passed: boolean, last: "pass" | "fail" | null = passed ? "pass" : null) => ({ name: "40 gal round reservoir", passedSinceRework: passed, lastResult: last });
const records = (over: Partial<GateRecords>): GateRecords => ({ ...NO_RECORDS, partCount: 1, ...over });

describe("stage gates", () => {
  it("into coating: every leak-test part needs a pass newer than its last rework", () => {
    expect(checkMove("pressure_test", "coating", "fabrication", records({ leakTestParts: [tank(true)] })).unmet).toEqual([]);
    const failed = checkMove("pressure_test", "coating", "fabrication", records({ leakTestParts: [tank(false, "fail")] }));
    expect(failed.unmet).toHaveLength(1);
    expect(failed.unmet[0]).toMatch(/last leak test failed/);
    const untested = checkMove("pressure_test", "coating", "fabrication", records({ leakTestParts: [tank(false)] }));
    expect(untested.unmet[0]).toMatch(/record a passing leak test/);
  });

  it("into install: every coated part is back and inspected", () => {
    const out = records({ coatedParts: [{ name: "Tool box", received: false, inspected: false }] });
    expect(checkMove("coating", "install", "fabrication", out).unmet[0]).toMatch(/still out for coating/);
    const back = records({ coatedParts: [{ name: "Tool box", received: true, inspected: false }] });
    expect(checkMove("coating", "install", "fabrication", back).unmet[0]).toMatch(/receiving inspection/);
    const done = records({ coatedParts: [{ name: "Tool box", received: true, inspected: true }] });
    expect(checkMove("coating", "install", "fabrication", done).unmet).toEqual([]);
  });

  it("into ready: the sign-off must be complete, and says what is missing", () => {
    expect(checkMove("wire", "ready", "fabrication", records({})).unmet).toEqual(["Into Ready for pickup: Wiring & run-test sign-off: not started."]);
    const partial = records({ signOff: { complete: false, missing: ["relief pressure reading"] } });
    expect(checkMove("wire", "ready", "fabrication", partial).unmet[0]).toMatch(/relief pressure reading/);
    expect(checkMove("wire", "ready", "fabrication", records({ signOff: { complete: true, missing: [] } })).unmet).toEqual([]);
  });

  it("a forward move that skips columns still meets every gate it crosses", () => {
    const check = checkMove("fabricate", "ready", "fabrication", records({ leakTestParts: [tank(false)], coatedParts: [{ name: "Box", received: false, inspected: false }] }));
    expect(check.kind).toBe("forward");
    expect(check.unmet.map((u) => u.split(":")[0])).toEqual(["Into Outside coating", "Into Install", "Into Ready for pickup"]);
  });

  it("a tank reworked after it passed stops the job moving on, even from a later stage", () => {
    const reworked = records({ leakTestParts: [tank(false)], signOff: { complete: true, missing: [] } });
    const check = checkMove("wire", "ready", "fabrication", reworked);
    expect(check.unmet).toEqual([expect.stringMatching(/^Into Outside coating: .*record a passing leak test/)]);
    // The card says so too, not only the next gate's own conditions.
    expect(nextGateState("install", "fabrication", reworked)?.unmet).toEqual([expect.stringMatching(/leak test/)]);
  });

  it("what the owner waived with an override is not asked again once the job is past it", () => {
    const untested = records({ leakTestParts: [tank(false)], signOff: null });
    // Fabricate → Ready for pickup over an override: Outside coating, Install and Ready waived.
    const waivedGates = waivedGatesOf([
      { from: null, to: "queued", overridden: false },
      { from: "queued", to: "fabricate", overridden: false },
      { from: "fabricate", to: "ready", overridden: true },
    ]);
    expect(waivedGates).toEqual(["coating", "install", "ready"]);
    expect(checkMove("ready", "delivered", "fabrication", { ...untested, waivedGates }).unmet).toEqual([]);
    expect(nextGateState("ready", "fabrication", { ...untested, waivedGates })).toBeNull();
    // Without the override on record the same job is held, as before.
    expect(checkMove("ready", "delivered", "fabrication", untested).unmet.map((u) => u.split(":")[0])).toEqual(["Into Outside coating", "Into Ready for pickup"]);
    // The stage the move enters is always asked, waiver or not.
    expect(checkMove("wire", "ready", "fabrication", { ...untested, waivedGates: ["coating", "ready"] }).unmet).toEqual(["Into Ready for pickup: Wiring & run-test sign-off: not started."]);
  });

  it("a job moved back before a waived stage is asked again on the way forward", () => {
    expect(waivedGatesOf([
      { from: "fabricate", to: "ready", overridden: true },
      { from: "ready", to: "pressure_test", overridden: false },
    ])).toEqual([]);
    expect(waivedGatesOf([
      { from: "fabricate", to: "ready", overridden: true },
      { from: "ready", to: "install", overridden: false },
    ])).toEqual(["coating", "install"]);
  });

  it("a coating that failed adhesion holds the part, and says what to do", () => {
    const failed = records({ coatedParts: [{ name: "Tool box", received: true, inspected: false, adhesionFailed: true }] });
    expect(gateUnmet("install", failed)).toEqual(["Tool box: coating failed adhesion; send it back for a recoat or record a passing inspection."]);
  });

  it("a part not yet sent for coating says so", () => {
    const unsent = records({ coatedParts: [{ name: "Battery box", sent: false, received: false, inspected: false }] });
    expect(gateUnmet("install", unsent)).toEqual(["Battery box: not sent for coating yet; send it out on a coating run."]);
  });

  it("a job with fabricated parts cannot pass the coating gate with no parts recorded", () => {
    expect(checkMove("queued", "install", "fabrication", NO_RECORDS).unmet).toEqual([
      "Into Outside coating: No fabricated parts are recorded on this job yet: add them under Parts (or make the job install only).",
    ]);
    // An install-only job has no coating gate, so it needs no parts.
    expect(checkMove("queued", "install", "install_only", NO_RECORDS).unmet).toEqual([]);
  });

  it("ungated forward moves pass: queued → fabricate → pressure test", () => {
    expect(checkMove("queued", "fabricate", "fabrication", NO_RECORDS).unmet).toEqual([]);
    expect(checkMove("fabricate", "pressure_test", "fabrication", records({ leakTestParts: [tank(false)] })).unmet).toEqual([]);
  });

  it("backward moves are always allowed (a failed test sends the job back to fabricate)", () => {
    const check = checkMove("pressure_test", "fabricate", "fabrication", records({ leakTestParts: [tank(false, "fail")] }));
    expect(check).toEqual({ kind: "backward", unmet: [], impossible: false });
    expect(checkMove("ready", "install", "install_only", NO_RECORDS).kind).toBe("backward");
  });

  it("reordering inside a column is a move with no gate", () => {
    expect(checkMove("coating", "coating", "fabrication", records({ leakTestParts: [tank(false)] }))).toEqual({ kind: "reorder", unmet: [], impossible: false });
  });

  it("a job with no fabricated parts skips fabricate, pressure test and coating", () => {
    expect(stagesFor("install_only")).toEqual(["queued", "install", "wire", "ready", "delivered"]);
    const refused = checkMove("queued", "fabricate", "install_only", NO_RECORDS);
    expect(refused.impossible).toBe(true);
    expect(refused.unmet[0]).toMatch(/skips Fabricate/);
    // Its coating gate does not apply when it goes straight to install.
    expect(checkMove("queued", "install", "install_only", records({ leakTestParts: [tank(false)] })).unmet).toEqual([]);
  });

  it("the card shows the next gate ahead and what it still needs", () => {
    expect(nextGateState("fabricate", "fabrication", records({ leakTestParts: [tank(false)] }))).toEqual({ gate: "coating", unmet: [expect.stringMatching(/leak test/)] });
    expect(nextGateState("queued", "install_only", NO_RECORDS)?.gate).toBe("install");
    expect(nextGateState("ready", "fabrication", NO_RECORDS)).toBeNull();
    expect(gateUnmet("install", NO_RECORDS)).toEqual([]);
  });
});
