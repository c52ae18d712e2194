/**
 * Marks on the canvas for prints that do not fit: an outline set off from the art and a small tag
 * with short words. Pure: the editor's own warnings in, plain stage-pixel shapes out. The canvas
 * draws these and never runs the checks itself.
 */
import { toStage, type View } from "@/lib/editor/view";
import { fitProblems, shortLabels, type WarningFlag } from "@/lib/placement/flags";
import type { Placement } from "@/lib/placement/model";
import { degToRad } from "@/lib/units";

export type PrintMark = {
  id: string;
  /** The outline's corners in stage px, flat (x0, y0, x1, y1, …), closed. */
  points: number[];
  /** Short words, e.g. "Too wide · Near seam". */
  text: string;
  /** Any error among them (art over a seam, off the garment, into the collar). */
  error: boolean;
  /** Where the tag's box goes, in stage px, and its size. */
  tag: { x: number; y: number; width: number; height: number };
};

/** How far the outline stands off the art, in screen px: clear of the resize handles (9 px squares on the edge). */
export const MARK_GAP_PX = 8;
export const MARK_TAG_HEIGHT_PX = 18;
/** Rough width of one character of the 11 px tag text, for sizing its box (as the callouts do). */
const CHAR_PX = 6.4;

/**
 * One mark for each print with a fit problem among its warnings (too wide, too tall, seams, collar,
 * hem, pocket, print area, off the garment); hints and style notes are left to the inspector.
 * `minY` keeps tags below the ruler: a tag that would sit above it goes under the outline instead.
 */
export function printMarks(args: {
  placements: readonly Placement[];
  flags: Readonly<Record<string, readonly WarningFlag[] | undefined>>;
  view: View;
  /** A print being dragged or resized: Konva owns it until the gesture ends, so it is not marked. */
  skip?: string | null;
  gapPx?: number;
  minY?: number;
}): PrintMark[] {
  const s = args.view.pxPerInch * args.view.zoom;
  const gap = (args.gapPx ?? MARK_GAP_PX) / s;
  const out: PrintMark[] = [];
  for (const p of args.placements) {
    if (p.id === args.skip) continue;
    const problems = fitProblems(args.flags[p.id] ?? []);
    if (problems.length === 0) continue;
    const a = degToRad(p.rotationDeg);
    const cos = Math.cos(a);
    const sin = Math.sin(a);
    const cx = p.offsetFromCenterIn;
    const cy = p.belowCollarIn + p.heightIn / 2;
    const hw = p.widthIn / 2 + gap;
    const hh = p.heightIn / 2 + gap;
    const corners = [
      [-hw, -hh],
      [hw, -hh],
      [hw, hh],
      [-hw, hh],
    ].map(([x, y]) => toStage(args.view, { x: cx + x! * cos - y! * sin, y: cy + x! * sin + y! * cos }));
    const points = corners.flatMap((c) => [c.x, c.y]);
    const text = shortLabels(problems).join(" · ");
    const width = Math.ceil(text.length * CHAR_PX + 12);
    const left = Math.min(...corners.map((c) => c.x));
    const top = Math.min(...corners.map((c) => c.y));
    const bottom = Math.max(...corners.map((c) => c.y));
    const above = top - MARK_TAG_HEIGHT_PX - 3;
    const y = above >= (args.minY ?? 0) ? above : bottom + 3;
    out.push({
      id: p.id,
      points,
      text,
      error: problems.some((w) => w.severity === "error"),
      tag: { x: left, y, width, height: MARK_TAG_HEIGHT_PX },
    });
  }
  return out;
}
