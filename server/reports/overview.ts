import "server-only";
import { sql } from "kysely";
import type { DB } from "@/db";
import type { Stage } from "@/db/schema";
import { BOARD_STAGES, STAGE_LABELS } from "@/server/jobs/stages";
import { partsWaitingCounts } from "@/server/parts/desk";
import { addCalendarDays, addWorkingDays, shopDateOf, workingDaysBetween } from "@/server/shop/business-days";
import { reportCalendar, techOpenJobs } from "./queries";

/** How many days ahead "due soon" looks, calendar days counted from today. */
export const DUE_SOON_DAYS = 7;
const LIST_LIMIT = 12;

export interface OverviewJob {
  id: number;
  workOrder: string;
  stage: Stage;
  stageLabel: string;
  customerName: string;
  unitNumber: string;
  dueOn: string;
  /** Business days the job has sat in its stage, from the day it entered it to today. */
  daysInStage: number | null;
  /** Business days past its due date (past due only). */
  daysLate: number;
}

/**
 * The office's morning page: what is on the board, what is late and where it is stuck, what is due
 * this week, coating runs out, e-mails that failed, and each tech's open jobs. Each figure comes
 * with the address of the list behind it (the page makes it a link).
 */
export async function loadOverview(db: DB, now = new Date()) {
  const cal = await reportCalendar(db, now);
  const { today, holidays, timeZone } = cal;
  const dueSoonUntil = addCalendarDays(today, DUE_SOON_DAYS);
  const nextWorkingDay = addWorkingDays(today, 1, holidays);

  // When each job entered the stage it is in: its newest event into that stage from another.
  const enteredStage = sql<string | null>`(select max(e.at) from stage_event e where e.job_id = job.id and e.to_stage = job.stage and (e.from_stage is null or e.from_stage != e.to_stage))`;
  const jobRows = (where: "late" | "soon") =>
    db
      .selectFrom("job")
      .innerJoin("customer", "customer.id", "job.customer_id")
      .innerJoin("truck", "truck.id", "job.truck_id")
      .select(["job.id", "job.work_order", "job.stage", "job.due_on", "customer.name as customer_name", "truck.unit_number", enteredStage.as("entered_at")])
      .where("job.stage", "in", BOARD_STAGES)
      .where("job.due_on", "is not", null)
      .$call((q) => (where === "late" ? q.where("job.due_on", "<", today) : q.where("job.due_on", ">=", today).where("job.due_on", "<=", dueSoonUntil)))
      .orderBy("job.due_on")
      .orderBy("job.id")
      .execute();

  const [stageRows, late, soon, runs, failed, techs, unassigned, parts] = await Promise.all([
    db.selectFrom("job").select(["stage", (eb) => eb.fn.countAll<number>().as("n")]).where("stage", "in", BOARD_STAGES).groupBy("stage").execute(),
    jobRows("late"),
    jobRows("soon"),
    db
      .selectFrom("coating_run")
      .select([
        (eb) => eb.fn.countAll<number>().as("out"),
        sql<number>`coalesce(sum(promised_on < ${today}), 0)`.as("overdue"),
        sql<number>`coalesce(sum(promised_on >= ${today} and promised_on <= ${nextWorkingDay}), 0)`.as("due_back"),
      ])
      .where("received_on", "is", null)
      .executeTakeFirstOrThrow(),
    db
      .selectFrom("outbox")
      .select([(eb) => eb.fn.countAll<number>().as("messages"), sql<number>`count(distinct job_id)`.as("jobs")])
      .where("status", "=", "failed")
      .where("replaced_at", "is", null)
      .executeTakeFirstOrThrow(),
    techOpenJobs(db),
    db.selectFrom("job").select((eb) => eb.fn.countAll<number>().as("n")).where("stage", "in", BOARD_STAGES).where("assigned_tech_id", "is", null).executeTakeFirstOrThrow(),
    partsWaitingCounts(db, today),
  ]);

  const counts = new Map(stageRows.map((r) => [r.stage, Number(r.n)]));
  const toJob = (r: (typeof late)[number]): OverviewJob => ({
    id: r.id,
    workOrder: r.work_order,
    stage: r.stage,
    stageLabel: STAGE_LABELS[r.stage],
    customerName: r.customer_name,
    unitNumber: r.unit_number,
    dueOn: r.due_on!,
    daysInStage: r.entered_at ? Math.max(0, workingDaysBetween(shopDateOf(r.entered_at, timeZone), today, holidays)) : null,
    daysLate: r.due_on! < today ? workingDaysBetween(r.due_on!, today, holidays) : 0,
  });

  return {
    today,
    dueSoonUntil,
    nextWorkingDay,
    stages: BOARD_STAGES.map((stage) => ({ stage, label: STAGE_LABELS[stage], jobs: counts.get(stage) ?? 0, href: `/jobs?stage=${stage}` })),
    onBoard: [...counts.values()].reduce((a, b) => a + b, 0),
    pastDue: { count: late.length, href: "/jobs?due=late&sort=due", jobs: late.map(toJob).slice(0, LIST_LIMIT) },
    dueSoon: { count: soon.length, href: "/jobs?due=soon&sort=due", jobs: soon.map(toJob).slice(0, LIST_LIMIT) },
    coating: {
      out: Number(runs.out),
      dueBack: Number(runs.due_back),
      overdue: Number(runs.overdue),
      href: "/coating#out",
    },
    emailsFailed: { messages: Number(failed.messages), jobs: Number(failed.jobs), href: "/jobs?email=failed" },
    techs: techs.map((t) => ({ ...t, href: `/board?tech=${encodeURIComponent(t.id)}` })),
    unassigned: { count: Number(unassigned.n), href: "/board?tech=none" },
    boughtParts: { ...parts, href: "/parts#to-order", overdueHref: "/parts#overdue" },
    // Quotes waiting on someone join here once the shop records them.
  };
}
export type Overview = Awaited<ReturnType<typeof loadOverview>>;
