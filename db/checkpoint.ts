import { Worker } from "node:worker_threads";
import type SQLite from "better-sqlite3";

/**
 * WAL checkpoints off the request path.
 *
 * In WAL mode each commit is appended to the -wal file; a checkpoint copies those pages back into
 * the database file and flushes it to disk. By default SQLite runs one inside whichever commit
 * crosses 1,000 pages, on the one event loop that serves every request, so every few hundred
 * moves one move (and everyone waiting behind it) paid for a disk flush. Here the server's
 * connection never checkpoints by itself; a worker thread with its own connection runs a PASSIVE
 * checkpoint (it never blocks a reader or a writer) every `everyMs`. If that worker cannot start
 * or dies, the server's connection goes back to checkpointing by itself, so the WAL never grows
 * without bound.
 */
const WORKER_SOURCE = `
const { parentPort, workerData } = require("node:worker_threads");
const Database = require("better-sqlite3");
const db = new Database(workerData.path, { fileMustExist: true });
db.pragma("busy_timeout = 5000");
db.pragma("synchronous = NORMAL");
const run = (asked) => {
  const [result] = db.pragma("wal_checkpoint(PASSIVE)");
  if (asked !== undefined) parentPort.postMessage({ ...result, asked });
};
run();
const timer = setInterval(run, workerData.everyMs);
parentPort.on("message", (message) => {
  if (typeof message === "number") run(message);
  if (message === "stop") {
    clearInterval(timer);
    db.close();
    parentPort.close();
  }
});
`;

/** What the last checkpoint reported: the WAL's size in pages and how many of them are now in the database file. */
export interface CheckpointResult {
  busy: number;
  log: number;
  checkpointed: number;
}

export interface Checkpointer {
  /** Resolves with the next checkpoint's result (runs one now). */
  now(): Promise<CheckpointResult>;
  /** Stops the worker; the connection checkpoints by itself again. */
  stop(): Promise<void>;
  /** True while the worker does the checkpoints. */
  readonly running: boolean;
}

const AUTOCHECKPOINT_PAGES = 1000;

export function startCheckpointer(sqlite: SQLite.Database, path: string, everyMs = 1000): Checkpointer {
  sqlite.pragma("wal_autocheckpoint = 0");
  let running = true;
  const waiting = new Map<number, (r: CheckpointResult) => void>();
  let asked = 0;
  const fallBack = () => {
    if (!running) return;
    running = false;
    if (sqlite.open) sqlite.pragma(`wal_autocheckpoint = ${AUTOCHECKPOINT_PAGES}`);
  };
  const worker = new Worker(WORKER_SOURCE, { eval: true, workerData: { path, everyMs } });
  // Only checkpoints someone asked for are answered, each to whoever asked.
  worker.on("message", ({ asked: id, busy, log, checkpointed }: CheckpointResult & { asked: number }) => {
    waiting.get(id)?.({ busy, log, checkpointed });
    waiting.delete(id);
    if (!waiting.size) worker.unref();
  });
  worker.on("error", (error) => {
    console.error(`WAL checkpoints moved back to the server's connection: ${error.message}`);
    fallBack();
  });
  worker.on("exit", fallBack);
  // The worker never keeps the process alive (unref after the listeners, which would ref it again).
  worker.unref();
  return {
    get running() {
      return running;
    },
    now() {
      return new Promise((resolve, reject) => {
        if (!running) return reject(new Error("The checkpoint worker is not running."));
        const id = ++asked;
        waiting.set(id, resolve);
        // Someone is waiting for the answer: keep the process alive until it comes.
        worker.ref();
        worker.postMessage(id);
      });
    },
    async stop() {
      if (!running) return;
      const exited = new Promise<void>((resolve) => worker.once("exit", () => resolve()));
      // Someone waits for it to end: an unreferenced worker would let a process with nothing else
      // to do exit mid-await (Node's exit code 13) before the worker closed its connection.
      worker.ref();
      worker.postMessage("stop");
      await exited;
    },
  };
}
