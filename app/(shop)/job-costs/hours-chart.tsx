"use client";

import { Bar, BarChart, CartesianGrid, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";

/** Hours by stage across the period's jobs, one bar per stage; the table under it carries the same figures. */
export function HoursByStageChart({ stages }: { stages: { label: string; hours: number }[] }) {
  const data = stages.map((s) => ({ stage: s.label, hours: Math.round(s.hours * 100) / 100 }));
  return (
    <div className="h-64 w-full" role="img" aria-label={`Hours by stage: ${data.map((d) => `${d.stage} ${d.hours} h`).join(", ")}`}>
      <ResponsiveContainer width="100%" height="100%">
        <BarChart data={data} margin={{ top: 8, right: 8, bottom: 8, left: 8 }}>
          <CartesianGrid strokeDasharray="3 3" stroke="var(--color-line)" />
          <XAxis dataKey="stage" tick={{ fill: "var(--color-ink)", fontSize: 13 }} />
          <YAxis tick={{ fill: "var(--color-ink)", fontSize: 13 }} label={{ value: "hours", angle: -90, position: "insideLeft", fill: "var(--color-ink)" }} />
          <Tooltip formatter={(v) => [`${v} h`, "Hours"]} />
          <Bar dataKey="hours" fill="var(--color-bay-700)" isAnimationActive={false} />
        </BarChart>
      </ResponsiveContainer>
    </div>
  );
}
