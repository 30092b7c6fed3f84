import { describe, expect, it, beforeAll } from "vitest";
import * as coatingRunItem from "@/app/api/coating-runs/[id]/route";
import * as coatingRuns from "@/app/api/coating-runs/route";
import * as parts from "@/app/api/jobs/[id]/parts/route";
import * as leakTests from "@/app/api/parts/[id]/leak-tests/route";
import * as vendors from "@/app/api/vendors/route";
import type { Stage } from "@/db/schema";
import { shopToday } from "@/server/records/turnaround";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";
import { moneyChecksOff } from "../support/money";

const { db } = useFreshDatabase();
// Money is not the subject here: the shop's money checks are off (payments-gates.test.ts holds them).
beforeAll(() => moneyChecksOff(db()));
let office = "";
let officeId = "";
let vendorId = 0;

const today = () => shopToday({ now: new Date(), timeZone: "US/Central" });
const tank = { name: "40 gal round reservoir", kind: "reservoir", material: "aluminum", needsLeakTest: true, needsCoating: true };
const passingTest = () => ({
  method: "both", testPressurePsig: 4, gaugeFullScalePsi: 10, gaugeCalibratedOn: today(), holdMinutes: 20,
  startPressurePsig: 4, endPressurePsig: 4, startTempF: 70, endTempF: 70, seams: [{ location: "Sump to shell", result: "pass" }], tester: "Bench tech",
});

async function addPart(jobId: number, body: Record<string, unknown>) {
  const res = await parts.POST(request(`/api/jobs/${jobId}/parts`, { cookie: office, body }), params({ id: String(jobId) }));
  expect(res.status).toBe(201);
  return (await readBody(res)).part.id as number;
}

async function passLeakTest(partId: number) {
  const res = await leakTests.POST(request(`/api/parts/${partId}/leak-tests`, { cookie: office, body: passingTest() }), params({ id: String(partId) }));
  expect(res.status).toBe(201);
}

/** A job in Pressure test with a tested tank that needs coating. */
async function testedJob() {
  const job = await makeJob(db(), { stage: "pressure_test", parts: false });
  const tankId = await addPart(job.id, tank);
  await passLeakTest(tankId);
  return { job, tankId };
}

const stageOf = async (jobId: number) => (await db().selectFrom("job").select("stage").where("id", "=", jobId).executeTakeFirstOrThrow()).stage as Stage;
const count = async (table: "coating_run" | "stage_event" | "outbox") => Number((await db().selectFrom(table).select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow()).n);

function send(partIds: number[], moveJobIds: number[]) {
  return coatingRuns.POST(
    request("/api/coating-runs", { cookie: office, body: { vendorId, finish: { colour: "Black", gloss: "gloss" }, sentOn: today(), promisedOn: today(), partIds, moveJobIds } }),
  );
}

function inspect(runId: number, moveJobIds: number[], adhesionOk = true, extra: Record<string, unknown> = {}) {
  return coatingRunItem.PATCH(
    request(`/api/coating-runs/${runId}`, { method: "PATCH", cookie: office, body: { ...extra, inspection: { dftReadingsMils: [2.4, 2.8, 3.0], adhesionOk, defects: "" }, moveJobIds } }),
    params({ id: String(runId) }),
  );
}

beforeAll(async () => {
  await ensureShop(db());
  const staff = await makeStaff(db(), "office");
  officeId = staff.id;
  office = await sessionCookieFor(staff.id);
  const res = await vendors.POST(request("/api/vendors", { cookie: office, body: { name: "Ridge Powder", contact: "", phone: "", email: "", usualTurnaroundDays: 5, notes: "" } }));
  vendorId = (await readBody(res)).vendor.id;
});

describe("sending a coating run moves its jobs", () => {
  it("moves a ticked job into Outside coating through the board's move: stage event, version and the customer's e-mail after the quiet period", async () => {
    const { job, tankId } = await testedJob();
    const res = await send([tankId], [job.id]);
    expect(res.status).toBe(201);
    const body = await readBody(res);
    expect(body.moves).toEqual([{ jobId: job.id, workOrder: job.work_order, toStage: "coating", moved: true, stage: "coating" }]);
    const row = await db().selectFrom("job").select(["stage", "version"]).where("id", "=", job.id).executeTakeFirstOrThrow();
    expect(row).toEqual({ stage: "coating", version: job.version + 1 });
    const event = await db().selectFrom("stage_event").selectAll().where("job_id", "=", job.id).orderBy("id", "desc").executeTakeFirstOrThrow();
    expect(event).toEqual(expect.objectContaining({ from_stage: "pressure_test", to_stage: "coating", actor_id: officeId, note: `Parts went out on coating run ${body.run.id}.`, override_reason: null }));
    const mail = await db().selectFrom("outbox").selectAll().where("job_id", "=", job.id).executeTakeFirstOrThrow();
    expect(mail.status).toBe("pending");
    expect(JSON.parse(mail.payload)).toEqual({ from: "pressure_test", to: "coating" });
    // The shop's quiet period is 3 minutes unless changed: the customer hears 180 s after the move.
    expect(Date.parse(mail.next_attempt_at) - Date.parse(mail.created_at)).toBe(180_000);
  });

  it("an unticked job stays where it is", async () => {
    const { job, tankId } = await testedJob();
    const body = await readBody(await send([tankId], []));
    expect(body.moves).toEqual([]);
    expect(await stageOf(job.id)).toBe("pressure_test");
  });

  it("says in the move's own words what a job needs when it cannot move, and still sends the run and the other jobs", async () => {
    const ready = await testedJob();
    // A second tank on this job is leak-tested but not coated, and has no passing test yet.
    const blocked = await testedJob();
    await addPart(blocked.job.id, { name: "Hydraulic return box", kind: "box", material: "aluminum", needsLeakTest: true, needsCoating: false });
    const runsBefore = await count("coating_run");
    const res = await send([ready.tankId, blocked.tankId], [blocked.job.id, ready.job.id]);
    expect(res.status).toBe(201);
    const { moves } = await readBody(res);
    expect(await count("coating_run")).toBe(runsBefore + 1);
    expect(moves).toEqual([
      {
        jobId: blocked.job.id, workOrder: blocked.job.work_order, toStage: "coating", moved: false, stage: "pressure_test",
        reason: "Needs before it can move to Outside coating:", unmet: ["Hydraulic return box: record a passing leak test."],
      },
      { jobId: ready.job.id, workOrder: ready.job.work_order, toStage: "coating", moved: true, stage: "coating" },
    ]);
    expect(await stageOf(blocked.job.id)).toBe("pressure_test");
  });

  it("does not move a job whose other part needing coating has not gone out, and names that part", async () => {
    const { job, tankId } = await testedJob();
    const second = await addPart(job.id, { ...tank, name: "Diesel-side step box", kind: "box" });
    await passLeakTest(second);
    const { moves } = await readBody(await send([tankId], [job.id]));
    expect(moves[0]).toEqual(expect.objectContaining({ moved: false, stage: "pressure_test" }));
    expect(moves[0].reason).toContain("Diesel-side step box has not gone out yet");
    expect(await stageOf(job.id)).toBe("pressure_test");
  });

  it("refuses a job with no part on the run before sending anything", async () => {
    const { tankId } = await testedJob();
    const other = await makeJob(db(), { stage: "pressure_test" });
    const [runs, events] = [await count("coating_run"), await count("stage_event")];
    const res = await send([tankId], [other.id]);
    expect(res.status).toBe(400);
    expect((await readBody(res)).error.details.fields["moveJobIds.0"]).toEqual(["That job has no part on this run, so it does not move with it."]);
    expect([await count("coating_run"), await count("stage_event")]).toEqual([runs, events]);
  });
});

describe("a run received and inspected moves its jobs into Install", () => {
  async function jobOut() {
    const { job, tankId } = await testedJob();
    const body = await readBody(await send([tankId], [job.id]));
    return { job, runId: body.run.id as number };
  }

  it("moves the ticked jobs when the inspection passes", async () => {
    const { job, runId } = await jobOut();
    const res = await inspect(runId, [job.id], true, { receivedOn: today() });
    expect(res.status).toBe(200);
    const body = await readBody(res);
    expect(body.run.inspection.adhesionOk).toBe(true);
    expect(body.moves).toEqual([{ jobId: job.id, workOrder: job.work_order, toStage: "install", moved: true, stage: "install" }]);
    const event = await db().selectFrom("stage_event").selectAll().where("job_id", "=", job.id).orderBy("id", "desc").executeTakeFirstOrThrow();
    expect(event).toEqual(expect.objectContaining({ from_stage: "coating", to_stage: "install", note: `Parts back from coating run ${runId} and inspected.` }));
  });

  it("keeps a job out of Install when adhesion failed, saying why", async () => {
    const { job, runId } = await jobOut();
    const { moves } = await readBody(await inspect(runId, [job.id], false, { receivedOn: today() }));
    expect(moves).toEqual([
      {
        jobId: job.id, workOrder: job.work_order, toStage: "install", moved: false, stage: "coating",
        reason: "Needs before it can move to Install:", unmet: ["40 gal round reservoir: coating failed adhesion; send it back for a recoat or record a passing inspection."],
      },
    ]);
    expect(await stageOf(job.id)).toBe("coating");
  });

  it("moves jobs only with the inspection", async () => {
    const { job, runId } = await jobOut();
    const res = await coatingRunItem.PATCH(request(`/api/coating-runs/${runId}`, { method: "PATCH", cookie: office, body: { receivedOn: today(), moveJobIds: [job.id] } }), params({ id: String(runId) }));
    expect(res.status).toBe(400);
    expect((await readBody(res)).error.message).toContain("Jobs move to Install with the receiving inspection");
    expect(await stageOf(job.id)).toBe("coating");
  });
});
