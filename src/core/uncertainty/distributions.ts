/**
 * Probability distributions of uncertain inputs, with their inverse cumulative distribution
 * functions (the sampler maps a stratified uniform u in (0, 1) to a value by x = F⁻¹(u)).
 *
 *   uniform(low, high)            F⁻¹(p) = low + p·(high − low)
 *   log-uniform(low, high)        ln x uniform on [ln low, ln high]
 *   triangular(low, mode, high)   the closed-form inverse of the two quadratic pieces
 *   normal(mean, sd)              mean + sd·Φ⁻¹(p)
 *   lognormal(median, gsd)        median·gsd^Φ⁻¹(p)   (gsd: geometric standard deviation > 1)
 *   lognormal-range(low, high, percentile)
 *                                 the lognormal whose `percentile`-th and (100 − percentile)-th
 *                                 percentiles are low and high: median √(low·high),
 *                                 ln gsd = ln(high/low) / (2·Φ⁻¹(1 − percentile/100))
 * Each may be truncated to [truncate.low, truncate.high]: x = F⁻¹(F(a) + u·(F(b) − F(a))); for the
 * normal family the upper tail is worked with survival probabilities, so a truncation far out in
 * the upper tail keeps its accuracy. Accuracy: that of Φ⁻¹ (AS 241, ~1e-16 relative, normal.ts) and
 * Φ (Cody's erfc) — a few ulp in the argument, ample for sampling.
 *
 * Validation refuses, with a message naming the input: parameters out of order (low above high),
 * a standard deviation or gsd that is not positive, truncation bounds that leave no probability,
 * and any distribution that puts probability outside the input's physical range (porosity in
 * (0, 1], K > 0, …): that is an input error, never silently clipped. Truncating the distribution
 * inside the range is the remedy the message offers.
 */
import { ValidationError } from '../validation';
import { normalCdf, normalQuantile } from './normal';

export interface Truncation {
  readonly low?: number | null;
  readonly high?: number | null;
}

export type Distribution = (
  | { readonly kind: 'uniform'; readonly low: number; readonly high: number }
  | { readonly kind: 'log-uniform'; readonly low: number; readonly high: number }
  | { readonly kind: 'triangular'; readonly low: number; readonly mode: number; readonly high: number }
  | { readonly kind: 'normal'; readonly mean: number; readonly sd: number }
  | { readonly kind: 'lognormal'; readonly median: number; readonly gsd: number }
  | { readonly kind: 'lognormal-range'; readonly low: number; readonly high: number; readonly percentile: number }
) & { readonly truncate?: Truncation | null };

export type DistributionKind = Distribution['kind'];

/** The physical range of an input, e.g. porosity (0, 1]: min 0 open, max 1 closed. */
export interface PhysicalRange {
  readonly min: number;
  readonly max: number;
  readonly minOpen: boolean;
  readonly maxOpen: boolean;
}

/** A bound in a message: 3 significant figures, a true minus sign. */
const writtenBound = (v: number): string => String(Number(v.toPrecision(3))).replace('e+', 'e').replace(/^-/, '−');

export function rangeText(r: PhysicalRange): string {
  if (r.max === Infinity) return r.min === -Infinity ? 'any value' : `${r.minOpen ? '>' : '≥'} ${r.min}`;
  if (r.min === -Infinity) return `${r.maxOpen ? '<' : '≤'} ${r.max}`;
  return `in ${r.minOpen ? '(' : '['}${r.min}, ${r.max}${r.maxOpen ? ')' : ']'}`;
}

/** A distribution ready to sample: x = sample(u) for u in (0, 1); its support and cdf. */
export interface Sampler {
  readonly sample: (u: number) => number;
  readonly cdf: (x: number) => number;
  /** smallest and largest value it can return */
  readonly low: number;
  readonly high: number;
  /** median of the (truncated) distribution */
  readonly median: number;
}

/** Log-space location and scale of a lognormal given either way. */
function lognormalParams(d: Extract<Distribution, { kind: 'lognormal' | 'lognormal-range' }>): { mu: number; sigma: number } {
  if (d.kind === 'lognormal') return { mu: Math.log(d.median), sigma: Math.log(d.gsd) };
  const z = normalQuantile(1 - d.percentile / 100);
  return { mu: 0.5 * (Math.log(d.low) + Math.log(d.high)), sigma: Math.log(d.high / d.low) / (2 * z) };
}

interface Base {
  cdf(x: number): number;
  quantile(p: number): number;
  /** support before truncation, and whether its ends are values it can take (uniform's are) */
  lo: number;
  hi: number;
  closed: boolean;
  /** normal family: x ↔ standard normal z */
  toZ?: (x: number) => number;
  fromZ?: (z: number) => number;
}

function base(d: Distribution): Base {
  switch (d.kind) {
    case 'uniform': {
      const w = d.high - d.low;
      return { lo: d.low, hi: d.high, closed: true, cdf: (x) => Math.min(1, Math.max(0, (x - d.low) / w)), quantile: (p) => Math.min(d.high, d.low + p * w) };
    }
    case 'log-uniform': {
      const a = Math.log(d.low);
      const w = Math.log(d.high) - a;
      return {
        lo: d.low,
        hi: d.high,
        closed: true,
        cdf: (x) => (x <= d.low ? 0 : x >= d.high ? 1 : (Math.log(x) - a) / w),
        quantile: (p) => Math.min(d.high, Math.max(d.low, Math.exp(a + p * w))),
      };
    }
    case 'triangular': {
      const { low, mode, high } = d;
      const w = high - low;
      const c = (mode - low) / w;
      return {
        lo: low,
        hi: high,
        closed: true,
        cdf: (x) => (x <= low ? 0 : x >= high ? 1 : x <= mode ? ((x - low) * (x - low)) / (w * (mode - low)) : 1 - ((high - x) * (high - x)) / (w * (high - mode))),
        quantile: (p) => Math.min(high, Math.max(low, p < c ? low + Math.sqrt(p * w * (mode - low)) : high - Math.sqrt((1 - p) * w * (high - mode)))),
      };
    }
    case 'normal': {
      const toZ = (x: number) => (x - d.mean) / d.sd;
      const fromZ = (z: number) => d.mean + d.sd * z;
      return { lo: -Infinity, hi: Infinity, closed: false, cdf: (x) => normalCdf(toZ(x)), quantile: (p) => fromZ(normalQuantile(p)), toZ, fromZ };
    }
    case 'lognormal':
    case 'lognormal-range': {
      const { mu, sigma } = lognormalParams(d);
      const toZ = (x: number) => (x > 0 ? (Math.log(x) - mu) / sigma : -Infinity);
      const fromZ = (z: number) => Math.exp(mu + sigma * z);
      return { lo: 0, hi: Infinity, closed: false, cdf: (x) => normalCdf(toZ(x)), quantile: (p) => fromZ(normalQuantile(p)), toZ, fromZ };
    }
  }
}

const finite = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

/** Check the parameters of a distribution; `field` is the input's path, `label` its name in words. */
function checkParameters(field: string, label: string, d: Distribution): void {
  const need = (name: string, ok: boolean, range: string, detail: string, value: unknown) => {
    if (!ok) throw new ValidationError(`${field}.${name}`, value, range, `${label}: ${detail}`);
  };
  const num = (name: string, v: unknown) => need(name, finite(v), 'a finite number', `the ${name} must be a finite number`, v);
  switch (d?.kind) {
    case 'uniform':
    case 'log-uniform':
      num('low', d.low);
      num('high', d.high);
      if (d.kind === 'log-uniform') need('low', d.low > 0, 'a value > 0', 'a log-uniform distribution needs a low value above 0', d.low);
      need('high', d.high > d.low, `above the low value (${d.low})`, `the low value (${d.low}) is not below the high value (${d.high})`, d.high);
      return;
    case 'triangular':
      num('low', d.low);
      num('mode', d.mode);
      num('high', d.high);
      need('high', d.high > d.low, `above the low value (${d.low})`, `the low value (${d.low}) is not below the high value (${d.high})`, d.high);
      need('mode', d.mode >= d.low && d.mode <= d.high, `in [${d.low}, ${d.high}]`, `the most likely value (${d.mode}) must lie between low and high`, d.mode);
      return;
    case 'normal':
      num('mean', d.mean);
      num('sd', d.sd);
      need('sd', d.sd > 0, 'a standard deviation > 0', `the standard deviation must be above 0 (got ${d.sd})`, d.sd);
      return;
    case 'lognormal':
      num('median', d.median);
      num('gsd', d.gsd);
      need('median', d.median > 0, 'a value > 0', 'a lognormal median must be above 0', d.median);
      need('gsd', d.gsd > 1, 'a geometric standard deviation > 1', `the geometric standard deviation must be above 1 (got ${d.gsd}; 1 would be a fixed value)`, d.gsd);
      return;
    case 'lognormal-range':
      num('low', d.low);
      num('high', d.high);
      num('percentile', d.percentile);
      need('low', d.low > 0, 'a value > 0', 'a lognormal range needs a low value above 0', d.low);
      need('high', d.high > d.low, `above the low value (${d.low})`, `the low value (${d.low}) is not below the high value (${d.high})`, d.high);
      need('percentile', d.percentile > 0 && d.percentile < 50, 'a percentile in (0, 50)', 'the low value is read as this percentile and the high value as 100 minus it; it must lie between 0 and 50', d.percentile);
      return;
    default:
      throw new ValidationError(`${field}.kind`, (d as { kind?: unknown })?.kind, 'uniform, log-uniform, triangular, normal, lognormal or lognormal-range', `${label}: unknown distribution`);
  }
}

/**
 * Validate a distribution against the input's physical range and build its sampler. Throws
 * ValidationError naming `field` (the input's path) and `label` (its name in words).
 */
export function makeSampler(field: string, label: string, d: Distribution, range: PhysicalRange): Sampler {
  checkParameters(field, label, d);
  const b = base(d);
  // a truncated continuous distribution never takes its truncation bound itself
  let lo = b.lo;
  let hi = b.hi;
  let loClosed = b.closed;
  let hiClosed = b.closed;
  const t = d.truncate ?? null;
  const ta = t?.low ?? null;
  const tb = t?.high ?? null;
  if (ta !== null && !finite(ta)) throw new ValidationError(`${field}.truncate.low`, ta, 'a finite number', `${label}: the lower truncation bound must be a finite number`);
  if (tb !== null && !finite(tb)) throw new ValidationError(`${field}.truncate.high`, tb, 'a finite number', `${label}: the upper truncation bound must be a finite number`);
  if (ta !== null && tb !== null && !(tb > ta))
    throw new ValidationError(`${field}.truncate.high`, tb, `above the lower bound (${ta})`, `${label}: the lower truncation bound (${ta}) is not below the upper one (${tb})`);
  if (ta !== null && ta >= lo) {
    lo = ta;
    loClosed = false;
  }
  if (tb !== null && tb <= hi) {
    hi = tb;
    hiClosed = false;
  }
  const Fa = ta === null ? 0 : b.cdf(ta);
  const Fb = tb === null ? 1 : b.cdf(tb);
  if (!(Fb - Fa > 1e-12) || !(hi > lo)) {
    // where the distribution lies (its 0.1st to 99.9th percentile), so the message names the range bounds must overlap
    const within = `${writtenBound(b.quantile(0.001))} to ${writtenBound(b.quantile(0.999))}`;
    throw new ValidationError(
      `${field}.truncate`,
      t,
      `bounds that overlap ${within}`,
      `${label}: the truncation bounds [${ta ?? '−∞'}, ${tb ?? '∞'}] leave (almost) none of the distribution, which lies from ${within} (0.1st to 99.9th percentile): set bounds that overlap that range`,
    );
  }

  // physical range: no probability outside it
  const below = lo < range.min || (lo === range.min && loClosed && range.minOpen);
  const above = hi > range.max || (hi === range.max && hiClosed && range.maxOpen);
  if (below || above) {
    const side = below ? 'below' : 'above';
    const edge = below ? range.min : range.max;
    const massOut = below ? Math.max(0, b.cdf(range.min) - Fa) / (Fb - Fa) : Math.max(0, Fb - b.cdf(range.max)) / (Fb - Fa);
    const share = massOut > 0 ? `${(100 * massOut).toPrecision(2)} % of its probability` : 'values';
    throw new ValidationError(
      field,
      d,
      `a distribution within the physical range (${rangeText(range)})`,
      `${label}: this ${d.kind} distribution puts ${share} ${side} ${edge}, outside the physical range (${rangeText(range)}); truncate it inside that range or choose a distribution that stays within it`,
    );
  }

  let sample: (u: number) => number;
  let cdf = (x: number) => (x <= lo ? 0 : x >= hi ? 1 : (b.cdf(x) - Fa) / (Fb - Fa));
  if (ta === null && tb === null) sample = b.quantile;
  else if (b.toZ && b.fromZ) {
    const za = ta === null ? -Infinity : b.toZ(ta);
    const zb = tb === null ? Infinity : b.toZ(tb);
    const fromZ = b.fromZ;
    if (za > 0) {
      // upper tail: survival probabilities keep their accuracy there
      const Sa = normalCdf(-za);
      const Sb = normalCdf(-zb);
      const toZ = b.toZ;
      sample = (u) => Math.min(hi, Math.max(lo, fromZ(-normalQuantile(Sa - u * (Sa - Sb)))));
      cdf = (x) => (x <= lo ? 0 : x >= hi ? 1 : (Sa - normalCdf(-toZ(x))) / (Sa - Sb));
    } else {
      const Pa = normalCdf(za);
      const Pb = normalCdf(zb);
      sample = (u) => Math.min(hi, Math.max(lo, fromZ(normalQuantile(Pa + u * (Pb - Pa)))));
    }
  } else {
    const q = b.quantile;
    sample = (u) => Math.min(hi, Math.max(lo, q(Fa + u * (Fb - Fa))));
  }
  return { sample, cdf, low: lo, high: hi, median: sample(0.5) };
}
