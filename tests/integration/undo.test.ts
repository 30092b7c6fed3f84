import { describe, expect, it, beforeAll } from "vitest";
import * as moves from "@/app/api/jobs/[id]/moves/route";
import * as undo from "@/app/api/jobs/[id]/undo/route";
import type { Role, Stage } from "@/db/schema";
import { useFreshDatabase } from "../support/db";
import { makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";
import { moneyChecksOff } from "../support/money";

const { db } = useFreshDatabase();
// Money is not the subject here: the shop's money checks are off (payments-gates.test.ts holds them).
beforeAll(() => moneyChecksOff(db()));

async function as(role: Role) {
  const staff = await makeStaff(db(), role);
  return { staff, cookie: await sessionCookieFor(staff.id) };
}

function move(cookie: string, jobId: number, body: unknown) {
  return moves.POST(request(`/api/jobs/${jobId}/moves`, { cookie, body }), params({ id: String(jobId) }));
}

function takeBack(cookie: string, jobId: number, body: unknown) {
  return undo.POST(request(`/api/jobs/${jobId}/undo`, { cookie, body }), params({ id: String(jobId) }));
}

async function column(stage: Stage) {
  return (await db().selectFrom("job").select("id").where("stage", "=", stage).orderBy("position").execute()).map((r) => r.id);
}

async function eventsOf(jobId: number) {
  return db().selectFrom("stage_event").select(["from_stage", "to_stage", "actor_id", "note"]).where("job_id", "=", jobId).orderBy("id").execute();
}

async function current(jobId: number) {
  return db().selectFrom("job").select(["stage", "position", "version"]).where("id", "=", jobId).executeTakeFirstOrThrow();
}

/** Three cards in one stage; the middle one is the card that will be moved. */
async function threeIn(stage: Stage) {
  const above = await makeJob(db(), { stage });
  const card = await makeJob(db(), { stage });
  const below = await makeJob(db(), { stage });
  return { above, card, below };
}

describe("undoing a move", () => {
  it("the mover takes a move back: the card returns to the same place in its column, and both moves stay on the timeline", async () => {
    const { cookie, staff } = await as("tech");
    const { above, card, below } = await threeIn("fabricate");
    const moved = await move(cookie, card.id, { toStage: "pressure_test", version: card.version });
    expect(moved.status).toBe(200);
    const { eventId } = await readBody(moved);
    expect(await column("fabricate")).toEqual([above.id, below.id]);

    const res = await takeBack(cookie, card.id, { eventId });
    expect(res.status).toBe(200);
    const body = await readBody(res);
    expect(body.job.stage).toBe("fabricate");
    expect(body.eventId).toBeGreaterThan(eventId);
    expect(await column("fabricate")).toEqual([above.id, card.id, below.id]);
    expect((await current(card.id)).version).toBe(card.version + 2);
    expect(await eventsOf(card.id)).toEqual([
      expect.objectContaining({ from_stage: "fabricate", to_stage: "pressure_test", actor_id: staff.id }),
      expect.objectContaining({ from_stage: "pressure_test", to_stage: "fabricate", actor_id: staff.id, note: expect.stringMatching(/^Undo/) }),
    ]);
  });

  it("takes back a reorder inside a column to the card's old place", async () => {
    const { cookie } = await as("office");
    const { above, card, below } = await threeIn("install");
    const { eventId } = await readBody(await move(cookie, card.id, { toStage: "install", beforeJobId: above.id, version: card.version }));
    expect(await column("install")).toEqual([card.id, above.id, below.id]);
    expect((await takeBack(cookie, card.id, { eventId })).status).toBe(200);
    expect(await column("install")).toEqual([above.id, card.id, below.id]);
  });

  it("when the card that followed it has gone, the card goes back to the same index", async () => {
    const { cookie } = await as("tech");
    const { above, card, below } = await threeIn("wire");
    const last = await makeJob(db(), { stage: "wire" });
    const { eventId } = await readBody(await move(cookie, card.id, { toStage: "install", version: card.version }));
    expect((await move(cookie, below.id, { toStage: "install", version: below.version })).status).toBe(200);
    expect((await takeBack(cookie, card.id, { eventId })).status).toBe(200);
    expect(await column("wire")).toEqual([above.id, card.id, last.id]);
  });

  it("only the mover may undo: another tech, the office and even the owner are told to move the card themselves", async () => {
    const mover = await as("tech");
    const { card } = await threeIn("queued");
    const { eventId } = await readBody(await move(mover.cookie, card.id, { toStage: "fabricate", version: card.version }));
    for (const role of ["tech", "office", "owner"] as const) {
      const other = await as(role);
      const res = await takeBack(other.cookie, card.id, { eventId });
      expect(res.status).toBe(403);
      const { error } = await readBody(res);
      expect(error.message).toContain(mover.staff.name);
      expect(error.message).toMatch(/Move the card with the board/);
    }
    expect((await current(card.id)).stage).toBe("fabricate");
    expect(await eventsOf(card.id)).toHaveLength(1);
  });

  it("only the job's last move: after a second move the first one cannot be taken back", async () => {
    const { cookie } = await as("tech");
    const { card } = await threeIn("fabricate");
    const first = await readBody(await move(cookie, card.id, { toStage: "pressure_test", version: card.version }));
    const second = await readBody(await move(cookie, card.id, { toStage: "fabricate", version: first.job.version }));
    const res = await takeBack(cookie, card.id, { eventId: first.eventId });
    expect(res.status).toBe(409);
    const { error } = await readBody(res);
    expect(error.message).toMatch(/moved since.*Fabricate/);
    expect(error.details.job.stage).toBe("fabricate");
    expect((await current(card.id)).version).toBe(second.job.version);
  });

  it("only within the undo window: a move from three minutes ago is refused with what to do instead", async () => {
    const { cookie } = await as("tech");
    const { card } = await threeIn("install");
    const { eventId } = await readBody(await move(cookie, card.id, { toStage: "wire", version: card.version }));
    await db().updateTable("stage_event").set({ at: new Date(Date.now() - 3 * 60_000).toISOString() }).where("id", "=", eventId).execute();
    const res = await takeBack(cookie, card.id, { eventId });
    expect(res.status).toBe(409);
    expect((await readBody(res)).error.message).toMatch(/2 minutes.*back to Install/);
    expect((await current(card.id)).stage).toBe("wire");
  });

  it("opening the work order is not a move; an event of another job is not found; bad input changes nothing", async () => {
    const { cookie, staff } = await as("office");
    const { card } = await threeIn("queued");
    const opened = await db()
      .insertInto("stage_event")
      .values({ job_id: card.id, from_stage: null, to_stage: "queued", actor_id: staff.id, at: new Date().toISOString(), note: "Work order opened.", override_reason: null })
      .returning("id")
      .executeTakeFirstOrThrow();
    expect((await takeBack(cookie, card.id, { eventId: opened.id })).status).toBe(409);

    const other = await makeJob(db(), { stage: "queued" });
    const { eventId } = await readBody(await move(cookie, other.id, { toStage: "fabricate", version: other.version }));
    expect((await takeBack(cookie, card.id, { eventId })).status).toBe(404);

    for (const body of [{}, { eventId: "last" }, { eventId: -1 }, { eventId, extra: 1 }]) {
      const res = await takeBack(cookie, other.id, body);
      expect(res.status).toBe(400);
      expect((await readBody(res)).error.details.fields).toBeDefined();
    }
    const wrongShape = await undo.POST(request("/api/jobs/WO-1/undo", { cookie, body: { eventId } }), params({ id: "WO-1" }));
    expect(wrongShape.status).toBe(400);
    expect((await current(other.id)).stage).toBe("fabricate");
  });

  it("an undo that would carry the card past what a stage needs is refused like any move, naming what is missing", async () => {
    const { cookie } = await as("tech");
    const card = await makeJob(db(), { stage: "install" });
    const now = new Date().toISOString();
    await db()
      .insertInto("part")
      .values({ job_id: card.id, name: "Hydraulic reservoir", kind: "reservoir", material: "carbon_steel", needs_leak_test: 1, needs_coating: 0, created_at: now, updated_at: now } as never)
      .execute();
    const { eventId } = await readBody(await move(cookie, card.id, { toStage: "fabricate", version: card.version }));
    const res = await takeBack(cookie, card.id, { eventId });
    expect(res.status).toBe(422);
    const { error } = await readBody(res);
    expect(error.code).toBe("gate_unmet");
    expect(error.details.unmet.join(" ")).toMatch(/leak test/i);
    expect((await current(card.id)).stage).toBe("fabricate");
  });

  it("a signed-out request is refused", async () => {
    const res = await undo.POST(request("/api/jobs/1/undo", { body: { eventId: 1 } }), params({ id: "1" }));
    expect(res.status).toBe(401);
  });
});
