import { rmSync } from "node:fs";
import { createDb, databasePath } from "@/db";
import { migrateToLatest } from "@/migrations";

const path = databasePath();
for (const suffix of ["", "-wal", "-shm"]) rmSync(path + suffix, { force: true });
const db = createDb(path);
await migrateToLatest(db);
await db.destroy();
console.log(`Reset ${path}: empty and migrated. Run \`npm run db:seed\` for the demo shop.`);
