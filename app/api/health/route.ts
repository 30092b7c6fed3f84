import { sql } from "kysely";
import { getDb } from "@/db";
import { pendingMigrations } from "@/migrations";
import { json, respond } from "@/server/http/respond";

export const dynamic = "force-dynamic";

export async function GET() {
  return respond(async () => {
    const db = getDb();
    try {
      await sql`select 1`.execute(db);
      const pending = await pendingMigrations(db);
      if (pending.length) return json({ ok: false, database: "reachable", pendingMigrations: pending }, { status: 503 });
      return json({ ok: true, database: "migrated" });
    } catch {
      return json({ ok: false, database: "unreachable" }, { status: 503 });
    }
  });
}
