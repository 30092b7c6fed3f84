import "server-only";
import { type Transaction, sql } from "kysely";
import type { DB } from "@/db";
import type { Database } from "@/db/schema";
import { ApiError, notFound } from "@/server/http/errors";
import { findTruck } from "./queries";
import type { NewTruckInput, TruckPatch } from "./schemas";

type Trx = Transaction<Database>;

function fieldProblem(code: "validation" | "conflict", field: string, message: string, extra: Record<string, unknown> = {}) {
  return new ApiError(code, message, { fields: { [field]: [message] }, ...extra });
}

async function assertCustomerExists(trx: Trx, customerId: number) {
  const found = await trx.selectFrom("customer").select("id").where("id", "=", customerId).executeTakeFirst();
  if (!found) throw fieldProblem("validation", "customerId", "No customer has that id; choose the customer from the list.");
}

async function assertVinFree(trx: Trx, vin: string, exceptTruckId?: number) {
  const holder = await trx
    .selectFrom("truck")
    .innerJoin("customer", "customer.id", "truck.customer_id")
    .select(["truck.id", "truck.unit_number", "customer.name"])
    .where("truck.vin", "=", vin)
    .executeTakeFirst();
  if (holder && holder.id !== exceptTruckId) {
    throw fieldProblem("conflict", "vin", `That VIN is already on file: unit ${holder.unit_number} of ${holder.name}.`, { truckId: holder.id });
  }
}

// A fleet tells its trucks apart by unit number, so two trucks of one customer may not share one.
async function assertUnitNumberFree(trx: Trx, customerId: number, unitNumber: string, exceptTruckId?: number) {
  const holder = await trx
    .selectFrom("truck")
    .select("id")
    .where("customer_id", "=", customerId)
    .where(sql<boolean>`unit_number = ${unitNumber} collate nocase`)
    .executeTakeFirst();
  if (holder && holder.id !== exceptTruckId) {
    throw fieldProblem("conflict", "unitNumber", `This customer already has a truck with unit number ${unitNumber}.`, { truckId: holder.id });
  }
}

export async function createTruck(db: DB, input: NewTruckInput) {
  const id = await db.transaction().execute(async (trx) => {
    await assertCustomerExists(trx, input.customerId);
    await assertVinFree(trx, input.vin);
    await assertUnitNumberFree(trx, input.customerId, input.unitNumber);
    const row = await trx
      .insertInto("truck")
      .values({
        customer_id: input.customerId,
        unit_number: input.unitNumber,
        vin: input.vin,
        year: input.year,
        description: input.description,
        transmission: input.transmission,
        work_engine_rpm: input.workEngineRpm,
        make: input.make,
        model: input.model,
        pto_opening: input.ptoOpening,
        created_at: new Date().toISOString(),
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    return row.id;
  });
  return (await findTruck(db, id))!;
}

/** Moving a truck to another customer (it was sold) leaves its past jobs with the customer they were done for. */
export async function updateTruck(db: DB, id: number, patch: TruckPatch) {
  await db.transaction().execute(async (trx) => {
    const existing = await trx.selectFrom("truck").select(["customer_id", "unit_number"]).where("id", "=", id).executeTakeFirst();
    if (!existing) throw notFound("That truck");
    if (patch.customerId !== undefined) await assertCustomerExists(trx, patch.customerId);
    if (patch.vin !== undefined) await assertVinFree(trx, patch.vin, id);
    if (patch.customerId !== undefined || patch.unitNumber !== undefined) {
      await assertUnitNumberFree(trx, patch.customerId ?? existing.customer_id, patch.unitNumber ?? existing.unit_number, id);
    }
    await trx
      .updateTable("truck")
      .set({
        ...(patch.customerId !== undefined ? { customer_id: patch.customerId } : {}),
        ...(patch.unitNumber !== undefined ? { unit_number: patch.unitNumber } : {}),
        ...(patch.vin !== undefined ? { vin: patch.vin } : {}),
        ...(patch.year !== undefined ? { year: patch.year } : {}),
        ...(patch.description !== undefined ? { description: patch.description } : {}),
        ...(patch.transmission !== undefined ? { transmission: patch.transmission } : {}),
        ...(patch.workEngineRpm !== undefined ? { work_engine_rpm: patch.workEngineRpm } : {}),
        ...(patch.make !== undefined ? { make: patch.make } : {}),
        ...(patch.model !== undefined ? { model: patch.model } : {}),
        ...(patch.ptoOpening !== undefined ? { pto_opening: patch.ptoOpening } : {}),
      })
      .where("id", "=", id)
      .execute();
  });
  return (await findTruck(db, id))!;
}
