import type { Kysely } from "kysely";
import { addBusinessDaysTo, shopToday } from "@/server/records/turnaround";
import type { Database, Stage } from "./schema";
import type { BoughtPartKind } from "./tables/bought-parts";

type Line = { kind: BoughtPartKind; description: string; partNumber: string; quantity: number; supplier: string; costCents: number | null; fits?: string; ratio?: number; displacement?: number };

// Invented suppliers and part numbers.
const FLUID = "Ketterby Fluid Power";
const DRIVE = "Oxbow Drivetrain Supply";

/** The bought-in lines of a wet kit for a truck with this transmission. */
function wetKit(transmission: string): Line[] {
  return [
    { kind: "pto", description: "10-bolt PTO, air shift, 122 % output", partNumber: "KP-1022-A", quantity: 1, supplier: DRIVE, costCents: 118_500, fits: transmission, ratio: 122 },
    { kind: "pump", description: "Direct-mount gear pump, 3.2 cu in/rev", partNumber: "GP-32-DM", quantity: 1, supplier: FLUID, costCents: 64_900, displacement: 3.2 },
    { kind: "valve", description: "Relief valve, 2,500 psi, SAE 12 ports", partNumber: "RV-25-12", quantity: 1, supplier: FLUID, costCents: 18_950 },
    { kind: "hose", description: "Pressure hose, 3/4 in, 20 ft with ends", partNumber: "PH-12-20", quantity: 2, supplier: FLUID, costCents: 9_475 },
    { kind: "fitting", description: "Breakaway coupler pair, 3/4 in", partNumber: "BC-12-P", quantity: 2, supplier: FLUID, costCents: 7_820 },
    { kind: "control", description: "Dash air switch with PTO-engaged light", partNumber: "DS-2L", quantity: 1, supplier: DRIVE, costCents: 6_240 },
  ];
}

/**
 * The demo shop's bought-in parts, consistent with each job's stage: every job at Install or past
 * it has all its parts received (installed, once past Install); jobs before Install have parts on
 * order (one purchase order overdue, one short-shipped) or still to order. Runs inside the demo
 * seed's transaction, after the jobs and records.
 */
export async function seedBoughtParts(db: Kysely<Database>, now: Date) {
  const today = shopToday({ now, timeZone: "US/Central" });
  const back = (n: number) => addBusinessDaysTo(today, -n);
  const at = (date: string, hourUtc = 16) => `${date}T${String(hourUtc).padStart(2, "0")}:00:00.000Z`;
  const staff = new Map((await db.selectFrom("staff").select(["id", "name", "email"]).execute()).map((s) => [s.email.split("@")[0], s]));
  const office = staff.get("office")!;
  const installer = staff.get("cody")!;
  const jobs = await db
    .selectFrom("job")
    .innerJoin("truck", "truck.id", "job.truck_id")
    .select(["job.id", "job.stage", "job.description", "truck.unit_number", "truck.transmission"])
    .orderBy("job.id")
    .execute();
  const job = (unit: string, stage: Stage) => jobs.find((j) => j.unit_number === unit && j.stage === stage);

  await db.updateTable("shop").set({ labour_rate_cents: 12_500 }).where("id", "=", 1).execute();
  let poSeq = 1;
  const year = today.slice(2, 4);
  const order = async (supplier: string, orderedDaysAgo: number, expectedInDays: number) => {
    const number = `PO-${year}-${String(poSeq++).padStart(4, "0")}`;
    const orderedOn = back(orderedDaysAgo);
    return (await db
      .insertInto("purchase_order")
      .values({ number, supplier, ordered_on: orderedOn, expected_on: addBusinessDaysTo(today, expectedInDays), notes: "", created_by: office.id, created_at: at(orderedOn, 15) })
      .returning("id")
      .executeTakeFirstOrThrow()).id;
  };
  const add = async (jobId: number, line: Line, state: { po?: number; received?: number; installedDaysAgo?: number; receivedDaysAgo?: number }) => {
    const receivedQuantity = state.received ?? 0;
    const installed = state.installedDaysAgo !== undefined;
    const row = await db
      .insertInto("bought_part")
      .values({
        job_id: jobId, kind: line.kind, description: line.description, part_number: line.partNumber, quantity: line.quantity, supplier: line.supplier,
        unit_cost_cents: line.costCents, state: installed ? "installed" : receivedQuantity >= line.quantity ? "received" : state.po || receivedQuantity ? "ordered" : "needed",
        purchase_order_id: state.po ?? null,
        expected_on: state.po ? (await db.selectFrom("purchase_order").select("expected_on").where("id", "=", state.po).executeTakeFirstOrThrow()).expected_on : null,
        received_quantity: receivedQuantity, installed_at: installed ? at(back(state.installedDaysAgo!), 19) : null, installed_by: installed ? installer.id : null,
        fits_transmission: line.fits ?? "", ratio_percent: line.ratio ?? null, displacement_cu_in: line.displacement ?? null,
        created_by: office.id, created_at: now.toISOString(), updated_at: now.toISOString(),
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    if (receivedQuantity > 0) {
      const day = back(state.receivedDaysAgo ?? 3);
      await db.insertInto("bought_part_receipt").values({ bought_part_id: row.id, quantity: receivedQuantity, received_by: office.id, received_by_name: office.name, received_at: at(day) }).execute();
    }
  };

  // Every job at Install or past it: its kit is here (and fitted, once past Install).
  const pastStages: Stage[] = ["install", "wire", "ready", "delivered"];
  for (const j of jobs.filter((j) => pastStages.includes(j.stage) && j.description.startsWith("Wet kit"))) {
    const fitted = j.stage !== "install";
    const po = await order(FLUID, 15, -8);
    for (const line of wetKit(j.transmission)) {
      await add(j.id, line, { po, received: line.quantity, receivedDaysAgo: 9, installedDaysAgo: fitted ? 4 : undefined });
    }
  }
  const tf9Wire = job("TF-9", "wire");
  if (tf9Wire) {
    // The customer supplied the reservoir; the shop bought the pump and its lines.
    const po = await order(FLUID, 10, -5);
    for (const line of wetKit(tf9Wire.transmission).filter((l) => l.kind !== "pto")) await add(tf9Wire.id, line, { po, received: line.quantity, receivedDaysAgo: 6, installedDaysAgo: 2 });
  }

  // Before Install: the Harlan Ridge spare kit is on order, one supplier overdue and one short-shipped.
  const queuedKit = jobs.find((j) => j.stage === "queued" && j.description.startsWith("Wet kit"));
  const fabricating = job("HR-27", "fabricate");
  const coating = job("HR-21", "coating");
  if (queuedKit) {
    const overdue = await order(DRIVE, 8, -2);
    const onTime = await order(FLUID, 3, 4);
    for (const line of wetKit(queuedKit.transmission)) {
      if (line.kind === "pto" || line.kind === "control") await add(queuedKit.id, line, { po: overdue });
      else if (line.kind === "hose") await add(queuedKit.id, line, { po: onTime, received: 1, receivedDaysAgo: 1 });
      else await add(queuedKit.id, line, { po: onTime });
    }
  }
  if (fabricating) {
    await add(fabricating.id, { kind: "fitting", description: "Bulkhead fitting, SAE 16, stainless", partNumber: "BF-16-SS", quantity: 4, supplier: FLUID, costCents: 2_150 }, {});
  }
  if (coating) {
    // A replacement tank only: the mounting straps are bought in and still to order.
    await add(coating.id, { kind: "other", description: "Tank mounting straps, pair", partNumber: "", quantity: 1, supplier: "", costCents: null }, {});
  }
  await db.updateTable("shop").set({ next_purchase_order: poSeq }).where("id", "=", 1).execute();
}
