import "server-only";
import { type Transaction, sql } from "kysely";
import type { DB } from "@/db";
import type { Database, JobScope, Stage } from "@/db/schema";
import type { StaffUser } from "@/server/auth/session";
import { type AuditActor, recordAudit } from "@/server/audit/record";
import { ApiError, notFound } from "@/server/http/errors";
import { evaluateLeakTest, type LeakTestOutcome } from "./leak-test";
import {
  type CoatingRunView,
  type LeakTestView,
  currentLeakResult,
  type PartView,
  type SignOffView,
  type VendorView,
  findCoatingRun,
  findPart,
  findSignOff,
  findVendor,
  listLeakTests,
  recordsSettings,
  signOffFields,
} from "./queries";
import {
  type CoatingRunInput,
  type CoatingRunPatch,
  type LeakTestRequest,
  type PartInput,
  type PartPatch,
  type SignOffSave,
  type VendorInput,
  type WiringSignOff,
  type LeakTestProcedurePatch,
  kindDefaults,
  partProblems,
  procedureProblems,
} from "./schemas";
import type { LeakTestProcedure } from "./procedure";
import { signOffMissing } from "./sign-off";
import { shopToday } from "./turnaround";

type Trx = Transaction<Database>;

function fieldErrors(fields: Record<string, string>, message?: string) {
  const names = Object.keys(fields);
  return new ApiError("validation", message ?? `Check ${names.slice(0, 4).join(", ")}: ${fields[names[0]]}`, {
    fields: Object.fromEntries(names.map((name) => [name, [fields[name]]])),
  });
}

async function todayIn(trx: Trx, now: Date) {
  const settings = await recordsSettings(trx);
  return { settings, today: shopToday({ now, timeZone: settings.timeZone }) };
}

async function assertJob(trx: Trx, jobId: number) {
  const job = await trx.selectFrom("job").select(["id", "stage", "scope"]).where("id", "=", jobId).executeTakeFirst();
  if (!job) throw notFound("That job");
  return job;
}

// An install-only job skips Pressure test and Outside coating, so a part that needs either could
// never be released: refuse it and send the user to the job's scope.
const INSTALL_ONLY = {
  needsLeakTest: "This job is install only: it has no fabricated parts to leak-test. Change the job's Work to fabricated parts first, or add the part without a leak test (a reservoir is always tested).",
  needsCoating: "This job is install only: it has no fabricated parts to send out for coating. Change the job's Work to fabricated parts first, or add the part without outside coating.",
} as const;

/** Who may take a part off the gates' lists or change its kind: those decide what the gates into coating and install ask for. */
const GATE_EDITORS: readonly StaffUser["role"][] = ["office", "owner"];

export async function createPart(db: DB, jobId: number, input: PartInput): Promise<PartView> {
  const id = await db.transaction().execute(async (trx) => {
    const job = await assertJob(trx, jobId);
    if (job.scope === "install_only") {
      const problems: Record<string, string> = {};
      if (input.needsLeakTest) problems.needsLeakTest = INSTALL_ONLY.needsLeakTest;
      if (input.needsCoating) problems.needsCoating = INSTALL_ONLY.needsCoating;
      if (Object.keys(problems).length) throw fieldErrors(problems);
    }
    const at = new Date().toISOString();
    const row = await trx
      .insertInto("part")
      .values({
        job_id: jobId, name: input.name, kind: input.kind, material: input.material, shape: input.shape,
        geometry: input.geometry ? JSON.stringify(input.geometry) : null, needs_leak_test: input.needsLeakTest ? 1 : 0,
        needs_coating: input.needsCoating ? 1 : 0, notes: input.notes, rework_count: 0, reworked_at: null, rework_note: "",
        created_at: at, updated_at: at,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    return row.id;
  });
  return (await findPart(db, id))!;
}

async function openRunOf(trx: Trx, partIds: readonly number[]) {
  if (partIds.length === 0) return new Map<number, { runId: number; vendorName: string }>();
  const rows = await trx
    .selectFrom("coating_run_part as c")
    .innerJoin("coating_run as r", "r.id", "c.run_id")
    .innerJoin("vendor as v", "v.id", "r.vendor_id")
    .select(["c.part_id", "c.run_id", "v.name"])
    .where("c.open", "=", 1)
    .where("c.part_id", "in", partIds)
    .execute();
  return new Map(rows.map((r) => [r.part_id, { runId: r.run_id, vendorName: r.name }]));
}

/**
 * Edits a part. `reworked: true` starts a new generation, so every earlier test and coating run of
 * the part stops counting. Any staff member edits names, notes and materials, adds a part to the
 * leak-test or coating list and marks rework; taking a part off either list or changing its kind
 * is for the office or owner, since that is how a gate could be stepped around.
 */
export async function patchPart(db: DB, actor: StaffUser, partId: number, patch: PartPatch): Promise<PartView> {
  await db.transaction().execute(async (trx) => {
    const part = await trx
      .selectFrom("part as p")
      .innerJoin("job as j", "j.id", "p.job_id")
      .selectAll("p")
      .select("j.scope")
      .where("p.id", "=", partId)
      .executeTakeFirst();
    if (!part) throw notFound("That part");
    // The record as it will be once the patch is applied: every rule below reads this, never the request alone.
    // A new kind brings its own defaults (kindDefaults): whatever the patch does not say is reset, not kept.
    const kindChanged = patch.kind !== undefined && patch.kind !== part.kind;
    const fresh = kindChanged ? kindDefaults(patch.kind!, part.shape) : null;
    const storedGeometry = part.geometry ? (JSON.parse(part.geometry) as PartPatch["geometry"]) : null;
    const merged = {
      kind: patch.kind ?? part.kind,
      shape: patch.shape ?? (patch.geometry ? patch.geometry.shape : (fresh?.shape ?? part.shape)),
      geometry: patch.geometry !== undefined ? patch.geometry : fresh && !fresh.keepsGeometry ? null : storedGeometry,
      needsLeakTest: patch.needsLeakTest ?? fresh?.needsLeakTest ?? part.needs_leak_test === 1,
      needsCoating: patch.needsCoating ?? part.needs_coating === 1,
    };
    if (!GATE_EDITORS.includes(actor.role)) {
      const refused: string[] = [];
      if (merged.kind !== part.kind) refused.push("change a part's kind");
      if (part.needs_leak_test === 1 && !merged.needsLeakTest) refused.push("take a part off the leak-test list");
      if (part.needs_coating === 1 && !merged.needsCoating) refused.push("take a part off the coating list");
      if (refused.length) {
        throw new ApiError(
          "forbidden",
          `Only the office or the owner can ${refused.join(" or ")}: that decides what a job needs before it can move to Outside coating and Install. Ask them, or mark the part reworked.`,
        );
      }
    }
    const problems = Object.fromEntries(partProblems({ ...merged, geometry: merged.geometry ?? null }).map((p) => [p.path, p.message]));
    if (part.scope === "install_only") {
      if (merged.needsLeakTest && part.needs_leak_test !== 1) problems.needsLeakTest ??= INSTALL_ONLY.needsLeakTest;
      if (merged.needsCoating && part.needs_coating !== 1) problems.needsCoating ??= INSTALL_ONLY.needsCoating;
    }
    if (!merged.needsCoating && part.needs_coating === 1) {
      const out = (await openRunOf(trx, [partId])).get(partId);
      if (out) problems.needsCoating = `The part is out on coating run ${out.runId} with ${out.vendorName}; mark that run received first.`;
    }
    if (Object.keys(problems).length) throw fieldErrors(problems);
    const at = new Date().toISOString();
    await trx
      .updateTable("part")
      .set({
        ...(patch.name !== undefined ? { name: patch.name } : {}),
        ...(patch.material !== undefined ? { material: patch.material } : {}),
        ...(patch.notes !== undefined ? { notes: patch.notes } : {}),
        kind: merged.kind,
        shape: merged.shape,
        geometry: merged.geometry ? JSON.stringify(merged.geometry) : null,
        needs_leak_test: merged.needsLeakTest ? 1 : 0,
        needs_coating: merged.needsCoating ? 1 : 0,
        ...(patch.reworked
          ? { rework_count: part.rework_count + 1, reworked_at: at, rework_note: patch.reworkNote ?? "" }
          : patch.reworkNote !== undefined
            ? { rework_note: patch.reworkNote }
            : {}),
        updated_at: at,
      })
      .where("id", "=", partId)
      .execute();
  });
  return (await findPart(db, partId))!;
}

/**
 * A part added by mistake can go while nothing is recorded against it; tests and runs are kept for
 * good. Only the office or owner removes a part: a missing part is a gate that no longer asks.
 */
export async function deletePart(db: DB, actor: StaffUser, partId: number): Promise<void> {
  if (!GATE_EDITORS.includes(actor.role)) {
    throw new ApiError("forbidden", "Only the office or the owner can remove a part from a job. Ask them, or mark the part reworked if it was remade.");
  }
  await db.transaction().execute(async (trx) => {
    const part = await trx.selectFrom("part").innerJoin("job", "job.id", "part.job_id").select(["part.id", "part.name", "part.job_id", "job.work_order"]).where("part.id", "=", partId).executeTakeFirst();
    if (!part) throw notFound("That part");
    const test = await trx.selectFrom("leak_test").select("id").where("part_id", "=", partId).limit(1).executeTakeFirst();
    const run = await trx.selectFrom("coating_run_part").select("run_id").where("part_id", "=", partId).limit(1).executeTakeFirst();
    if (test || run) {
      throw new ApiError("conflict", "This part has a leak test or coating run on record, and records are kept. Edit the part instead.");
    }
    await trx.deleteFrom("part").where("id", "=", partId).execute();
    await recordAudit(trx, { kind: "part_deleted", actor, subject: `work order ${part.work_order}`, summary: `${actor.name} deleted the part "${part.name}" from work order ${part.work_order}.`, details: { partId, jobId: part.job_id, name: part.name } });
  });
}

export interface LeakTestAnswer extends Pick<LeakTestOutcome, "correctedDropPsi" | "result" | "warnings" | "invalidReasons" | "thermometerPsiPerF" | "thermometerCaution"> {
  test: LeakTestView;
  /**
   * The job as it stood when the test was saved: a page opened earlier may hold an older stage or
   * version, and the offer to send the job back to Fabricate must act on the current one.
   */
  job: { id: number; workOrder: string; stage: Stage; scope: JobScope; version: number };
}

/**
 * Records a leak test: the drop is corrected for temperature and decided against the shop's
 * allowance; a test outside the shop's procedure is kept as invalid and counts for nothing.
 */
export async function recordLeakTest(db: DB, actor: StaffUser, partId: number, input: LeakTestRequest, now = new Date()): Promise<LeakTestAnswer> {
  const { testId, outcome, job } = await db.transaction().execute(async (trx) => {
    const part = await trx
      .selectFrom("part as p")
      .innerJoin("job as j", "j.id", "p.job_id")
      .select(["p.id", "p.job_id", "p.shape", "p.rework_count", "j.work_order", "j.stage", "j.scope", "j.version"])
      .where("p.id", "=", partId)
      .executeTakeFirst();
    if (!part) throw notFound("That part");
    if (input.jobId !== undefined && input.jobId !== part.job_id) {
      throw fieldErrors({ jobId: `This part belongs to work order ${part.work_order}, not the job the form was opened from; reload the job page.` });
    }
    const { settings, today } = await todayIn(trx, now);
    const { jobId: _jobId, ...test } = input;
    const outcome = evaluateLeakTest(test, { partShape: part.shape, allowedDropPsi: settings.allowedDropPsi, today, procedure: settings.procedure });
    const row = await trx
      .insertInto("leak_test")
      .values({
        part_id: partId, rework_count: part.rework_count, method: test.method, part_shape: part.shape,
        test_pressure_psig: test.testPressurePsig, gauge_full_scale_psi: test.gaugeFullScalePsi, gauge_calibrated_on: test.gaugeCalibratedOn,
        hold_minutes: test.holdMinutes, start_pressure_psig: test.startPressurePsig ?? null, end_pressure_psig: test.endPressurePsig ?? null,
        start_temp_f: test.startTempF ?? null, end_temp_f: test.endTempF ?? null, barometric_psia: test.barometricPsia, seams: JSON.stringify(test.seams),
        tester: test.tester, raw_drop_psi: outcome.rawDropPsi, corrected_drop_psi: outcome.correctedDropPsi,
        allowed_drop_psi: settings.allowedDropPsi, result: outcome.result, warnings: JSON.stringify(outcome.warnings),
        invalid_reasons: JSON.stringify(outcome.invalidReasons),
        recorded_by: actor.id, tested_at: now.toISOString(),
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    const job = { id: part.job_id, workOrder: part.work_order, stage: part.stage, scope: part.scope, version: part.version };
    return { testId: row.id, outcome, job };
  });
  const [test] = await listLeakTests(db, { testId });
  return {
    correctedDropPsi: outcome.correctedDropPsi,
    result: outcome.result,
    warnings: outcome.warnings,
    invalidReasons: outcome.invalidReasons,
    thermometerPsiPerF: outcome.thermometerPsiPerF,
    thermometerCaution: outcome.thermometerCaution,
    test,
    job,
  };
}

export async function createVendor(db: DB, input: VendorInput): Promise<VendorView> {
  const id = await db.transaction().execute(async (trx) => {
    const same = await trx.selectFrom("vendor").select("id").where(sql<boolean>`name = ${input.name} collate nocase`).executeTakeFirst();
    if (same) {
      const message = `A coater named “${input.name}” is already on the list.`;
      throw new ApiError("conflict", message, { fields: { name: [message] } });
    }
    const row = await trx
      .insertInto("vendor")
      .values({
        name: input.name, contact: input.contact, phone: input.phone, email: input.email,
        usual_turnaround_days: input.usualTurnaroundDays, notes: input.notes, created_at: new Date().toISOString(),
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    return row.id;
  });
  return (await findVendor(db, id))!;
}

const TEST_FIRST = "has no passing leak test since its last rework; a tank is tested before it is coated.";
const TEST_NONE = "has no passing leak test yet; a tank is tested before it is coated.";
const TEST_FAILED = "failed its last leak test; rework it and record a passing test before it is coated.";
const TEST_INVALID = "has an invalid last leak test (outside the shop's procedure); test it again before it is coated.";

/** Sends parts out on a coating run. Every part is checked; each refusal names its place in the list. */
export async function createCoatingRun(db: DB, actor: StaffUser, input: Omit<CoatingRunInput, "moveJobIds"> & { moveJobIds?: number[] }, now = new Date()): Promise<CoatingRunView> {
  const id = await db.transaction().execute(async (trx) => {
    const { today } = await todayIn(trx, now);
    const problems: Record<string, string> = {};
    if (input.sentOn > today) problems.sentOn = `The sent date cannot be after today (${today}).`;
    if (input.receivedOn && input.receivedOn > today) problems.receivedOn = `The received date cannot be after today (${today}).`;
    const vendor = await trx.selectFrom("vendor").select("id").where("id", "=", input.vendorId).executeTakeFirst();
    if (!vendor) problems.vendorId = "That coater is not on the list of coaters; choose one from the list.";

    const parts = await trx
      .selectFrom("part as p")
      .innerJoin("job as j", "j.id", "p.job_id")
      .select([
        "p.id", "p.name", "p.needs_coating", "p.needs_leak_test", "p.rework_count", "j.id as job_id", "j.work_order", "j.stage",
        currentLeakResult.as("last_result"),
      ])
      .where("p.id", "in", input.partIds)
      .execute();
    const byId = new Map(parts.map((p) => [p.id, p]));
    const out = await openRunOf(trx, input.partIds);
    input.partIds.forEach((partId, index) => {
      const part = byId.get(partId);
      const field = `partIds.${index}`;
      if (!part) problems[field] = `Part ${partId} is not on file.`;
      else if (part.stage === "delivered") problems[field] = `${part.name} (${part.work_order}) is on a delivered job.`;
      else if (part.needs_coating !== 1) problems[field] = `${part.name} (${part.work_order}) is not marked for outside coating.`;
      else if (out.has(partId)) problems[field] = `${part.name} (${part.work_order}) is already out on coating run ${out.get(partId)!.runId} with ${out.get(partId)!.vendorName}.`;
      else if (part.needs_leak_test === 1 && part.last_result !== "pass") {
        problems[field] = `${part.name} (${part.work_order}) ${part.last_result === "fail" ? TEST_FAILED : part.last_result === "invalid" ? TEST_INVALID : part.rework_count > 0 ? TEST_FIRST : TEST_NONE}`;
      }
    });
    const jobsOnRun = new Set(parts.map((p) => p.job_id));
    (input.moveJobIds ?? []).forEach((jobId, index) => {
      if (!jobsOnRun.has(jobId)) problems[`moveJobIds.${index}`] = "That job has no part on this run, so it does not move with it.";
    });
    if (Object.keys(problems).length) throw fieldErrors(problems);

    const at = now.toISOString();
    const run = await trx
      .insertInto("coating_run")
      .values({
        vendor_id: input.vendorId, finish_colour: input.finish.colour, finish_gloss: input.finish.gloss, sent_on: input.sentOn,
        promised_on: input.promisedOn, received_on: input.receivedOn ?? null, dft_readings_mils: null, adhesion_ok: null, defects: null,
        inspected_at: null, inspected_by: null, created_by: actor.id, created_at: at, updated_at: at, price_cents: input.priceCents ?? null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await trx
      .insertInto("coating_run_part")
      .values(input.partIds.map((partId) => ({ run_id: run.id, part_id: partId, open: input.receivedOn ? 0 : 1, rework_count: byId.get(partId)!.rework_count })))
      .execute();
    return run.id;
  });
  return (await findCoatingRun(db, id, now))!;
}

/**
 * Marks a run received, moves its promise, or records the receiving inspection. Receiving closes
 * the run for its parts; a received date can be corrected but not taken back.
 */
export async function patchCoatingRun(db: DB, actor: StaffUser, runId: number, patch: CoatingRunPatch, now = new Date()): Promise<CoatingRunView> {
  if (patch.promisedOn !== undefined && actor.role === "tech") {
    throw new ApiError("forbidden", "The office keeps the coater's promised date; a tech can mark a run received and record its inspection.");
  }
  if (patch.priceCents !== undefined && actor.role === "tech") {
    throw new ApiError("forbidden", "The office records what the coater charged; a tech can mark a run received and record its inspection.");
  }
  await db.transaction().execute(async (trx) => {
    const run = await trx.selectFrom("coating_run").select(["id", "sent_on", "received_on"]).where("id", "=", runId).executeTakeFirst();
    if (!run) throw notFound("That coating run");
    const { today } = await todayIn(trx, now);
    const problems: Record<string, string> = {};
    if (patch.receivedOn !== undefined) {
      if (patch.receivedOn < run.sent_on) problems.receivedOn = `The received date cannot be before the sent date (${run.sent_on}).`;
      else if (patch.receivedOn > today) problems.receivedOn = `The received date cannot be after today (${today}).`;
    }
    if (patch.promisedOn !== undefined && patch.promisedOn < run.sent_on) {
      problems.promisedOn = `The promised date cannot be before the sent date (${run.sent_on}).`;
    }
    if (patch.inspection && !(patch.receivedOn ?? run.received_on)) {
      problems.inspection = "Mark the run received before recording its receiving inspection.";
    }
    if (patch.moveJobIds?.length) {
      const onRun = await trx
        .selectFrom("coating_run_part as c")
        .innerJoin("part as p", "p.id", "c.part_id")
        .select("p.job_id")
        .where("c.run_id", "=", runId)
        .execute();
      const jobsOnRun = new Set(onRun.map((r) => r.job_id));
      patch.moveJobIds.forEach((jobId, index) => {
        if (!jobsOnRun.has(jobId)) problems[`moveJobIds.${index}`] = "That job has no part on this run, so it does not move with it.";
      });
    }
    if (Object.keys(problems).length) throw fieldErrors(problems);

    const at = now.toISOString();
    await trx
      .updateTable("coating_run")
      .set({
        ...(patch.receivedOn !== undefined ? { received_on: patch.receivedOn } : {}),
        ...(patch.promisedOn !== undefined ? { promised_on: patch.promisedOn } : {}),
        ...(patch.priceCents !== undefined ? { price_cents: patch.priceCents } : {}),
        ...(patch.inspection
          ? {
              dft_readings_mils: JSON.stringify(patch.inspection.dftReadingsMils),
              adhesion_ok: patch.inspection.adhesionOk ? 1 : 0,
              defects: patch.inspection.defects,
              inspected_at: at,
              inspected_by: actor.id,
            }
          : {}),
        updated_at: at,
      })
      .where("id", "=", runId)
      .execute();
    if (patch.receivedOn !== undefined) await trx.updateTable("coating_run_part").set({ open: 0 }).where("run_id", "=", runId).execute();
  });
  return (await findCoatingRun(db, runId, now))!;
}

/**
 * Saves the wiring & run-test sign-off, complete or not. It is complete when nothing is missing;
 * then the staff member who saved it and the time are kept with the signed name. Saving the same
 * complete record again keeps the first signature. The save must name the version it edited: a
 * stale one answers 409 with the sign-off as it now stands.
 */
export async function saveSignOff(db: DB, actor: StaffUser, jobId: number, input: SignOffSave, now = new Date()): Promise<SignOffView> {
  await db.transaction().execute(async (trx) => {
    await assertJob(trx, jobId);
    const { expectedVersion, ...entered } = input;
    const fields: WiringSignOff = { ...entered, signedBy: entered.signedBy?.trim() || null };
    const text = JSON.stringify(fields);
    const complete = signOffMissing(fields).length === 0;
    const existing = await trx
      .selectFrom("sign_off")
      .select(["fields", "complete", "signed_at", "signed_by_staff_id", "version"])
      .where("job_id", "=", jobId)
      .executeTakeFirst();
    const current = existing?.version ?? 0;
    if (expectedVersion !== current) {
      throw new ApiError(
        "stale",
        current === 0
          ? "No sign-off has been saved for this job yet, so there is no such version to change. Reload the page and save again."
          : "Someone saved this sign-off after you opened it. The form now shows what is saved; check it and make your change again.",
        { signOff: await findSignOff(trx, jobId) },
      );
    }
    const at = now.toISOString();
    const unchanged = existing?.complete === 1 && JSON.stringify(signOffFields(existing.fields)) === text;
    const signature = complete
      ? {
          signed_by: fields.signedBy!,
          signed_at: unchanged ? existing!.signed_at : at,
          signed_by_staff_id: unchanged ? existing!.signed_by_staff_id : actor.id,
        }
      : { signed_by: null, signed_at: null, signed_by_staff_id: null };
    const values = { fields: text, complete: complete ? 1 : 0, ...signature, updated_by: actor.id, updated_at: at, version: current + 1 };
    if (existing) await trx.updateTable("sign_off").set(values).where("job_id", "=", jobId).where("version", "=", current).execute();
    else await trx.insertInto("sign_off").values({ job_id: jobId, created_at: at, ...values }).execute();
  });
  return (await findSignOff(db, jobId))!;
}

export async function updateLeakAllowance(db: DB, actor: AuditActor, allowedDropPsi: number): Promise<void> {
  await db.transaction().execute(async (trx) => {
    const shop = await trx.selectFrom("shop").select("id").where("id", "=", 1).executeTakeFirst();
    if (!shop) await trx.insertInto("shop").values({ id: 1, name: "Your shop" }).execute();
    const before = (await sql<{ drop: number | null }>`select leak_allowed_drop_psi as "drop" from shop where id = 1`.execute(trx)).rows[0]?.drop ?? null;
    // The column is this area's own addition to the shop table (migration 0003), so it is written by name.
    await sql`update shop set leak_allowed_drop_psi = ${allowedDropPsi} where id = 1`.execute(trx);
    if (before !== allowedDropPsi) {
      await recordAudit(trx, {
        kind: "settings_changed",
        actor,
        subject: "Allowed leak-test drop",
        summary: `${actor.name} changed the allowed leak-test drop from ${before ?? "the default"} psi to ${allowedDropPsi} psi.`,
        details: { leakAllowedDropPsi: [before, allowedDropPsi] },
      });
    }
  });
}

const PROCEDURE_WORDS: Record<keyof LeakTestProcedure, string> = {
  minHoldMinutes: "shortest hold (min)",
  gaugeRatioMin: "lowest gauge ratio (×)",
  gaugeRatioMax: "highest gauge ratio (×)",
  roundMinPsig: "round tank lowest test pressure (psig)",
  roundMaxPsig: "round tank highest test pressure (psig)",
  boxMinPsig: "box tank lowest test pressure (psig)",
  boxMaxPsig: "box tank highest test pressure (psig)",
  calibrationMonths: "oldest gauge calibration (months)",
};

/** The owner's change to the leak-test procedure. Tests already recorded keep the decision they were saved with. */
export async function updateLeakTestProcedure(db: DB, actor: AuditActor, patch: LeakTestProcedurePatch): Promise<LeakTestProcedure> {
  return db.transaction().execute(async (trx) => {
    const shop = await trx.selectFrom("shop").select("id").where("id", "=", 1).executeTakeFirst();
    if (!shop) await trx.insertInto("shop").values({ id: 1, name: "Your shop" }).execute();
    const before = (await recordsSettings(trx)).procedure;
    const merged = { ...before, ...patch };
    const problems = procedureProblems(merged);
    if (Object.keys(problems).length) throw fieldErrors(problems);
    await trx
      .updateTable("shop")
      .set({
        leak_min_hold_minutes: merged.minHoldMinutes,
        leak_gauge_ratio_min: merged.gaugeRatioMin,
        leak_gauge_ratio_max: merged.gaugeRatioMax,
        leak_round_min_psig: merged.roundMinPsig,
        leak_round_max_psig: merged.roundMaxPsig,
        leak_box_min_psig: merged.boxMinPsig,
        leak_box_max_psig: merged.boxMaxPsig,
        leak_calibration_months: merged.calibrationMonths,
      })
      .where("id", "=", 1)
      .execute();
    const changed = (Object.keys(merged) as (keyof LeakTestProcedure)[]).filter((key) => merged[key] !== before[key]);
    if (changed.length) {
      await recordAudit(trx, {
        kind: "settings_changed",
        actor,
        subject: "Leak-test procedure",
        summary: `${actor.name} changed the leak-test procedure: ${changed.map((key) => `${PROCEDURE_WORDS[key]} from ${before[key]} to ${merged[key]}`).join("; ")}.`,
        details: Object.fromEntries(changed.map((key) => [key, [before[key], merged[key]]])),
      });
    }
    return merged;
  });
}
