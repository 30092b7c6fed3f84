import { describe, expect, it, beforeAll } from "vitest";
import * as board from "@/app/api/board/route";
import * as coatingRunItem from "@/app/api/coating-runs/[id]/route";
import * as coatingRuns from "@/app/api/coating-runs/route";
import * as parts from "@/app/api/jobs/[id]/parts/route";
import * as moves from "@/app/api/jobs/[id]/moves/route";
import * as signOff from "@/app/api/jobs/[id]/sign-off/route";
import * as leakTests from "@/app/api/parts/[id]/leak-tests/route";
import * as partItem from "@/app/api/parts/[id]/route";
import * as vendors from "@/app/api/vendors/route";
import type { Role, Stage } from "@/db/schema";
import { loadGateRecords } from "@/server/jobs/gate-records";
import { coatingFlags } from "@/server/records/queries";
import { SIGN_OFF_CHECK_KEYS } from "@/server/records/sign-off";
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
  return (await readBody(res)).part as { id: number; name: string };
}

// A 4 psig soap-and-decay test of a round tank: 70 °F throughout, so the drop is the leak.
function leakTestBody(endPressurePsig: number, seamResult: "pass" | "leak" = "pass") {
  return {
    method: "both", testPressurePsig: 4, gaugeFullScalePsi: 10, gaugeCalibratedOn: today(), holdMinutes: 20,
    startPressurePsig: 4, endPressurePsig, startTempF: 70, endTempF: 70, seams: [{ location: "Sump to shell", result: seamResult }], tester: "Bench tech",
  };
}

async function recordTest(cookie: string, partId: number, body: unknown) {
  const res = await leakTests.POST(request(`/api/parts/${partId}/leak-tests`, { cookie, body }), params({ id: String(partId) }));
  expect(res.status).toBe(201);
  return readBody(res);
}

async function version(jobId: number) {
  return (await db().selectFrom("job").select("version").where("id", "=", jobId).executeTakeFirstOrThrow()).version;
}

async function moveTo(cookie: string, jobId: number, toStage: Stage) {
  return moves.POST(request(`/api/jobs/${jobId}/moves`, { cookie, body: { toStage, version: await version(jobId) } }), params({ id: String(jobId) }));
}

async function stageOf(jobId: number) {
  return (await db().selectFrom("job").select("stage").where("id", "=", jobId).executeTakeFirstOrThrow()).stage;
}

async function makeVendor(cookie: string, name: string) {
  const res = await vendors.POST(request("/api/vendors", { cookie, body: { name, usualTurnaroundDays: 5 } }));
  expect(res.status).toBe(201);
  return (await readBody(res)).vendor as { id: number };
}

describe("into Outside coating: every leak-test part passed since its last rework", () => {
  it("refuses an untested tank, refuses a failed one, and lets a pass through", async () => {
    await ensureShop(db());
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "pressure_test" });
    const tank = await addPart(tech.cookie, job.id);

    const untested = await moveTo(tech.cookie, job.id, "coating");
    expect(untested.status).toBe(422);
    expect((await readBody(untested)).error.details.unmet).toEqual([expect.stringMatching(/40 gal round reservoir: record a passing leak test/)]);

    const failed = await recordTest(tech.cookie, tank.id, leakTestBody(3.8));
    expect(failed.result).toBe("fail");
    const afterFail = await moveTo(tech.cookie, job.id, "coating");
    expect(afterFail.status).toBe(422);
    expect((await readBody(afterFail)).error.details.unmet).toEqual([expect.stringMatching(/last leak test failed/)]);
    expect(await stageOf(job.id)).toBe("pressure_test");

    const passed = await recordTest(tech.cookie, tank.id, leakTestBody(4));
    expect(passed.result).toBe("pass");
    expect((await moveTo(tech.cookie, job.id, "coating")).status).toBe(200);
    expect(await stageOf(job.id)).toBe("coating");
  });

  it("a pass then a newer fail closes the gate: the newest test since the last rework must be the pass", async () => {
    // A later fail means the tank leaks now, whatever the earlier test said.
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "pressure_test" });
    const tank = await addPart(tech.cookie, job.id);
    await recordTest(tech.cookie, tank.id, leakTestBody(4));
    await recordTest(tech.cookie, tank.id, leakTestBody(3.5));
    expect((await loadGateRecords(db(), [job.id])).get(job.id)!.leakTestParts).toEqual([
      { name: tank.name, passedSinceRework: false, lastResult: "fail", reworked: false },
    ]);
    const refused = await moveTo(tech.cookie, job.id, "coating");
    expect(refused.status).toBe(422);
    expect((await readBody(refused)).error.details.unmet).toEqual([expect.stringMatching(/40 gal round reservoir: the last leak test failed/)]);
    const card = (await readBody(await board.GET(request("/api/board", { cookie: tech.cookie })))).cards.find((c: { id: number }) => c.id === job.id);
    expect(card.gate.unmet).toEqual([expect.stringMatching(/the last leak test failed/)]);

    // Tested again without a rework and passing: the newest test decides again.
    await recordTest(tech.cookie, tank.id, leakTestBody(4));
    expect((await moveTo(tech.cookie, job.id, "coating")).status).toBe(200);
  });

  it("rework voids the pass: the job cannot enter coating again until a new pass", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "pressure_test" });
    const tank = await addPart(tech.cookie, job.id);
    await recordTest(tech.cookie, tank.id, leakTestBody(4));
    expect((await moveTo(tech.cookie, job.id, "coating")).status).toBe(200);

    // Damaged on the way to the coater: back to fabricate, reworked.
    expect((await moveTo(tech.cookie, job.id, "fabricate")).status).toBe(200);
    const rework = await partItem.PATCH(
      request(`/api/parts/${tank.id}`, { method: "PATCH", cookie: tech.cookie, body: { reworked: true, reworkNote: "Rewelded the dented corner" } }),
      params({ id: String(tank.id) }),
    );
    expect(rework.status).toBe(200);
    const reworked = (await readBody(rework)).part;
    expect(reworked.reworkCount).toBe(1);
    expect(reworked.reworkedAt).toEqual(expect.any(String));
    expect(reworked.leak).toEqual({ passedSinceRework: false, lastResult: null });

    expect((await moveTo(tech.cookie, job.id, "pressure_test")).status).toBe(200);
    const refused = await moveTo(tech.cookie, job.id, "coating");
    expect(refused.status).toBe(422);
    expect((await readBody(refused)).error.details.unmet[0]).toMatch(/none since its last rework/);

    // The old pass is still on record, marked as no longer counting.
    const history = await readBody(await leakTests.GET(request(`/api/parts/${tank.id}/leak-tests`, { cookie: tech.cookie }), params({ id: String(tank.id) })));
    expect(history.leakTests.map((t: { result: string; current: boolean }) => [t.result, t.current])).toEqual([["pass", false]]);

    await recordTest(tech.cookie, tank.id, leakTestBody(4));
    expect((await moveTo(tech.cookie, job.id, "coating")).status).toBe(200);
  });

  it("skipping a column does not skip its gate", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "fabricate" });
    await addPart(tech.cookie, job.id);
    const res = await moveTo(tech.cookie, job.id, "install");
    expect(res.status).toBe(422);
    const unmet: string[] = (await readBody(res)).error.details.unmet;
    expect(unmet.some((u) => /^Into Outside coating: .*leak test/.test(u))).toBe(true);
    expect(unmet.some((u) => /^Into Install: .*not sent for coating yet/.test(u))).toBe(true);
  });
});

describe("into Install: every coated part back and inspected", () => {
  it("a coating run spanning two jobs releases both when it is received and inspected", async () => {
    const office = await as("office");
    const tech = await as("tech");
    const vendor = await makeVendor(office.cookie, "Bright Bend Finishing");
    const jobA = await makeJob(db(), { stage: "pressure_test" });
    const jobB = await makeJob(db(), { stage: "pressure_test" });
    const tankA = await addPart(tech.cookie, jobA.id);
    const tankB = await addPart(tech.cookie, jobB.id, { name: "45 gal box reservoir", shape: "box", geometry: null, kind: "reservoir" });
    const bracket = await addPart(tech.cookie, jobB.id, { name: "Breakaway bracket", kind: "bracket", material: "carbon_steel", needsLeakTest: false, geometry: null });
    await recordTest(tech.cookie, tankA.id, leakTestBody(4));
    await recordTest(tech.cookie, tankB.id, { ...leakTestBody(2), method: "soap", testPressurePsig: 2, startPressurePsig: 2, gaugeFullScalePsi: 5 });
    for (const job of [jobA, jobB]) expect((await moveTo(tech.cookie, job.id, "coating")).status).toBe(200);

    const sent = await coatingRuns.POST(
      request("/api/coating-runs", {
        cookie: office.cookie,
        body: { vendorId: vendor.id, finish: { colour: "Gloss black", gloss: "gloss" }, sentOn: today(), promisedOn: today(), partIds: [tankA.id, tankB.id, bracket.id] },
      }),
    );
    expect(sent.status).toBe(201);
    const run = (await readBody(sent)).run;
    expect(run.parts.map((p: { id: number; jobId: number }) => [p.id, p.jobId])).toEqual(
      expect.arrayContaining([[tankA.id, jobA.id], [tankB.id, jobB.id], [bracket.id, jobB.id]]),
    );

    for (const job of [jobA, jobB]) {
      const res = await moveTo(tech.cookie, job.id, "install");
      expect(res.status).toBe(422);
      expect((await readBody(res)).error.details.unmet[0]).toMatch(/still out for coating; mark the coating run received/);
    }
    const cards = (await readBody(await board.GET(request("/api/board", { cookie: tech.cookie })))).cards;
    const cardB = cards.find((c: { id: number }) => c.id === jobB.id);
    expect(cardB.gate.unmet).toHaveLength(2);
    expect(cardB.coating).toEqual({ overdue: false, vendorName: "Bright Bend Finishing", promisedOn: today() });
    expect((await coatingFlags(db(), [jobA.id, jobB.id])).get(jobA.id)).toEqual({ overdue: false, vendorName: "Bright Bend Finishing", promisedOn: today() });

    const received = await coatingRunItem.PATCH(
      request(`/api/coating-runs/${run.id}`, { method: "PATCH", cookie: office.cookie, body: { receivedOn: today() } }),
      params({ id: String(run.id) }),
    );
    expect(received.status).toBe(200);
    expect((await coatingFlags(db(), [jobA.id, jobB.id])).size).toBe(0);
    const backNotInspected = await moveTo(tech.cookie, jobA.id, "install");
    expect(backNotInspected.status).toBe(422);
    expect((await readBody(backNotInspected)).error.details.unmet[0]).toMatch(/record the receiving inspection/);

    const inspected = await coatingRunItem.PATCH(
      request(`/api/coating-runs/${run.id}`, { method: "PATCH", cookie: office.cookie, body: { inspection: { dftReadingsMils: [2.4, 2.8, 3.1], adhesionOk: true } } }),
      params({ id: String(run.id) }),
    );
    expect(inspected.status).toBe(200);
    expect((await readBody(inspected)).run.inspection).toEqual(expect.objectContaining({ dftReadingsMils: [2.4, 2.8, 3.1], adhesionOk: true, defects: "", inspectedByName: office.staff.name }));

    const after = (await readBody(await board.GET(request("/api/board", { cookie: tech.cookie })))).cards;
    for (const job of [jobA, jobB]) {
      expect(after.find((c: { id: number }) => c.id === job.id).gate).toEqual({ stage: "install", label: "Install", unmet: [] });
      expect(after.find((c: { id: number }) => c.id === job.id).coating).toBeNull();
      expect((await moveTo(tech.cookie, job.id, "install")).status).toBe(200);
    }
  });

  it("a part sent again for a recoat holds the job until that run is back too", async () => {
    const office = await as("office");
    const tech = await as("tech");
    const vendor = await makeVendor(office.cookie, "Quarry Road Coatings");
    const job = await makeJob(db(), { stage: "coating" });
    const box = await addPart(tech.cookie, job.id, { name: "Tool box", kind: "box", material: "carbon_steel", needsLeakTest: false, geometry: null });
    const send = (body: Record<string, unknown> = {}) =>
      coatingRuns.POST(request("/api/coating-runs", { cookie: office.cookie, body: { vendorId: vendor.id, finish: { colour: "Safety yellow", gloss: "semi_gloss" }, sentOn: today(), promisedOn: today(), partIds: [box.id], ...body } }));
    const first = (await readBody(await send({ receivedOn: today() }))).run;
    await coatingRunItem.PATCH(
      request(`/api/coating-runs/${first.id}`, { method: "PATCH", cookie: office.cookie, body: { inspection: { dftReadingsMils: [1.2], adhesionOk: false, defects: "Thin on the lid edge" } } }),
      params({ id: String(first.id) }),
    );
    // A failed adhesion check does not count as inspected for the gate.
    expect((await loadGateRecords(db(), [job.id])).get(job.id)!.coatedParts).toEqual([{ name: "Tool box", sent: true, received: true, inspected: false, adhesionFailed: true }]);
    expect((await send()).status).toBe(201);
    expect((await loadGateRecords(db(), [job.id])).get(job.id)!.coatedParts).toEqual([{ name: "Tool box", sent: true, received: false, inspected: false, adhesionFailed: false }]);
  });
});

describe("into Ready for pickup: the sign-off complete", () => {
  it("a saved draft holds the job and says what is missing; the complete sign-off lets it go", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "wire" });
    const put = (body: unknown) => signOff.PUT(request(`/api/jobs/${job.id}/sign-off`, { method: "PUT", cookie: tech.cookie, body }), params({ id: String(job.id) }));
    const draft = { indicatorSource: "pto_feedback", indicatorInput: "ground_active", checks: { indicator_follows_pto: true } };
    expect((await put({ ...draft, expectedVersion: 0 })).status).toBe(200);
    const refused = await moveTo(tech.cookie, job.id, "ready");
    expect(refused.status).toBe(422);
    const unmet: string[] = (await readBody(refused)).error.details.unmet;
    expect(unmet).toContain("Into Ready for pickup: Sign-off: Not checked yet: Pump runs without cavitation noise.");
    expect(unmet.some((u) => /indicator source/.test(u))).toBe(false);

    const complete = { ...draft, checks: Object.fromEntries(SIGN_OFF_CHECK_KEYS.map((k) => [k, true])), reliefPressurePsi: 2500, timedRunMinutes: 20, signedBy: "Ines Marsh", expectedVersion: 1 };
    const saved = await readBody(await put(complete));
    expect(saved.signOff).toEqual(expect.objectContaining({ complete: true, missing: [], signedBy: "Ines Marsh", signedByStaffName: tech.staff.name }));
    expect((await moveTo(tech.cookie, job.id, "ready")).status).toBe(200);
  });
});

describe("loading gate records for the board", () => {
  it("answers for hundreds of jobs at once, each with its own records", async () => {
    const tech = await as("tech");
    const first = await makeJob(db(), { stage: "pressure_test" });
    const { customer_id, truck_id } = await db().selectFrom("job").select(["customer_id", "truck_id"]).where("id", "=", first.id).executeTakeFirstOrThrow();
    const at = new Date().toISOString();
    const rest = await db()
      .insertInto("job")
      .values(
        Array.from({ length: 619 }, (_, i) => ({
          work_order: `WO-BULK-${first.id}-${i}`, customer_id, truck_id, scope: "fabrication" as const, description: "Wet kit", stage: "pressure_test" as const,
          position: 1000 + i, due_on: null, assigned_tech_id: null, priority: "normal" as const, notes: "", version: 1, created_at: at, updated_at: at,
        })),
      )
      .returning("id")
      .execute();
    const jobs = [first, ...rest];
    const tested = jobs[5];
    const untested = jobs[600];
    const tank = await addPart(tech.cookie, tested.id);
    await addPart(tech.cookie, untested.id, { name: "Untested tank" });
    await recordTest(tech.cookie, tank.id, leakTestBody(4));
    const records = await loadGateRecords(db(), jobs.map((j) => j.id));
    expect(records.size).toBe(620);
    expect(records.get(tested.id)!.leakTestParts).toEqual([{ name: tank.name, passedSinceRework: true, lastResult: "pass", reworked: false }]);
    expect(records.get(untested.id)!.leakTestParts).toEqual([{ name: "Untested tank", passedSinceRework: false, lastResult: null, reworked: false }]);
    expect(records.get(jobs[0].id)).toMatchObject({ partCount: 1, leakTestParts: [], coatedParts: [], signOff: null });
  });
});
