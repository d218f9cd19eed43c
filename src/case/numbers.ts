/**
 * One rule for how each kind of quantity is written, on screen and in exported files.
 *
 * Results come out of floating-point arithmetic: a receptor on the centreline sits 3.55e-15 m
 * off it, a distance converted back and forth reads 149.99999999999994. Each kind has
 *  - a resolution (internal units) below which a value is zero within round-off and is written 0;
 *  - significant digits on screen (enough to read, not more than the inputs carry);
 *  - significant digits in exported files (10: far finer than any input, coarse enough to drop
 *    the last-bit noise of double arithmetic, whose relative error here is ~1e-15).
 * The resolutions are common practice for screening, far below anything measured in the field.
 */
export type NumberKind =
  /** positions, distances, lengths, m */
  | 'length'
  /** times, d */
  | 'time'
  /** concentrations, mg/L */
  | 'concentration'
  /** velocities and conductivities, m/d */
  | 'velocity'
  /** ratios, gradients, porosities, factors (dimensionless) */
  | 'ratio'
  /** map directions, degrees */
  | 'angle';

interface Rule {
  /** |v| below this (internal units) is zero within round-off */
  readonly zeroBelow: number;
  readonly screenDigits: number;
  readonly fileDigits: number;
}

export const NUMBER_RULES: Readonly<Record<NumberKind, Rule>> = {
  length: { zeroBelow: 1e-6, screenDigits: 4, fileDigits: 10 }, // 1 µm
  time: { zeroBelow: 1e-6, screenDigits: 3, fileDigits: 10 }, // 0.09 s
  concentration: { zeroBelow: 1e-12, screenDigits: 3, fileDigits: 10 }, // 1 pg/L
  velocity: { zeroBelow: 1e-15, screenDigits: 3, fileDigits: 10 },
  ratio: { zeroBelow: 1e-12, screenDigits: 3, fileDigits: 10 },
  angle: { zeroBelow: 1e-9, screenDigits: 4, fileDigits: 10 },
};

/**
 * Significant digits of an input value shown in a unit other than the one it was typed in (a K
 * typed as 40 m/d reads 131.2 ft/d in a US customary case, not 131.234): enough to read and to
 * retype, as the other screen figures. The stored value keeps every digit as typed.
 */
export const CONVERTED_DIGITS = 4;

/** v rounded to `digits` significant digits (a finite number stays finite; -0 becomes 0). */
export function roundSig(v: number, digits: number): number {
  if (!Number.isFinite(v) || v === 0) return v === 0 ? 0 : v;
  return Number(v.toPrecision(digits)) + 0;
}

/** Zero within round-off for its kind? (`v` in internal units) */
export function isRoundOffZero(v: number, kind: NumberKind): boolean {
  return Math.abs(v) < NUMBER_RULES[kind].zeroBelow;
}

/**
 * A value of `kind`, in internal units `internal`, as the number a file carries: 0 within round-off,
 * else 10 significant digits. `shown` is the value in the unit written (default: internal).
 */
export function fileNumber(internal: number, kind: NumberKind, shown = internal): number {
  if (!Number.isFinite(shown)) return shown;
  return isRoundOffZero(internal, kind) ? 0 : roundSig(shown, NUMBER_RULES[kind].fileDigits);
}

/** Up to `digits` significant digits, no trailing zeros, plain notation where it reads well. */
export function formatSig(v: number, digits = 4): string {
  if (!Number.isFinite(v)) return String(v);
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e-3 && a < 1e6) return String(roundSig(v, digits));
  return v.toExponential(digits - 1).replace(/\.?0+e/, 'e');
}

/**
 * A value of `kind` for the screen: `internal` decides zero within round-off; `shown` (the value
 * in the display unit, default: internal) is written with the kind's significant digits.
 */
export function screenNumber(internal: number, kind: NumberKind, shown = internal, digits = NUMBER_RULES[kind].screenDigits): string {
  if (Number.isFinite(internal) && isRoundOffZero(internal, kind)) return '0';
  return formatSig(shown, digits);
}

const YEAR_D = 365.25;

export type TimeUnit = 'd' | 'yr';

/**
 * The one time unit of a screen (its table, charts, summaries and the printed report): years when
 * the horizon is longer than two (Julian) years, days otherwise, so "102 d" never stands beside
 * "0.279 years".
 */
export function timeUnitFor(horizonDays: number): TimeUnit {
  return horizonDays > 2 * YEAR_D ? 'yr' : 'd';
}

/**
 * A time span in days as read on screen: in `unit` when given (the screen's unit, timeUnitFor);
 * otherwise days below a (Julian) year and years above.
 */
export function formatDuration(d: number, digits?: number, unit?: TimeUnit): string {
  if (d === Infinity) return 'steady state';
  const u = unit ?? (Math.abs(d) < YEAR_D ? 'd' : 'yr');
  if (u === 'd') return `${screenNumber(d, 'time', d, digits)} d`;
  return `${screenNumber(d, 'time', d / YEAR_D, digits)} yr`;
}

const pad2 = (n: number) => String(n).padStart(2, '0');

/**
 * A moment as the report and exports write it, in the device's local time: 'YYYY-MM-DD HH:MM'
 * (ISO 8601's order, as the monitoring dates 'YYYY-MM-DD' are written), one format throughout.
 */
export function dateTimeText(t: Date | string | number): string {
  const d = new Date(t);
  if (!Number.isFinite(d.getTime())) return String(t);
  return `${d.getFullYear()}-${pad2(d.getMonth() + 1)}-${pad2(d.getDate())} ${pad2(d.getHours())}:${pad2(d.getMinutes())}`;
}
