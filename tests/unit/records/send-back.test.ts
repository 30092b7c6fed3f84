import { describe, expect, it } from "vitest";
import { STAGES } from "@/db/schema";
import { canSendBackToFabricate, sendBackNote } from "@/server/records/send-back";

describe("the offer to send a job back to Fabricate after a failed leak test", () => {
  it("stands from Pressure test to Ready for pickup, on the fabrication route only", () => {
    const offered = STAGES.filter((stage) => canSendBackToFabricate({ stage, scope: "fabrication" }));
    expect(offered).toEqual(["pressure_test", "coating", "install", "wire", "ready"]);
    for (const stage of STAGES) expect(canSendBackToFabricate({ stage, scope: "install_only" })).toBe(false);
  });

  it("writes a note that says which part failed and why", () => {
    const leak = sendBackNote({ partName: "40 gal round reservoir", seams: [{ location: "Fill neck", result: "leak" }, { location: "End caps", result: "pass" }], correctedDropPsi: 0, allowedDropPsi: 0.05 });
    expect(leak).toBe("Leak test failed: 40 gal round reservoir, leak at Fill neck.");
    const drop = sendBackNote({ partName: "Spare tank", seams: [], correctedDropPsi: 0.1234, allowedDropPsi: 0.05 });
    expect(drop).toBe("Leak test failed: Spare tank, corrected drop 0.12 psi, over the allowed 0.05 psi.");
  });
});
