import { IconWarn } from "@/components/icons";
import { showStoredDate } from "@/server/http/calendar-date";
import { likelyMissesDue, MIN_VISITS, type Prediction } from "@/server/jobs/prediction";
import { STAGE_LABELS } from "@/server/jobs/stages";

const visits = (n: number) => `${n} finished ${n === 1 ? "visit" : "visits"}`;
const days = (n: number) => `${n} business ${n === 1 ? "day" : "days"}`;

/** The job page's "Likely ready" line: the estimate, or why there is none. */
export function LikelyReady({ prediction, dueOn, stage }: { prediction: Prediction; dueOn: string | null; stage: string }) {
  if (prediction.kind === "ready") return <span data-testid="likely-ready">{stage === "delivered" ? "Delivered" : "Ready now"}</span>;
  if (prediction.kind === "not_enough_history") {
    return (
      <span data-testid="likely-ready">
        Not enough history yet:{" "}
        {prediction.stages.map((s) => `${STAGE_LABELS[s.stage]} has ${visits(s.visits)} in the last 12 months`).join("; ")} ({MIN_VISITS} needed).
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
          In {STAGE_LABELS[prediction.steps[0].stage]} for {days(prediction.daysInStage)}, longer than most past visits: counted as finishing today.
        </p>
      )}
      <p className="text-sm text-ink-soft">
        An estimate from the shop&apos;s own stage times over the last 12 months: each stage still ahead at its median, the late case at
        its 90th percentile, business days with the shop&apos;s holidays skipped.
      </p>
    </div>
  );
}
