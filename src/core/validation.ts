/**
 * Validation: impossible input throws ValidationError naming the field, the value and the accepted
 * range; doubtful input yields Warning objects in plain words. Nothing that passed validation may
 * produce NaN or Infinity downstream.
 */

export class ValidationError extends Error {
  readonly field: string;
  readonly value: unknown;
  readonly range: string;
  constructor(field: string, value: unknown, range: string, detail?: string) {
    super(`${field} = ${formatValue(value)} is not accepted: ${detail ?? `must be ${range}`}`);
    this.name = 'ValidationError';
    this.field = field;
    this.value = value;
    this.range = range;
  }
}

export interface Warning {
  /** stable machine code, e.g. 'domenico-large-dispersivity' */
  readonly code: string;
  /** plain-words message for the user */
  readonly message: string;
  readonly field?: string;
}

function formatValue(v: unknown): string {
  if (typeof v === 'number') return Number.isNaN(v) ? 'NaN' : String(v);
  if (v === undefined) return 'missing';
  try {
    return JSON.stringify(v) ?? String(v);
  } catch {
    return String(v);
  }
}

/**
 * The engine's working range: magnitudes up to 1e30 and, for non-zero values, down to 1e-30.
 * Every physically meaningful screening value lies far inside it (in m, d, mg/L), and within it
 * no intermediate product or quotient of the solutions can overflow or underflow into NaN.
 */
export const WORKING_MAX = 1e30;
export const WORKING_MIN = 1e-30;
const RANGE_NOTE = `(magnitude between ${WORKING_MIN} and ${WORKING_MAX}, or 0)`;

export function inWorkingRange(v: number): boolean {
  const a = Math.abs(v);
  return a === 0 || (a >= WORKING_MIN && a <= WORKING_MAX);
}

/** A finite number within the working range (throws otherwise). */
export function requireFinite(field: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || !inWorkingRange(v))
    throw new ValidationError(field, v, `a finite number ${RANGE_NOTE}`);
  return v;
}

/** requireFinite on every element of a list of numbers, the field named `name[j]` (built only for the one that fails). */
export function requireFiniteEach(name: string, values: ArrayLike<unknown>): void {
  for (let j = 0; j < values.length; j++) {
    const v = values[j];
    if (typeof v !== 'number' || !Number.isFinite(v) || !inWorkingRange(v)) requireFinite(`${name}[${j}]`, v);
  }
}

export function requirePositive(field: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || !(v > 0) || !inWorkingRange(v))
    throw new ValidationError(field, v, `a finite number > 0, between ${WORKING_MIN} and ${WORKING_MAX}`);
  return v;
}

export function requireNonNegative(field: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || !(v >= 0) || !inWorkingRange(v))
    throw new ValidationError(field, v, `a finite number ≥ 0 ${RANGE_NOTE}`);
  return v;
}

/** A non-negative number or +Infinity (used for times where Infinity means steady state). */
export function requireTime(field: string, v: unknown): number {
  if (v === Infinity) return v;
  if (typeof v !== 'number' || !Number.isFinite(v) || !(v >= 0) || !inWorkingRange(v))
    throw new ValidationError(field, v, `a number ≥ 0 ${RANGE_NOTE}, or Infinity for steady state`);
  return v;
}

export function requireInRange(field: string, v: unknown, lo: number, hi: number, loOpen = false, hiOpen = false): number {
  const ok =
    typeof v === 'number' &&
    Number.isFinite(v) &&
    (loOpen ? v > lo : v >= lo) &&
    (hiOpen ? v < hi : v <= hi);
  if (!ok) throw new ValidationError(field, v, `in ${loOpen ? '(' : '['}${lo}, ${hi}${hiOpen ? ')' : ']'}`);
  return v as number;
}

/** R ≥ 1 */
export function requireRetardation(field: string, v: unknown): number {
  if (v === undefined) return 1;
  if (typeof v !== 'number' || !Number.isFinite(v) || !(v >= 1) || v > WORKING_MAX)
    throw new ValidationError(field, v, `a finite number ≥ 1 and ≤ ${WORKING_MAX}`);
  return v;
}

export function optionalNonNegative(field: string, v: unknown, fallback = 0): number {
  if (v === undefined) return fallback;
  return requireNonNegative(field, v);
}
