"use client";

import { useSyncExternalStore } from "react";
import { Bar, BarChart, CartesianGrid, Legend, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";

export interface ChartSeries {
  key: string;
  label: string;
  /** A theme colour (hex from app/globals.css). */
  color: string;
  /** Series with the same stack id sit on top of each other. */
  stack?: string;
}

export interface ReportChartProps {
  rows: Record<string, string | number | null>[];
  xKey: string;
  xLabel: string;
  yLabel: string;
  series: ChartSeries[];
  /** What the chart shows, in a sentence, for a screen reader (the table below holds the figures). */
  summary: string;
  /** Whole numbers only on the value axis (counts). */
  integers?: boolean;
}

/**
 * A bar chart for a report: labelled axes, a legend, and a sentence for screen readers; the
 * figures themselves are in the table under it. Loaded after the page (recharts is large), so the
 * table is there first.
 */
const NARROW = "(max-width: 639px)";
const watchNarrow = (onChange: () => void) => {
  const query = window.matchMedia(NARROW);
  query.addEventListener("change", onChange);
  return () => query.removeEventListener("change", onChange);
};

/** Names along the category axis, cut only when very long (the table under the chart has them whole). */
const shortName = (limit: number) => (v: string) => (v.length > limit ? `${v.slice(0, limit - 1)}…` : v);

export default function ReportChart({ rows, xKey, xLabel, yLabel, series, summary, integers }: ReportChartProps) {
  // On a phone, names under upright bars run into each other and a dozen weeks of bars shrink to
  // hairlines: the bars lie down instead, one row per stage, coater or week, names read across.
  const narrow = useSyncExternalStore(watchNarrow, () => window.matchMedia(NARROW).matches, () => false);
  if (narrow && rows.length > 1) {
    const barsPerRow = new Set(series.map((s) => s.stack ?? s.key)).size;
    const height = Math.max(260, rows.length * (barsPerRow * 10 + 14) + 110);
    return (
      <figure role="img" aria-label={summary} className="w-full" style={{ height }} data-testid="report-chart">
        <ResponsiveContainer width="100%" height="100%">
          <BarChart data={rows} layout="vertical" margin={{ top: 8, right: 16, bottom: 24, left: 4 }}>
            <CartesianGrid strokeDasharray="3 3" stroke="#d5d9d6" />
            <XAxis type="number" allowDecimals={!integers} tick={{ fill: "#16252b", fontSize: 13 }} label={{ value: yLabel, position: "insideBottom", offset: -14, fill: "#44545b", fontSize: 13 }} />
            <YAxis type="category" dataKey={xKey} width={112} interval={0} tick={{ fill: "#16252b", fontSize: 12 }} tickFormatter={shortName(30)} />
            <Tooltip />
            <Legend verticalAlign="top" itemSorter={null} wrapperStyle={{ paddingBottom: 8 }} />
            {series.map((s) => (
              <Bar key={s.key} dataKey={s.key} name={s.label} fill={s.color} stackId={s.stack} isAnimationActive={false} />
            ))}
          </BarChart>
        </ResponsiveContainer>
        <figcaption className="sr-only">{xLabel} down the side</figcaption>
      </figure>
    );
  }
  return (
    <figure role="img" aria-label={summary} className="h-96 w-full" data-testid="report-chart">
      <ResponsiveContainer width="100%" height="100%">
        <BarChart data={rows} margin={{ top: 8, right: 16, bottom: 28, left: 8 }}>
          <CartesianGrid strokeDasharray="3 3" stroke="#d5d9d6" />
          <XAxis dataKey={xKey} tick={{ fill: "#16252b", fontSize: 12 }} angle={rows.length > 4 ? -30 : 0} textAnchor={rows.length > 4 ? "end" : "middle"} height={rows.length > 4 ? 64 : 30} interval={rows.length <= 8 ? 0 : "preserveStartEnd"} tickFormatter={(v: string) => (rows.length > 4 && v.length > 16 ? `${v.slice(0, 15)}…` : v)} label={{ value: xLabel, position: "insideBottom", offset: -18, fill: "#44545b", fontSize: 13 }} />
          <YAxis
            allowDecimals={!integers}
            tick={{ fill: "#16252b", fontSize: 13 }}
            width={56}
            label={{ value: yLabel, angle: -90, position: "insideLeft", offset: 4, fill: "#44545b", fontSize: 13, style: { textAnchor: "middle" } }}
          />
          <Tooltip />
          <Legend verticalAlign="top" itemSorter={null} wrapperStyle={{ paddingBottom: 8 }} />
          {series.map((s) => (
            <Bar key={s.key} dataKey={s.key} name={s.label} fill={s.color} stackId={s.stack} isAnimationActive={false} />
          ))}
        </BarChart>
      </ResponsiveContainer>
    </figure>
  );
}
