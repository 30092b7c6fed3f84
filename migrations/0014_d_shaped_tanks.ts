import { type Kysely, sql } from "kysely";

/*
 * D-shaped tanks (a flat side against the frame rail, a half round outboard) become a part shape.
 * SQLite cannot change a check constraint in place, so `part` and `leak_test` are rebuilt: copy,
 * drop, rename. Migrations run in a transaction, where `PRAGMA foreign_keys` cannot be turned
 * off, and dropping `part` with foreign keys on deletes its rows first, cascading into every
 * table that references it (leak tests, coating run parts). So those tables are rebuilt with it,
 * pointing at the new `part`, and dropped before it. Each table is rebuilt from its own stored
 * definition, so columns, indexes and triggers added by any other migration come along.
 */

const ROUND_BOX_OTHER = ["round", "box", "other"];
const ROUND_BOX_D_OTHER = ["round", "box", "d", "other"];

/** A column's `check (column in (…))`, from one list of values to another; `map` rewrites values the new list lacks. */
type CheckChange = { column: string; from: string[]; to: string[]; map?: string };

type SchemaRow = { type: string; name: string; tbl_name: string; sql: string | null };

const quote = (name: string) => `"${name.replace(/"/g, '""')}"`;

async function schemaRows(db: Kysely<unknown>) {
  const rows = await sql<SchemaRow>`select type, name, tbl_name, sql from sqlite_master`.execute(db);
  return rows.rows;
}

/** Tables whose foreign keys name `parent`. */
async function referrers(db: Kysely<unknown>, parent: string) {
  const rows = await sql<{ name: string }>`
    select distinct m.name from sqlite_master m, pragma_foreign_key_list(m.name) f
    where m.type = 'table' and f."table" = ${parent} and m.name <> ${parent}
  `.execute(db);
  return rows.rows.map((r) => r.name);
}

function replaceOnce(text: string, pattern: RegExp, replacement: string, what: string) {
  const matches = text.match(new RegExp(pattern.source, `${pattern.flags.replace("g", "")}g`));
  if (!matches || matches.length !== 1) throw new Error(`Migration 0014 cannot rebuild: ${what} was found ${matches?.length ?? 0} times, expected once.`);
  return text.replace(pattern, replacement);
}

const escapeRegExp = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

/**
 * Rebuilds `part` and every table that references it, with the shape checks changed as given.
 * Row ids, AUTOINCREMENT counters, indexes and triggers are kept as they were.
 */
async function rebuildPartFamily(db: Kysely<unknown>, checks: Record<string, CheckChange[]>) {
  const children = await referrers(db, "part");
  for (const child of children) {
    const grandchildren = await referrers(db, child);
    if (grandchildren.length > 0) throw new Error(`Migration 0014 cannot rebuild ${child}: ${grandchildren.join(", ")} reference it.`);
  }
  const family = ["part", ...children];
  const next = (table: string) => `${table}_next`;
  const rows = await schemaRows(db);
  const mentions = new RegExp(`\\b(${family.map(escapeRegExp).join("|")})\\b`, "i");
  // Indexes of the family, and every trigger or view on or about it; recreated once the tables are back.
  const dependents = rows.filter(
    (r) => r.sql && ((r.type === "index" && family.includes(r.tbl_name)) || ((r.type === "trigger" || r.type === "view") && (family.includes(r.tbl_name) || mentions.test(r.sql)))),
  );

  for (const r of dependents.filter((d) => d.type !== "index")) {
    await sql.raw(`drop ${r.type} ${quote(r.name)}`).execute(db);
  }

  for (const table of family) {
    const row = rows.find((r) => r.type === "table" && r.name === table);
    if (!row?.sql) throw new Error(`Migration 0014 cannot rebuild: table ${table} is missing.`);
    let definition = replaceOnce(row.sql, /^CREATE TABLE\s+(?:"[^"]+"|\w+)/i, `CREATE TABLE ${quote(next(table))}`, `the name of ${table}`);
    if (table !== "part") {
      definition = definition.replace(/references\s+(?:"part"|part)\s*\(/gi, `references ${quote(next("part"))} (`);
    }
    for (const check of checks[table] ?? []) {
      const values = check.from.map((v) => `'${escapeRegExp(v)}'`).join("\\s*,\\s*");
      const pattern = new RegExp(`check\\s*\\(\\s*"?${check.column}"?\\s+in\\s*\\(\\s*${values}\\s*\\)\\s*\\)`, "i");
      const to = check.to.map((v) => `'${v}'`).join(", ");
      definition = replaceOnce(definition, pattern, `check (${check.column} in (${to}))`, `the check on ${table}.${check.column}`);
    }
    await sql.raw(definition).execute(db);

    const columns = await sql<{ name: string }>`select name from pragma_table_info(${table}) order by cid`.execute(db);
    const list = columns.rows.map((c) => quote(c.name)).join(", ");
    const source = columns.rows.map((c) => checks[table]?.find((k) => k.column === c.name && k.map)?.map ?? quote(c.name)).join(", ");
    await sql.raw(`insert into ${quote(next(table))} (${list}) select ${source} from ${quote(table)}`).execute(db);
    // AUTOINCREMENT never hands out an id again, even one whose row was deleted: keep the counter.
    await sql`delete from sqlite_sequence where name = ${next(table)}`.execute(db);
    await sql`insert into sqlite_sequence (name, seq) select ${next(table)}, seq from sqlite_sequence where name = ${table}`.execute(db);
  }

  // Children first: with nothing referencing it any more, dropping `part` cascades nowhere.
  for (const table of [...children, "part"]) await sql.raw(`drop table ${quote(table)}`).execute(db);
  // Renaming part_next also points the children's foreign keys at the new name.
  for (const table of ["part", ...children]) await sql.raw(`alter table ${quote(next(table))} rename to ${quote(table)}`).execute(db);

  for (const r of dependents.filter((d) => d.type === "index")) await sql.raw(r.sql!).execute(db);
  for (const r of dependents.filter((d) => d.type === "view")) await sql.raw(r.sql!).execute(db);
  for (const r of dependents.filter((d) => d.type === "trigger")) await sql.raw(r.sql!).execute(db);

  const broken = await sql<{ table: string }>`select "table" from pragma_foreign_key_check`.execute(db);
  if (broken.rows.length > 0) throw new Error(`Migration 0014 left ${broken.rows.length} broken references (first in ${broken.rows[0].table}).`);
}

export async function up(db: Kysely<unknown>) {
  await rebuildPartFamily(db, {
    part: [{ column: "shape", from: ROUND_BOX_OTHER, to: ROUND_BOX_D_OTHER }],
    leak_test: [{ column: "part_shape", from: ROUND_BOX_OTHER, to: ROUND_BOX_D_OTHER }],
  });
}

export async function down(db: Kysely<unknown>) {
  // A D-shaped part has no shape to go back to without losing what its geometry means: refuse.
  const d = await sql<{ name: string; work_order: string }>`
    select p.name, j.work_order from part p join job j on j.id = p.job_id where p.shape = 'd' order by p.id limit 5
  `.execute(db);
  if (d.rows.length > 0) {
    const named = d.rows.map((r) => `${r.name} (${r.work_order})`).join(", ");
    throw new Error(`Migration 0014 cannot go down while parts are D-shaped: change the shape of ${named} to box or other first.`);
  }
  await rebuildPartFamily(db, {
    part: [{ column: "shape", from: ROUND_BOX_D_OTHER, to: ROUND_BOX_OTHER }],
    // A D-shaped tank was tested as a flat-walled one, under the box tank's band and rules.
    leak_test: [{ column: "part_shape", from: ROUND_BOX_D_OTHER, to: ROUND_BOX_OTHER, map: "case part_shape when 'd' then 'box' else part_shape end" }],
  });
}
