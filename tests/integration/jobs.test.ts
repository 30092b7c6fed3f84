import { describe, expect, it, beforeAll } from "vitest";
import * as board from "@/app/api/board/route";
import * as jobItem from "@/app/api/jobs/[id]/route";
import * as moves from "@/app/api/jobs/[id]/moves/route";
import * as jobs from "@/app/api/jobs/route";
import type { Role } from "@/db/schema";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeCustomer, makeJob, makeStaff, makeTruck } from "../support/factories";
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

async function column(stage: string) {
  return db().selectFrom("job").select(["id", "position"]).where("stage", "=", stage as never).orderBy("position").execute();
}

describe("creating and editing jobs", () => {
  it("office and owner open work orders with readable, unique numbers; a tech may not", async () => {
    await ensureShop(db());
    const customer = await makeCustomer(db());
    const truck = await makeTruck(db(), customer.id);
    const body = { customerId: customer.id, truckId: truck.id, scope: "fabrication", description: "Wet kit, 40 gal round tank", dueOn: "2026-12-20" };
    const numbers: string[] = [];
    for (const role of ["office", "owner"] as const) {
      const { cookie } = await as(role);
      const res = await jobs.POST(request("/api/jobs", { cookie, body }));
      expect(res.status).toBe(201);
      const { job } = await readBody(res);
      expect(job.stage).toBe("queued");
      numbers.push(job.workOrder);
    }
    expect(numbers[0]).toMatch(/^WO-\d{2}-\d{4}$/);
    expect(new Set(numbers).size).toBe(2);
    const tech = await as("tech");
    expect((await jobs.POST(request("/api/jobs", { cookie: tech.cookie, body }))).status).toBe(403);
  });

  it("a job entered late with a due date already past is opened, keeping the date (the form warns; the shop decides)", async () => {
    await ensureShop(db());
    const customer = await makeCustomer(db());
    const truck = await makeTruck(db(), customer.id);
    const { cookie } = await as("office");
    const body = { customerId: customer.id, truckId: truck.id, scope: "install_only", description: "Hitch and lights", dueOn: "2020-01-06" };
    const res = await jobs.POST(request("/api/jobs", { cookie, body }));
    expect(res.status).toBe(201);
    expect((await readBody(res)).job.dueOn).toBe("2020-01-06");
  });

  it("refuses a truck of another customer and bad input with the field named, creating nothing", async () => {
    const { cookie } = await as("office");
    const a = await makeCustomer(db());
    const b = await makeCustomer(db());
    const truckOfB = await makeTruck(db(), b.id);
    const before = (await db().selectFrom("job").select("id").execute()).length;
    const wrongTruck = await jobs.POST(request("/api/jobs", { cookie, body: { customerId: a.id, truckId: truckOfB.id, scope: "fabrication", description: "x" } }));
    expect(wrongTruck.status).toBe(400);
    expect((await readBody(wrongTruck)).error.details.fields.truckId).toBeDefined();
    const bad = await jobs.POST(request("/api/jobs", { cookie, body: { customerId: "one", scope: "everything", description: "y".repeat(9999), dueOn: "tomorrow" } }));
    expect(bad.status).toBe(400);
    expect(Object.keys((await readBody(bad)).error.details.fields)).toEqual(expect.arrayContaining(["customerId", "truckId", "scope", "description", "dueOn"]));
    expect((await db().selectFrom("job").select("id").execute()).length).toBe(before);
  });

  it("PATCH takes the version; a stale version gets 409 with the current job", async () => {
    const { cookie } = await as("office");
    const job = await makeJob(db());
    const first = await jobItem.PATCH(request(`/api/jobs/${job.id}`, { method: "PATCH", cookie, body: { version: job.version, priority: "rush" } }), params({ id: String(job.id) }));
    expect(first.status).toBe(200);
    expect((await readBody(first)).job.version).toBe(job.version + 1);
    const stale = await jobItem.PATCH(request(`/api/jobs/${job.id}`, { method: "PATCH", cookie, body: { version: job.version, notes: "late edit" } }), params({ id: String(job.id) }));
    expect(stale.status).toBe(409);
    const body = await readBody(stale);
    expect(body.error.code).toBe("stale");
    expect(body.error.details.job.priority).toBe("rush");
  });

  it("refuses to make a job install only while it has a part that needs a leak test or coating", async () => {
    const { cookie } = await as("office");
    const job = await makeJob(db(), { stage: "queued" });
    await db().insertInto("part").values({ job_id: job.id, name: "40 gal round reservoir", kind: "reservoir", material: "aluminum", needs_leak_test: 1, needs_coating: 1, created_at: new Date().toISOString(), updated_at: new Date().toISOString() } as never).execute();
    const res = await jobItem.PATCH(request(`/api/jobs/${job.id}`, { method: "PATCH", cookie, body: { version: job.version, scope: "install_only" } }), params({ id: String(job.id) }));
    expect(res.status).toBe(400);
    expect((await readBody(res)).error.details.fields.scope[0]).toMatch(/40 gal round reservoir needs a leak test or outside coating/);
    expect((await db().selectFrom("job").select("scope").where("id", "=", job.id).executeTakeFirstOrThrow()).scope).toBe("fabrication");
  });

  it("a tech edits notes but nothing else", async () => {
    const { cookie } = await as("tech");
    const job = await makeJob(db());
    const notes = await jobItem.PATCH(request(`/api/jobs/${job.id}`, { method: "PATCH", cookie, body: { version: job.version, notes: "Sump welded, needs grinding." } }), params({ id: String(job.id) }));
    expect(notes.status).toBe(200);
    const due = await jobItem.PATCH(request(`/api/jobs/${job.id}`, { method: "PATCH", cookie, body: { version: job.version + 1, dueOn: "2027-01-05" } }), params({ id: String(job.id) }));
    expect(due.status).toBe(403);
  });

  it("lists jobs sorted by the database before the limit, so no older job is silently left out", async () => {
    const { cookie } = await as("office");
    const customer = await makeCustomer(db(), "Sorting Test Haulage");
    const early = await makeJob(db(), { customerId: customer.id });
    await db().updateTable("job").set({ due_on: "2020-01-02" }).where("id", "=", early.id).execute();
    for (let i = 0; i < 3; i++) await makeJob(db(), { customerId: customer.id });
    const res = await jobs.GET(request("/api/jobs?sort=due&limit=1", { cookie }));
    expect((await readBody(res)).jobs.map((j: { id: number }) => j.id)).toEqual([early.id]);
    expect((await jobs.GET(request("/api/jobs?sort=sideways", { cookie }))).status).toBe(400);
  });

  it("ids of another shape get 400, unknown ids 404", async () => {
    const { cookie } = await as("office");
    for (const bad of ["abc", "-1", "1.5", "0"]) {
      expect((await jobItem.GET(request(`/api/jobs/${bad}`, { cookie }), params({ id: bad }))).status).toBe(400);
    }
    expect((await jobItem.GET(request("/api/jobs/99999", { cookie }), params({ id: "99999" }))).status).toBe(404);
  });
});

describe("moving cards", () => {
  it("a tech moves a card forward: stage event and outbox row written together, version bumped", async () => {
    const { cookie, staff } = await as("tech");
    const job = await makeJob(db(), { stage: "fabricate" });
    const res = await move(cookie, job.id, { toStage: "pressure_test", version: job.version, note: "Welds done" });
    expect(res.status).toBe(200);
    const body = await readBody(res);
    expect(body.job.stage).toBe("pressure_test");
    expect(body.job.version).toBe(job.version + 1);
    const events = await db().selectFrom("stage_event").selectAll().where("job_id", "=", job.id).execute();
    expect(events).toEqual([expect.objectContaining({ from_stage: "fabricate", to_stage: "pressure_test", actor_id: staff.id, note: "Welds done" })]);
    const outbox = await db().selectFrom("outbox").selectAll().where("job_id", "=", job.id).execute();
    expect(outbox).toHaveLength(1);
    expect(JSON.parse(outbox[0].payload)).toEqual({ from: "fabricate", to: "pressure_test" });
  });

  it("places the card before another and keeps both columns dense", async () => {
    const { cookie } = await as("tech");
    const a = await makeJob(db(), { stage: "install" });
    const b = await makeJob(db(), { stage: "install" });
    const mover = await makeJob(db(), { stage: "wire" });
    const res = await move(cookie, mover.id, { toStage: "install", beforeJobId: b.id, version: mover.version });
    expect(res.status).toBe(200);
    const install = (await column("install")).filter((r) => [a.id, b.id, mover.id].includes(r.id));
    expect(install.map((r) => r.id)).toEqual([a.id, mover.id, b.id]);
    for (const stage of ["install", "wire"]) {
      const positions = (await column(stage)).map((r) => r.position);
      expect(positions).toEqual(positions.map((_, i) => i));
    }
  });

  it("reordering inside a column is a move too (an event, no customer message)", async () => {
    const { cookie } = await as("tech");
    const first = await makeJob(db(), { stage: "queued" });
    const second = await makeJob(db(), { stage: "queued" });
    const res = await move(cookie, second.id, { toStage: "queued", beforeJobId: first.id, version: second.version });
    expect(res.status).toBe(200);
    const ids = (await column("queued")).map((r) => r.id);
    expect(ids.indexOf(second.id)).toBeLessThan(ids.indexOf(first.id));
    expect(await db().selectFrom("stage_event").select("id").where("job_id", "=", second.id).execute()).toHaveLength(1);
    expect(await db().selectFrom("outbox").select("id").where("job_id", "=", second.id).execute()).toHaveLength(0);
  });

  it("refuses a gate with 422 gate_unmet and its plain-word conditions, changing nothing", async () => {
    const { cookie } = await as("tech");
    const job = await makeJob(db(), { stage: "wire" });
    const res = await move(cookie, job.id, { toStage: "ready", version: job.version });
    expect(res.status).toBe(422);
    const body = await readBody(res);
    expect(body.error.code).toBe("gate_unmet");
    expect(body.error.details.unmet).toEqual([expect.stringMatching(/sign-off/i)]);
    const after = await db().selectFrom("job").select(["stage", "version"]).where("id", "=", job.id).executeTakeFirstOrThrow();
    expect(after).toEqual({ stage: "wire", version: job.version });
    expect(await db().selectFrom("stage_event").select("id").where("job_id", "=", job.id).execute()).toHaveLength(0);
  });

  it("a job with fabricated parts but none recorded cannot skip ahead past the coating gate", async () => {
    const { cookie } = await as("office");
    const job = await makeJob(db(), { stage: "queued", parts: false });
    const res = await move(cookie, job.id, { toStage: "install", version: job.version });
    expect(res.status).toBe(422);
    expect((await readBody(res)).error.details.unmet).toEqual([expect.stringMatching(/No fabricated parts are recorded on this job yet/)]);
  });

  it("only an owner overrides a gate, and the reason is kept on the stage event", async () => {
    const tech = await as("tech");
    const owner = await as("owner");
    const job = await makeJob(db(), { stage: "wire" });
    const override = { reason: "Customer picking up for a one-day haul; sign-off on return." };
    expect((await move(tech.cookie, job.id, { toStage: "ready", version: job.version, override })).status).toBe(403);
    const ok = await move(owner.cookie, job.id, { toStage: "ready", version: job.version, override });
    expect(ok.status).toBe(200);
    const event = await db().selectFrom("stage_event").selectAll().where("job_id", "=", job.id).executeTakeFirstOrThrow();
    expect(event.override_reason).toBe(override.reason);
  });

  it("moving backwards is allowed and kept; a job without fabrication cannot enter Fabricate", async () => {
    const { cookie } = await as("tech");
    const job = await makeJob(db(), { stage: "pressure_test" });
    const back = await move(cookie, job.id, { toStage: "fabricate", version: job.version, note: "Leak at the sump seam" });
    expect(back.status).toBe(200);
    const installOnly = await makeJob(db(), { stage: "queued", scope: "install_only" });
    const refused = await move(cookie, installOnly.id, { toStage: "fabricate", version: installOnly.version });
    expect(refused.status).toBe(422);
    expect((await readBody(refused)).error.details.canOverride).toBe(false);
  });

  it("two sessions move the same card at once: one wins, the other gets 409 with the truth; nothing is lost or doubled", async () => {
    const a = await as("tech");
    const b = await as("tech");
    const job = await makeJob(db(), { stage: "fabricate" });
    await makeJob(db(), { stage: "pressure_test" });
    const eventsBefore = (await db().selectFrom("stage_event").select("id").execute()).length;
    const [r1, r2] = await Promise.all([
      move(a.cookie, job.id, { toStage: "pressure_test", version: job.version }),
      move(b.cookie, job.id, { toStage: "queued", version: job.version }),
    ]);
    const statuses = [r1.status, r2.status].sort();
    expect(statuses).toEqual([200, 409]);
    const loser = r1.status === 409 ? r1 : r2;
    const winnerStage = r1.status === 200 ? "pressure_test" : "queued";
    expect((await readBody(loser)).error.details.job.stage).toBe(winnerStage);
    expect((await db().selectFrom("stage_event").select("id").execute()).length).toBe(eventsBefore + 1);
    for (const stage of ["fabricate", "pressure_test", "queued"]) {
      const positions = (await column(stage)).map((r) => r.position);
      expect(positions).toEqual(positions.map((_, i) => i));
    }
  });

  it("many concurrent moves into one column leave every position unique and every event once", async () => {
    const { cookie } = await as("tech");
    const cards = await Promise.all(Array.from({ length: 8 }, () => makeJob(db(), { stage: "queued" })));
    const results = await Promise.all(cards.map((c) => move(cookie, c.id, { toStage: "fabricate", version: c.version })));
    expect(results.every((r) => r.status === 200)).toBe(true);
    const fab = await column("fabricate");
    expect(new Set(fab.map((r) => r.position)).size).toBe(fab.length);
    for (const c of cards) {
      expect(await db().selectFrom("stage_event").select("id").where("job_id", "=", c.id).execute()).toHaveLength(1);
    }
  });

  it("bad input gets 400 and changes nothing: unknown stage, negative or foreign beforeJobId, missing version, another id shape", async () => {
    const { cookie } = await as("tech");
    const job = await makeJob(db(), { stage: "fabricate" });
    const other = await makeJob(db(), { stage: "queued" });
    const bodies = [
      { toStage: "paint_booth", version: job.version },
      { toStage: "install", beforeJobId: -3, version: job.version },
      { toStage: "pressure_test" },
      { toStage: "pressure_test", version: "1" },
      { toStage: "pressure_test", beforeJobId: other.id, version: job.version },
      { toStage: "pressure_test", version: job.version, extra: true },
    ];
    for (const body of bodies) {
      const res = await move(cookie, job.id, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
    }
    const wrongShape = await moves.POST(request("/api/jobs/WO-1/moves", { cookie, body: { toStage: "queued", version: 1 } }), params({ id: "WO-1" }));
    expect(wrongShape.status).toBe(400);
    const after = await db().selectFrom("job").select(["stage", "version", "position"]).where("id", "=", job.id).executeTakeFirstOrThrow();
    expect(after.stage).toBe("fabricate");
    expect(after.version).toBe(job.version);
    expect(await db().selectFrom("stage_event").select("id").where("job_id", "=", job.id).execute()).toHaveLength(0);
  });
});

describe("the board", () => {
  it("lists every job but delivered ones, with gate state, and filters by search", async () => {
    const { cookie } = await as("tech");
    const delivered = await makeJob(db(), { stage: "delivered" });
    const wire = await makeJob(db(), { stage: "wire" });
    const res = await board.GET(request("/api/board", { cookie }));
    expect(res.status).toBe(200);
    const body = await readBody(res);
    expect(body.columns.map((c: { stage: string }) => c.stage)).toEqual(["queued", "fabricate", "pressure_test", "coating", "install", "wire", "ready"]);
    const ids = body.cards.map((c: { id: number }) => c.id);
    expect(ids).toContain(wire.id);
    expect(ids).not.toContain(delivered.id);
    const card = body.cards.find((c: { id: number }) => c.id === wire.id);
    expect(card.gate).toEqual({ stage: "ready", label: "Ready for pickup", unmet: [expect.stringMatching(/sign-off/i)] });
    const searched = await readBody(await board.GET(request(`/api/board?q=${encodeURIComponent(wire.work_order)}`, { cookie })));
    expect(searched.cards.map((c: { id: number }) => c.id)).toEqual([wire.id]);
  });

  it("shows a move at once, even though the board's answer is kept between reads", async () => {
    const { cookie } = await as("tech");
    const job = await makeJob(db(), { stage: "queued" });
    const stageOf = async () => (await readBody(await board.GET(request("/api/board", { cookie })))).cards.find((c: { id: number }) => c.id === job.id).stage;
    expect(await stageOf()).toBe("queued");
    expect(await stageOf()).toBe("queued");
    expect((await move(cookie, job.id, { toStage: "fabricate", version: job.version })).status).toBe(200);
    expect(await stageOf()).toBe("fabricate");
    await db().updateTable("job").set({ priority: "rush" }).where("id", "=", job.id).execute();
    const card = (await readBody(await board.GET(request("/api/board", { cookie })))).cards.find((c: { id: number }) => c.id === job.id);
    expect(card.priority).toBe("rush");
  });

  it("answers 400 to a filter of the wrong shape", async () => {
    const { cookie } = await as("tech");
    expect((await board.GET(request("/api/board?due=someday", { cookie }))).status).toBe(400);
  });
});
