/**
 * Reading and writing case files. `parseCaseFile` never throws: it returns the case or a list of
 * plain-words problems (size, JSON syntax, format, version, schema fields, hostile content).
 * `serializeCase` writes pretty JSON with the keys in the schema's order, so an exported file
 * reads the same way every time and re-imports to an identical case.
 */
import { caseSchema, type Case } from './schema';
import { CaseFormatError, migrateCase } from './migrate';

export const DEFAULT_MAX_BYTES = 2 * 1024 * 1024;
/** deepest nesting of objects and lists accepted (a valid case nests 6 deep) */
export const MAX_DEPTH = 16;
/** longest single string (as written, escapes included) accepted before the schema checks its
 * own per-field limits (notes: 20 000 characters) */
export const MAX_STRING = 100_000;
/** keys that could reach an object's prototype when data is later merged or spread */
const FORBIDDEN_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

export type ParseResult = { ok: true; case: Case } | { ok: false; errors: string[] };

export interface ParseOptions {
  maxBytes?: number;
}

/** UTF-8 byte length without TextEncoder (not in the pure core's lib). */
export function utf8Length(text: string): number {
  let n = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c < 0x80) n += 1;
    else if (c < 0x800) n += 2;
    else if (c >= 0xd800 && c <= 0xdbff && i + 1 < text.length) {
      n += 4;
      i++;
    } else n += 3;
  }
  return n;
}

function formatBytes(n: number): string {
  return n >= 1024 * 1024 ? `${(n / 1024 / 1024).toFixed(1)} MB` : n >= 1024 ? `${(n / 1024).toFixed(1)} kB` : `${n} bytes`;
}

/** Scans the raw text for nesting depth and string length before JSON.parse sees it, so that a
 * hostile file cannot exhaust the stack or memory. Returns a problem or null. */
function scanStructure(text: string): string | null {
  let depth = 0;
  let inString = false;
  let start = 0;
  for (let i = 0; i < text.length; i++) {
    const ch = text.charCodeAt(i);
    if (inString) {
      if (ch === 0x5c) i++; // backslash: skip the escaped character
      else if (ch === 0x22) {
        inString = false;
        // raw length between the quotes (an escape sequence counts as its written characters)
        if (i - start - 1 > MAX_STRING) return `a text value of ${i - start - 1} characters is longer than the ${MAX_STRING} accepted`;
      }
    } else if (ch === 0x22) {
      inString = true;
      start = i;
    } else if (ch === 0x7b || ch === 0x5b) {
      if (++depth > MAX_DEPTH) return `the file nests objects or lists more than ${MAX_DEPTH} levels deep; a case file needs far fewer`;
    } else if (ch === 0x7d || ch === 0x5d) depth--;
  }
  return null;
}

/** Keys that must never appear anywhere (prototype pollution), with their paths. */
function forbiddenKeys(value: unknown, path: string, out: string[]): void {
  if (out.length >= 10 || typeof value !== 'object' || value === null) return;
  if (Array.isArray(value)) {
    value.forEach((v, i) => forbiddenKeys(v, `${path}[${i}]`, out));
    return;
  }
  for (const k of Object.keys(value)) {
    const p = path ? `${path}.${k}` : k;
    if (FORBIDDEN_KEYS.has(k)) out.push(`${p}: the key "${k}" is not accepted in a case file (it could alter program objects)`);
    else forbiddenKeys((value as Record<string, unknown>)[k], p, out);
  }
}

/** A short, printable excerpt of the text at `at`. */
function excerpt(text: string, at: number): string {
  const s = text.slice(at, at + 24).replace(/\s+/g, ' ').trim();
  return s.length ? `“${s}”` : 'nothing';
}

/**
 * Why text that JSON.parse refused is not a case file, in the screen's words: a file of another
 * kind, a case file cut short, or one damaged at a line and column (the parser's own wording differs
 * between browsers and is not shown).
 */
export function notJson(text: string, parserMessage: string): string {
  const first = text.search(/\S/);
  if (first >= 0 && text[first] !== '{')
    return `this is not a case file: a case file is JSON text that begins with “{”, and this file begins with ${excerpt(text.slice(first), 0)}. Was another file chosen?`;
  const pos = /position (\d+)/.exec(parserMessage);
  const atEnd = pos ? Number(pos[1]) >= text.trimEnd().length : /Unexpected end/i.test(parserMessage);
  if (atEnd) return 'the case file is cut short or damaged: its text ends before the case is complete. Was it copied or downloaded completely?';
  if (!pos) return 'the case file is damaged: its text does not follow the JSON form a case file is written in. Was it edited by hand?';
  const at = Number(pos[1]);
  const before = text.slice(0, at);
  const line = before.split('\n').length;
  const column = at - before.lastIndexOf('\n');
  return `the case file is damaged at line ${line}, column ${column} (near ${excerpt(text, at)}): from there it no longer follows the JSON form a case file is written in. Was it edited by hand?`;
}

export function parseCaseFile(text: string, options: ParseOptions = {}): ParseResult {
  const maxBytes = options.maxBytes ?? DEFAULT_MAX_BYTES;
  if (typeof text !== 'string') return { ok: false, errors: ['the file could not be read as text'] };
  if (text.length > maxBytes || utf8Length(text) > maxBytes) {
    return {
      ok: false,
      errors: [`the file is ${formatBytes(utf8Length(text))}, larger than the ${formatBytes(maxBytes)} accepted for a case file`],
    };
  }
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text; // tolerate a byte-order mark
  if (!body.trim()) return { ok: false, errors: ['the file is empty'] };
  const structural = scanStructure(body);
  if (structural) return { ok: false, errors: [structural] };
  let raw: unknown;
  try {
    raw = JSON.parse(body);
  } catch (e) {
    return { ok: false, errors: [notJson(body, e instanceof Error ? e.message : String(e))] };
  }
  const bad: string[] = [];
  forbiddenKeys(raw, '', bad);
  if (bad.length) return { ok: false, errors: bad };
  try {
    return { ok: true, case: migrateCase(raw) };
  } catch (e) {
    if (e instanceof CaseFormatError) return { ok: false, errors: [...e.errors] };
    return { ok: false, errors: [`the case could not be read: ${e instanceof Error ? e.message : String(e)}`] };
  }
}

/**
 * Pretty JSON (2-space indent, trailing newline) with keys in the schema's order: zod's object
 * parse emits the shape's keys in declaration order. A case that no longer passes the schema is
 * still written out, as it is, so nothing is lost; it will report its problems on import.
 */
export function serializeCase(c: Case): string {
  const r = caseSchema.safeParse(c);
  return JSON.stringify(r.success ? r.data : c, null, 2) + '\n';
}
