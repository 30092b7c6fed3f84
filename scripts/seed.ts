import { createDb, databasePath } from "@/db";
import { seedDemo } from "@/db/seed";
import { migrateToLatest } from "@/migrations";

const db = createDb();
try {
  await migrateToLatest(db);
  await seedDemo(db);
  console.log(`Seeded the demo shop (Cold Creek Upfit) into ${databasePath()}.`);
} catch (err) {
  console.error(err instanceof Error ? err.message : err);
  process.exitCode = 1;
} finally {
  await db.destroy();
}
