import { type Kysely, sql } from "kysely";

/*
 * A soap-only leak test is decided on the seams alone: the end pressure and the temperatures
 * belong to pressure decay, so such a test may be recorded without them, and then has no drop.
 * The four hold readings and the two drops become nullable in `leak_test`, with a check that only a
 * soap-only test leaves them out, and all together. SQLite cannot drop NOT NULL in place, so the
 * table is rebuilt from its own stored definition (copy, drop, rename), keeping row ids, the id
 * counter, indexes and triggers. Nothing references `leak_test`, so no other table moves with it.
 */

const READINGS = ["start_pressure_psig", "end_pressure_psig", "start_temp_f", "end_temp_f", "raw_drop_psi", "corrected_drop_psi"];
const CHECK_NAME = "leak_test_readings_by_method";
const CHECK = `constraint ${CHECK_NAME} check (${READINGS.map((c) => `"${c}" is not null`).join(" and ")} or (method = 'soap' and ${READINGS.map((c) => `"${c}" is null`).join(" and ")}))`;

type SchemaRow = { type: string; name: string; tbl_name: string; sql: string | null };
const quote = (name: string) => `"${name.replace(/"/g, '""')}"`;

function replaceOnce(text: string, pattern: RegExp, replacement: string, what: string) {
  const matches = text.match(new RegExp(pattern.source, `${pattern.flags.replace("g", "")}g`));
  if (!matches || matches.length !== 1) throw new Error(`Migration 0023 cannot rebuild leak_test: ${what} was found ${matches?.length ?? 0} times, expected once.`);
  return text.replace(pattern, replacement);
}

async function rebuildLeakTest(db: Kysely<unknown>, change: (definition: string) => string) {
  const rows = (await sql<SchemaRow>`select type, name, tbl_name, sql from sqlite_master`.execute(db)).rows;
  const table = rows.find((r) => r.type === "table" && r.name === "leak_test");
  if (!table?.sql) throw new Error("Migration 0023 cannot rebuild leak_test: the table is missing.");
  const referrers = await sql<{ name: string }>`
    select distinct m.name from sqlite_master m, pragma_foreign_key_list(m.name) f
    where m.type = 'table' and f."table" = 'leak_test' and m.name <> 'leak_test'
  `.execute(db);
  if (referrers.rows.length > 0) throw new Error(`Migration 0023 cannot rebuild leak_test: ${referrers.rows.map((r) => r.name).join(", ")} reference it.`);
  const dependents = rows.filter((r) => r.sql && r.tbl_name === "leak_test" && (r.type === "index" || r.type === "trigger"));
  for (const r of dependents.filter((d) => d.type === "trigger")) await sql.raw(`drop trigger ${quote(r.name)}`).execute(db);

  let definition = replaceOnce(table.sql, /^CREATE TABLE\s+(?:"[^"]+"|\w+)/i, `CREATE TABLE "leak_test_next"`, "the table name");
  definition = change(definition);
  await sql.raw(definition).execute(db);
  const columns = (await sql<{ name: string }>`select name from pragma_table_info('leak_test') order by cid`.execute(db)).rows.map((c) => quote(c.name)).join(", ");
  await sql.raw(`insert into "leak_test_next" (${columns}) select ${columns} from "leak_test"`).execute(db);
  // AUTOINCREMENT never hands out an id again, even one whose row was deleted: keep the counter.
  await sql`delete from sqlite_sequence where name = 'leak_test_next'`.execute(db);
  await sql`insert into sqlite_sequence (name, seq) select 'leak_test_next', seq from sqlite_sequence where name = 'leak_test'`.execute(db);
  await sql`drop table "leak_test"`.execute(db);
  await sql`alter table "leak_test_next" rename to "leak_test"`.execute(db);
  for (const r of dependents.filter((d) => d.type === "index")) await sql.raw(r.sql!).execute(db);
  for (const r of dependents.filter((d) => d.type === "trigger")) await sql.raw(r.sql!).execute(db);
  const broken = await sql<{ table: string }>`select "table" from pragma_foreign_key_check('leak_test')`.execute(db);
  if (broken.rows.length > 0) throw new Error(`Migration 0023 left ${broken.rows.length} broken references in leak_test.`);
}

export async function up(db: Kysely<unknown>) {
  await rebuildLeakTest(db, (definition) => {
    let next = definition;
    for (const column of READINGS) {
      next = replaceOnce(next, new RegExp(`("?${column}"?\\s+real)\\s+not\\s+null`, "i"), "$1", `${column} not null`);
    }
    return replaceOnce(next, /\)\s*$/, `, ${CHECK})`, "the end of the definition");
  });
}

export async function down(db: Kysely<unknown>) {
  // A soap-only test kept without readings has nothing to put back in them: refuse rather than invent.
  const bare = await sql<{ id: number }>`select id from leak_test where start_pressure_psig is null order by id limit 5`.execute(db);
  if (bare.rows.length > 0) {
    throw new Error(`Migration 0023 cannot go down while soap-only leak tests have no hold readings (ids ${bare.rows.map((r) => r.id).join(", ")}); delete or complete them first.`);
  }
  await rebuildLeakTest(db, (definition) => {
    let next = replaceOnce(definition, new RegExp(`,\\s*constraint\\s+${CHECK_NAME}\\s+check\\s*\\(.*\\)\\)\\s*$`, "is"), ")", "the readings check");
    for (const column of READINGS) {
      next = replaceOnce(next, new RegExp(`("?${column}"?\\s+real)(?=\\s*[,)])`, "i"), "$1 not null", `${column}`);
    }
    return next;
  });
}
