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

/** A finite number (throws otherwise). */
export function requireFinite(field: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new ValidationError(field, v, 'a finite number');
  return v;
}

export function requirePositive(field: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || !(v > 0)) throw new ValidationError(field, v, 'a finite number > 0');
  return v;
}

export function requireNonNegative(field: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || !(v >= 0)) throw new ValidationError(field, v, 'a finite number ≥ 0');
  return v;
}

/** A non-negative number or +Infinity (used for times where Infinity means steady state). */
export function requireTime(field: string, v: unknown): number {
  if (typeof v !== 'number' || Number.isNaN(v) || !(v >= 0)) throw new ValidationError(field, v, 'a number ≥ 0 (or Infinity for steady state)');
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
  if (typeof v !== 'number' || !Number.isFinite(v) || !(v >= 1)) throw new ValidationError(field, v, 'a finite number ≥ 1');
  return v;
}

export function optionalNonNegative(field: string, v: unknown, fallback = 0): number {
  if (v === undefined) return fallback;
  return requireNonNegative(field, v);
}
