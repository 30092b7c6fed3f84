import { describe, expect, it } from "vitest";
import { demoKitCalcInput, computeKitSpec } from "@/server/kit-calc";
import { hoseFeet, kitSpecLines, type KitPriceItem } from "@/server/money/kit-lines";

const ITEMS: KitPriceItem[] = [
  { id: 1, kind: "part", name: "PTO, 6-bolt", unitPriceCents: 148_900, taxable: true, kitUse: "pto", sizeIn: null },
  { id: 2, kind: "part", name: "Gear pump", unitPriceCents: 92_500, taxable: true, kitUse: "pump", sizeIn: null },
  { id: 3, kind: "fabrication", name: "Aluminum reservoir", unitPriceCents: 165_000, taxable: true, kitUse: "reservoir", sizeIn: null },
  { id: 4, kind: "part", name: "Hose 1 in", unitPriceCents: 675, taxable: true, kitUse: "hose", sizeIn: 1 },
  { id: 5, kind: "part", name: "Hose 3/4 in", unitPriceCents: 525, taxable: true, kitUse: "hose", sizeIn: 0.75 },
];

describe("lines from the kit spec", () => {
  const spec = computeKitSpec(demoKitCalcInput);

  it("prices the PTO, pump, reservoir and each hose by its size and length", () => {
    const { lines, unpriced } = kitSpecLines(demoKitCalcInput, spec, ITEMS);
    expect(lines.map((l) => [l.kind, l.quantity, l.unitPriceCents, l.priceItemId])).toEqual([
      ["part", 1, 148_900, 1],
      ["part", 1, 92_500, 2],
      ["fabrication", 1, 165_000, 3],
      ["part", 4, 0, null], // 1.75 in suction hose: not on this list
      ["part", 14, 675, 4],
      ["part", 14, 525, 5],
    ]);
    expect(lines[0].description).toBe("PTO, 6-bolt — PTO, 115 % of engine speed");
    expect(lines[2].description).toMatch(/^Aluminum reservoir — Reservoir, round 20 in × 30 in, \d+(\.\d)? gal$/);
    expect(unpriced).toEqual(["Suction hose, 1.75 in inside diameter, 4 ft"]);
  });

  it("a D-shaped reservoir is named as one, not as a box", () => {
    const input = { ...demoKitCalcInput, tank: { shape: "d" as const, lengthIn: 30, widthIn: 16, heightIn: 20 } };
    const { lines } = kitSpecLines(input, computeKitSpec(input), ITEMS);
    expect(lines[2].description).toMatch(/Reservoir, D-shape 30 × 16 × 20 in, /);
  });

  it("an empty price list still lists every line, each named as unpriced", () => {
    const { lines, unpriced } = kitSpecLines(demoKitCalcInput, spec, []);
    expect(lines).toHaveLength(6);
    expect(unpriced).toHaveLength(6);
    expect(lines.every((l) => l.unitPriceCents === 0)).toBe(true);
  });

  it("hose is priced to the next tenth of a foot", () => {
    expect(hoseFeet(14)).toBe(14);
    expect(hoseFeet(4.01)).toBe(4.1);
    expect(hoseFeet(4.1)).toBe(4.1);
    expect(hoseFeet(0.1)).toBe(0.1);
  });
});
