/**
 * Checked reading of case values, and errors named by the case field a user edits, in the screen's
 * words.
 *
 * A `Rule` is one accepted range: the case field it belongs to and its bounds in internal units
 * (m, d, mg/L, kg/L, L/kg; src/core/units.ts), both from the field catalogue (fields.ts). The same
 * rule checks a value read from the case file (`readQuantity`, `readFraction`: the message quotes
 * the value and the range in the unit the user wrote) and a value a caller substitutes in internal
 * units (`checkRule`, physics.ts `modelFor`), so each range is written once.
 *
 * Every refusal is a `CaseFieldError`: its `field` is the case field path (the screen matches it to
 * the input), its message names the field as the screen labels it, with the value as entered, its
 * unit and the accepted range: "Effective porosity nₑ −0.3 is not accepted: enter a value above 0
 * and below 1". `inCaseWords(error, case)` restates any other error of case preparation that way
 * (the engine's own quantities become the case field they come from, quoted as the user typed it).
 */
import { ValidationError } from '../core';
import { WORKING_MAX, WORKING_MIN } from '../core/validation';
import { roundSig } from './numbers';
import { UNITS, unitDef, unitsOf, type Dimension } from '../core/units';
import type { Case } from './schema';
import { INTERNAL_UNIT, acceptedWords, fieldInfo, fieldLabel, withinBounds, writtenNumber, type Bounds, type ItemNamer } from './fields';

export interface Rule {
  /** the case field path, e.g. 'aquifer.effectivePorosity' or 'site.receptors[2].screenTop' */
  readonly field: string;
  readonly bounds: Bounds;
  /** the dimension of the value's unit; null: a plain number */
  readonly dimension: Dimension | null;
  /** the test, on the value in internal units */
  readonly ok: (v: number) => boolean;
  /** the accepted range in words, in internal units */
  readonly range: string;
}

/** The rule of a case field from the catalogue (fields.ts); `b` replaces its bounds (a range that depends on another field). */
export function ruleFor(field: string, b?: Bounds): Rule {
  const info = fieldInfo(field);
  const bounds = b ?? info?.bounds;
  if (!bounds) throw new Error(`no accepted range is defined for ${field}`);
  const dimension = info?.dimension ?? null;
  return { field, bounds, dimension, ok: (v) => withinBounds(bounds, v), range: acceptedWords(bounds, dimension && INTERNAL_UNIT[dimension]) };
}

/** How a value is written in a message: 12 m/d, −0.3, [17.2, 52.4]. */
export function writtenValue(value: unknown, unit: string | null): string {
  const label = unit && unit !== '-' ? (UNITS[unit]?.label ?? unit) : '';
  // time units named in words take the singular for exactly one ("1 day")
  const u = label ? ` ${value === 1 && /^(years|days|hours)$/.test(label) ? label.slice(0, -1) : label}` : '';
  if (typeof value === 'number') return writtenNumber(value) + u;
  if (value === undefined) return '(missing)';
  if (value === null) return '(none)';
  if (Array.isArray(value)) return `[${value.map((x) => (typeof x === 'number' ? writtenNumber(x) : String(x))).join(', ')}]`;
  if (typeof value === 'object' && typeof (value as { value?: unknown }).value === 'number') {
    const q = value as { value: number; unit: string };
    return writtenValue(q.value, q.unit);
  }
  const s = typeof value === 'string' ? `“${value.length > 40 ? value.slice(0, 40) + '…' : value}”` : JSON.stringify(value);
  return s ?? String(value);
}

/**
 * A refused case value, in the screen's words. `unit`: the unit id the value is written in (null: a
 * plain number); `range`: the accepted range in words in that unit; `detail`: a reason that
 * replaces "enter a value <range>".
 */
export class CaseFieldError extends ValidationError {
  readonly unit: string | null;
  readonly detail: string | null;
  constructor(field: string, value: unknown, unit: string | null, range: string, detail: string | null = null, nameOf?: ItemNamer) {
    super(field, value, range, detail ?? undefined);
    this.name = 'ValidationError';
    this.unit = unit;
    this.detail = detail;
    const label = fieldLabel(field, nameOf);
    // a problem of a whole list or outline (value undefined) is said without a value
    this.message =
      value === undefined && detail ? `${label}: ${detail}` : `${label} ${writtenValue(value, unit)} is not accepted: ${detail ?? `enter a value ${range}`}`;
  }
  /** The same error with list items named from the case ('of “Farm well”' instead of 'of receptor 1'). */
  named(nameOf: ItemNamer): CaseFieldError {
    return new CaseFieldError(this.field, this.value, this.unit, this.range, this.detail, nameOf);
  }
}

/** A value in internal units against its rule (throws CaseFieldError on the rule's field). */
export function checkRule(r: Rule, v: number): number {
  if (typeof v !== 'number' || !r.ok(v)) {
    const unit = r.dimension && INTERNAL_UNIT[r.dimension];
    throw new CaseFieldError(r.field, v, unit, acceptedWords(r.bounds, unit, v));
  }
  return v;
}

type Quantity = { value: number; unit: string };

/** A case quantity {value, unit} converted to internal units and checked; `field` overrides the rule's (list elements). */
export function readQuantity(q: Quantity, r: Rule, field = r.field): number {
  if (!q || typeof q.value !== 'number' || !Number.isFinite(q.value))
    throw new CaseFieldError(field, q?.value, q?.unit ?? null, acceptedWords(r.bounds, q?.unit ?? null), 'enter a finite number');
  let def;
  try {
    def = unitDef(q.unit);
  } catch {
    const known = r.dimension ? unitsOf(r.dimension).map((u) => u.label).join(', ') : 'a known unit';
    throw new CaseFieldError(`${field}.unit`, q.unit, null, known, `it is not a unit the app knows; choose one of ${known}`);
  }
  const v = q.value * def.factor;
  if (!r.ok(v)) throw new CaseFieldError(field, q.value, q.unit, acceptedWords(r.bounds, q.unit, q.value));
  return v;
}

/** A plain number of the case (a fraction, an angle) checked against its rule. */
export const readFraction = (v: number, r: Rule): number => checkRule(r, v);

/** The reason of an error, without a ValidationError's own "<field> <value> is not accepted:" head. */
export function detailOf(e: unknown): string {
  if (e instanceof CaseFieldError) return e.detail ?? `enter a value ${e.range}`;
  if (e instanceof ValidationError) return e.message.replace(/^[\s\S]*? is not accepted: /, '');
  return e instanceof Error ? e.message : String(e);
}

/** Run a geo/core step; any error it throws becomes a CaseFieldError on the case field, with its reason. */
export function atField<T>(field: string, value: unknown, range: string, f: () => T): T {
  try {
    return f();
  } catch (e) {
    throw new CaseFieldError(field, value, null, range, detailOf(e));
  }
}

/** Engine field names → the case field a user edits, and what the engine's quantity is called. */
const MODEL_TO_CASE: Record<string, [field: string, words: string, unit: string | null]> = {
  v: ['aquifer.hydraulicConductivity', 'a seepage velocity', 'm/d'],
  hydraulicConductivity: ['aquifer.hydraulicConductivity', 'a conductivity', 'K:m/d'],
  effectivePorosity: ['aquifer.effectivePorosity', 'an effective porosity', null],
  ax: ['aquifer.dispersivity', 'a longitudinal dispersivity', 'm'],
  ay: ['aquifer.dispersivity', 'a transverse dispersivity', 'm'],
  az: ['aquifer.dispersivity', 'a vertical dispersivity', 'm'],
  diffusion: ['aquifer.diffusion', 'an effective diffusion coefficient', 'm2/d'],
  R: ['contaminant.sorption', 'a retardation factor', null],
  kd: ['contaminant.sorption', 'a distribution coefficient Kd', 'L/kg'],
  decay: ['contaminant.halfLife', 'a decay rate', '1/d'],
  width: ['site.source.width', 'a source width', 'm'],
  thickness: ['source.thickness', 'a source thickness', 'm'],
  c0: ['source.concentration', 'a source concentration', 'mg/L'],
  sourceDecay: ['source.sourceHalfLife', 'a source decline rate', '1/d'],
  duration: ['source.duration', 'a release duration', 'd'],
  limit: ['contaminant.limit', 'a limit', 'mg/L'],
  horizon: ['evaluation.horizon', 'a horizon', 'd'],
  t: ['evaluation.viewTime', 'a time', 'd'],
};

/** The case field of an engine field name ('receptors[2].x' → 'site.receptors[2].x'). */
export function caseFieldOf(field: string | undefined): string | undefined {
  if (field === undefined) return undefined;
  const rec = /^receptors?\[(\d+)\](.*)$/.exec(field);
  if (rec) return `site.receptors[${rec[1]}]${rec[2]}`;
  return MODEL_TO_CASE[field]?.[0] ?? field;
}

/** An engine ValidationError restated on the case field it comes from. */
export function atCaseField(err: ValidationError): ValidationError {
  if (err instanceof CaseFieldError) return err;
  const engine = MODEL_TO_CASE[err.field];
  const field = caseFieldOf(err.field) ?? err.field;
  const detail = engine
    ? `it gives ${engine[1]} of ${writtenValue(typeof err.value === 'number' ? roundSig(err.value, 4) : err.value, engine[2])}, outside the range the calculation works in (0, or magnitudes from ${writtenNumber(WORKING_MIN)} to ${writtenNumber(WORKING_MAX)}${engine[2] ? ' ' + (UNITS[engine[2]]?.label ?? '') : ''})`
    : detailOf(err);
  return new CaseFieldError(field, err.value, null, err.range, detail);
}

/** The value a case holds at a field path ('site.receptors[0].screenTop' → its quantity), or undefined. */
export function valueAt(c: unknown, path: string): unknown {
  let at: unknown = c;
  for (const key of path.replace(/\[(\d+)\]/g, '.$1').split('.')) {
    if (at === null || typeof at !== 'object') return undefined;
    at = (at as Record<string, unknown>)[key];
  }
  return at;
}

function quantityAt(c: Case, path: string): Quantity | null {
  const v = valueAt(c, path);
  return v && typeof v === 'object' && typeof (v as Quantity).value === 'number' && typeof (v as Quantity).unit === 'string' ? (v as Quantity) : null;
}

/** Names of the case's list items, for messages. */
export function itemNamer(c: Case): ItemNamer {
  return (list, i) => {
    const item = valueAt(c, `${list}[${i}]`);
    const name = item && typeof item === 'object' ? (item as { name?: unknown }).name : undefined;
    return typeof name === 'string' && name.trim() ? name.trim() : undefined;
  };
}

/**
 * Any error of preparing or screening `c`, restated in the screen's words on the case field:
 * named list items, and the value the user entered at that field (an engine quantity derived from
 * it is said in the reason). Other errors pass through unchanged.
 */
export function inCaseWords(e: unknown, c: Case): unknown {
  if (!(e instanceof ValidationError)) return e;
  const nameOf = itemNamer(c);
  if (e instanceof CaseFieldError) {
    // a value quoted without its unit: the unit it was entered in
    const q = e.unit === null ? quantityAt(c, e.field) : null;
    if (q && q.value === e.value) return new CaseFieldError(e.field, e.value, q.unit, e.range, e.detail, nameOf);
    // an engine's point ({x, y} in the flow frame): quote the position as the case holds it
    const entered = valueAt(c, e.field);
    if (Array.isArray(entered) && e.value !== null && typeof e.value === 'object' && !Array.isArray(e.value))
      return new CaseFieldError(e.field, entered, null, e.range, e.detail, nameOf);
    return e.named(nameOf);
  }
  const restated = atCaseField(e) as CaseFieldError;
  let field = restated.field;
  if (field === 'contaminant.sorption') field = `contaminant.sorption.${c.contaminant.sorption.mode}`;
  const entered = valueAt(c, field);
  const q = quantityAt(c, field);
  const value = q ? q.value : entered !== undefined ? entered : e.value;
  return new CaseFieldError(field, value, q ? q.unit : null, e.range, restated.detail, nameOf);
}

/** Run a step of preparing `c`; its errors come out in the screen's words (`inCaseWords`). */
export function inWordsOf<T>(c: Case, f: () => T): T {
  try {
    return f();
  } catch (e) {
    throw inCaseWords(e, c);
  }
}
