import { PRESSURE_BAND_FROM_PSI, velocityBandSources, type KitCalcInput, type KitSpec, type LineCheck, type LineStatus } from "@/server/kit-calc";
import { fmt, metric } from "./format";

export const LINE_NAMES = { suction: "Suction line", return: "Return line", pressure: "Pressure line" } as const;
export type LineName = keyof typeof LINE_NAMES;

// Slow oil is no harm (the line is bigger than it needs to be); fast oil is the problem, so only "high" is red.
const STATUS: Record<LineStatus, { icon: string; word: string; className: string }> = {
  ok: { icon: "✓", word: "In range", className: "bg-ok-100 text-ok-700" },
  low: { icon: "▽", word: "Below range", className: "bg-bay-50 text-bay-900" },
  high: { icon: "▲", word: "Too fast", className: "bg-stop-100 text-stop-700" },
};

export function LineStatusBadge({ status }: { status: LineStatus }) {
  const s = STATUS[status];
  return (
    <span className={`inline-flex items-center gap-1 whitespace-nowrap rounded-full px-2 py-0.5 text-sm font-bold ${s.className}`}>
      <span aria-hidden="true">{s.icon}</span>
      {s.word}
    </span>
  );
}

export function lineEntries(input: KitCalcInput, spec: KitSpec): { name: LineName; line: LineCheck; insideDiameterIn: number; lengthFt: number }[] {
  const out: { name: LineName; line: LineCheck; insideDiameterIn: number; lengthFt: number }[] = [
    { name: "suction", line: spec.lines.suction, ...input.suctionLine },
    { name: "return", line: spec.lines.return, ...input.returnLine },
  ];
  if (spec.lines.pressure && input.pressureLine) out.push({ name: "pressure", line: spec.lines.pressure, ...input.pressureLine });
  return out;
}

export function bandText(line: LineCheck) {
  return `${fmt(line.bandFps[0], 0)}–${fmt(line.bandFps[1], 0)} ft/s`;
}

/** Where each velocity range comes from, shown beside the lines (they are guidance, not a standard). */
export function BandSources({ workingPressurePsi, withPressure }: { workingPressurePsi: number; withPressure: boolean }) {
  const items: string[] = [velocityBandSources.suction, velocityBandSources.return];
  if (withPressure) items.push(workingPressurePsi < PRESSURE_BAND_FROM_PSI ? velocityBandSources.lowPressure : velocityBandSources.pressure);
  return (
    <div className="text-sm text-ink-soft">
      <p className="font-semibold text-ink">Where the velocity ranges come from</p>
      <ul className="list-disc space-y-0.5 pl-5">
        {items.map((text) => (
          <li key={text}>{text}</li>
        ))}
      </ul>
    </div>
  );
}

export function LineFacts({ line, insideDiameterIn, lengthFt }: { line: LineCheck; insideDiameterIn: number; lengthFt: number }) {
  return (
    <>
      <p className="text-sm text-ink-soft">
        {fmt(insideDiameterIn, 2)} in ID ({metric.mm(insideDiameterIn)}), {fmt(lengthFt, 1)} ft ({metric.m(lengthFt)})
      </p>
      <p className="flex flex-wrap items-baseline gap-x-2 gap-y-1">
        <span className="text-xl font-bold">
          {fmt(line.velocityFps, 1)} <span className="text-base font-semibold">ft/s</span>
        </span>
        <span className="text-sm text-ink-soft">{metric.mPerS(line.velocityFps)}</span>
        <LineStatusBadge status={line.status} />
      </p>
      <p className="text-sm">
        Range {bandText(line)}. Smallest ID for {fmt(line.bandFps[1], 0)} ft/s: <strong>{fmt(line.minInsideDiameterIn, 2)} in</strong> ({metric.mm(line.minInsideDiameterIn)})
      </p>
    </>
  );
}
