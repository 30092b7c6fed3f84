import { type Kysely, sql } from "kysely";

/*
 * The office's desk: the shop's own details (address, holidays, whether the status page shows the
 * predicted ready date) with a version for stale forms, and one search over everything.
 *
 * `desk_search` is a trigram full-text index (any three letters or more, anywhere in a word, case
 * ignored) over jobs (work order, work description), customers, contacts, trucks (unit number,
 * VIN, make and model), parts, coaters and photo captions. Its rowid says what a row is:
 * `id * 8 + kind` (kind numbers in server/search/kinds.ts), so a trigger can replace one row
 * without reading the index. Contentless: the answer is read back from the tables themselves.
 *
 * The Jobs list's own index (`job_search`, migration 0010) gains the work description.
 */
const KIND = { job: 0, customer: 1, contact: 2, truck: 3, part: 4, vendor: 5, photo: 6 } as const;

type Source = { table: string; kind: number; text: (row: string) => string; columns: string[] };

const SOURCES: Source[] = [
  { table: "job", kind: KIND.job, text: (r) => `${r}.work_order || ' ' || ${r}.description`, columns: ["work_order", "description"] },
  { table: "customer", kind: KIND.customer, text: (r) => `${r}.name`, columns: ["name"] },
  { table: "contact", kind: KIND.contact, text: (r) => `${r}.name`, columns: ["name"] },
  {
    table: "truck",
    kind: KIND.truck,
    text: (r) => `${r}.unit_number || ' ' || ${r}.vin || ' ' || ${r}.make || ' ' || ${r}.model || ' ' || ${r}.description`,
    columns: ["unit_number", "vin", "make", "model", "description"],
  },
  { table: "part", kind: KIND.part, text: (r) => `${r}.name`, columns: ["name"] },
  { table: "vendor", kind: KIND.vendor, text: (r) => `${r}.name`, columns: ["name"] },
  { table: "photo", kind: KIND.photo, text: (r) => `${r}.caption`, columns: ["caption"] },
];

const JOB_SEARCH_TRIGGERS = ["job_search_customer", "job_search_truck", "job_search_delete", "job_search_update", "job_search_insert"];

export async function up(db: Kysely<unknown>) {
  await sql`alter table shop add column address text not null default ''`.execute(db);
  await sql`alter table shop add column show_predicted_date integer not null default 0`.execute(db);
  await sql`alter table shop add column settings_version integer not null default 1`.execute(db);
  await sql`create table shop_holiday (day text primary key, name text not null default '')`.execute(db);
  // Reports read stage events by when they happened.
  await sql`create index stage_event_at on stage_event (at, job_id)`.execute(db);

  await sql`create virtual table desk_search using fts5(body, content='', contentless_delete=1, tokenize='trigram')`.execute(db);
  for (const s of SOURCES) {
    const rowid = (r: string) => `${r}.id * 8 + ${s.kind}`;
    await sql.raw(`insert into desk_search (rowid, body) select ${rowid(s.table)}, ${s.text(s.table)} from ${s.table}`).execute(db);
    await sql.raw(`create trigger desk_search_${s.table}_insert after insert on ${s.table} begin
      insert into desk_search (rowid, body) values (${rowid("new")}, ${s.text("new")});
    end`).execute(db);
    await sql.raw(`create trigger desk_search_${s.table}_update after update of ${s.columns.join(", ")} on ${s.table} begin
      delete from desk_search where rowid = ${rowid("old")};
      insert into desk_search (rowid, body) values (${rowid("new")}, ${s.text("new")});
    end`).execute(db);
    await sql.raw(`create trigger desk_search_${s.table}_delete after delete on ${s.table} begin
      delete from desk_search where rowid = ${rowid("old")};
    end`).execute(db);
  }

  await rebuildJobSearch(db, true);
}

/** The Jobs list's index, with the work description (`withDescription`) or as 0010 made it. */
async function rebuildJobSearch(db: Kysely<unknown>, withDescription: boolean) {
  for (const name of JOB_SEARCH_TRIGGERS) await sql.raw(`drop trigger if exists ${name}`).execute(db);
  await sql`drop table if exists job_search`.execute(db);
  const cols = withDescription ? "work_order, unit_number, customer_name, description" : "work_order, unit_number, customer_name";
  await sql.raw(`create virtual table job_search using fts5(${cols}, content='', contentless_delete=1, tokenize='trigram')`).execute(db);
  const row = (job: string) =>
    `select ${job}.id, ${job}.work_order, (select unit_number from truck where truck.id = ${job}.truck_id), (select name from customer where customer.id = ${job}.customer_id)${withDescription ? `, ${job}.description` : ""}`;
  await sql.raw(`insert into job_search (rowid, ${cols}) ${row("job")} from job`).execute(db);
  await sql.raw(`create trigger job_search_insert after insert on job begin
    insert into job_search (rowid, ${cols}) ${row("new")};
  end`).execute(db);
  await sql.raw(`create trigger job_search_update after update of work_order, truck_id, customer_id${withDescription ? ", description" : ""} on job begin
    delete from job_search where rowid = old.id;
    insert into job_search (rowid, ${cols}) ${row("new")};
  end`).execute(db);
  await sql.raw(`create trigger job_search_delete after delete on job begin
    delete from job_search where rowid = old.id;
  end`).execute(db);
  await sql.raw(`create trigger job_search_truck after update of unit_number on truck begin
    delete from job_search where rowid in (select id from job where truck_id = new.id);
    insert into job_search (rowid, ${cols}) ${row("job")} from job where job.truck_id = new.id;
  end`).execute(db);
  await sql.raw(`create trigger job_search_customer after update of name on customer begin
    delete from job_search where rowid in (select id from job where customer_id = new.id);
    insert into job_search (rowid, ${cols}) ${row("job")} from job where job.customer_id = new.id;
  end`).execute(db);
}

export async function down(db: Kysely<unknown>) {
  await rebuildJobSearch(db, false);
  for (const s of SOURCES) {
    for (const what of ["insert", "update", "delete"]) await sql.raw(`drop trigger if exists desk_search_${s.table}_${what}`).execute(db);
  }
  await sql`drop table if exists desk_search`.execute(db);
  await sql`drop index if exists stage_event_at`.execute(db);
  await sql`drop table if exists shop_holiday`.execute(db);
  await sql`alter table shop drop column settings_version`.execute(db);
  await sql`alter table shop drop column show_predicted_date`.execute(db);
  await sql`alter table shop drop column address`.execute(db);
}
