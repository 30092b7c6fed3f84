import { addDays } from "date-fns";
import type { Stage } from "@/db/schema";

export type LinkState = "active" | "revoked" | "expired";

/**
 * A link works until the office turns it off, and ends `linkDays` after the truck is delivered.
 * Before delivery it never expires: an owner waiting weeks on a coater still gets news. A job
 * moved back out of delivered makes its links work again.
 */
export function linkState(link: { revoked_at: string | null }, job: { stage: Stage; deliveredAt: string | null }, linkDays: number, now: Date): LinkState {
  if (link.revoked_at) return "revoked";
  if (job.stage === "delivered" && job.deliveredAt && now > addDays(new Date(job.deliveredAt), linkDays)) return "expired";
  return "active";
}

export function linkExpiresAt(job: { stage: Stage; deliveredAt: string | null }, linkDays: number): string | null {
  if (job.stage !== "delivered" || !job.deliveredAt) return null;
  return addDays(new Date(job.deliveredAt), linkDays).toISOString();
}
