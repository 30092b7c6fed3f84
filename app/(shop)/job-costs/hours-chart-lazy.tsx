"use client";

import dynamic from "next/dynamic";

// The chart library loads after the page, as on the reports: the table under the chart is already there to read.
const Chart = dynamic(() => import("./hours-chart").then((m) => m.HoursByStageChart), {
  ssr: false,
  loading: () => <div className="grid h-64 place-items-center text-ink-soft">Drawing the chart…</div>,
});

export function LazyHoursByStageChart(props: { stages: { label: string; hours: number }[] }) {
  return <Chart {...props} />;
}
