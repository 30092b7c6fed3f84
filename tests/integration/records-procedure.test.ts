import { describe, expect, it, beforeAll } from "vitest";
import * as coatingRuns from "@/app/api/coating-runs/route";
import * as moves from "@/app/api/jobs/[id]/moves/route";
import * as parts from "@/app/api/jobs/[id]/parts/route";
import * as leakTests from "@/app/api/parts/[id]/leak-tests/route";
import * as partItem from "@/app/api/parts/[id]/route";
import * as procedure from "@/app/api/shop-settings/leak-test-procedure/route";
import * as vendors from "@/app/api/vendors/route";
import type { Role } from "@/db/schema";
import { loadGateRecords } from "@/server/jobs/gate-records";
import { shopToday } from "@/server/records/turnaround";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";
import { moneyChecksOff } from "../support/money";

const { db } = useFreshDatabase();
// Money is not the subject here: the shop's money checks are off (payments-gates.test.ts holds them).
beforeAll(() => moneyChecksOff(db()));

async function as(role: Role) {
  const staff = await makeStaff(db(), role);
  return { staff, cookie: await sessionCookieFor(staff.id) };
}

const today = () => shopToday({ now: new Date(), timeZone: "US/Central" });

async function addPart(cookie: string, jobId: number, body: Record<string, unknown> = {}) {
  const res = await parts.POST(
    request(`/api/jobs/${jobId}/parts`, {
      cookie,
      body: { name: "40 gal round reservoir", kind: "reservoir", material: "aluminum", needsLeakTest: true, needsCoating: true, geometry: { shape: "round", insideDiameterIn: 18, lengthIn: 36.5 }, ...body },
    }),
    params({ id: String(jobId) }),
  );
  expect(res.status).toBe(201);
  return (await readBody(res)).part as { id: number; name: string; needsLeakTest: boolean; shape: string };
}

// A 3 psig soap-and-decay test of a round tank at one temperature, no drop and no bubbles: by the
// book it passes (UL 142 §42.2.1 band 3–5 psig; ASME BPVC Section V, Article 10: 15 min hold and a
// gauge 1.5–4 × the test pressure, here 4.5–12 psi).
function cleanTest(overrides: Record<string, unknown> = {}) {
  return {
    method: "both", testPressurePsig: 3, gaugeFullScalePsi: 6, gaugeCalibratedOn: today(), holdMinutes: 20,
    startPressurePsig: 3, endPressurePsig: 3, startTempF: 70, endTempF: 70, seams: [{ location: "Sump to shell", result: "pass" }], tester: "Bench tech",
    ...overrides,
  };
}

async function recordTest(cookie: string, partId: number, body: unknown) {
  const res = await leakTests.POST(request(`/api/parts/${partId}/leak-tests`, { cookie, body }), params({ id: String(partId) }));
  expect(res.status).toBe(201);
  return readBody(res);
}

async function moveToCoating(cookie: string, jobId: number) {
  const { version } = await db().selectFrom("job").select("version").where("id", "=", jobId).executeTakeFirstOrThrow();
  return moves.POST(request(`/api/jobs/${jobId}/moves`, { cookie, body: { toStage: "coating", version } }), params({ id: String(jobId) }));
}

async function gateOpen(jobId: number, cookie: string) {
  const records = (await loadGateRecords(db(), [jobId])).get(jobId)!;
  const stage = (await db().selectFrom("job").select("stage").where("id", "=", jobId).executeTakeFirstOrThrow()).stage;
  const move = await moveToCoating(cookie, jobId);
  return { passed: records.leakTestParts.every((p) => p.passedSinceRework), moved: move.status === 200, before: stage, body: await readBody(move) };
}

describe("a leak test outside the shop's procedure is invalid and opens no gate", () => {
  it("a 10-minute hold saves as invalid with its reason, and the coating gate stays shut", async () => {
    await ensureShop(db());
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "pressure_test" });
    const tank = await addPart(tech.cookie, job.id);

    const answer = await recordTest(tech.cookie, tank.id, cleanTest({ holdMinutes: 10 }));
    expect(answer.result).toBe("invalid");
    expect(answer.invalidReasons.map((r: { code: string }) => r.code)).toEqual(["hold_too_short"]);
    expect(answer.invalidReasons[0].message).toContain("at least 15 min");
    expect(answer.test.result).toBe("invalid");

    const gate = await gateOpen(job.id, tech.cookie);
    expect(gate.passed).toBe(false);
    expect(gate.moved).toBe(false);
    expect(JSON.stringify(gate.body)).toContain("did not follow the shop's procedure");
    expect((await db().selectFrom("job").select("stage").where("id", "=", job.id).executeTakeFirstOrThrow()).stage).toBe("pressure_test");
  });

  it("a gauge outside 1.5–4 × the test pressure saves as invalid, on both sides of the range", async () => {
    await ensureShop(db());
    const tech = await as("tech");
    // 3 psig: 4.5–12 psi full scale (ASME BPVC Section V, Article 10). 30 psi is 10×; 4 psi is 1.33×.
    for (const gauge of [30, 4]) {
      const job = await makeJob(db(), { stage: "pressure_test" });
      const tank = await addPart(tech.cookie, job.id);
      const answer = await recordTest(tech.cookie, tank.id, cleanTest({ gaugeFullScalePsi: gauge }));
      expect(answer.result).toBe("invalid");
      expect(answer.invalidReasons.map((r: { code: string }) => r.code)).toEqual(["gauge_range"]);
      expect(answer.invalidReasons[0].message).toContain("between 4.5 and 12 psi");
      const gate = await gateOpen(job.id, tech.cookie);
      expect(gate.passed).toBe(false);
      expect(gate.moved).toBe(false);
    }
  });

  it("the same test inside the procedure passes and the job moves into coating", async () => {
    await ensureShop(db());
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "pressure_test" });
    const tank = await addPart(tech.cookie, job.id);
    // The edges are inside: 4.5 psi and 12 psi gauges at 3 psig, a 15-minute hold.
    for (const gaugeFullScalePsi of [4.5, 12]) {
      expect((await recordTest(tech.cookie, tank.id, cleanTest({ gaugeFullScalePsi, holdMinutes: 15 }))).result).toBe("pass");
    }
    const gate = await gateOpen(job.id, tech.cookie);
    expect(gate.passed).toBe(true);
    expect(gate.moved).toBe(true);
  });

  it("an invalid test after a pass shuts the gate again: the newest test decides", async () => {
    await ensureShop(db());
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "pressure_test" });
    const tank = await addPart(tech.cookie, job.id);
    await recordTest(tech.cookie, tank.id, cleanTest());
    await recordTest(tech.cookie, tank.id, cleanTest({ holdMinutes: 5 }));
    expect((await gateOpen(job.id, tech.cookie)).moved).toBe(false);
  });

  it("a part whose newest test is invalid cannot go out on a coating run", async () => {
    await ensureShop(db());
    const office = await as("office");
    const job = await makeJob(db(), { stage: "pressure_test" });
    const tank = await addPart(office.cookie, job.id);
    await recordTest(office.cookie, tank.id, cleanTest({ holdMinutes: 10 }));
    const vendorRes = await vendors.POST(request("/api/vendors", { cookie: office.cookie, body: { name: "Procedure Test Coater", usualTurnaroundDays: 5 } }));
    const vendor = (await readBody(vendorRes)).vendor as { id: number };
    const run = await coatingRuns.POST(
      request("/api/coating-runs", {
        cookie: office.cookie,
        body: { vendorId: vendor.id, finish: { colour: "Black", gloss: "satin" }, sentOn: today(), promisedOn: today(), partIds: [tank.id] },
      }),
    );
    expect(run.status).toBe(400);
    expect(JSON.stringify(await readBody(run))).toContain("invalid last leak test");
  });

  it("a seam seen leaking fails the test even when the procedure was broken: a bubble is a leak", async () => {
    await ensureShop(db());
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "pressure_test" });
    const tank = await addPart(tech.cookie, job.id);
    const answer = await recordTest(tech.cookie, tank.id, cleanTest({ holdMinutes: 10, seams: [{ location: "Fill neck", result: "leak" }] }));
    expect(answer.result).toBe("fail");
  });
});

describe("the procedure's minimums are shop settings the owner changes", () => {
  it("defaults to the published figures; only the owner changes them; bad input changes nothing", async () => {
    await ensureShop(db());
    const owner = await as("owner");
    const tech = await as("tech");
    const read = await procedure.GET(request("/api/shop-settings/leak-test-procedure", { cookie: tech.cookie }));
    expect(read.status).toBe(200);
    expect((await readBody(read)).procedure).toEqual({
      minHoldMinutes: 15, gaugeRatioMin: 1.5, gaugeRatioMax: 4, roundMinPsig: 3, roundMaxPsig: 5, boxMinPsig: 1.5, boxMaxPsig: 3, calibrationMonths: 12,
    });

    const byTech = await procedure.PATCH(request("/api/shop-settings/leak-test-procedure", { method: "PATCH", cookie: tech.cookie, body: { minHoldMinutes: 30 } }));
    expect(byTech.status).toBe(403);
    for (const body of [{ gaugeRatioMax: 1.2 }, { minHoldMinutes: -1 }, { minHoldMinutes: "long" }, { holdTime: 30 }, {}]) {
      const res = await procedure.PATCH(request("/api/shop-settings/leak-test-procedure", { method: "PATCH", cookie: owner.cookie, body }));
      expect(res.status).toBe(400);
    }
    const unchanged = await procedure.GET(request("/api/shop-settings/leak-test-procedure", { cookie: tech.cookie }));
    expect((await readBody(unchanged)).procedure.minHoldMinutes).toBe(15);

    const ok = await procedure.PATCH(request("/api/shop-settings/leak-test-procedure", { method: "PATCH", cookie: owner.cookie, body: { minHoldMinutes: 30 } }));
    expect(ok.status).toBe(200);
    expect((await readBody(ok)).procedure.minHoldMinutes).toBe(30);
    // The owner sees the change on the audit trail, with the figure before and after.
    const audit = await db().selectFrom("audit_event").select(["kind", "subject", "summary", "actor_id"]).where("subject", "=", "Leak-test procedure").execute();
    expect(audit).toEqual([{ kind: "settings_changed", subject: "Leak-test procedure", summary: `${owner.staff.name} changed the leak-test procedure: shortest hold (min) from 15 to 30.`, actor_id: owner.staff.id }]);

    // A 20-minute hold passed by the book, but not by this shop's 30 minutes.
    const job = await makeJob(db(), { stage: "pressure_test" });
    const tank = await addPart(tech.cookie, job.id);
    const answer = await recordTest(tech.cookie, tank.id, cleanTest({ holdMinutes: 20 }));
    expect(answer.result).toBe("invalid");
    expect(answer.invalidReasons[0].message).toContain("the shop's procedure");

    await procedure.PATCH(request("/api/shop-settings/leak-test-procedure", { method: "PATCH", cookie: owner.cookie, body: { minHoldMinutes: 15 } }));
  });
});

describe("changing a part's kind resets the kind's defaults", () => {
  it("PATCH of a reservoir's kind to bracket without needsLeakTest turns the flag off and drops the tank geometry", async () => {
    await ensureShop(db());
    const office = await as("office");
    const job = await makeJob(db(), { stage: "fabricate" });
    const tank = await addPart(office.cookie, job.id);
    expect(tank.needsLeakTest).toBe(true);
    const res = await partItem.PATCH(request(`/api/parts/${tank.id}`, { method: "PATCH", cookie: office.cookie, body: { kind: "bracket" } }), params({ id: String(tank.id) }));
    expect(res.status).toBe(200);
    const part = (await readBody(res)).part;
    expect(part.kind).toBe("bracket");
    expect(part.needsLeakTest).toBe(false);
    expect(part.shape).toBe("other");
    expect(part.geometry).toBeNull();
    const stored = await db().selectFrom("part").select(["needs_leak_test"]).where("id", "=", tank.id).executeTakeFirstOrThrow();
    expect(stored.needs_leak_test).toBe(0);
  });

  it("a bracket stays on the leak-test list when the change ticks it, and back to reservoir it is tested again", async () => {
    await ensureShop(db());
    const office = await as("office");
    const job = await makeJob(db(), { stage: "fabricate" });
    const tank = await addPart(office.cookie, job.id);
    const ticked = await partItem.PATCH(
      request(`/api/parts/${tank.id}`, { method: "PATCH", cookie: office.cookie, body: { kind: "bracket", needsLeakTest: true } }),
      params({ id: String(tank.id) }),
    );
    expect((await readBody(ticked)).part.needsLeakTest).toBe(true);
    const off = await partItem.PATCH(request(`/api/parts/${tank.id}`, { method: "PATCH", cookie: office.cookie, body: { needsLeakTest: false } }), params({ id: String(tank.id) }));
    expect((await readBody(off)).part.needsLeakTest).toBe(false);
    const back = await partItem.PATCH(request(`/api/parts/${tank.id}`, { method: "PATCH", cookie: office.cookie, body: { kind: "reservoir" } }), params({ id: String(tank.id) }));
    expect(back.status).toBe(200);
    expect((await readBody(back)).part.needsLeakTest).toBe(true);
  });
});
