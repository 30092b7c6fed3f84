import "server-only";
import { sql } from "kysely";
import type { DB } from "@/db";
import type { JobScope, Stage } from "@/db/schema";
import { notifySettings } from "@/server/email/settings";
import { ApiError } from "@/server/http/errors";
import { predictJob } from "@/server/jobs/prediction-queries";
import { stageIndex } from "@/server/jobs/stages";
import { jobRoute } from "./route";
import { DEFAULT_STATUS_LINK_DAYS } from "@/server/email/schemas";
import { queueLinkOpened } from "./opened";
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

/**
 * The job of a working link, for the customer's own actions on it (approving a quote, paying, a
 * PDF): a turned-off or expired link says so, an unknown one is "not found", as on the page.
 */
export async function jobOfWorkingLink(db: DB, rawToken: string): Promise<number> {
  const link = await openStatusLink(db, rawToken);
  if (link.state === "revoked" || link.state === "expired") throw new ApiError("not_found", "This status link no longer works. Ask the shop for a new one.");
  if (link.state !== "active") throw new ApiError("not_found", "Not found.");
  return link.jobId;
}

/**
 * Notes that a working link was opened, at most once an hour per link, and never on the request:
 * the write is queued and made a moment later with any others (`server/status/opened.ts`).
 */
export function noteLinkOpened(db: DB, link: { linkId: number; lastOpenedAt: string | null }, now = new Date()) {
  queueLinkOpened(db, link, now);
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
  /** "Likely ready around …" from the shop's stage times, only when the shop shows it and there is enough history. */
  likelyReadyOn?: string | null;
  /** How long the link keeps working after pickup (the shop's setting). */
  linkDays: number;
  timeline: { fromStage: Stage | null; toStage: Stage; back: boolean; at: string }[];
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
    timeline: timelineOf(events),
    photos,
  };
}

type EventRow = { from_stage: Stage | null; to_stage: Stage; at: string };

// A reorder inside a column is the shop's business, not a step of the job.
function timelineOf(events: EventRow[]): StatusView["timeline"] {
  return events
    .filter((e) => e.from_stage !== e.to_stage)
    .map((e) => ({ fromStage: e.from_stage, toStage: e.to_stage, back: e.from_stage !== null && stageIndex(e.to_stage) < stageIndex(e.from_stage), at: e.at }));
}

export interface StatusPageRead {
  link: OpenedLink;
  view: StatusView | null;
  shop: StatusView["shop"];
}

/**
 * Everything the status page shows, in one statement: the link and whether it still works, the
 * job, the truck, the timeline, the customer's photos, the shop's contact and link setting. The
 * shop's row comes back even for an unknown token, for the "link not working" page.
 */
export async function readStatusPage(db: DB, rawToken: string, now = new Date()): Promise<StatusPageRead> {
  const tokenHash = looksLikeToken(rawToken) ? hashToken(rawToken) : null;
  const { rows } = await sql<{
    linkId: number | null; jobId: number | null; revokedAt: string | null; lastOpenedAt: string | null;
    stage: Stage | null; scope: JobScope | null; readyBy: string | null; workOrder: string | null; workDescription: string | null;
    unitNumber: string | null; year: number | null; description: string | null; vinTail: string | null;
    deliveredAt: string | null; events: string | null; photos: string | null; parts: string | null;
    shopName: string | null; shopPhone: string | null; shopTimeZone: string | null; linkDays: number | null; showPredicted: number | null;
  }>`select l.id as "linkId", l.job_id as "jobId", l.revoked_at as "revokedAt", l.last_opened_at as "lastOpenedAt",
      j.stage, j.scope, j.due_on as "readyBy", j.work_order as "workOrder", j.description as "workDescription", t.unit_number as "unitNumber", t.year, t.description, substr(t.vin, -6) as "vinTail",
      case when j.stage = 'delivered' then (select e.at from stage_event e where e.job_id = j.id and e.to_stage = 'delivered' order by e.id desc limit 1) end as "deliveredAt",
      case when j.id is not null then (select json_group_array(json_array(e.from_stage, e.to_stage, e.at) order by e.id) from stage_event e where e.job_id = j.id) end as events,
      case when j.id is not null then (select json_group_array(json_object('id', p.id, 'caption', p.caption, 'stage', p.stage, 'width', p.width, 'height', p.height) order by p.id)
        from photo p where p.job_id = j.id and p.customer_visible = 1) end as photos,
      case when j.id is not null then (select json_group_array(json_array(pt.needs_leak_test, pt.needs_coating)) from part pt where pt.job_id = j.id) end as parts,
      s.name as "shopName", s.phone as "shopPhone", s.time_zone as "shopTimeZone", s.show_predicted_date as "showPredicted", m.status_link_days as "linkDays"
    from (select 1) as one
    left join status_link l on l.token_hash = ${tokenHash}
    left join job j on j.id = l.job_id
    left join truck t on t.id = j.truck_id
    left join shop s on s.id = 1
    left join message_setting m on m.id = 1`.execute(db);
  const row = rows[0];
  const shop = { name: row.shopName ?? "The shop", phone: row.shopPhone ?? "", timeZone: row.shopTimeZone ?? "US/Central" };
  if (row.linkId === null || row.jobId === null || row.stage === null) return { link: { state: "unknown" }, view: null, shop };
  const linkDays = row.linkDays ?? DEFAULT_STATUS_LINK_DAYS;
  const state = linkState({ revoked_at: row.revokedAt }, { stage: row.stage, deliveredAt: row.deliveredAt }, linkDays, now);
  if (state !== "active") return { link: { state, linkId: row.linkId }, view: null, shop };
  const events = (JSON.parse(row.events ?? "[]") as [Stage | null, Stage, string][]).map(([from_stage, to_stage, at]) => ({ from_stage, to_stage, at }));
  const parts = (JSON.parse(row.parts ?? "[]") as [number, number][]).map(([leak, coat]) => ({ needsLeakTest: leak === 1, needsCoating: coat === 1 }));
  // The likely date is the shop's choice to show; without enough history the page says nothing more.
  const prediction = row.showPredicted === 1 && row.stage !== "ready" && row.stage !== "delivered" ? await predictJob(db, { id: row.jobId, stage: row.stage, scope: row.scope! }, now) : null;
  return {
    link: { state, linkId: row.linkId, jobId: row.jobId, lastOpenedAt: row.lastOpenedAt },
    shop,
    view: {
      shop,
      truck: { unitNumber: row.unitNumber ?? "", year: row.year ?? 0, description: row.description ?? "", vinTail: row.vinTail ?? "" },
      job: { workOrder: row.workOrder ?? "", description: row.workDescription ?? "" },
      stage: row.stage,
      route: jobRoute(row.scope!, parts),
      scope: row.scope!,
      readyBy: row.readyBy,
      likelyReadyOn: prediction?.kind === "estimate" ? prediction.likelyOn : null,
      linkDays,
      timeline: timelineOf(events),
      photos: JSON.parse(row.photos ?? "[]") as StatusView["photos"],
    },
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
