import "server-only";
import type { DB } from "@/db";
import type { StaffUser } from "@/server/auth/session";
import { ApiError } from "@/server/http/errors";
import { computeKitSpec } from "@/server/kit-calc";
import { type SavedKitSpec, latestKitSpec } from "./queries";
import type { KitSpecSave } from "./schemas";

/**
 * Saves a new version of the job's kit spec. The results are computed here from the inputs: whatever a
 * client says the results are is never stored. A stale expectedVersion answers 409 with the spec in force.
 */
export async function saveKitSpec(db: DB, actor: StaffUser, jobId: number, save: KitSpecSave): Promise<SavedKitSpec> {
  // Pure and quick, so done before the transaction opens; it re-parses the inputs and so throws on bad ones.
  const results = computeKitSpec(save.inputs);
  const savedAt = new Date().toISOString();
  await db.transaction().execute(async (trx) => {
    const job = await trx.selectFrom("job").select("id").where("id", "=", jobId).executeTakeFirst();
    if (!job) throw new ApiError("not_found", "That job was not found.");
    const latest = await trx
      .selectFrom("kit_spec")
      .select("version")
      .where("job_id", "=", jobId)
      .orderBy("version", "desc")
      .limit(1)
      .executeTakeFirst();
    const current = latest?.version ?? 0;
    if (save.expectedVersion !== undefined && save.expectedVersion !== current) {
      throw new ApiError(
        "stale",
        current === 0
          ? "This job has no saved kit spec yet, so there is nothing of that version to change. Reload and save again."
          : `Someone saved version ${current} of this kit spec after you opened it. Here it is; check it and make your change again.`,
        { spec: await latestKitSpec(trx, jobId) },
      );
    }
    await trx
      .insertInto("kit_spec")
      .values({ job_id: jobId, version: current + 1, inputs: JSON.stringify(save.inputs), results: JSON.stringify(results), saved_by: actor.id, saved_at: savedAt })
      .execute();
  });
  return (await latestKitSpec(db, jobId))!;
}
