/**
 * Checked reading of case values, and errors named by the case field a user edits.
 *
 * A `Rule` is one accepted range: the case field it belongs to, the test on the value in internal
 * units (m, d, mg/L, kg/L, L/kg; src/core/units.ts) and the range in words. The same rule checks a
 * value read from the case file (`readQuantity`, `readFraction`: the message quotes the value as the
 * user wrote it) and a value a caller substitutes in internal units (`checkRule`, physics.ts
 * `modelFor`), so each range is written once.
 */
import { ValidationError } from '../core';
import { unitDef } from '../core/units';

export interface Rule {
  /** the case field path, e.g. 'aquifer.effectivePorosity' */
  readonly field: string;
  /** the test, on the value in internal units */
  readonly ok: (v: number) => boolean;
  /** the accepted range, in words (shown to the user) */
  readonly range: string;
}

export const positive = (v: number): boolean => Number.isFinite(v) && v > 0;
export const nonNegative = (v: number): boolean => Number.isFinite(v) && v >= 0;

export function rule(field: string, ok: (v: number) => boolean, range: string): Rule {
  return { field, ok, range };
}

/** A fraction in an interval, open or closed at each end: (0, 1), [0, 1], (0, 1]. */
export function fractionRule(field: string, lo: number, hi: number, loOpen: boolean, hiOpen: boolean): Rule {
  return {
    field,
    ok: (v) => typeof v === 'number' && Number.isFinite(v) && (loOpen ? v > lo : v >= lo) && (hiOpen ? v < hi : v <= hi),
    range: `in ${loOpen ? '(' : '['}${lo}, ${hi}${hiOpen ? ')' : ']'}`,
  };
}

/** A value in internal units against its rule (throws ValidationError on the rule's field). */
export function checkRule(r: Rule, v: number): number {
  if (typeof v !== 'number' || !r.ok(v)) throw new ValidationError(r.field, v, r.range);
  return v;
}

type Quantity = { value: number; unit: string };

/** A case quantity {value, unit} converted to internal units and checked; `field` overrides the rule's (list elements). */
export function readQuantity(q: Quantity, r: Rule, field = r.field): number {
  if (!q || typeof q.value !== 'number' || !Number.isFinite(q.value)) throw new ValidationError(field, q?.value, r.range);
  let def;
  try {
    def = unitDef(q.unit);
  } catch {
    throw new ValidationError(`${field}.unit`, q.unit, 'a known unit');
  }
  const v = q.value * def.factor;
  // every range given here is either unit-free (> 0, ≥ 0) or states its own unit
  if (!r.ok(v)) throw new ValidationError(field, q.value, r.range);
  return v;
}

/** A plain number of the case (a fraction, an angle) checked against its rule. */
export const readFraction = (v: number, r: Rule): number => checkRule(r, v);

/** The reason of an error, without a core ValidationError's own "field = value is not accepted:" head. */
export function detailOf(e: unknown): string {
  if (e instanceof ValidationError) return e.message.replace(/^[\s\S]*? is not accepted: /, '');
  return e instanceof Error ? e.message : String(e);
}

/** Run a geo/core step; any error it throws becomes a ValidationError on the case field. */
export function atField<T>(field: string, value: unknown, range: string, f: () => T): T {
  try {
    return f();
  } catch (e) {
    throw new ValidationError(field, value, range, detailOf(e));
  }
}

/** Engine field names → the case field a user edits. */
const MODEL_TO_CASE: Record<string, string> = {
  v: 'aquifer.hydraulicConductivity',
  ax: 'aquifer.dispersivity',
  ay: 'aquifer.dispersivity',
  az: 'aquifer.dispersivity',
  diffusion: 'aquifer.diffusion',
  R: 'contaminant.sorption',
  decay: 'contaminant.halfLife',
  width: 'site.source.width',
  thickness: 'source.thickness',
  c0: 'source.concentration',
  sourceDecay: 'source.sourceHalfLife',
  duration: 'source.duration',
  limit: 'contaminant.limit',
  horizon: 'evaluation.horizon',
};

/** The case field of an engine field name ('receptors[2].x' → 'site.receptors[2].x'). */
export function caseFieldOf(field: string | undefined): string | undefined {
  if (field === undefined) return undefined;
  const rec = /^receptors?\[(\d+)\](.*)$/.exec(field);
  if (rec) return `site.receptors[${rec[1]}]${rec[2]}`;
  return MODEL_TO_CASE[field] ?? field;
}

/** An engine ValidationError restated on the case field it comes from. */
export function atCaseField(err: ValidationError): ValidationError {
  return new ValidationError(caseFieldOf(err.field) ?? err.field, err.value, err.range, detailOf(err));
}
