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
import { SIGN_OFF_CHECK_KEYS } from "@/server/records/sign-off";
import { shopToday } from "@/server/records/turnaround";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";
import { moneyChecksOff } from "../support/money";

// Who may change what a gate asks for, and the records the gates must not be fooled by.
const { db } = useFreshDatabase();
// Money is not the subject here: the shop's money checks are off (payments-gates.test.ts holds them).
beforeAll(() => moneyChecksOff(db()));

async function as(role: Role) {
  const staff = await makeStaff(db(), role);
  return { staff, cookie: await sessionCookieFor(staff.id) };
}

const today = () => shopToday({ now: new Date(), timeZone: "US/Central" });
const fields = async (res: Response) => Object.keys((await readBody(res)).error.details.fields);

const tankBody = { name: "40 gal round reservoir", kind: "reservoir", material: "aluminum", needsLeakTest: true, needsCoating: true, geometry: { shape: "round", insideDiameterIn: 18, lengthIn: 36.5 } };
const boxBody = { name: "Tool box", kind: "box", material: "carbon_steel", needsLeakTest: false, needsCoating: true };

async function addPart(cookie: string, jobId: number, body: Record<string, unknown> = tankBody) {
  const res = await parts.POST(request(`/api/jobs/${jobId}/parts`, { cookie, body }), params({ id: String(jobId) }));
  expect(res.status, JSON.stringify(await res.clone().json())).toBe(201);
  return (await readBody(res)).part as { id: number; name: string };
}

const patchPart = (cookie: string, id: number, body: unknown, headers?: Record<string, string>) =>
  partItem.PATCH(request(`/api/parts/${id}`, { method: "PATCH", cookie, body, headers }), params({ id: String(id) }));
const deletePart = (cookie: string, id: number, headers?: Record<string, string>) =>
  partItem.DELETE(request(`/api/parts/${id}`, { method: "DELETE", cookie, headers }), params({ id: String(id) }));

// A 4 psig soap-and-decay test at 70 °F throughout, so the drop is the leak.
function leakTestBody(endPressurePsig: number) {
  return {
    method: "both", testPressurePsig: 4, gaugeFullScalePsi: 10, gaugeCalibratedOn: today(), holdMinutes: 20,
    startPressurePsig: 4, endPressurePsig, startTempF: 70, endTempF: 70, seams: [{ location: "Sump to shell", result: "pass" }], tester: "Bench tech",
  };
}

async function recordTest(cookie: string, partId: number, endPressurePsig: number, overrides: Record<string, unknown> = {}) {
  const body = { ...leakTestBody(endPressurePsig), ...overrides };
  const res = await leakTests.POST(request(`/api/parts/${partId}/leak-tests`, { cookie, body }), params({ id: String(partId) }));
  expect(res.status).toBe(201);
  return (await readBody(res)).result as "pass" | "fail" | "invalid";
}

async function version(jobId: number) {
  return (await db().selectFrom("job").select("version").where("id", "=", jobId).executeTakeFirstOrThrow()).version;
}

async function moveTo(cookie: string, jobId: number, toStage: Stage) {
  return moves.POST(request(`/api/jobs/${jobId}/moves`, { cookie, body: { toStage, version: await version(jobId) } }), params({ id: String(jobId) }));
}

async function partRow(id: number) {
  return db().selectFrom("part").selectAll().where("id", "=", id).executeTakeFirst();
}

let vendorCount = 0;
async function makeVendor(cookie: string) {
  const res = await vendors.POST(request("/api/vendors", { cookie, body: { name: `Guard coater ${++vendorCount}`, usualTurnaroundDays: 5 } }));
  expect(res.status).toBe(201);
  return (await readBody(res)).vendor as { id: number };
}

function sendRun(cookie: string, vendorId: number, partIds: number[], over: Record<string, unknown> = {}) {
  return coatingRuns.POST(
    request("/api/coating-runs", { cookie, body: { vendorId, finish: { colour: "Gloss black", gloss: "gloss" }, sentOn: today(), promisedOn: today(), partIds, ...over } }),
  );
}

function patchRun(cookie: string, runId: number, body: unknown) {
  return coatingRunItem.PATCH(request(`/api/coating-runs/${runId}`, { method: "PATCH", cookie, body }), params({ id: String(runId) }));
}

const inspection = (adhesionOk: boolean, defects = "") => ({ inspection: { dftReadingsMils: [2.4, 2.7], adhesionOk, defects } });

async function coatedParts(jobId: number) {
  return (await loadGateRecords(db(), [jobId])).get(jobId)!.coatedParts;
}

describe("who may change what a gate asks for", () => {
  it("a tech cannot delete a part; the office can, and the refusal says who", async () => {
    await ensureShop(db());
    const tech = await as("tech");
    const office = await as("office");
    const job = await makeJob(db(), { stage: "pressure_test" });
    const tank = await addPart(tech.cookie, job.id);

    const refused = await deletePart(tech.cookie, tank.id);
    expect(refused.status).toBe(403);
    expect((await readBody(refused)).error).toEqual(expect.objectContaining({ code: "forbidden", message: expect.stringMatching(/office or the owner/) }));
    expect(await partRow(tank.id)).toBeDefined();
    // The gate still asks for the tank's test.
    expect((await moveTo(tech.cookie, job.id, "coating")).status).toBe(422);

    expect((await deletePart(office.cookie, tank.id)).status).toBe(204);
    expect(await partRow(tank.id)).toBeUndefined();
  });

  it("a tech cannot take a part off the leak-test or coating list or change its kind; the office can", async () => {
    const tech = await as("tech");
    const office = await as("office");
    const job = await makeJob(db(), { stage: "pressure_test" });
    const box = await addPart(tech.cookie, job.id, { ...boxBody, name: "Battery box", needsLeakTest: true });
    // A box tank is tested at 1.5–3 psig (UL 142 §42.2.1) on a 5 psi gauge; a 0.5 psi drop fails it.
    expect(await recordTest(tech.cookie, box.id, 1.5, { testPressurePsig: 2, startPressurePsig: 2, gaugeFullScalePsi: 5 })).toBe("fail");
    const before = await partRow(box.id);

    for (const body of [{ needsLeakTest: false }, { needsCoating: false }, { kind: "bracket", shape: "other" }, { kind: "other", needsLeakTest: false }]) {
      const res = await patchPart(tech.cookie, box.id, body);
      expect(res.status, JSON.stringify(body)).toBe(403);
      expect((await readBody(res)).error.message, JSON.stringify(body)).toMatch(/Only the office or the owner can .*Ask them, or mark the part reworked/);
    }
    expect(await partRow(box.id)).toEqual(before);
    const refused = await moveTo(tech.cookie, job.id, "coating");
    expect(refused.status).toBe(422);
    expect((await readBody(refused)).error.details.unmet).toEqual([expect.stringMatching(/Battery box: the last leak test failed/)]);

    // What techs keep doing: renaming, resending the form's unchanged flags, adding to a list, marking rework.
    const form = { name: "Battery box, left", kind: "box", material: "carbon_steel", shape: "box", geometry: null, needsLeakTest: true, needsCoating: true, notes: "Lid hinge on the outboard side" };
    expect((await patchPart(tech.cookie, box.id, form)).status).toBe(200);
    const bracket = await addPart(tech.cookie, job.id, { name: "Pump bracket", kind: "bracket", material: "carbon_steel", needsLeakTest: false, needsCoating: false });
    expect((await patchPart(tech.cookie, bracket.id, { needsCoating: true })).status).toBe(200);
    expect((await patchPart(tech.cookie, box.id, { reworked: true, reworkNote: "Rewelded the lid seam" })).status).toBe(200);

    const cleared = await patchPart(office.cookie, box.id, { needsLeakTest: false });
    expect(cleared.status).toBe(200);
    expect((await readBody(cleared)).part.needsLeakTest).toBe(false);
    expect((await patchPart(office.cookie, bracket.id, { kind: "other" })).status).toBe(200);
  });

  it("a reservoir always needs a leak test: the record after the patch is checked, and the database refuses one without", async () => {
    const office = await as("office");
    const job = await makeJob(db(), { stage: "fabricate" });
    const bracket = await addPart(office.cookie, job.id, { name: "Tank saddle", kind: "bracket", material: "aluminum", needsLeakTest: false, needsCoating: false });
    const before = await partRow(bracket.id);
    // The request unticks the test on a part it makes a reservoir: refused, nothing changed.
    expect(await fields(await patchPart(office.cookie, bracket.id, { kind: "reservoir", needsLeakTest: false }))).toEqual(["needsLeakTest"]);
    expect(await partRow(bracket.id)).toEqual(before);
    // Only the kind in the request: a reservoir's defaults come with it, the leak test among them.
    const made = await patchPart(office.cookie, bracket.id, { kind: "reservoir" });
    expect(made.status).toBe(200);
    expect((await readBody(made)).part.needsLeakTest).toBe(true);

    const at = new Date().toISOString();
    await expect(
      db()
        .insertInto("part")
        .values({ job_id: job.id, name: "Untestable tank", kind: "reservoir", material: "aluminum", shape: "other", geometry: null, needs_leak_test: 0, needs_coating: 1, notes: "", rework_count: 0, reworked_at: null, rework_note: "", created_at: at, updated_at: at })
        .execute(),
    ).rejects.toThrow(/CHECK constraint failed/);
    await expect(db().updateTable("part").set({ needs_leak_test: 0 }).where("id", "=", bracket.id).execute()).rejects.toThrow(/CHECK constraint failed/);
  });

  it("DELETE refuses a cross-site request and changes nothing", async () => {
    const office = await as("office");
    const job = await makeJob(db(), { stage: "fabricate" });
    const bracket = await addPart(office.cookie, job.id, { name: "Light bar bracket", kind: "bracket", material: "aluminum", needsLeakTest: false, needsCoating: false });
    const fromElsewhere = await deletePart(office.cookie, bracket.id, { origin: "https://elsewhere.example" });
    expect(fromElsewhere.status).toBe(403);
    expect((await readBody(fromElsewhere)).error.code).toBe("cross_site");
    const fetchedCrossSite = await deletePart(office.cookie, bracket.id, { "sec-fetch-site": "cross-site" });
    expect(fetchedCrossSite.status).toBe(403);
    expect(await partRow(bracket.id)).toBeDefined();
  });
});

describe("install-only jobs have no fabricated parts", () => {
  it("refuses a part that needs a leak test or coating, naming the field, and adds nothing", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "queued", scope: "install_only" });
    const cases: [Record<string, unknown>, string[]][] = [
      [tankBody, ["needsCoating", "needsLeakTest"]],
      [{ name: "Valve bracket", kind: "bracket", material: "carbon_steel", needsLeakTest: false, needsCoating: true }, ["needsCoating"]],
      [{ name: "Hose tray", kind: "other", material: "aluminum", needsLeakTest: true, needsCoating: false }, ["needsLeakTest"]],
    ];
    for (const [body, names] of cases) {
      const res = await parts.POST(request(`/api/jobs/${job.id}/parts`, { cookie: tech.cookie, body }), params({ id: String(job.id) }));
      expect(res.status, String(body.name)).toBe(400);
      const error = (await readBody(res)).error;
      expect(Object.keys(error.details.fields).sort()).toEqual(names);
      for (const name of names) expect(error.details.fields[name][0]).toMatch(/install only: it has no fabricated parts.*Change the job's Work to fabricated parts first/);
    }
    expect(await db().selectFrom("part").select("id").where("job_id", "=", job.id).execute()).toEqual([]);

    // A plain bracket is fine, and later turning its coating on is refused the same way.
    const bracket = await addPart(tech.cookie, job.id, { name: "Valve bracket", kind: "bracket", material: "carbon_steel", needsLeakTest: false, needsCoating: false });
    expect(await fields(await patchPart(tech.cookie, bracket.id, { needsCoating: true }))).toEqual(["needsCoating"]);
    expect((await partRow(bracket.id))!.needs_coating).toBe(0);
    expect((await moveTo(tech.cookie, job.id, "install")).status).toBe(200);
  });
});

describe("leak tests: the newest test since the last rework decides", () => {
  it("a tank whose newest test failed cannot be sent out for coating, even with an earlier pass", async () => {
    const office = await as("office");
    const tech = await as("tech");
    const vendor = await makeVendor(office.cookie);
    const job = await makeJob(db(), { stage: "pressure_test" });
    const tank = await addPart(tech.cookie, job.id);
    await recordTest(tech.cookie, tank.id, 4);
    await recordTest(tech.cookie, tank.id, 3.5);
    const refused = await sendRun(office.cookie, vendor.id, [tank.id]);
    expect(refused.status).toBe(400);
    expect((await readBody(refused)).error.details.fields["partIds.0"][0]).toMatch(/failed its last leak test/);
    expect(await db().selectFrom("coating_run_part").select("run_id").where("part_id", "=", tank.id).execute()).toEqual([]);
  });
});

describe("into Install: coating counts only since the last rework, and only with adhesion passed", () => {
  it("a part with no coating run yet is not sent, and the gate says so", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "coating" });
    await addPart(tech.cookie, job.id, boxBody);
    expect(await coatedParts(job.id)).toEqual([{ name: "Tool box", sent: false, received: false, inspected: false, adhesionFailed: false }]);
    const refused = await moveTo(tech.cookie, job.id, "install");
    expect(refused.status).toBe(422);
    const unmet: string[] = (await readBody(refused)).error.details.unmet;
    expect(unmet).toEqual([expect.stringMatching(/Tool box: not sent for coating yet/)]);
    expect(unmet.join(" ")).not.toMatch(/still out for coating/);
  });

  it("an inspection from before a rework no longer releases the part; a run after it does", async () => {
    const office = await as("office");
    const tech = await as("tech");
    const vendor = await makeVendor(office.cookie);
    const job = await makeJob(db(), { stage: "coating" });
    const box = await addPart(tech.cookie, job.id, boxBody);
    const first = (await readBody(await sendRun(office.cookie, vendor.id, [box.id], { receivedOn: today() }))).run;
    expect((await patchRun(office.cookie, first.id, inspection(true))).status).toBe(200);
    expect((await coatedParts(job.id))[0]).toEqual(expect.objectContaining({ received: true, inspected: true }));

    // Dropped off the forklift after it came back: ground and rewelded, so the coating is gone.
    expect((await patchPart(tech.cookie, box.id, { reworked: true, reworkNote: "Rewelded the hinge corner" })).status).toBe(200);
    const refused = await moveTo(tech.cookie, job.id, "install");
    expect(refused.status).toBe(422);
    expect((await readBody(refused)).error.details.unmet).toEqual([expect.stringMatching(/Tool box: not sent for coating yet/)]);
    expect(await coatedParts(job.id)).toEqual([{ name: "Tool box", sent: false, received: false, inspected: false, adhesionFailed: false }]);
    const part = (await readBody(await partItem.GET(request(`/api/parts/${box.id}`, { cookie: tech.cookie }), params({ id: String(box.id) })))).part;
    expect(part.coating).toEqual(expect.objectContaining({ runId: first.id, state: "inspected", current: false }));

    // Sent again: the run keeps the generation it was sent in.
    const second = (await readBody(await sendRun(office.cookie, vendor.id, [box.id]))).run;
    const links = await db().selectFrom("coating_run_part").select(["run_id", "rework_count"]).where("part_id", "=", box.id).orderBy("run_id").execute();
    expect(links).toEqual([{ run_id: first.id, rework_count: 0 }, { run_id: second.id, rework_count: 1 }]);
    expect(await coatedParts(job.id)).toEqual([{ name: "Tool box", sent: true, received: false, inspected: false, adhesionFailed: false }]);
    expect((await patchRun(office.cookie, second.id, { receivedOn: today(), ...inspection(true) })).status).toBe(200);
    expect((await moveTo(tech.cookie, job.id, "install")).status).toBe(200);
  });

  it("a failed adhesion check holds the part; a passing inspection releases it, and noted defects do not hold it", async () => {
    const office = await as("office");
    const tech = await as("tech");
    const vendor = await makeVendor(office.cookie);
    const job = await makeJob(db(), { stage: "coating" });
    const box = await addPart(tech.cookie, job.id, boxBody);
    const run = (await readBody(await sendRun(office.cookie, vendor.id, [box.id], { receivedOn: today() }))).run;
    expect((await patchRun(office.cookie, run.id, inspection(false, "Flaking at the lid edge after the tape test"))).status).toBe(200);
    const refused = await moveTo(tech.cookie, job.id, "install");
    expect(refused.status).toBe(422);
    expect((await readBody(refused)).error.details.unmet).toEqual(["Into Install: Tool box: coating failed adhesion; send it back for a recoat or record a passing inspection."]);
    expect(await coatedParts(job.id)).toEqual([{ name: "Tool box", sent: true, received: true, inspected: false, adhesionFailed: true }]);
    const card = (await readBody(await board.GET(request("/api/board", { cookie: tech.cookie })))).cards.find((c: { id: number }) => c.id === job.id);
    expect(card.gate.unmet).toHaveLength(1);
    const part = (await readBody(await partItem.GET(request(`/api/parts/${box.id}`, { cookie: tech.cookie }), params({ id: String(box.id) })))).part;
    expect(part.coating).toEqual(expect.objectContaining({ state: "inspected", adhesionOk: false, current: true }));

    // Checked again and the adhesion holds; a run in the powder is noted, and the office accepted it.
    expect((await patchRun(office.cookie, run.id, inspection(true, "Small run in the powder on the lid"))).status).toBe(200);
    expect(await coatedParts(job.id)).toEqual([{ name: "Tool box", sent: true, received: true, inspected: true, adhesionFailed: false }]);
    expect((await moveTo(tech.cookie, job.id, "install")).status).toBe(200);
  });
});

describe("the sign-off's version", () => {
  const complete = { indicatorSource: "pto_feedback", indicatorInput: "ground_active", checks: Object.fromEntries(SIGN_OFF_CHECK_KEYS.map((k) => [k, true])), reliefPressurePsi: 2500, timedRunMinutes: 20, signedBy: "Ines Marsh" };

  it("a stale tab cannot re-complete a sign-off someone has just un-ticked", async () => {
    const tech = await as("tech");
    const office = await as("office");
    const job = await makeJob(db(), { stage: "wire" });
    const put = (cookie: string, body: unknown) => signOff.PUT(request(`/api/jobs/${job.id}/sign-off`, { method: "PUT", cookie, body }), params({ id: String(job.id) }));

    const noVersion = await put(tech.cookie, complete);
    expect(noVersion.status).toBe(400);
    expect(await fields(noVersion)).toEqual(["expectedVersion"]);
    expect(await db().selectFrom("sign_off").select("id").where("job_id", "=", job.id).executeTakeFirst()).toBeUndefined();
    expect((await put(tech.cookie, { ...complete, expectedVersion: 2 })).status).toBe(409);

    const first = (await readBody(await put(tech.cookie, { ...complete, expectedVersion: 0 }))).signOff;
    expect(first).toEqual(expect.objectContaining({ complete: true, version: 1 }));
    // Two tabs hold version 1. The office finds the breakaways uncapped and un-ticks that check.
    const unticked = (await readBody(await put(office.cookie, { ...complete, checks: { ...complete.checks, breakaways_secured_capped: false }, expectedVersion: 1 }))).signOff;
    expect(unticked).toEqual(expect.objectContaining({ complete: false, version: 2 }));

    const before = await db().selectFrom("sign_off").selectAll().where("job_id", "=", job.id).executeTakeFirstOrThrow();
    const stale = await put(tech.cookie, { ...complete, expectedVersion: 1 });
    expect(stale.status).toBe(409);
    const error = (await readBody(stale)).error;
    expect(error.code).toBe("stale");
    expect(error.message).toMatch(/Someone saved this sign-off after you opened it/);
    expect(error.details.signOff).toEqual(expect.objectContaining({ complete: false, version: 2, fields: expect.objectContaining({ checks: expect.objectContaining({ breakaways_secured_capped: false }) }) }));
    expect(await db().selectFrom("sign_off").selectAll().where("job_id", "=", job.id).executeTakeFirstOrThrow()).toEqual(before);
    expect((await moveTo(tech.cookie, job.id, "ready")).status).toBe(422);

    // Reloaded, the tech re-checks the caps and signs again on the current version.
    expect((await readBody(await put(tech.cookie, { ...complete, expectedVersion: 2 }))).signOff).toEqual(expect.objectContaining({ complete: true, version: 3 }));
    expect((await moveTo(tech.cookie, job.id, "ready")).status).toBe(200);
  });
});
