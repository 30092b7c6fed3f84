import "server-only";
import { sql } from "kysely";
import type { DB } from "@/db";
import type { JobScope, Stage } from "@/db/schema";
import { notifySettings } from "@/server/email/settings";
import { stageIndex } from "@/server/jobs/stages";
import { jobRoute } from "./route";
import { type LinkState, linkState } from "./rules";
import { hashToken, looksLikeToken } from "./tokens";

/*
 * The customer's side of the data. Every select here names the few columns a truck owner may
 * see; none of the staff queries is reused, so a column added for staff never leaks here.
 */

export type OpenedLink = { state: "unknown" } | { state: Exclude<LinkState, "active">; linkId: number } | { state: "active"; linkId: number; jobId: number; lastOpenedAt: string | null };

export async function deliveredAt(db: DB, jobId: number): Promise<string | null> {
  const row = await db
    .selectFrom("stage_event")
    .select("at")
    .where("job_id", "=", jobId)
    .where("to_stage", "=", "delivered")
    .orderBy("id", "desc")
    .limit(1)
    .executeTakeFirst();
  return row?.at ?? null;
}

export async function openStatusLink(db: DB, rawToken: string, now = new Date()): Promise<OpenedLink> {
  if (!looksLikeToken(rawToken)) return { state: "unknown" };
  const link = await db
    .selectFrom("status_link")
    .innerJoin("job", "job.id", "status_link.job_id")
    .select(["status_link.id", "status_link.job_id", "status_link.revoked_at", "status_link.last_opened_at", "job.stage"])
    .where("status_link.token_hash", "=", hashToken(rawToken))
    .executeTakeFirst();
  if (!link) return { state: "unknown" };
  const delivered = link.stage === "delivered" ? await deliveredAt(db, link.job_id) : null;
  const { statusLinkDays } = await notifySettings(db);
  const state = linkState(link, { stage: link.stage, deliveredAt: delivered }, statusLinkDays, now);
  if (state !== "active") return { state, linkId: link.id };
  return { state, linkId: link.id, jobId: link.job_id, lastOpenedAt: link.last_opened_at };
}

/** Kept coarse (once per ten minutes) so a page reload is a read, not a disk write. */
export async function noteLinkOpened(db: DB, link: { linkId: number; lastOpenedAt: string | null }, now = new Date()) {
  if (link.lastOpenedAt && now.getTime() - Date.parse(link.lastOpenedAt) < 10 * 60_000) return;
  await db.updateTable("status_link").set({ last_opened_at: now.toISOString() }).where("id", "=", link.linkId).execute();
}

export async function shopContact(db: DB) {
  const shop = await db.selectFrom("shop").select(["name", "phone", "time_zone as timeZone"]).where("id", "=", 1).executeTakeFirst();
  return shop ?? { name: "The shop", phone: "", timeZone: "US/Central" };
}

export interface StatusView {
  shop: { name: string; phone: string; timeZone: string };
  truck: { unitNumber: string; year: number; description: string; vinTail: string };
  /** The work order and the work description as the office wrote it: a unit with two open jobs reads as two jobs. */
  job: { workOrder: string; description: string };
  stage: Stage;
  /** The job's own route (server/status/route.ts), from its work and parts as they are now. */
  route: Stage[];
  scope: JobScope;
  readyBy: string | null;
  /** How long the link keeps working after pickup (the shop's setting). */
  linkDays: number;
  timeline: { toStage: Stage; back: boolean; at: string }[];
  photos: { id: number; caption: string; stage: Stage; width: number; height: number }[];
}

export async function statusView(db: DB, jobId: number): Promise<StatusView | null> {
  const job = await db
    .selectFrom("job")
    .innerJoin("truck", "truck.id", "job.truck_id")
    .select([
      "job.stage",
      "job.scope",
      "job.due_on as readyBy",
      "job.work_order as workOrder",
      "job.description as workDescription",
      "truck.unit_number as unitNumber",
      "truck.year",
      "truck.description",
      sql<string>`substr(truck.vin, -6)`.as("vinTail"),
    ])
    .where("job.id", "=", jobId)
    .executeTakeFirst();
  if (!job) return null;
  const [events, photos, shop, settings, parts] = await Promise.all([
    db.selectFrom("stage_event").select(["from_stage", "to_stage", "at"]).where("job_id", "=", jobId).orderBy("id").execute(),
    db
      .selectFrom("photo")
      .select(["id", "caption", "stage", "width", "height"])
      .where("job_id", "=", jobId)
      .where("customer_visible", "=", 1)
      .orderBy("id")
      .execute(),
    shopContact(db),
    notifySettings(db),
    db.selectFrom("part").select(["needs_leak_test", "needs_coating"]).where("job_id", "=", jobId).execute(),
  ]);
  return {
    shop,
    truck: { unitNumber: job.unitNumber, year: job.year, description: job.description, vinTail: job.vinTail },
    job: { workOrder: job.workOrder, description: job.workDescription },
    stage: job.stage,
    route: jobRoute(job.scope, parts.map((p) => ({ needsLeakTest: p.needs_leak_test === 1, needsCoating: p.needs_coating === 1 }))),
    scope: job.scope,
    readyBy: job.readyBy,
    linkDays: settings.statusLinkDays,
    // A reorder inside a column is the shop's business, not a step of the job.
    timeline: events
      .filter((e) => e.from_stage !== e.to_stage)
      .map((e) => ({ toStage: e.to_stage, back: e.from_stage !== null && stageIndex(e.to_stage) < stageIndex(e.from_stage), at: e.at })),
    photos,
  };
}

/** A photo the link may show: same job, marked for the customer. Anything else is "not found". */
export async function statusPhoto(db: DB, jobId: number, photoId: number) {
  return db
    .selectFrom("photo")
    .select(["id", "job_id", "upload_key"])
    .where("id", "=", photoId)
    .where("job_id", "=", jobId)
    .where("customer_visible", "=", 1)
    .executeTakeFirst();
}
