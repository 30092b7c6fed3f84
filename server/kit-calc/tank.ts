export type TankGeometry =
  | { shape: "round"; insideDiameterIn: number; lengthIn: number }
  | { shape: "box"; lengthIn: number; widthIn: number; heightIn: number }
  | { shape: "d"; lengthIn: number; widthIn: number; heightIn: number };

export interface TankFill {
  fillDepthIn: number;
  totalCuIn: number;
  oilCuIn: number;
  wettedAreaSqIn: number;
}

const clamp = (value: number, low: number, high: number): number => Math.min(high, Math.max(low, value));

// Half the central angle of the wetted arc, α = acos((r−h)/r). Evaluated as 2·asin(√(h/2r)) from the nearer of
// bottom and top: acos near ±1 loses half its digits, which let a nearly full tube read more than full.
function wettedHalfAngle(radius: number, depth: number): number {
  const h = clamp(depth, 0, 2 * radius);
  return h <= radius
    ? 2 * Math.asin(Math.sqrt(h / (2 * radius)))
    : Math.PI - 2 * Math.asin(Math.sqrt((2 * radius - h) / (2 * radius)));
}

// Circular segment (geometry handbook): A = r² acos((r−h)/r) − (r−h)√(2rh − h²) = r² (α − sin α cos α).
// Above the middle it is the circle less the dry segment, so it never exceeds the circle.
export function circularSegmentArea(radius: number, depth: number): number {
  const h = clamp(depth, 0, 2 * radius);
  if (h > radius) return circleArea(radius) - circularSegmentArea(radius, 2 * radius - h);
  const alpha = wettedHalfAngle(radius, h);
  // α − sin α cos α can round a hair below zero for a film of oil.
  return Math.max(0, radius * radius * (alpha - Math.sin(alpha) * Math.cos(alpha)));
}

// Circle (elementary geometry): π r².
export function circleArea(radius: number): number {
  return Math.PI * radius * radius;
}

// Circular segment (geometry handbook): the wetted arc is r × 2α.
export function wettedArcLength(radius: number, depth: number): number {
  return 2 * radius * wettedHalfAngle(radius, depth);
}

// Bisection for the depth at which a cross-section that only grows with depth holds a given area.
function depthForArea(height: number, target: number, areaAt: (depth: number) => number): number {
  let low = 0;
  let high = height;
  for (let step = 0; step < 200 && high - low > height * 1e-15; step++) {
    const mid = (low + high) / 2;
    if (areaAt(mid) < target) low = mid;
    else high = mid;
  }
  return (low + high) / 2;
}

// The segment area has no closed-form inverse; bisection on a function that only grows converges every time.
export function roundFillDepthForFraction(insideDiameterIn: number, volumeFraction: number): number {
  const radius = insideDiameterIn / 2;
  return depthForArea(insideDiameterIn, volumeFraction * circleArea(radius), (depth) => circularSegmentArea(radius, depth));
}

/**
 * A D-shaped tank's end: a flat side of height h against the frame rail, a semicircle of diameter h outboard,
 * and a flat top and bottom between them, so the width W runs from the rail to the crown of the curve
 * (W ≥ h/2; W = h/2 is a plain half-round). The section is a (W − h/2) × h rectangle plus a half circle of
 * radius h/2. Filled to depth y the half circle holds half the circle's segment of depth y (it is cut by the
 * circle's vertical diameter, a line of symmetry for every horizontal slice).
 */
export function dSectionArea(widthIn: number, heightIn: number, depthIn: number): number {
  const radius = heightIn / 2;
  const y = clamp(depthIn, 0, heightIn);
  return (widthIn - radius) * y + circularSegmentArea(radius, y) / 2;
}

/** Wetted perimeter of the D section filled to depth y: the flat bottom, the rail side up to y and half the wetted arc. */
export function dWettedPerimeter(widthIn: number, heightIn: number, depthIn: number): number {
  const radius = heightIn / 2;
  const y = clamp(depthIn, 0, heightIn);
  return widthIn - radius + y + wettedArcLength(radius, y) / 2;
}

export function tankHeightIn(tank: TankGeometry): number {
  return tank.shape === "round" ? tank.insideDiameterIn : tank.heightIn;
}

// Default fill: full less the air space, by volume. For a box that is the same fraction of the height;
// for a round tube or a D it is the depth whose cross-section holds that share of the whole.
export function defaultFillDepthIn(tank: TankGeometry, airSpaceFraction: number): number {
  if (tank.shape === "round") return roundFillDepthForFraction(tank.insideDiameterIn, 1 - airSpaceFraction);
  if (tank.shape === "d") {
    const { widthIn, heightIn } = tank;
    const full = dSectionArea(widthIn, heightIn, heightIn);
    return depthForArea(heightIn, (1 - airSpaceFraction) * full, (depth) => dSectionArea(widthIn, heightIn, depth));
  }
  return tank.heightIn * (1 - airSpaceFraction);
}

/** The oil below a given depth, in³ (0 at or under the bottom, the whole tank at or over the top). */
export function oilBelowDepthCuIn(tank: TankGeometry, depthIn: number): number {
  return tankFill(tank, clamp(depthIn, 0, tankHeightIn(tank))).oilCuIn;
}

export function tankFill(tank: TankGeometry, fillDepthIn: number): TankFill {
  if (tank.shape === "round") {
    const radius = tank.insideDiameterIn / 2;
    const segment = circularSegmentArea(radius, fillDepthIn);
    return {
      fillDepthIn,
      // Cylinder (elementary geometry): V = π r² L.
      totalCuIn: circleArea(radius) * tank.lengthIn,
      // Circular segment (geometry handbook) × length for a horizontal tube filled to depth h.
      oilCuIn: segment * tank.lengthIn,
      // Wetted shell (arc × length) plus the two wetted end segments.
      wettedAreaSqIn: wettedArcLength(radius, fillDepthIn) * tank.lengthIn + 2 * segment,
    };
  }
  if (tank.shape === "d") {
    const { widthIn, heightIn, lengthIn } = tank;
    const section = dSectionArea(widthIn, heightIn, fillDepthIn);
    return {
      fillDepthIn,
      totalCuIn: dSectionArea(widthIn, heightIn, heightIn) * lengthIn,
      oilCuIn: section * lengthIn,
      // Wetted bottom, rail side and curve along the length, plus the two wetted end sections.
      wettedAreaSqIn: dWettedPerimeter(widthIn, heightIn, fillDepthIn) * lengthIn + 2 * section,
    };
  }
  const depth = Math.min(fillDepthIn, tank.heightIn);
  return {
    fillDepthIn,
    // Box (elementary geometry): V = L × W × H.
    totalCuIn: tank.lengthIn * tank.widthIn * tank.heightIn,
    oilCuIn: tank.lengthIn * tank.widthIn * depth,
    // Bottom plus the wetted strip of both sides and both ends; the top never touches oil.
    wettedAreaSqIn: tank.lengthIn * tank.widthIn + 2 * depth * (tank.lengthIn + tank.widthIn),
  };
}
