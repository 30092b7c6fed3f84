import "server-only";
import { sql } from "kysely";
import type { DB } from "@/db";
import { containsText } from "@/server/customers/search";
import type { TruckListQuery, TruckView } from "./schemas";

function truckSelect(db: DB) {
  return db
    .selectFrom("truck")
    .innerJoin("customer", "customer.id", "truck.customer_id")
    .select([
      "truck.id",
      "truck.customer_id as customerId",
      "customer.name as customerName",
      "truck.unit_number as unitNumber",
      "truck.vin",
      "truck.year",
      "truck.description",
      "truck.transmission",
      "truck.work_engine_rpm as workEngineRpm",
      "truck.created_at as createdAt",
      "truck.make",
      "truck.model",
      "truck.pto_opening as ptoOpening",
    ]);
}

/** Trucks in unit-number order; `q` matches unit number, VIN, description or the owner's name. */
export function listTrucks(db: DB, query: TruckListQuery = {}): Promise<TruckView[]> {
  let select = truckSelect(db);
  if (query.customerId !== undefined) select = select.where("truck.customer_id", "=", query.customerId);
  if (query.q) {
    const q = query.q;
    select = select.where((eb) =>
      eb.or([
        containsText(eb.ref("truck.unit_number"), q),
        containsText(eb.ref("truck.vin"), q),
        containsText(eb.ref("truck.description"), q),
        containsText(eb.ref("truck.make"), q),
        containsText(eb.ref("truck.model"), q),
        containsText(eb.ref("customer.name"), q),
      ]),
    );
  }
  return select
    .orderBy(sql`customer.name collate nocase`)
    .orderBy(sql`truck.unit_number collate nocase`)
    .orderBy("truck.id")
    .execute();
}

export function findTruck(db: DB, id: number): Promise<TruckView | undefined> {
  return truckSelect(db).where("truck.id", "=", id).executeTakeFirst();
}

/** The truck that already carries this VIN, if any (VINs are stored upper-case). */
export function findTruckByVin(db: DB, vin: string) {
  return db
    .selectFrom("truck")
    .innerJoin("customer", "customer.id", "truck.customer_id")
    .select(["truck.id", "truck.unit_number as unitNumber", "customer.name as customerName"])
    .where("truck.vin", "=", vin)
    .executeTakeFirst();
}
