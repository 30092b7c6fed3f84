"use client";

import { useDraggable } from "@dnd-kit/core";
import Link from "next/link";
import { useState } from "react";
import { formatDay } from "@/components/dates";
import { IconCheck, IconClock, IconPerson, IconStop, IconWarn } from "@/components/icons";
import { ClockButton } from "@/components/labour-clock";
import type { MoveRefusal } from "@/components/move-job";
import { RefusalNote } from "@/components/refusal-note";
import type { Stage } from "@/db/schema";
import { STAGE_LABELS, stagesFor } from "@/server/jobs/stages";
import type { BoardCard } from "./board-types";

export interface CardActions {
  moveTo: (card: BoardCard, stage: Stage) => void;
  override: (card: BoardCard, reason: string) => void;
  dismiss: (card: BoardCard) => void;
  /** Show a one-tap clock button on each card (techs). */
  showClock?: boolean;
}

/** A card on the board; `dropBefore` draws the line where a dragged card would land, without moving anything. */
export function DraggableCard({ card, refusal, pending, actions, dropBefore, keyboardTarget }: { card: BoardCard; refusal?: MoveRefusal; pending: boolean; actions: CardActions; dropBefore: boolean; keyboardTarget: boolean }) {
  const { attributes, listeners, setNodeRef, setActivatorNodeRef, isDragging } = useDraggable({ id: card.id, data: { stage: card.stage } });
  return (
    <li ref={setNodeRef} className={`relative scroll-mt-24 scroll-mb-28 ${isDragging ? "opacity-40" : ""}`} data-card={card.workOrder} data-card-id={card.id}>
      {dropBefore && <DropLine where="top" label={keyboardTarget} />}
      <CardBody
        card={card}
        refusal={refusal}
        pending={pending}
        actions={actions}
        handle={
          <button
            type="button"
            ref={setActivatorNodeRef}
            {...attributes}
            {...listeners}
            // touch-action must be set inline: the class alone is not honoured by every touch browser.
            style={{ touchAction: "none" }}
            data-drag-handle
            aria-label={`Drag ${card.workOrder} to another stage or place`}
            className="grid h-11 w-9 shrink-0 cursor-grab pointer-coarse:w-11 place-items-center rounded-md text-ink-soft hover:bg-bay-50 active:cursor-grabbing"
          >
            <svg viewBox="0 0 12 20" className="h-5 w-3" aria-hidden="true">
              {[3, 9].map((x) => [4, 10, 16].map((y) => <circle key={`${x}-${y}`} cx={x} cy={y} r="1.6" fill="currentColor" />))}
            </svg>
          </button>
        }
      />
    </li>
  );
}

export function CardBody({ card, refusal, pending, actions, handle }: { card: BoardCard; refusal?: MoveRefusal; pending?: boolean; actions?: CardActions; handle?: React.ReactNode }) {
  const route = stagesFor(card.scope).filter((s) => s !== card.stage);
  const gateMet = card.gate && card.gate.unmet.length === 0;
  return (
    <article
      aria-label={`${card.workOrder}, ${card.customerName}, unit ${card.unitNumber}`}
      className={`relative rounded-lg border bg-panel p-2 shadow-sm ${refusal ? "border-stop-700" : card.overdue ? "border-spark-500" : "border-line"} ${pending ? "opacity-70" : ""}`}
    >
      <div className="flex items-start gap-1">
        {handle}
        <div className="min-w-0 flex-1">
          <div className="flex items-center justify-between gap-1">
            <Link href={`/jobs/${card.id}`} className="whitespace-nowrap font-bold text-bay-900 underline-offset-2 hover:underline pointer-coarse:inline-flex pointer-coarse:min-h-11 pointer-coarse:items-center">
              {card.workOrder}
            </Link>
            {card.priority === "rush" && <span className="shrink-0 whitespace-nowrap rounded bg-spark-100 px-1.5 text-xs font-bold text-spark-700">▲ Rush</span>}
          </div>
          <p className="truncate text-sm font-semibold" title={card.customerName}>{card.customerName}</p>
          <p className="text-xs text-ink-soft">
            Unit <span className="font-semibold text-ink">{card.unitNumber}</span> · <span className="whitespace-nowrap">VIN …{card.vinLast6}</span>
          </p>
        </div>
      </div>
      <dl className="mt-1 space-y-0.5 text-sm">
        <div className="flex gap-1">
          <dt className="sr-only">Due</dt>
          <dd className={card.overdue ? "font-bold text-stop-700" : "text-ink-soft"}>
            {card.overdue ? <IconWarn /> : <IconClock />} {card.dueOn ? `${card.overdue ? "Overdue · due " : "Due "}${formatDay(card.dueOn)}` : "No due date"}
          </dd>
        </div>
        {card.likelyLate && (
          <div className="flex gap-1">
            <dt className="sr-only">Likely ready</dt>
            <dd className="font-semibold text-warn-700" data-likely-late title={`From the shop's stage times: late case ${formatDay(card.likelyLate.lateOn)}`}>
              <IconWarn /> {card.overdue ? "Likely ready around" : "Likely late: ready around"} {formatDay(card.likelyLate.likelyOn)}
            </dd>
          </div>
        )}
        <div className="flex gap-1">
          <dt className="sr-only">Assigned</dt>
          <dd className="text-ink-soft"><IconPerson /> {card.techName ?? "Unassigned"}</dd>
        </div>
        {card.coating && (
          <div>
            <dt className="sr-only">Out for coating</dt>
            <dd className={card.coating.overdue ? "font-bold text-stop-700" : "text-ink-soft"}>
              {card.coating.overdue ? <IconWarn /> : <IconClock />} {card.coating.overdue ? "Coating overdue" : "At the coater"} · {card.coating.vendorName}, promised {formatDay(card.coating.promisedOn)}
            </dd>
          </div>
        )}
        {card.waitingParts.length > 0 && (
          <div>
            <dt className="sr-only">Bought-in parts</dt>
            <dd className="text-warn-700" data-waiting-parts>
              <IconWarn /> Waiting on {card.waitingParts.length} {card.waitingParts.length === 1 ? "part" : "parts"}:{" "}
              <span className="text-ink">{card.waitingParts.slice(0, 3).join(", ")}{card.waitingParts.length > 3 ? ` and ${card.waitingParts.length - 3} more` : ""}</span>
            </dd>
          </div>
        )}
        {card.money && (
          <div>
            <dt className="sr-only">Money</dt>
            <dd className={/due|declined/i.test(card.money) ? "text-warn-700" : "text-ink-soft"} data-money>
              {card.money}
            </dd>
          </div>
        )}
        {card.scope === "install_only" && (
          <div>
            <dt className="sr-only">Work</dt>
            <dd className="text-xs font-semibold uppercase tracking-wide text-ink-soft">Install only</dd>
          </div>
        )}
        {card.gate && (
          <div>
            <dt className="sr-only">Before it can move to {card.gate.label}</dt>
            <dd className={gateMet ? "text-ok-700" : "text-warn-700"}>
              {gateMet ? <IconCheck /> : <IconStop />} {gateMet ? `Has what ${card.gate.label} needs` : `Needs before it can move to ${card.gate.label}: ${card.gate.unmet.length} ${card.gate.unmet.length === 1 ? "thing" : "things"}`}
              {!gateMet && (
                <details className="text-xs text-ink">
                  <summary className="cursor-pointer text-warn-700 underline pointer-coarse:flex pointer-coarse:min-h-11 pointer-coarse:items-center">What it still needs</summary>
                  <ul className="mt-1 list-disc pl-4">
                    {card.gate.unmet.map((u) => (
                      <li key={u}>{u}</li>
                    ))}
                  </ul>
                </details>
              )}
            </dd>
          </div>
        )}
      </dl>
      {actions && <MoveToList card={card} stages={route} onMove={(stage) => actions.moveTo(card, stage)} />}
      {actions?.showClock && <ClockButton jobId={card.id} workOrder={card.workOrder} compact />}
      {refusal && actions && (
        <div className="mt-2">
          <RefusalNote refusal={refusal} onOverride={(reason) => actions.override(card, reason)} onDismiss={() => actions.dismiss(card)} jobHref={`/jobs/${card.id}`} />
        </div>
      )}
    </article>
  );
}

/** The line (and, for keyboard moves, a label) where a dragged card would land. */
export function DropLine({ where, label }: { where: "top" | "bottom"; label: boolean }) {
  return (
    <div data-drop-marker aria-hidden="true" className={`pointer-events-none absolute inset-x-0 z-10 flex items-center ${where === "top" ? "-top-1.5" : "-bottom-1.5"}`}>
      <div className="h-1 flex-1 rounded-full bg-bay-600" />
      {label && <span className="ml-1 rounded bg-bay-600 px-1.5 text-xs font-bold text-white">Drops here</span>}
    </div>
  );
}

/**
 * "Move to…" only chooses: arrow keys and a gloved tap change the choice, and the card moves
 * when Move is pressed (or Enter on the list).
 */
function MoveToList({ card, stages, onMove }: { card: BoardCard; stages: Stage[]; onMove: (stage: Stage) => void }) {
  const [choice, setChoice] = useState<Stage | "">("");
  const go = () => {
    if (!choice) return;
    onMove(choice);
    setChoice("");
  };
  return (
    <div className="mt-1 flex gap-1">
      <label className="min-w-0 flex-1">
        <span className="sr-only">Move {card.workOrder} to</span>
        <select
          value={choice}
          data-move-to
          onChange={(e) => setChoice(e.target.value as Stage | "")}
          onKeyDown={(e) => {
            if (e.key === "Enter" && choice) {
              e.preventDefault();
              go();
            }
          }}
          className="min-h-11 w-full rounded-md border border-line bg-paper px-2 text-sm font-semibold text-bay-900 xl:px-1"
        >
          <option value="">Move to…</option>
          {stages.map((s) => (
            <option key={s} value={s}>
              {STAGE_LABELS[s]}
            </option>
          ))}
        </select>
      </label>
      <button
        type="button"
        onClick={go}
        aria-disabled={!choice}
        aria-label={choice ? `Move ${card.workOrder} to ${STAGE_LABELS[choice]}` : `Move ${card.workOrder}: choose a stage first`}
        className={`min-h-11 shrink-0 rounded-md px-3 text-sm font-semibold xl:px-2 ${choice ? "bg-bay-700 text-white hover:bg-bay-800" : "border border-line bg-panel text-ink-soft"}`}
      >
        Move
      </button>
    </div>
  );
}
