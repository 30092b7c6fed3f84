import { describe, expect, it } from "vitest";
import type { z } from "zod";
import {
  coatingRunPatchSchema,
  leakTestRequestSchema,
  partInputSchema,
  partPatchSchema,
  partProblems,
  recordsSettingsPatchSchema,
  vendorInputSchema,
} from "@/server/records/schemas";

function pathsOf(schema: z.ZodType, input: unknown) {
  const result = schema.safeParse(input);
  expect(result.success).toBe(false);
  return result.error!.issues.map((issue) => issue.path.join("."));
}

const tank = { name: "40 gal round reservoir", kind: "reservoir", material: "aluminum", needsLeakTest: true, needsCoating: true };

describe("partInputSchema", () => {
  it("takes the shape from the geometry, and calls other parts other (a box a box)", () => {
    expect(partInputSchema.parse({ ...tank, geometry: { shape: "round", insideDiameterIn: 18, lengthIn: 36.5 } }).shape).toBe("round");
    expect(partInputSchema.parse(tank)).toEqual(expect.objectContaining({ shape: "other", geometry: null, notes: "" }));
    expect(partInputSchema.parse({ ...tank, kind: "box", needsLeakTest: false }).shape).toBe("box");
  });

  it("keeps a reservoir on the leak-test list (tanks are tested before coating)", () => {
    expect(pathsOf(partInputSchema, { ...tank, needsLeakTest: false })).toEqual(["needsLeakTest"]);
    expect(partInputSchema.safeParse({ ...tank, kind: "bracket", needsLeakTest: false }).success).toBe(true);
  });

  it("gives geometry to reservoirs only, matching their shape, in 1–240 in", () => {
    expect(pathsOf(partInputSchema, { ...tank, kind: "box", geometry: { shape: "box", lengthIn: 30, widthIn: 10, heightIn: 12 } })).toEqual(["geometry"]);
    expect(pathsOf(partInputSchema, { ...tank, shape: "box", geometry: { shape: "round", insideDiameterIn: 18, lengthIn: 36 } })).toEqual(["shape"]);
    expect(pathsOf(partInputSchema, { ...tank, geometry: { shape: "round", insideDiameterIn: 300, lengthIn: 36 } })).toEqual(["geometry.insideDiameterIn"]);
    expect(pathsOf(partInputSchema, { ...tank, geometry: { shape: "oval" } })).toEqual(["geometry.shape"]);
  });

  it("takes a D-shaped reservoir with the calculator's dimensions, its width at least half its height", () => {
    const d = (widthIn: number) => ({ ...tank, geometry: { shape: "d", lengthIn: 40, widthIn, heightIn: 20 } });
    expect(partInputSchema.parse(d(24))).toEqual(expect.objectContaining({ shape: "d", geometry: { shape: "d", lengthIn: 40, widthIn: 24, heightIn: 20 } }));
    // Width 10 in on a 20 in flat side is exactly a half round: the edge is allowed.
    expect(partInputSchema.parse(d(10)).shape).toBe("d");
    expect(pathsOf(partInputSchema, d(9.9))).toEqual(["geometry.widthIn"]);
    expect(partInputSchema.parse({ ...tank, shape: "d" })).toEqual(expect.objectContaining({ shape: "d", geometry: null }));
    expect(pathsOf(partInputSchema, { ...tank, shape: "box", geometry: { shape: "d", lengthIn: 40, widthIn: 24, heightIn: 20 } })).toEqual(["shape"]);
    expect(pathsOf(partInputSchema, { ...tank, shape: "hex" })).toEqual(["shape"]);
  });

  it("checks merged edits with the same rules", () => {
    expect(partProblems({ kind: "reservoir", shape: "round", geometry: null, needsLeakTest: true })).toEqual([]);
    expect(partProblems({ kind: "bracket", shape: "box", geometry: { shape: "round", insideDiameterIn: 18, lengthIn: 36 }, needsLeakTest: false }).map((p) => p.path)).toEqual([
      "geometry",
      "shape",
    ]);
  });
});

describe("partPatchSchema", () => {
  it("takes a rework mark and refuses keys it does not know or an empty change", () => {
    expect(partPatchSchema.parse({ reworked: true, reworkNote: " Rewelded " })).toEqual({ reworked: true, reworkNote: "Rewelded" });
    expect(pathsOf(partPatchSchema, { reworked: false })).toEqual(["reworked"]);
    expect(pathsOf(partPatchSchema, { jobId: 4 })).toContain("");
    expect(pathsOf(partPatchSchema, {})).toEqual([""]);
  });
});

describe("leakTestRequestSchema", () => {
  const test = {
    method: "decay", testPressurePsig: 4, gaugeFullScalePsi: 10, gaugeCalibratedOn: "2025-01-15", holdMinutes: 20,
    startPressurePsig: 4, endPressurePsig: 4, startTempF: 70, endTempF: 70, tester: "Bench tech",
  };
  it("carries the job the form came from beside the test, and names both kinds of fault at once", () => {
    expect(leakTestRequestSchema.parse({ ...test, jobId: 12 })).toEqual(expect.objectContaining({ jobId: 12, barometricPsia: 14.696, seams: [] }));
    expect(leakTestRequestSchema.parse(test).jobId).toBeUndefined();
    expect(pathsOf(leakTestRequestSchema, { ...test, jobId: 0, endTempF: 300 })).toEqual(["jobId", "endTempF"]);
  });
});

describe("vendorInputSchema", () => {
  it("takes a coater with an optional contact and a usual turnaround of 1–60 business days", () => {
    expect(vendorInputSchema.parse({ name: " Quarry Road Coatings ", usualTurnaroundDays: 8 })).toEqual({
      name: "Quarry Road Coatings", contact: "", phone: "", email: "", usualTurnaroundDays: 8, notes: "",
    });
    expect(pathsOf(vendorInputSchema, { name: "X", email: "desk at coater", usualTurnaroundDays: 2.5 })).toEqual(["email", "usualTurnaroundDays"]);
    expect(pathsOf(vendorInputSchema, { name: "X", usualTurnaroundDays: 61 })).toEqual(["usualTurnaroundDays"]);
  });
});

describe("coatingRunPatchSchema", () => {
  it("changes the received date, the promise or the inspection, nothing else", () => {
    expect(coatingRunPatchSchema.safeParse({ receivedOn: "2025-03-12" }).success).toBe(true);
    expect(pathsOf(coatingRunPatchSchema, { sentOn: "2025-03-01" })).toContain("");
    expect(pathsOf(coatingRunPatchSchema, { receivedOn: "12/03/2025" })).toEqual(["receivedOn"]);
    expect(pathsOf(coatingRunPatchSchema, { inspection: { dftReadingsMils: [70], adhesionOk: true } })).toEqual(["inspection.dftReadingsMils.0"]);
  });
});

describe("recordsSettingsPatchSchema", () => {
  it("takes an allowed drop of 0 to 0.5 psi", () => {
    expect(recordsSettingsPatchSchema.parse({ leakAllowedDropPsi: 0 })).toEqual({ leakAllowedDropPsi: 0 });
    expect(pathsOf(recordsSettingsPatchSchema, { leakAllowedDropPsi: 0.6 })).toEqual(["leakAllowedDropPsi"]);
  });
});
