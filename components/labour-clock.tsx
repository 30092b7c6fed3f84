"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { ApiRequestError, api } from "./api";
import type { OpenClock } from "@/server/labour/queries";
import { IconClock, IconWarn } from "./icons";

export type { OpenClock };

const clockKey = ["clock"] as const;

/** The signed-in person's running clock, shared by every clock button on the screen. */
export function useClock(initial?: OpenClock | null) {
  const qc = useQueryClient();
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const query = useQuery({
    queryKey: clockKey,
    queryFn: async () => (await api<{ clock: OpenClock | null }>("/api/clock")).clock,
    initialData: initial,
    staleTime: 10_000,
  });
  const settle = (clock: OpenClock | null) => {
    qc.setQueryData(clockKey, clock);
    setError(null);
    // Server-drawn hours on the page follow the clock.
    router.refresh();
  };
  const fail = (err: unknown) => setError(err instanceof ApiRequestError ? err.failure.message : "The clock did not change; try again.");
  const on = useMutation({
    mutationFn: (jobId: number) => api<{ clock: OpenClock | null }>("/api/clock", { method: "POST", body: { jobId } }),
    onSuccess: (res) => settle(res.clock),
    onError: fail,
  });
  const off = useMutation({
    mutationFn: () => api<{ clock: null }>("/api/clock", { method: "DELETE", body: {} }),
    onSuccess: () => settle(null),
    onError: fail,
  });
  return { clock: query.data ?? null, on, off, error, pending: on.isPending || off.isPending };
}

/**
 * One tap for the bench: clock on this job (switching from any other), or clock off it. The
 * button says which job the clock is on, so nobody clocks the wrong truck by accident.
 */
export function ClockButton({ jobId, workOrder, compact = false }: { jobId: number; workOrder: string; compact?: boolean }) {
  const { clock, on, off, error, pending } = useClock();
  const here = clock?.jobId === jobId;
  const label = here ? `Clock off ${workOrder}` : clock ? `Switch clock to ${workOrder}` : `Clock on ${workOrder}`;
  return (
    <div className={compact ? "mt-1" : "space-y-2"} data-clock-for={workOrder}>
      {!compact && (
        <p className={here ? "font-semibold text-ok-700" : "text-ink-soft"} aria-live="polite">
          <IconClock /> {here ? `You are on the clock here since ${clock!.since}.` : clock ? `Your clock is on ${clock.workOrder} since ${clock.since}.` : "Your clock is off."}
        </p>
      )}
      {here && clock!.flags.map((f) => <p key={f.code} className="text-sm font-semibold text-warn-700"><IconWarn /> {f.message}</p>)}
      <button
        type="button"
        disabled={pending}
        onClick={() => (here ? off.mutate() : on.mutate(jobId))}
        className={`min-h-11 w-full rounded-md px-3 text-sm font-semibold ${here ? "bg-ok-700 text-white hover:opacity-90" : "border border-line bg-panel text-bay-900 hover:bg-bay-50"} ${compact ? "" : "sm:w-auto sm:px-5 sm:text-base"}`}
        aria-label={compact ? label : undefined}
      >
        {compact ? (here ? `On the clock · Clock off` : clock ? "Switch clock here" : "Clock on") : label}
      </button>
      {error && <p role="alert" className="text-sm font-semibold text-stop-700">{error}</p>}
    </div>
  );
}

/** A strip at the top of the board while the person's clock runs: which job, since when, and off in one tap. */
export function ClockStrip({ initial }: { initial?: OpenClock | null }) {
  const { clock, off, error, pending } = useClock(initial);
  if (!clock) return null;
  const flagged = clock.flags.length > 0;
  return (
    <div className={`flex flex-wrap items-center justify-between gap-2 rounded-md border px-3 py-1 ${flagged ? "border-warn-700 bg-warn-100" : "border-ok-700 bg-ok-100"}`} data-clock-strip>
      <p className={`text-sm font-semibold ${flagged ? "text-warn-700" : "text-ok-700"}`}>
        {flagged ? <IconWarn /> : <IconClock />} On the clock: <a className="inline-flex min-h-11 items-center underline" href={`/jobs/${clock.jobId}`}>{clock.workOrder}</a> since {clock.since}
        {flagged && <> · {clock.flags[0].message}</>}
      </p>
      <button type="button" disabled={pending} onClick={() => off.mutate()} className="min-h-11 rounded-md bg-panel px-3 text-sm font-semibold text-ink border border-line">
        Clock off
      </button>
      {error && <p role="alert" className="w-full text-sm font-semibold text-stop-700">{error}</p>}
    </div>
  );
}
