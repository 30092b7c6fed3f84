import { renderToStaticMarkup } from "react-dom/server";
import { describe, expect, it } from "vitest";
import { JobCostSection } from "@/app/(shop)/jobs/[id]/labour-section";
import * as clockEntry from "@/app/api/clock-entries/[id]/route";
import * as clock from "@/app/api/clock/route";
import * as jobCosts from "@/app/api/reports/job-costs/route";
import * as labourRate from "@/app/api/shop-settings/labour-rate/route";
import * as boughtParts from "@/app/api/jobs/[id]/bought-parts/route";
import type { Role } from "@/db/schema";
import type { JobDetail } from "@/server/jobs/queries";
import { jobClockEntries, jobHours } from "@/server/labour/queries";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { giveJobMoney } from "../support/money";
import { params, readBody, request, sessionCookieFor } from "../support/http";

const { db } = useFreshDatabase();

async function as(role: Role) {
  await ensureShop(db());
  const staff = await makeStaff(db(), role);
  return { staff, cookie: await sessionCookieFor(staff.id) };
}

const on = (cookie: string, body: unknown) => clock.POST(request("/api/clock", { cookie, body }));
const off = (cookie: string) => clock.DELETE(request("/api/clock", { method: "DELETE", cookie }));
const correct = (cookie: string, id: number, body: unknown) => clockEntry.PATCH(request(`/api/clock-entries/${id}`, { method: "PATCH", cookie, body }), params({ id: String(id) }));
const entriesOf = (staffId: string) => db().selectFrom("clock_entry").selectAll().where("staff_id", "=", staffId).orderBy("id").execute();

describe("the labour clock", () => {
  it("a tech clocks on, switches job in one tap (one open clock), and clocks off; the stage at the time is kept", async () => {
    const tech = await as("tech");
    const a = await makeJob(db(), { stage: "fabricate" });
    const b = await makeJob(db(), { stage: "install", scope: "install_only" });
    const first = await on(tech.cookie, { jobId: a.id });
    expect(first.status).toBe(201);
    expect((await readBody(first)).clock).toEqual(expect.objectContaining({ jobId: a.id, stage: "fabricate" }));
    // The same job again changes nothing.
    expect((await on(tech.cookie, { jobId: a.id })).status).toBe(200);
    const switched = await readBody(await on(tech.cookie, { jobId: b.id }));
    expect(switched.closed.jobId).toBe(a.id);
    let rows = await entriesOf(tech.staff.id);
    expect(rows.map((r) => [r.job_id, r.stage, r.ended_at === null])).toEqual([[a.id, "fabricate", false], [b.id, "install", true]]);
    expect(rows[0].ended_at).toBe(rows[1].started_at);
    expect((await off(tech.cookie)).status).toBe(200);
    rows = await entriesOf(tech.staff.id);
    expect(rows.every((r) => r.ended_at !== null)).toBe(true);
    const again = await off(tech.cookie);
    expect(again.status).toBe(409);
    expect((await readBody(again)).error.message).toBe("You are not clocked on any job.");
  });

  it("bad input answers 400 naming the field; a delivered job cannot be clocked on", async () => {
    const tech = await as("tech");
    for (const body of [{}, { jobId: "7" }, { jobId: -1 }, { jobId: 1.5 }]) {
      const res = await on(tech.cookie, body);
      expect(res.status).toBe(400);
      expect(Object.keys((await readBody(res)).error.details.fields)).toContain("jobId");
    }
    const gone = await makeJob(db(), { stage: "delivered" });
    const res = await on(tech.cookie, { jobId: gone.id });
    expect(res.status).toBe(400);
    expect((await readBody(res)).error.details.fields.jobId[0]).toMatch(/delivered/);
    expect(await entriesOf(tech.staff.id)).toEqual([]);
  });

  it("a tech cannot correct another tech's entry, nor their own; the office corrects with a reason that is kept and audited", async () => {
    const tech = await as("tech");
    const other = await as("tech");
    const office = await as("office");
    const job = await makeJob(db(), { stage: "fabricate" });
    await on(other.cookie, { jobId: job.id });
    await off(other.cookie);
    const [entry] = await entriesOf(other.staff.id);
    const body = { startedAt: "2026-03-02T14:00:00.000Z", endedAt: "2026-03-02T16:00:00.000Z", reason: "Forgot to clock on at the start of the shift" };
    expect((await correct(tech.cookie, entry.id, body)).status).toBe(403);
    expect((await correct(other.cookie, entry.id, body)).status).toBe(403);
    expect((await entriesOf(other.staff.id))[0].started_at).toBe(entry.started_at);

    const ok = await correct(office.cookie, entry.id, body);
    expect(ok.status).toBe(200);
    const [fixed] = await entriesOf(other.staff.id);
    expect(fixed).toEqual(expect.objectContaining({ started_at: body.startedAt, ended_at: body.endedAt, original_started_at: entry.started_at, original_ended_at: entry.ended_at, correction_reason: body.reason, corrected_by: office.staff.id }));
    const audit = await db().selectFrom("audit_event").select(["kind", "summary"]).where("kind", "=", "clock_corrected").execute();
    expect(audit).toHaveLength(1);
    expect(audit[0].summary).toContain("Forgot to clock on");
  });

  it("a correction that overlaps another of the person's entries is refused, naming the field; bad times too", async () => {
    const tech = await as("tech");
    const office = await as("office");
    const job = await makeJob(db(), { stage: "fabricate" });
    const at = (h: number) => `2026-03-02T${String(h).padStart(2, "0")}:00:00.000Z`;
    const ids = [];
    for (const [s, e] of [[14, 16], [16, 18]]) {
      ids.push((await db().insertInto("clock_entry").values({ staff_id: tech.staff.id, job_id: job.id, stage: "fabricate", started_at: at(s), ended_at: at(e) }).returning("id").executeTakeFirstOrThrow()).id);
    }
    const clash = await correct(office.cookie, ids[1], { startedAt: at(15), endedAt: at(18), reason: "Started earlier" });
    expect(clash.status).toBe(400);
    // The clash is named on the shop's clock: the entry from 14:00 UTC on 2 March began at 08:00 Central standard time (UTC−6).
    expect((await readBody(clash)).error.details.fields.startedAt[0]).toMatch(/overlap .* from Mon 2 Mar 2026 08:00 \(shop time\)/);
    for (const [body, field] of [
      [{ startedAt: at(17), endedAt: at(16), reason: "Typed it backwards" }, "endedAt"],
      [{ startedAt: "2026-02-31T10:00:00Z", endedAt: at(16), reason: "No such day" }, "startedAt"],
      [{ startedAt: at(16), endedAt: at(17), reason: "" }, "reason"],
      [{ startedAt: at(16), endedAt: "2999-01-01T00:00:00.000Z", reason: "In the future" }, "endedAt"],
    ] as const) {
      const res = await correct(office.cookie, ids[1], body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys((await readBody(res)).error.details.fields)).toContain(field);
    }
    // An end left empty (a clock still on when the office corrects it) gets one message saying what to enter.
    const empty = await correct(office.cookie, ids[1], { startedAt: at(16), endedAt: "", reason: "Left on overnight" });
    expect((await readBody(empty)).error.details.fields).toEqual({ endedAt: ["Enter when the work ended as a date and time."] });
    expect((await entriesOf(tech.staff.id)).map((r) => [r.started_at, r.ended_at])).toEqual([[at(14), at(16)], [at(16), at(18)]]);
  });

  it("hours per stage follow the job's moves while the clock runs", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "install", scope: "install_only" });
    const entry = await db().insertInto("clock_entry").values({ staff_id: tech.staff.id, job_id: job.id, stage: "install", started_at: "2026-03-02T14:00:00.000Z", ended_at: "2026-03-02T17:00:00.000Z" }).returning("id").executeTakeFirstOrThrow();
    expect(entry.id).toBeGreaterThan(0);
    await db().insertInto("stage_event").values({ job_id: job.id, from_stage: "install", to_stage: "wire", actor_id: tech.staff.id, at: "2026-03-02T16:00:00.000Z", note: "", override_reason: null }).execute();
    const hours = await jobHours(db(), job.id, new Date("2026-03-03T00:00:00.000Z"));
    expect(hours.totalHours).toBe(3);
    expect(Object.fromEntries(hours.byStage.map((s) => [s.stage, s.hours]))).toEqual({ install: 2, wire: 1 });
  });
});

describe("a clock entry's stage", () => {
  it("an entry that ran across a move is labelled with both stages, as the hours by stage count it", async () => {
    const tech = await as("tech");
    const job = await makeJob(db(), { stage: "queued" });
    const clocked = await on(tech.cookie, { jobId: job.id });
    expect((await readBody(clocked)).entry.stage).toBe("queued");
    const [entry] = await entriesOf(tech.staff.id);
    // The clock went on at 19:50 UTC on 2 December; the job moved to Fabricate 20 hours later.
    await db().updateTable("clock_entry").set({ started_at: "2026-12-02T19:50:00.000Z" }).where("id", "=", entry.id).execute();
    await db().updateTable("stage_event").set({ at: "2026-11-30T14:00:00.000Z" }).where("job_id", "=", job.id).execute();
    await db().insertInto("stage_event").values({ job_id: job.id, from_stage: "queued", to_stage: "fabricate", actor_id: tech.staff.id, at: "2026-12-03T15:50:00.000Z", note: "", override_reason: null }).execute();
    const now = new Date("2026-12-03T16:00:00.000Z");
    const [view] = await jobClockEntries(db(), job.id, "US/Central", now);
    expect(view.stage).toBe("queued");
    expect(view.stages).toEqual(["queued", "fabricate"]);
    const hours = await jobHours(db(), job.id, now);
    expect(hours.byStage.map((s) => s.stage)).toEqual(view.stages);
    expect(hours.byStage[0].hours).toBe(20);
  });
});

describe("job cost", () => {
  it("only the owner sets the labour rate (an audit line); the report prices hours × rate plus bought-in parts, in cents, and downloads as CSV", async () => {
    const owner = await as("owner");
    const office = await as("office");
    const tech = await as("tech");
    const rate = (cookie: string, body: unknown) => labourRate.PATCH(request("/api/shop-settings/labour-rate", { method: "PATCH", cookie, body }));
    expect((await rate(office.cookie, { labourRateCents: 12_500 })).status).toBe(403);
    const bad = await rate(owner.cookie, { labourRateCents: 125.5 });
    expect(bad.status).toBe(400);
    expect(Object.keys((await readBody(bad)).error.details.fields)).toEqual(["labourRateCents"]);
    expect((await rate(owner.cookie, { labourRateCents: 12_500 })).status).toBe(200);
    expect(await db().selectFrom("audit_event").select("summary").where("kind", "=", "settings_changed").execute()).toEqual([{ summary: expect.stringContaining("from $0.00 to $125.00 an hour") }]);

    const job = await makeJob(db(), { stage: "install", scope: "install_only" });
    await boughtParts.POST(request(`/api/jobs/${job.id}/bought-parts`, { cookie: office.cookie, body: { kind: "pump", description: "Gear pump", quantity: 1, costCents: 64_900 } }), params({ id: String(job.id) }));
    const today = new Date();
    const start = new Date(today.getTime() - 3 * 3_600_000);
    // 1 h 20 min on the clock: at $125.00/h that is $166.666… → $166.67.
    await db().insertInto("clock_entry").values({ staff_id: tech.staff.id, job_id: job.id, stage: "install", started_at: start.toISOString(), ended_at: new Date(start.getTime() + 80 * 60_000).toISOString() }).execute();
    const res = await jobCosts.GET(request("/api/reports/job-costs", { cookie: office.cookie }));
    expect(res.status).toBe(200);
    const report = await readBody(res);
    const row = report.jobs.find((j: { jobId: number }) => j.jobId === job.id);
    expect(row).toEqual(expect.objectContaining({ labourCents: 16_667, partsCents: 64_900, totalCents: 81_567 }));
    const csv = await (await jobCosts.GET(request("/api/reports/job-costs?format=csv", { cookie: office.cookie }))).text();
    expect(csv).toContain(`${job.work_order},`);
    // Hours, quoted hours, labour, bought-in, unpriced lines, coating share, unpriced runs, cost, quoted, over.
    expect(csv).toContain(",1.33,,166.67,649.00,0,0.00,0,815.67,,");
    expect((await jobCosts.GET(request("/api/reports/job-costs", { cookie: tech.cookie }))).status).toBe(403);
  });

  it("a job under its quote downloads a negative over/under figure as a plain number a spreadsheet can add, not as text", async () => {
    const office = await as("office");
    const tech = await as("tech");
    await db().updateTable("shop").set({ labour_rate_cents: 12_500 }).where("id", "=", 1).execute();
    const job = await makeJob(db(), { stage: "install", scope: "install_only" });
    // An approved quote of $1,000.00 before tax.
    await giveJobMoney(db(), job.id, "quote-approved", office.staff.id);
    await db().insertInto("bought_part").values({ job_id: job.id, kind: "pump", description: "Gear pump", quantity: 1, unit_cost_cents: 64_900, created_at: new Date().toISOString(), updated_at: new Date().toISOString(), created_by: office.staff.id, purchase_order_id: null, expected_on: null, installed_at: null, installed_by: null, ratio_percent: null, displacement_cu_in: null }).execute();
    const start = new Date(Date.now() - 3 * 3_600_000);
    await db().insertInto("clock_entry").values({ staff_id: tech.staff.id, job_id: job.id, stage: "install", started_at: start.toISOString(), ended_at: new Date(start.getTime() + 80 * 60_000).toISOString() }).execute();
    const csv = await (await jobCosts.GET(request("/api/reports/job-costs?format=csv", { cookie: office.cookie }))).text();
    const [header, ...lines] = csv.split("\r\n");
    const line = lines.find((l) => l.startsWith(`${job.work_order},`))!;
    // $166.67 labour + $649.00 bought-in = $815.67 against $1,000.00 quoted: $184.33 under, written -184.33.
    expect(header.endsWith(",cost_dollars,quoted_dollars,over_under_quote_dollars")).toBe(true);
    expect(line.endsWith(",815.67,1000.00,-184.33")).toBe(true);
    expect(line).not.toContain("'");

    // The job page names the same figure with the same words as the Hours page and the CSV.
    const html = renderToStaticMarkup(await JobCostSection({ job: { id: job.id } as JobDetail }));
    expect(html).toContain("Over / under the quote");
    expect(html).toContain("under by $184.33");
    expect(html).not.toMatch(/margin/i);
  });
});
