import { describe, expect, it } from "vitest";
import { csvCell, toCsv } from "@/server/audit/csv";

// Rules from OWASP's "CSV Injection" page (cells starting with = + - @ tab or carriage return
// are prefixed with a single quote) and RFC 4180 (quote fields with commas, quotes or line
// breaks, doubling the quotes inside).
describe("CSV cells", () => {
  it("makes formula-looking cells text", () => {
    expect(csvCell("=1+2")).toBe("'=1+2");
    expect(csvCell("+15550100")).toBe("'+15550100");
    expect(csvCell("-3+cmd")).toBe("'-3+cmd");
    expect(csvCell("-40 gal tank")).toBe("'-40 gal tank");
    expect(csvCell("@SUM(A1)")).toBe("'@SUM(A1)");
    expect(csvCell("\t=cmd")).toBe("'\t=cmd");
    expect(csvCell("\r=cmd")).toBe("\"'\r=cmd\"");
  });

  it("leaves a plain negative number a number, and makes anything more after a minus text", () => {
    // A negative amount (a job under its quote) must add up in a spreadsheet.
    for (const n of ["-1993.70", "-2", "-0.5", "-.5", "0", "1993.70"]) expect(csvCell(n)).toBe(n);
    expect(csvCell(-2)).toBe("-2");
    expect(csvCell(-0.5)).toBe("-0.5");
    expect(toCsv(["over_under_quote_dollars"], [["-1993.70"]])).toBe("over_under_quote_dollars\r\n-1993.70\r\n");
    // Only a minus, digits and one decimal point: anything else after the minus is still neutralised.
    for (const t of ["-1+2", "-2e3", "- 5", "-1.2.3", "-", "-.", "-1.", "-1,5", "-0x1F", "-Infinity", "-2-cmd|' /C calc'!A0", "+5", "+1.5"]) {
      expect(csvCell(t).replace(/^"/, "").startsWith("'"), t).toBe(true);
    }
    expect(csvCell(-Infinity)).toBe("'-Infinity");
  });

  it("quotes commas, quotes and line breaks, and leaves plain text alone", () => {
    expect(csvCell("Rosa Quill")).toBe("Rosa Quill");
    expect(csvCell("a, b")).toBe('"a, b"');
    expect(csvCell('say "hi"')).toBe('"say ""hi"""');
    expect(csvCell("two\nlines")).toBe('"two\nlines"');
    expect(csvCell('=HYPERLINK("x","y")')).toBe(`"'=HYPERLINK(""x"",""y"")"`);
    expect(csvCell(null)).toBe("");
    expect(csvCell(42)).toBe("42");
  });

  it("joins rows with CRLF and ends with one", () => {
    expect(toCsv(["a", "b"], [["1", "x,y"]])).toBe('a,b\r\n1,"x,y"\r\n');
  });
});
