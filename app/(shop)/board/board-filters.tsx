"use client";

import { useEffect, useState } from "react";
import { inputClass } from "@/components/form";
import type { Board, BoardFilter } from "./board-types";

/** How many filters narrow the board now, shown on the phone's folded "Filter" button. */
export function activeFilterCount(filter: BoardFilter) {
  return [filter.q, filter.tech, filter.customer, filter.due].filter((v) => v !== undefined && v !== "").length;
}

/**
 * Filters live in the URL so a view can be shared or bookmarked at the desk. On a phone they fold
 * behind one "Filter" button (`open`), so the first screen shows cards.
 */
export function BoardFilters({ filter, board, onChange, meId, open }: { filter: BoardFilter; board: Board; onChange: (f: BoardFilter) => void; meId: string; open: boolean }) {
  const [q, setQ] = useState(filter.q ?? "");
  useEffect(() => {
    const t = setTimeout(() => {
      if ((filter.q ?? "") !== q) onChange({ ...filter, q: q || undefined });
    }, 300);
    return () => clearTimeout(t);
  }, [q, filter, onChange]);
  const active = activeFilterCount(filter) > 0;
  return (
    <form id="board-filters" role="search" aria-label="Filter the board" className={`${open ? "grid" : "hidden"} grid-cols-2 items-end gap-2 rounded-lg border border-line bg-panel p-2 md:flex md:flex-wrap md:border-0 md:bg-transparent md:p-0`} onSubmit={(e) => e.preventDefault()}>
      <label className="col-span-2 min-w-56 flex-1 text-sm font-semibold">
        Search
        <input type="search" value={q} onChange={(e) => setQ(e.target.value)} placeholder="Work order, unit, last 6 of VIN or description" className={`${inputClass} mt-1`} />
      </label>
      <label className="text-sm font-semibold">
        Tech
        <select value={filter.tech ?? ""} onChange={(e) => onChange({ ...filter, tech: e.target.value || undefined })} className={`${inputClass} mt-1`}>
          <option value="">Everyone</option>
          <option value="none">Not assigned</option>
          {board.techs.map((t) => (
            <option key={t.id} value={t.id}>{t.name}</option>
          ))}
        </select>
      </label>
      <label className="col-span-2 text-sm font-semibold md:col-span-1">
        Customer
        <select value={filter.customer ?? ""} onChange={(e) => onChange({ ...filter, customer: e.target.value ? Number(e.target.value) : undefined })} className={`${inputClass} mt-1`}>
          <option value="">All customers</option>
          {board.customers.map((c) => (
            <option key={c.id} value={c.id}>{c.name}</option>
          ))}
        </select>
      </label>
      <label className="text-sm font-semibold">
        Due
        <select value={filter.due ?? ""} onChange={(e) => onChange({ ...filter, due: (e.target.value || undefined) as BoardFilter["due"] })} className={`${inputClass} mt-1`}>
          <option value="">Any time</option>
          <option value="overdue">Overdue</option>
          <option value="week">Within 7 days</option>
          <option value="two_weeks">Within 14 days</option>
        </select>
      </label>
      <button
        type="button"
        aria-pressed={filter.tech === meId}
        className={`min-h-11 rounded-md border px-3 font-semibold ${filter.tech === meId ? "border-bay-700 bg-bay-700 text-white" : "border-line bg-panel text-bay-900"}`}
        onClick={() => onChange({ ...filter, tech: filter.tech === meId ? undefined : meId })}
      >
        My jobs
      </button>
      {active && (
        <button
          type="button"
          className="min-h-11 rounded-md px-3 font-semibold text-bay-800 underline"
          onClick={() => {
            setQ("");
            onChange({});
          }}
        >
          Clear filters
        </button>
      )}
    </form>
  );
}
