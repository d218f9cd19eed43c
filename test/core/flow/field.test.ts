/**
 * The well field (src/core/flow): closed forms from outside the project, named beside each check.
 *
 * - Javandel & Tsang 1986, Ground Water 24(5): one well pumping Q in uniform flow (discharge per
 *   unit width Q₀ = qB): stagnation point Q/(2πQ₀) downgradient, capture width Q/(2Q₀) through the
 *   well and Q/Q₀ far upgradient, dividing streamline y = Q·θ/(2πQ₀) (θ the polar angle about the
 *   well from the downgradient direction; equivalently y = ±(Q/2Q₀)(1 − θ'/π), θ' from upgradient).
 * - Travel time along the upgradient axis, t(r) = (nB/Q₀)·[r − a·ln(1 + r/a)], a = Q/(2πQ₀): the
 *   elementary integral of dr/v along the axis (derived here; the same expression is given by
 *   Bear & Jacobs 1965, J. Hydrology 3 — recalled, not looked up).
 * - Image wells (Ferris et al. 1962, USGS WSP 1536-E): drawdown at a well face a distance d from a
 *   constant-head line, s = Q/(2πT)·ln(2d/rw); zero drawdown along the constant-head line; no
 *   normal flow across an impermeable line.
 * - Well a distance d upgradient of a constant-head line with the regional flow towards it (image
 *   injection well at 2d; derived here from that image field, the standard configuration of the
 *   induced-infiltration problem, e.g. Wilson 1993, WRR 29(10) — recalled): with c = Q/(πQ₀),
 *   stagnation points on the axis at x = d − √(d² − c·d) when d > c; on the line at
 *   y = ±√(c·d − d²) when d < c, and then the stream supplies
 *   (2Q/π)·atan(y_s/d) − 2Q₀·y_s of the well's Q.
 */
import { describe, expect, it } from 'vitest';
import {
  captureZone,
  captureZoneSingleWell,
  dischargePotential,
  dividingStreamlines,
  drawdown,
  flowVelocity,
  flowWarnings,
  prepareFlow,
  sourceCapture,
  stagnationPoints,
  wellFieldVelocity,
  ValidationError,
} from '../../../src/core/index';

const Q = 500; // m³/d
const B = 10; // m
const q = 0.1; // m/d
const n = 0.25;
const Q0 = q * B;
const a = Q / (2 * Math.PI * Q0);

describe('captureZoneSingleWell (Javandel & Tsang 1986 closed forms)', () => {
  it('stagnation distance Q/(2πBq), widths Q/(2Bq) and Q/(Bq) (tolerance 1e-15 relative)', () => {
    const r = captureZoneSingleWell({ pumpingRate: Q, thickness: B, darcyFlux: q });
    expect(r.stagnationDistance).toBeCloseTo(500 / (2 * Math.PI), 12);
    expect(r.widthAtWell).toBe(250);
    expect(r.widthFarUpgradient).toBe(500);
  });

  it('the velocity of the superposed field vanishes at that stagnation point (|v| < 1e-12 of q/n)', () => {
    const { stagnationDistance } = captureZoneSingleWell({ pumpingRate: Q, thickness: B, darcyFlux: q });
    const v = wellFieldVelocity({ x: stagnationDistance, y: 0, darcyFlux: q, porosity: n, thickness: B, wells: [{ x: 0, y: 0, rate: Q }] });
    expect(Math.hypot(v.vx, v.vy)).toBeLessThan(1e-12 * (q / n));
  });

  it('refuses zero thickness, zero flux and a rate that is not a number, naming the field', () => {
    expect(() => captureZoneSingleWell({ pumpingRate: Q, thickness: 0, darcyFlux: q })).toThrow(/thickness/);
    expect(() => captureZoneSingleWell({ pumpingRate: Q, thickness: B, darcyFlux: 0 })).toThrow(/darcyFlux/);
    expect(() => captureZoneSingleWell({ pumpingRate: NaN, thickness: B, darcyFlux: q })).toThrow(/pumpingRate/);
  });
});

describe('wellFieldVelocity', () => {
  const base = { darcyFlux: q, porosity: n, thickness: B };
  it('without wells: the regional seepage velocity q/nₑ along +x (exact)', () => {
    expect(wellFieldVelocity({ ...base, x: 3, y: -7, wells: [] })).toEqual({ vx: q / n, vy: 0 });
  });

  it('one well: radial inflow Q/(2πrnB) plus the regional velocity (Strack 1989 superposition; 1e-14 relative)', () => {
    const r = 40;
    const v = wellFieldVelocity({ ...base, x: 0, y: r, wells: [{ x: 0, y: 0, rate: Q }] });
    expect(v.vx).toBeCloseTo(q / n, 14);
    expect(v.vy / (-Q / (2 * Math.PI * r * n * B))).toBeCloseTo(1, 14);
  });

  it('no NaN at or inside a well: finite velocity, potential and drawdown at the centre and at rw/2', () => {
    const f = prepareFlow({ ...base, wells: [{ x: 0, y: 0, rate: Q, radius: 0.15 }] });
    const o = { x: 0, y: 0 };
    for (const [x, y] of [
      [0, 0],
      [0.075, 0],
      [0, 0.15],
    ]) {
      flowVelocity(f, x, y, o);
      expect(Number.isFinite(o.x) && Number.isFinite(o.y)).toBe(true);
      expect(Number.isFinite(dischargePotential(f, x, y))).toBe(true);
      expect(Number.isFinite(drawdown(f, 20, x, y, 500))).toBe(true);
    }
    const v = wellFieldVelocity({ ...base, x: 0, y: 0, wells: [{ x: 0, y: 0, rate: Q }] });
    expect(v).toEqual({ vx: q / n, vy: 0 });
  });

  it('refuses a rate that is not finite, zero thickness and a well on a boundary line, with messages', () => {
    expect(() => wellFieldVelocity({ ...base, x: 1, y: 1, wells: [{ x: 0, y: 0, rate: Infinity }] })).toThrow(/wells\[0\]\.rate/);
    expect(() => wellFieldVelocity({ ...base, thickness: 0, x: 1, y: 1, wells: [] })).toThrow(ValidationError);
    expect(() => wellFieldVelocity({ ...base, thickness: 0, x: 1, y: 1, wells: [] })).toThrow(/thickness/);
    const onLine = () =>
      wellFieldVelocity({ ...base, x: 1, y: 1, wells: [{ x: 50, y: 0, rate: Q }], boundaries: [{ kind: 'constant-head', x1: 50, y1: -10, x2: 50, y2: 10 }] });
    expect(onLine).toThrow(/on boundary line 1/);
    const beyond = () => prepareFlow({ ...base, wells: [{ x: 60, y: 0, rate: Q }], boundaries: [{ kind: 'no-flow', x1: 50, y1: 0, x2: 50, y2: 10 }] });
    expect(beyond).toThrow(/beyond boundary line 1/);
    const skew = () =>
      prepareFlow({
        ...base,
        wells: [],
        boundaries: [
          { kind: 'no-flow', x1: 0, y1: 0, x2: 10, y2: 0 },
          { kind: 'no-flow', x1: 0, y1: 0, x2: 10, y2: 7 },
        ],
      });
    expect(skew).toThrow(/parallel or at right angles/);
  });
});

describe('capture zone of one well traced backward vs Javandel & Tsang', () => {
  const f = prepareFlow({ darcyFlux: q, porosity: n, thickness: B, wells: [{ x: 0, y: 0, rate: Q }] });

  it('one stagnation point, at Q/(2πQ₀) downgradient (Newton, 1e-9 relative)', () => {
    const s = stagnationPoints(f);
    expect(s.length).toBe(1);
    expect(s[0].x / a).toBeCloseTo(1, 9);
    expect(Math.abs(s[0].y)).toBeLessThan(1e-9 * a);
  });

  it('the dividing streamlines traced from it satisfy y = Q·θ/(2πQ₀) to 1e-4·a, out to 30a upgradient', () => {
    const [s] = stagnationPoints(f);
    const lines = dividingStreamlines(f, s, { maxDistance: 30 * a });
    expect(lines.length).toBe(2);
    let worst = 0;
    for (const l of lines) {
      expect(l.end).toBe('far');
      for (let i = 0; i < l.x.length; i++) {
        const theta = Math.atan2(l.y[i], l.x[i]);
        if (Math.abs(l.y[i]) < 1e-3 * a) continue; // the start, within the offset of the stagnation point
        worst = Math.max(worst, Math.abs(l.y[i] - a * theta));
      }
      // far upgradient the half-width tends to Q/(2Q₀): at 30a it is (1 − atan(π/30)/π)·Q/(2Q₀) ≈ 0.967 of it
      const last = l.y.length - 1;
      expect(Math.abs(l.y[last]) / (Q / (2 * Q0))).toBeGreaterThan(0.96);
      expect(Math.abs(l.y[last])).toBeLessThan(Q / (2 * Q0));
    }
    expect(worst).toBeLessThan(1e-4 * a);
  });

  it('the fan: width through the well Q/(2Q₀) (±2 streamline spacings) and the whole flow from upgradient', () => {
    const cz = captureZone(f, 0, { count: 181, maxDistance: 30 * a });
    expect(cz.fromRegional).toBe(1);
    // the traced streamlines cross x = 0 at |y| ≤ Q/(4Q₀); the outermost close to it
    let ymax = 0;
    for (const s of cz.streamlines)
      for (let i = 1; i < s.x.length; i++)
        if ((s.x[i - 1] - 0) * (s.x[i] - 0) <= 0 && Math.abs(s.y[i]) > 1) {
          const t = s.x[i - 1] / (s.x[i - 1] - s.x[i]);
          ymax = Math.max(ymax, Math.abs(s.y[i - 1] + t * (s.y[i] - s.y[i - 1])));
        }
    expect(ymax).toBeLessThanOrEqual(Q / (4 * Q0) * (1 + 1e-6));
    expect(ymax).toBeGreaterThan(Q / (4 * Q0) - 2 * (Q / 181));
  });

  it('isochrones: the upgradient-axis point at time T matches t(r) = (nB/Q₀)[r − a ln(1 + r/a)] (1e-5 relative)', () => {
    const years = [1, 5, 10, 25].map((y) => y * 365.25);
    const M = 73; // odd: streamline (M − 1)/2 starts at θ = π, on the upgradient axis
    const cz = captureZone(f, 0, { count: M, times: years });
    for (const iso of cz.isochrones) {
      const k = (M - 1) / 2;
      const x = iso.polygon[2 * k];
      const y = iso.polygon[2 * k + 1];
      const r = Math.hypot(x, y);
      expect(Math.abs(y)).toBeLessThan(1e-6 * r);
      const t = ((n * B) / Q0) * (r - a * Math.log(1 + r / a));
      expect(t / iso.time).toBeCloseTo(1, 5);
    }
  });

  it('isochrones with retardation: the solute zone at T is the water zone at T/R (exact by construction; R = 3)', () => {
    const water = captureZone(f, 0, { count: 24, times: [365.25] });
    const solute = captureZone(f, 0, { count: 24, times: [3 * 365.25], retardation: 3 });
    for (let i = 0; i < 48; i++) expect(solute.isochrones[0].polygon[i]).toBeCloseTo(water.isochrones[0].polygon[i], 6);
  });

  it('the source: captured on the axis upgradient (travel time as above, 1e-5), not captured beyond Q/(2Q₀) across', () => {
    const r = 300;
    const c = sourceCapture(f, -r, 0);
    expect(c.well).toBe(0);
    const t = ((n * B) / Q0) * (r - a * Math.log(1 + r / a));
    expect((c.travelTime as number) / t).toBeCloseTo(1, 5);
    const outside = sourceCapture(f, -2000, 0.55 * (Q / Q0), { maxDistance: 5000 });
    expect(outside.well).toBe(-1);
    expect(outside.travelTime).toBeNull();
    const inside = sourceCapture(f, -2000, 0.45 * (Q / Q0), { maxDistance: 5000 });
    expect(inside.well).toBe(0);
  });
});

describe('image wells (Ferris et al. 1962) and a well near a stream', () => {
  const d = 100;
  // the stream at x = d across the flow, aquifer on x < d (left of the upward direction)
  const stream = { kind: 'constant-head' as const, x1: d, y1: 0, x2: d, y2: 1 };

  it('drawdown at the well face Q/(2πT)·ln(2d/rw) and zero along the stream line (1e-12 relative)', () => {
    const K = 20;
    const f = prepareFlow({ darcyFlux: 0, porosity: n, thickness: B, wells: [{ x: 0, y: 0, rate: Q, radius: 0.1 }], boundaries: [stream] });
    const sWell = drawdown(f, K, 0.1, 0);
    expect(sWell / ((Q / (2 * Math.PI * K * B)) * Math.log((2 * d - 0.1) / 0.1))).toBeCloseTo(1, 12);
    for (const y of [-500, -30, 0, 12, 800]) expect(Math.abs(drawdown(f, K, d, y))).toBeLessThan(1e-12 * sWell);
  });

  it('an impermeable line along the flow: no flow across it (|vy| < 1e-13 of q/n)', () => {
    const f = prepareFlow({ darcyFlux: q, porosity: n, thickness: B, wells: [{ x: 0, y: 30, rate: Q }], boundaries: [{ kind: 'no-flow', x1: 0, y1: 0, x2: 1, y2: 0 }] });
    const o = { x: 0, y: 0 };
    for (const x of [-400, -10, 0, 25, 300]) {
      flowVelocity(f, x, 0, o);
      expect(Math.abs(o.y)).toBeLessThan(1e-13 * (q / n));
    }
    expect(flowWarnings(f).map((w) => w.code)).toContain('well-near-boundary');
  });

  it('a corner of two impermeable lines: three images, no normal flow on either line', () => {
    const f = prepareFlow({
      darcyFlux: q,
      porosity: n,
      thickness: B,
      wells: [{ x: 40, y: 30, rate: Q }],
      boundaries: [
        { kind: 'no-flow', x1: 0, y1: 0, x2: 1, y2: 0 },
        { kind: 'no-flow', x1: 0, y1: 1, x2: 0, y2: 0 },
      ],
    });
    expect(f.sx.length).toBe(4);
    const o = { x: 0, y: 0 };
    flowVelocity(f, 70, 0, o);
    expect(Math.abs(o.y)).toBeLessThan(1e-13);
    flowVelocity(f, 0, 55, o);
    // the regional flow crosses the line x = 0 (the warning says so); the wells' part does not
    expect(Math.abs(o.x - q / n)).toBeLessThan(1e-13);
    expect(flowWarnings(f).map((w) => w.code)).toContain('boundary-regional-flow');
  });

  it('d > Q/(πQ₀): stagnation on the axis at d − √(d² − c·d), and none of the water from the stream', () => {
    const Qs = 200; // c = Q/(πQ₀) = 63.7 m < d
    const c = Qs / (Math.PI * Q0);
    const f = prepareFlow({ darcyFlux: q, porosity: n, thickness: B, wells: [{ x: 0, y: 0, rate: Qs }], boundaries: [stream] });
    const s = stagnationPoints(f);
    expect(s.length).toBe(1);
    expect(s[0].x / (d - Math.sqrt(d * d - c * d))).toBeCloseTo(1, 9);
    expect(Math.abs(s[0].y)).toBeLessThan(1e-9 * d);
    const cz = captureZone(f, 0, { count: 90, maxDistance: 5000 });
    expect(cz.fromBoundary[0]).toBe(0);
  });

  it('d < Q/(πQ₀): stagnation points on the stream at ±√(c·d − d²), the stream supplying (2Q/π)atan(y_s/d) − 2Q₀y_s (±1/M)', () => {
    const c = Q / (Math.PI * Q0); // 159 m > d
    const ys = Math.sqrt(c * d - d * d);
    const f = prepareFlow({ darcyFlux: q, porosity: n, thickness: B, wells: [{ x: 0, y: 0, rate: Q }], boundaries: [stream] });
    const s = stagnationPoints(f).sort((p, r) => p.y - r.y);
    expect(s.length).toBe(2);
    expect(s[0].x / d).toBeCloseTo(1, 9);
    expect(s[1].y / ys).toBeCloseTo(1, 9);
    expect(s[0].y / -ys).toBeCloseTo(1, 9);
    const M = 360;
    const cz = captureZone(f, 0, { count: M, maxDistance: 5000 });
    const share = ((2 * Q) / Math.PI * Math.atan(ys / d) - 2 * Q0 * ys) / Q;
    expect(Math.abs(cz.fromBoundary[0] - share)).toBeLessThanOrEqual(1.5 / M);
    expect(Math.abs(cz.fromBoundary[0] + cz.fromRegional - 1)).toBeLessThan(1e-12);
  });
});
