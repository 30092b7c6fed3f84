import { STAGES, type JobScope, type Stage } from "@/db/schema";

export { STAGES };
export type { Stage };

export const STAGE_LABELS: Record<Stage, string> = {
  queued: "Queued",
  fabricate: "Fabricate",
  pressure_test: "Pressure test",
  coating: "Outside coating",
  install: "Install",
  wire: "Wire & verify",
  ready: "Ready for pickup",
  delivered: "Delivered",
};

/** Columns on the board: delivered jobs leave it and live in the job list. */
export const BOARD_STAGES = STAGES.filter((s) => s !== "delivered");

const FAB_ONLY: readonly Stage[] = ["fabricate", "pressure_test", "coating"];

export const SCOPE_LABELS: Record<JobScope, string> = {
  fabrication: "Fabricated parts",
  install_only: "Install only",
};

/** A job whose scope has no fabricated parts skips fabricate, pressure test and coating. */
export function stagesFor(scope: JobScope): Stage[] {
  return scope === "fabrication" ? [...STAGES] : STAGES.filter((s) => !FAB_ONLY.includes(s));
}

export function stageIndex(stage: Stage) {
  return STAGES.indexOf(stage);
}

export function isStage(value: string): value is Stage {
  return (STAGES as readonly string[]).includes(value);
}
