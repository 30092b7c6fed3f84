import { describe, expect, it } from "vitest";
import { jobRoute, nextOnRoute, statusSteps, stepsShown } from "@/server/status/route";
import { whatComesNext } from "@/server/status/words";

/*
 * The shop's rule for the customer's steps, written out by hand for each shape of job:
 * - no fabricated part: no Fabrication, Pressure test or Powder coat;
 * - fabricated parts, none leak-tested: no Pressure test;
 * - fabricated parts, none sent for outside coating: no Powder coat.
 */
const tank = { needsLeakTest: true, needsCoating: true };
const stainlessTank = { needsLeakTest: true, needsCoating: false };
const bracket = { needsLeakTest: false, needsCoating: false };
const coatedBracket = { needsLeakTest: false, needsCoating: true };

describe("a job's route from its work and parts", () => {
  it("install only: booked in, install, wiring, ready, picked up", () => {
    expect(jobRoute("install_only", [])).toEqual(["queued", "install", "wire", "ready", "delivered"]);
    expect(jobRoute("install_only", [bracket])).toEqual(["queued", "install", "wire", "ready", "delivered"]);
  });

  it("fabricated parts but none recorded yet: fabrication is told, test and coating once a part needs them", () => {
    expect(jobRoute("fabrication", [])).toEqual(["queued", "fabricate", "install", "wire", "ready", "delivered"]);
  });

  it("a tank that is leak-tested and powder coated: every step", () => {
    expect(jobRoute("fabrication", [tank])).toEqual(["queued", "fabricate", "pressure_test", "coating", "install", "wire", "ready", "delivered"]);
  });

  it("a stainless tank with no outside coating: pressure test, no powder coat", () => {
    expect(jobRoute("fabrication", [stainlessTank])).toEqual(["queued", "fabricate", "pressure_test", "install", "wire", "ready", "delivered"]);
  });

  it("a bare bracket: fabrication only, no pressure test, no powder coat", () => {
    expect(jobRoute("fabrication", [bracket])).toEqual(["queued", "fabricate", "install", "wire", "ready", "delivered"]);
  });

  it("a coated bracket beside a stainless tank: both steps, because some part needs each", () => {
    expect(jobRoute("fabrication", [stainlessTank, coatedBracket])).toEqual(["queued", "fabricate", "pressure_test", "coating", "install", "wire", "ready", "delivered"]);
    expect(jobRoute("fabrication", [bracket, coatedBracket])).toEqual(["queued", "fabricate", "coating", "install", "wire", "ready", "delivered"]);
  });

  it("the next step is the next one on the job's own route", () => {
    const stainless = jobRoute("fabrication", [stainlessTank]);
    expect(nextOnRoute(stainless, "pressure_test")).toBe("install");
    expect(whatComesNext("pressure_test", stainless)).toBe("Next, we install the kit on your truck.");
    expect(whatComesNext("fabricate", jobRoute("fabrication", [bracket]))).toBe("Next, we install the kit on your truck.");
    expect(whatComesNext("fabricate", jobRoute("fabrication", [tank]))).toBe("Next, the fabricated parts are pressure-tested for leaks.");
    expect(whatComesNext("pressure_test", jobRoute("fabrication", [tank]))).toBe("Next, the parts go to an outside coater for powder coat.");
    expect(whatComesNext("queued", jobRoute("fabrication", []))).toBe("Next, we start building the fabricated parts. We will e-mail you as the job moves.");
    expect(whatComesNext("queued", jobRoute("install_only", []))).toBe("Next, we start installing the kit. We will e-mail you as the job moves.");
    expect(whatComesNext("queued", jobRoute("fabrication", [bracket]))).toBe("Next, we start building the fabricated parts. We will e-mail you as the job moves.");
    expect(nextOnRoute(stainless, "delivered")).toBeNull();
  });

  it("a card sitting in a stage off its route still shows where it is", () => {
    const bare = jobRoute("fabrication", [bracket]);
    expect(stepsShown(bare, "install")).toEqual(bare);
    expect(stepsShown(bare, "coating")).toEqual(["queued", "fabricate", "coating", "install", "wire", "ready", "delivered"]);
  });
});

describe("the customer's timeline", () => {
  const route = jobRoute("fabrication", [tank]);
  const at = (d: number) => `2026-11-${String(d).padStart(2, "0")}T15:00:00.000Z`;

  it("marks each step the job went through done, with when, and the rest to come", () => {
    const timeline = [{ fromStage: null, toStage: "queued", back: false, at: at(2) }, { fromStage: "queued", toStage: "fabricate", back: false, at: at(3) }, { fromStage: "fabricate", toStage: "pressure_test", back: false, at: at(5) }] as const;
    expect(statusSteps(route, "pressure_test", timeline).map((s) => [s.stage, s.state, s.reachedAt])).toEqual([
      ["queued", "done", at(2)],
      ["fabricate", "done", at(3)],
      ["pressure_test", "now", at(5)],
      ["coating", "next", null],
      ["install", "next", null],
      ["wire", "next", null],
      ["ready", "next", null],
      ["delivered", "next", null],
    ]);
  });

  it("never calls a step done that the job was moved past without entering", () => {
    // The owner moved the job from Fabricate straight to Ready for pickup.
    const timeline = [{ fromStage: null, toStage: "queued", back: false, at: at(2) }, { fromStage: "queued", toStage: "fabricate", back: false, at: at(3) }, { fromStage: "fabricate", toStage: "ready", back: false, at: at(9) }] as const;
    expect(statusSteps(route, "ready", timeline).map((s) => [s.stage, s.state])).toEqual([
      ["queued", "done"],
      ["fabricate", "done"],
      ["ready", "now"],
      ["delivered", "next"],
    ]);
  });

  it("keeps the earlier steps of a job booked in at a later step: no move jumped over them", () => {
    // No move jumped over Booked in or Fabrication: they stay, as before.
    const timeline = [{ fromStage: null, toStage: "pressure_test", back: false, at: at(4) }] as const;
    expect(statusSteps(route, "pressure_test", timeline).map((s) => s.stage).slice(0, 3)).toEqual(["queued", "fabricate", "pressure_test"]);
  });
});
