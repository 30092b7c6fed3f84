"use client";

import Link from "next/link";
import { createContext, useContext, useEffect, useRef, useState } from "react";
import { IconCheck, IconStop } from "@/components/icons";
import type { RunJobMove } from "@/server/records/run-moves";
import { STAGE_LABELS } from "@/server/jobs/stages";

export interface RunOutcome {
  /** "Run 12 is out to … with 3 parts." */
  headline: string;
  moves: RunJobMove[];
}

const OutcomeContext = createContext<(outcome: RunOutcome) => void>(() => {});

/** Keeps the last run's outcome on screen while the page refreshes under it (the form that sent it may be gone). */
export function RunOutcomeProvider({ children }: { children: React.ReactNode }) {
  const [outcome, setOutcome] = useState<RunOutcome | null>(null);
  const [shown, setShown] = useState(0);
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (shown) ref.current?.focus();
  }, [shown]);
  return (
    <OutcomeContext.Provider
      value={(o) => {
        setOutcome(o);
        setShown((n) => n + 1);
      }}
    >
      <div ref={ref} tabIndex={-1} role="status" aria-label="What the last save did" className="scroll-mt-4 outline-none">
        {outcome && <RunOutcomeNote outcome={outcome} onDismiss={() => setOutcome(null)} />}
      </div>
      {children}
    </OutcomeContext.Provider>
  );
}

export const useRunOutcome = () => useContext(OutcomeContext);

function RunOutcomeNote({ outcome, onDismiss }: { outcome: RunOutcome; onDismiss: () => void }) {
  const moved = outcome.moves.filter((m) => m.moved);
  const stayed = outcome.moves.filter((m) => !m.moved);
  return (
    <div className="mb-4 space-y-2 rounded-lg border border-ok-700/40 bg-ok-100 p-3 text-sm" data-run-outcome>
      <p className="font-semibold text-ok-700">
        <IconCheck /> {outcome.headline}
      </p>
      {moved.length > 0 && (
        <ul className="space-y-1">
          {moved.map((m) => (
            <li key={m.jobId} className="text-ok-700">
              <IconCheck /> <JobLink move={m} /> moved to {STAGE_LABELS[m.toStage]}.
            </li>
          ))}
        </ul>
      )}
      {stayed.length > 0 && (
        <ul className="space-y-2 rounded-md border border-stop-700/40 bg-stop-100 p-2 text-stop-700">
          {stayed.map((m) => (
            <li key={m.jobId}>
              <p className="font-semibold">
                <IconStop /> <JobLink move={m} /> not moved (still in {STAGE_LABELS[m.stage]}). {m.reason}
              </p>
              {m.unmet && (
                <ul className="list-disc pl-5">
                  {m.unmet.map((u) => (
                    <li key={u}>{u}</li>
                  ))}
                </ul>
              )}
            </li>
          ))}
        </ul>
      )}
      <button type="button" onClick={onDismiss} className="inline-flex min-h-11 items-center font-semibold underline">
        Dismiss
      </button>
    </div>
  );
}

function JobLink({ move }: { move: RunJobMove }) {
  return (
    <Link href={`/jobs/${move.jobId}`} className="font-semibold underline">
      {move.workOrder}
    </Link>
  );
}

/** One tick box a job: move it with the run (ticked unless someone unticks it). */
export function MoveJobChoices({ jobs, toStage, skipped, onToggle }: { jobs: { jobId: number; workOrder: string; customerName: string; unitNumber: string }[]; toStage: "coating" | "install"; skipped: number[]; onToggle: (jobId: number, move: boolean) => void }) {
  if (jobs.length === 0) return null;
  return (
    <fieldset className="space-y-1 rounded-md border border-line p-2">
      <legend className="px-1 text-sm font-semibold">Move to {STAGE_LABELS[toStage]}</legend>
      <p className="text-sm text-ink-soft">
        {toStage === "coating"
          ? "Every part these jobs send for coating goes out on this run. Moving them checks what Outside coating needs, like a move on the board; the customer hears after the usual quiet period."
          : "Every part these jobs sent for coating is back with this inspection. Moving them checks what Install needs, like a move on the board; the customer hears after the usual quiet period."}
      </p>
      {jobs.map((j) => (
        <label key={j.jobId} className="flex min-h-11 cursor-pointer items-center gap-3">
          <input type="checkbox" name="moveJob" value={j.jobId} checked={!skipped.includes(j.jobId)} onChange={(e) => onToggle(j.jobId, e.target.checked)} className="h-5 w-5 shrink-0 accent-bay-700" />
          <span>
            Move {j.workOrder} · {j.customerName} · unit {j.unitNumber}
          </span>
        </label>
      ))}
    </fieldset>
  );
}
