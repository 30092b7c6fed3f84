import { describe, expect, it } from "vitest";
import { type MoneyDocument, renderMoneyPdf } from "@/server/money/pdf";
import { pdfPages } from "../../support/pdf-text";

const BASE: MoneyDocument = {
  title: "Invoice",
  number: "INV-26-0004",
  dateWords: "3 December 2026",
  shop: { name: "Cold Creek Upfit", address: "400 Mill Race Road, Cold Creek", phone: "555-0142" },
  customer: { name: "Tamsin Flats Recovery" },
  job: { workOrder: "WO-26-0031", description: "Wet kit: PTO pump, 40 gal aluminum tank", unitNumber: "TF-9" },
  lines: [
    { description: "PTO, 10-bolt, air shift", kindWords: "Bought-in part", quantity: 1, unitPriceCents: 148_900, amountCents: 148_900, taxable: true },
    { description: "Install and plumb", kindWords: "Labour", quantity: 6.5, unitPriceCents: 12_500, amountCents: 81_250, taxable: false },
  ],
  // By hand: 1,489.00 + 812.50 = 2,301.50; 8.25 % of 1,489.00 = 122.8425 → 122.84; total 2,424.34.
  subtotalCents: 230_150,
  taxableCents: 148_900,
  taxRatePercent: 8.25,
  taxCents: 12_284,
  totalCents: 242_434,
  // Deposit 1,212.17 received; 2,424.34 − 1,212.17 = 1,212.17 due.
  payments: [{ label: "Deposit received 12 November 2026", amountCents: 121_217 }],
  balanceCents: 121_217,
  createdAt: new Date("2026-12-03T15:00:00Z"),
};

describe("money documents as PDF", () => {
  it("an invoice shows the shop, customer, job, lines, figures, payments and the balance as a PDF reader reads them", async () => {
    const [page, more] = await pdfPages(await renderMoneyPdf(BASE));
    expect(more).toBeUndefined();
    for (const words of ["Cold Creek Upfit", "400 Mill Race Road, Cold Creek", "Phone 555-0142", "Invoice", "INV-26-0004", "3 December 2026", "For Tamsin Flats Recovery", "Work order WO-26-0031 · Unit TF-9 · Wet kit: PTO pump, 40 gal aluminum tank", "6.5 × $125.00 $812.50", "Bought-in part · taxable", "Labour · not taxed"]) {
      expect(page).toContain(words);
    }
    expect(page).toContain("Subtotal $2,301.50 Sales tax 8.25 % on $1,489.00 $122.84 Total $2,424.34 Deposit received 12 November 2026 -$1,212.17 Balance due $1,212.17");
    expect(page).not.toContain("Deposit due on approval");
  });

  it("the same document gives the same bytes, so a retried e-mail carries an identical file", async () => {
    expect((await renderMoneyPdf(BASE)).equals(await renderMoneyPdf(BASE))).toBe(true);
  });

  it("a long document runs onto more pages and ends with its figures; characters Helvetica lacks print as ?", async () => {
    const lines = Array.from({ length: 60 }, (_, i) => ({ description: `Hose fitting ${i + 1} ≤ 1 in`, quantity: 1, unitPriceCents: 1_000, amountCents: 1_000, taxable: false }));
    const pages = await pdfPages(await renderMoneyPdf({ ...BASE, lines, subtotalCents: 60_000, taxableCents: 0, taxCents: 0, totalCents: 60_000, payments: undefined, balanceCents: undefined, terms: "Payment due on pickup." }));
    expect(pages.length).toBeGreaterThan(1);
    const all = pages.join(" ");
    expect(all).toContain("Hose fitting 60 ? 1 in");
    expect(pages.at(-1)).toContain("Total $600.00");
    expect(pages.at(-1)).toContain("Payment due on pickup.");
  });
});
