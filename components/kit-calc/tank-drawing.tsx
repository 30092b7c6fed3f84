import { DEFAULT_AIR_SPACE_FRACTION } from "@/server/kit-calc/practice";
import type { KitCalcInput } from "@/server/kit-calc";
import { defaultFillDepthIn } from "@/server/kit-calc/tank";
import { fmt } from "./format";

// Trade reference (Fluid Power, Goodheart-Willcox, ch. 8): the suction pick-up sits at least 1 in above the bottom,
// so settled dirt and water stay in the tank.
export const PICKUP_ABOVE_BOTTOM_IN = 1;

const VIEW_W = 340;
const VIEW_H = 230;
const AREA = { x: 60, y: 34, w: 180, h: 150 };
const LABEL = 13;

/**
 * The tank to scale: a round tube seen from its end, a box from its side, with the oil line and the
 * suction pick-up. A sump is drawn below, not to scale (only its volume is known).
 */
export function TankDrawing({ input, className = "" }: { input: KitCalcInput; className?: string }) {
  const tank = input.tank;
  const heightIn = tank.shape === "round" ? tank.insideDiameterIn : tank.heightIn;
  // Round and D tanks are drawn from the end (their cross-section), a box from the side.
  const widthIn = tank.shape === "round" ? tank.insideDiameterIn : tank.shape === "d" ? tank.widthIn : tank.lengthIn;
  const fillIn = Math.min(input.fillDepthIn ?? defaultFillDepthIn(tank, DEFAULT_AIR_SPACE_FRACTION), heightIn);
  const hasSump = (input.sumpGal ?? 0) > 0;
  const sumpDepth = 22;
  const scale = Math.min(AREA.w / widthIn, (AREA.h - (hasSump ? sumpDepth : 0)) / heightIn);
  const w = widthIn * scale;
  const h = heightIn * scale;
  const left = AREA.x + (AREA.w - w) / 2;
  const top = AREA.y;
  const bottom = top + h;
  const oilY = bottom - fillIn * scale;
  // The pick-up drops down the middle of a tube; in a box it sits toward the suction end.
  const pickupX = tank.shape === "round" ? left + w / 2 : tank.shape === "d" ? left + Math.max(w - h / 2, w * 0.3) * 0.6 : left + w * 0.8;
  const sumpW = Math.max(w * 0.2, 20);
  const sump = hasSump ? { x: pickupX - sumpW / 2, y: bottom - 1, w: sumpW, h: sumpDepth } : null;
  const floorY = sump ? sump.y + sump.h : bottom;
  const pickupEndY = floorY - Math.max(PICKUP_ABOVE_BOTTOM_IN * scale, 5);
  // Named after its geometry: two drawings of one tank may share a clip path, two different tanks never do.
  const clipId = `tank-clip-${tank.shape}-${Math.round(left * 100)}-${Math.round(w * 100)}-${Math.round(h * 100)}`;
  const flatW = w - h / 2;
  const outline =
    tank.shape === "round" ? (
      <circle cx={left + w / 2} cy={top + h / 2} r={w / 2} />
    ) : tank.shape === "d" ? (
      // Flat rail side on the left, flat top and bottom, a half-round of the tank's height outboard.
      <path d={`M ${left} ${top} H ${left + flatW} A ${h / 2} ${h / 2} 0 0 1 ${left + flatW} ${bottom} H ${left} Z`} />
    ) : (
      <rect x={left} y={top} width={w} height={h} />
    );
  const sizeText =
    tank.shape === "round"
      ? `Round tube, end view: ${fmt(tank.insideDiameterIn, 1)} in inside diameter × ${fmt(tank.lengthIn, 1)} in long`
      : tank.shape === "d"
        ? `D-shaped tank, end view: ${fmt(tank.heightIn, 1)} in high × ${fmt(tank.widthIn, 1)} in wide, flat side on the frame rail, ${fmt(tank.lengthIn, 1)} in long`
        : `Box, side view: ${fmt(tank.lengthIn, 1)} in long × ${fmt(tank.heightIn, 1)} in high × ${fmt(tank.widthIn, 1)} in wide`;
  const summary = `${sizeText}. Oil ${fmt(fillIn, 1)} in deep. Suction pick-up ${PICKUP_ABOVE_BOTTOM_IN} in above the ${sump ? "sump" : "tank"} bottom.`;

  return (
    <figure className={`space-y-1 ${className}`}>
      <svg viewBox={`0 0 ${VIEW_W} ${VIEW_H}`} role="img" aria-label={summary} className="h-auto w-full max-w-[420px] text-ink">
        <defs>
          <clipPath id={clipId}>{outline}</clipPath>
        </defs>
        {sump && <rect x={sump.x} y={sump.y} width={sump.w} height={sump.h} fill="var(--color-bay-100)" stroke="currentColor" strokeWidth={2} strokeDasharray="4 3" />}
        <rect x={left - 2} y={oilY} width={w + 4} height={bottom - oilY + 2} clipPath={`url(#${clipId})`} fill="var(--color-bay-100)" />
        <g fill="none" stroke="currentColor" strokeWidth={2.5}>{outline}</g>
        <line x1={left - 10} x2={left + w + 12} y1={oilY} y2={oilY} stroke="var(--color-spark-700)" strokeWidth={2} strokeDasharray="6 4" />
        <text x={left + w + 16} y={oilY + 4} fontSize={LABEL} fill="var(--color-spark-700)" fontWeight={700}>
          oil {fmt(fillIn, 1)} in
        </text>
        <line x1={pickupX} x2={pickupX} y1={top - 20} y2={pickupEndY} stroke="var(--color-bay-800)" strokeWidth={5} />
        <text x={pickupX - 8} y={top - 10} fontSize={LABEL} textAnchor="end" fill="var(--color-bay-800)" fontWeight={700}>
          suction pick-up
        </text>
        <line x1={pickupX + 5} x2={pickupX + 5} y1={pickupEndY} y2={floorY} stroke="var(--color-bay-800)" strokeWidth={1.5} />
        <text x={pickupX} y={floorY + 17} fontSize={LABEL - 1} textAnchor="middle" fill="var(--color-bay-800)">
          pick-up ≥ {PICKUP_ABOVE_BOTTOM_IN} in above bottom
        </text>
        {sump && (
          <text x={sump.x - 6} y={floorY - 5} fontSize={LABEL - 1} textAnchor="end" fill="currentColor">
            sump {fmt(input.sumpGal ?? 0, 1)} gal
          </text>
        )}
        <text x={AREA.x + AREA.w / 2} y={VIEW_H - 6} fontSize={LABEL} textAnchor="middle" fill="currentColor" fontWeight={600}>
          {tank.shape === "round"
            ? `Ø ${fmt(tank.insideDiameterIn, 1)} in × ${fmt(tank.lengthIn, 1)} in long`
            : tank.shape === "d"
              ? `D ${fmt(tank.heightIn, 1)} in high × ${fmt(tank.widthIn, 1)} in wide × ${fmt(tank.lengthIn, 1)} in long`
              : `${fmt(tank.lengthIn, 1)} in long × ${fmt(tank.heightIn, 1)} in high, ${fmt(tank.widthIn, 1)} in wide`}
        </text>
      </svg>
      <figcaption className="text-sm text-ink-soft">
        {tank.shape === "round" ? "End view of the tube" : tank.shape === "d" ? "End view of the D (frame rail on the left)" : "Side view of the box"}, to scale{sump ? " (the sump is not)" : ""}. Dashed line: the oil level.
      </figcaption>
    </figure>
  );
}
