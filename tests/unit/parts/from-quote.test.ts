import { describe, expect, it } from "vitest";
import { type QuotePartLine, kindOfQuoteLine, lineFromQuote, linesFromQuote } from "@/server/parts/rules";

const line = (description: string, quantityMilli = 1000, kitUse: string | null = null): QuotePartLine => ({ description, quantityMilli, kitUse });

describe("a quote's part line as a bought-in line", () => {
  it("takes its kind from the price-list item's kit use, else from the trade's words", () => {
    expect(kindOfQuoteLine(line("Side-mount 6-bolt unit", 1000, "pto"))).toBe("pto");
    expect(kindOfQuoteLine(line("Direct-mount gear unit", 1000, "pump"))).toBe("pump");
    expect(kindOfQuoteLine(line("Return line, 1.25 in", 1000, "hose"))).toBe("hose");
    expect(kindOfQuoteLine(line("PTO, 52 % of engine speed"))).toBe("pto");
    expect(kindOfQuoteLine(line("Power take-off, 8-bolt"))).toBe("pto");
    expect(kindOfQuoteLine(line("Hydraulic pump, 2.5 in³/rev"))).toBe("pump");
    expect(kindOfQuoteLine(line("Directional control valve, 3 spool"))).toBe("valve");
    expect(kindOfQuoteLine(line("Pressure hose, 1 in inside diameter, 12.5 ft"))).toBe("hose");
    expect(kindOfQuoteLine(line("Breakaway coupler pair"))).toBe("fitting");
    expect(kindOfQuoteLine(line("Dash switch and indicator lamp"))).toBe("control");
    expect(kindOfQuoteLine(line("Mounting bracket kit"))).toBe("other");
    // A reservoir priced from the list is built in the shop, never a PTO because of its item.
    expect(kindOfQuoteLine(line("Reservoir, round 20 in × 30 in", 1000, "reservoir"))).toBe("other");
  });

  it("carries whole quantities over, and makes a fractional one (hose by the foot) one piece with the quantity in words", () => {
    expect(lineFromQuote(line("Breakaway coupler pair", 2000))).toEqual({ kind: "fitting", description: "Breakaway coupler pair", quantity: 2 });
    expect(lineFromQuote(line("Pressure hose, 1 in", 12_500))).toEqual({ kind: "hose", description: "Pressure hose, 1 in (quoted quantity 12.5)", quantity: 1 });
    expect(lineFromQuote(line("Suction hose", 300))).toEqual({ kind: "hose", description: "Suction hose (quoted quantity 0.3)", quantity: 1 });
    // The description stays within the 200 characters a bought-in line takes.
    expect(lineFromQuote(line("x".repeat(200), 1500)).description).toHaveLength(200);
    expect(lineFromQuote(line("x".repeat(250), 1000)).description).toHaveLength(200);
  });
});

describe("listing a quote's parts on the job", () => {
  const quote = [
    line("PTO — PTO, 52 % of engine speed", 1000, "pto"),
    line("Pump — Hydraulic pump, 2.5 in³/rev", 1000, "pump"),
    line("Breakaway coupler pair", 2000),
    line("Pressure hose, 1 in", 12_500, "hose"),
    line("Fitting pack"),
    line("Fitting pack"),
  ];

  it("lists every line the first time, in quote order", () => {
    expect(linesFromQuote(quote, []).map((l) => [l.kind, l.quantity])).toEqual([
      ["pto", 1], ["pump", 1], ["fitting", 2], ["hose", 1], ["fitting", 1], ["fitting", 1],
    ]);
  });

  it("adds nothing on a second press", () => {
    const first = linesFromQuote(quote, []);
    expect(linesFromQuote(quote, first)).toEqual([]);
  });

  it("counts a PTO or pump already listed (by hand or from the kit spec) whatever its words", () => {
    const listed = [{ kind: "pto" as const, description: "PTO, 52 % of engine speed" }];
    expect(linesFromQuote(quote, listed).map((l) => l.kind)).toEqual(["pump", "fitting", "hose", "fitting", "fitting"]);
  });

  it("matches other lines on their words, case and spaces aside, one listed line for one quote line", () => {
    const listed = [
      { kind: "fitting" as const, description: "  fitting   PACK " },
      { kind: "fitting" as const, description: "Breakaway coupler pair" },
    ];
    const left = linesFromQuote(quote, listed);
    expect(left.map((l) => l.description)).toEqual([
      "PTO — PTO, 52 % of engine speed",
      "Pump — Hydraulic pump, 2.5 in³/rev",
      "Pressure hose, 1 in (quoted quantity 12.5)",
      "Fitting pack",
    ]);
  });

  it("adds a line whose words differ from every listed line", () => {
    expect(linesFromQuote([line("Valve, 2 spool")], [{ kind: "valve", description: "Valve, 3 spool" }])).toHaveLength(1);
  });
});
