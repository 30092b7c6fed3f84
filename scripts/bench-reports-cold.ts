// Times the reports and job cost built from the database right after a write (so nothing kept
// helps), in-process, over the default period (the last 90 days).
// Run with node's react-server condition so server-only modules load outside Next:
//   tsx --conditions=react-server scripts/bench-reports-cold.ts <database path> [runs]
import { createDb } from "@/db";
import { jobCostsReport } from "@/server/labour/report";
import { loadPartsDesk } from "@/server/parts/desk";
import { loadOverview } from "@/server/reports/overview";
import { readPeriod } from "@/server/reports/period";
import { coatersReport, reportCalendar, stageTimesReport, throughputReport, workloadReport } from "@/server/reports/queries";

const [path, runsArg] = process.argv.slice(2);
const db = createDb(path);
const runs = Number(runsArg ?? 20);
const cal = await reportCalendar(db);
const read = readPeriod({}, cal.today);
if (!read.ok) throw new Error("no default period");
const period = read.period;
const builds: Record<string, () => Promise<unknown>> = {
  stageTimes: () => stageTimesReport(db, period, cal),
  throughput: () => throughputReport(db, period, cal),
  coaters: () => coatersReport(db, period, cal),
  workload: () => workloadReport(db, period, cal),
  jobCosts: () => jobCostsReport(db, period, cal),
  partsDesk: () => loadPartsDesk(db),
  overview: () => loadOverview(db),
};
const out: Record<string, { p50Ms: number; p95Ms: number }> = {};
for (const [name, build] of Object.entries(builds)) {
  const times: number[] = [];
  for (let i = 0; i < runs + 3; i++) {
    // A write the shop would make, so no kept answer is reused.
    await db.updateTable("shop").set({ name: (eb) => eb.ref("name") }).execute();
    const started = performance.now();
    await build();
    if (i >= 3) times.push(performance.now() - started);
  }
  times.sort((a, b) => a - b);
  const at = (p: number) => times[Math.min(times.length - 1, Math.ceil((p / 100) * times.length) - 1)];
  out[name] = { p50Ms: Math.round(at(50) * 10) / 10, p95Ms: Math.round(at(95) * 10) / 10 };
}
await db.destroy();
console.log(JSON.stringify(out));
