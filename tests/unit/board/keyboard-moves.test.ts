import { describe, expect, it } from "vitest";
import { type DropTarget, nextKeyboardTarget } from "@/app/(shop)/board/board-dnd";
import { BOARD_STAGES, stagesFor } from "@/server/jobs/stages";

const board = stagesFor("fabrication").filter((s) => s !== "delivered");
const counts = { queued: 2, fabricate: 4, pressure_test: 0, coating: 1, install: 3, wire: 2, ready: 0, delivered: 0 } as const;
const count = (s: keyof typeof counts) => counts[s];

describe("keyboard moves on the board", () => {
  it("Right from Fabricate reaches each later column once, in the board's order, and stops at the last", () => {
    let at: DropTarget = { stage: "fabricate", index: 3 };
    const visited: string[] = [];
    for (let i = 0; i < 7; i++) {
      at = nextKeyboardTarget("ArrowRight", at, board, count)!;
      visited.push(at.stage);
    }
    // The board's columns, left to right, as the shop reads them.
    expect(visited).toEqual(["pressure_test", "coating", "install", "wire", "ready", "ready", "ready"]);
    expect(BOARD_STAGES.slice(2)).toEqual(["pressure_test", "coating", "install", "wire", "ready"]);
  });

  it("Left walks back one column at a time to Queued", () => {
    let at: DropTarget = { stage: "ready", index: 0 };
    const visited: string[] = [];
    while (at.stage !== "queued") {
      at = nextKeyboardTarget("ArrowLeft", at, board, count)!;
      visited.push(at.stage);
    }
    expect(visited).toEqual(["wire", "install", "coating", "pressure_test", "fabricate", "queued"]);
  });

  it("keeps the place in the column where it can, and never past the column's end", () => {
    expect(nextKeyboardTarget("ArrowRight", { stage: "fabricate", index: 3 }, board, count)).toEqual({ stage: "pressure_test", index: 0 });
    expect(nextKeyboardTarget("ArrowRight", { stage: "coating", index: 1 }, board, count)).toEqual({ stage: "install", index: 1 });
  });

  it("Up and Down move the place inside the column: top is 0, the end is after the last card", () => {
    expect(nextKeyboardTarget("ArrowDown", { stage: "install", index: 2 }, board, count)).toEqual({ stage: "install", index: 3 });
    expect(nextKeyboardTarget("ArrowDown", { stage: "install", index: 3 }, board, count)).toEqual({ stage: "install", index: 3 });
    expect(nextKeyboardTarget("ArrowUp", { stage: "install", index: 0 }, board, count)).toEqual({ stage: "install", index: 0 });
  });

  it("an install-only card skips the fabrication columns it never visits", () => {
    const route = stagesFor("install_only").filter((s) => s !== "delivered");
    expect(nextKeyboardTarget("ArrowRight", { stage: "queued", index: 0 }, route, count)).toEqual({ stage: "install", index: 0 });
  });

  it("other keys are not moves", () => {
    expect(nextKeyboardTarget("KeyA", { stage: "queued", index: 0 }, board, count)).toBeNull();
  });
});
