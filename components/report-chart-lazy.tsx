"use client";

import dynamic from "next/dynamic";
import type { ReportChartProps } from "./report-chart";

// The chart library loads after the page: the table under the chart is already there to read.
const Chart = dynamic(() => import("./report-chart"), {
  ssr: false,
  loading: () => <div className="grid h-80 place-items-center text-ink-soft">Drawing the chart…</div>,
});

export function LazyReportChart(props: ReportChartProps) {
  return <Chart {...props} />;
}
