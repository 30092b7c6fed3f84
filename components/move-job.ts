import { ApiRequestError, api } from "./api";
import type { Stage } from "@/db/schema";

export interface MoveBody {
  toStage: Stage;
  beforeJobId?: number | null;
  version: number;
  note?: string;
  override?: { reason: string };
}

/** Why a move was refused, in the shape both the board and the job page show. */
export interface MoveRefusal {
  kind: "gate" | "stale" | "forbidden" | "other";
  message: string;
  unmet: string[];
  canOverride: boolean;
  /** The stage the card was headed for, when the caller knows it. */
  toStage?: Stage;
}

export interface MoveAnswer {
  job: { id: number; stage: Stage; version: number };
  /** The move's stage event, which its mover can take back for a short while. */
  eventId: number;
}

export async function sendMove(jobId: number, body: MoveBody) {
  return api<MoveAnswer>(`/api/jobs/${jobId}/moves`, { method: "POST", body });
}

/** Takes back the caller's own last move of the card. */
export async function sendUndo(jobId: number, eventId: number) {
  return api<MoveAnswer>(`/api/jobs/${jobId}/undo`, { method: "POST", body: { eventId } });
}

export function refusalOf(err: unknown, toStage?: Stage): MoveRefusal {
  const refusal = refusalWithout(err);
  return toStage ? { ...refusal, toStage } : refusal;
}

function refusalWithout(err: unknown): MoveRefusal {
  if (!(err instanceof ApiRequestError)) return { kind: "other", message: "The move did not go through. Try again.", unmet: [], canOverride: false };
  const f = err.failure;
  const unmet = Array.isArray(f.details?.unmet) ? (f.details.unmet as string[]) : [];
  if (f.code === "gate_unmet") return { kind: "gate", message: f.message, unmet, canOverride: Boolean(f.details?.canOverride) };
  if (f.code === "stale") return { kind: "stale", message: f.message, unmet: [], canOverride: false };
  if (f.code === "forbidden") return { kind: "forbidden", message: f.message, unmet: [], canOverride: false };
  return { kind: "other", message: f.message, unmet, canOverride: false };
}
