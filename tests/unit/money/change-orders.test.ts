import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { figureRows, lineQuantityWords } from "@/server/money/document";
import { agreedPriceCents, documentTotals } from "@/server/money/totals";

// Figures worked by hand; tax is 8.25 % on the taxable subtotal, rounded half-up once per document
// (Streamlined Sales and Use Tax Agreement §324, invoice basis).

describe("the job's price: approved quote plus approved change orders", () => {
  it("adds each approved document's own total, tax included", () => {
    // Quote: $1,989.00 + tax $122.84 = $2,111.84. Change order: $389.50 taxable, tax 32.13375 → $32.13, total $421.63.
    // Job price: $2,111.84 + $421.63 = $2,533.47.
    const quote = documentTotals(
      [
        { kind: "part", quantityMilli: 1000, unitPriceCents: 148_900, taxable: true },
        { kind: "labour", quantityMilli: 4000, unitPriceCents: 12_500, taxable: false },
      ],
      8250,
    );
    const change = documentTotals([{ kind: "part", quantityMilli: 1000, unitPriceCents: 38_950, taxable: true }], 8250);
    expect(quote.totalCents).toBe(211_184);
    expect(change).toEqual({ subtotalCents: 38_950, taxableCents: 38_950, taxCents: 3_213, totalCents: 42_163 });
    expect(agreedPriceCents([{ status: "approved", totalCents: quote.totalCents }, { status: "approved", totalCents: change.totalCents }])).toBe(253_347);
  });

  it("a declined, waiting, replaced or draft change order adds nothing", () => {
    const docs = [
      { status: "approved", totalCents: 211_184 },
      { status: "declined", totalCents: 42_163 },
      { status: "sent", totalCents: 10_000 },
      { status: "superseded", totalCents: 9_999 },
      { status: "draft", totalCents: 1 },
      { status: "approved", totalCents: 5_413 },
    ];
    // $2,111.84 + $54.13 = $2,165.97
    expect(agreedPriceCents(docs)).toBe(216_597);
    expect(agreedPriceCents([])).toBe(0);
  });

  it("tax is rounded once on each document, never on the job as a whole", () => {
    // 6 ¢ × 8.25 % = 0.495 ¢: under half a cent, so 0 ¢.
    const small = documentTotals([{ kind: "fee", quantityMilli: 1000, unitPriceCents: 6, taxable: true }], 8250);
    expect(small.taxCents).toBe(0);
    // 1,000 ¢ × 8.25 % = 82.5 ¢ → 83 ¢ on each document; the job pays 2 × 1,083 ¢ = 2,166 ¢.
    const ten = documentTotals([{ kind: "fee", quantityMilli: 1000, unitPriceCents: 1_000, taxable: true }], 8250);
    expect(ten.totalCents).toBe(1_083);
    expect(agreedPriceCents([{ status: "approved", ...ten }, { status: "approved", ...ten }])).toBe(2_166);
  });

  it("is always whole cents and exactly the sum of the approved documents' totals", () => {
    const doc = fc.record({
      status: fc.constantFrom("approved", "declined", "sent", "superseded", "draft"),
      lines: fc.array(fc.record({ quantityMilli: fc.integer({ min: 1, max: 500_000 }), unitPriceCents: fc.integer({ min: 0, max: 5_000_000 }), taxable: fc.boolean() }), { minLength: 1, maxLength: 8 }),
    });
    fc.assert(
      fc.property(fc.array(doc, { maxLength: 6 }), fc.integer({ min: 0, max: 25_000 }), (docs, rate) => {
        const priced = docs.map((d) => ({ status: d.status, ...documentTotals(d.lines.map((l) => ({ kind: "fee" as const, ...l })), rate) }));
        const price = agreedPriceCents(priced);
        expect(Number.isSafeInteger(price)).toBe(true);
        let sum = 0;
        for (const d of priced) if (d.status === "approved") sum += d.subtotalCents + d.taxCents;
        expect(price).toBe(sum);
      }),
    );
  });
});

describe("the figures under a document, as every screen, e-mail and PDF writes them", () => {
  it("a quote: subtotal, tax with its rate and base, total, deposit", () => {
    expect(figureRows({ subtotalCents: 198_900, taxableCents: 148_900, taxRatePercent: 8.25, taxCents: 12_284, totalCents: 211_184, depositCents: 105_592 })).toEqual([
      { label: "Subtotal", value: "$1,989.00", strong: false },
      { label: "Sales tax 8.25 % on $1,489.00", value: "$122.84", strong: false },
      { label: "Total", value: "$2,111.84", strong: true },
      { label: "Deposit due on approval", value: "$1,055.92", strong: false },
    ]);
  });
  it("a change order asks no deposit; an invoice lists payments and the balance", () => {
    expect(figureRows({ subtotalCents: 38_950, taxableCents: 38_950, taxRatePercent: 8.875, taxCents: 3_457, totalCents: 42_407 }).map((r) => r.label)).toEqual(["Subtotal", "Sales tax 8.875 % on $389.50", "Total"]);
    const invoice = figureRows({ subtotalCents: 100_000, taxableCents: 0, taxRatePercent: 0, taxCents: 0, totalCents: 100_000, payments: [{ label: "Deposit received", amountCents: 50_000 }], balanceCents: 50_000 });
    // Nothing taxable: no tax row at all, rather than "Sales tax 0 % on $0.00".
    expect(invoice.map((r) => r.label)).toEqual(["Subtotal", "Total", "Deposit received", "Balance due"]);
    expect(invoice.slice(2)).toEqual([
      { label: "Deposit received", value: "−$500.00", strong: false },
      { label: "Balance due", value: "$500.00", strong: true },
    ]);
  });
  it("a line's quantity and price", () => {
    expect(lineQuantityWords(2.5, 12_500)).toBe("2.5 × $125.00");
  });
});
