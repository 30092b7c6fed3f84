import "server-only";
import { subDays } from "date-fns";
import { sql } from "kysely";
import type { DB } from "@/db";
import type { PartKind, PartMaterial, PartShape } from "@/db/tables/records";
import type { Stage } from "@/db/schema";
import { formatCalendarDate, parseCalendarDate } from "./calendar";
import type { LeakTestResult, LeakTestWarning } from "./leak-test";
import { type LeakTestProcedure, PUBLISHED_PROCEDURE } from "./procedure";
import type { CoatingFinish, LeakTestMethod, PartGeometry, SeamCheck, WiringSignOff } from "./schemas";
import { DEFAULT_ALLOWED_DROP_PSI, DEFAULT_SHOP_TIME_ZONE } from "./settings";
import { signOffMissing } from "./sign-off";
import {
  type ShopClock,
  type VendorRecord,
  VENDOR_RECORD_WINDOW_DAYS,
  businessDaysOut,
  businessDaysOverdue,
  isOverdue,
  shopToday,
  vendorRecord,
} from "./turnaround";

// Job ids go into `in (…)` lists; chunks keep each statement far under SQLite's bound-parameter limit.
const CHUNK = 500;
function chunks<T>(items: readonly T[]): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < items.length; i += CHUNK) out.push(items.slice(i, i + CHUNK));
  return out;
}

function parseJson<T>(text: string | null, fallback: T): T {
  if (text === null) return fallback;
  try {
    return JSON.parse(text) as T;
  } catch {
    return fallback;
  }
}

export interface RecordsSettings {
  allowedDropPsi: number;
  timeZone: string;
  procedure: LeakTestProcedure;
}

/** The shop settings the records read: the leak test's allowed drop and procedure, and the shop's time zone. */
export async function recordsSettings(db: DB): Promise<RecordsSettings> {
  const row = await db
    .selectFrom("shop")
    .select([
      "time_zone", "leak_allowed_drop_psi", "leak_min_hold_minutes", "leak_gauge_ratio_min", "leak_gauge_ratio_max", "leak_round_min_psig",
      "leak_round_max_psig", "leak_box_min_psig", "leak_box_max_psig", "leak_calibration_months",
    ])
    .where("id", "=", 1)
    .executeTakeFirst();
  const procedure: LeakTestProcedure = row
    ? {
        minHoldMinutes: row.leak_min_hold_minutes,
        gaugeRatioMin: row.leak_gauge_ratio_min,
        gaugeRatioMax: row.leak_gauge_ratio_max,
        roundMinPsig: row.leak_round_min_psig,
        roundMaxPsig: row.leak_round_max_psig,
        boxMinPsig: row.leak_box_min_psig,
        boxMaxPsig: row.leak_box_max_psig,
        calibrationMonths: row.leak_calibration_months,
      }
    : { ...PUBLISHED_PROCEDURE };
  return { allowedDropPsi: row?.leak_allowed_drop_psi ?? DEFAULT_ALLOWED_DROP_PSI, timeZone: row?.time_zone ?? DEFAULT_SHOP_TIME_ZONE, procedure };
}

export async function shopClock(db: DB, now = new Date()): Promise<ShopClock> {
  return { now, timeZone: (await recordsSettings(db)).timeZone };
}

export type CoatingState = "out" | "back" | "inspected";

/**
 * The result of a part's newest leak test in its current rework generation (null when none), as a
 * SQL expression over `part as p`. A part passes only while its newest test is a pass: a pass
 * followed by a fail means the tank leaks now, whatever the earlier test said.
 */
export const currentLeakResult = sql<LeakTestResult | null>`(select t.result from leak_test t where t.part_id = p.id and t.rework_count = p.rework_count order by t.id desc limit 1)`;

// The newest coating run that carried the part in its current generation: a run from before a
// rework coated metal that has since been cut or welded, so it no longer counts.
const currentRun = (column: string) =>
  sql.raw(
    `(select ${column} from coating_run_part c join coating_run r on r.id = c.run_id where c.part_id = p.id and c.rework_count = p.rework_count order by c.run_id desc limit 1)`,
  );

/** One row per part with what its gates need, computed in SQL so hundreds of jobs cost one statement. */
export interface PartStatusRow {
  id: number;
  job_id: number;
  name: string;
  needs_leak_test: number;
  needs_coating: number;
  rework_count: number;
  /** 1 when the newest test since the last rework (same generation) is a pass. */
  passed: number;
  /** The newest test's result since the last rework; null when none. */
  last_result: LeakTestResult | null;
  /** The newest coating run carrying the part since its last rework, and where it stands; null when not sent since. */
  last_run_id: number | null;
  coating_state: CoatingState | null;
  /** That run's adhesion check: 1 passed, 0 failed, null when not inspected (or not sent). */
  adhesion_ok: number | null;
  /** The newest run that ever carried the part, in any generation (what the job page shows); null when never sent. */
  any_run_id: number | null;
}

export async function partStatuses(db: DB, filter: { jobIds?: readonly number[]; partIds?: readonly number[]; onlyGated?: boolean }): Promise<PartStatusRow[]> {
  const run = async (column: "p.job_id" | "p.id", ids: readonly number[]) => {
    let query = db
      .selectFrom("part as p")
      .select((eb) => [
        "p.id",
        "p.job_id",
        "p.name",
        "p.needs_leak_test",
        "p.needs_coating",
        "p.rework_count",
        sql<number>`coalesce(${currentLeakResult} = 'pass', 0)`.as("passed"),
        currentLeakResult.as("last_result"),
        sql<number | null>`${currentRun("c.run_id")}`.as("last_run_id"),
        sql<CoatingState | null>`${currentRun("case when r.received_on is null then 'out' when r.inspected_at is null then 'back' else 'inspected' end")}`.as(
          "coating_state",
        ),
        sql<number | null>`${currentRun("r.adhesion_ok")}`.as("adhesion_ok"),
        eb
          .selectFrom("coating_run_part as c")
          .select("c.run_id")
          .whereRef("c.part_id", "=", "p.id")
          .orderBy("c.run_id", "desc")
          .limit(1)
          .as("any_run_id"),
      ])
      .where(column, "in", ids);
    if (filter.onlyGated) query = query.where((eb) => eb.or([eb("p.needs_leak_test", "=", 1), eb("p.needs_coating", "=", 1)]));
    return query.orderBy("p.id").execute();
  };
  const rows: PartStatusRow[] = [];
  for (const ids of chunks(filter.jobIds ?? [])) rows.push(...((await run("p.job_id", ids)) as PartStatusRow[]));
  for (const ids of chunks(filter.partIds ?? [])) rows.push(...((await run("p.id", ids)) as PartStatusRow[]));
  return rows;
}

export interface PartView {
  id: number;
  jobId: number;
  name: string;
  kind: PartKind;
  material: PartMaterial;
  shape: PartShape;
  geometry: PartGeometry | null;
  needsLeakTest: boolean;
  needsCoating: boolean;
  notes: string;
  reworkCount: number;
  reworkedAt: string | null;
  reworkNote: string;
  leak: { passedSinceRework: boolean; lastResult: LeakTestResult | null };
  coating: PartCoating | null;
}

export interface PartCoating {
  runId: number;
  vendorName: string;
  finish: CoatingFinish;
  sentOn: string;
  promisedOn: string;
  receivedOn: string | null;
  inspectedAt: string | null;
  state: CoatingState;
  /** The receiving inspection's adhesion check; null until inspected. */
  adhesionOk: boolean | null;
  /** False when the part has been reworked since this run: it must go out again. */
  current: boolean;
  overdue: boolean;
}

/** A job's parts with their leak-test and coating state, in the order they were added. */
export async function listParts(db: DB, filter: { jobId?: number; partId?: number }, now = new Date()): Promise<PartView[]> {
  let query = db
    .selectFrom("part")
    .select([
      "id", "job_id", "name", "kind", "material", "shape", "geometry", "needs_leak_test", "needs_coating", "notes",
      "rework_count", "reworked_at", "rework_note",
    ]);
  if (filter.jobId !== undefined) query = query.where("job_id", "=", filter.jobId);
  if (filter.partId !== undefined) query = query.where("id", "=", filter.partId);
  const parts = await query.orderBy("id").execute();
  if (parts.length === 0) return [];
  const statuses = new Map((await partStatuses(db, { partIds: parts.map((p) => p.id) })).map((s) => [s.id, s]));
  const runIds = [...new Set([...statuses.values()].flatMap((s) => (s.any_run_id === null ? [] : [s.any_run_id])))];
  const runs = new Map(
    runIds.length
      ? (
          await db
            .selectFrom("coating_run as r")
            .innerJoin("vendor as v", "v.id", "r.vendor_id")
            .select(["r.id", "v.name as vendor_name", "r.finish_colour", "r.finish_gloss", "r.sent_on", "r.promised_on", "r.received_on", "r.inspected_at", "r.adhesion_ok"])
            .where("r.id", "in", runIds)
            .execute()
        ).map((r) => [r.id, r])
      : [],
  );
  const clock = await shopClock(db, now);
  return parts.map((p) => {
    const status = statuses.get(p.id)!;
    const run = status.any_run_id === null ? undefined : runs.get(status.any_run_id);
    return {
      id: p.id,
      jobId: p.job_id,
      name: p.name,
      kind: p.kind,
      material: p.material,
      shape: p.shape,
      geometry: parseJson<PartGeometry | null>(p.geometry, null),
      needsLeakTest: p.needs_leak_test === 1,
      needsCoating: p.needs_coating === 1,
      notes: p.notes,
      reworkCount: p.rework_count,
      reworkedAt: p.reworked_at,
      reworkNote: p.rework_note,
      leak: { passedSinceRework: status.passed === 1, lastResult: status.last_result },
      coating: run
        ? {
            runId: run.id,
            vendorName: run.vendor_name,
            finish: { colour: run.finish_colour, gloss: run.finish_gloss as CoatingFinish["gloss"] },
            sentOn: run.sent_on,
            promisedOn: run.promised_on,
            receivedOn: run.received_on,
            inspectedAt: run.inspected_at,
            state: run.received_on === null ? "out" : run.inspected_at === null ? "back" : "inspected",
            adhesionOk: run.inspected_at === null ? null : run.adhesion_ok === 1,
            current: run.id === status.last_run_id,
            overdue: isOverdue({ sentOn: run.sent_on, promisedOn: run.promised_on, receivedOn: run.received_on }, clock),
          }
        : null,
    };
  });
}

export async function findPart(db: DB, id: number, now = new Date()): Promise<PartView | undefined> {
  return (await listParts(db, { partId: id }, now))[0];
}

export interface LeakTestView {
  id: number;
  partId: number;
  partName: string;
  /** False once the part has been reworked since this test: it no longer counts for the gate. */
  current: boolean;
  method: LeakTestMethod;
  partShape: PartShape;
  testPressurePsig: number;
  gaugeFullScalePsi: number;
  gaugeCalibratedOn: string;
  holdMinutes: number;
  startPressurePsig: number | null;
  endPressurePsig: number | null;
  startTempF: number | null;
  endTempF: number | null;
  barometricPsia: number;
  seams: SeamCheck[];
  tester: string;
  rawDropPsi: number | null;
  correctedDropPsi: number | null;
  allowedDropPsi: number;
  result: LeakTestResult;
  warnings: LeakTestWarning[];
  /** Why the test did not follow the procedure; empty unless the result is "invalid". */
  invalidReasons: LeakTestWarning[];
  recordedByName: string | null;
  testedAt: string;
}

/** Leak tests, newest first, of one part or of every part of a job. */
export async function listLeakTests(db: DB, filter: { jobId?: number; partId?: number; testId?: number }): Promise<LeakTestView[]> {
  let query = db
    .selectFrom("leak_test as t")
    .innerJoin("part as p", "p.id", "t.part_id")
    .leftJoin("staff as s", "s.id", "t.recorded_by")
    .select([
      "t.id", "t.part_id", "p.name as part_name", "p.rework_count as part_rework_count", "t.rework_count", "t.method", "t.part_shape",
      "t.test_pressure_psig", "t.gauge_full_scale_psi", "t.gauge_calibrated_on", "t.hold_minutes", "t.start_pressure_psig",
      "t.end_pressure_psig", "t.start_temp_f", "t.end_temp_f", "t.barometric_psia", "t.seams", "t.tester", "t.raw_drop_psi",
      "t.corrected_drop_psi", "t.allowed_drop_psi", "t.result", "t.warnings", "t.invalid_reasons", "s.name as recorded_by_name", "t.tested_at",
    ]);
  if (filter.jobId !== undefined) query = query.where("p.job_id", "=", filter.jobId);
  if (filter.partId !== undefined) query = query.where("t.part_id", "=", filter.partId);
  if (filter.testId !== undefined) query = query.where("t.id", "=", filter.testId);
  const rows = await query.orderBy("t.id", "desc").execute();
  return rows.map((t) => ({
    id: t.id,
    partId: t.part_id,
    partName: t.part_name,
    current: t.rework_count === t.part_rework_count,
    method: t.method,
    partShape: t.part_shape,
    testPressurePsig: t.test_pressure_psig,
    gaugeFullScalePsi: t.gauge_full_scale_psi,
    gaugeCalibratedOn: t.gauge_calibrated_on,
    holdMinutes: t.hold_minutes,
    startPressurePsig: t.start_pressure_psig,
    endPressurePsig: t.end_pressure_psig,
    startTempF: t.start_temp_f,
    endTempF: t.end_temp_f,
    barometricPsia: t.barometric_psia,
    seams: parseJson<SeamCheck[]>(t.seams, []),
    tester: t.tester,
    rawDropPsi: t.raw_drop_psi,
    correctedDropPsi: t.corrected_drop_psi,
    allowedDropPsi: t.allowed_drop_psi,
    result: t.result,
    warnings: parseJson<LeakTestWarning[]>(t.warnings, []),
    invalidReasons: parseJson<LeakTestWarning[]>(t.invalid_reasons, []),
    recordedByName: t.recorded_by_name,
    testedAt: t.tested_at,
  }));
}

export interface VendorView {
  id: number;
  name: string;
  contact: string;
  phone: string;
  email: string;
  usualTurnaroundDays: number;
  notes: string;
}

export async function listVendors(db: DB): Promise<VendorView[]> {
  const rows = await db
    .selectFrom("vendor")
    .select(["id", "name", "contact", "phone", "email", "usual_turnaround_days", "notes"])
    .orderBy("name")
    .execute();
  return rows.map((v) => ({ id: v.id, name: v.name, contact: v.contact, phone: v.phone, email: v.email, usualTurnaroundDays: v.usual_turnaround_days, notes: v.notes }));
}

export async function findVendor(db: DB, id: number) {
  return (await listVendors(db)).find((v) => v.id === id);
}

/** Each vendor's record over the last 90 days: runs, median turnaround in business days, share on time. */
export async function vendorRecords(db: DB, now = new Date()): Promise<(VendorView & { record: VendorRecord })[]> {
  const clock = await shopClock(db, now);
  const windowStart = formatCalendarDate(subDays(parseCalendarDate(shopToday(clock)), VENDOR_RECORD_WINDOW_DAYS - 1));
  const [vendors, runs] = await Promise.all([
    listVendors(db),
    db.selectFrom("coating_run").select(["vendor_id", "sent_on", "promised_on", "received_on"]).where("sent_on", ">=", windowStart).execute(),
  ]);
  return vendors.map((v) => ({
    ...v,
    record: vendorRecord(
      runs.filter((r) => r.vendor_id === v.id).map((r) => ({ sentOn: r.sent_on, promisedOn: r.promised_on, receivedOn: r.received_on })),
      clock,
    ),
  }));
}

export interface RunPartView {
  id: number;
  name: string;
  kind: PartKind;
  jobId: number;
  workOrder: string;
  jobStage: Stage;
  customerName: string;
  unitNumber: string;
}

export interface CoatingRunView {
  id: number;
  vendorId: number;
  vendorName: string;
  finish: CoatingFinish;
  sentOn: string;
  promisedOn: string;
  receivedOn: string | null;
  inspection: { dftReadingsMils: number[]; adhesionOk: boolean; defects: string; inspectedAt: string; inspectedByName: string | null } | null;
  parts: RunPartView[];
  overdue: boolean;
  businessDaysOut: number;
  businessDaysOverdue: number;
  /** What the coater charged for the run, cents; null when not recorded. Left out for techs (`runForRole`). */
  priceCents?: number | null;
}

/** A tech sees no prices: the run as the signed-in person may read it. */
export function runForRole<T extends CoatingRunView>(run: T, role: string): T {
  if (role !== "tech") return run;
  const { priceCents: _hidden, ...rest } = run;
  return rest as T;
}

export type CoatingRunListStatus = "current" | "open" | "all";

/**
 * Coating runs with their vendor, parts and jobs. "open" is every run still at the coater, overdue
 * first; "current" adds runs back but not yet inspected and those back within the last 30 days.
 */
export async function listCoatingRuns(db: DB, filter: { status?: CoatingRunListStatus; runId?: number; limit?: number } = {}, now = new Date()): Promise<CoatingRunView[]> {
  const clock = await shopClock(db, now);
  const today = shopToday(clock);
  let query = db
    .selectFrom("coating_run as r")
    .innerJoin("vendor as v", "v.id", "r.vendor_id")
    .leftJoin("staff as s", "s.id", "r.inspected_by")
    .select([
      "r.id", "r.vendor_id", "v.name as vendor_name", "r.finish_colour", "r.finish_gloss", "r.sent_on", "r.promised_on", "r.received_on",
      "r.dft_readings_mils", "r.adhesion_ok", "r.defects", "r.inspected_at", "s.name as inspected_by_name", "r.price_cents",
    ]);
  const status = filter.status ?? "current";
  if (filter.runId !== undefined) query = query.where("r.id", "=", filter.runId);
  else if (status === "open") query = query.where("r.received_on", "is", null);
  else if (status === "current") {
    const since = formatCalendarDate(subDays(parseCalendarDate(today), 30));
    query = query.where((eb) => eb.or([eb("r.received_on", "is", null), eb("r.inspected_at", "is", null), eb("r.received_on", ">=", since)]));
  }
  const runs = await query.orderBy("r.id", "desc").limit(filter.limit ?? 500).execute();
  if (runs.length === 0) return [];
  const runParts = (ids: number[]) =>
    db
      .selectFrom("coating_run_part as c")
      .innerJoin("part as p", "p.id", "c.part_id")
      .innerJoin("job as j", "j.id", "p.job_id")
      .innerJoin("customer as cu", "cu.id", "j.customer_id")
      .innerJoin("truck as tr", "tr.id", "j.truck_id")
      .select(["c.run_id", "p.id", "p.name", "p.kind", "j.id as job_id", "j.work_order", "j.stage", "cu.name as customer_name", "tr.unit_number"])
      .where("c.run_id", "in", ids)
      .orderBy("j.work_order")
      .orderBy("p.id")
      .execute();
  const partRows: Awaited<ReturnType<typeof runParts>> = [];
  for (const ids of chunks(runs.map((r) => r.id))) partRows.push(...(await runParts(ids)));
  const views = runs.map((r): CoatingRunView => {
    const dates = { sentOn: r.sent_on, promisedOn: r.promised_on, receivedOn: r.received_on };
    return {
      id: r.id,
      vendorId: r.vendor_id,
      vendorName: r.vendor_name,
      finish: { colour: r.finish_colour, gloss: r.finish_gloss as CoatingFinish["gloss"] },
      sentOn: r.sent_on,
      promisedOn: r.promised_on,
      receivedOn: r.received_on,
      inspection: r.inspected_at
        ? {
            dftReadingsMils: parseJson<number[]>(r.dft_readings_mils, []),
            adhesionOk: r.adhesion_ok === 1,
            defects: r.defects ?? "",
            inspectedAt: r.inspected_at,
            inspectedByName: r.inspected_by_name,
          }
        : null,
      parts: partRows
        .filter((p) => p.run_id === r.id)
        .map((p) => ({ id: p.id, name: p.name, kind: p.kind, jobId: p.job_id, workOrder: p.work_order, jobStage: p.stage, customerName: p.customer_name, unitNumber: p.unit_number })),
      overdue: isOverdue(dates, clock),
      businessDaysOut: businessDaysOut(dates, clock),
      businessDaysOverdue: businessDaysOverdue(dates, clock),
      priceCents: r.price_cents,
    };
  });
  // Overdue first (longest overdue on top), then what is due soonest, then the runs already back.
  return views.sort((a, b) => {
    const rank = (run: CoatingRunView) => (run.receivedOn ? 2 : run.overdue ? 0 : 1);
    if (rank(a) !== rank(b)) return rank(a) - rank(b);
    if (rank(a) < 2) return a.promisedOn.localeCompare(b.promisedOn) || a.id - b.id;
    return (b.receivedOn ?? "").localeCompare(a.receivedOn ?? "") || b.id - a.id;
  });
}

export async function findCoatingRun(db: DB, id: number, now = new Date()): Promise<CoatingRunView | undefined> {
  return (await listCoatingRuns(db, { runId: id }, now))[0];
}

export interface CoatingCandidate {
  id: number;
  name: string;
  kind: PartKind;
  material: PartMaterial;
  jobId: number;
  workOrder: string;
  jobStage: Stage;
  customerName: string;
  unitNumber: string;
  needsLeakTest: boolean;
  leakPassed: boolean;
  /** The last run that carried it since its last rework (sending it again recoats it); null when not coated since. */
  lastRunId: number | null;
}

/** Parts marked for coating that are not out on a run, on jobs not yet delivered: what the send form offers. */
export async function coatingCandidates(db: DB): Promise<CoatingCandidate[]> {
  const rows = await db
    .selectFrom("part as p")
    .innerJoin("job as j", "j.id", "p.job_id")
    .innerJoin("customer as cu", "cu.id", "j.customer_id")
    .innerJoin("truck as tr", "tr.id", "j.truck_id")
    .select(["p.id", "p.name", "p.kind", "p.material", "p.needs_leak_test", "j.id as job_id", "j.work_order", "j.stage", "cu.name as customer_name", "tr.unit_number"])
    .where("p.needs_coating", "=", 1)
    .where("j.stage", "!=", "delivered")
    .where((eb) => eb.not(eb.exists(eb.selectFrom("coating_run_part as c").select("c.part_id").whereRef("c.part_id", "=", "p.id").where("c.open", "=", 1))))
    .orderBy("j.work_order")
    .orderBy("p.id")
    .execute();
  if (rows.length === 0) return [];
  const statuses = new Map((await partStatuses(db, { partIds: rows.map((r) => r.id) })).map((s) => [s.id, s]));
  const candidates = rows.map((r) => {
    const status = statuses.get(r.id)!;
    return {
      id: r.id,
      name: r.name,
      kind: r.kind,
      material: r.material,
      jobId: r.job_id,
      workOrder: r.work_order,
      jobStage: r.stage,
      customerName: r.customer_name,
      unitNumber: r.unit_number,
      needsLeakTest: r.needs_leak_test === 1,
      leakPassed: status.passed === 1,
      lastRunId: status.last_run_id,
    };
  });
  // Parts never sent come first; those already coated once are offered last, for a recoat.
  return candidates.sort((a, b) => Number(a.lastRunId !== null) - Number(b.lastRunId !== null));
}

export interface CoatingFlag {
  overdue: boolean;
  vendorName: string;
  promisedOn: string;
}

/**
 * For the board: each job with a part out on a coating run, with the run that matters most (an
 * overdue one first, else the one promised soonest). Jobs with nothing out are absent from the map.
 */
export async function coatingFlags(db: DB, jobIds: readonly number[], now = new Date()): Promise<Map<number, CoatingFlag>> {
  const flags = new Map<number, CoatingFlag>();
  if (jobIds.length === 0) return flags;
  const clock = await shopClock(db, now);
  for (const ids of chunks(jobIds)) {
    const rows = await db
      .selectFrom("coating_run_part as c")
      .innerJoin("part as p", "p.id", "c.part_id")
      .innerJoin("coating_run as r", "r.id", "c.run_id")
      .innerJoin("vendor as v", "v.id", "r.vendor_id")
      .select(["p.job_id", "r.sent_on", "r.promised_on", "v.name as vendor_name"])
      .where("c.open", "=", 1)
      .where("p.job_id", "in", ids)
      .orderBy("r.promised_on")
      .orderBy("r.id")
      .execute();
    for (const row of rows) {
      const overdue = isOverdue({ sentOn: row.sent_on, promisedOn: row.promised_on }, clock);
      const seen = flags.get(row.job_id);
      // Rows come soonest promise first, so the first overdue row is also the most overdue.
      if (!seen || (overdue && !seen.overdue)) flags.set(row.job_id, { overdue, vendorName: row.vendor_name, promisedOn: row.promised_on });
    }
  }
  return flags;
}

export interface SignOffView {
  fields: WiringSignOff;
  complete: boolean;
  missing: string[];
  signedBy: string | null;
  signedAt: string | null;
  signedByStaffName: string | null;
  updatedAt: string;
  updatedByName: string | null;
  /** Sent back with the next save as expectedVersion. */
  version: number;
}

const EMPTY_SIGN_OFF_FIELDS: WiringSignOff = { checks: {} };

export function signOffFields(text: string): WiringSignOff {
  const fields = parseJson<WiringSignOff>(text, EMPTY_SIGN_OFF_FIELDS);
  return { ...fields, checks: fields.checks ?? {} };
}

export async function findSignOff(db: DB, jobId: number): Promise<SignOffView | null> {
  const row = await db
    .selectFrom("sign_off as so")
    .leftJoin("staff as signer", "signer.id", "so.signed_by_staff_id")
    .leftJoin("staff as editor", "editor.id", "so.updated_by")
    .select(["so.fields", "so.complete", "so.signed_by", "so.signed_at", "signer.name as signer_name", "so.updated_at", "editor.name as editor_name", "so.version"])
    .where("so.job_id", "=", jobId)
    .executeTakeFirst();
  if (!row) return null;
  const fields = signOffFields(row.fields);
  return {
    fields,
    complete: row.complete === 1,
    missing: signOffMissing(fields),
    signedBy: row.signed_by,
    signedAt: row.signed_at,
    signedByStaffName: row.signer_name,
    updatedAt: row.updated_at,
    updatedByName: row.editor_name,
    version: row.version,
  };
}

/** Sign-offs of many jobs at once, for the gates. */
export async function signOffStates(db: DB, jobIds: readonly number[]): Promise<Map<number, { complete: boolean; missing: string[] }>> {
  const states = new Map<number, { complete: boolean; missing: string[] }>();
  for (const ids of chunks(jobIds)) {
    const rows = await db.selectFrom("sign_off").select(["job_id", "fields", "complete"]).where("job_id", "in", ids).execute();
    for (const row of rows) {
      const missing = signOffMissing(signOffFields(row.fields));
      // The stored flag was decided when it was saved; recomputing guards against a check added since.
      states.set(row.job_id, { complete: row.complete === 1 && missing.length === 0, missing });
    }
  }
  return states;
}
