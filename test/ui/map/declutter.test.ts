// Map labels never overprint (src/ui/map/declutter.ts): checked by rectangle intersection, the rule
// itself (no outside reference applies; the layout is the program's own).
import { describe, expect, test } from 'vitest';
import { declutter, labelRect, overlaps, symbolRect, type LabelItem } from '../../../src/ui/map/declutter';

const W = 390;
const H = 380;

function placedRects(items: LabelItem[], obstacles = items.map((i) => symbolRect(i.x, i.y))) {
  const p = declutter(items, obstacles, [], W, H);
  return { p, rects: items.flatMap((i) => {
    const s = p.get(i.id)!;
    return s.side ? [{ id: i.id, r: labelRect(i, s.side, s.maxWidth ?? i.w) }] : [];
  }), obstacles };
}

describe('declutter', () => {
  test('a lone label goes to the right of its mark', () => {
    const p = declutter([{ id: 'a', x: 100, y: 100, w: 80, h: 20 }], [], [], W, H);
    expect(p.get('a')).toEqual({ side: 'right', maxWidth: null });
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
