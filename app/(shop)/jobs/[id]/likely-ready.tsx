import { IconWarn } from "@/components/icons";
import { showStoredDate } from "@/server/http/calendar-date";
import { likelyMissesDue, MIN_VISITS, type Prediction } from "@/server/jobs/prediction";
import { STAGE_LABELS } from "@/server/jobs/stages";

/** "3 jobs went through Wire & verify": each finished stay in the stage, so a job sent back and through again counts again. */
const wentThrough = (n: number, stage: string) => `${n} ${n === 1 ? "job" : "jobs"} went through ${stage}`;
const days = (n: number) => `${n} business ${n === 1 ? "day" : "days"}`;

/** The job page's "Likely ready" line: the estimate, or why there is none. */
export function LikelyReady({ prediction, dueOn, stage }: { prediction: Prediction; dueOn: string | null; stage: string }) {
  if (prediction.kind === "ready") return <span data-testid="likely-ready">{stage === "delivered" ? "Delivered" : "Ready now"}</span>;
  if (prediction.kind === "not_enough_history") {
    return (
      <span data-testid="likely-ready">
        Not enough history yet:{" "}
        {prediction.stages.map((s) => wentThrough(s.visits, STAGE_LABELS[s.stage])).join("; ")} in the last 12 months ({MIN_VISITS} needed
        {prediction.stages.length > 1 ? " for each" : ""}; a job sent back counts each time through).
      </span>
    );
  }
  const late = likelyMissesDue(prediction, dueOn);
  return (
    <div data-testid="likely-ready">
      <p>
        <span className="font-semibold">Around {showStoredDate(prediction.likelyOn, "EEE d MMM yyyy")}</span>
        <span className="text-ink-soft"> · late case {showStoredDate(prediction.lateOn, "EEE d MMM yyyy")}</span>
      </p>
      {late && (
        <p className="font-semibold text-warn-700">
          <IconWarn /> Likely after the due date
        </p>
      )}
      {prediction.overstayed && (
        <p className="text-sm text-warn-700">
          In {STAGE_LABELS[prediction.steps[0].stage]} for {days(prediction.daysInStage)}, longer than most jobs took there: counted as finishing today.
        </p>
      )}
      <p className="text-sm text-ink-soft">
        An estimate from the shop&apos;s own stage times over the last 12 months: each stage still ahead at its median, the late case at
        its 90th percentile, business days with the shop&apos;s holidays skipped.
      </p>
    </div>
  );
}
