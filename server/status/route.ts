import { STAGES, type JobScope, type Stage } from "@/db/schema";

/*
 * The steps a customer is told about come from what the job really has: its work (fabricated
 * parts or install only) and the parts the office recorded. A stainless tank marked "no outside
 * coating" has no powder coat step; a job with no part to leak-test has no pressure test step; a
 * job of fabricated parts has its fabrication step from the day it is booked in.
 * Pure: the status page and the e-mails call it with the job's parts as they are now, so a part
 * added later changes the route from then on.
 */

export interface RoutePart {
  needsLeakTest: boolean;
  needsCoating: boolean;
}

/** The job's route, in board order. */
export function jobRoute(scope: JobScope, parts: readonly RoutePart[]): Stage[] {
  const on = new Set<Stage>(["queued", "install", "wire", "ready", "delivered"]);
  // Fabrication is told from the start (parts are recorded as they are built); the test and
  // coating steps only once a recorded part needs them.
  if (scope === "fabrication") {
    on.add("fabricate");
    if (parts.some((p) => p.needsLeakTest)) on.add("pressure_test");
    if (parts.some((p) => p.needsCoating)) on.add("coating");
  }
  return STAGES.filter((s) => on.has(s));
}

/**
 * The steps to show while the job sits in `stage`: the route, plus the stage the card is in when
 * the route does not have it (an owner's override, or parts not recorded yet), so the customer
 * always sees where the job is now.
 */
export function stepsShown(route: readonly Stage[], stage: Stage): Stage[] {
  return route.includes(stage) ? [...route] : STAGES.filter((s) => s === stage || route.includes(s));
}

/** The next step on the route after `stage`, or null after the last one. */
export function nextOnRoute(route: readonly Stage[], stage: Stage): Stage | null {
  const at = STAGES.indexOf(stage);
  return route.find((s) => STAGES.indexOf(s) > at) ?? null;
}

/** The first step of work after booking in: fabrication when the route has it, else install. */
export function firstWorkStep(route: readonly Stage[]): Stage | null {
  return nextOnRoute(route, "queued");
}

export interface StatusStep {
  stage: Stage;
  state: "done" | "now" | "next";
  reachedAt: string | null;
  backAt: string | null;
}

/**
 * The customer's timeline: the job's route with the date each step was last reached; later steps
 * are still to come. A step behind the job that it never entered (the owner moved it past) is left
 * out: the customer is never told a step was done when it was not.
 */
export function statusSteps(route: readonly Stage[], stage: Stage, timeline: readonly { fromStage?: Stage | null; toStage: Stage; back: boolean; at: string }[]): StatusStep[] {
  const current = STAGES.indexOf(stage);
  const at = (s: Stage | null | undefined) => (s ? STAGES.indexOf(s) : -1);
  const entered = new Set(timeline.map((e) => e.toStage));
  // Passed over: a recorded move jumped from before the step to after it, and no move entered it.
  const passedOver = (s: Stage) => !entered.has(s) && timeline.some((e) => e.fromStage && at(e.fromStage) < at(s) && at(e.toStage) > at(s));
  return stepsShown(route, stage)
    .filter((s) => STAGES.indexOf(s) >= current || !passedOver(s))
    .map((s) => {
      const arrivals = timeline.filter((e) => e.toStage === s);
      const state = s === stage ? "now" : STAGES.indexOf(s) < current ? "done" : "next";
      const back = arrivals.filter((e) => e.back).at(-1) ?? null;
      return { stage: s, state, reachedAt: state === "next" ? null : (arrivals.at(-1)?.at ?? null), backAt: state === "next" ? null : (back?.at ?? null) };
    });
}
