"use client";

import { useState } from "react";
import { STAGE_LABELS } from "@/server/jobs/stages";
import { IconStop } from "./icons";
import type { MoveRefusal } from "./move-job";

/** A refused move says why, and offers the owner an override with a written reason. */
export function RefusalNote({ refusal, onOverride, onDismiss, jobHref }: { refusal: MoveRefusal; onOverride?: (reason: string) => void; onDismiss?: () => void; jobHref?: string }) {
  const [reason, setReason] = useState("");
  return (
    <div role="alert" tabIndex={-1} data-refusal className="space-y-2 rounded-md border border-stop-700/40 bg-stop-100 p-2 text-sm text-stop-700">
      <p className="font-semibold"><IconStop /> {refusal.kind === "gate" ? (refusal.toStage ? `Not moved. Needs before it can move to ${STAGE_LABELS[refusal.toStage]}:` : "Not moved. It still needs:") : refusal.message}</p>
      {refusal.unmet.length > 0 && (
        <ul className="list-disc space-y-0.5 pl-5">
          {refusal.unmet.map((u) =>
            jobHref === undefined ? (
              <li key={u}>{withoutHeadingStage(u, refusal.toStage)}</li>
            ) : (
              <li key={u}>
                {/* Each need opens the part of the job page where it is recorded. */}
                <a href={`${jobHref}#${recordAnchorOf(u)}`} className="underline decoration-stop-700/50 underline-offset-2 hover:decoration-2">{withoutHeadingStage(u, refusal.toStage)}</a>
              </li>
            ),
          )}
        </ul>
      )}
      {jobHref && refusal.unmet.length > 0 && (
        <a href={`${jobHref}#${recordAnchorOf(refusal.unmet[0])}`} className="inline-flex min-h-11 items-center font-semibold text-bay-900 underline">
          Open the job's records to fix this →
        </a>
      )}
      {refusal.canOverride && onOverride && (
        <form
          className="space-y-1"
          onSubmit={(e) => {
            e.preventDefault();
            onOverride(reason);
          }}
        >
          <label className="block font-semibold text-ink">
            Override as owner: write the reason (kept on the job's timeline)
            <textarea value={reason} onChange={(e) => setReason(e.target.value)} rows={2} className="mt-1 block w-full rounded border border-line bg-panel p-2 text-ink" />
          </label>
          <button type="submit" className="min-h-11 rounded-md bg-warn-700 px-3 font-semibold text-white disabled:opacity-50" disabled={reason.trim().length < 5}>
            Override and move
          </button>
        </form>
      )}
      {onDismiss && (
        <button type="button" className="min-h-11 font-semibold underline" onClick={onDismiss}>
          Dismiss
        </button>
      )}
    </div>
  );
}

/** The part of the job page where a missing record is kept. */
export function recordAnchorOf(item: string) {
  if (/sign-off/i.test(item)) return "sign-off";
  if (/waiting on/i.test(item)) return "bought-parts";
  if (/approved quote/i.test(item)) return "quote";
  if (/deposit|invoice|balance|on account/i.test(item)) return "money";
  return "parts";
}

/** "Into Install: …" under "Needs before it can move to Install:" says the stage twice; a move across several stages keeps the other stages' names. */
function withoutHeadingStage(item: string, toStage: MoveRefusal["toStage"]) {
  const prefix = toStage ? `Into ${STAGE_LABELS[toStage]}: ` : null;
  return prefix && item.startsWith(prefix) ? item.slice(prefix.length) : item;
}
