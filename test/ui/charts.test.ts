/**
 * The centreline chart's receptor labels (src/ui/charts/Charts.tsx receptorMarks): no two labels
 * in one row overlap, every label stays inside the plot, and receptors past the distance axis are
 * listed at its end. Checks of the layout rule itself (widths as the function estimates them).
 */
import { describe, expect, test } from 'vitest';
import { receptorMarks } from '../../src/ui/charts/Charts';

describe('receptorMarks', () => {
  test('close receptors go into separate rows; none overlaps another in its row', () => {
    const rs = [
      { name: 'Farm supply well', x: 170 },
      { name: "Neighbour's garden well", x: 180 },
      { name: 'Property line', x: 190 },
      { name: 'Spring', x: 400 },
    ];
    const out = receptorMarks(rs, 500, 'm');
    expect(out).toHaveLength(4);
    const rows = new Set(out.filter((r) => r.x < 200).map((r) => r.row));
    expect(rows.size).toBe(3);
    expect(out.find((r) => r.name === 'Spring')!.row).toBe(0);
  });

  test('a receptor past the axis is listed at its end with its distance', () => {
    const out = receptorMarks([{ name: 'Village supply well', x: 866 }, { name: 'Spring', x: 100 }], 300, 'm');
    const far = out.find((r) => r.name === 'Village supply well')!;
    expect(far.beyond).toBe(true);
    expect(far.label).toBe('→ Village supply well, 866 m');
  });

  test('upgradient receptors (x ≤ 0) are left out', () => {
    expect(receptorMarks([{ name: 'Up', x: -60 }], 300, 'm')).toEqual([]);
  });
});
