import { describe, expect, it } from "vitest";
import { quoteBareNonFiniteNumbers } from "@/server/http/bare-numbers";

// JSON (RFC 8259 §6) has no NaN or Infinity literals; these tests pin how a body carrying them is made judgeable.
describe("quoteBareNonFiniteNumbers", () => {
  it("quotes bare NaN, Infinity and -Infinity so JSON.parse accepts the body", () => {
    const text = '{"engineRpm": NaN, "tank": {"lengthIn":Infinity}, "sumpGal": -Infinity, "list": [NaN]}';
    const quoted = quoteBareNonFiniteNumbers(text);
    expect(JSON.parse(quoted!)).toEqual({ engineRpm: "NaN", tank: { lengthIn: "Infinity" }, sumpGal: "-Infinity", list: ["NaN"] });
  });

  it("leaves the words alone inside strings, escaped quotes included", () => {
    expect(quoteBareNonFiniteNumbers('{"note": "NaN \\" Infinity", "x": 1}')).toBeNull();
    expect(JSON.parse(quoteBareNonFiniteNumbers('{"note": "a \\"NaN\\"", "x": NaN}')!)).toEqual({ note: 'a "NaN"', x: "NaN" });
  });

  it("answers null when there is nothing to quote, so the caller keeps its own error", () => {
    expect(quoteBareNonFiniteNumbers('{"engineRpm": 1200')).toBeNull();
    expect(quoteBareNonFiniteNumbers("")).toBeNull();
  });
});
