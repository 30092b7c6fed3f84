import "server-only";
import type { DB } from "@/db";

export const staffColumns = ["id", "name", "email", "role", "active", "created_at"] as const;

export function listStaff(db: DB) {
  return db.selectFrom("staff").select(staffColumns).orderBy("active", "desc").orderBy("name").execute();
}

export function findStaff(db: DB, id: string) {
  return db.selectFrom("staff").select(staffColumns).where("id", "=", id).executeTakeFirst();
}

export function findStaffForSignIn(db: DB, email: string) {
  return db.selectFrom("staff").select(["id", "name", "role", "password_hash", "active", "must_change_password"]).where("email", "=", email).executeTakeFirst();
}

export async function staffCount(db: DB) {
  const row = await db.selectFrom("staff").select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow();
  return Number(row.n);
}

/** The shop's active techs, for "Assigned to"; a job's current assignee stays in the list even if not a tech, so editing it keeps the choice. */
export function listTechs(db: DB, keepId?: string | null) {
  return db
    .selectFrom("staff")
    .select(["id", "name", "role"])
    .where("active", "=", 1)
    .where((eb) => (keepId ? eb.or([eb("role", "=", "tech"), eb("id", "=", keepId)]) : eb("role", "=", "tech")))
    .orderBy("name")
    .execute();
}
