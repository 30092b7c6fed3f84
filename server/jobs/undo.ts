import "server-only";
import { z } from "zod";
import type { DB } from "@/db";
import type { StaffUser } from "@/server/auth/session";
import { ApiError } from "@/server/http/errors";
import { type MoveResult, moveJob } from "./mutations";
import { findJob } from "./queries";
import { STAGE_LABELS } from "./stages";

/** How long after a move its mover may take it back: long enough to notice a slip, short enough that nobody has acted on the move. */
export const UNDO_WINDOW_MS = 2 * 60_000;

export const undoSchema = z
  .object({
    eventId: z.number({ message: "Send eventId, the number of the move to take back." }).int("eventId is a whole number.").positive("eventId is a positive number."),
  })
  .strict();
export type UndoInput = z.infer<typeof undoSchema>;

/** Where a card stood in its column just before a move: its index and the card that followed it. */
export interface FormerPlace {
  index: number;
  followerId: number | null;
}

// Kept in the server's memory for the undo window only (one server process per shop). A restart
// inside the window forgets the place, and the undo then puts the card at the end of its column.
const memory = globalThis as unknown as { baywrightFormerPlaces?: Map<number, FormerPlace & { keptAt: number }> };
const places = (memory.baywrightFormerPlaces ??= new Map());

async function columnOrder(db: DB, stage: string, exceptId?: number) {
  let q = db.selectFrom("job").select("id").where("stage", "=", stage as never);
  if (exceptId) q = q.where("id", "!=", exceptId);
  return (await q.orderBy("position").orderBy("id").execute()).map((r) => r.id);
}

/** Reads where the card stands now, before it is moved, so an undo can put it back in the same place (one statement: this runs on every move). */
export async function formerPlace(db: DB, jobId: number): Promise<FormerPlace | null> {
  const ids = (
    await db
      .selectFrom("job")
      .select("id")
      .where("stage", "=", (eb) => eb.selectFrom("job as moving").select("moving.stage").where("moving.id", "=", jobId))
      .orderBy("position")
      .orderBy("id")
      .execute()
  ).map((r) => r.id);
  const index = ids.indexOf(jobId);
  if (index < 0) return null;
  return { index, followerId: ids[index + 1] ?? null };
}

export function rememberFormerPlace(eventId: number, place: FormerPlace | null, now = Date.now()) {
  for (const [id, kept] of places) if (now - kept.keptAt > UNDO_WINDOW_MS * 2) places.delete(id);
  if (place) places.set(eventId, { ...place, keptAt: now });
}

/** The card to place the returning card before: the one that followed it, or whoever holds its old index now. */
function beforeIdFor(column: number[], place: FormerPlace | undefined): number | null {
  if (!place) return null;
  if (place.followerId !== null && column.includes(place.followerId)) return place.followerId;
  return column[place.index] ?? null;
}

/**
 * Takes back a card's last move: only its mover, only the job's newest move, only within the
 * undo window. The undo is one more move (its own stage event, through `moveJob`, so versions,
 * what each stage needs, positions and the customer's message follow the same rules), and both
 * moves stay on the job's timeline.
 */
export async function undoMove(db: DB, actor: StaffUser, jobId: number, input: UndoInput, now = new Date()): Promise<MoveResult> {
  const job = await db.selectFrom("job").select(["id", "stage", "version"]).where("id", "=", jobId).executeTakeFirst();
  if (!job) throw new ApiError("not_found", "That job was not found.");
  const event = await db
    .selectFrom("stage_event")
    .leftJoin("staff", "staff.id", "stage_event.actor_id")
    .select(["stage_event.id", "stage_event.from_stage", "stage_event.to_stage", "stage_event.actor_id", "stage_event.at", "staff.name as actor_name"])
    .where("stage_event.id", "=", input.eventId)
    .where("stage_event.job_id", "=", jobId)
    .executeTakeFirst();
  if (!event) throw new ApiError("not_found", "That move is not on this job's timeline. Reload the board and move the card where it belongs.");
  if (event.from_stage === null) throw new ApiError("conflict", "Opening the work order is not a move and cannot be undone.");
  const last = await db.selectFrom("stage_event").select("id").where("job_id", "=", jobId).orderBy("id", "desc").limit(1).executeTakeFirstOrThrow();
  if (last.id !== event.id || job.stage !== event.to_stage) {
    throw new ApiError("conflict", `The card has moved since; it is in ${STAGE_LABELS[job.stage]} now. Move it with the board or its "Move to…" list instead.`, { job: await findJob(db, jobId) });
  }
  if (event.actor_id !== actor.id) {
    throw new ApiError("forbidden", `Only ${event.actor_name ?? "the person who moved it"} can undo this move. Move the card with the board or its "Move to…" list instead.`);
  }
  if (now.getTime() - Date.parse(event.at) > UNDO_WINDOW_MS) {
    throw new ApiError("conflict", `Undo is kept for ${UNDO_WINDOW_MS / 60_000} minutes after a move. Move the card back to ${STAGE_LABELS[event.from_stage]} with the board or its "Move to…" list.`);
  }
  const column = await columnOrder(db, event.from_stage, jobId);
  return moveJob(db, actor, jobId, {
    toStage: event.from_stage,
    beforeJobId: beforeIdFor(column, places.get(event.id)),
    version: job.version,
    note: event.from_stage === event.to_stage ? "Undo: back to its place in the column." : `Undo: back from ${STAGE_LABELS[event.to_stage]} to ${STAGE_LABELS[event.from_stage]}.`,
  });
}
