import { randomUUID } from "node:crypto";
import { addDays, formatISO, subDays } from "date-fns";
import { hashPassword } from "@/server/auth/password";
import { stagesFor } from "@/server/jobs/stages";
import { formatWorkOrder } from "@/server/jobs/work-order";
import { withCheckDigit } from "@/server/vehicles/vin";
import type { DB } from "./index";
import { seedMoney } from "./seed-money";
import { seedPayments } from "./seed-payments";
import { seedBoughtParts } from "./seed-bought-parts";
import { seedLabour } from "./seed-labour";
import { seedRecords } from "./seed-records";
import type { JobScope, Priority, Role, Stage } from "./schema";

export const DEMO_PASSWORD_DEFAULT = "upfit-demo-2026";

export const DEMO_STAFF: { key: string; name: string; email: string; role: Role }[] = [
  { key: "owner", name: "Marla Voss", email: "owner@cold-creek.example", role: "owner" },
  { key: "office", name: "Jen Halvorsen", email: "office@cold-creek.example", role: "office" },
  { key: "tech", name: "Tobin Reyes", email: "tech@cold-creek.example", role: "tech" },
  { key: "fab2", name: "Luka Pardo", email: "luka@cold-creek.example", role: "tech" },
  { key: "install", name: "Cody Varga", email: "cody@cold-creek.example", role: "tech" },
  { key: "wiring", name: "Ines Marsh", email: "ines@cold-creek.example", role: "tech" },
];

const KIT = "Wet kit: PTO, direct-mount gear pump, reservoir between the rails, breakaways, dash indicator";

/** Fills an empty database with the demo shop. Refuses a database that already has staff or jobs. */
export async function seedDemo(db: DB, password = process.env.DEMO_PASSWORD || DEMO_PASSWORD_DEFAULT, today = new Date()) {
  const existing = await db.selectFrom("staff").select("id").limit(1).executeTakeFirst();
  const anyJob = await db.selectFrom("job").select("id").limit(1).executeTakeFirst();
  if (existing || anyJob) throw new Error("The database is not empty: refusing to seed. Run `npm run db:reset` to start over.");

  const passwordHash = await hashPassword(password);
  const now = today.toISOString();
  const day = (offset: number) => formatISO(addDays(today, offset), { representation: "date" });

  await db.transaction().execute(async (trx) => {
    await trx
      .insertInto("shop")
      .values({ id: 1, name: "Cold Creek Upfit", phone: "(555) 010-4417", time_zone: "US/Central", work_order_prefix: "WO", next_work_order: 1 })
      .onConflict((oc) => oc.column("id").doUpdateSet({ name: "Cold Creek Upfit", phone: "(555) 010-4417" }))
      .execute();

    const staffIds: Record<string, string> = {};
    for (const s of DEMO_STAFF) {
      staffIds[s.key] = randomUUID();
      await trx
        .insertInto("staff")
        .values({ id: staffIds[s.key], name: s.name, email: s.email, role: s.role, password_hash: passwordHash, active: 1, created_at: now })
        .execute();
    }

    const customer = async (kind: "company" | "owner_operator", name: string, phone: string, email: string, notes: string, contacts: [string, string, string][]) => {
      const row = await trx.insertInto("customer").values({ kind, name, phone, email, notes, created_at: now }).returning("id").executeTakeFirstOrThrow();
      for (const [cName, cEmail, cPhone] of contacts) {
        await trx.insertInto("contact").values({ customer_id: row.id, name: cName, email: cEmail, phone: cPhone, receives_email: 1 }).execute();
      }
      return row.id;
    };
    const harlan = await customer("company", "Harlan Ridge Heavy Haul", "(555) 010-2290", "dispatch@harlan-ridge.example",
      "Three tractors pulling hydraulic detachable-gooseneck trailers.",
      [["Renee Ashby (dispatch)", "dispatch@harlan-ridge.example", "(555) 010-2291"], ["Walt Kessler (fleet manager)", "fleet@harlan-ridge.example", "(555) 010-2292"]]);
    const tamsin = await customer("company", "Tamsin Flats Recovery", "(555) 010-3385", "office@tamsin-flats.example",
      "Towing and recovery; calls ahead before pickup.", [["Corinne Tamsin", "office@tamsin-flats.example", "(555) 010-3385"]]);
    const dell = await customer("owner_operator", "Dell Okafor", "(555) 010-6120", "dell.okafor@mail.example",
      "Owner-operator, often on the road: prefers e-mail to calls.", [["Dell Okafor", "dell.okafor@mail.example", "(555) 010-6120"]]);

    const truck = async (customerId: number, unit: string, vinBase: string, year: number, description: string, transmission: string, rpm: number) =>
      (await trx.insertInto("truck")
        .values({ customer_id: customerId, unit_number: unit, vin: withCheckDigit(vinBase), year, description, transmission, work_engine_rpm: rpm, created_at: now })
        .returning("id").executeTakeFirstOrThrow()).id;
    // Invented VINs: the 9th character is computed so each passes the check-digit rule.
    const hr21 = await truck(harlan, "HR-21", "4CW7T3X20RK418825", 2024, "Tandem-axle day cab", "18-speed manual", 1300);
    const hr22 = await truck(harlan, "HR-22", "4CW7T3X20RK418826", 2024, "Tandem-axle day cab", "18-speed manual", 1300);
    const hr27 = await truck(harlan, "HR-27", "4CW7T3Y23SK502217", 2025, "Sleeper tractor", "12-speed automated manual", 1250);
    const tf7 = await truck(tamsin, "TF-7", "5LR2B4P10PN330071", 2023, "Tandem-axle day cab, pulls a hydraulic tilt trailer", "10-speed manual", 1200);
    const tf9 = await truck(tamsin, "TF-9", "5LR2B4P11RN330499", 2024, "Tri-axle day cab", "12-speed automated manual", 1200);
    const dellTruck = await truck(dell, "DO-1", "3KM9S6T41NW771506", 2022, "Sleeper tractor, 72 in bunk", "18-speed manual", 1350);

    type Plan = { customer: number; truck: number; scope: JobScope; stage: Stage; description: string; due: number; tech: string | null; priority?: Priority; notes?: string; startedDaysAgo: number };
    const plans: Plan[] = [
      { customer: harlan, truck: hr21, scope: "fabrication", stage: "delivered", description: `${KIT}; 40 gal aluminum round tank`, due: -30, tech: "install", startedDaysAgo: 48 },
      { customer: tamsin, truck: tf7, scope: "install_only", stage: "delivered", description: "Swap dash indicator to PTO engagement feedback; replace breakaway couplers", due: -12, tech: "wiring", startedDaysAgo: 20 },
      { customer: harlan, truck: hr22, scope: "fabrication", stage: "ready", description: `${KIT}; 40 gal aluminum round tank`, due: 1, tech: "install", startedDaysAgo: 26 },
      { customer: dell, truck: dellTruck, scope: "fabrication", stage: "wire", description: `${KIT}; 45 gal stainless box tank behind the sleeper`, due: 2, tech: "wiring", priority: "rush", notes: "Owner flies back Friday; wants the truck Saturday morning.", startedDaysAgo: 22 },
      { customer: tamsin, truck: tf9, scope: "install_only", stage: "wire", description: "Customer-supplied reservoir: install pump, lines and indicator", due: 3, tech: "wiring", startedDaysAgo: 9 },
      { customer: harlan, truck: hr27, scope: "fabrication", stage: "install", description: `${KIT}; 50 gal aluminum round tank with sump`, due: 5, tech: "install", startedDaysAgo: 19 },
      { customer: tamsin, truck: tf7, scope: "fabrication", stage: "install", description: "Fabricate and mount a steel tool box under the deck", due: -1, tech: "install", notes: "Box came back from coating with a run on the lid; accepted by the customer.", startedDaysAgo: 17 },
      { customer: harlan, truck: hr21, scope: "fabrication", stage: "coating", description: "Replacement 40 gal tank after frame-rail damage", due: 8, tech: "fab2", startedDaysAgo: 12 },
      { customer: dell, truck: dellTruck, scope: "fabrication", stage: "coating", description: "Battery box and hose tray for the wet kit", due: 9, tech: "tech", startedDaysAgo: 11 },
      { customer: tamsin, truck: tf9, scope: "fabrication", stage: "pressure_test", description: "45 gal aluminum box reservoir with baffle", due: 12, tech: "tech", startedDaysAgo: 6 },
      { customer: harlan, truck: hr22, scope: "fabrication", stage: "pressure_test", description: "Second reservoir for the spare tractor kit", due: 14, tech: "fab2", startedDaysAgo: 5 },
      { customer: harlan, truck: hr27, scope: "fabrication", stage: "fabricate", description: "Hose carrier and breakaway bracket at the back of the cab", due: 15, tech: "tech", startedDaysAgo: 3 },
      { customer: tamsin, truck: tf7, scope: "fabrication", stage: "fabricate", description: "Stainless round reservoir, 35 gal", due: 18, tech: "fab2", startedDaysAgo: 2 },
      { customer: dell, truck: dellTruck, scope: "install_only", stage: "queued", description: "Move the PTO switch to the dash panel and add an engaged light", due: 21, tech: null, startedDaysAgo: 1 },
      { customer: harlan, truck: hr21, scope: "fabrication", stage: "queued", description: `${KIT}; spare kit for the shop's loaner tractor`, due: 28, tech: null, startedDaysAgo: 0 },
    ];

    const positions: Partial<Record<Stage, number>> = {};
    let seq = 1;
    for (const plan of plans) {
      const route = stagesFor(plan.scope);
      const upTo = route.slice(0, route.indexOf(plan.stage) + 1);
      const created = subDays(today, plan.startedDaysAgo);
      const position = positions[plan.stage] ?? 0;
      positions[plan.stage] = position + 1;
      const job = await trx
        .insertInto("job")
        .values({
          work_order: formatWorkOrder("WO", today.getFullYear(), seq++),
          customer_id: plan.customer, truck_id: plan.truck, scope: plan.scope, description: plan.description,
          stage: plan.stage, position, due_on: day(plan.due), assigned_tech_id: plan.tech ? staffIds[plan.tech] : null,
          priority: plan.priority ?? "normal", notes: plan.notes ?? "", version: upTo.length,
          created_at: created.toISOString(), updated_at: now,
        })
        .returning("id").executeTakeFirstOrThrow();
      // One stage event per step, spread evenly from the day the job came in until today.
      const step = upTo.length > 1 ? plan.startedDaysAgo / (upTo.length - 1) : 0;
      for (let i = 0; i < upTo.length; i++) {
        const actor = i === 0 ? staffIds.office : plan.tech ? staffIds[plan.tech] : staffIds.office;
        await trx.insertInto("stage_event").values({
          job_id: job.id, from_stage: i === 0 ? null : upTo[i - 1], to_stage: upTo[i], actor_id: actor,
          at: addDays(created, Math.round(step * i)).toISOString(), note: i === 0 ? "Work order opened." : "", override_reason: null,
        }).execute();
      }
    }
    await trx.updateTable("shop").set({ next_work_order: seq }).where("id", "=", 1).execute();
    await seedRecords(trx, today);
    await seedMoney(trx, today);
    await seedPayments(trx, today);
    await seedBoughtParts(trx, today);
    await seedLabour(trx, today);
  });
}
