import fc from "fast-check";
import { describe, expect, it } from "vitest";
import * as kitCalc from "@/app/api/kit-calc/route";
import type { Role } from "@/db/schema";
import { computeKitSpec, demoKitCalcInput } from "@/server/kit-calc";
import { useFreshDatabase } from "../support/db";
import { makeStaff } from "../support/factories";
import { readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

async function cookieFor(role: Role) {
  const staff = await makeStaff(db(), role);
  return sessionCookieFor(staff.id);
}

function post(cookie: string, body: unknown) {
  return kitCalc.POST(request("/api/kit-calc", { cookie, body }));
}

// A body as a careless client might send it: not necessarily JSON at all.
function postRaw(cookie: string, rawBody: string) {
  return kitCalc.POST(request("/api/kit-calc", { method: "POST", cookie, rawBody, headers: { "content-type": "application/json", origin: "http://localhost:3000" } }));
}

const withField = (path: string, value: unknown) => {
  const copy = structuredClone(demoKitCalcInput) as Record<string, any>;
  const keys = path.split(".");
  let node = copy;
  for (const key of keys.slice(0, -1)) node = node[key];
  node[keys[keys.length - 1]] = value;
  return copy;
};

async function fieldsOf(res: Response): Promise<Record<string, string[]>> {
  expect(res.status).toBe(400);
  const text = await res.clone().text();
  expect(text).not.toMatch(/:\s*(?:-?Infinity|NaN|null)\b/);
  const body = JSON.parse(text);
  expect(body.error.code).toBe("validation");
  return body.error.details.fields;
}

describe("POST /api/kit-calc", () => {
  it.each(["tech", "office", "owner"] as const)("answers a %s with the computed kit spec", async (role) => {
    const res = await post(await cookieFor(role), demoKitCalcInput);
    expect(res.status).toBe(200);
    const spec = await readBody(res);
    // The route adds nothing and drops nothing: it is the pure computation, through JSON.
    expect(spec).toEqual(JSON.parse(JSON.stringify(computeKitSpec(demoKitCalcInput))));
    expect(spec.flowGpm).toBeCloseTo((1200 * 1.15 * 3.5 * 0.9) / 231, 10);
    expect(spec.lines.suction.status).toMatch(/^(low|ok|high)$/);
  });

  it("refuses cross-site posts and bodies that are not JSON", async () => {
    const cookie = await cookieFor("tech");
    const cross = await kitCalc.POST(request("/api/kit-calc", { cookie, body: demoKitCalcInput, headers: { origin: "http://elsewhere.example" } }));
    expect(cross.status).toBe(403);
    const form = await kitCalc.POST(request("/api/kit-calc", { method: "POST", cookie, rawBody: "engineRpm=1200", headers: { "content-type": "application/x-www-form-urlencoded" } }));
    expect(form.status).toBe(415);
  });

  it.each([
    ["engineRpm", 0],
    ["engineRpm", -1200],
    ["pumpDisplacementCuIn", 0],
    ["tank.insideDiameterIn", 0],
    ["tank.lengthIn", -30],
    ["suctionLine.insideDiameterIn", 0],
    ["returnLine.lengthFt", -3],
    ["volumetricEfficiency", 1.2],
    ["mechanicalEfficiency", 0],
    ["mechanicalEfficiency", 90],
    ["engineRpm", "1200"],
    ["workingPressurePsi", "high"],
    ["tank.lengthIn", null],
    ["engineRpm", 1e300],
  ])("%s = %j answers 400 naming that field", async (path, value) => {
    const fields = await fieldsOf(await post(await cookieFor("tech"), withField(path, value)));
    expect(Object.keys(fields)).toContain(path);
    expect(fields[path][0]).toMatch(/must be|required/);
  });

  it("a fill depth above the tank's inside diameter names fillDepthIn and the diameter", async () => {
    const fields = await fieldsOf(await post(await cookieFor("office"), withField("fillDepthIn", 21)));
    expect(fields.fillDepthIn[0]).toMatch(/inside diameter \(20 in\)/);
  });

  it("a box tank filled above its height names fillDepthIn", async () => {
    const input = { ...demoKitCalcInput, tank: { shape: "box", lengthIn: 36, widthIn: 20, heightIn: 18 }, fillDepthIn: 18.5 };
    const fields = await fieldsOf(await post(await cookieFor("office"), input));
    expect(Object.keys(fields)).toEqual(["fillDepthIn"]);
  });

  it("an unknown tank shape and a missing suction line are named", async () => {
    const { suctionLine: _s, ...noSuction } = demoKitCalcInput;
    const fields = await fieldsOf(await post(await cookieFor("office"), { ...noSuction, tank: { shape: "barrel", insideDiameterIn: 20, lengthIn: 30 } }));
    expect(Object.keys(fields)).toEqual(expect.arrayContaining(["tank.shape", "suctionLine"]));
  });

  it("a bare NaN (which JSON cannot carry) answers 400 naming the field, not only 'bad JSON'", async () => {
    const cookie = await cookieFor("tech");
    const raw = JSON.stringify(demoKitCalcInput).replace('"engineRpm":1200', '"engineRpm": NaN').replace('"lengthIn":30', '"lengthIn":-Infinity');
    const fields = await fieldsOf(await postRaw(cookie, raw));
    expect(Object.keys(fields).sort()).toEqual(["engineRpm", "tank.lengthIn"]);
    const lone = await fieldsOf(await postRaw(cookie, '{"engineRpm": NaN}'));
    expect(lone.engineRpm[0]).toMatch(/Engine speed must be a number/);
  });

  it("a NaN inside a text value is text, not a number; broken JSON still answers 400", async () => {
    const cookie = await cookieFor("tech");
    const res = await postRaw(cookie, '{"engineRpm": "NaN", "note": "Infinity');
    expect(res.status).toBe(400);
    expect((await readBody(res)).error.message).toMatch(/not valid JSON/);
  });

  it("1e400 (Infinity once parsed) answers 400 naming the field, with no Infinity in the answer", async () => {
    const cookie = await cookieFor("tech");
    const raw = JSON.stringify(demoKitCalcInput).replace('"pumpDisplacementCuIn":3.5', '"pumpDisplacementCuIn":1e400').replace('"insideDiameterIn":1.75', '"insideDiameterIn":-1e400');
    const fields = await fieldsOf(await postRaw(cookie, raw));
    expect(Object.keys(fields).sort()).toEqual(["pumpDisplacementCuIn", "suctionLine.insideDiameterIn"]);
  });

  it("the largest accepted values still answer finite numbers (no null where Infinity would be)", async () => {
    const input = {
      ...demoKitCalcInput,
      engineRpm: 5000,
      ptoRatioPercent: 300,
      pumpDisplacementCuIn: 20,
      workingPressurePsi: 10_000,
      reliefPressurePsi: 10_000,
      tank: { shape: "round", insideDiameterIn: 1, lengthIn: 1 },
      // A 1 in tube has no room for the demo's pick-up 1 in off the bottom.
      pickupHeightIn: 0,
      sumpGal: 0,
      suctionLine: { insideDiameterIn: 0.1, lengthFt: 200 },
      returnLine: { insideDiameterIn: 0.1, lengthFt: 200 },
      pressureLine: { insideDiameterIn: 0.1, lengthFt: 200 },
    };
    const res = await post(await cookieFor("owner"), input);
    expect(res.status).toBe(200);
    const text = await res.text();
    expect(text).not.toMatch(/null|Infinity|NaN/);
    expect(JSON.parse(text).warnings.map((w: { code: string }) => w.code)).toContain("suction_velocity_high");
  });
});

describe("POST /api/kit-calc under hostile values in every field, old and added (fast-check)", () => {
  const PATHS = [
    "engineRpm", "ptoRatioPercent", "pumpDisplacementCuIn", "workingPressurePsi", "reliefPressurePsi", "tank", "tank.shape", "tank.lengthIn",
    "fillDepthIn", "sumpGal", "suctionLine", "suctionLine.insideDiameterIn", "oilToAirDeltaF", "trailerOilNeedGal",
    "dutyAtWorkingPercent", "dutyOverReliefPercent", "ptoIntermittentTorqueLbFt", "ptoHpRating", "pumpMaxRpm", "governedEngineRpm",
    "pumpRatedPsi", "hoseRatedPsi", "trailerRatedPsi", "oilViscosityCst", "oilSpecificGravity", "suctionFittingsEquivalentFt",
    "pumpInletLimitInHg", "pickupHeightIn", "targetFlowGpm", "cylinder", "cylinder.boreIn", "cylinder.rodIn", "cylinder.count",
  ];
  const hostile = fc.oneof(
    fc.constantFrom(0, -1, -0, 1e308, -1e308, 1e-320, 2 ** 53 + 1, 0.5, 100, 101, "", "12", "NaN", null, true, [], {}, "'; drop table job; --", "d", "round"),
    fc.double(),
    fc.integer(),
    fc.record({ cold: fc.double(), working: fc.double() }),
    fc.record({ shape: fc.constantFrom("round", "box", "d"), lengthIn: fc.double(), widthIn: fc.double(), heightIn: fc.double(), insideDiameterIn: fc.double() }),
  );

  it("answers 200 with finite numbers or 400 naming a field; never 500", async () => {
    const cookie = await cookieFor("tech");
    await fc.assert(
      fc.asyncProperty(fc.constantFrom(...PATHS), hostile, async (path, value) => {
        const res = await post(cookie, withField(path, value));
        expect([200, 400]).toContain(res.status);
        const text = await res.text();
        expect(text).not.toMatch(/:\s*(?:-?Infinity|NaN|null)\b/);
        if (res.status === 400) expect(Object.keys(JSON.parse(text).error.details.fields).length).toBeGreaterThan(0);
      }),
      { numRuns: 150 },
    );
  });
});
