import type { JobScope, Stage } from "@/db/schema";
import { stageIndex } from "@/server/jobs/stages";

/**
 * What the truck owner reads: plain words, no shop shorthand. Shared by the status page and the
 * stage e-mails so both say the same thing.
 */
export const CUSTOMER_STAGE_NAMES: Record<Stage, string> = {
  queued: "Waiting to start",
  fabricate: "Building the parts",
  pressure_test: "Leak testing the tank",
  coating: "Out for powder coat",
  install: "Installing the kit",
  wire: "Wiring and run test",
  ready: "Ready for pickup",
  delivered: "Picked up",
};

/** One sentence: where the truck is now. */
export function whereItIsNow(stage: Stage, scope: JobScope): string {
  switch (stage) {
    case "queued":
      return "Your truck is booked in and waiting for its turn in the shop.";
    case "fabricate":
      return "We are building the tank and brackets for your truck's kit at the fabrication bench.";
    case "pressure_test":
      return "The tank is built and is being leak-tested with low air pressure.";
    case "coating":
      return "The fabricated parts are out at the powder coater.";
    case "install":
      return scope === "install_only" ? "Your truck is in the bay and the kit is going on." : "The parts are back from coating and the kit is going on your truck.";
    case "wire":
      return "The kit is on; we are wiring the dash switch and PTO light and running the kit to test it.";
    case "ready":
      return "Your truck is ready for pickup.";
    case "delivered":
      return "Your truck has been picked up. Thank you for your business.";
  }
}

/** What happens after this stage, for the e-mail's "what comes next" line. */
export function whatComesNext(stage: Stage, scope: JobScope, linkDays = 60): string {
  switch (stage) {
    case "queued":
      return "We will e-mail you when work starts.";
    case "fabricate":
      return "Next, the tank gets a low-pressure air leak test.";
    case "pressure_test":
      return "When it passes, the parts go out for powder coat.";
    case "coating":
      return "When the parts come back and pass our inspection, we install the kit on your truck.";
    case "install":
      return "After the install we wire the dash switch and the PTO light and run-test the kit.";
    case "wire":
      return "When the run test is signed off, your truck is ready for pickup.";
    case "ready":
      return scope === "install_only" ? "Call us to set a pickup time." : "Call us to set a pickup time; we will walk you through the kit when you collect the truck.";
    case "delivered":
      return `Your status link keeps working for ${linkDays} days in case you want to look back at the photos.`;
  }
}

/** What just happened, for the e-mail's first line. A move back says so plainly. */
export function whatHappened(from: Stage | null, to: Stage, scope: JobScope): string {
  if (from && stageIndex(to) < stageIndex(from)) {
    if (from === "pressure_test" && to === "fabricate") return "The tank needs more work before it passes its leak test, so it is back at the fabrication bench.";
    if (to === "queued") return "Work on your truck is paused for now; it is back in the queue.";
    return `Your job has gone back a step to "${CUSTOMER_STAGE_NAMES[to].toLowerCase()}" so we can get it right.`;
  }
  switch (to) {
    case "queued":
      return "Your job is booked in.";
    case "fabricate":
      return "Work has started: we are building the parts for your truck's kit.";
    case "pressure_test":
      return "The tank is built and now gets its leak test.";
    case "coating":
      return "The tank passed its leak test and the parts have gone out for powder coat.";
    case "install":
      return scope === "install_only" ? "Work has started: the kit is going on your truck." : "The parts are back from powder coat and the kit is going on your truck.";
    case "wire":
      return "The kit is installed; we are now wiring the dash switch and PTO light and run-testing it.";
    case "ready":
      return "Your truck is ready for pickup.";
    case "delivered":
      return "Your truck has been picked up. Thank you for your business.";
  }
}

/** Only the tail of the VIN goes to the customer page: enough to recognise the truck, not to copy the VIN. */
export function vinTail(vin: string): string {
  return vin.length > 6 ? `…${vin.slice(-6)}` : vin;
}
