import { describe, expect, it } from "vitest";
import { listJobs } from "@/server/jobs/queries";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeCustomer, makeJob, makeTruck } from "../support/factories";

const { db } = useFreshDatabase();

/** What the office means by search: the words appear anywhere in the work order, unit number, customer name or work description, any case. */
async function expected(q: string) {
  const rows = await db().selectFrom("job").innerJoin("truck", "truck.id", "job.truck_id").innerJoin("customer", "customer.id", "job.customer_id").select(["job.id", "job.work_order", "truck.unit_number", "customer.name", "job.description"]).execute();
  const needle = q.toLowerCase();
  return rows.filter((r) => [r.work_order, r.unit_number, r.name, r.description].some((v) => v.toLowerCase().includes(needle))).map((r) => r.id).sort((a, b) => b - a);
}

const found = async (q: string) => (await listJobs(db(), { q, limit: 500 })).map((r) => r.id);

describe("Jobs search", () => {
  it("finds the words anywhere in work order, unit number or customer name, and follows renames", async () => {
    await ensureShop(db());
    const ridge = await makeCustomer(db(), "Ridgeline Hauling Co");
    const marsh = await makeCustomer(db(), "Marsh Hollow Paving");
    const t1 = await makeTruck(db(), ridge.id);
    const t2 = await makeTruck(db(), marsh.id);
    await db().updateTable("truck").set({ unit_number: "RH-7040" }).where("id", "=", t1.id).execute();
    for (let i = 0; i < 3; i++) await makeJob(db(), { customerId: ridge.id, truckId: t1.id });
    for (let i = 0; i < 2; i++) await makeJob(db(), { customerId: marsh.id, truckId: t2.id, stage: "delivered" });
    for (const q of ["ridge", "HOLLOW", "7040", "rh-70", "WO-T", "line haul", "paving", "zzz", 'say "hi"', "ow P"]) {
      expect(await found(q), q).toEqual(await expected(q));
    }
    expect((await found("ridge")).length).toBe(3);
    await db().updateTable("customer").set({ name: "Stonegate Fleet" }).where("id", "=", ridge.id).execute();
    expect(await found("ridge")).toEqual([]);
    expect(await found("stonegate")).toEqual(await expected("stonegate"));
    await db().updateTable("truck").set({ unit_number: "SG-12" }).where("id", "=", t1.id).execute();
    expect(await found("7040")).toEqual([]);
    expect(await found("SG-12")).toHaveLength(3);
    const gone = (await found("hollow"))[0];
    await db().deleteFrom("part").where("job_id", "=", gone).execute();
    await db().deleteFrom("stage_event").where("job_id", "=", gone).execute();
    await db().deleteFrom("job").where("id", "=", gone).execute();
    expect(await found("hollow")).toEqual(await expected("hollow"));
    expect(await found("hollow")).toHaveLength(1);
  });

  it("finds a word of the work description, and follows a changed description", async () => {
    const job = await makeJob(db());
    await db().updateTable("job").set({ description: "Wet kit: 35 gal stainless reservoir, PTO pump" }).where("id", "=", job.id).execute();
    for (const q of ["reservoir", "STAINLESS", "35 gal", "pto pump"]) {
      expect(await found(q), q).toEqual(await expected(q));
      expect(await found(q), q).toContain(job.id);
    }
    await db().updateTable("job").set({ description: "Dump body hoist" }).where("id", "=", job.id).execute();
    expect(await found("reservoir")).not.toContain(job.id);
    expect(await found("hoist")).toEqual([job.id]);
  });
});
