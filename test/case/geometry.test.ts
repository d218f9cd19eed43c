/**
 * The case's geometry steps (src/case/geometry.ts) on their own; prepare.test.ts checks them through
 * prepareCase against geographiclib and hand calculations.
 */
import { expect, test } from 'vitest';
import { newCase } from '../../src/case/defaults';
import { prepareFlow, prepareFrame, prepareReceptors, prepareSourcePlane, receptorReach } from '../../src/case/geometry';
import { newReceptor } from '../../src/case/defaults';

test('flow from three head readings on the plane h = 20 − 0.01·east: gradient 0.01 towards east (90°)', () => {
  const c = newCase({ now: new Date('2026-01-01T00:00:00Z') });
  c.site.flow = {
    method: 'heads',
    readings: [
      { id: 'a', name: 'A', position: [0, 0], head: { value: 20, unit: 'm' } },
      { id: 'b', name: 'B', position: [100, 0], head: { value: 19, unit: 'm' } },
      { id: 'c', name: 'C', position: [0, 100], head: { value: 20, unit: 'm' } },
    ],
  };
  const f = prepareFlow(c, prepareFrame(c));
  // the three-point problem by hand: Δh/Δeast = −1/100, no change north → i = 0.01 towards +east
  expect(f.gradient).toBeCloseTo(0.01, 12);
  expect(f.azimuthDeg).toBeCloseTo(90, 9);
  expect(f.headFit?.readingIds).toEqual(['a', 'b', 'c']);
});

test('receptors in the flow frame, and the reach an estimated dispersivity is scaled from', () => {
  const c = newCase({ now: new Date('2026-01-01T00:00:00Z') }); // flow towards east (90°), source at the datum
  c.site.receptors = [newReceptor([120, 0], 0, 'r1'), newReceptor([-30, 5], 1, 'r2'), newReceptor([80, -10], 2, 'r3')];
  const sf = prepareFrame(c);
  const plane = prepareSourcePlane(c, sf, 90);
  const { receptors } = prepareReceptors(c, sf, plane.sourceEN, 90);
  expect(receptors.map((r) => Math.round(r.x))).toEqual([120, -30, 80]);
  // y positive to the left looking downgradient (east): north is +y
  expect(Math.round(receptors[1].y)).toBe(5);
  expect(receptorReach(receptors)).toBeCloseTo(120, 9);
  expect(receptorReach(receptors.filter((r) => r.x < 0))).toBeNull();
});
