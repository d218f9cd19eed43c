/**
 * The centreline chart's receptor labels (src/ui/charts/Charts.tsx receptorMarks): no two labels
 * in one row overlap, every label stays inside the plot, and receptors past the distance axis are
 * listed at its end. Checks of the layout rule itself (widths as the function estimates them).
 * The particle curve's points (particlePoints): a pumping well's interval means drawn as steps over
 * their intervals, a point estimate at its time; the band ± 2 standard errors, never below zero.
 */
import { describe, expect, test } from 'vitest';
import { arrivalLabelY, M, particlePoints, receptorMarks } from '../../src/ui/charts/Charts';

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

describe('particlePoints', () => {
  const curve = { times: [10, 20, 30], c: [0, 0.5, 1], se: [0, 0.3, 0.1], label: 'particles' };
  test('a pumping well: each interval mean held over (t_{k−1}, t_k], band ± 2 SE clipped at 0', () => {
    const p = particlePoints({ ...curve, pumped: true });
    expect(p.ts).toEqual([0, 10, 10, 20, 20, 30]);
    expect(p.c).toEqual([0, 0, 0.5, 0.5, 1, 1]);
    expect(p.lo).toEqual([0, 0, 0, 0, 0.8, 0.8]);
    expect(p.hi.map((v) => Number(v.toFixed(12)))).toEqual([0, 0, 1.1, 1.1, 1.2, 1.2]);
  });
  test('a point estimate: one point per output time', () => {
    const p = particlePoints({ ...curve, pumped: false });
    expect(p.ts).toEqual([10, 20, 30]);
    expect(p.c).toEqual([0, 0.5, 1]);
  });
});

describe('arrivalLabelY (issue 13: "log scale" overprinted "reaches limit")', () => {
  // the note's box: x from M.l + 4, about 58 wide (9 characters of 10 px DejaVu Sans), baseline M.t + 11, 10 px tall
  const noteRight = M.l + 4 + 58;
  test('on a log axis, words starting over the note go one line (14 px) lower, clear of its baseline by a text height', () => {
    expect(arrivalLabelY(M.l + 5, true)).toBe(M.t + 27);
    expect(arrivalLabelY(M.l + 5, true) - 12).toBeGreaterThan(M.t + 11); // 12 px: the words' cap height and more
    expect(arrivalLabelY(noteRight + 1, true)).toBe(M.t + 13);
  });
  test('on a linear axis there is no note: the top line', () => {
    expect(arrivalLabelY(M.l + 5, false)).toBe(M.t + 13);
  });
});
