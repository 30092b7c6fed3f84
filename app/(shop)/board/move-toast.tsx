"use client";

import { useEffect, useRef, useState } from "react";

export interface Toast {
  /** A new number for every toast, so the timer starts again when one replaces another. */
  key: number;
  text: string;
  tone: "ok" | "stop";
  /** How long the toast stays, unless a hand or the focus is on it. */
  ms: number;
  undo?: { label: string; run: () => void };
  busy?: boolean;
}

/**
 * The confirmation after a move, fixed to the bottom of the screen so it is in view beside the moved
 * card. While it shows, the page gets room below the board as tall as the toast, so the moved card
 * (scrolled into view with that margin) and every other card can sit above it, never under it. The
 * next tap anywhere else closes it: the person has gone on to other work, and the message would
 * otherwise speak of a move that is no longer the latest thing they did.
 */
export function MoveToast({ toast, onClose }: { toast: Toast | null; onClose: () => void }) {
  const [held, setHeld] = useState(false);
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!toast || held || toast.busy) return;
    const t = setTimeout(onClose, toast.ms);
    return () => clearTimeout(t);
  }, [toast, held, onClose]);
  useEffect(() => {
    if (!toast || toast.busy) return;
    const elsewhere = (e: MouseEvent) => {
      if (!box.current?.contains(e.target as Node)) onClose();
    };
    document.addEventListener("click", elsewhere, true);
    return () => document.removeEventListener("click", elsewhere, true);
  }, [toast, onClose]);
  return (
    <>
      {toast && <div aria-hidden="true" data-toast-room className="h-28" />}
      <div role="status" aria-live="polite" className="pointer-events-none fixed inset-x-0 bottom-3 z-40 flex justify-center px-3">
        {toast && (
          <div
            ref={box}
            data-move-toast
            onMouseEnter={() => setHeld(true)}
            onMouseLeave={() => setHeld(false)}
            onFocus={() => setHeld(true)}
            onBlur={() => setHeld(false)}
            className={`pointer-events-auto flex max-w-xl items-center gap-2 rounded-lg px-3 py-1.5 text-sm font-semibold shadow-lg ${toast.tone === "stop" ? "bg-stop-700 text-white" : "bg-bay-900 text-white"}`}
          >
            <span className="py-2">{toast.text}</span>
            {toast.undo && (
              <button type="button" onClick={toast.undo.run} disabled={toast.busy} aria-label={toast.undo.label} className="min-h-11 shrink-0 rounded-md px-2 font-bold underline underline-offset-2 hover:bg-white/10 disabled:opacity-60">
                {toast.busy ? "Undoing…" : "Undo"}
              </button>
            )}
            <button type="button" onClick={onClose} aria-label="Close this message" className="grid min-h-11 min-w-11 place-items-center rounded-md text-lg hover:bg-white/10">
              ×
            </button>
          </div>
        )}
      </div>
    </>
  );
}
