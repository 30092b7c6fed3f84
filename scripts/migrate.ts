import { createDb, databasePath } from "@/db";
import { migrateToLatest } from "@/migrations";

const db = createDb();
try {
  const results = await migrateToLatest(db);
  const applied = results.filter((r) => r.status === "Success").map((r) => r.migrationName);
  console.log(applied.length ? `Migrated ${databasePath()}: ${applied.join(", ")}` : `Database ${databasePath()} is up to date.`);
} finally {
  await db.destroy();
}
