import { describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seed";
import { loadGateRecords } from "@/server/jobs/gate-records";
import { GATED_STAGES, gateUnmet } from "@/server/jobs/gates";
import { stageIndex, stagesFor } from "@/server/jobs/stages";
import { coatingFlags, findSignOff, listCoatingRuns, vendorRecords } from "@/server/records/queries";
import { useFreshDatabase } from "../support/db";

const { db } = useFreshDatabase();

describe("the demo shop's records", () => {
  it("agree with every seeded job's stage", async () => {
    await seedDemo(db(), "demo-password-for-tests");
    const jobs = await db().selectFrom("job").select(["id", "stage", "scope", "work_order"]).execute();
    const records = await loadGateRecords(db(), jobs.map((j) => j.id));
    for (const job of jobs) {
      const passed = GATED_STAGES.filter((g) => stagesFor(job.scope).includes(g) && stageIndex(g) <= stageIndex(job.stage));
      for (const gate of passed) expect(gateUnmet(gate, records.get(job.id)!, job.scope), `${job.work_order} in ${job.stage}, gate ${gate}`).toEqual([]);
    }

    const inCoating = jobs.filter((j) => j.stage === "coating");
    expect(inCoating.length).toBeGreaterThan(0);
    const flags = await coatingFlags(db(), inCoating.map((j) => j.id));
    expect(flags.size).toBe(inCoating.length);
    expect([...flags.values()].filter((f) => f.overdue)).toHaveLength(1);
    expect(new Set([...flags.values()].map((f) => f.vendorName))).toEqual(new Set(["Bright Bend Finishing", "Quarry Road Coatings"]));
    for (const job of inCoating) {
      expect(gateUnmet("install", records.get(job.id)!).length, job.work_order).toBeGreaterThan(0);
    }

    for (const job of jobs.filter((j) => j.stage === "wire")) {
      const signOff = await findSignOff(db(), job.id);
      expect(signOff, job.work_order).not.toBeNull();
      expect(signOff!.complete).toBe(false);
    }
    for (const job of jobs.filter((j) => j.stage === "ready" || j.stage === "delivered")) {
      expect((await findSignOff(db(), job.id))?.complete, job.work_order).toBe(true);
    }

    const open = await listCoatingRuns(db(), { status: "open" });
    expect(open[0].overdue).toBe(true);
    const vendors = await vendorRecords(db());
    expect(vendors.map((v) => [v.name, v.usualTurnaroundDays])).toEqual([
      ["Bright Bend Finishing", 5],
      ["Quarry Road Coatings", 8],
    ]);
    for (const v of vendors) expect(v.record.runs).toBeGreaterThan(0);
  });
});
