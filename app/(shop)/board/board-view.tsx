"use client";

import {
  type Announcements,
  DndContext,
  type DragEndEvent,
  DragOverlay,
  type DragStartEvent,
  KeyboardSensor,
  MouseSensor,
  TouchSensor,
  closestCorners,
  useDroppable,
  useSensor,
  useSensors,
} from "@dnd-kit/core";
import { SortableContext, arrayMove, sortableKeyboardCoordinates, verticalListSortingStrategy } from "@dnd-kit/sortable";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { usePathname, useRouter } from "next/navigation";
import { useCallback, useMemo, useState } from "react";
import { api } from "@/components/api";
import { type MoveBody, type MoveRefusal, refusalOf, sendMove } from "@/components/move-job";
import type { Role, Stage } from "@/db/schema";
import { STAGE_LABELS } from "@/server/jobs/stages";
import { type CardActions, CardBody, SortableCard } from "./board-card";
import { BoardFilters } from "./board-filters";
import { type Board, type BoardCard, type BoardFilter, filterToSearch } from "./board-types";

const boardKey = (filter: BoardFilter) => ["board", filterToSearch(filter)] as const;

// Gentle edge scrolling: on a phone the next column shows only as a strip at the screen's edge,
// and the default speed carried a card past it to the last column.
const AUTO_SCROLL = { threshold: { x: 0.06, y: 0.12 }, acceleration: 2 };

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

export function BoardView({ initial, initialFilter, role, meId }: { initial: Board; initialFilter: BoardFilter; role: Role; meId: string }) {
  const router = useRouter();
  const pathname = usePathname();
  const qc = useQueryClient();
  const [filter, setFilter] = useState<BoardFilter>(initialFilter);
  const [dragging, setDragging] = useState<BoardCard | null>(null);
  const [refusals, setRefusals] = useState<Record<number, { refusal: MoveRefusal; body: MoveBody }>>({});
  const [status, setStatus] = useState<string>("");

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

  const move = useMutation({
    mutationFn: ({ card, body }: PlannedMove) => sendMove(card.id, body),
    onMutate: async ({ card, body }) => {
      await qc.cancelQueries({ queryKey: ["board"] });
      const snapshot = qc.getQueryData<Board>(key);
      if (snapshot) qc.setQueryData<Board>(key, applyMove(snapshot, card.id, body.toStage, body.beforeJobId));
      setRefusals(({ [card.id]: _, ...rest }) => rest);
      return { snapshot };
    },
    onError: (err, { card, body }, context) => {
      if (context?.snapshot) qc.setQueryData(key, context.snapshot);
      const refusal = refusalOf(err);
      setRefusals((r) => ({ ...r, [card.id]: { refusal: { ...refusal, canOverride: refusal.canOverride && role === "owner" }, body } }));
      setStatus(`${card.workOrder} was not moved: ${refusal.unmet[0] ?? refusal.message}`);
    },
    onSuccess: (_res, { card, body }) => setStatus(`${card.workOrder} moved to ${STAGE_LABELS[body.toStage]}.`),
    onSettled: () => qc.invalidateQueries({ queryKey: ["board"] }),
  });

  const columns = useMemo(() => {
    const by = new Map<Stage, BoardCard[]>(board.columns.map((c) => [c.stage, []]));
    for (const card of board.cards) by.get(card.stage)?.push(card);
    return by;
  }, [board]);
  const cardById = useMemo(() => new Map(board.cards.map((c) => [c.id, c])), [board]);

  const actions: CardActions = {
    moveTo: (card, stage) => move.mutate({ card, body: { toStage: stage, version: card.version } }),
    override: (card, reason) => {
      const attempt = refusals[card.id];
      if (attempt) move.mutate({ card, body: { ...attempt.body, override: { reason } } });
    },
    dismiss: (card) => setRefusals(({ [card.id]: _, ...rest }) => rest),
  };

  const sensors = useSensors(
    useSensor(MouseSensor, { activationConstraint: { distance: 6 } }),
    // A short press starts a drag on a phone, so a tap or a scroll never moves a card by accident.
    useSensor(TouchSensor, { activationConstraint: { delay: 180, tolerance: 8 } }),
    useSensor(KeyboardSensor, { coordinateGetter: sortableKeyboardCoordinates }),
  );

  const describe = (id: string | number | undefined) => {
    if (id === undefined) return "";
    if (typeof id === "string" && id.startsWith("column:")) return `the ${STAGE_LABELS[id.slice(7) as Stage]} column`;
    const card = cardById.get(Number(id));
    return card ? `${card.workOrder} in ${STAGE_LABELS[card.stage]}` : "";
  };
  const announcements: Announcements = {
    onDragStart: ({ active }) => `Picked up ${describe(active.id)}. Use the arrow keys to move, space to drop, escape to cancel.`,
    onDragOver: ({ active, over }) => (over ? `${cardById.get(Number(active.id))?.workOrder} is over ${describe(over.id)}.` : "Not over a stage."),
    onDragEnd: ({ active, over }) => (over ? `Dropped ${cardById.get(Number(active.id))?.workOrder} at ${describe(over.id)}.` : "Dropped where it was."),
    onDragCancel: ({ active }) => `Cancelled. ${cardById.get(Number(active.id))?.workOrder} stays where it was.`,
  };

  function onDragStart(e: DragStartEvent) {
    setDragging(cardById.get(Number(e.active.id)) ?? null);
  }

  function onDragEnd(e: DragEndEvent) {
    setDragging(null);
    const card = cardById.get(Number(e.active.id));
    if (!card || !e.over) return;
    const overId = e.over.id;
    let toStage: Stage;
    let beforeJobId: number | null = null;
    if (typeof overId === "string" && overId.startsWith("column:")) {
      toStage = overId.slice(7) as Stage;
    } else {
      const overCard = cardById.get(Number(overId));
      if (!overCard) return;
      toStage = overCard.stage;
      const ids = (columns.get(toStage) ?? []).map((c) => c.id);
      if (overCard.stage === card.stage) {
        const from = ids.indexOf(card.id);
        const to = ids.indexOf(overCard.id);
        if (from === to) return;
        const reordered = arrayMove(ids, from, to);
        beforeJobId = reordered[to + 1] ?? null;
      } else {
        beforeJobId = overCard.id;
      }
    }
    if (toStage === card.stage && beforeJobId === null && (columns.get(toStage) ?? []).at(-1)?.id === card.id) return;
    move.mutate({ card, body: { toStage, beforeJobId, version: card.version } });
  }

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h1 className="text-2xl font-bold">Board</h1>
        <p className="text-sm text-ink-soft" aria-live="polite">
          {board.cards.length} on the board{isFetching ? " · refreshing…" : ""}
        </p>
      </div>
      <BoardFilters filter={filter} board={board} onChange={changeFilter} meId={meId} />
      <nav aria-label="Jump to a stage" className="relative -mx-4 flex gap-1 overflow-x-auto px-4 pb-1 xl:hidden">
        {board.columns.map((c) => (
          <a key={c.stage} href={`#column-${c.stage}`} className="flex min-h-11 shrink-0 items-center rounded-full border border-line bg-panel px-3 text-sm font-semibold">
            {c.label} <span className="ml-1 rounded-full bg-bay-100 px-1.5 text-bay-900">{columns.get(c.stage)?.length ?? 0}</span>
          </a>
        ))}
      </nav>
      <p role="status" aria-live="polite" className="sr-only">{status}</p>
      <DndContext sensors={sensors} collisionDetection={closestCorners} autoScroll={AUTO_SCROLL} onDragStart={onDragStart} onDragEnd={onDragEnd} onDragCancel={() => setDragging(null)} accessibility={{ announcements, screenReaderInstructions: { draggable: "To pick up a card, press space or enter on its handle. Use the arrow keys to move it between stages and within a stage. Press space or enter again to drop it, or escape to cancel." } }}>
        <div className="relative -mx-4 flex snap-x snap-mandatory gap-2 overflow-x-auto px-4 pb-4 xl:mx-0 xl:grid xl:snap-none xl:grid-cols-7 xl:overflow-visible xl:px-0">
          {board.columns.map((col) => (
            <Column key={col.stage} stage={col.stage} label={col.label} cards={columns.get(col.stage) ?? []} refusals={refusals} pendingId={move.isPending ? move.variables?.card.id : undefined} actions={actions} />
          ))}
        </div>
        <DragOverlay>{dragging ? <div className="w-64 rotate-1"><CardBody card={dragging} /></div> : null}</DragOverlay>
      </DndContext>
    </div>
  );
}

function Column({ stage, label, cards, refusals, pendingId, actions }: { stage: Stage; label: string; cards: BoardCard[]; refusals: Record<number, { refusal: MoveRefusal }>; pendingId?: number; actions: CardActions }) {
  const { setNodeRef, isOver } = useDroppable({ id: `column:${stage}` });
  return (
    <section id={`column-${stage}`} aria-labelledby={`column-${stage}-title`} className="w-[85vw] max-w-80 shrink-0 snap-start xl:w-auto xl:max-w-none">
      <h2 id={`column-${stage}-title`} className="sticky top-0 z-10 flex items-center justify-between rounded-t-lg bg-bay-800 px-2 py-1.5 text-sm font-bold text-white">
        {label}
        <span className="rounded-full bg-bay-600 px-2 text-xs" aria-label={`${cards.length} jobs`}>{cards.length}</span>
      </h2>
      <SortableContext id={stage} items={cards.map((c) => c.id)} strategy={verticalListSortingStrategy}>
        <ul ref={setNodeRef} data-stage={stage} className={`min-h-32 space-y-2 rounded-b-lg border-2 p-1.5 ${isOver ? "border-dashed border-bay-600 bg-bay-50" : "border-transparent bg-bay-100/50"}`}>
          {cards.map((card) => (
            <SortableCard key={card.id} card={card} refusal={refusals[card.id]?.refusal} pending={pendingId === card.id} actions={actions} />
          ))}
          {cards.length === 0 && <li className="p-3 text-center text-sm text-ink-soft">No jobs here. Drop a card to move it to {label}.</li>}
        </ul>
      </SortableContext>
    </section>
  );
}
