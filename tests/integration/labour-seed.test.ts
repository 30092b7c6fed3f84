import { describe, expect, it } from "vitest";
import { seedDemo } from "@/db/seed";
import { useFreshDatabase } from "../support/db";

const { db } = useFreshDatabase();

describe("the demo shop's clock", () => {
  it("every clock entry keeps the stage its job was in when it went on; the running clocks went on in the stage their job is in", async () => {
    await seedDemo(db(), "demo-password-for-tests");
    const entries = await db().selectFrom("clock_entry").innerJoin("job", "job.id", "clock_entry.job_id").select(["job_id", "clock_entry.stage", "job.stage as job_stage", "started_at", "ended_at"]).execute();
    const events = await db().selectFrom("stage_event").select(["job_id", "to_stage", "at"]).orderBy("id").execute();
    expect(entries.filter((e) => e.ended_at === null).length, "running clocks in the demo").toBeGreaterThan(0);
    for (const e of entries) {
      const before = events.filter((ev) => ev.job_id === e.job_id && ev.at <= e.started_at);
      expect(e.stage, `entry on job ${e.job_id} from ${e.started_at}`).toBe(before[before.length - 1]?.to_stage);
      if (e.ended_at === null) expect(e.stage, `running clock on job ${e.job_id}`).toBe(e.job_stage);
    }
  });
});
