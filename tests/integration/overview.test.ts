import { describe, expect, it } from "vitest";
import * as boardRoute from "@/app/api/board/route";
import * as overviewRoute from "@/app/api/overview/route";
import { truckRecords, withDeliveredDays } from "@/server/jobs/history";
import { listJobs } from "@/server/jobs/queries";
import { loadOverview } from "@/server/reports/overview";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { readBody, request, sessionCookieFor } from "../support/http";

/*
 * The overview on a hand-built shop, seen at 10:00 on Wednesday 18 March 2026 on the shop's clock
 * (US/Central, daylight time: 15:00Z). The shop is closed Thursday 12 March.
 */
const { db } = useFreshDatabase();
const NOW = new Date("2026-03-18T15:00:00.000Z");

async function job(stage: "queued" | "fabricate" | "install" | "delivered", dueOn: string | null, enteredAt?: string, tech?: string) {
  const j = await makeJob(db(), { stage, scope: stage === "install" ? "install_only" : "fabrication" });
  await db().updateTable("job").set({ due_on: dueOn, assigned_tech_id: tech ?? null }).where("id", "=", j.id).execute();
  if (enteredAt) await db().insertInto("stage_event").values({ job_id: j.id, from_stage: "queued", to_stage: stage, at: enteredAt, actor_id: null, note: "", override_reason: null }).execute();
  return j;
}

describe("the office's overview", () => {
  it("counts what is late, due, out at the coater and failed, each with the list behind it", async () => {
    await ensureShop(db());
    await db().updateTable("shop").set({ time_zone: "US/Central" }).where("id", "=", 1).execute();
    await db().insertInto("shop_holiday").values({ day: "2026-03-12", name: "Closed" }).execute();
    const tech = await makeStaff(db(), "tech", { name: "Avery Tech" });

    // Due Friday 13, in Fabricate since Tuesday 10: late Fri 13, Mon 16, Tue 17 = 3 business
    // days; in the stage Tue 10, Wed 11, (Thu 12 closed), Fri 13, Mon 16, Tue 17 = 5.
    const late = await job("fabricate", "2026-03-13", "2026-03-10T15:00:00.000Z", tech.id);
    await job("delivered", "2026-03-01"); // delivered: not late however old its due date
    const soon = await job("queued", "2026-03-25"); // 18 + 7 = 25 March: due within 7 days
    await job("install", "2026-03-26"); // one day beyond
    await job("install", "2026-03-18", undefined, tech.id); // due today: due soon, not late

    const vendor = (await db().insertInto("vendor").values({ name: "Ridgeline Powder", contact: "", phone: "", email: "", usual_turnaround_days: 4, notes: "", created_at: NOW.toISOString() }).returning("id").executeTakeFirstOrThrow()).id;
    const run = (promised: string, received: string | null) =>
      db().insertInto("coating_run").values({ vendor_id: vendor, finish_colour: "Black", finish_gloss: "gloss", sent_on: "2026-03-09", promised_on: promised, received_on: received, dft_readings_mils: null, adhesion_ok: null, defects: null, inspected_at: null, inspected_by: null, created_by: null, created_at: NOW.toISOString(), updated_at: NOW.toISOString() }).execute();
    await run("2026-03-17", null); // overdue
    await run("2026-03-19", null); // due back by the next working day, Thursday 19
    await run("2026-03-25", null); // out
    await run("2026-03-16", "2026-03-16"); // back

    const outbox = (id: string, status: "failed" | "sent", replaced: string | null) =>
      db().insertInto("outbox").values({ id, job_id: late.id, kind: "stage_changed", payload: "{}", status, attempts: 5, next_attempt_at: NOW.toISOString(), last_error: "refused", created_at: NOW.toISOString(), sent_at: null, replaced_at: replaced }).execute();
    await outbox("m1", "failed", null);
    await outbox("m2", "failed", null);
    await outbox("m3", "failed", NOW.toISOString()); // replaced by a later move: never sent again, not waiting on anyone
    await outbox("m4", "sent", null);

    const o = await loadOverview(db(), NOW);
    expect(o.today).toBe("2026-03-18");
    expect(o.pastDue.count).toBe(1);
    expect(o.pastDue.jobs[0]).toMatchObject({ id: late.id, stage: "fabricate", daysLate: 3, daysInStage: 5 });
    expect(o.dueSoon.count).toBe(2);
    expect(o.dueSoon.jobs.map((j) => j.dueOn)).toEqual(["2026-03-18", "2026-03-25"]);
    expect(o.dueSoon.jobs[1].id).toBe(soon.id);
    expect(o.coating).toMatchObject({ out: 3, overdue: 1, dueBack: 1 });
    expect(o.emailsFailed).toMatchObject({ messages: 2, jobs: 1 });
    expect(o.stages.find((s) => s.stage === "install")).toMatchObject({ jobs: 2, href: "/jobs?stage=install" });
    expect(o.onBoard).toBe(4);
    expect(o.techs).toEqual([{ id: tech.id, name: "Avery Tech", openJobs: 2, href: `/board?tech=${tech.id}` }]);
    expect(o.unassigned.count).toBe(2);

    // The lists behind the numbers hold the same jobs.
    const list = (f: Parameters<typeof listJobs>[1]) => listJobs(db(), f).then((rows) => rows.map((r) => r.id).sort());
    expect(await list({ due: "late", today: o.today })).toEqual([late.id]);
    expect((await list({ due: "soon", today: o.today, dueSoonUntil: o.dueSoonUntil })).length).toBe(2);
    expect(await list({ emailFailed: true })).toEqual([late.id]);
  });

  it("answers the office as JSON and refuses the bench", async () => {
    const office = await makeStaff(db(), "office");
    const tech = await makeStaff(db(), "tech");
    const ok = await overviewRoute.GET(request("/api/overview", { cookie: await sessionCookieFor(office.id) }));
    expect(ok.status).toBe(200);
    expect((await readBody(ok)).pastDue.href).toBe("/jobs?due=late&sort=due");
    expect((await overviewRoute.GET(request("/api/overview", { cookie: await sessionCookieFor(tech.id) }))).status).toBe(403);
  });

  it("the board's search box matches a word of the work description too", async () => {
    const office = await makeStaff(db(), "office");
    const j = await makeJob(db(), { stage: "queued" });
    await db().updateTable("job").set({ description: "Wet kit: 35 gal reservoir" }).where("id", "=", j.id).execute();
    const res = await boardRoute.GET(request("/api/board?q=reservoir", { cookie: await sessionCookieFor(office.id) }));
    expect((await readBody(res)).cards.map((c: { id: number }) => c.id)).toEqual([j.id]);
  });

  it("a truck's history gives each delivered job the day it went out on the shop's clock, and its newest kit spec", async () => {
    await db().updateTable("shop").set({ time_zone: "US/Central" }).where("id", "=", 1).execute();
    const staff = await makeStaff(db(), "office");
    const out = await makeJob(db(), { stage: "delivered", scope: "install_only" });
    const open = await makeJob(db(), { stage: "install", scope: "install_only", customerId: (await db().selectFrom("job").select("customer_id").where("id", "=", out.id).executeTakeFirstOrThrow()).customer_id });
    const ev = (at: string, to: "delivered" | "ready") => db().insertInto("stage_event").values({ job_id: out.id, from_stage: "ready", to_stage: to, at, actor_id: null, note: "", override_reason: null }).execute();
    await ev("2026-03-02T15:00:00.000Z", "delivered");
    await ev("2026-03-04T04:00:00.000Z", "delivered"); // 22:00 on Tuesday 3 March, shop time
    const rows = await withDeliveredDays(db(), [{ id: out.id }, { id: open.id }]);
    expect(rows).toEqual([{ id: out.id, deliveredAt: "2026-03-03" }, { id: open.id, deliveredAt: null }]);

    const truckId = (await db().selectFrom("job").select("truck_id").where("id", "=", out.id).executeTakeFirstOrThrow()).truck_id;
    for (const version of [1, 2]) {
      await db().insertInto("kit_spec").values({ job_id: out.id, version, inputs: "{}", results: "{}", saved_by: staff.id, saved_at: `2026-03-0${version}T15:00:00.000Z` }).execute();
    }
    const { specs, photos } = await truckRecords(db(), truckId);
    expect(specs.map((k) => [k.jobId, k.version])).toEqual([[out.id, 2]]);
    expect(photos).toEqual([]);
  });
});
