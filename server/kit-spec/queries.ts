import "server-only";
import type { DB } from "@/db";
import { demoKitCalcInput, type KitCalcInput, type KitSpec } from "@/server/kit-calc";
import type { KitSpecTank, SavedKitSpec } from "./schemas";

export type { KitSpecTank, SavedKitSpec };

/** The spec in force on a job (its highest version), or null when none was saved. */
export async function latestKitSpec(db: DB, jobId: number): Promise<SavedKitSpec | null> {
  const row = await db
    .selectFrom("kit_spec")
    .innerJoin("staff", "staff.id", "kit_spec.saved_by")
    .select(["kit_spec.version", "kit_spec.inputs", "kit_spec.results", "kit_spec.saved_by", "kit_spec.saved_at", "staff.name"])
    .where("kit_spec.job_id", "=", jobId)
    .orderBy("kit_spec.version", "desc")
    .limit(1)
    .executeTakeFirst();
  if (!row) return null;
  return {
    version: row.version,
    inputs: JSON.parse(row.inputs) as KitCalcInput,
    results: JSON.parse(row.results) as KitSpec,
    savedBy: { id: row.saved_by, name: row.name },
    savedAt: row.saved_at,
  };
}

/** The reservoir geometry of the job's latest kit spec, for a fabricated reservoir part to take. */
export async function latestKitSpecTank(db: DB, jobId: number): Promise<KitSpecTank | null> {
  const spec = await latestKitSpec(db, jobId);
  if (!spec) return null;
  return {
    specVersion: spec.version,
    tank: spec.inputs.tank,
    fillDepthIn: spec.inputs.fillDepthIn ?? null,
    sumpGal: spec.inputs.sumpGal ?? null,
  };
}

/** The job's saved versions, newest first, without their bulky inputs and results. */
export async function kitSpecHistory(db: DB, jobId: number) {
  return db
    .selectFrom("kit_spec")
    .innerJoin("staff", "staff.id", "kit_spec.saved_by")
    .select(["kit_spec.version", "kit_spec.saved_at as savedAt", "staff.name as savedByName"])
    .where("kit_spec.job_id", "=", jobId)
    .orderBy("kit_spec.version", "desc")
    .execute();
}

/**
 * Where the editor starts: the latest spec's inputs, or (none saved yet) the shop's usual kit at the
 * truck's recorded work engine speed.
 */
export async function kitSpecStartingInputs(db: DB, jobId: number): Promise<{ inputs: KitCalcInput; from: "spec" | "truck" | "shop_default" } | null> {
  const spec = await latestKitSpec(db, jobId);
  if (spec) return { inputs: spec.inputs, from: "spec" };
  const truck = await db
    .selectFrom("job")
    .innerJoin("truck", "truck.id", "job.truck_id")
    .select("truck.work_engine_rpm")
    .where("job.id", "=", jobId)
    .executeTakeFirst();
  if (!truck) return null;
  const rpm = truck.work_engine_rpm;
  return rpm
    ? { inputs: { ...demoKitCalcInput, engineRpm: rpm }, from: "truck" }
    : { inputs: demoKitCalcInput, from: "shop_default" };
}
