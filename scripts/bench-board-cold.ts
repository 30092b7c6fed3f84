// Times the board's answer built from the database (no cache), as after every write.
// Run with node's react-server condition so server-only modules load outside Next:
//   tsx --conditions=react-server scripts/bench-board-cold.ts <database path> [runs]
import { createDb } from "@/db";
import { loadBoard } from "@/server/jobs/board";

const [path, runsArg] = process.argv.slice(2);
const db = createDb(path);
const runs = Number(runsArg ?? 40);
const times: number[] = [];
let bytes = 0;
for (let i = 0; i < runs + 5; i++) {
  const started = performance.now();
  const body = JSON.stringify(await loadBoard(db, {}));
  if (i >= 5) times.push(performance.now() - started);
  bytes = body.length;
}
await db.destroy();
times.sort((a, b) => a - b);
const at = (p: number) => times[Math.min(times.length - 1, Math.ceil((p / 100) * times.length) - 1)];
console.log(JSON.stringify({ runs, p50Ms: at(50), p95Ms: at(95), bytes }));
