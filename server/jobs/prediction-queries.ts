import "server-only";
import type { DB } from "@/db";
import type { JobScope, Stage } from "@/db/schema";
import { coatingFlags } from "@/server/records/queries";
import { shopToday } from "@/server/records/turnaround";
import { shopDateOf, shopDayStart } from "@/server/shop/business-days";
import { shopHolidays, shopSettings } from "@/server/shop/queries";
import { jobRoute, type RoutePart } from "@/server/status/route";
import { type DatedStageEvent, type FinishedVisit, finishedVisits, historyStart, type Prediction, predictReady, type StageHistory, stageHistory } from "./prediction";
import { BOARD_STAGES } from "./stages";

/*
 * The shop's stage-time history for predictions, kept in memory per database and brought up to
 * date from the stage events added since the last read (events are only ever added). The board
 * asks for it after every move, so a move costs one small read here, not a pass over a year of
 * events; the sorted history is worked out again only when events arrived or the day changed.
 */

interface HistoryState {
  calendarKey: string;
  lastEventId: number;
  /** Each job's stage since its last move (the visit not yet finished). */
  open: Map<number, { stage: Stage; day: string }>;
  visits: FinishedVisit[];
  sorted: { today: string; history: StageHistory } | null;
}

const states = new WeakMap<DB, HistoryState>();
const updating = new WeakMap<DB, Promise<unknown>>();

/** Days on the shop's clock, read once per quarter hour of instants (every zone offset is a whole number of quarter hours). */
function shopDayReader(timeZone: string) {
  const seen = new Map<number, string>();
  return (instant: string) => {
    const block = Math.floor(Date.parse(instant) / 900_000);
    let day = seen.get(block);
    if (day === undefined) {
      day = shopDateOf(new Date(block * 900_000), timeZone);
      seen.set(block, day);
    }
    return day;
  };
}

export interface PredictionContext {
  today: string;
  timeZone: string;
  holidays: ReadonlySet<string>;
  history: StageHistory;
  /** The day a job entered `stage`, when that is the stage it is in (its newest move there); null when no move was recorded. */
  enteredOn: (jobId: number, stage: Stage) => string | null;
  /** Answers already worked out in this request: cards in the same stage on the same route since the same day share one. */
  worked: Map<string, Prediction>;
}

type EventRow = { id: number; job_id: number; from_stage: Stage | null; to_stage: Stage; at: string };

function applyEvents(state: HistoryState, rows: readonly EventRow[], dayOf: (at: string) => string, holidays: ReadonlySet<string>) {
  // Each job's events continue from its open visit: prepend it as a synthetic "entered" event.
  const byJob = new Map<number, DatedStageEvent[]>();
  for (const r of rows) {
    let list = byJob.get(r.job_id);
    if (!list) {
      list = [];
      const open = state.open.get(r.job_id);
      if (open) list.push({ jobId: r.job_id, fromStage: null, toStage: open.stage, day: open.day });
      byJob.set(r.job_id, list);
    }
    list.push({ jobId: r.job_id, fromStage: r.from_stage, toStage: r.to_stage, day: dayOf(r.at) });
    if (r.id > state.lastEventId) state.lastEventId = r.id;
  }
  for (const [jobId, list] of byJob) {
    state.visits.push(...finishedVisits(list, holidays));
    let open = state.open.get(jobId) ?? null;
    for (const e of list) if (!open || open.stage !== e.toStage) open = { stage: e.toStage, day: e.day };
    if (open) state.open.set(jobId, open);
  }
}

async function refresh(db: DB, now: Date): Promise<PredictionContext> {
  const [shop, holidays] = await Promise.all([shopSettings(db), shopHolidays(db)]);
  const today = shopToday({ now, timeZone: shop.timeZone });
  const since = historyStart(today);
  const calendarKey = `${shop.timeZone}|${[...holidays].sort().join(",")}`;
  const dayOf = shopDayReader(shop.timeZone);
  let state = states.get(db);
  if (!state || state.calendarKey !== calendarKey) {
    // From scratch: every event of the jobs that moved within the window or are still open (a
    // visit that ended in the window may have begun long before it).
    const start = shopDayStart(since, shop.timeZone);
    const max = await db.selectFrom("stage_event").select((eb) => eb.fn.max("id").as("id")).executeTakeFirst();
    const lastEventId = Number(max?.id ?? 0);
    const rows = await db
      .selectFrom("stage_event")
      .select(["id", "job_id", "from_stage", "to_stage", "at"])
      .where((eb) =>
        eb.or([
          eb("job_id", "in", eb.selectFrom("stage_event as recent").select("recent.job_id").where("recent.at", ">=", start)),
          eb("job_id", "in", eb.selectFrom("job").select("job.id").where("job.stage", "in", BOARD_STAGES)),
        ]),
      )
      .where("id", "<=", lastEventId)
      .orderBy("job_id")
      .orderBy("at")
      .orderBy("id")
      .execute();
    state = { calendarKey, lastEventId: 0, open: new Map(), visits: [], sorted: null };
    applyEvents(state, rows, dayOf, holidays);
    state.lastEventId = lastEventId;
    states.set(db, state);
  } else {
    const rows = await db.selectFrom("stage_event").select(["id", "job_id", "from_stage", "to_stage", "at"]).where("id", ">", state.lastEventId).orderBy("id").execute();
    if (rows.length > 0) {
      applyEvents(state, rows, dayOf, holidays);
      state.sorted = null;
    }
  }
  if (!state.sorted || state.sorted.today !== today) {
    state.visits = state.visits.filter((v) => v.leftOn >= since);
    state.sorted = { today, history: stageHistory(state.visits, since) };
  }
  const open = state.open;
  return {
    today,
    timeZone: shop.timeZone,
    holidays,
    history: state.sorted.history,
    worked: new Map(),
    enteredOn: (jobId, stage) => {
      const visit = open.get(jobId);
      return visit && visit.stage === stage ? visit.day : null;
    },
  };
}

/** The shop's calendar and stage-time history, once per request (callers pass it to every job). */
export async function predictionContext(db: DB, now = new Date()): Promise<PredictionContext> {
  // One update at a time per database, so two requests never count the same new events twice.
  const before = updating.get(db) ?? Promise.resolve();
  const run = before.catch(() => undefined).then(() => refresh(db, now));
  updating.set(db, run);
  return run;
}

export interface PredictableJob {
  id: number;
  stage: Stage;
  scope: JobScope;
  parts: readonly RoutePart[];
  coatingPromisedOn: string | null;
}

export function predictionOf(ctx: PredictionContext, job: PredictableJob): Prediction {
  const route = jobRoute(job.scope, job.parts);
  const enteredOn = ctx.enteredOn(job.id, job.stage);
  const key = `${job.stage}|${route.join(",")}|${enteredOn}|${job.coatingPromisedOn}`;
  let prediction = ctx.worked.get(key);
  if (!prediction) {
    prediction = predictReady({ stage: job.stage, route, enteredOn, today: ctx.today, coatingPromisedOn: job.coatingPromisedOn }, ctx.history, ctx.holidays);
    ctx.worked.set(key, prediction);
  }
  return prediction;
}

/** Predictions for a few jobs (a job page, the status page), reading what each needs. */
export async function predictJobs(db: DB, jobs: readonly { id: number; stage: Stage; scope: JobScope }[], now = new Date()): Promise<Map<number, Prediction>> {
  const out = new Map<number, Prediction>();
  if (jobs.length === 0) return out;
  const ids = jobs.map((j) => j.id);
  const [ctx, coating, parts] = await Promise.all([
    predictionContext(db, now),
    coatingFlags(db, ids, now),
    db.selectFrom("part").select(["job_id", "needs_leak_test", "needs_coating"]).where("job_id", "in", ids).execute(),
  ]);
  for (const job of jobs) {
    const own = parts.filter((p) => p.job_id === job.id).map((p) => ({ needsLeakTest: p.needs_leak_test === 1, needsCoating: p.needs_coating === 1 }));
    out.set(job.id, predictionOf(ctx, { id: job.id, stage: job.stage, scope: job.scope, parts: own, coatingPromisedOn: coating.get(job.id)?.promisedOn ?? null }));
  }
  return out;
}

export async function predictJob(db: DB, job: { id: number; stage: Stage; scope: JobScope }, now = new Date()): Promise<Prediction> {
  return (await predictJobs(db, [job], now)).get(job.id)!;
}
