/**
 * "Start from the kit spec": the priced lines a saved kit spec brings, using the owner's price
 * list. Pure: the caller reads the spec and the list. A figure the list has no price for still
 * becomes a line, at $0.00, and is named in `unpriced` so the office prices it before sending.
 */
import type { KitUse, LineKind } from "@/db/tables/money";
import type { KitCalcInput, KitSpec } from "@/server/kit-calc";
import { toThousandths } from "./totals";

export interface KitPriceItem {
  id: number;
  kind: LineKind;
  name: string;
  unitPriceCents: number;
  taxable: boolean;
  kitUse: KitUse | null;
  sizeIn: number | null;
}

export interface KitLine {
  kind: LineKind;
  description: string;
  quantity: number;
  unitPriceCents: number;
  taxable: boolean;
  priceItemId: number | null;
}

const trim = (n: number, places: number) => Number(n.toFixed(places)).toString();

/** Hose is bought by the foot: a run is priced to the next tenth of a foot, never shorter than it is cut. */
export function hoseFeet(lengthFt: number): number {
  return Math.ceil(Math.round(lengthFt * 1000) / 100) / 10;
}

export function kitSpecLines(inputs: KitCalcInput, results: KitSpec, items: readonly KitPriceItem[]): { lines: KitLine[]; unpriced: string[] } {
  const lines: KitLine[] = [];
  const unpriced: string[] = [];
  const find = (use: KitUse, sizeIn?: number) =>
    items.find((i) => i.kitUse === use && (sizeIn === undefined || (i.sizeIn !== null && toThousandths(i.sizeIn) === toThousandths(sizeIn))));
  const add = (use: KitUse, fallbackKind: LineKind, description: string, quantity: number, sizeIn?: number) => {
    const item = find(use, sizeIn);
    if (!item) unpriced.push(description);
    lines.push({
      kind: item?.kind ?? fallbackKind,
      description: item ? `${item.name} — ${description}` : description,
      quantity,
      unitPriceCents: item?.unitPriceCents ?? 0,
      taxable: item?.taxable ?? true,
      priceItemId: item?.id ?? null,
    });
  };

  add("pto", "part", `PTO, ${trim(inputs.ptoRatioPercent, 0)} % of engine speed`, 1);
  add("pump", "part", `Hydraulic pump, ${trim(inputs.pumpDisplacementCuIn, 2)} in³/rev`, 1);
  const t = inputs.tank;
  const shape =
    t.shape === "round"
      ? `round ${trim(t.insideDiameterIn, 2)} in × ${trim(t.lengthIn, 2)} in`
      : `${t.shape === "d" ? "D-shape" : "box"} ${trim(t.lengthIn, 2)} × ${trim(t.widthIn, 2)} × ${trim(t.heightIn, 2)} in`;
  add("reservoir", "fabrication", `Reservoir, ${shape}, ${trim(results.tank.totalGal, 1)} gal`, 1);
  const hoses: [string, { insideDiameterIn: number; lengthFt: number } | undefined][] = [
    ["Suction hose", inputs.suctionLine],
    ["Return hose", inputs.returnLine],
    ["Pressure hose", inputs.pressureLine],
  ];
  for (const [name, line] of hoses) {
    if (!line) continue;
    add("hose", "part", `${name}, ${trim(line.insideDiameterIn, 3)} in inside diameter, ${trim(hoseFeet(line.lengthFt), 1)} ft`, hoseFeet(line.lengthFt), line.insideDiameterIn);
  }
  return { lines, unpriced };
}
