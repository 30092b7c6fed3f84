import { describe, expect, it } from "vitest";
import { fitFlags } from "@/server/parts/fit";
import { applyReceipt, boughtPartState, distinctSuppliers, firstLinesOf, groupBySupplier, orderTotal, supplierKey, supplierSummary, waitingWords } from "@/server/parts/rules";

const line = (quantity: number, receivedQuantity = 0, ordered = true) => ({ quantity, receivedQuantity, ordered, installed: false });

describe("receiving bought-in parts", () => {
  it("refuses more than is still outstanding, naming how many are", () => {
    const check = applyReceipt(line(4, 1), 4);
    expect(check.ok).toBe(false);
    if (!check.ok) expect(check.message).toContain("Only 3 are still outstanding (1 of 4 received)");
  });

  it("refuses any receipt on a line already received in full", () => {
    expect(applyReceipt(line(2, 2), 1).ok).toBe(false);
  });

  it("keeps a short receipt on order until the rest arrives", () => {
    const first = applyReceipt(line(2, 0), 1);
    expect(first).toEqual({ ok: true, receivedQuantity: 1, state: "ordered" });
    const second = applyReceipt(line(2, 1), 1);
    expect(second).toEqual({ ok: true, receivedQuantity: 2, state: "received" });
  });

  it("a line bought over the counter, never on an order, is received when it all came", () => {
    expect(applyReceipt(line(1, 0, false), 1)).toEqual({ ok: true, receivedQuantity: 1, state: "received" });
    expect(boughtPartState({ quantity: 3, receivedQuantity: 1, ordered: false, installed: false })).toBe("ordered");
    expect(boughtPartState({ quantity: 3, receivedQuantity: 0, ordered: false, installed: false })).toBe("needed");
  });
});

describe("purchase order totals", () => {
  it("adds quantity × cost of one in whole cents, leaving unpriced lines out and counting them", () => {
    // 2 × $94.75 + 1 × $1,185.00 + 3 × $0.10 = $189.50 + $1,185.00 + $0.30 = $1,374.80
    const total = orderTotal([
      { quantity: 2, unitCostCents: 9_475 },
      { quantity: 1, unitCostCents: 118_500 },
      { quantity: 3, unitCostCents: 10 },
      { quantity: 5, unitCostCents: null },
    ]);
    expect(total).toEqual({ totalCents: 137_480, unpriced: 1 });
    expect(Number.isInteger(total.totalCents)).toBe(true);
  });

  it("an order of ten-cent lines stays exact where floating dollars would drift", () => {
    // 0.1 + 0.2 in binary floating point is 0.30000000000000004; in cents it is 30.
    expect(orderTotal([{ quantity: 1, unitCostCents: 10 }, { quantity: 1, unitCostCents: 20 }]).totalCents).toBe(30);
  });
});

describe("what Install waits for, in words", () => {
  it("names the part and what to do", () => {
    expect(waitingWords({ description: "10-bolt PTO", quantity: 1, receivedQuantity: 0, state: "needed" })).toBe("waiting on 10-bolt PTO: not ordered yet; order it from the parts desk.");
    expect(waitingWords({ description: "Hose", quantity: 2, receivedQuantity: 1, state: "ordered", purchaseOrder: "PO-26-0004", expectedOn: "Thu 10 Dec" })).toBe(
      "waiting on Hose: 1 of 2 received, the rest on order on PO-26-0004, expected Thu 10 Dec; receive it when it arrives.",
    );
  });
});

describe("fit checks", () => {
  const truck = { transmission: "18-speed manual" };
  const spec = { ptoRatioPercent: 122, pumpDisplacementCuIn: 3.2 };
  const pto = (fits: string, ratio: number | null) => ({ kind: "pto", fitsTransmission: fits, ratioPercent: ratio, displacementCuIn: null });

  it("a PTO for the truck's transmission, written differently, at the spec's ratio passes", () => {
    expect(fitFlags(pto("18 Speed Manual", 122), truck, spec)).toEqual([]);
  });

  it("flags a PTO for another transmission and one whose ratio differs from the kit spec", () => {
    expect(fitFlags(pto("10-speed manual", 135), truck, spec).map((f) => f.code)).toEqual(["transmission_mismatch", "ratio_differs"]);
  });

  it("flags a pump whose displacement differs from the kit spec, not one that matches", () => {
    const pump = (d: number) => ({ kind: "pump", fitsTransmission: "", ratioPercent: null, displacementCuIn: d });
    expect(fitFlags(pump(3.2), truck, spec)).toEqual([]);
    expect(fitFlags(pump(2.5), truck, spec).map((f) => f.code)).toEqual(["displacement_differs"]);
  });

  it("asks for what it cannot check: the truck's transmission, the PTO's ratio", () => {
    expect(fitFlags(pto("18-speed manual", null), { transmission: "" }, spec).map((f) => f.code)).toEqual(["transmission_unknown", "ratio_missing"]);
    expect(fitFlags(pto("18-speed manual", 122), truck, null)).toEqual([]);
  });
});

describe("the parts desk's folded groups", () => {
  const lines = (n: number) => Array.from({ length: n }, (_, i) => i + 1);

  it("shows a short group whole, even a few lines past the first ten", () => {
    expect(firstLinesOf(lines(3))).toEqual([1, 2, 3]);
    expect(firstLinesOf(lines(14))).toHaveLength(14);
  });

  it("shows the first ten of a long group, in the desk's order", () => {
    expect(firstLinesOf(lines(15))).toEqual(lines(10));
    expect(firstLinesOf(lines(600))).toEqual(lines(10));
  });

  it("sums a supplier's folded lines: jobs once each, unpriced lines apart, the soonest date and the late ones", () => {
    const line = (jobId: number, lineCents: number | null, expectedOn: string | null, overdue = false) => ({ jobId, lineCents, expectedOn, overdue });
    expect(supplierSummary([line(1, 118_500, "2026-12-09"), line(1, null, null), line(2, 2 * 9_475, "2026-11-30", true), line(3, 6_240, "2026-12-01", true)])).toEqual({
      lines: 4,
      jobs: 3,
      // 1,185.00 + 189.50 + 62.40, worked by hand
      amountCents: 143_690,
      unpriced: 1,
      nextExpectedOn: "2026-11-30",
      overdue: 2,
    });
    expect(supplierSummary([])).toEqual({ lines: 0, jobs: 0, amountCents: 0, unpriced: 0, nextExpectedOn: null, overdue: 0 });
  });
});

describe("one supplier however its name is capitalized or spaced", () => {
  it("matches names without capitals, surrounding or doubled spaces", () => {
    expect(supplierKey("Ketterby Fluid Power")).toBe(supplierKey("ketterby fluid power"));
    expect(supplierKey(" Ketterby  Fluid\tPower ")).toBe("ketterby fluid power");
    expect(supplierKey("Ketterby Fluid Power")).not.toBe(supplierKey("Ketterby Fluid Power West"));
    expect(supplierKey("   ")).toBe("");
  });

  it("groups the lines as one supplier under the name as first written, A–Z with no supplier last", () => {
    const lines = [
      { id: 7, supplier: "ketterby fluid power" },
      { id: 3, supplier: "Ketterby Fluid Power" },
      { id: 9, supplier: "" },
      { id: 5, supplier: "Aldwin Hose " },
      { id: 8, supplier: " KETTERBY  FLUID POWER" },
    ];
    expect(groupBySupplier(lines).map((g) => [g.supplier, g.lines.map((l) => l.id)])).toEqual([
      ["Aldwin Hose", [5]],
      ["Ketterby Fluid Power", [7, 3, 8]],
      ["", [9]],
    ]);
  });

  it("lists each known supplier once, as first written", () => {
    expect(distinctSuppliers(["Ketterby Fluid Power", "ketterby fluid power", "", "Aldwin  Hose", "aldwin hose"])).toEqual(["Aldwin Hose", "Ketterby Fluid Power"]);
  });
});
