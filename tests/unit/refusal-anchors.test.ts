import { describe, expect, it } from "vitest";
import { recordAnchorOf } from "@/components/refusal-note";
import { NO_RECORDS, checkMove } from "@/server/jobs/gates";
import type { JobMoney } from "@/server/money/state";

const money = (over: Partial<JobMoney>): JobMoney => ({ checksOn: true, quoteStatus: "approved", depositAskedCents: 50_000, depositReceivedCents: 0, priceCents: 100_000, receivedCents: 0, onAccountCents: 0, invoice: null, ...over });

describe("each need in a refused move opens where it is recorded on the job page", () => {
  it("sends each kind of need to its own section", () => {
    const needs = checkMove("queued", "ready", "fabrication", {
      ...NO_RECORDS,
      partCount: 1,
      leakTestParts: [{ name: "35 gal round reservoir", passedSinceRework: false, lastResult: null }],
      waitingBoughtParts: [{ description: "10-bolt PTO", quantity: 1, receivedQuantity: 0, state: "needed" }],
      money: money({ quoteStatus: "sent" }),
    }).unmet;
    expect(needs.map((n) => [n.split(":")[0], recordAnchorOf(n)])).toEqual([
      ["Into Fabricate", "quote"],
      ["Into Outside coating", "parts"],
      ["Into Install", "bought-parts"],
      ["Into Ready for pickup", "sign-off"],
    ]);
    const deposit = checkMove("queued", "fabricate", "fabrication", { ...NO_RECORDS, money: money({}) }).unmet;
    expect(deposit.map(recordAnchorOf)).toEqual(["money"]);
  });
});
