// Map labels never overprint (src/ui/map/declutter.ts): checked by rectangle intersection, the rule
// itself (no outside reference applies; the layout is the program's own).
import { describe, expect, test } from 'vitest';
import { declutter, labelRect, overlaps, placeOnLines, pointAlong, symbolRect, LINE_LABEL_GAP, type LabelItem } from '../../../src/ui/map/declutter';

const W = 390;
const H = 380;

function placedRects(items: LabelItem[], obstacles = items.map((i) => symbolRect(i.x, i.y))) {
  const p = declutter(items, obstacles, [], W, H);
  return { p, rects: items.flatMap((i) => {
    const s = p.get(i.id)!;
    return s.side ? [{ id: i.id, r: labelRect(i, s.side, s.maxWidth ?? i.w, s.shift) }] : [];
  }), obstacles };
}

describe('declutter', () => {
  test('a lone label goes to the right of its mark', () => {
    const p = declutter([{ id: 'a', x: 100, y: 100, w: 80, h: 20 }], [], [], W, H);
    expect(p.get('a')).toEqual({ side: 'right', maxWidth: null });
  });

  test('at the right edge with a symbol to its left (the depot demo’s supply well on a phone): above, slid inside the view, still over its mark', () => {
    const well: LabelItem = { id: 'well', x: 328, y: 200, w: 130, h: 22 };
    const handle = symbolRect(210, 200);
    const p = declutter([well], [symbolRect(well.x, well.y), handle], [], W, H);
    const s = p.get('well')!;
    expect(s.side).toBe('above');
    const r = labelRect(well, 'above', well.w, s.shift);
    expect(r.x + r.w).toBeLessThanOrEqual(W);
    expect(r.x).toBeGreaterThanOrEqual(0);
    expect(r.x).toBeLessThan(well.x);
    expect(r.x + r.w).toBeGreaterThan(well.x);
    expect(overlaps(r, handle)).toBe(false);
  });

  test('near the right edge: to the left', () => {
    const p = declutter([{ id: 'a', x: 370, y: 100, w: 120, h: 20 }], [], [], W, H);
    expect(p.get('a')!.side).toBe('left');
  });

  test('a cluster (five wells within 40 px, as in the depot demo on a phone): no two labels and no label and symbol overlap', () => {
    const items: LabelItem[] = [
      { id: 'well', x: 200, y: 190, w: 150, h: 20, keep: true },
      { id: 'mw1', x: 180, y: 200, w: 120, h: 20 },
      { id: 'mw2', x: 215, y: 205, w: 120, h: 20 },
      { id: 'mw3', x: 190, y: 175, w: 120, h: 20 },
      { id: 'mw4', x: 230, y: 185, w: 120, h: 20 },
    ];
    const { p, rects, obstacles } = placedRects(items);
    for (let i = 0; i < rects.length; i++) {
      for (let j = i + 1; j < rects.length; j++) expect(overlaps(rects[i].r, rects[j].r), `${rects[i].id} / ${rects[j].id}`).toBe(false);
      // only the kept (selected) label may lie over other marks' symbols
      if (rects[i].id !== 'well') for (const o of obstacles) expect(overlaps(rects[i].r, o)).toBe(false);
      const r = rects[i].r;
      expect(r.x >= 0 && r.y >= 0 && r.x + r.w <= W && r.y + r.h <= H).toBe(true);
    }
    // the selected mark always keeps its label
    expect(p.get('well')!.side).not.toBeNull();
    // those without a free place are hidden, never drawn over another
    expect([...p.values()].filter((x) => x.side === null).length).toBe(items.length - rects.length);
  });

  test('a map control is kept clear', () => {
    const zoom = { x: 10, y: 10, w: 44, h: 88 };
    const p = declutter([{ id: 'a', x: 80, y: 40, w: 120, h: 20, keep: true }], [], [zoom], W, H);
    const r = labelRect({ id: 'a', x: 80, y: 40, w: 120, h: 20 }, p.get('a')!.side!, 120);
    expect(overlaps(r, zoom)).toBe(false);
  });
});

describe('placeOnLines (labels of the head lines)', () => {
  const line = (y: number) => [{ x: 0, y }, { x: 200, y }];
  test('pointAlong walks the line by length', () => {
    expect(pointAlong([{ x: 0, y: 0 }, { x: 10, y: 0 }, { x: 10, y: 10 }], 0.75)).toEqual({ x: 10, y: 5 });
    expect(pointAlong([{ x: 3, y: 3 }, { x: 3, y: 3 }], 0.5)).toBeNull();
  });

  test('a lone label goes to the middle of its line', () => {
    expect(placeOnLines([{ id: 'a', points: line(50), w: 40, h: 18 }], [], W, H).get('a')).toEqual({ x: 100, y: 50 });
  });

  test('close parallel lines: labels move along their lines and never overlap (with their gap); no room, no label', () => {
    const items = Array.from({ length: 12 }, (_, k) => ({ id: `l${k}`, points: line(40 + 8 * k), w: 40, h: 18 }));
    const p = placeOnLines(items, [symbolRect(100, 60)], W, H);
    const boxes = items.flatMap((it) => {
      const at = p.get(it.id);
      return at ? [{ x: at.x - it.w / 2 - LINE_LABEL_GAP, y: at.y - it.h / 2 - LINE_LABEL_GAP, w: it.w + 2 * LINE_LABEL_GAP, h: it.h + 2 * LINE_LABEL_GAP }] : [];
    });
    expect(boxes.length).toBeGreaterThan(1);
    expect(boxes.length).toBeLessThan(items.length);
    for (let a = 0; a < boxes.length; a++) {
      expect(overlaps(boxes[a], symbolRect(100, 60))).toBe(false);
      for (let b = a + 1; b < boxes.length; b++) expect(overlaps(boxes[a], boxes[b])).toBe(false);
    }
  });

  test('a label that would leave the view is tried further along, else left out', () => {
    const p = placeOnLines([{ id: 'edge', points: [{ x: 0, y: 2 }, { x: 100, y: 2 }], w: 40, h: 18 }], [], W, H);
    expect(p.get('edge')).toBeNull();
  });
});
