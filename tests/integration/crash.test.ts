import { type ChildProcess, spawn } from "node:child_process";
import { join } from "node:path";
import { createInterface } from "node:readline";
import SQLite from "better-sqlite3";
import { describe, expect, it, beforeAll } from "vitest";
import { closeDb } from "@/db";
import { useFreshDatabase } from "../support/db";
import { ensureShop, makeJob, makeStaff } from "../support/factories";
import { moneyChecksOff } from "../support/money";

const { db } = useFreshDatabase();
// Money is not the subject here: the shop's money checks are off (payments-gates.test.ts holds them).
beforeAll(() => moneyChecksOff(db()));

interface Answered {
  jobId: number;
  eventId: number;
  from: string;
  to: string;
  version: number;
}

/** The move path in its own process, against the same database file. */
function startMover(env: Record<string, string>) {
  const child = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", join(process.cwd(), "tests/support/crash-mover.ts")], {
    env: { ...process.env, ...env },
    stdio: ["ignore", "pipe", "inherit"],
  });
  const answered: Answered[] = [];
  let finished = false;
  createInterface({ input: child.stdout! }).on("line", (line) => {
    if (line === "done") finished = true;
    else if (line.startsWith("{")) answered.push(JSON.parse(line) as Answered);
  });
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) => child.once("exit", (code, signal) => resolve({ code, signal })));
  return { child, answered, exited, finished: () => finished };
}

async function until(check: () => boolean, what: string, ms = 20_000) {
  const end = Date.now() + ms;
  while (!check()) {
    if (Date.now() > end) throw new Error(`Gave up waiting for ${what}.`);
    await new Promise((r) => setTimeout(r, 5));
  }
}

function kill9(child: ChildProcess) {
  child.kill("SIGKILL");
}

describe("a crash in a burst of moves", () => {
  it("loses no answered move: its event, its place and its outbox row are all there after a restart, and columns stay dense", async () => {
    await ensureShop(db());
    const staff = await makeStaff(db(), "office");
    const jobs = [];
    for (let i = 0; i < 12; i++) jobs.push((await makeJob(db(), { scope: "install_only" })).id);
    // The test's own connection must not be open while the mover runs: the crash is the mover's alone.
    await closeDb();
    const env = { CRASH_JOBS: JSON.stringify(jobs), CRASH_STAFF: staff.id, DATABASE_PATH: process.env.DATABASE_PATH! };

    const first = startMover({ ...env, CRASH_SEED: "7" });
    await until(() => first.answered.length >= 120, "120 answered moves");
    kill9(first.child);
    expect(await first.exited).toEqual({ code: null, signal: "SIGKILL" });
    expect(first.finished()).toBe(false);

    // Restart: the next process opens the database after the crash and carries on moving.
    const second = startMover({ ...env, CRASH_SEED: "11", CRASH_LIMIT: "40" });
    expect(await second.exited).toEqual({ code: 0, signal: null });
    expect(second.answered.length).toBeGreaterThanOrEqual(40);

    const sqlite = new SQLite(process.env.DATABASE_PATH!, { readonly: true });
    try {
      expect(sqlite.pragma("integrity_check", { simple: true })).toBe("ok");
      const eventOf = sqlite.prepare("select id, job_id, from_stage, to_stage, at from stage_event where id = ?");
      for (const move of [...first.answered, ...second.answered]) {
        expect(eventOf.get(move.eventId), `event ${move.eventId}`).toMatchObject({ job_id: move.jobId, from_stage: move.from, to_stage: move.to });
      }
      // The customer's messages follow the committed moves exactly, move by move: a stage change
      // queues one (replacing the one still waiting, told from where that one started), a move
      // back to where the waiting one started queues none, a reorder none. Nothing is sent here,
      // so every message is still waiting or replaced.
      const eventsOf = sqlite.prepare("select id, from_stage, to_stage, at from stage_event where job_id = ? and from_stage is not null order by id");
      const messagesOf = sqlite.prepare("select payload, created_at, status from outbox where job_id = ? and kind = 'stage_changed' order by created_at, rowid");
      for (const jobId of jobs) {
        const events = eventsOf.all(jobId) as { id: number; from_stage: string; to_stage: string; at: string }[];
        const messages = messagesOf.all(jobId) as { payload: string; created_at: string; status: string }[];
        let waitingFrom: string | null = null;
        let next = 0;
        for (const event of events) {
          if (event.from_stage === event.to_stage) continue;
          const before: string = waitingFrom ?? event.from_stage;
          if (before === event.to_stage) {
            waitingFrom = null;
            continue;
          }
          const message = messages[next++];
          expect(message && { ...JSON.parse(message.payload), at: message.created_at }, `message for event ${event.id}`).toEqual({ from: before, to: event.to_stage, at: event.at });
          waitingFrom = before;
        }
        expect(next, `messages of job ${jobId}`).toBe(messages.length);
        expect(messages.filter((m) => m.status === "pending").length).toBe(waitingFrom === null ? 0 : 1);
      }

      // Each card stands where its last event put it, at least as new as its last answered move.
      const cards = sqlite.prepare("select id, stage, position, version from job where id in (" + jobs.join(",") + ")").all() as { id: number; stage: string; position: number; version: number }[];
      const lastEvent = sqlite.prepare("select to_stage from stage_event where job_id = ? order by id desc limit 1");
      for (const card of cards) {
        const last = lastEvent.get(card.id) as { to_stage: string } | undefined;
        expect(last?.to_stage ?? "queued").toBe(card.stage);
        const answeredVersions = [...first.answered, ...second.answered].filter((m) => m.jobId === card.id).map((m) => m.version);
        if (answeredVersions.length) expect(card.version).toBeGreaterThanOrEqual(Math.max(...answeredVersions));
      }
      // Every column numbered 0, 1, 2… with no gaps and no two cards on one place.
      const columns = sqlite.prepare("select stage, group_concat(position) as positions from (select stage, position from job order by stage, position) group by stage").all() as { stage: string; positions: string }[];
      for (const column of columns) {
        const positions = column.positions.split(",").map(Number);
        expect(positions, column.stage).toEqual(positions.map((_, i) => i));
      }
      // Events with no answer are allowed (killed between commit and reply), events that were never committed are not there to check.
      const events = (sqlite.prepare("select count(*) as n from stage_event where actor_id = ?").get(staff.id) as { n: number }).n;
      expect(events).toBeGreaterThanOrEqual(first.answered.length + second.answered.length);
    } finally {
      sqlite.close();
    }
  }, 60_000);
});
