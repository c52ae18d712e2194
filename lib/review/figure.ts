/**
 * A plain body figure for the worn view, in the same garment inches as the silhouette (origin at
 * the collar, y down). Proportions are from memory, approximate: stature about 2.4 × the garment's
 * body length, head about 1/8 of stature, arms about 0.37 of stature. It only helps a client judge
 * how high a print sits on a person; it is not a fit model.
 */
import type { Point } from "@/lib/garments/types";
import type { Silhouette } from "@/lib/garments/silhouette";

export const STATURE_PER_BODY_LENGTH = 2.4;

function ellipse(cx: number, cy: number, rx: number, ry: number, steps = 36): Point[] {
  return Array.from({ length: steps }, (_, i) => {
    const a = (i / steps) * Math.PI * 2;
    return { x: cx + Math.cos(a) * rx, y: cy + Math.sin(a) * ry };
  });
}

function limb(from: Point, to: Point, widthFrom: number, widthTo: number): Point[] {
  const dx = to.x - from.x;
  const dy = to.y - from.y;
  const len = Math.hypot(dx, dy) || 1;
  const nx = -dy / len;
  const ny = dx / len;
  return [
    { x: from.x + (nx * widthFrom) / 2, y: from.y + (ny * widthFrom) / 2 },
    { x: to.x + (nx * widthTo) / 2, y: to.y + (ny * widthTo) / 2 },
    { x: to.x - (nx * widthTo) / 2, y: to.y - (ny * widthTo) / 2 },
    { x: from.x - (nx * widthFrom) / 2, y: from.y - (ny * widthFrom) / 2 },
  ];
}

export function bodyFigure(args: { silhouette: Silhouette; bodyLength: number; chestWidth: number; neckWidth: number }): Point[][] {
  const { silhouette: s } = args;
  const stature = args.bodyLength * STATURE_PER_BODY_LENGTH;
  const hpsY = s.hps.left.y;
  const headH = stature / 8;
  const headCy = hpsY - headH * 0.5 - stature * 0.03;
  const neck = limb({ x: 0, y: headCy + headH * 0.35 }, { x: 0, y: hpsY + 1 }, args.neckWidth * 0.7, args.neckWidth * 0.85);
  const shoulderX = Math.abs(s.shoulderPoints.right.x) * 0.97;
  const shoulderY = s.shoulderPoints.right.y + 0.5;
  const armLen = stature * 0.37;
  const armW = stature * 0.055;
  const spread = 0.12;
  const rightArm = limb({ x: shoulderX - armW * 0.3, y: shoulderY }, { x: shoulderX + armLen * spread, y: shoulderY + armLen }, armW, armW * 0.7);
  const leftArm = rightArm.map((p) => ({ x: -p.x, y: p.y }));
  const feetY = hpsY - headH - stature * 0.03 + stature;
  const hipHalf = (args.chestWidth / 2) * 0.85;
  const legW = hipHalf * 0.85;
  const legTop = s.hemY - 3;
  const rightLeg = limb({ x: hipHalf * 0.5, y: legTop }, { x: hipHalf * 0.45, y: feetY }, legW, legW * 0.45);
  const leftLeg = rightLeg.map((p) => ({ x: -p.x, y: p.y }));
  const torso = [
    { x: -shoulderX, y: shoulderY - 0.5 },
    { x: shoulderX, y: shoulderY - 0.5 },
    { x: hipHalf, y: legTop + 2 },
    { x: -hipHalf, y: legTop + 2 },
  ];
  return [leftLeg, rightLeg, leftArm, rightArm, torso, neck, ellipse(0, headCy, headH * 0.38, headH * 0.5)];
}

/** Height of the figure in inches, for fitting the worn view on screen. */
export function figureBounds(args: { silhouette: Silhouette; bodyLength: number }) {
  const stature = args.bodyLength * STATURE_PER_BODY_LENGTH;
  const top = args.silhouette.hps.left.y - stature / 8 - stature * 0.03;
  return { top, bottom: top + stature, stature };
}
