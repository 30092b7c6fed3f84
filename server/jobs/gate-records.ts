import "server-only";
import type { DB } from "@/db";
import { type GateRecords, NO_RECORDS } from "./gates";

/**
 * The records each job's gates read, for many jobs at once (the board asks for hundreds).
 * Until parts, leak tests, coating runs and the sign-off are recorded, every job has none.
 */
export async function loadGateRecords(_db: DB, jobIds: readonly number[]): Promise<Map<number, GateRecords>> {
  return new Map(jobIds.map((id) => [id, NO_RECORDS]));
}
