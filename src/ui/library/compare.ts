/**
 * Comparing two cases (typically a parent and its what-if variant): which inputs differ, and what
 * that does to each receptor's result. Pure: the component feeds it two cases and their results.
 *
 * Quantities are compared in internal units, so "10 m/d" and "0.000115740… m/s" are the same
 * input; bookkeeping fields (id, dates, parent link, notes) are not inputs and are left out.
 * Receptors are matched by id (a variant keeps its parent's receptor ids), then by name.
 */
import { formatDuration, formatSig, roundSig, screenNumber } from '../../case/numbers';
import type { Case, ReceptorKind } from '../../case/schema';
import { KIND_LABEL } from '../../case/receptorKinds';
import { CASE_FIELDS, choiceText, fieldLabel } from '../../case/fields';
import { UNITS } from '../../core/units';

export interface Difference {
  /** dotted path in the case, e.g. aquifer.hydraulicConductivity */
  path: string;
  label: string;
  a: string;
  b: string;
}

const SKIP = new Set(['format', 'version', 'id', 'name', 'created', 'modified', 'parentId', 'notes']);


type Q = { value: number; unit: string };

function isQuantity(v: unknown): v is Q {
  return !!v && typeof v === 'object' && typeof (v as Q).value === 'number' && typeof (v as Q).unit === 'string';
}

function internal(q: Q): number {
  const f = UNITS[q.unit]?.factor;
  return f === undefined ? NaN : q.value * f;
}

/** Equal to 12 significant digits (unit conversions are not exact in binary). */
function sameNumber(x: number, y: number): boolean {
  if (x === y) return true;
  return Math.abs(x - y) <= 1e-12 * Math.max(Math.abs(x), Math.abs(y));
}

/** "1 year", "2 years": time units named in words take the singular for exactly one. */
export function quantityText(value: number, unit: string): string {
  const label = UNITS[unit]?.label ?? unit;
  const n = roundSig(value, 6);
  const word = n === 1 && /^(years|days|hours)$/.test(label) ? label.slice(0, -1) : label;
  return `${formatSig(n, 6)} ${word}`;
}

/**
 * The pair to compare, in reading order: the base case first, its what-if second (so "now reaches
 * the limit" describes the what-if). With nothing chosen: the open case, after its base if it is
 * a what-if. A chosen pair given what-if first is turned round.
 */
export function comparePairOrder(
  list: readonly { id: string; parentId: string | null }[],
  chosen: [string | null, string | null],
  openId: string,
): [string | null, string | null] {
  const byId = new Map(list.map((x) => [x.id, x]));
  const [a, b] = chosen;
  let first = a && byId.has(a) ? a : null;
  let second = b && byId.has(b) && b !== first ? b : null;
  if (!first && !second) {
    const parent = byId.get(openId)?.parentId;
    if (parent && byId.has(parent)) [first, second] = [parent, openId];
    else first = byId.has(openId) ? openId : (list[0]?.id ?? null);
  }
  if (!first) first = list.find((x) => x.id !== second)?.id ?? null;
  if (!second) second = list.find((x) => x.id !== first)?.id ?? null;
  if (first && second && byId.get(first)?.parentId === second) [first, second] = [second, first];
  return [first, second];
}

export function show(v: unknown): string {
  if (v === null || v === undefined) return 'none';
  if (isQuantity(v)) return quantityText(v.value, v.unit);
  if (typeof v === 'number') return String(Number(v.toPrecision(6)));
  if (typeof v === 'boolean') return v ? 'yes' : 'no';
  if (typeof v === 'string') return v || '(empty)';
  if (Array.isArray(v)) {
    if (v.length === 2 && v.every((x) => typeof x === 'number')) return `${show(v[0])}, ${show(v[1])}`;
    return `${v.length} item${v.length === 1 ? '' : 's'}`;
  }
  return 'set';
}

/** What each top-level part of the case is called on screen, for inputs without a label of their own. */
const PART_WORDS: Record<string, string> = {
  site: 'Site',
  aquifer: 'Aquifer',
  contaminant: 'Contaminant',
  source: 'Source',
  evaluation: 'Results',
  uncertainty: 'How sure',
  observations: 'Measured',
};

/** "hydraulicConductivity" → "hydraulic conductivity" */
const words = (key: string) => key.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase();

/**
 * The input's name as the screen says it; an input without a label of its own (a newer optional
 * field) is named in words from its place in the case, never by its code.
 */
export function label(path: string): string {
  const known = CASE_FIELDS[path]?.label; // the input panels' labels (src/case/fields.ts)
  if (known) return known;
  const [part, ...rest] = path.split('.');
  const dist = /^uncertainty\.inputs\.(\w+)$/.exec(path);
  if (dist) return `How sure: distribution of ${words(dist[1])}`;
  const head = PART_WORDS[part] ?? words(part);
  return rest.length ? `${head}: ${rest.map(words).join(', ')}` : head;
}

function walk(a: unknown, b: unknown, path: string, out: Difference[]): void {
  if (isQuantity(a) && isQuantity(b)) {
    if (!sameNumber(internal(a), internal(b))) out.push({ path, label: label(path), a: show(a), b: show(b) });
    return;
  }
  if (typeof a === 'number' && typeof b === 'number') {
    if (!sameNumber(a, b)) out.push({ path, label: label(path), a: show(a), b: show(b) });
    return;
  }
  const objA = a !== null && typeof a === 'object' && !Array.isArray(a);
  const objB = b !== null && typeof b === 'object' && !Array.isArray(b);
  if (objA && objB && !isQuantity(a) && !isQuantity(b)) {
    const ra = a as Record<string, unknown>;
    const rb = b as Record<string, unknown>;
    // a mode switch (e.g. dispersivity estimate → given) is one difference, then the fields of each
    if ('mode' in ra && ra.mode !== rb.mode) out.push({ path: `${path}.mode`, label: label(`${path}.mode`), a: shownAt(`${path}.mode`, ra.mode), b: shownAt(`${path}.mode`, rb.mode) });
    if ('method' in ra && ra.method !== rb.method) out.push({ path: `${path}.method`, label: label(`${path}.method`), a: shownAt(`${path}.method`, ra.method), b: shownAt(`${path}.method`, rb.method) });
    for (const k of new Set([...Object.keys(ra), ...Object.keys(rb)])) {
      if ((k === 'mode' || k === 'method') && ra[k] !== rb[k]) continue;
      const p = path ? `${path}.${k}` : k;
      if (!path && SKIP.has(k)) continue;
      if (p === 'site.receptors') continue;
      walk(ra[k], rb[k], p, out);
    }
    return;
  }
  if (JSON.stringify(a) !== JSON.stringify(b)) out.push({ path, label: label(path), a: shownAt(path, a), b: shownAt(path, b) });
}

/** A value as the screen says it at this field: a choice in its words (fields.ts CHOICE_WORDS), a receptor kind in words. */
function shownAt(path: string, v: unknown): string {
  if (typeof v !== 'string') return show(v);
  if (path === 'kind') return KIND_LABEL[v as ReceptorKind] ?? v;
  return choiceText(path, v);
}

const RECEPTOR_FIELDS = ['kind', 'position', 'screenTop', 'screenBottom', 'pumping', 'pumpingRate'] as const;

/** The inputs that differ between two cases, in the order of the case file. */
export function inputDifferences(a: Case, b: Case): Difference[] {
  const out: Difference[] = [];
  walk(a, b, '', out);
  const ra = a.site.receptors;
  const rb = b.site.receptors;
  const matched = new Set<string>();
  for (const x of ra) {
    const y = rb.find((r) => r.id === x.id) ?? rb.find((r) => r.name === x.name && !matched.has(r.id));
    if (!y) {
      out.push({ path: `site.receptors.${x.id}`, label: `Receptor “${x.name}”`, a: 'present', b: 'absent' });
      continue;
    }
    matched.add(y.id);
    for (const k of RECEPTOR_FIELDS) {
      const inner: Difference[] = [];
      walk(x[k], y[k], k, inner);
      for (const d of inner) out.push({ ...d, path: `site.receptors.${x.id}.${k}`, label: fieldLabel(`site.receptors[0].${k}`, () => x.name) });
    }
    if (x.name !== y.name) out.push({ path: `site.receptors.${x.id}.name`, label: `Receptor name`, a: x.name, b: y.name });
  }
  for (const y of rb) {
    if (!matched.has(y.id)) out.push({ path: `site.receptors.${y.id}`, label: `Receptor “${y.name}”`, a: 'absent', b: 'present' });
  }
  return out;
}

export interface ReceptorOutcome {
  id: string;
  name: string;
  status: string;
  arrival: number | null;
  peak: { c: number; t: number };
  atHorizon: number;
}

export interface ReceptorChange {
  name: string;
  a: ReceptorOutcome | null;
  b: ReceptorOutcome | null;
  /** plain words: what the change does at this receptor */
  effect: string;
}

const years = (d: number) => formatDuration(d);

export function describeChange(a: ReceptorOutcome | null, b: ReceptorOutcome | null): string {
  if (!a) return 'only in the second case';
  if (!b) return 'only in the first case';
  const parts: string[] = [];
  if (a.arrival === null && b.arrival !== null) parts.push(`now reaches the limit, after ${years(b.arrival)}`);
  else if (a.arrival !== null && b.arrival === null) parts.push('no longer reaches the limit within the horizon');
  else if (a.arrival !== null && b.arrival !== null && !sameNumber(a.arrival, b.arrival)) {
    const dt = b.arrival - a.arrival;
    parts.push(`reaches the limit ${years(Math.abs(dt))} ${dt < 0 ? 'sooner' : 'later'}`);
  }
  if (a.peak.c > 0 && b.peak.c > 0 && !sameNumber(a.peak.c, b.peak.c)) {
    const r = b.peak.c / a.peak.c;
    parts.push(`peak ×${screenNumber(r, 'ratio')}`);
  } else if (a.peak.c === 0 && b.peak.c > 0) parts.push('peak rises from zero');
  else if (a.peak.c > 0 && b.peak.c === 0) parts.push('peak falls to zero');
  return parts.length ? parts.join('; ') : 'no change';
}

/** Each receptor's result in both cases (matched by id, then by name). */
export function receptorChanges(a: readonly ReceptorOutcome[], b: readonly ReceptorOutcome[]): ReceptorChange[] {
  const used = new Set<string>();
  const out: ReceptorChange[] = [];
  for (const x of a) {
    const y = b.find((r) => r.id === x.id && !used.has(r.id)) ?? b.find((r) => r.name === x.name && !used.has(r.id)) ?? null;
    if (y) used.add(y.id);
    out.push({ name: x.name, a: x, b: y, effect: describeChange(x, y) });
  }
  for (const y of b) if (!used.has(y.id)) out.push({ name: y.name, a: null, b: y, effect: describeChange(null, y) });
  return out;
}
