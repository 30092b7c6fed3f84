import { describe, expect, it } from "vitest";
import { collapseListErrors, fieldErrorSummary, listNumbers } from "@/server/records/form-errors";

const UNIT = "A film-thickness reading is 0.1 to 40 mils; check the unit (mils, not µm).";

describe("list errors collapsed for a form", () => {
  it("names item numbers plainly, with runs of three or more as a range", () => {
    expect(listNumbers([1])).toBe("1");
    expect(listNumbers([2, 1])).toBe("1 and 2");
    expect(listNumbers([1, 2, 4])).toBe("1, 2 and 4");
    expect(listNumbers([1, 2, 3, 5])).toBe("1–3 and 5");
    expect(listNumbers([])).toBe("");
  });

  it("shows one line for three readings with the same message, naming the readings and what was typed", () => {
    const fields = { "inspection.dftReadingsMils.0": [UNIT], "inspection.dftReadingsMils.1": [UNIT], "inspection.dftReadingsMils.2": [UNIT] };
    const typed = ["64", "71", "76"];
    expect(collapseListErrors(fields, "inspection.dftReadingsMils", { one: "Reading", many: "Readings" }, (i) => typed[i])).toEqual([
      `Readings 1–3 (64, 71, 76): ${UNIT}`,
    ]);
  });

  it("keeps different messages apart and the whole list's own message first", () => {
    const fields = {
      "inspection.dftReadingsMils.1": ["Enter each film-thickness reading in mils."],
      "inspection.dftReadingsMils.3": [UNIT],
      "inspection.dftReadingsMils": ["Enter at most 20 film-thickness readings."],
      "inspection.adhesionOk": ["Say whether the coating passed the adhesion check."],
    };
    expect(collapseListErrors(fields, "inspection.dftReadingsMils", { one: "Reading", many: "Readings" })).toEqual([
      "Enter at most 20 film-thickness readings.",
      "Reading 2: Enter each film-thickness reading in mils.",
      `Reading 4: ${UNIT}`,
    ]);
  });
});

describe("the one-line summary beside a form's button", () => {
  const order = ["testPressurePsig", "holdMinutes", "seams", "tester"];
  const label = (key: string) =>
    /^seams\.\d+\.result$/.test(key)
      ? `Result of seam ${Number(key.split(".")[1]) + 1}`
      : (({ testPressurePsig: "Test pressure", holdMinutes: "Hold", tester: "Tester" }) as Record<string, string>)[key] ?? null;

  it("lists the entries to fix in the form's order, each once, with numbered ones named together", () => {
    const seam = ["Mark the seam pass or leak."];
    const fields = { tester: ["Enter the tester's name."], "seams.2.result": seam, testPressurePsig: ["Enter Test pressure in psig."], "seams.0.result": seam, "seams.1.result": seam };
    expect(fieldErrorSummary(fields, order, label)).toBe("Fix 3 entries: Test pressure, Result of seams 1–3, Tester.");
    expect(fieldErrorSummary({ "seams.3.result": seam, holdMinutes: ["x"] }, order, label)).toBe("Fix 2 entries: Hold, Result of seam 4.");
    expect(fieldErrorSummary({ holdMinutes: ["x"] }, order, label)).toBe("Fix 1 entry: Hold.");
  });

  it("tells an error the form has no field for by its message", () => {
    const fields = { jobId: ["This part belongs to work order WO-26-0003; reload the job page."], holdMinutes: ["x"] };
    expect(fieldErrorSummary(fields, order, label)).toBe("Fix 1 entry: Hold. This part belongs to work order WO-26-0003; reload the job page.");
  });
});
