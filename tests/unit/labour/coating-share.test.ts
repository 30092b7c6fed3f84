import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { coatingShare, jobCost, splitRunPrice } from "@/server/labour/cost";

describe("a coating run's price split over its parts", () => {
  it("gives equal whole-cent shares, the odd cents to the lowest part ids", () => {
    // $100.00 over 3 parts: 10000 = 3334 + 3333 + 3333.
    expect([...splitRunPrice(10_000, [12, 5, 9])]).toEqual([[5, 3334], [9, 3333], [12, 3333]]);
    // $480.00 over 4 parts divides evenly: $120.00 each.
    expect([...splitRunPrice(48_000, [1, 2, 3, 4]).values()]).toEqual([12_000, 12_000, 12_000, 12_000]);
    // 2 cents over 3 parts: the third part's share is nothing.
    expect([...splitRunPrice(2, [7, 8, 9])]).toEqual([[7, 1], [8, 1], [9, 0]]);
    expect([...splitRunPrice(0, [1, 2])]).toEqual([[1, 0], [2, 0]]);
    expect(splitRunPrice(500, []).size).toBe(0);
    // A part listed twice is one part.
    expect([...splitRunPrice(101, [4, 4, 3])]).toEqual([[3, 51], [4, 50]]);
  });

  it("always adds up to the price, each share within a cent of the others", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 10_000_000 }), fc.uniqueArray(fc.integer({ min: 1, max: 1_000_000 }), { minLength: 1, maxLength: 60 }), (price, ids) => {
        const shares = [...splitRunPrice(price, ids).values()];
        expect(shares.reduce((a, b) => a + b, 0)).toBe(price);
        expect(Math.max(...shares) - Math.min(...shares)).toBeLessThanOrEqual(1);
      }),
    );
  });

  it("gives a job its parts' shares of each run, and counts runs with no price apart", () => {
    const runs = [
      // $300.00 run: two of this job's parts and one of another job's, $100.00 each.
      { priceCents: 30_000, partIds: [1, 2, 50] },
      // $50.01 run of this job's part 1 again (a recoat) and another job's part: 2501 + 2500.
      { priceCents: 5001, partIds: [1, 60] },
      { priceCents: null, partIds: [2] },
      // A run with none of this job's parts is not its cost.
      { priceCents: 99_999, partIds: [70, 71] },
    ];
    expect(coatingShare(runs, new Set([1, 2]))).toEqual({ cents: 20_000 + 2501, unpricedRuns: 1 });
    expect(coatingShare(runs, new Set([50]))).toEqual({ cents: 10_000, unpricedRuns: 0 });
    expect(coatingShare(runs, new Set([60]))).toEqual({ cents: 2500, unpricedRuns: 0 });
    expect(coatingShare([], new Set([1]))).toEqual({ cents: 0, unpricedRuns: 0 });
  });

  it("adds the coating share to the job's cost so far", () => {
    const cost = jobCost({ rateCentsPerHour: 0, msByStage: [], boughtLines: [{ quantity: 2, unitCostCents: 1250 }], coating: { cents: 22_501, unpricedRuns: 1 } });
    expect(cost).toEqual(expect.objectContaining({ partsCents: 2500, coatingCents: 22_501, unpricedCoatingRuns: 1, totalCents: 25_001 }));
    expect(jobCost({ rateCentsPerHour: 0, msByStage: [], boughtLines: [] })).toEqual(expect.objectContaining({ coatingCents: 0, totalCents: 0 }));
  });
});
