import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll } from "vitest";
import { closeDb, getDb } from "@/db";
import { migrateToLatest } from "@/migrations";

/**
 * Gives the test file its own freshly migrated SQLite file; route handlers reach it through
 * DATABASE_PATH like the real server does.
 */
export function useFreshDatabase() {
  const dir = mkdtempSync(join(tmpdir(), "baywright-test-"));
  process.env.DATABASE_PATH = join(dir, "test.db");
  beforeAll(async () => {
    await migrateToLatest(getDb());
  });
  afterAll(async () => {
    await closeDb();
    rmSync(dir, { recursive: true, force: true });
  });
  return { db: () => getDb() };
}
