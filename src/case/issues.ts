/**
 * Schema problems in plain words: each zod issue becomes one line that names the case field as the
 * screen labels it where the screen has it, with its place in the file (e.g. "Unit of screen top
 * below water table of receptor 3 (site.receptors[2].screenTop.unit)"), and what is accepted there.
 */
import type { z } from 'zod';
import { CASE_FIELDS, fieldLabel, fieldPattern } from './fields';

type Issue = z.core.$ZodIssue;
type PathKey = PropertyKey;

/** ['site', 'receptors', 2, 'screenTop'] → "site.receptors[2].screenTop" */
export function fieldPath(path: readonly PathKey[]): string {
  let out = '';
  for (const k of path) {
    if (typeof k === 'number') out += `[${k}]`;
    else out += (out ? '.' : '') + String(k);
  }
  return out || '(the whole file)';
}

/** The field as the screen labels it, with its place in the file; the place alone for a field the screen does not show. */
function named(path: readonly PathKey[]): string {
  const at = fieldPath(path);
  const shown = CASE_FIELDS[fieldPattern(at)] ?? (at.endsWith('.unit') ? CASE_FIELDS[fieldPattern(at.slice(0, -5))] : undefined);
  return shown ? `${fieldLabel(at)} (${at})` : at;
}

function show(v: unknown): string {
  if (typeof v === 'string') return JSON.stringify(v.length > 40 ? v.slice(0, 40) + '…' : v);
  if (v === undefined) return 'missing';
  if (v === null) return 'null';
  if (typeof v === 'number' || typeof v === 'boolean') return String(v);
  if (Array.isArray(v)) return 'a list';
  return 'an object';
}

const TYPE_WORDS: Record<string, string> = {
  number: 'a number',
  string: 'text',
  boolean: 'true or false',
  object: 'an object { … }',
  array: 'a list [ … ]',
  tuple: 'a list [ … ]',
  null: 'null',
};

function bound(issue: { origin?: string; inclusive?: boolean }, value: unknown, big: boolean): string {
  const n = String(value);
  switch (issue.origin) {
    case 'string':
      return big ? `at most ${n} characters` : `at least ${n} character${n === '1' ? '' : 's'}`;
    case 'array':
    case 'set':
      return big ? `at most ${n} items` : `at least ${n} item${n === '1' ? '' : 's'}`;
    default:
      return big ? (issue.inclusive === false ? `< ${n}` : `≤ ${n}`) : issue.inclusive === false ? `> ${n}` : `≥ ${n}`;
  }
}

function describe(issue: Issue, base: readonly PathKey[]): string[] {
  const path = [...base, ...issue.path];
  const at = named(path);
  const input = (issue as { input?: unknown }).input;
  switch (issue.code) {
    case 'invalid_type': {
      if (typeof input === 'number') return [`${at}: expected a finite number, got ${input} (a number too large to represent, or not a number)`];
      const want = TYPE_WORDS[issue.expected] ?? issue.expected;
      return input === undefined ? [`${at} is missing: expected ${want}`] : [`${at}: expected ${want}, got ${show(input)}`];
    }
    case 'invalid_value': {
      const vals = issue.values.map((v) => JSON.stringify(v));
      if (input === undefined) return [`${at} is missing; accepted ${vals.length === 1 ? 'value' : 'values'}: ${vals.join(', ')}`];
      return [`${at}: ${show(input)} is not accepted; accepted ${vals.length === 1 ? 'value' : 'values'}: ${vals.join(', ')}`];
    }
    case 'too_small':
      return [`${at}: ${show(input)} is too small; accepted: ${bound(issue, issue.minimum, false)}`];
    case 'too_big':
      return [`${at}: ${show(input)} is too large; accepted: ${bound(issue, issue.maximum, true)}`];
    case 'unrecognized_keys':
      return issue.keys.map((k) => `${fieldPath([...path, k])}: unknown field (check the spelling; unknown fields are not accepted)`);
    case 'invalid_union': {
      const u = issue as Issue & { discriminator?: string; options?: unknown[]; errors: Issue[][] };
      if (u.options) {
        const given = u.discriminator && input && typeof input === 'object' ? (input as Record<string, unknown>)[u.discriminator] : input;
        return [`${at}: ${show(given)} is not accepted; accepted values: ${u.options.map((o) => JSON.stringify(o)).join(', ')}`];
      }
      if (input === undefined) return [`${at} is missing`];
      if (!u.errors.length) return [`${at}: does not match any accepted form`];
      // report the branch that came closest (fewest problems)
      const closest = u.errors.reduce((a, b) => (b.length < a.length ? b : a));
      return [`${at}: does not match any accepted form; closest form needs:`, ...closest.flatMap((i) => describe(i, path)).map((s) => '  ' + s)];
    }
    case 'custom':
      return [`${at}: ${show(input)} ${issue.message}`];
    default:
      return [`${at}: ${issue.message}`];
  }
}

/** Plain-words lines for a zod error (first `max` issues; a final line says how many more). */
export function issueMessages(error: z.ZodError, max = 30): string[] {
  const lines = error.issues.slice(0, max).flatMap((i) => describe(i, []));
  if (error.issues.length > max) lines.push(`… and ${error.issues.length - max} more problems`);
  return lines;
}
