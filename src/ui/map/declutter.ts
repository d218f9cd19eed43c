/**
 * Where each map label goes so that none overprints another label, another mark or a map control:
 * the one rule for every labelled mark (receptors, water-level wells, monitoring wells), shared by
 * their layers through siteMap.placeLabels. Pure: positions in the map container's pixels.
 *
 * Each label is tried, in the order given (the caller puts the selected mark and receptors first),
 * to the right of its mark, then left, above and below; the first place inside the view that
 * touches nothing already placed wins. Above or below, a label near the view's side edge slides
 * sideways to stay inside it, still spanning its mark (a receptor at the edge of a phone's map
 * keeps its name). Beside the mark a label may be cut short (to at least
 * MIN_LABEL_W, with an ellipsis) to stay inside the view. A label with no free place is hidden;
 * its mark keeps its name for screen readers and as its title, and tapping it selects it. A label
 * marked `keep` (the selected mark's, placed first) is never hidden: with no free place it may lie
 * over other marks' symbols, never over a label or a control.
 *
 * Geometry (app.css .dg-mark-label and the dg-label-* classes): a mark is a 44 px box centred on
 * its point with a 32 px symbol; beside it a label starts LABEL_OFFSET px from the centre, its top
 * 12 px above it; above or below it is centred, SYMBOL_R + 2 px clear of the centre.
 */
export interface Rect {
  x: number;
  y: number;
  w: number;
  h: number;
}

export type Side = 'right' | 'left' | 'above' | 'below';

export interface LabelItem {
  id: string;
  /** the mark's centre */
  x: number;
  y: number;
  /** the label's natural size */
  w: number;
  h: number;
  /** show it even where it must cover other symbols (the selected mark) */
  keep?: boolean;
}

export interface Placement {
  side: Side | null;
  /** a width to cut the label to, or null for its natural width */
  maxWidth: number | null;
  /** above or below: px the label is slid sideways from centred, to stay inside the view (absent: centred) */
  shift?: number;
}

export const SYMBOL_R = 16;
export const LABEL_OFFSET = 16;
export const MIN_LABEL_W = 60;
const SIDES: readonly Side[] = ['right', 'left', 'above', 'below'];

/** The symbol's box of a mark centred at (x, y). */
export function symbolRect(x: number, y: number): Rect {
  return { x: x - SYMBOL_R, y: y - SYMBOL_R, w: 2 * SYMBOL_R, h: 2 * SYMBOL_R };
}

/** The box of a label of width w on one side of its mark (above or below: slid `shift` px from centred). */
export function labelRect(it: LabelItem, side: Side, w = it.w, shift = 0): Rect {
  switch (side) {
    case 'right':
      return { x: it.x + LABEL_OFFSET, y: it.y - 12, w, h: it.h };
    case 'left':
      return { x: it.x - LABEL_OFFSET - w, y: it.y - 12, w, h: it.h };
    case 'above':
      return { x: it.x - w / 2 + shift, y: it.y - SYMBOL_R - 2 - it.h, w, h: it.h };
    case 'below':
      return { x: it.x - w / 2 + shift, y: it.y + SYMBOL_R + 2, w, h: it.h };
  }
}

/**
 * Above or below a mark near the view's side edge: the slide that brings the centred label inside
 * the view while it still spans the mark's point (so it reads as the mark's), else 0.
 */
function slideInside(it: LabelItem, w: number, width: number): number {
  const x = it.x - w / 2;
  const shift = x < 0 ? -x : x + w > width ? width - (x + w) : 0;
  const spans = it.x >= x + shift + 8 && it.x <= x + shift + w - 8;
  return spans ? shift : 0;
}

/** Do two boxes share any area (touching edges do not count)? */
export function overlaps(a: Rect, b: Rect): boolean {
  return a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;
}

const inside = (r: Rect, width: number, height: number) => r.x >= 0 && r.y >= 0 && r.x + r.w <= width && r.y + r.h <= height;

type Chosen = { side: Side; rect: Rect; maxWidth: number | null; shift: number };

/** The first side (right, left, above, below) whose box is inside the view and clear of `blocked`. */
function firstFree(it: LabelItem, blocked: readonly Rect[], width: number, height: number): Chosen | null {
  for (const side of SIDES) {
    let w = it.w;
    if (side === 'right') w = Math.min(w, width - (it.x + LABEL_OFFSET) - 4);
    else if (side === 'left') w = Math.min(w, it.x - LABEL_OFFSET - 4);
    if (w < Math.min(it.w, MIN_LABEL_W)) continue;
    const shift = side === 'above' || side === 'below' ? slideInside(it, w, width) : 0;
    const rect = labelRect(it, side, w, shift);
    if (inside(rect, width, height) && !blocked.some((t) => overlaps(rect, t))) return { side, rect, maxWidth: w < it.w ? w : null, shift };
  }
  return null;
}

/**
 * Places the labels in the order given, clear of `symbols` (every mark's symbol), `controls` (the
 * map's buttons and scale) and each other. Returns a placement per label id.
 */
export function declutter(items: readonly LabelItem[], symbols: readonly Rect[], controls: readonly Rect[], width: number, height: number): Map<string, Placement> {
  const out = new Map<string, Placement>();
  const labels: Rect[] = [];
  for (const it of items) {
    const chosen =
      firstFree(it, [...symbols, ...controls, ...labels], width, height) ?? (it.keep ? firstFree(it, [...controls, ...labels], width, height) : null);
    if (chosen) labels.push(chosen.rect);
    out.set(it.id, chosen ? { side: chosen.side, maxWidth: chosen.maxWidth, ...(chosen.shift ? { shift: chosen.shift } : {}) } : { side: null, maxWidth: null });
  }
  return out;
}

/** A label that goes on a line (a contour), centred on a point of it. */
export interface LineLabelItem {
  id: string;
  /** the line's vertices in the map container's pixels */
  points: readonly { x: number; y: number }[];
  w: number;
  h: number;
}

/** Where along a line a label is tried, as fractions of its length: the middle first, then outwards. */
export const LINE_LABEL_AT = [0.5, 0.35, 0.65, 0.2, 0.8, 0.1, 0.9] as const;
/** Room kept free around a line label, px (so labels of neighbouring lines do not read as one). */
export const LINE_LABEL_GAP = 6;

/** The point a fraction `t` of the way along a polyline (by length); null for a line of no length. */
export function pointAlong(points: readonly { x: number; y: number }[], t: number): { x: number; y: number } | null {
  let total = 0;
  for (let k = 1; k < points.length; k++) total += Math.hypot(points[k].x - points[k - 1].x, points[k].y - points[k - 1].y);
  if (!(total > 0)) return null;
  let left = t * total;
  for (let k = 1; k < points.length; k++) {
    const a = points[k - 1], b = points[k];
    const s = Math.hypot(b.x - a.x, b.y - a.y);
    if (left <= s && s > 0) return { x: a.x + ((b.x - a.x) * left) / s, y: a.y + ((b.y - a.y) * left) / s };
    left -= s;
  }
  return points[points.length - 1];
}

/**
 * Places labels on lines (contour levels), in the order given: each at the first of LINE_LABEL_AT
 * along its line whose box, centred there and grown by LINE_LABEL_GAP, lies inside the view and
 * clear of `blocked` (marks, their labels, controls, notices over the map) and of the labels already
 * placed. A label with no such place is left out (null): a line without a label keeps its legend.
 */
export function placeOnLines(items: readonly LineLabelItem[], blocked: readonly Rect[], width: number, height: number): Map<string, { x: number; y: number } | null> {
  const out = new Map<string, { x: number; y: number } | null>();
  const placed: Rect[] = [];
  for (const it of items) {
    let chosen: { x: number; y: number } | null = null;
    for (const t of LINE_LABEL_AT) {
      const p = pointAlong(it.points, t);
      if (!p) break;
      const rect = { x: p.x - it.w / 2 - LINE_LABEL_GAP, y: p.y - it.h / 2 - LINE_LABEL_GAP, w: it.w + 2 * LINE_LABEL_GAP, h: it.h + 2 * LINE_LABEL_GAP };
      if (!inside(rect, width, height)) continue;
      if (blocked.some((b) => overlaps(rect, b)) || placed.some((b) => overlaps(rect, b))) continue;
      placed.push(rect);
      chosen = p;
      break;
    }
    out.set(it.id, chosen);
  }
  return out;
}
