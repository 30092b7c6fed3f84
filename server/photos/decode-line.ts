import "server-only";

/**
 * Photos are decoded one at a time in each server process. A phone photo decodes to 50 MB or
 * more of pixels; sixteen at once took the server past a gigabyte. The line is in memory: one
 * server process per shop, and a photo that never got its turn is sent again by the uploader.
 */
export interface DecodeTicket {
  jobId: number;
  name: string;
  uploadedBy: string;
}

export type DecodeState = "waiting" | "decoding";
export interface DecodeLineEntry extends DecodeTicket {
  id: number;
  state: DecodeState;
  /** Photos of any job in front of this one (0 while it is being decoded). */
  ahead: number;
}

interface Line {
  nextId: number;
  entries: { id: number; ticket: DecodeTicket; state: DecodeState; start: () => void }[];
}

// Kept on globalThis: the production build can hold several copies of this module, and there
// must be one line per process.
const line = ((globalThis as unknown as { __baywrightDecodeLine?: Line }).__baywrightDecodeLine ??= { nextId: 1, entries: [] });

function startNext() {
  const first = line.entries[0];
  if (first && first.state === "waiting") {
    first.state = "decoding";
    first.start();
  }
}

/** Runs `work` when every photo queued before it in this process is done. */
export function inDecodeLine<T>(ticket: DecodeTicket, work: () => Promise<T>): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const id = line.nextId++;
    const entry = {
      id,
      ticket,
      state: "waiting" as DecodeState,
      start: () => {
        Promise.resolve()
          .then(work)
          .then(resolve, reject)
          .finally(() => {
            const at = line.entries.findIndex((e) => e.id === id);
            if (at >= 0) line.entries.splice(at, 1);
            startNext();
          });
      },
    };
    line.entries.push(entry);
    startNext();
  });
}

/** The line as it stands, optionally only one job's photos (and only one person's). */
export function decodeLine(filter: { jobId?: number; uploadedBy?: string } = {}): DecodeLineEntry[] {
  return line.entries
    .map((e, i) => ({ ...e.ticket, id: e.id, state: e.state, ahead: i }))
    .filter((e) => (filter.jobId === undefined || e.jobId === filter.jobId) && (filter.uploadedBy === undefined || e.uploadedBy === filter.uploadedBy));
}
