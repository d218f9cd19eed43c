/**
 * Axis arithmetic for the charts: linear "nice" ticks (1, 2, 5 × 10ⁿ), decade ticks for
 * logarithmic concentration axes, and the choice between them. Pure, tested in Node.
 */

export interface Scale {
  (v: number): number;
  ticks: { value: number; label: string }[];
  log: boolean;
  domain: [number, number];
}

/** The smallest 1, 2 or 5 × 10ⁿ that divides `span` into at most `count` steps. */
export function niceStep(span: number, count: number): number {
  const raw = span / Math.max(1, count);
  const p = Math.pow(10, Math.floor(Math.log10(raw)));
  for (const m of [1, 2, 5]) if (m * p >= raw * (1 - 1e-12)) return m * p;
  return 10 * p;
}

export function niceLinearTicks(lo: number, hi: number, count = 5): number[] {
  if (!(hi > lo)) return [lo];
  const step = niceStep(hi - lo, count);
  const out: number[] = [];
  for (let v = Math.ceil(lo / step - 1e-9) * step; v <= hi + step * 1e-9; v += step) out.push(Number(v.toPrecision(12)));
  return out;
}

function label(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e-3 && a < 1e5) return String(Number(v.toPrecision(4)));
  const e = Math.floor(Math.log10(a));
  const m = v / Math.pow(10, e);
  return `${Math.abs(m - 1) < 1e-9 ? '' : Number(m.toPrecision(3)) + '×'}10${superscript(e)}`;
}

const SUP: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };
function superscript(n: number): string {
  return String(n)
    .split('')
    .map((c) => SUP[c] ?? c)
    .join('');
}

export function linearScale(lo: number, hi: number, r0: number, r1: number, fmt: (v: number) => string = label): Scale {
  const span = hi - lo || 1;
  const f = ((v: number) => r0 + ((v - lo) / span) * (r1 - r0)) as Scale;
  f.ticks = niceLinearTicks(lo, hi).map((value) => ({ value, label: fmt(value) }));
  f.log = false;
  f.domain = [lo, hi];
  return f;
}

/** Log scale over whole decades; values ≤ lo are drawn at the bottom edge. */
export function logScale(lo: number, hi: number, r0: number, r1: number, fmt: (v: number) => string = label): Scale {
  const a = Math.floor(Math.log10(lo));
  const b = Math.ceil(Math.log10(hi));
  const span = Math.max(1, b - a);
  const f = ((v: number) => {
    const l = v > 0 ? Math.log10(v) : a;
    return r0 + ((Math.max(a, Math.min(b, l)) - a) / span) * (r1 - r0);
  }) as Scale;
  const every = span > 8 ? 2 : 1;
  f.ticks = [];
  for (let e = a; e <= b; e += every) f.ticks.push({ value: Math.pow(10, e), label: fmt(Math.pow(10, e)) });
  f.log = true;
  f.domain = [Math.pow(10, a), Math.pow(10, b)];
  return f;
}

/**
 * Concentration axis: logarithmic when the curve's peak and the limit are more than two decades
 * apart (either way), else linear from 0. The log axis runs from a tenth of the smaller of the two
 * to above the larger, at most eight decades.
 */
export function concentrationScale(values: number[], limit: number, r0: number, r1: number, fmt?: (v: number) => string): Scale {
  const finite = values.filter((v) => Number.isFinite(v) && v >= 0);
  const curvePeak = finite.length ? Math.max(...finite) : 0;
  const top = Math.max(limit, curvePeak);
  const hi = top * 1.3;
  const ratio = curvePeak > 0 ? top / Math.min(limit, curvePeak) : Infinity;
  if (ratio <= 100) return linearScale(0, hi, r0, r1, fmt);
  const lo = Math.max(Math.min(limit, curvePeak > 0 ? curvePeak : limit) / 10, top * 1e-8);
  return logScale(lo, hi, r0, r1, fmt);
}
