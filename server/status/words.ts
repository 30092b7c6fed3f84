import type { Stage } from "@/db/schema";
import { stageIndex } from "@/server/jobs/stages";
import { firstWorkStep, nextOnRoute } from "./route";

/*
 * What the truck owner reads, shared by the status page and the stage e-mails so both say the
 * same thing. Every sentence follows from the stage alone: a card can be moved on by an owner's
 * override or back for rework, so nothing here claims a test passed, parts left or came back,
 * or that the job has a tank, a PTO or any other particular part.
 */

export const CUSTOMER_STAGE_NAMES: Record<Stage, string> = {
  queued: "Booked in",
  fabricate: "Fabrication",
  pressure_test: "Pressure test",
  coating: "Powder coat",
  install: "Install",
  wire: "Wiring and run test",
  ready: "Ready for pickup",
  delivered: "Picked up",
};

/** One sentence: the stage the job is in, in plain words. */
export function whereItIsNow(stage: Stage): string {
  switch (stage) {
    case "queued":
      return "Your job is booked in and waiting its turn in the shop.";
    case "fabricate":
      return "We are building the fabricated parts for your truck.";
    case "pressure_test":
      return "The fabricated parts are being pressure-tested for leaks.";
    case "coating":
      return "Your job is at powder coat: the fabricated parts go to an outside coater and come back before install.";
    case "install":
      return "We are installing the kit on your truck.";
    case "wire":
      return "We are wiring and run-testing the kit.";
    case "ready":
      return "Your truck is ready for pickup.";
    case "delivered":
      return "Picked up — thank you.";
  }
}

/** What the next step on the job's own route is, for the e-mail and under the status page's sentence. */
export function whatComesNext(stage: Stage, route: readonly Stage[], linkDays = 60): string {
  if (stage === "ready") return "Get in touch with us to set a pickup time.";
  if (stage === "delivered") return `Your status link keeps working for ${linkDays} days in case you want to look back at the photos.`;
  const next = nextOnRoute(route, stage);
  if (stage === "queued") {
    return next === "fabricate" ? "Next, we start building the fabricated parts. We will e-mail you as the job moves." : "Next, we start installing the kit. We will e-mail you as the job moves.";
  }
  if (stage === "coating" && next === "install") return "When the parts are back from the coater, we install the kit on your truck.";
  if (stage === "wire" && next === "ready") return "When the run test is signed off, your truck is ready for pickup.";
  switch (next) {
    case "pressure_test":
      return "Next, the fabricated parts are pressure-tested for leaks.";
    case "coating":
      return "Next, the parts go to an outside coater for powder coat.";
    case "install":
      return "Next, we install the kit on your truck.";
    case "wire":
      return "Next, we wire the kit and run-test it.";
    case "ready":
      return "Next, your truck is ready for pickup.";
    default:
      return "We will e-mail you as the job moves.";
  }
}

/** The e-mail's first line about the work: the stage the job has moved to. A move back says so plainly. */
export function whatHappened(from: Stage | null, to: Stage, route: readonly Stage[]): string {
  if (from && stageIndex(to) < stageIndex(from)) {
    if (to === "queued") return "Work on your truck is paused for now; your job is back in the queue.";
    return `Your job has gone back to the ${CUSTOMER_STAGE_NAMES[to].toLowerCase()} step for more work. ${whereItIsNow(to)}`;
  }
  if (to === "queued") return "Your job is booked in.";
  // The first step of work on this job's route is where work starts.
  if (to === firstWorkStep(route) || to === "fabricate") return `Work has started. ${whereItIsNow(to)}`;
  return whereItIsNow(to);
}

/** Only the tail of the VIN goes to the customer page: enough to recognise the truck, not to copy the VIN. */
export function vinTail(vin: string): string {
  return vin.length > 6 ? `…${vin.slice(-6)}` : vin;
}
