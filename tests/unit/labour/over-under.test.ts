import { describe, expect, it } from "vitest";
import { OVER_UNDER_QUOTE, overUnderWords } from "@/server/labour/cost";

describe("a job's cost so far against its quote", () => {
  it("has one name, and says over, under or on the quote with the amount in dollars", () => {
    expect(OVER_UNDER_QUOTE).toBe("Over / under the quote");
    // Cost $1,141.91 against a $2,000.00 quote: $858.09 under.
    expect(overUnderWords(114_191 - 200_000)).toBe("under by $858.09");
    // Cost $2,012.00 against $2,000.00: $12.00 over.
    expect(overUnderWords(201_200 - 200_000)).toBe("over by $12.00");
    expect(overUnderWords(0)).toBe("on the quote");
    expect(overUnderWords(-123_456_78)).toBe("under by $123,456.78");
  });
});
