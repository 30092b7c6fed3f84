import { parse } from "csv-parse/sync";
import { beforeAll, describe, expect, it } from "vitest";
import * as coaters from "@/app/api/reports/coaters/route";
import * as stageTimes from "@/app/api/reports/stage-times/route";
import * as throughputRoute from "@/app/api/reports/throughput/route";
import * as workloadRoute from "@/app/api/reports/workload/route";
import type { Stage } from "@/db/schema";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { readBody, request, sessionCookieFor } from "../support/http";

/*
 * A month of a shop's history written by hand, March 2026, shop clock US/Central, the shop closed
 * on Thursday 12 March. Every expected figure below is worked out in the comments from the
 * calendar (1 March 2026 is a Sunday), never read from the code under test.
 *
 * Business days count the working days from the day a job entered up to, not including, the day
 * it left. Median: middle value, or mean of the two middle ones. 90th percentile: nearest rank,
 * the value at rank ceil(0.9 × n).
 */
const { db } = useFreshDatabase();
const PERIOD = "from=2026-03-01&to=2026-03-31";
let cookie = "";
let techOne = "";

// 15:00Z is 09:00 or 10:00 on the shop's clock (daylight saving starts 8 March); always the same day.
const at = (day: string, time = "15:00:00") => `${day}T${time}.000Z`;

async function events(jobId: number, moves: [Stage | null, Stage, string, string?][]) {
  for (const [from, to, when, actor] of moves) {
    await db().insertInto("stage_event").values({ job_id: jobId, from_stage: from, to_stage: to, at: when, actor_id: actor ?? null, note: "", override_reason: null }).execute();
  }
}

beforeAll(async () => {
  await ensureShop(db());
  await db().updateTable("shop").set({ time_zone: "US/Central" }).where("id", "=", 1).execute();
  await db().insertInto("shop_holiday").values({ day: "2026-03-12", name: "Shop closed" }).execute();
  const office = await makeStaff(db(), "office");
  cookie = await sessionCookieFor(office.id);
  techOne = (await makeStaff(db(), "tech", { name: "Avery Tech" })).id;
  await makeStaff(db(), "tech", { name: "Blake Tech" });

  // Job A goes back to Fabricate twice.
  const a = await makeJob(db(), { stage: "coating" });
  await events(a.id, [
    [null, "queued", at("2026-03-02")],
    ["queued", "fabricate", at("2026-03-03"), techOne], // queued Mon 2 → Tue 3: 1
    ["fabricate", "pressure_test", at("2026-03-05"), techOne], // fabricate Tue 3 → Thu 5: 2
    ["pressure_test", "fabricate", at("2026-03-06")], // pressure test Thu 5 → Fri 6: 1
    ["fabricate", "pressure_test", at("2026-03-09")], // fabricate Fri 6 → Mon 9: 1
    ["pressure_test", "fabricate", at("2026-03-10"), techOne], // pressure test Mon 9 → Tue 10: 1 (a reorder by the tech follows)
    ["fabricate", "fabricate", at("2026-03-10", "18:00:00"), techOne], // a reorder: not a visit, not a move
    ["fabricate", "pressure_test", at("2026-03-16")], // fabricate Tue 10 → Mon 16: Tue, Wed, (Thu closed), Fri = 3
    ["pressure_test", "pressure_test", at("2026-03-17")], // reorder
    ["pressure_test", "coating", at("2026-03-18")], // pressure test Mon 16 → Wed 18: 2
  ]);
  // Job B enters Fabricate the day before the holiday.
  const b = await makeJob(db(), { stage: "coating" });
  await events(b.id, [
    [null, "queued", at("2026-03-02", "16:00:00")],
    ["queued", "fabricate", at("2026-03-11", "16:00:00")], // queued Mon 2 → Wed 11: 5 + Mon 9, Tue 10 = 7
    ["fabricate", "pressure_test", at("2026-03-13", "16:00:00")], // fabricate Wed 11 → Fri 13: Wed (Thu closed) = 1
    ["pressure_test", "coating", at("2026-03-20", "16:00:00")], // pressure test Fri 13 → Fri 20: 5
  ]);
  // Job C leaves Queued in the evening of Tuesday 3 March on the shop's clock (already the 4th in UTC).
  const c = await makeJob(db(), { stage: "fabricate", });
  await events(c.id, [
    [null, "queued", at("2026-02-20")],
    ["queued", "fabricate", "2026-03-04T03:00:00.000Z"], // queued Fri 20 Feb → Tue 3 Mar: Fri, 5 (23–27 Feb), Mon 2 = 7
  ]);
  // Job D leaves Queued after the period: not counted.
  const d = await makeJob(db(), { stage: "fabricate" });
  await events(d.id, [
    [null, "queued", at("2026-03-30")],
    ["queued", "fabricate", at("2026-04-02")],
  ]);

  // Deliveries.
  const delivered = async (dueOn: string | null, moves: [Stage | null, Stage, string, string?][], tech?: string) => {
    const job = await makeJob(db(), { stage: "delivered", scope: "install_only" });
    await db().updateTable("job").set({ due_on: dueOn, assigned_tech_id: tech ?? null }).where("id", "=", job.id).execute();
    await events(job.id, moves);
  };
  await delivered("2026-03-10", [["ready", "delivered", at("2026-03-10", "20:00:00")]]); // E: on time, week of 9 Mar
  await delivered("2026-03-10", [["ready", "delivered", at("2026-03-11")]]); // F: late, week of 9 Mar
  await delivered(null, [["ready", "delivered", at("2026-03-03"), techOne]], techOne); // G: no due date, week of 2 Mar
  await delivered("2026-03-20", [
    ["ready", "delivered", at("2026-03-05")],
    ["delivered", "ready", at("2026-03-06")],
    ["ready", "delivered", at("2026-03-24"), techOne], // H: counted once, on the 24th: late, week of 23 Mar
  ]);
  await delivered("2026-03-31", [["ready", "delivered", "2026-03-01T05:00:00.000Z"]]); // I: 28 Feb on the shop's clock: outside
  await delivered(null, [["ready", "delivered", at("2026-04-01"), techOne]]); // J: after the period

  // Tech workload: Avery has two open jobs (the delivered G and H do not count), Blake none.
  const open1 = await makeJob(db(), { stage: "queued" });
  const open2 = await makeJob(db(), { stage: "install", scope: "install_only" });
  await db().updateTable("job").set({ assigned_tech_id: techOne }).where("id", "in", [open1.id, open2.id]).execute();

  // Coating runs.
  const vendor = async (name: string) => (await db().insertInto("vendor").values({ name, contact: "", phone: "", email: "", usual_turnaround_days: 4, notes: "", created_at: at("2026-01-01") }).returning("id").executeTakeFirstOrThrow()).id;
  const x = await vendor("Ridgeline Powder");
  const y = await vendor("Copperleaf Finishers");
  const run = (vendorId: number, sent: string, promised: string, received: string | null) =>
    db().insertInto("coating_run").values({ vendor_id: vendorId, finish_colour: "Black", finish_gloss: "gloss", sent_on: sent, promised_on: promised, received_on: received, dft_readings_mils: null, adhesion_ok: null, defects: null, inspected_at: null, inspected_by: null, created_by: null, created_at: at(sent), updated_at: at(sent) }).execute();
  await run(x, "2026-03-02", "2026-03-06", "2026-03-09"); // Friday promise, back Monday: late. Turnaround Mon 2 → Mon 9 = 5; promised 4
  await run(x, "2026-03-09", "2026-03-13", "2026-03-11"); // on time. Turnaround Mon 9 → Wed 11 = 2; promised Mon 9 → Fri 13 less Thu 12 = 3
  await run(x, "2026-03-16", "2026-03-19", null); // still out, promise passed long ago: overdue, late. Promised Mon 16 → Thu 19 = 3
  await run(y, "2026-02-25", "2026-03-02", "2026-03-02"); // sent before the period: not counted
  await run(y, "2026-03-30", "2026-04-03", "2026-04-02"); // on time. Turnaround Mon 30 → Thu 2 = 3; promised 4
});

const get = async (route: { GET: (req: Request) => Promise<Response> }, path: string, who = cookie) => route.GET(request(path, { cookie: who }));

describe("report: time in each stage", () => {
  it("counts each visit that ended in the period, in business days on the shop's calendar, holidays skipped", async () => {
    const res = await get(stageTimes, `/api/reports/stage-times?${PERIOD}`);
    expect(res.status).toBe(200);
    const body = await readBody(res);
    expect(body.period).toEqual({ from: "2026-03-01", to: "2026-03-31" });
    const byStage = Object.fromEntries(body.stages.map((s: { stage: string }) => [s.stage, s]));
    // Queued: A 1, B 7, C 7 → sorted 1, 7, 7: median 7; 90th percentile rank ceil(2.7) = 3 → 7. D ended in April.
    expect(byStage.queued).toMatchObject({ visits: 3, medianDays: 7, p90Days: 7 });
    // Fabricate: A 2, 1, 3 and B 1 → 1, 1, 2, 3: median (1 + 2) / 2 = 1.5; rank ceil(3.6) = 4 → 3.
    expect(byStage.fabricate).toMatchObject({ visits: 4, medianDays: 1.5, p90Days: 3 });
    // Pressure test: A 1, 1, 2 and B 5 → 1, 1, 2, 5: median 1.5; rank 4 → 5.
    expect(byStage.pressure_test).toMatchObject({ visits: 4, medianDays: 1.5, p90Days: 5 });
    // Ready for pickup: H went back from Delivered on Fri 6 and out again Tue 24: Fri 6, 9–13 less
    // Thu 12 (4), 16–20 (5), Mon 23 = 11.
    expect(byStage.ready).toMatchObject({ visits: 1, medianDays: 11, p90Days: 11 });
    // Nobody has left Outside coating yet.
    expect(byStage.coating).toMatchObject({ visits: 0, medianDays: null, p90Days: null });
    expect(body.stages.map((s: { stage: string }) => s.stage)).not.toContain("delivered");
  });

  it("downloads as CSV that a CSV reader parses back, with a header row", async () => {
    const res = await get(stageTimes, `/api/reports/stage-times?${PERIOD}&format=csv`);
    expect(res.headers.get("content-type")).toContain("text/csv");
    expect(res.headers.get("content-disposition")).toContain("baywright-stage-times-2026-03-01-to-2026-03-31.csv");
    const rows = parse(await res.text(), { columns: true }) as Record<string, string>[];
    expect(rows.find((r) => r.stage === "Fabricate")).toEqual({ stage: "Fabricate", jobs_through: "4", median_business_days: "1.5", p90_business_days: "3" });
  });
});

describe("report: throughput", () => {
  it("counts jobs delivered per week (Monday to Sunday) on the shop's clock and on-time against the due date", async () => {
    const body = await readBody(await get(throughputRoute, `/api/reports/throughput?${PERIOD}`));
    // Weeks touching 1–31 March 2026: Sunday 1 March belongs to the week of Monday 23 February.
    expect(body.weeks).toEqual([
      { week: "2026-02-23", delivered: 0, onTime: 0, late: 0, noDueDate: 0 },
      { week: "2026-03-02", delivered: 1, onTime: 0, late: 0, noDueDate: 1 }, // G
      { week: "2026-03-09", delivered: 2, onTime: 1, late: 1, noDueDate: 0 }, // E, F
      { week: "2026-03-16", delivered: 0, onTime: 0, late: 0, noDueDate: 0 },
      { week: "2026-03-23", delivered: 1, onTime: 0, late: 1, noDueDate: 0 }, // H, last delivery only
      { week: "2026-03-30", delivered: 0, onTime: 0, late: 0, noDueDate: 0 },
    ]);
    expect(body).toMatchObject({ delivered: 4, onTime: 1, late: 2, noDueDate: 1 });
    expect(body.onTimeShare).toBeCloseTo(1 / 3, 10);
  });
});

describe("report: coaters", () => {
  it("gives each coater's turnaround against its promise; a Monday return after a Friday promise is late", async () => {
    const body = await readBody(await get(coaters, `/api/reports/coaters?${PERIOD}`));
    expect(body.coaters).toHaveLength(2);
    const [copper, ridge] = body.coaters; // A–Z
    // Ridgeline: promised 4, 3, 3 → median 3; turnaround 5, 2 → median 3.5, rank ceil(1.8) = 2 → 5.
    expect(ridge).toMatchObject({ vendorName: "Ridgeline Powder", runs: 3, received: 2, onTime: 1, late: 2, overdue: 1, medianPromisedDays: 3, medianTurnaroundDays: 3.5, p90TurnaroundDays: 5 });
    expect(ridge.onTimeShare).toBeCloseTo(1 / 3, 10);
    expect(copper).toMatchObject({ vendorName: "Copperleaf Finishers", runs: 1, received: 1, onTime: 1, late: 0, overdue: 0, medianPromisedDays: 4, medianTurnaroundDays: 3, p90TurnaroundDays: 3, onTimeShare: 1 });
  });
});

describe("report: tech workload", () => {
  it("gives open jobs now and stage moves per week for each tech; reorders and other people's moves do not count", async () => {
    const body = await readBody(await get(workloadRoute, `/api/reports/workload?${PERIOD}`));
    expect(body.weeks).toEqual(["2026-02-23", "2026-03-02", "2026-03-09", "2026-03-16", "2026-03-23", "2026-03-30"]);
    const avery = body.techs.find((t: { name: string }) => t.name === "Avery Tech");
    const blake = body.techs.find((t: { name: string }) => t.name === "Blake Tech");
    // Avery moved A on 3 and 5 March and G on 3 March (week of 2 March), A on 10 March (week of 9
    // March; the reorder that day is not a move), H on 24 March; J on 1 April is outside.
    expect(avery).toMatchObject({ openJobs: 2, moves: 5, movesByWeek: [0, 3, 1, 0, 1, 0] });
    expect(blake).toMatchObject({ openJobs: 0, moves: 0, movesByWeek: [0, 0, 0, 0, 0, 0] });
  });
});

describe("report periods and access", () => {
  it("refuses a period that runs backwards, an impossible day, or more than two years, saying what to fix", async () => {
    for (const q of ["from=2026-03-31&to=2026-03-01", "from=2026-02-30&to=2026-03-31", "from=2020-01-01&to=2026-03-31", "from=March"]) {
      const res = await get(stageTimes, `/api/reports/stage-times?${q}`);
      expect(res.status, q).toBe(400);
      const body = await readBody(res);
      expect(body.error.code).toBe("validation");
      expect(body.error.message.length).toBeGreaterThan(10);
    }
  });

  it("is for the office and the owner, not the bench", async () => {
    const tech = await sessionCookieFor(techOne);
    expect((await get(throughputRoute, `/api/reports/throughput?${PERIOD}`, tech)).status).toBe(403);
  });
});
