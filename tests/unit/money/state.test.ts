import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { checkMove, NO_RECORDS, nextGateState } from "@/server/jobs/gates";
import { balanceDueCents, invoiceOutOfDate, type JobMoney, moneyBeforeDeliveryUnmet, moneyBeforeWorkUnmet, moneyWords, NO_MONEY } from "@/server/money/state";

const on = (m: Partial<JobMoney>): JobMoney => ({ ...NO_MONEY, checksOn: true, ...m });
// $2,111.84 approved, half of it ($1,055.92) asked as the deposit.
const approved = on({ quoteStatus: "approved", priceCents: 211_184, depositAskedCents: 105_592 });
const depositPaid = { ...approved, depositReceivedCents: 105_592, receivedCents: 105_592 };
// A job with one plain part and a complete sign-off: only money stands between it and any stage.
const withRecords = (money: JobMoney) => ({ ...NO_RECORDS, partCount: 1, signOff: { complete: true, missing: [] }, money });

describe("money before work", () => {
  it("asks for an approved quote, saying where the quote stands", () => {
    expect(moneyBeforeWorkUnmet(on({}))).toEqual(["An approved quote: no quote yet; make one under Quote and send it."]);
    expect(moneyBeforeWorkUnmet(on({ quoteStatus: "sent" }))[0]).toMatch(/waiting for the customer's answer/);
    expect(moneyBeforeWorkUnmet(on({ quoteStatus: "declined" }))[0]).toMatch(/declined/);
  });
  it("then the deposit, by what is still owed", () => {
    expect(moneyBeforeWorkUnmet(approved)).toEqual(["Deposit: $1,055.92 not paid yet; the customer pays on the status link, or record cash or a check under Money."]);
    expect(moneyBeforeWorkUnmet({ ...approved, depositReceivedCents: 100_000 })[0]).toMatch(/^Deposit: \$55\.92 not paid yet/);
    expect(moneyBeforeWorkUnmet(depositPaid)).toEqual([]);
  });
  it("asks no deposit when the shop asks none, and nothing when the checks are off", () => {
    expect(moneyBeforeWorkUnmet({ ...approved, depositAskedCents: 0 })).toEqual([]);
    expect(moneyBeforeWorkUnmet({ ...NO_MONEY, checksOn: false })).toEqual([]);
  });
});

describe("the money gates on a move", () => {
  it("Fabricate is refused before the deposit and allowed after; install-only work meets it at Install", () => {
    expect(checkMove("queued", "fabricate", "fabrication", withRecords(approved)).unmet).toEqual([expect.stringMatching(/^Into Fabricate: Deposit: \$1,055\.92/)]);
    expect(checkMove("queued", "fabricate", "fabrication", withRecords(depositPaid)).unmet).toEqual([]);
    expect(checkMove("queued", "install", "install_only", withRecords(approved)).unmet).toEqual([expect.stringMatching(/^Into Install: Deposit/)]);
    // Skipping a column never skips its check.
    expect(checkMove("queued", "install", "fabrication", withRecords(on({}))).unmet[0]).toMatch(/^Into Fabricate: An approved quote/);
  });
  it("Delivered needs the invoice settled or on account", () => {
    const open = { ...depositPaid, invoice: { number: "INV-26-0001", status: "open" as const, totalCents: 211_184 } };
    expect(checkMove("ready", "delivered", "fabrication", withRecords(open)).unmet).toEqual([
      "Into Delivered: Invoice INV-26-0001: balance due $1,055.92; the customer pays on the status link, or record a payment under Money.",
    ]);
    expect(moneyBeforeDeliveryUnmet({ ...open, invoice: { ...open.invoice, status: "on_account" } })).toEqual([]);
    expect(moneyBeforeDeliveryUnmet({ ...open, receivedCents: 211_184, invoice: { ...open.invoice, status: "paid" } })).toEqual([]);
    expect(moneyBeforeDeliveryUnmet(depositPaid)[0]).toMatch(/none yet; it goes out when the job reaches Ready for pickup/);
  });
  it("a change order approved after the invoice holds the truck until the invoice is made again", () => {
    // The invoice billed $2,111.84 and was paid in full; then a $350.00 change order was approved:
    // the work is now $2,461.84, so "paid" no longer means nothing is owed.
    const paid = { ...depositPaid, receivedCents: 211_184, invoice: { number: "INV-26-0001", status: "paid" as const, totalCents: 211_184 } };
    const changed = { ...paid, priceCents: 211_184 + 35_000 };
    expect(invoiceOutOfDate(paid)).toBe(false);
    expect(invoiceOutOfDate(changed)).toBe(true);
    expect(checkMove("ready", "delivered", "fabrication", withRecords(changed)).unmet).toEqual([
      "Into Delivered: Invoice INV-26-0001 bills $2,111.84, but the approved work is now $2,461.84 after a change order: the owner voids it under Money, then make the new invoice there.",
    ]);
    expect(moneyWords(changed)).toBe("Invoice out of date");
    // A change order replaced by a smaller one leaves the invoice billing too much: the same hold.
    expect(invoiceOutOfDate({ ...paid, priceCents: 200_000 })).toBe(true);
    // On account does not excuse it either: the account would carry the wrong figure.
    expect(moneyBeforeDeliveryUnmet({ ...changed, invoice: { ...changed.invoice, status: "on_account" } })[0]).toMatch(/^Invoice INV-26-0001 bills \$2,111\.84/);
    // The shop's money checks off: the truck may go, as with every money check.
    expect(moneyBeforeDeliveryUnmet({ ...changed, checksOn: false })).toEqual([]);
  });
  it("the card looks past Fabricate and Delivered when the shop's money checks are off", () => {
    expect(nextGateState("queued", "fabrication", withRecords(approved))).toEqual({ gate: "fabricate", unmet: [expect.stringMatching(/Deposit/)] });
    expect(nextGateState("queued", "fabrication", withRecords({ ...approved, checksOn: false }))?.gate).toBe("coating");
    expect(nextGateState("ready", "fabrication", withRecords(depositPaid))?.gate).toBe("delivered");
  });
});

describe("the money state in words", () => {
  it("follows the quote, the deposit and the invoice", () => {
    expect(moneyWords(on({}))).toBeNull();
    expect(moneyWords(on({ quoteStatus: "sent" }))).toBe("Quote sent");
    expect(moneyWords(approved)).toBe("Deposit due $1,055.92");
    expect(moneyWords(depositPaid)).toBe("Deposit paid");
    expect(moneyWords({ ...approved, depositAskedCents: 0 })).toBe("Quote approved");
    const invoiced = { ...depositPaid, invoice: { number: "INV-26-0001", status: "open" as const, totalCents: 211_184 } };
    expect(moneyWords(invoiced)).toBe("Balance due $1,055.92");
    expect(moneyWords({ ...invoiced, receivedCents: 211_184, invoice: { ...invoiced.invoice, status: "paid" } })).toBe("Paid in full");
    expect(moneyWords({ ...invoiced, invoice: { ...invoiced.invoice, status: "on_account" } })).toBe("Invoice on account");
  });
  it("payments in any split settle the balance exactly, never past zero", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 100_000_000 }), fc.array(fc.integer({ min: 1, max: 1_000 }), { minLength: 1, maxLength: 12 }), (price, weights) => {
        // Split the price into parts by weight, the last taking what is left, as a counter would.
        const sum = weights.reduce((a, b) => a + b, 0);
        const parts = weights.map((w) => Math.floor((price * w) / sum));
        parts[parts.length - 1] += price - parts.reduce((a, b) => a + b, 0);
        let received = 0;
        for (const p of parts) {
          received += p;
          expect(balanceDueCents(on({ quoteStatus: "approved", priceCents: price, receivedCents: received }))).toBeGreaterThanOrEqual(0);
        }
        expect(balanceDueCents(on({ quoteStatus: "approved", priceCents: price, receivedCents: received }))).toBe(0);
      }),
    );
  });
});
