import type { Kysely } from "kysely";
import { type LeakTestContext, evaluateLeakTest, expectedEndPressurePsig } from "@/server/records/leak-test";
import type { LeakTestInput, PartGeometry, WiringSignOff } from "@/server/records/schemas";
import { DEFAULT_ALLOWED_DROP_PSI } from "@/server/records/settings";
import { SIGN_OFF_CHECK_KEYS, signOffMissing } from "@/server/records/sign-off";
import { addBusinessDaysTo, shopToday } from "@/server/records/turnaround";
import type { Database, Stage } from "./schema";
import type { PartKind, PartMaterial, PartShape } from "./tables/records";

type Part = {
  name: string;
  kind: PartKind;
  material: PartMaterial;
  shape?: PartShape;
  geometry?: PartGeometry;
  leakTest: boolean;
  coating: boolean;
  notes?: string;
};

/**
 * The demo shop's records, consistent with each seeded job's stage: tanks past the pressure test
 * passed it, jobs in coating have parts out (one run overdue), jobs in install and later got
 * theirs back and inspected, jobs ready or delivered are signed off, jobs in wire have a draft.
 * Runs inside the demo seed's transaction; a job the seed no longer makes is skipped.
 */
export async function seedRecords(db: Kysely<Database>, now: Date) {
  const today = shopToday({ now, timeZone: "US/Central" });
  // Business days back from the shop's today; always lands on a weekday.
  const back = (n: number) => addBusinessDaysTo(today, -n);
  const at = (date: string, hourUtc = 15) => `${date}T${String(hourUtc).padStart(2, "0")}:00:00.000Z`;

  const staff = new Map(
    (await db.selectFrom("staff").select(["id", "name", "email"]).execute()).map((s) => [s.email.split("@")[0], s]),
  );
  const who = (key: string) => staff.get(key) ?? null;
  const jobs = await db
    .selectFrom("job")
    .innerJoin("truck", "truck.id", "job.truck_id")
    .select(["job.id", "job.stage", "truck.unit_number"])
    .execute();
  const job = (unit: string, stage: Stage) => jobs.find((j) => j.unit_number === unit && j.stage === stage)?.id;

  const vendor = async (name: string, contact: string, phone: string, email: string, usual: number, notes: string) =>
    (await db
      .insertInto("vendor")
      .values({ name, contact, phone, email, usual_turnaround_days: usual, notes, created_at: now.toISOString() })
      .returning("id")
      .executeTakeFirstOrThrow()).id;
  const brightBend = await vendor("Bright Bend Finishing", "Nadia Fenwick", "(555) 010-0187", "orders@brightbend.example", 5,
    "About 40 miles away; picks up and drops off on Tuesdays and Thursdays.");
  const quarryRoad = await vendor("Quarry Road Coatings", "Gus Ambrose", "(555) 010-0143", "shop@quarryroad.example", 8,
    "Slower but cheaper; good for boxes and brackets that are not in a hurry.");

  const addPart = async (jobId: number, p: Part) =>
    (await db
      .insertInto("part")
      .values({
        job_id: jobId, name: p.name, kind: p.kind, material: p.material, shape: p.shape ?? p.geometry?.shape ?? "other",
        geometry: p.geometry ? JSON.stringify(p.geometry) : null, needs_leak_test: p.leakTest ? 1 : 0, needs_coating: p.coating ? 1 : 0,
        notes: p.notes ?? "", rework_count: 0, reworked_at: null, rework_note: "", created_at: now.toISOString(), updated_at: now.toISOString(),
      })
      .returning(["id", "shape"])
      .executeTakeFirstOrThrow());

  const gaugeCalibratedOn = back(120);
  // A clean test: the end pressure is what cooling alone explains (ideal gas law), read to 0.01 psi.
  const cleanTest = (shape: PartShape, date: string, tester: string, seams: string[]): LeakTestInput => {
    const psig = shape === "box" ? 2 : 4;
    const end = Math.round(expectedEndPressurePsig({ startPressurePsig: psig, startTempF: 68, endTempF: 66, barometricPsia: 14.696 }) * 100) / 100;
    return {
      method: shape === "box" ? "soap" : "both", testPressurePsig: psig, gaugeFullScalePsi: shape === "box" ? 5 : 10, gaugeCalibratedOn,
      holdMinutes: 20, startPressurePsig: psig, endPressurePsig: end, startTempF: 68, endTempF: 66, barometricPsia: 14.696,
      seams: seams.map((location) => ({ location, result: "pass" as const })), tester,
    };
  };
  const recordTest = async (part: { id: number; shape: PartShape }, date: string, testerKey: string, test: LeakTestInput, reworkCount = 0) => {
    const tester = who(testerKey);
    const context: LeakTestContext = { partShape: part.shape, allowedDropPsi: DEFAULT_ALLOWED_DROP_PSI, today: date };
    const outcome = evaluateLeakTest({ ...test, tester: tester?.name ?? test.tester }, context);
    await db
      .insertInto("leak_test")
      .values({
        part_id: part.id, rework_count: reworkCount, method: test.method, part_shape: part.shape, test_pressure_psig: test.testPressurePsig,
        gauge_full_scale_psi: test.gaugeFullScalePsi, gauge_calibrated_on: test.gaugeCalibratedOn, hold_minutes: test.holdMinutes,
        start_pressure_psig: test.startPressurePsig, end_pressure_psig: test.endPressurePsig, start_temp_f: test.startTempF,
        end_temp_f: test.endTempF, barometric_psia: test.barometricPsia, seams: JSON.stringify(test.seams), tester: tester?.name ?? test.tester,
        raw_drop_psi: outcome.rawDropPsi, corrected_drop_psi: outcome.correctedDropPsi, allowed_drop_psi: DEFAULT_ALLOWED_DROP_PSI,
        result: outcome.result, warnings: JSON.stringify(outcome.warnings), invalid_reasons: JSON.stringify(outcome.invalidReasons), recorded_by: tester?.id ?? null, tested_at: at(date),
      })
      .execute();
    return outcome.result;
  };
  const passingTest = async (part: { id: number; shape: PartShape }, date: string, testerKey: string, seams: string[]) => {
    const result = await recordTest(part, date, testerKey, cleanTest(part.shape, date, testerKey, seams));
    if (result !== "pass") throw new Error(`Demo leak test of part ${part.id} should pass`);
  };

  type Run = { vendorId: number; colour: string; gloss: string; sentOn: string; promisedOn: string; receivedOn?: string; inspection?: { dft: number[]; adhesionOk: boolean; defects: string; by: string } };
  const addRun = async (run: Run, partIds: number[]) => {
    const inspector = run.inspection ? who(run.inspection.by) : null;
    const row = await db
      .insertInto("coating_run")
      .values({
        vendor_id: run.vendorId, finish_colour: run.colour, finish_gloss: run.gloss, sent_on: run.sentOn, promised_on: run.promisedOn,
        // The coater's price for the run (invented for the demo): a lot charge and a price per part.
        price_cents: 6_000 + 8_500 * partIds.length,
        received_on: run.receivedOn ?? null, dft_readings_mils: run.inspection ? JSON.stringify(run.inspection.dft) : null,
        adhesion_ok: run.inspection ? (run.inspection.adhesionOk ? 1 : 0) : null, defects: run.inspection?.defects ?? null,
        inspected_at: run.inspection && run.receivedOn ? at(run.receivedOn, 20) : null, inspected_by: inspector?.id ?? null,
        created_by: who("office")?.id ?? null, created_at: at(run.sentOn, 14), updated_at: at(run.receivedOn ?? run.sentOn, 20),
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    const generations = new Map(
      (await db.selectFrom("part").select(["id", "rework_count"]).where("id", "in", partIds).execute()).map((p) => [p.id, p.rework_count]),
    );
    await db
      .insertInto("coating_run_part")
      .values(partIds.map((part_id) => ({ run_id: row.id, part_id, open: run.receivedOn ? 0 : 1, rework_count: generations.get(part_id) ?? 0 })))
      .execute();
  };

  const allChecked = Object.fromEntries(SIGN_OFF_CHECK_KEYS.map((k) => [k, true]));
  const signOff = async (jobId: number, fields: WiringSignOff, date: string, byKey: string) => {
    const by = who(byKey);
    const complete = signOffMissing(fields).length === 0;
    await db
      .insertInto("sign_off")
      .values({
        job_id: jobId, fields: JSON.stringify(fields), complete: complete ? 1 : 0, signed_by: complete ? fields.signedBy! : null,
        signed_by_staff_id: complete ? (by?.id ?? null) : null, signed_at: complete ? at(date, 21) : null, updated_by: by?.id ?? null,
        created_at: at(date, 18), updated_at: at(date, 21),
      })
      .execute();
  };
  const ines = who("ines")?.name ?? "Ines Marsh";
  const completeSignOff = (source: WiringSignOff["indicatorSource"], input: WiringSignOff["indicatorInput"], relief: number): WiringSignOff => ({
    indicatorSource: source, indicatorInput: input, checks: allChecked, reliefPressurePsi: relief, timedRunMinutes: 20, signedBy: ines,
  });

  const roundTank40 = { shape: "round" as const, insideDiameterIn: 18, lengthIn: 36.5 };
  const roundSeams = ["Sump to shell", "Fill neck", "Suction port", "Return port", "End caps"];

  // Delivered: HR-21's first kit.
  const hr21Delivered = job("HR-21", "delivered");
  if (hr21Delivered) {
    const tank = await addPart(hr21Delivered, { name: "40 gal round reservoir", kind: "reservoir", material: "aluminum", geometry: roundTank40, leakTest: true, coating: true });
    await passingTest(tank, back(30), "tech", roundSeams);
    await addRun({ vendorId: brightBend, colour: "Black", gloss: "gloss", sentOn: back(28), promisedOn: back(23), receivedOn: back(23), inspection: { dft: [2.4, 2.6, 2.9, 2.5], adhesionOk: true, defects: "", by: "cody" } }, [tank.id]);
    await signOff(hr21Delivered, completeSignOff("pto_feedback", "ground_active", 2500), back(18), "ines");
  }
  // Delivered, install only: TF-7's indicator swap.
  const tf7Delivered = job("TF-7", "delivered");
  if (tf7Delivered) await signOff(tf7Delivered, completeSignOff("pto_feedback", "voltage_active", 2300), back(9), "ines");

  // Ready for pickup: HR-22.
  const hr22Ready = job("HR-22", "ready");
  if (hr22Ready) {
    const tank = await addPart(hr22Ready, { name: "40 gal round reservoir", kind: "reservoir", material: "aluminum", geometry: roundTank40, leakTest: true, coating: true });
    await passingTest(tank, back(16), "luka", roundSeams);
    await addRun({ vendorId: quarryRoad, colour: "Black", gloss: "gloss", sentOn: back(14), promisedOn: back(6), receivedOn: back(7), inspection: { dft: [2.2, 2.8, 2.5], adhesionOk: true, defects: "", by: "office" } }, [tank.id]);
    await signOff(hr22Ready, completeSignOff("pto_feedback", "ground_active", 2500), back(1), "ines");
  }

  // Wire & verify: Dell's polished stainless box tank is not coated; the run test is half done.
  const dellWire = job("DO-1", "wire");
  if (dellWire) {
    const tank = await addPart(dellWire, { name: "45 gal stainless box reservoir", kind: "reservoir", material: "stainless", geometry: { shape: "box", lengthIn: 36, widthIn: 18, heightIn: 16 }, leakTest: true, coating: false, notes: "Polished finish, no coating." });
    await passingTest(tank, back(10), "tech", ["Corner seams", "Fill neck", "Suction port", "Return port", "Sight gauge bosses"]);
    await signOff(dellWire, { indicatorSource: "switch", indicatorInput: "ground_active", checks: { indicator_follows_pto: true, pto_engages_per_procedure: true, breakaways_secured_capped: true }, signedBy: null }, back(0), "ines");
  }
  const tf9Wire = job("TF-9", "wire");
  if (tf9Wire) await signOff(tf9Wire, { indicatorSource: "pto_feedback", checks: {} }, back(0), "ines");

  // Install: parts back from the coaters and inspected.
  const hr27Install = job("HR-27", "install");
  if (hr27Install) {
    const tank = await addPart(hr27Install, { name: "50 gal round reservoir with sump", kind: "reservoir", material: "aluminum", geometry: { shape: "round", insideDiameterIn: 20, lengthIn: 36.8 }, leakTest: true, coating: true });
    await passingTest(tank, back(11), "luka", roundSeams);
    await addRun({ vendorId: brightBend, colour: "Black", gloss: "gloss", sentOn: back(9), promisedOn: back(4), receivedOn: back(4), inspection: { dft: [2.5, 2.7, 2.6], adhesionOk: true, defects: "", by: "cody" } }, [tank.id]);
  }
  const tf7Install = job("TF-7", "install");
  if (tf7Install) {
    const box = await addPart(tf7Install, { name: "Under-deck tool box", kind: "box", material: "carbon_steel", shape: "box", leakTest: false, coating: true });
    await addRun({ vendorId: quarryRoad, colour: "Safety yellow", gloss: "semi_gloss", sentOn: back(12), promisedOn: back(4), receivedOn: back(3), inspection: { dft: [2.1, 3.4, 2.8, 2.6], adhesionOk: true, defects: "Run in the powder on the lid, about 2 in long; the customer accepted it.", by: "office" } }, [box.id]);
  }

  // Outside coating: Bright Bend is past its promise on HR-21's replacement tank; Quarry Road is not due yet.
  const hr21Coating = job("HR-21", "coating");
  if (hr21Coating) {
    const tank = await addPart(hr21Coating, { name: "Replacement 40 gal round reservoir", kind: "reservoir", material: "aluminum", geometry: roundTank40, leakTest: true, coating: true });
    await passingTest(tank, back(8), "luka", roundSeams);
    await addRun({ vendorId: brightBend, colour: "Black", gloss: "gloss", sentOn: back(7), promisedOn: back(2) }, [tank.id]);
  }
  const dellCoating = job("DO-1", "coating");
  if (dellCoating) {
    const battery = await addPart(dellCoating, { name: "Battery box", kind: "box", material: "carbon_steel", shape: "box", leakTest: false, coating: true });
    const tray = await addPart(dellCoating, { name: "Hose tray", kind: "bracket", material: "carbon_steel", leakTest: false, coating: true });
    const sentOn = back(2);
    await addRun({ vendorId: quarryRoad, colour: "Black", gloss: "satin", sentOn, promisedOn: addBusinessDaysTo(sentOn, 8) }, [battery.id, tray.id]);
  }

  // Pressure test: TF-9's box tank waits for its test; HR-22's second tank failed, was reworked and passed.
  const tf9Test = job("TF-9", "pressure_test");
  if (tf9Test) {
    await addPart(tf9Test, { name: "45 gal aluminum box reservoir", kind: "reservoir", material: "aluminum", geometry: { shape: "box", lengthIn: 34, widthIn: 20, heightIn: 15.25 }, leakTest: true, coating: true, notes: "Baffle between suction and return." });
  }
  const hr22Test = job("HR-22", "pressure_test");
  if (hr22Test) {
    const tank = await addPart(hr22Test, { name: "Spare 40 gal round reservoir", kind: "reservoir", material: "aluminum", geometry: roundTank40, leakTest: true, coating: true });
    const failed: LeakTestInput = { ...cleanTest("round", back(2), "luka", roundSeams), endPressurePsig: 3.78, startTempF: 67, endTempF: 67 };
    failed.seams = failed.seams.map((s) => (s.location === "Fill neck" ? { ...s, result: "leak" as const } : s));
    await recordTest(tank, back(2), "luka", failed);
    await db.updateTable("part").set({ rework_count: 1, reworked_at: at(back(1), 16), rework_note: "Ground out and rewelded the fill neck." }).where("id", "=", tank.id).execute();
    await recordTest(tank, back(1), "luka", cleanTest("round", back(1), "luka", roundSeams), 1);
  }

  // Fabricate: parts on the bench, not tested yet.
  const hr27Fab = job("HR-27", "fabricate");
  if (hr27Fab) {
    await addPart(hr27Fab, { name: "Hose carrier", kind: "bracket", material: "carbon_steel", leakTest: false, coating: true });
    await addPart(hr27Fab, { name: "Breakaway bracket", kind: "bracket", material: "carbon_steel", leakTest: false, coating: true });
  }
  const tf7Fab = job("TF-7", "fabricate");
  if (tf7Fab) {
    await addPart(tf7Fab, { name: "35 gal stainless round reservoir", kind: "reservoir", material: "stainless", geometry: { shape: "round", insideDiameterIn: 16, lengthIn: 40.2 }, leakTest: true, coating: false });
  }
}
