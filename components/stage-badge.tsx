import type { Stage } from "@/db/schema";
import { STAGE_LABELS } from "@/server/jobs/stages";

/** Each stage has a word and a small numbered step, never colour alone. */
const STEP: Record<Stage, string> = { queued: "1", fabricate: "2", pressure_test: "3", coating: "4", install: "5", wire: "6", ready: "7", delivered: "✓" };

export function StageBadge({ stage }: { stage: Stage }) {
  return (
    <span className="inline-flex items-center gap-1.5 rounded-full border border-bay-600/40 bg-bay-50 px-2.5 py-0.5 text-sm font-semibold text-bay-900">
      <span aria-hidden="true" className="grid h-4 w-4 place-items-center rounded-full bg-bay-700 text-[10px] text-white">{STEP[stage]}</span>
      {STAGE_LABELS[stage]}
    </span>
  );
}
