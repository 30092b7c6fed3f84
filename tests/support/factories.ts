import { randomUUID } from "node:crypto";
import type { DB } from "@/db";
import type { JobScope, Role, Stage } from "@/db/schema";
import { hashPassword } from "@/server/auth/password";
import { withCheckDigit } from "@/server/vehicles/vin";

export const TEST_PASSWORD = "bench-test-password";
let counter = 0;
const next = () => ++counter;

let cachedHash: Promise<string> | undefined;

export async function makeStaff(db: DB, role: Role, overrides: Partial<{ name: string; email: string; active: number }> = {}) {
  cachedHash ??= hashPassword(TEST_PASSWORD);
  const n = next();
  const row = {
    id: randomUUID(),
    name: overrides.name ?? `${role[0].toUpperCase()}${role.slice(1)} Person ${n}`,
    email: overrides.email ?? `${role}${n}-${randomUUID().slice(0, 6)}@shop.example`,
    role,
    password_hash: await cachedHash,
    active: overrides.active ?? 1,
    created_at: new Date().toISOString(),
  };
  await db.insertInto("staff").values(row).execute();
  return row;
}

export async function ensureShop(db: DB) {
  await db.insertInto("shop").values({ id: 1, name: "Test Upfit", phone: "(555) 010-0000" }).onConflict((oc) => oc.column("id").doNothing()).execute();
}

export function testVin(n: number) {
  const digits = String(n).padStart(6, "0");
  return withCheckDigit(`1TS5T3X20RK${digits}`);
}

export async function makeCustomer(db: DB, name = `Customer ${next()}`) {
  return db.insertInto("customer").values({ kind: "company", name, phone: "", email: "", notes: "", created_at: new Date().toISOString() }).returning(["id", "name"]).executeTakeFirstOrThrow();
}

export async function makeTruck(db: DB, customerId: number) {
  const n = next();
  return db
    .insertInto("truck")
    .values({ customer_id: customerId, unit_number: `U-${n}`, vin: testVin(n + Math.floor(Math.random() * 900000)), year: 2024, description: "Tandem-axle day cab", transmission: "18-speed manual", work_engine_rpm: 1300, created_at: new Date().toISOString() })
    .returning(["id", "unit_number", "vin"])
    .executeTakeFirstOrThrow();
}

/**
 * A job for tests. A fabrication job comes with one plain part (a bracket that needs neither a
 * leak test nor coating), as a real one would, so the coating gate's "no parts recorded" rule
 * does not get in the way; pass `parts: false` for a job with none.
 */
export async function makeJob(db: DB, opts: { stage?: Stage; scope?: JobScope; position?: number; customerId?: number; truckId?: number; notes?: string; parts?: boolean } = {}) {
  const customerId = opts.customerId ?? (await makeCustomer(db)).id;
  const truckId = opts.truckId ?? (await makeTruck(db, customerId)).id;
  const stage = opts.stage ?? "queued";
  const position =
    opts.position ??
    Number((await db.selectFrom("job").select((eb) => eb.fn.countAll<number>().as("n")).where("stage", "=", stage).executeTakeFirstOrThrow()).n);
  const now = new Date().toISOString();
  const job = await db
    .insertInto("job")
    .values({ work_order: `WO-T-${next()}-${randomUUID().slice(0, 4)}`, customer_id: customerId, truck_id: truckId, scope: opts.scope ?? "fabrication", description: "Wet kit", stage, position, due_on: null, assigned_tech_id: null, priority: "normal", notes: opts.notes ?? "", version: 1, created_at: now, updated_at: now })
    .returning(["id", "version", "stage", "position", "work_order"])
    .executeTakeFirstOrThrow();
  if ((opts.scope ?? "fabrication") === "fabrication" && opts.parts !== false) {
    await db
      .insertInto("part")
      .values({ job_id: job.id, name: "Mounting bracket", kind: "bracket", material: "carbon_steel", needs_leak_test: 0, needs_coating: 0, created_at: now, updated_at: now } as never)
      .execute();
  }
  return job;
}
