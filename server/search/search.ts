import "server-only";
import { sql } from "kysely";
import type { DB } from "@/db";
import { STAGE_LABELS } from "@/server/jobs/stages";

/**
 * One search over the shop (`desk_search`, migration 0011): a trigram index, so any three letters
 * or more match anywhere in a work order, work description, customer or contact name, unit number,
 * VIN (the last six as read off the door), make and model, part name, coater or photo caption.
 * The row id says what each hit is: `id * 8 + kind`.
 */
export const SEARCH_KINDS = ["job", "customer", "contact", "truck", "part", "vendor", "photo"] as const;
export type SearchKind = (typeof SEARCH_KINDS)[number];

/** Groups in the order the office looks for things; the label is the shop's word. */
const GROUPS: { kind: SearchKind; label: string }[] = [
  { kind: "job", label: "Jobs" },
  { kind: "truck", label: "Trucks" },
  { kind: "customer", label: "Customers" },
  { kind: "contact", label: "Contacts" },
  { kind: "part", label: "Parts" },
  { kind: "vendor", label: "Coaters" },
  { kind: "photo", label: "Photos" },
];

export const SEARCH_MIN_LETTERS = 3;
const PER_GROUP = 6;
/** A word found in more rows than this is counted only this far ("500+"). */
const COUNT_CAP = 5000;

export interface SearchHit {
  id: number;
  title: string;
  detail: string;
  href: string;
}

export interface SearchGroup {
  kind: SearchKind;
  label: string;
  /** How many matched in all (up to the cap); `hits` holds the newest few. */
  total: number;
  hits: SearchHit[];
}

export interface SearchAnswer {
  q: string;
  groups: SearchGroup[];
  /** Said when the search could not run as typed. */
  hint: string | null;
}

export async function searchShop(db: DB, raw: string): Promise<SearchAnswer> {
  const q = raw.trim().slice(0, 80);
  if ([...q].length < SEARCH_MIN_LETTERS) {
    return { q, groups: [], hint: q ? `Type at least ${SEARCH_MIN_LETTERS} letters or digits.` : null };
  }
  // The whole entry as one phrase (quotes doubled), so "35 gal" finds those letters together.
  const phrase = `"${q.replace(/"/g, '""')}"`;
  const rows = await sql<{ rowid: number }>`select rowid from desk_search where desk_search match ${phrase} order by rowid desc limit ${COUNT_CAP}`.execute(db);
  const ids = new Map<SearchKind, number[]>(SEARCH_KINDS.map((k) => [k, []]));
  const totals = new Map<SearchKind, number>(SEARCH_KINDS.map((k) => [k, 0]));
  for (const { rowid } of rows.rows) {
    const kind = SEARCH_KINDS[rowid % 8];
    if (!kind) continue;
    totals.set(kind, totals.get(kind)! + 1);
    const list = ids.get(kind)!;
    if (list.length < PER_GROUP) list.push(Math.floor(rowid / 8));
  }
  const hits = await Promise.all(GROUPS.map((g) => (ids.get(g.kind)!.length ? readHits(db, g.kind, ids.get(g.kind)!) : Promise.resolve([]))));
  const groups = GROUPS.map((g, i) => ({ ...g, total: totals.get(g.kind)!, hits: hits[i] })).filter((g) => g.hits.length > 0);
  return { q, groups, hint: null };
}

/** The rows behind the hits, newest first, with where each one lives. */
async function readHits(db: DB, kind: SearchKind, ids: number[]): Promise<SearchHit[]> {
  switch (kind) {
    case "job": {
      const rows = await db
        .selectFrom("job")
        .innerJoin("customer", "customer.id", "job.customer_id")
        .innerJoin("truck", "truck.id", "job.truck_id")
        .select(["job.id", "job.work_order", "job.description", "job.stage", "customer.name", "truck.unit_number"])
        .where("job.id", "in", ids)
        .orderBy("job.id", "desc")
        .execute();
      return rows.map((r) => ({ id: r.id, title: `${r.work_order} · ${r.description}`, detail: `${r.name} · Unit ${r.unit_number} · ${STAGE_LABELS[r.stage]}`, href: `/jobs/${r.id}` }));
    }
    case "truck": {
      const rows = await db
        .selectFrom("truck")
        .innerJoin("customer", "customer.id", "truck.customer_id")
        .select(["truck.id", "truck.unit_number", "truck.vin", "truck.year", "truck.make", "truck.model", "customer.name"])
        .where("truck.id", "in", ids)
        .orderBy("truck.id", "desc")
        .execute();
      return rows.map((r) => ({ id: r.id, title: `Unit ${r.unit_number} · VIN …${r.vin.slice(-6)}`, detail: [r.name, [r.year, r.make, r.model].filter(Boolean).join(" ")].filter(Boolean).join(" · "), href: `/trucks/${r.id}` }));
    }
    case "customer": {
      const rows = await db.selectFrom("customer").select(["id", "name", "phone"]).where("id", "in", ids).orderBy("id", "desc").execute();
      return rows.map((r) => ({ id: r.id, title: r.name, detail: r.phone || "Customer", href: `/customers/${r.id}` }));
    }
    case "contact": {
      const rows = await db
        .selectFrom("contact")
        .innerJoin("customer", "customer.id", "contact.customer_id")
        .select(["contact.id", "contact.name", "contact.customer_id", "customer.name as customer_name"])
        .where("contact.id", "in", ids)
        .orderBy("contact.id", "desc")
        .execute();
      return rows.map((r) => ({ id: r.id, title: r.name, detail: `Contact at ${r.customer_name}`, href: `/customers/${r.customer_id}` }));
    }
    case "part": {
      const rows = await db
        .selectFrom("part")
        .innerJoin("job", "job.id", "part.job_id")
        .select(["part.id", "part.name", "part.job_id", "job.work_order"])
        .where("part.id", "in", ids)
        .orderBy("part.id", "desc")
        .execute();
      return rows.map((r) => ({ id: r.id, title: r.name, detail: `Part on ${r.work_order}`, href: `/jobs/${r.job_id}` }));
    }
    case "vendor": {
      const rows = await db.selectFrom("vendor").select(["id", "name", "phone"]).where("id", "in", ids).orderBy("id", "desc").execute();
      return rows.map((r) => ({ id: r.id, title: r.name, detail: r.phone ? `Coater · ${r.phone}` : "Coater", href: "/coating#vendors" }));
    }
    case "photo": {
      const rows = await db
        .selectFrom("photo")
        .innerJoin("job", "job.id", "photo.job_id")
        .select(["photo.id", "photo.caption", "photo.job_id", "job.work_order"])
        .where("photo.id", "in", ids)
        .orderBy("photo.id", "desc")
        .execute();
      return rows.map((r) => ({ id: r.id, title: r.caption, detail: `Photo on ${r.work_order}`, href: `/jobs/${r.job_id}` }));
    }
  }
}
