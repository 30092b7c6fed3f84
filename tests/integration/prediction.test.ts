import { createElement } from "react";
import { renderToStaticMarkup } from "react-dom/server";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import StatusPage from "@/app/(public)/status/[token]/page";
import { LikelyReady } from "@/app/(shop)/jobs/[id]/likely-ready";
import * as board from "@/app/api/board/route";
import * as jobRoute from "@/app/api/jobs/[id]/route";
import * as jobLinks from "@/app/api/jobs/[id]/status-links/route";
import * as moves from "@/app/api/jobs/[id]/moves/route";
import type { Stage } from "@/db/schema";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { params, readBody, request, sessionCookieFor } from "../support/http";
import { moneyChecksOff } from "../support/money";

/*
 * A shop's history written by hand on the 2026 calendar (1 March 2026 is a Sunday), shop clock
 * US/Central, closed on Thursday 12 March. "Today" is Wednesday 4 March 2026, 12:00 on the shop's
 * clock. Expected dates are worked out in the comments, never read from the code under test.
 * Median: the middle value, or the mean of the two middle ones; 90th percentile: nearest rank,
 * the value at rank ⌈0.9 × n⌉ of the sorted visits.
 */
const { db } = useFreshDatabase();
// Money is not the subject here: the shop's money checks are off (payments-gates.test.ts holds them).
beforeAll(() => moneyChecksOff(db()));
let office = "";
let installJob = 0;

// 18:00Z is 12:00 on the shop's clock (CST, UTC−6, until 8 March): always the same day.
const at = (day: string) => `${day}T18:00:00.000Z`;

async function events(jobId: number, moves: [Stage | null, Stage, string][]) {
  for (const [from, to, day] of moves) {
    await db().insertInto("stage_event").values({ job_id: jobId, from_stage: from, to_stage: to, at: at(day), actor_id: null, note: "", override_reason: null }).execute();
  }
}

beforeAll(async () => {
  vi.useFakeTimers({ toFake: ["Date"], now: new Date(at("2026-03-04")) });
  await ensureShop(db());
  await db().updateTable("shop").set({ time_zone: "US/Central" }).where("id", "=", 1).execute();
  await db().insertInto("shop_holiday").values({ day: "2026-03-12", name: "Shop closed" }).execute();
  office = await sessionCookieFor((await makeStaff(db(), "office")).id);

  // Install visits 1, 2, 2, 3, 8 (Mon 2 Feb → Tue 3 = 1; Mon 2 → Wed 4 = 2; Mon 9 → Wed 11 = 2;
  // Mon 9 → Thu 12 = 3; Mon 2 → Thu 12 Feb = 8) and Wire & verify visits 1, 1, 2, 4, 5, 6.
  const history: [Stage[], string[]][] = [
    [["install", "wire", "ready", "delivered"], ["2026-02-02", "2026-02-03", "2026-02-04", "2026-02-05"]], // install 1, wire Tue 3 → Wed 4 = 1
    [["install", "wire", "ready", "delivered"], ["2026-02-02", "2026-02-04", "2026-02-05", "2026-02-06"]], // install 2, wire Wed 4 → Thu 5 = 1
    [["install", "wire", "ready", "delivered"], ["2026-02-09", "2026-02-11", "2026-02-13", "2026-02-16"]], // install 2, wire Wed 11 → Fri 13 = 2
    [["install", "wire", "ready", "delivered"], ["2026-02-09", "2026-02-12", "2026-02-18", "2026-02-19"]], // install 3, wire Thu 12 → Wed 18 = 4
    [["install", "wire", "ready", "delivered"], ["2026-02-02", "2026-02-12", "2026-02-19", "2026-02-20"]], // install 8, wire Thu 12 → Thu 19 = 5
    [["wire", "ready", "delivered"], ["2026-02-16", "2026-02-24", "2026-02-25"]], // wire Mon 16 → Tue 24 = 6
  ];
  for (const [stages, days] of history) {
    const job = await makeJob(db(), { stage: "delivered", scope: "install_only" });
    await events(job.id, stages.map((s, i) => [i === 0 ? null : stages[i - 1], s, days[i]]));
  }
  // The job being predicted: install only, moved into Install today, due Tue 10 March.
  const job = await makeJob(db(), { stage: "install", scope: "install_only" });
  await events(job.id, [[null, "queued", "2026-03-02"], ["queued", "install", "2026-03-04"]]);
  await db().updateTable("job").set({ due_on: "2026-03-10" }).where("id", "=", job.id).execute();
  installJob = job.id;
});
afterAll(() => vi.useRealTimers());

const getJob = async (id: number) => readBody(await jobRoute.GET(request(`/api/jobs/${id}`, { cookie: office }), params({ id: String(id) })));

describe("the likely ready date on a job", () => {
  it("the job API gives the median path and the 90th percentile path through the rest of the route", async () => {
    const body = await getJob(installJob);
    // Install median 2, 90th rank ⌈4.5⌉ = 5 → 8; Wire & verify median (2 + 4) / 2 = 3, 90th rank ⌈5.4⌉ = 6 → 6.
    // Likely 2 + 3 = 5 working days after Wed 4: Thu 5, Fri 6, Mon 9, Tue 10, Wed 11.
    // Late 8 + 6 = 14: … Wed 11 (5), Thu 12 closed, Fri 13 (6), Mon 16 … Fri 20 (11), Mon 23, Tue 24, Wed 25 (14).
    expect(body.prediction).toMatchObject({ kind: "estimate", likelyOn: "2026-03-11", lateOn: "2026-03-25" });
  });

  it("the job page shows the dates, says it is an estimate, and flags a likely miss of the due date", async () => {
    const { job, prediction } = await getJob(installJob);
    const html = renderToStaticMarkup(createElement(LikelyReady, { prediction, dueOn: job.dueOn, stage: job.stage }));
    expect(html).toContain("Around Wed 11 Mar 2026");
    expect(html).toContain("late case Wed 25 Mar 2026");
    expect(html).toContain("Likely after the due date");
    expect(html).toContain("An estimate");
  });

  it("a job whose route has a stage with too little history says not enough history yet", async () => {
    // Queued has one finished visit in this shop's history (the job above, Mon 2 → Wed 4 March).
    const queued = await makeJob(db(), { stage: "queued", scope: "install_only" });
    const { job, prediction } = await getJob(queued.id);
    expect(prediction).toEqual({ kind: "not_enough_history", stages: [{ stage: "queued", visits: 1 }] });
    const html = renderToStaticMarkup(createElement(LikelyReady, { prediction, dueOn: job.dueOn, stage: job.stage }));
    expect(html).toContain("Not enough history yet");
    // Said in the shop's words: jobs that went through the stage, not "visits".
    expect(html).toContain("1 job went through Queued in the last 12 months (5 needed; a job sent back counts each time through).");
    expect(html).not.toMatch(/visit/i);
    expect(html).not.toContain("Around");
  });

  it("two stages short of history are both named, each with the jobs that went through it", () => {
    const html = renderToStaticMarkup(
      createElement(LikelyReady, { prediction: { kind: "not_enough_history", stages: [{ stage: "wire", visits: 3 }, { stage: "queued", visits: 0 }] }, dueOn: null, stage: "install" }),
    );
    expect(html).toContain("3 jobs went through Wire &amp; verify; 0 jobs went through Queued in the last 12 months (5 needed for each; a job sent back counts each time through).");
  });

  it("the board marks the card that will likely miss its due date, and only that one", async () => {
    const onTime = await makeJob(db(), { stage: "install", scope: "install_only" });
    await events(onTime.id, [[null, "install", "2026-03-04"]]);
    await db().updateTable("job").set({ due_on: "2026-03-20" }).where("id", "=", onTime.id).execute();
    const cards = (await readBody(await board.GET(request("/api/board", { cookie: office })))).cards as { id: number; likelyLate: unknown }[];
    expect(cards.find((c) => c.id === installJob)!.likelyLate).toEqual({ likelyOn: "2026-03-11", lateOn: "2026-03-25" });
    expect(cards.find((c) => c.id === onTime.id)!.likelyLate).toBeNull();
  });

  it("a move brings the new visit into the history at once", async () => {
    // A sixth Install visit: Wed 4 → Wed 4 = 0 days. Install is then 0, 1, 2, 2, 3, 8: median 2, 90th rank ⌈5.4⌉ = 6 → 8.
    const quick = await makeJob(db(), { stage: "install", scope: "install_only" });
    await events(quick.id, [[null, "install", "2026-03-04"]]);
    const owner = await sessionCookieFor((await makeStaff(db(), "owner")).id);
    const moved = await moves.POST(request(`/api/jobs/${quick.id}/moves`, { method: "POST", cookie: owner, body: { toStage: "wire", version: quick.version } }), params({ id: String(quick.id) }));
    expect(moved.status).toBe(200);
    // The job now in Wire & verify: 0 days in; wire median 3 → Mon 9; 90th 6 → Thu 12 is closed → Fri 13.
    expect((await getJob(quick.id)).prediction).toMatchObject({ kind: "estimate", likelyOn: "2026-03-09", lateOn: "2026-03-13" });
    // The job in Install: visits of 0 days or more are all six; median (2 + 2) / 2 = 2, 90th 8: unchanged dates.
    expect((await getJob(installJob)).prediction).toMatchObject({ likelyOn: "2026-03-11", lateOn: "2026-03-25" });
  });
});

describe("the status page's likely date", () => {
  async function pageHtml(jobId: number) {
    const res = await jobLinks.POST(request(`/api/jobs/${jobId}/status-links`, { method: "POST", cookie: office }), params({ id: String(jobId) }));
    expect(res.status).toBe(201);
    const token = ((await readBody(res)).link.url as string).split("/status/")[1];
    return renderToStaticMarkup(await StatusPage({ params: Promise.resolve({ token }) }));
  }

  it("shows likely ready around … with the word estimate only when the shop turned it on", async () => {
    await db().updateTable("shop").set({ show_predicted_date: 0 }).where("id", "=", 1).execute();
    const off = await pageHtml(installJob);
    expect(off).not.toContain("Likely ready");
    expect(off).not.toContain("11 March");

    await db().updateTable("shop").set({ show_predicted_date: 1 }).where("id", "=", 1).execute();
    const on = await pageHtml(installJob);
    expect(on).toContain("Likely ready");
    expect(on).toContain("around Wednesday 11 March");
    expect(on).toContain("An estimate");
    // The late case is for the shop, not the customer.
    expect(on).not.toContain("25 March");
  });

  it("says nothing more when the history is too thin, even when turned on", async () => {
    const queued = await makeJob(db(), { stage: "queued", scope: "install_only" });
    const html = await pageHtml(queued.id);
    expect(html).not.toContain("Likely ready");
  });
});
