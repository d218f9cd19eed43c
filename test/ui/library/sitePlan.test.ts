// Where the printed site plan puts a mark's name (issue 13 item 17: labels stay inside the plan).
// Expected positions worked out by hand from the rule in SitePlan.tsx's labelPlace.
import { describe, expect, it } from 'vitest';
import { labelPlace } from '../../../src/ui/library/SitePlan';

describe('labelPlace', () => {
  const W = 680, H = 420, CHAR = 8;
  it('right of the mark where it fits, above it', () => {
    const l = labelPlace(100, 200, 'Farm well', W, H);
    expect(l).toMatchObject({ anchor: 'start', text: 'Farm well', y: 192 });
    expect(l.x).toBeCloseTo(100 + 16 * 0.7 + 3, 9);
  });
  it('left of the mark near the right edge, so the whole name stays inside', () => {
    const name = 'Mill creek bank';
    const l = labelPlace(W - 20, 200, name, W, H);
    expect(l.anchor).toBe('end');
    expect(l.x - name.length * CHAR).toBeGreaterThanOrEqual(0);
    expect(l.x).toBeLessThan(W - 20);
  });
  it('below the mark near the top; a long name cut short', () => {
    const l = labelPlace(300, 10, 'x'.repeat(50), W, H);
    expect(l.y).toBe(32);
    expect(l.text).toHaveLength(30);
    expect(l.text.endsWith('…')).toBe(true);
  });
  it('a name too long for either side starts inside the left edge', () => {
    const l = labelPlace(60, 200, 'y'.repeat(30), 200, H);
    expect(l.anchor).toBe('start');
    expect(l.x).toBeGreaterThanOrEqual(4);
  });
});
