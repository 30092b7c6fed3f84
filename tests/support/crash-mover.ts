/**
 * The move path in a process of its own, for the crash test: moves cards as fast as it can and
 * prints one line per move the app answered (after its transaction committed). The crash test
 * kills it with SIGKILL mid-burst. Run with `node --conditions=react-server --import tsx`.
 */
import { getDb } from "@/db";
import type { Stage } from "@/db/schema";
import type { StaffUser } from "@/server/auth/session";
import { ApiError } from "@/server/http/errors";
import { moveJob } from "@/server/jobs/mutations";

const jobIds: number[] = JSON.parse(process.env.CRASH_JOBS ?? "[]");
const actor: StaffUser = { id: process.env.CRASH_STAFF ?? "", name: "Crash Mover", email: "mover@shop.example", role: "office" };
const MOVERS = Number(process.env.CRASH_MOVERS ?? 8);
const LIMIT = Number(process.env.CRASH_LIMIT ?? Number.POSITIVE_INFINITY);
// Install-only jobs cross no records gate between these stages, so every move can be answered.
const STAGES: Stage[] = ["queued", "install", "wire"];

const db = getDb();
let answered = 0;
let seed = Number(process.env.CRASH_SEED ?? 1);
const random = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);

async function mover() {
  while (answered < LIMIT) {
    const jobId = jobIds[Math.floor(random() * jobIds.length)];
    const job = await db.selectFrom("job").select(["version", "stage"]).where("id", "=", jobId).executeTakeFirstOrThrow();
    const toStage = STAGES[Math.floor(random() * STAGES.length)];
    try {
      const result = await moveJob(db, actor, jobId, { toStage, version: job.version });
      answered++;
      process.stdout.write(`${JSON.stringify({ jobId, eventId: result.eventId, from: job.stage, to: toStage, version: result.job.version })}\n`);
    } catch (err) {
      // Another mover got there first: read the card again, as the board would.
      if (!(err instanceof ApiError && err.code === "stale")) throw err;
    }
  }
}

await Promise.all(Array.from({ length: MOVERS }, mover));
process.stdout.write("done\n");
