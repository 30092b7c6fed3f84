"use client";

import {
  type Announcements,
  type CollisionDetection,
  DndContext,
  type DragEndEvent,
  DragOverlay,
  type DragStartEvent,
  KeyboardSensor,
  type KeyboardCoordinateGetter,
  MouseSensor,
  TouchSensor,
  useDroppable,
  useSensor,
  useSensors,
} from "@dnd-kit/core";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { usePathname, useRouter } from "next/navigation";
import { useCallback, useMemo, useRef, useState } from "react";
import { api } from "@/components/api";
import { ClockStrip, type OpenClock } from "@/components/labour-clock";
import { type MoveBody, type MoveRefusal, refusalOf, sendMove, sendUndo } from "@/components/move-job";
import type { Role, Stage } from "@/db/schema";
import { BOARD_STAGES, STAGE_LABELS, stagesFor } from "@/server/jobs/stages";
import { type CardActions, CardBody, DraggableCard, DropLine } from "./board-card";
import { type DropTarget, columnDropId, dropTargetAt, nextKeyboardTarget, targetElement, useEdgeScroll } from "./board-dnd";
import { BoardFilters, activeFilterCount } from "./board-filters";
import { type Board, type BoardCard, type BoardFilter, filterToSearch } from "./board-types";
import { FirstSteps } from "./first-steps";
import { MoveToast, type Toast } from "./move-toast";

const boardKey = (filter: BoardFilter) => ["board", filterToSearch(filter)] as const;

const jobs = (n: number) => `${n} ${n === 1 ? "job" : "jobs"}`;

interface PlannedMove {
  card: BoardCard;
  body: MoveBody;
}

/** Applies a move to the cached board at once, so the card lands where it was dropped. */
function applyMove(board: Board, jobId: number, toStage: Stage, beforeJobId: number | null | undefined): Board {
  const moving = board.cards.find((c) => c.id === jobId);
  if (!moving) return board;
  const rest = board.cards.filter((c) => c.id !== jobId);
  const placed = { ...moving, stage: toStage };
  const index = beforeJobId ? rest.findIndex((c) => c.id === beforeJobId) : -1;
  if (index >= 0) rest.splice(index, 0, placed);
  else {
    const lastInColumn = rest.map((c) => c.stage).lastIndexOf(toStage);
    rest.splice(lastInColumn >= 0 ? lastInColumn + 1 : rest.length, 0, placed);
  }
  return { ...board, cards: rest };
}

/** The card and what to put on it once the board has drawn: keyboard focus (and the view) on the card or on its refusal. */
interface FocusRequest {
  id: number;
  on: "card" | "refusal";
}

export function BoardView({ initial, initialFilter, role, meId, denied, clock }: { initial: Board; initialFilter: BoardFilter; role: Role; meId: string; denied: boolean; clock?: OpenClock | null }) {
  const router = useRouter();
  const pathname = usePathname();
  const qc = useQueryClient();
  const [filter, setFilter] = useState<BoardFilter>(initialFilter);
  const [filtersOpen, setFiltersOpen] = useState(false);
  const [dragging, setDragging] = useState<{ card: BoardCard; by: "pointer" | "keyboard" } | null>(null);
  const [dropTarget, setDropTarget] = useState<DropTarget | null>(null);
  const [refusals, setRefusals] = useState<Record<number, { refusal: MoveRefusal; body: MoveBody }>>({});
  const [dragNews, setDragNews] = useState("");
  const [toast, setToast] = useState<Toast | null>(null);
  const closeToast = useCallback(() => setToast(null), []);
  const scroller = useRef<HTMLDivElement>(null);
  const edge = useEdgeScroll(scroller);
  const draggingRef = useRef<BoardCard | null>(null);
  const pointerTarget = useRef<DropTarget | null>(null);
  const keyboardTarget = useRef<DropTarget | null>(null);
  const pointer = useRef<{ x: number; y: number } | null>(null);

  const key = boardKey(filter);
  const { data: board = initial, isFetching } = useQuery({
    queryKey: key,
    queryFn: ({ signal }) => api<Board>(`/api/board?${filterToSearch(filter)}`, { signal }),
    initialData: filterToSearch(filter) === filterToSearch(initialFilter) ? initial : undefined,
    // Several people work the board at once: refresh on focus and every 15 s, but not mid-drag.
    refetchInterval: dragging ? false : 15_000,
    refetchOnWindowFocus: true,
    placeholderData: (prev) => prev,
  });

  const changeFilter = useCallback(
    (next: BoardFilter) => {
      setFilter(next);
      const search = filterToSearch(next);
      router.replace(search ? `${pathname}?${search}` : pathname, { scroll: false });
    },
    [pathname, router],
  );

  const columns = useMemo(() => {
    const by = new Map<Stage, BoardCard[]>(board.columns.map((c) => [c.stage, []]));
    for (const card of board.cards) by.get(card.stage)?.push(card);
    return by;
  }, [board]);
  const cardById = useMemo(() => new Map(board.cards.map((c) => [c.id, c])), [board]);
  const othersIn = useCallback((stage: Stage, exceptId: number) => (columns.get(stage) ?? []).filter((c) => c.id !== exceptId), [columns]);

  // Focus goes to the moved card (or to why it was not moved) once the board has drawn it, and the card is scrolled into view.
  const focusCard = useCallback((request: FocusRequest) => {
    let tries = 0;
    const attempt = () => {
      const li = document.querySelector<HTMLElement>(`li[data-card-id="${request.id}"]`);
      const target = li?.querySelector<HTMLElement>(request.on === "refusal" ? "[data-refusal]" : "[data-drag-handle]");
      if (li && target) {
        target.focus({ preventScroll: true });
        li.scrollIntoView({ block: "nearest", inline: "nearest", behavior: "smooth" });
      } else if (++tries < 20) requestAnimationFrame(attempt);
    };
    requestAnimationFrame(() => requestAnimationFrame(attempt));
  }, []);

  const undo = useMutation({
    mutationFn: ({ card, eventId }: { card: BoardCard; eventId: number; backTo: Stage }) => sendUndo(card.id, eventId),
    onMutate: () => setToast((t) => (t ? { ...t, busy: true } : t)),
    onSuccess: async (_res, { card, backTo }) => {
      await qc.refetchQueries({ queryKey: ["board"], type: "active" });
      setToast({ key: Date.now(), text: `${card.workOrder} is back in ${STAGE_LABELS[backTo]}.`, tone: "ok", ms: 6_000 });
      focusCard({ id: card.id, on: "card" });
    },
    onError: async (err, { card, backTo }) => {
      const refusal = refusalOf(err, backTo);
      await qc.refetchQueries({ queryKey: ["board"], type: "active" });
      const current = qc.getQueryData<Board>(key)?.cards.find((c) => c.id === card.id);
      if (refusal.kind === "gate" && current) {
        setRefusals((r) => ({ ...r, [card.id]: { refusal: { ...refusal, canOverride: refusal.canOverride && role === "owner" }, body: { toStage: backTo, version: current.version } } }));
        setToast(null);
        focusCard({ id: card.id, on: "refusal" });
      } else {
        setToast({ key: Date.now(), text: `Not undone: ${refusal.message}`, tone: "stop", ms: 15_000 });
      }
    },
  });

  const move = useMutation({
    mutationFn: ({ card, body }: PlannedMove) => sendMove(card.id, body),
    onMutate: async ({ card, body }) => {
      await qc.cancelQueries({ queryKey: ["board"] });
      const snapshot = qc.getQueryData<Board>(key);
      if (snapshot) qc.setQueryData<Board>(key, applyMove(snapshot, card.id, body.toStage, body.beforeJobId));
      setRefusals(({ [card.id]: _, ...rest }) => rest);
      setToast(null);
      focusCard({ id: card.id, on: "card" });
      return { snapshot };
    },
    onError: (err, { card, body }, context) => {
      if (context?.snapshot) qc.setQueryData(key, context.snapshot);
      const refusal = refusalOf(err, body.toStage);
      setRefusals((r) => ({ ...r, [card.id]: { refusal: { ...refusal, canOverride: refusal.canOverride && role === "owner" }, body } }));
      setDragNews(`${card.workOrder} was not moved: ${refusal.unmet[0] ?? refusal.message}`);
      focusCard({ id: card.id, on: "refusal" });
    },
    onSuccess: (res, { card, body }) => {
      const within = card.stage === body.toStage;
      setToast({
        key: Date.now(),
        text: within ? `Moved ${card.workOrder} within ${STAGE_LABELS[body.toStage]}` : `Moved ${card.workOrder} to ${STAGE_LABELS[body.toStage]}`,
        tone: "ok",
        ms: 10_000,
        undo: {
          label: within ? `Undo: put ${card.workOrder} back in its place` : `Undo: put ${card.workOrder} back in ${STAGE_LABELS[card.stage]}`,
          run: () => undo.mutate({ card, eventId: res.eventId, backTo: card.stage }),
        },
      });
      focusCard({ id: card.id, on: "card" });
    },
    // Not awaited: the card stops looking busy as soon as the server has answered.
    onSettled: () => {
      void qc.invalidateQueries({ queryKey: ["board"] });
    },
  });

  const actions: CardActions = {
    moveTo: (card, stage) => move.mutate({ card, body: { toStage: stage, version: card.version } }),
    override: (card, reason) => {
      const attempt = refusals[card.id];
      if (attempt) move.mutate({ card, body: { ...attempt.body, override: { reason } } });
    },
    dismiss: (card) => {
      setRefusals(({ [card.id]: _, ...rest }) => rest);
      focusCard({ id: card.id, on: "card" });
    },
    // Techs clock their hours from the card; the office's desk board stays dense.
    showClock: role === "tech",
  };

  const routeOf = useCallback((card: BoardCard) => stagesFor(card.scope).filter((s) => (BOARD_STAGES as readonly Stage[]).includes(s)), []);

  function describeTarget(card: BoardCard, target: DropTarget) {
    const count = othersIn(target.stage, card.id).length + 1;
    return `${card.workOrder} is over ${STAGE_LABELS[target.stage]}, place ${target.index + 1} of ${count}.`;
  }

  // Keyboard moves go stage by stage along the card's route; the target is kept here, not guessed from boxes on screen.
  const keyboardCoordinates: KeyboardCoordinateGetter = (event, { currentCoordinates }) => {
    const card = draggingRef.current;
    const from = keyboardTarget.current;
    if (!card || !from) return undefined;
    const next = nextKeyboardTarget(event.code, from, routeOf(card), (stage) => othersIn(stage, card.id).length);
    if (!next) return undefined;
    event.preventDefault();
    keyboardTarget.current = next;
    setDropTarget(next);
    setDragNews(describeTarget(card, next));
    targetElement(next, card.id)?.scrollIntoView({ block: "nearest", inline: "nearest" });
    return currentCoordinates;
  };

  // Drops follow the pointer itself: the column under it, and the place between the cards there.
  const collisionDetection: CollisionDetection = ({ pointerCoordinates, active }) => {
    if (!pointerCoordinates) return keyboardTarget.current ? [{ id: columnDropId(keyboardTarget.current.stage) }] : [];
    pointer.current = pointerCoordinates;
    const target = dropTargetAt(pointerCoordinates, Number(active.id));
    pointerTarget.current = target;
    return target ? [{ id: columnDropId(target.stage) }] : [];
  };

  const sensors = useSensors(
    useSensor(MouseSensor, { activationConstraint: { distance: 6 } }),
    // A short press starts a drag on a phone, so a tap or a scroll never moves a card by accident.
    useSensor(TouchSensor, { activationConstraint: { delay: 180, tolerance: 8 } }),
    useSensor(KeyboardSensor, { coordinateGetter: keyboardCoordinates }),
  );

  const syncPointerTarget = () => {
    if (keyboardTarget.current) return;
    const t = pointerTarget.current;
    setDropTarget((prev) => (prev?.stage === t?.stage && prev?.index === t?.index ? prev : t));
  };

  const announcements: Announcements = {
    onDragStart: ({ active }) => `Picked up ${cardById.get(Number(active.id))?.workOrder}. Right and Left go to the next or previous stage, Up and Down change its place in the stage; space drops it, escape cancels.`,
    onDragOver: ({ active, over }) => {
      if (draggingRef.current && keyboardTarget.current) return undefined;
      const card = cardById.get(Number(active.id));
      return over && card ? `${card.workOrder} is over ${STAGE_LABELS[String(over.id).slice(7) as Stage]}.` : "Not over a stage.";
    },
    onDragEnd: ({ active, over }) => (over ? `Dropped ${cardById.get(Number(active.id))?.workOrder}.` : "Dropped where it was."),
    onDragCancel: ({ active }) => `Cancelled. ${cardById.get(Number(active.id))?.workOrder} stays where it was.`,
  };

  function endDrag() {
    draggingRef.current = null;
    keyboardTarget.current = null;
    pointerTarget.current = null;
    pointer.current = null;
    edge.stop();
    setDragging(null);
    setDropTarget(null);
  }

  function onDragStart(e: DragStartEvent) {
    const card = cardById.get(Number(e.active.id));
    if (!card) return;
    draggingRef.current = card;
    const byKeyboard = typeof KeyboardEvent !== "undefined" && e.activatorEvent instanceof KeyboardEvent;
    if (byKeyboard) {
      const start = { stage: card.stage, index: (columns.get(card.stage) ?? []).findIndex((c) => c.id === card.id) };
      keyboardTarget.current = start;
      setDropTarget(start);
    }
    setDragging({ card, by: byKeyboard ? "keyboard" : "pointer" });
  }

  function onDragEnd(e: DragEndEvent) {
    const card = cardById.get(Number(e.active.id));
    const target = keyboardTarget.current ?? (e.over ? pointerTarget.current : null);
    const byKeyboard = keyboardTarget.current !== null;
    endDrag();
    if (!card) return;
    if (!target) {
      if (byKeyboard) focusCard({ id: card.id, on: "card" });
      return;
    }
    const others = othersIn(target.stage, card.id);
    const ownIndex = (columns.get(card.stage) ?? []).findIndex((c) => c.id === card.id);
    if (target.stage === card.stage && target.index === ownIndex) {
      focusCard({ id: card.id, on: "card" });
      return;
    }
    move.mutate({ card, body: { toStage: target.stage, beforeJobId: others[target.index]?.id ?? null, version: card.version } });
  }

  const filterCount = activeFilterCount(filter);
  const canOpenJobs = role !== "tech";

  return (
    <div className="space-y-3">
      {denied && (
        <p role="note" className="rounded-md border border-warn-700/40 bg-warn-100 p-2 text-sm text-ink">
          That page is for the office and the owner, so you were brought back to the board. Ask the office if something there needs changing.
        </p>
      )}
      <div className="flex flex-wrap items-center justify-between gap-2">
        <div className="flex items-baseline gap-2">
          <h1 className="text-2xl font-bold">Board</h1>
          <p className="text-sm text-ink-soft">
            {jobs(board.cards.length)} on the board{isFetching ? " · refreshing…" : ""}
          </p>
        </div>
        <div className="flex gap-2">
          <button
            type="button"
            aria-expanded={filtersOpen}
            aria-controls="board-filters"
            onClick={() => setFiltersOpen((o) => !o)}
            className={`min-h-11 rounded-md border px-3 font-semibold md:hidden ${filterCount ? "border-bay-700 bg-bay-700 text-white" : "border-line bg-panel text-bay-900"}`}
          >
            Filter{filterCount ? ` · ${filterCount} on` : ""}
          </button>
          {canOpenJobs && (
            <Link href="/jobs/new" className="inline-flex min-h-11 items-center rounded-md bg-bay-700 px-3 font-semibold text-white hover:bg-bay-800">
              New job
            </Link>
          )}
        </div>
      </div>
      <ClockStrip initial={clock} />
      <BoardFilters filter={filter} board={board} onChange={changeFilter} meId={meId} open={filtersOpen} />
      {board.firstSteps && <FirstSteps steps={board.firstSteps} canOpenJobs={canOpenJobs} />}
      {!board.firstSteps && board.cards.length === 0 && filterCount > 0 && (
        <p className="rounded-md border border-line bg-panel p-2 text-sm">No job on the board matches these filters. Change them or clear them to see every job.</p>
      )}
      <nav aria-label="Jump to a stage" className="relative -mx-4 flex gap-1 overflow-x-auto px-4 pb-1 xl:hidden">
        {board.columns.map((c) => (
          <a key={c.stage} href={`#column-${c.stage}`} className="flex min-h-11 shrink-0 items-center rounded-full border border-line bg-panel px-3 text-sm font-semibold">
            {c.label} <span className="ml-1 rounded-full bg-bay-100 px-1.5 text-bay-900">{columns.get(c.stage)?.length ?? 0}</span>
          </a>
        ))}
      </nav>
      <p role="status" aria-live="polite" className="sr-only" data-drag-news>{dragNews}</p>
      <DndContext
        sensors={sensors}
        collisionDetection={collisionDetection}
        // The board's sideways scroll is ours (one column at a time); dnd-kit scrolls only the page up and down.
        autoScroll={{ threshold: { x: 0.06, y: 0.12 }, acceleration: 4, canScroll: (el) => el !== scroller.current }}
        onDragStart={onDragStart}
        onDragMove={() => {
          edge.update(pointer.current);
          syncPointerTarget();
        }}
        onDragOver={syncPointerTarget}
        onDragEnd={onDragEnd}
        onDragCancel={(e) => {
          endDrag();
          focusCard({ id: Number(e.active.id), on: "card" });
        }}
        accessibility={{
          announcements,
          screenReaderInstructions: { draggable: "To pick up a card, press space or enter on its handle. Right and Left move it to the next or previous stage, Up and Down change its place in the stage. Press space or enter again to drop it, or escape to cancel." },
        }}
      >
        <div
          ref={scroller}
          onScroll={() => dragging?.by === "pointer" && requestAnimationFrame(syncPointerTarget)}
          className="relative -mx-4 flex snap-x snap-mandatory gap-2 overflow-x-auto px-4 pb-4 xl:mx-0 xl:grid xl:snap-none xl:grid-cols-7 xl:overflow-visible xl:px-0"
        >
          {board.columns.map((col) => (
            <Column
              key={col.stage}
              stage={col.stage}
              label={col.label}
              cards={columns.get(col.stage) ?? []}
              refusals={refusals}
              pendingId={move.isPending ? move.variables?.card.id : undefined}
              actions={actions}
              activeId={dragging?.card.id}
              dropIndex={dropTarget?.stage === col.stage ? dropTarget.index : null}
              byKeyboard={dragging?.by === "keyboard"}
            />
          ))}
        </div>
        <DragOverlay dropAnimation={null}>
          {dragging?.by === "pointer" ? (
            <div data-drag-overlay className="rotate-1 shadow-xl">
              <CardBody card={dragging.card} />
            </div>
          ) : null}
        </DragOverlay>
      </DndContext>
      <MoveToast toast={toast} onClose={closeToast} />
    </div>
  );
}

function Column({
  stage, label, cards, refusals, pendingId, actions, activeId, dropIndex, byKeyboard,
}: {
  stage: Stage; label: string; cards: BoardCard[]; refusals: Record<number, { refusal: MoveRefusal }>; pendingId?: number; actions: CardActions;
  activeId?: number; dropIndex: number | null; byKeyboard: boolean;
}) {
  const { setNodeRef } = useDroppable({ id: columnDropId(stage) });
  const others = cards.filter((c) => c.id !== activeId);
  const highlighted = dropIndex !== null;
  return (
    <section
      ref={setNodeRef}
      id={`column-${stage}`}
      data-drop-stage={stage}
      aria-labelledby={`column-${stage}-title`}
      className="flex w-[85vw] max-w-80 shrink-0 snap-start flex-col xl:w-auto xl:max-w-none"
    >
      <h2 id={`column-${stage}-title`} className="sticky top-0 z-10 flex items-center justify-between rounded-t-lg bg-bay-800 px-2 py-1.5 text-sm font-bold text-white">
        {label}
        <span className="rounded-full bg-bay-600 px-2 text-xs" aria-label={jobs(cards.length)}>{cards.length}</span>
      </h2>
      <ul data-stage={stage} className={`relative min-h-32 flex-1 space-y-2 rounded-b-lg border-2 p-1.5 ${highlighted ? "border-dashed border-bay-600 bg-bay-50" : "border-transparent bg-bay-100/50"}`}>
        {cards.map((card) => (
          <DraggableCard
            key={card.id}
            card={card}
            refusal={refusals[card.id]?.refusal}
            pending={pendingId === card.id}
            actions={actions}
            dropBefore={dropIndex !== null && card.id !== activeId && others.indexOf(card) === dropIndex}
            keyboardTarget={byKeyboard}
          />
        ))}
        {others.length === 0 && <li className="p-3 text-center text-sm text-ink-soft">{highlighted ? `Drops here, in ${label}.` : `No jobs here. Drop a card to move it to ${label}.`}</li>}
        {others.length > 0 && dropIndex === others.length && (
          <li aria-hidden="true" className="relative h-0">
            <DropLine where="bottom" label={byKeyboard} />
          </li>
        )}
      </ul>
    </section>
  );
}
