"use client";

import { useCallback, useEffect, useRef } from "react";
import type { Stage } from "@/db/schema";

/** Where a dragged card would land: a stage and the place among that stage's other cards. */
export interface DropTarget {
  stage: Stage;
  index: number;
}

export const columnDropId = (stage: Stage) => `column:${stage}`;

function otherCards(column: Element, activeId: number) {
  return [...column.querySelectorAll<HTMLElement>("li[data-card-id]")].filter((li) => Number(li.dataset.cardId) !== activeId);
}

/**
 * The stage column under the pointer, found from what the browser draws there (never from the
 * dragged overlay's box), and the place in it: before the first card whose middle is below the
 * pointer. Reads the page as it is now, so a column scrolled in mid-drag is found too.
 */
export function dropTargetAt(point: { x: number; y: number }, activeId: number): DropTarget | null {
  if (typeof document === "undefined") return null;
  for (const el of document.elementsFromPoint(point.x, point.y)) {
    if (el.closest("[data-drag-overlay]")) continue;
    const column = el.closest<HTMLElement>("[data-drop-stage]");
    if (!column) continue;
    const cards = otherCards(column, activeId);
    let index = cards.findIndex((li) => {
      const r = li.getBoundingClientRect();
      return point.y < r.top + r.height / 2;
    });
    if (index < 0) index = cards.length;
    return { stage: column.dataset.dropStage as Stage, index };
  }
  return null;
}

/**
 * Keyboard moves: Right and Left go to the next or previous stage on the card's route, one at a
 * time and in order; Up and Down change the place inside the stage.
 */
export function nextKeyboardTarget(key: string, from: DropTarget, route: readonly Stage[], counts: (stage: Stage) => number): DropTarget | null {
  const at = route.indexOf(from.stage);
  if (key === "ArrowRight" || key === "ArrowLeft") {
    const stage = route[at + (key === "ArrowRight" ? 1 : -1)];
    if (!stage) return from;
    return { stage, index: Math.min(from.index, counts(stage)) };
  }
  if (key === "ArrowDown") return { ...from, index: Math.min(from.index + 1, counts(from.stage)) };
  if (key === "ArrowUp") return { ...from, index: Math.max(from.index - 1, 0) };
  return null;
}

/** The stage's column element and its other cards, for scrolling a keyboard target into view. */
export function targetElement(target: DropTarget, activeId: number): HTMLElement | null {
  const column = document.querySelector<HTMLElement>(`[data-drop-stage="${target.stage}"]`);
  if (!column) return null;
  return otherCards(column, activeId)[target.index] ?? column;
}

// Edge scrolling, measured on a 390 px phone with gloves in mind: the zone is wide enough to
// reach with a thumb, nothing moves until the card has been held there a moment, then the board
// steps one column at a time, each step a little sooner than the last.
const EDGE_PX = 44;
const FIRST_STEP_MS = 550;
const FASTEST_STEP_MS = 260;
const SPEED_UP = 0.75;

/**
 * Sideways scrolling of the board while a card is held near its left or right edge: one column
 * per step, gradually quicker while held, and stopped the moment the card leaves the edge.
 */
export function useEdgeScroll(scroller: React.RefObject<HTMLElement | null>) {
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const side = useRef<-1 | 0 | 1>(0);
  const delay = useRef(FIRST_STEP_MS);

  const stop = useCallback(() => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = null;
    side.current = 0;
    delay.current = FIRST_STEP_MS;
  }, []);

  const step = useCallback(() => {
    const el = scroller.current;
    if (!el || side.current === 0) return;
    const column = el.querySelector<HTMLElement>("[data-drop-stage]");
    const gap = Number.parseFloat(getComputedStyle(el).columnGap) || 0;
    const width = (column?.offsetWidth ?? el.clientWidth) + gap;
    el.scrollBy({ left: side.current * width, behavior: "smooth" });
    delay.current = Math.max(FASTEST_STEP_MS, delay.current * SPEED_UP);
    timer.current = setTimeout(step, delay.current);
  }, [scroller]);

  const update = useCallback(
    (point: { x: number; y: number } | null) => {
      const el = scroller.current;
      if (!point || !el || el.scrollWidth <= el.clientWidth + 1) return stop();
      const box = el.getBoundingClientRect();
      const left = Math.max(box.left, 0);
      const right = Math.min(box.right, window.innerWidth);
      const want: -1 | 0 | 1 = point.x >= right - EDGE_PX ? 1 : point.x <= left + EDGE_PX ? -1 : 0;
      if (want === side.current) return;
      stop();
      if (want === 0) return;
      side.current = want;
      timer.current = setTimeout(step, FIRST_STEP_MS);
    },
    [scroller, step, stop],
  );

  useEffect(() => stop, [stop]);
  return { update, stop };
}
