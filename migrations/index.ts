import { type Kysely, type Migration, type MigrationProvider, Migrator } from "kysely";
import * as m0001 from "./0001_staff_and_sessions";
import * as m0002 from "./0002_customers_trucks_jobs";
import * as m0003 from "./0003_records";
import * as m0004 from "./0004_kit_spec";
import * as m0005 from "./0005_photos_and_messages";
import * as m0006 from "./0006_email_quiet_period";
import * as m0007 from "./0007_procedure_accounts_trucks";
import * as m0009 from "./0009_audit_trail";
import * as m0010 from "./0010_indexes";
import * as m0011 from "./0011_desk";
import * as m0012 from "./0012_bought_parts_and_labour";
import * as m0013 from "./0013_money";
import * as m0014 from "./0014_d_shaped_tanks";
import * as m0014b from "./0014b_coating_run_price";
import * as m0015 from "./0015_payments";
import * as m0016 from "./0016_email_attachments";
import * as m0019 from "./0019_report_indexes";
import * as m0023 from "./0023_soap_test_readings";

/** Every migration, in order. Add new ones here: file providers do not work inside the bundle. */
export const migrations: Record<string, Migration> = {
  "0001_staff_and_sessions": m0001,
  "0002_customers_trucks_jobs": m0002,
  "0003_records": m0003,
  "0004_kit_spec": m0004,
  "0005_photos_and_messages": m0005,
  "0006_email_quiet_period": m0006,
  "0007_procedure_accounts_trucks": m0007,
  "0009_audit_trail": m0009,
  "0010_indexes": m0010,
  "0011_desk": m0011,
  "0012_bought_parts_and_labour": m0012,
  "0013_money": m0013,
  "0014_d_shaped_tanks": m0014,
  "0014b_coating_run_price": m0014b,
  "0015_payments": m0015,
  "0016_email_attachments": m0016,
  "0019_report_indexes": m0019,
  "0023_soap_test_readings": m0023,
};

const provider: MigrationProvider = { getMigrations: async () => migrations };

export function migrator(db: Kysely<any>) {
  // Areas of the app are numbered ahead of time and may land in any order; each runs once.
  return new Migrator({ db, provider, allowUnorderedMigrations: true });
}

export async function migrateToLatest(db: Kysely<any>) {
  const { error, results } = await migrator(db).migrateToLatest();
  if (error) throw error instanceof Error ? error : new Error(String(error));
  return results ?? [];
}

export async function pendingMigrations(db: Kysely<any>): Promise<string[]> {
  const all = await migrator(db).getMigrations();
  return all.filter((m) => !m.executedAt).map((m) => m.name);
}
