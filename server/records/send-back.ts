import type { JobScope, Stage } from "@/db/schema";
import { stageIndex } from "@/server/jobs/stages";
import { formatDropPsi } from "./leak-test";

/**
 * Whether a failed leak test should offer to send the job back to Fabricate: the job is past
 * Fabricate (Pressure test or later) and not yet delivered. An install-only job has no Fabricate
 * to go back to.
 */
export function canSendBackToFabricate(job: { stage: Stage; scope: JobScope }): boolean {
  if (job.scope !== "fabrication" || job.stage === "delivered") return false;
  return stageIndex(job.stage) > stageIndex("fabricate");
}

/** The note kept on the stage event, so the timeline says why the job went back. */
export function sendBackNote(test: {
  partName: string;
  seams: { location: string; result: "pass" | "leak" }[];
  /** Null for a soap-only test without hold readings: it fails only on a seam seen leaking. */
  correctedDropPsi: number | null;
  allowedDropPsi: number;
}): string {
  const leaks = test.seams.filter((s) => s.result === "leak").map((s) => s.location.trim()).filter(Boolean);
  const why = leaks.length
    ? `leak at ${leaks.join(", ")}`
    : test.correctedDropPsi === null
      ? "a seam leaked"
      : `corrected drop ${formatDropPsi(test.correctedDropPsi)} psi, over the allowed ${test.allowedDropPsi} psi`;
  return `Leak test failed: ${test.partName}, ${why}.`;
}
