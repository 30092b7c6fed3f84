import { describe, expect, it } from "vitest";
import { csvCell, toCsv } from "@/server/audit/csv";

// Rules from OWASP's "CSV Injection" page (cells starting with = + - @ tab or carriage return
// are prefixed with a single quote) and RFC 4180 (quote fields with commas, quotes or line
// breaks, doubling the quotes inside).
describe("CSV cells", () => {
  it("makes formula-looking cells text", () => {
    expect(csvCell("=1+2")).toBe("'=1+2");
    expect(csvCell("+15550100")).toBe("'+15550100");
    expect(csvCell("-3")).toBe("'-3");
    expect(csvCell("@SUM(A1)")).toBe("'@SUM(A1)");
    expect(csvCell("\t=cmd")).toBe("'\t=cmd");
    expect(csvCell("\r=cmd")).toBe("\"'\r=cmd\"");
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
