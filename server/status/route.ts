import { STAGES, type JobScope, type Stage } from "@/db/schema";

/*
 * The steps a customer is told about come from what the job really has: its work (fabricated
 * parts or install only) and the parts the office recorded. A stainless tank marked "no outside
 * coating" has no powder coat step; a job with no part to leak-test has no pressure test step.
 * Pure: the status page and the e-mails call it with the job's parts as they are now, so a part
 * added later changes the route from then on.
 */

export interface RoutePart {
  needsLeakTest: boolean;
  needsCoating: boolean;
}

/** The job's route, in board order. */
export function jobRoute(scope: JobScope, parts: readonly RoutePart[]): Stage[] {
  const fabricated = scope === "fabrication" && parts.length > 0;
  const on = new Set<Stage>(["queued", "install", "wire", "ready", "delivered"]);
  if (fabricated) {
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
