import { describe, expect, it } from "vitest";
import {
  circularSegmentArea,
  defaultFillDepthIn,
  roundFillDepthForFraction,
  tankFill,
  wettedArcLength,
} from "@/server/kit-calc/tank";

const expectRelative = (actual: number, expected: number, relative: number) =>
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(Math.abs(expected) * relative);
// Geometry in double precision: acos and √ are correctly rounded to about 1e-16; 1e-12 leaves room for the
// subtraction in the segment formula near an empty or full tube.
const GEOMETRY_RELATIVE = 1e-12;

// Handbook's other form of the circular segment, by central angle θ: A = r² (θ − sin θ) / 2, depth h = r (1 − cos(θ/2)).
const segmentByAngle = (radius: number, theta: number) => ({
  depth: radius * (1 - Math.cos(theta / 2)),
  area: (radius * radius * (theta - Math.sin(theta))) / 2,
  arc: radius * theta,
});

describe("circular segment (geometry handbook: A = r² acos((r−h)/r) − (r−h)√(2rh − h²))", () => {
  it("an empty tube holds nothing, a half-full tube half the circle, a full tube all of it", () => {
    const radius = 10;
    expect(circularSegmentArea(radius, 0)).toBe(0);
    expectRelative(circularSegmentArea(radius, radius), (Math.PI * radius * radius) / 2, GEOMETRY_RELATIVE);
    expectRelative(circularSegmentArea(radius, 2 * radius), Math.PI * radius * radius, GEOMETRY_RELATIVE);
  });

  it("known segments: 60°, 90°, 120°, 240° and 300° central angles match r²(θ − sin θ)/2 (geometry handbook)", () => {
    const radius = 12;
    for (const degrees of [60, 90, 120, 240, 300]) {
      const known = segmentByAngle(radius, (degrees * Math.PI) / 180);
      expectRelative(circularSegmentArea(radius, known.depth), known.area, GEOMETRY_RELATIVE);
    }
  });

  it("agrees with the handbook's own form r² acos((r−h)/r) − (r−h)√(2rh − h²) away from the very bottom and top", () => {
    const radius = 10;
    for (const depth of [0.5, 2, 5, 10, 13.3, 18, 19.5]) {
      const offset = radius - depth;
      const handbook = radius * radius * Math.acos(offset / radius) - offset * Math.sqrt(2 * radius * depth - depth * depth);
      expectRelative(circularSegmentArea(radius, depth), handbook, GEOMETRY_RELATIVE);
    }
  });

  it("a nearly full tube never reads more than full, nor a film of oil less than empty", () => {
    const radius = 0.5015734517651074;
    const circle = Math.PI * radius * radius;
    for (const fraction of [1 - 1e-10, 1 - 1e-13, 1 - 1e-16]) {
      expect(circularSegmentArea(radius, fraction * 2 * radius)).toBeLessThanOrEqual(circle);
    }
    for (const depth of [5e-324, 1e-300, 1e-12]) expect(circularSegmentArea(radius, depth)).toBeGreaterThanOrEqual(0);
  });

  it("a 90° segment is r²(π/2 − 1)/2 (geometry handbook, quarter circle less its triangle)", () => {
    const radius = 8;
    const depth = radius * (1 - Math.SQRT1_2);
    expectRelative(circularSegmentArea(radius, depth), (radius * radius * (Math.PI / 2 - 1)) / 2, GEOMETRY_RELATIVE);
  });

  it("oil below the middle and the air space above it add up to the whole circle (symmetry)", () => {
    const radius = 10;
    for (const depth of [0.5, 3, 7.25, 9.9]) {
      const oil = circularSegmentArea(radius, depth);
      const airAbove = circularSegmentArea(radius, 2 * radius - depth);
      expectRelative(oil + airAbove, Math.PI * radius * radius, GEOMETRY_RELATIVE);
    }
  });

  it("agrees with a midpoint-rule integral of the chord width 2√(r² − (r−y)²) over the depth (to 1e-6 with 200,000 strips)", () => {
    const radius = 10;
    const depth = 6.5;
    const strips = 200_000;
    const dy = depth / strips;
    let area = 0;
    for (let strip = 0; strip < strips; strip++) {
      const y = (strip + 0.5) * dy;
      area += 2 * Math.sqrt(radius * radius - (radius - y) ** 2) * dy;
    }
    expectRelative(circularSegmentArea(radius, depth), area, 1e-6);
  });
});

describe("wetted arc (geometry handbook: arc = r × θ)", () => {
  it("matches r θ for known central angles, and is half the circumference when half full", () => {
    const radius = 12;
    for (const degrees of [60, 90, 180, 270]) {
      const known = segmentByAngle(radius, (degrees * Math.PI) / 180);
      expectRelative(wettedArcLength(radius, known.depth), known.arc, GEOMETRY_RELATIVE);
    }
    expectRelative(wettedArcLength(radius, radius), Math.PI * radius, GEOMETRY_RELATIVE);
  });
});

describe("tank volume and wetted area (elementary geometry)", () => {
  it("a half-full round tube: volume π r² L / 2; wetted area π r L plus two half ends π r²", () => {
    const tube = { shape: "round", insideDiameterIn: 20, lengthIn: 30 } as const;
    const fill = tankFill(tube, 10);
    expectRelative(fill.totalCuIn, Math.PI * 100 * 30, GEOMETRY_RELATIVE);
    expectRelative(fill.oilCuIn, fill.totalCuIn / 2, GEOMETRY_RELATIVE);
    expectRelative(fill.wettedAreaSqIn, Math.PI * 10 * 30 + Math.PI * 100, GEOMETRY_RELATIVE);
  });

  it("a full round tube is wetted over its whole shell and both ends: 2πrL + 2πr²", () => {
    const fill = tankFill({ shape: "round", insideDiameterIn: 20, lengthIn: 30 }, 20);
    expectRelative(fill.oilCuIn, fill.totalCuIn, GEOMETRY_RELATIVE);
    expectRelative(fill.wettedAreaSqIn, 2 * Math.PI * 10 * 30 + 2 * Math.PI * 100, GEOMETRY_RELATIVE);
  });

  it("a box: V = L × W × H, oil L × W × h, wetted bottom plus the wetted strip of the four walls", () => {
    const box = { shape: "box", lengthIn: 36, widthIn: 18, heightIn: 20 } as const;
    const fill = tankFill(box, 15);
    expect(fill.totalCuIn).toBe(36 * 18 * 20);
    expect(fill.oilCuIn).toBe(36 * 18 * 15);
    expect(fill.wettedAreaSqIn).toBe(36 * 18 + 2 * 36 * 15 + 2 * 18 * 15);
  });

  it("a full box is wetted everywhere but the top", () => {
    const box = { shape: "box", lengthIn: 36, widthIn: 18, heightIn: 20 } as const;
    const allSides = 2 * (36 * 18 + 36 * 20 + 18 * 20);
    expect(tankFill(box, 20).wettedAreaSqIn).toBe(allSides - 36 * 18);
  });
});

describe("default fill: full less 10 % air space (from memory: about 10 %)", () => {
  it("a round tube is filled to the depth whose segment holds 90 % of the circle", () => {
    const tube = { shape: "round", insideDiameterIn: 20, lengthIn: 30 } as const;
    const depth = defaultFillDepthIn(tube, 0.1);
    expectRelative(circularSegmentArea(10, depth), 0.9 * Math.PI * 100, GEOMETRY_RELATIVE);
    // Less than 90 % of the diameter: the narrow top of the circle holds little oil per inch, so the last
    // 10 % of the volume takes more than 10 % of the height.
    expect(depth).toBeGreaterThan(10);
    expect(depth).toBeLessThan(18);
  });

  it("a box is filled to 90 % of its height", () => {
    const box = { shape: "box", lengthIn: 36, widthIn: 18, heightIn: 20 } as const;
    expectRelative(defaultFillDepthIn(box, 0.1), 18, GEOMETRY_RELATIVE);
  });

  it("the fill-depth solver hits half the circle at the middle and 1 % near the bottom", () => {
    expectRelative(roundFillDepthForFraction(24, 0.5), 12, GEOMETRY_RELATIVE);
    const shallow = roundFillDepthForFraction(24, 0.01);
    expectRelative(circularSegmentArea(12, shallow), 0.01 * Math.PI * 144, 1e-9);
  });
});

describe("D-shaped tank (flat rail side of height h, half-round of diameter h outboard, flat between)", () => {
  // Chord width of the D section at height y above the bottom: the flat part plus the half chord of the circle.
  const widthAt = (W: number, h: number, y: number) => {
    const r = h / 2;
    return W - r + Math.sqrt(Math.max(0, r * r - (r - y) ** 2));
  };
  // Midpoint rule over 200,000 strips: an independent check of the cross-section to about 1e-7.
  const integrated = (W: number, h: number, depth: number) => {
    const strips = 200_000;
    const dy = depth / strips;
    let area = 0;
    for (let strip = 0; strip < strips; strip++) area += widthAt(W, h, (strip + 0.5) * dy) * dy;
    return area;
  };

  it("full: ((W − h/2) h + π h²/8) L (rectangle plus half circle, elementary geometry) at three widths including the plain half-round", () => {
    for (const [W, h, L] of [
      [10, 20, 30],
      [16, 20, 30],
      [40, 12, 60],
    ]) {
      const fill = tankFill({ shape: "d", lengthIn: L, widthIn: W, heightIn: h }, h);
      expectRelative(fill.totalCuIn, ((W - h / 2) * h + (Math.PI * h * h) / 8) * L, GEOMETRY_RELATIVE);
      expectRelative(fill.oilCuIn, fill.totalCuIn, GEOMETRY_RELATIVE);
    }
  });

  it("half full: (W − r) r + π r²/4, by the symmetry of the half circle about its middle", () => {
    const W = 16;
    const h = 20;
    const r = 10;
    expectRelative(tankFill({ shape: "d", lengthIn: 1, widthIn: W, heightIn: h }, r).oilCuIn, (W - r) * r + (Math.PI * r * r) / 4, GEOMETRY_RELATIVE);
  });

  it("partial fills agree with a strip-by-strip integral of the chord width (to 1e-6)", () => {
    for (const [W, h, depth] of [
      [16, 20, 0.5],
      [16, 20, 7.3],
      [10, 20, 18],
      [40, 12, 11.9],
    ]) {
      expectRelative(tankFill({ shape: "d", lengthIn: 1, widthIn: W, heightIn: h }, depth).oilCuIn, integrated(W, h, depth), 1e-6);
    }
  });

  it("wetted area, full: bottom and rail side and half the round shell along the length, plus both whole ends (no top)", () => {
    const W = 16;
    const h = 20;
    const L = 30;
    const r = h / 2;
    const section = (W - r) * h + (Math.PI * r * r) / 2;
    const expected = ((W - r) + h + Math.PI * r) * L + 2 * section;
    expectRelative(tankFill({ shape: "d", lengthIn: L, widthIn: W, heightIn: h }, h).wettedAreaSqIn, expected, GEOMETRY_RELATIVE);
  });

  it("wetted area at a film of oil: the flat bottom (W − r) L, as a box counts its bottom", () => {
    const tank = { shape: "d", lengthIn: 30, widthIn: 16, heightIn: 20 } as const;
    expect(tankFill(tank, 0).wettedAreaSqIn).toBe(6 * 30);
    expectRelative(tankFill(tank, 1e-9).wettedAreaSqIn, 6 * 30, 1e-3);
  });

  it("default fill holds 90 % of the section by the strip integral", () => {
    const tank = { shape: "d", lengthIn: 30, widthIn: 16, heightIn: 20 } as const;
    const depth = defaultFillDepthIn(tank, 0.1);
    const full = (16 - 10) * 20 + (Math.PI * 100) / 2;
    expectRelative(integrated(16, 20, depth), 0.9 * full, 1e-6);
  });
});
