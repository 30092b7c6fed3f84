import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { quantitySchema } from "@/server/money/schemas";
import {
  balanceCents,
  quantityProblem,
  depositCents,
  divideHalfUp,
  documentTotals,
  formatCents,
  jobPriceCents,
  lineAmountCents,
  paymentFits,
  salesTaxCents,
  toThousandths,
} from "@/server/money/totals";

// Expected figures below were worked by hand (long multiplication), not taken from the code.
// Tax rounding rule: Streamlined Sales and Use Tax Agreement §324 — carry to the third decimal
// place, round up to the next cent when the third decimal place is greater than four.

describe("line amounts (quantity × unit price, half-up to the cent; common practice, no published source)", () => {
  it("whole quantities multiply exactly", () => {
    expect(lineAmountCents(3000, 4_250)).toBe(12_750); // 3 × $42.50 = $127.50
  });
  it("fractional hours", () => {
    expect(lineAmountCents(2500, 9_550)).toBe(23_875); // 2.5 h × $95.50 = $238.75
    expect(lineAmountCents(1333, 8_500)).toBe(11_331); // 1.333 × 8500 = 11330.5 ¢ → 11331 (half goes up)
    expect(lineAmountCents(1250, 333)).toBe(416); // 1.25 × 333 = 416.25 ¢ → 416
    expect(lineAmountCents(1001, 1)).toBe(1); // 1.001 ¢ → 1
    expect(lineAmountCents(500, 1)).toBe(1); // 0.5 ¢ → 1
    expect(lineAmountCents(499, 1)).toBe(0); // 0.499 ¢ → 0
  });
  it("large figures keep every cent", () => {
    // 99,999.999 × 9,999,999 ¢ = 999,999,890,000.001 ¢ → 999,999,890,000 ¢ (the product passes 2^53 before the division)
    expect(lineAmountCents(99_999_999, 9_999_999)).toBe(999_999_890_000);
  });
});

describe("sales tax, once per document, half-up at the half cent (SSUTA §324)", () => {
  it("8.25 % on $123.45 is $10.18", () => {
    expect(salesTaxCents(12_345, 8_250)).toBe(1_018); // 12345 × 0.0825 = 1018.4625 ¢
  });
  it("the half cent goes up", () => {
    expect(salesTaxCents(200, 8_250)).toBe(17); // 200 × 0.0825 = 16.5 ¢ → 17
    expect(salesTaxCents(600, 8_250)).toBe(50); // 49.5 ¢ → 50
  });
  it("just under the half cent goes down", () => {
    expect(salesTaxCents(199, 8_250)).toBe(16); // 16.4175 ¢ → 16
  });
  it("a fractional rate (8.875 %)", () => {
    expect(salesTaxCents(10_000, 8_875)).toBe(888); // 887.5 ¢ → 888
    expect(salesTaxCents(12_345, 8_875)).toBe(1_096); // 12345 × 0.08875 = 1095.61875 ¢ → 1096
  });
  it("a 0 % rate is no tax", () => {
    expect(salesTaxCents(987_654, 0)).toBe(0);
  });
  it("rounding once per document differs from rounding each line, as the rule allows", () => {
    // Three taxable lines of $2.00 at 8.25 %: each line's tax is 16.5 ¢ (→ 17 ¢ each, 51 ¢ in all),
    // the document's is 600 × 0.0825 = 49.5 ¢ → 50 ¢. Baywright shows 50 ¢.
    const lines = [1, 2, 3].map(() => ({ kind: "part" as const, quantityMilli: 1000, unitPriceCents: 200, taxable: true }));
    expect(documentTotals(lines, 8_250)).toEqual({ subtotalCents: 600, taxableCents: 600, taxCents: 50, totalCents: 650 });
  });
});

describe("document totals", () => {
  it("labour is left out of the taxable subtotal when it is not taxable", () => {
    const totals = documentTotals(
      [
        { kind: "labour", quantityMilli: 6500, unitPriceCents: 12_500, taxable: false }, // 6.5 h × $125 = $812.50
        { kind: "part", quantityMilli: 1000, unitPriceCents: 148_900, taxable: true }, // $1,489.00
        { kind: "part", quantityMilli: 14_000, unitPriceCents: 675, taxable: true }, // 14 ft × $6.75 = $94.50
        { kind: "coating", quantityMilli: 1000, unitPriceCents: 38_500, taxable: false }, // $385.00
      ],
      8_250,
    );
    // taxable 148900 + 9450 = 158350 ¢; tax 158350 × 0.0825 = 13063.875 ¢ → 13064 ¢
    // subtotal 81250 + 158350 + 38500 = 278100 ¢; total 278100 + 13064 = 291164 ¢
    expect(totals).toEqual({ subtotalCents: 278_100, taxableCents: 158_350, taxCents: 13_064, totalCents: 291_164 });
  });
});

describe("deposits", () => {
  it("50 % of an odd total rounds the half cent up", () => {
    expect(depositCents(12_345, { kind: "percent", percent: 50 })).toBe(6_173); // 6172.5 ¢ → 6173
    expect(12_345 - depositCents(12_345, { kind: "percent", percent: 50 })).toBe(6_172);
  });
  it("a third of $100.00", () => {
    expect(depositCents(10_000, { kind: "percent", percent: 33 })).toBe(3_300);
  });
  it("a fixed deposit is never more than the total", () => {
    expect(depositCents(50_000, { kind: "fixed", cents: 100_000 })).toBe(50_000);
    expect(depositCents(500_000, { kind: "fixed", cents: 100_000 })).toBe(100_000);
  });
  it("no deposit on nothing", () => {
    expect(depositCents(0, { kind: "percent", percent: 50 })).toBe(0);
  });
});

describe("change orders and payments", () => {
  it("the job's price is the approved quote plus approved changes", () => {
    // $2,911.64 + $216.50 + $54.13 = $3,182.27
    expect(jobPriceCents([{ totalCents: 291_164 }, { totalCents: 21_650 }, { totalCents: 5_413 }])).toBe(318_227);
  });
  it("payments summing to the price leave exactly nothing", () => {
    const price = 318_227;
    const deposit = depositCents(291_164, { kind: "percent", percent: 50 }); // 145582 ¢
    expect(deposit).toBe(145_582);
    const rest = price - deposit; // 172645 ¢
    expect(balanceCents(price, [{ amountCents: deposit }, { amountCents: 172_645 }])).toBe(0);
    expect(rest).toBe(172_645);
  });
  it("a payment larger than the balance does not fit", () => {
    expect(paymentFits(10_000, [{ amountCents: 6_000 }], 4_001)).toBe(false);
    expect(paymentFits(10_000, [{ amountCents: 6_000 }], 4_000)).toBe(true);
    expect(paymentFits(10_000, [], 0)).toBe(false);
    expect(paymentFits(10_000, [], 10.5)).toBe(false);
  });
  it("a refund puts the amount back on the balance", () => {
    expect(balanceCents(10_000, [{ amountCents: 10_000 }, { amountCents: -2_500 }])).toBe(2_500);
  });
});

describe("typed figures to thousandths", () => {
  it("reads up to three decimals exactly", () => {
    expect(toThousandths(8.25)).toBe(8_250);
    expect(toThousandths(8.875)).toBe(8_875);
    expect(toThousandths(0.1)).toBe(100);
    expect(toThousandths(2.5)).toBe(2_500);
    expect(toThousandths(0)).toBe(0);
  });
  it("refuses a fourth decimal, negatives and non-numbers", () => {
    expect(toThousandths(1.0005)).toBeNull();
    expect(toThousandths(-1)).toBeNull();
    expect(toThousandths(Number.NaN)).toBeNull();
    expect(toThousandths(Number.POSITIVE_INFINITY)).toBeNull();
  });
});

describe("formatting", () => {
  it("dollars and cents with thousands", () => {
    expect(formatCents(291_164)).toBe("$2,911.64");
    expect(formatCents(5)).toBe("$0.05");
    expect(formatCents(100_000_000)).toBe("$1,000,000.00");
  });
});

describe("properties", () => {
  const line = fc.record({
    kind: fc.constantFrom("labour" as const, "part" as const, "fabrication" as const, "coating" as const, "fee" as const),
    quantityMilli: fc.integer({ min: 1, max: 100_000_000 }),
    unitPriceCents: fc.integer({ min: 0, max: 10_000_000 }),
    taxable: fc.boolean(),
  });
  const rate = fc.integer({ min: 0, max: 20_000 });

  it("totals never drift by a cent: total = subtotal + tax, subtotal = Σ line amounts, tax within half a cent of exact", () => {
    fc.assert(
      fc.property(fc.array(line, { maxLength: 30 }), rate, (lines, r) => {
        const t = documentTotals(lines, r);
        const amounts = lines.map((l) => lineAmountCents(l.quantityMilli, l.unitPriceCents));
        expect(t.subtotalCents).toBe(amounts.reduce((a, b) => a + b, 0));
        expect(t.taxableCents).toBe(amounts.filter((_, i) => lines[i].taxable).reduce((a, b) => a + b, 0));
        expect(t.totalCents).toBe(t.subtotalCents + t.taxCents);
        // |tax − taxable × rate| ≤ ½ cent, checked in exact integers: |200000·tax − 2·taxable·rate| ≤ 100000
        const diff = 200_000n * BigInt(t.taxCents) - 2n * BigInt(t.taxableCents) * BigInt(r);
        expect(diff <= 100_000n && diff > -100_000n).toBe(true);
        for (const amount of amounts) expect(Number.isSafeInteger(amount) && amount >= 0).toBe(true);
      }),
    );
  });

  it("half-up division is within half of the exact quotient and never below it by a half", () => {
    fc.assert(
      fc.property(fc.bigInt({ min: 0n, max: 10n ** 20n }), fc.bigInt({ min: 1n, max: 10n ** 9n }), (n, d) => {
        const q = divideHalfUp(n, d);
        // 2(q·d − n) ∈ (−d, d]
        const twice = 2n * (q * d - n);
        expect(twice > -d && twice <= d).toBe(true);
      }),
    );
  });

  it("the balance is never negative when only payments that fit are taken, and reaches zero exactly", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: MAX }), fc.array(fc.integer({ min: 1, max: MAX }), { maxLength: 20 }), (price, tries) => {
        const taken: { amountCents: number }[] = [];
        for (const amount of tries) if (paymentFits(price, taken, amount)) taken.push({ amountCents: amount });
        expect(balanceCents(price, taken)).toBeGreaterThanOrEqual(0);
        const rest = balanceCents(price, taken);
        if (rest > 0) {
          expect(paymentFits(price, taken, rest)).toBe(true);
          taken.push({ amountCents: rest });
        }
        expect(balanceCents(price, taken)).toBe(0);
      }),
    );
  });

  it("a percent deposit plus the rest is the total exactly", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: MAX }), fc.integer({ min: 0, max: 100 }), (total, percent) => {
        const deposit = depositCents(total, { kind: "percent", percent });
        expect(deposit).toBeGreaterThanOrEqual(0);
        expect(deposit).toBeLessThanOrEqual(total);
        expect(deposit + (total - deposit)).toBe(total);
      }),
    );
  });
});

const MAX = 1_000_000_000;

describe("typed dollars", () => {
  it("reads dollars and cents as text", async () => {
    const { dollarsToCents, centsToDollarsText } = await import("@/server/money/totals");
    expect(dollarsToCents("125")).toBe(12_500);
    expect(dollarsToCents("125.5")).toBe(12_550);
    expect(dollarsToCents("$1,489.05")).toBe(148_905);
    expect(dollarsToCents("0.07")).toBe(7);
    expect(dollarsToCents("1.005")).toBeNull();
    expect(dollarsToCents("-3")).toBeNull();
    expect(dollarsToCents("")).toBeNull();
    // A comma is a thousands separator or nothing: a decimal comma is refused, never read as 100×.
    expect(dollarsToCents("1,250")).toBe(125_000);
    expect(dollarsToCents("12,345,678.90")).toBe(1_234_567_890);
    expect(dollarsToCents("12,50")).toBeNull();
    expect(dollarsToCents("1,25.00")).toBeNull();
    expect(dollarsToCents("1250,")).toBeNull();
    expect(centsToDollarsText(148_905)).toBe("1489.05");
    expect(centsToDollarsText(7)).toBe("0.07");
  });
});

describe("a typed quote quantity", () => {
  it("a negative or zero quantity is told to be more than 0, not that it has too many decimals", () => {
    expect(quantityProblem("-1")).toBe("The quantity must be more than 0.");
    expect(quantityProblem("0")).toBe("The quantity must be more than 0.");
    expect(quantityProblem("-2.12345")).toBe("The quantity must be more than 0.");
  });
  it("names the other mistakes in the order they are fixed, and passes a quantity the shop can price", () => {
    expect(quantityProblem("")).toBe("Type the quantity, such as 1 or 2.5.");
    expect(quantityProblem("two")).toBe("Type the quantity as a number, such as 1 or 2.5.");
    expect(quantityProblem("100001")).toBe("The quantity is at most 100,000.");
    expect(quantityProblem("2.1254")).toBe("At most three decimals (2.125, not 2.1254).");
    for (const ok of ["1", "2.5", " 6.125 ", "100000"]) expect(quantityProblem(ok)).toBeNull();
  });
  it("the API gives the same single message for a negative quantity", () => {
    const parsed = quantitySchema.safeParse(-1);
    expect(parsed.error?.issues.map((i) => i.message)).toEqual(["The quantity must be more than 0."]);
    expect(quantitySchema.safeParse(1.0005).error?.issues.map((i) => i.message)).toEqual(["At most three decimals (2.125, not 2.1254)."]);
    expect(quantitySchema.safeParse(2.5).success).toBe(true);
  });
});
