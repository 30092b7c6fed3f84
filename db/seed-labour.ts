import type { Kysely } from "kysely";
import type { Database, Stage } from "./schema";

/**
 * The demo shop's clock: each job's hours laid inside the stages it went through (its stage
 * events), a morning and an afternoon per stage worked; one installer on the clock now, and one
 * fabricator's clock left on since yesterday for the office to correct.
 */
export async function seedLabour(db: Kysely<Database>, now: Date) {
  const staff = new Map((await db.selectFrom("staff").select(["id", "email"]).execute()).map((s) => [s.email.split("@")[0], s.id]));
  const jobs = await db.selectFrom("job").select(["id", "stage", "assigned_tech_id", "description"]).orderBy("id").execute();
  const events = await db.selectFrom("stage_event").select(["id", "job_id", "to_stage", "at"]).orderBy("id").execute();
  const worked: Stage[] = ["fabricate", "pressure_test", "install", "wire"];
  const hoursAt = (at: string, hourOffset: number) => new Date(new Date(at).getTime() + hourOffset * 3_600_000).toISOString();
  for (const job of jobs) {
    const tech = job.assigned_tech_id;
    if (!tech) continue;
    const mine = events.filter((e) => e.job_id === job.id);
    for (let i = 0; i < mine.length; i++) {
      const e = mine[i];
      if (!worked.includes(e.to_stage as Stage)) continue;
      const next = mine[i + 1];
      // Only stages the job has left: the one it is in now is still being worked.
      if (!next) continue;
      const span = new Date(next.at).getTime() - new Date(e.at).getTime();
      if (span < 6 * 3_600_000) continue;
      const hours = e.to_stage === "install" ? 3.5 : e.to_stage === "wire" ? 2.5 : e.to_stage === "fabricate" ? 4 : 1;
      await db.insertInto("clock_entry").values({ staff_id: tech, job_id: job.id, stage: e.to_stage, started_at: hoursAt(e.at, 1), ended_at: hoursAt(e.at, 1 + hours) }).execute();
    }
  }
  // A running clock went on after its job came into the stage it is in: the job's move into that
  // stage is put a quarter of an hour before the clock started (the demo's moves are otherwise laid
  // up to today), and the entry keeps that stage, as clocking on does.
  const runningClock = async (staffId: string, job: (typeof jobs)[number], startedAt: string) => {
    const mine = events.filter((e) => e.job_id === job.id);
    const last = mine.at(-1);
    const movedAt = new Date(new Date(startedAt).getTime() - 15 * 60_000).toISOString();
    if (last && last.to_stage === job.stage && last.at > movedAt && (mine.at(-2)?.at ?? "") < movedAt) {
      await db.updateTable("stage_event").set({ at: movedAt }).where("id", "=", last.id).execute();
      last.at = movedAt;
    }
    const stage = mine.filter((e) => e.at <= startedAt).at(-1)?.to_stage ?? job.stage;
    await db.insertInto("clock_entry").values({ staff_id: staffId, job_id: job.id, stage, started_at: startedAt, ended_at: null }).execute();
  };
  const installJob = jobs.find((j) => j.stage === "install" && j.description.startsWith("Wet kit"));
  const cody = staff.get("cody");
  if (installJob && cody) await runningClock(cody, installJob, new Date(now.getTime() - 90 * 60_000).toISOString());
  const fabJob = jobs.find((j) => j.stage === "fabricate");
  const luka = staff.get("luka");
  if (fabJob && luka) await runningClock(luka, fabJob, new Date(now.getTime() - 20 * 3_600_000).toISOString());
}
