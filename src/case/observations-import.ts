/**
 * Importing sampling results from a laboratory's or consultant's table (CSV, RFC 4180).
 *
 * Three pure steps, so that nothing is stored half-imported:
 * 1. `readObservationTable`: size, emptiness, delimiter and quoting; a file-level problem stops here.
 * 2. `importObservations` with a column mapping (`guessMapping` proposes one from the header names;
 *    the user confirms or changes it): every row is checked — well, date, analyte, value (a number,
 *    "< limit", or a non-detect word with a reporting-limit column), unit — and each bad row becomes
 *    a problem naming its line, while the good rows are kept.
 * 3. `applyImport`: the good rows and any new wells join the case's monitoring data in one step,
 *    only when the user accepts; until then the case is unchanged.
 *
 * Dates: YYYY-MM-DD (also with / or . and an optional time), D.M.YYYY (always day first),
 * D/M/YYYY or M/D/YYYY (the order is taken from the file — a first number above 12 means day
 * first — or asked for when every date is ambiguous), and 12 Mar 2021, 12-Mar-2021, Mar 12 2021.
 * Two-digit years are refused (the century is a guess). Units: mg/L, µg/L (ug/L), g/L, ng/L (stored
 * as µg/L), mg/m³ (= µg/L), and ppm, ppb (taken as mg/L and µg/L, for dilute water at 1 kg/L:
 * common practice), in any letter case.
 */
import { UNITS } from '../core/units';
import { CsvError, delimiterCounts, delimiterName, detectDelimiter, readCsv, type CsvRecord, type Delimiter } from './csv-read';
import { dayNumber, isoFromDay, MAX_RESULTS, type Monitoring, type MonitoringWell, type SamplingResult } from './monitoring';

export const MAX_IMPORT_BYTES = 5 * 1024 * 1024;

export const COLUMN_ROLES = ['well', 'date', 'analyte', 'value', 'unit', 'qualifier', 'limit', 'x', 'y', 'screenTop', 'screenBottom'] as const;
export type ColumnRole = (typeof COLUMN_ROLES)[number];
export type ColumnMapping = Record<ColumnRole, number | null>;

export const ROLE_LABELS: Record<ColumnRole, string> = {
  well: 'monitoring well',
  date: 'sampling date',
  analyte: 'analyte',
  value: 'result',
  unit: 'unit',
  qualifier: 'qualifier (<, U, ND)',
  limit: 'reporting limit',
  x: 'easting or longitude',
  y: 'northing or latitude',
  screenTop: 'screen top (m below water table)',
  screenBottom: 'screen bottom (m below water table)',
};

/** Header words that suggest each role (lower case, compared after removing punctuation). */
const ROLE_WORDS: Record<ColumnRole, string[]> = {
  well: ['well', 'monitoringwell', 'wellid', 'wellname', 'location', 'locationid', 'locid', 'station', 'samplepoint', 'samplinglocation', 'borehole', 'point', 'mw'],
  date: ['date', 'sampledate', 'samplingdate', 'datesampled', 'sampled', 'collectiondate', 'datetime', 'sampledatetime'],
  analyte: ['analyte', 'parameter', 'compound', 'chemical', 'chemicalname', 'determinand', 'substance', 'contaminant', 'analytename', 'param'],
  value: ['value', 'result', 'resultvalue', 'concentration', 'conc', 'measuredvalue', 'reading'],
  unit: ['unit', 'units', 'resultunit', 'resultunits', 'uom'],
  qualifier: ['qualifier', 'qual', 'flag', 'labqualifier', 'resultqualifier', 'detect', 'detectflag', 'detected', 'prefix'],
  limit: ['reportinglimit', 'rl', 'mdl', 'dl', 'detectionlimit', 'lor', 'loq', 'pql', 'limitofreporting', 'mrl'],
  x: ['x', 'easting', 'east', 'longitude', 'lon', 'long'],
  y: ['y', 'northing', 'north', 'latitude', 'lat'],
  screenTop: ['screentop', 'topofscreen', 'screenfrom'],
  screenBottom: ['screenbottom', 'bottomofscreen', 'screento', 'screenbase'],
};

const squash = (s: string) => s.toLowerCase().replace(/\(.*?\)|\[.*?\]/g, '').replace(/[^a-z0-9]/g, '');

/** Proposes a mapping from the header names; each column serves one role at most. */
export function guessMapping(header: readonly string[]): ColumnMapping {
  const mapping = Object.fromEntries(COLUMN_ROLES.map((r) => [r, null])) as ColumnMapping;
  const used = new Set<number>();
  for (const role of COLUMN_ROLES) {
    const words = ROLE_WORDS[role];
    const exact = header.findIndex((h, i) => !used.has(i) && words.includes(squash(h)));
    const idx = exact >= 0 ? exact : header.findIndex((h, i) => !used.has(i) && role !== 'x' && role !== 'y' && words.some((w) => w.length > 3 && squash(h).includes(w)));
    if (idx >= 0) {
      mapping[role] = idx;
      used.add(idx);
    }
  }
  return mapping;
}

export interface ObservationTable {
  readonly header: string[];
  readonly rows: CsvRecord[];
  readonly delimiter: Delimiter;
}

export type TableResult = { ok: true; table: ObservationTable } | { ok: false; problem: string };

export interface ReadOptions {
  /** 'auto' (default): the most frequent of , ; tab | on the header line */
  delimiter?: 'auto' | Delimiter;
  maxBytes?: number;
}

function formatBytes(n: number): string {
  return n >= 1024 * 1024 ? `${(n / 1024 / 1024).toFixed(1)} MB` : n >= 1024 ? `${(n / 1024).toFixed(1)} kB` : `${n} bytes`;
}

/** Step 1: the table's shape. Never throws. */
export function readObservationTable(text: string, options: ReadOptions = {}): TableResult {
  const maxBytes = options.maxBytes ?? MAX_IMPORT_BYTES;
  if (typeof text !== 'string') return { ok: false, problem: 'the file could not be read as text' };
  if (text.length > maxBytes)
    return {
      ok: false,
      problem: `the file is ${formatBytes(text.length)}, larger than the ${formatBytes(maxBytes)} accepted for one import (about ${Math.round(maxBytes / 80 / 1000)} thousand results); split it into smaller files`,
    };
  if (!text.replace(/^\ufeff/, '').trim()) return { ok: false, problem: 'the file is empty' };
  const counts = delimiterCounts(text);
  let delimiter: Delimiter;
  if (!options.delimiter || options.delimiter === 'auto') {
    const d = detectDelimiter(text);
    if (!d) return { ok: false, problem: 'line 1: the header has a single column; separate the columns by commas, semicolons or tabs' };
    delimiter = d;
  } else {
    delimiter = options.delimiter;
    if (counts[delimiter] === 0) {
      const other = detectDelimiter(text);
      return {
        ok: false,
        problem: `line 1: no ${delimiterName(delimiter)} between the column names${other ? `; the file seems to use the ${delimiterName(other)} — choose that delimiter` : ''}`,
      };
    }
  }
  let records: CsvRecord[];
  try {
    records = readCsv(text, delimiter);
  } catch (e) {
    return { ok: false, problem: e instanceof CsvError ? e.message : String(e) };
  }
  if (records.length === 0) return { ok: false, problem: 'the file is empty' };
  const header = records[0].fields.map((h) => h.trim());
  if (records.length === 1) return { ok: false, problem: `line ${records[0].line}: the header has no rows of results under it` };
  return { ok: true, table: { header, rows: records.slice(1), delimiter } };
}

// ------------------------------------------------------------------------------------------------
// Cell readers

const MONTHS = ['jan', 'feb', 'mar', 'apr', 'may', 'jun', 'jul', 'aug', 'sep', 'oct', 'nov', 'dec'];

export type DateOrder = 'auto' | 'dmy' | 'mdy';

function ymd(y: number, m: number, d: number): number | null {
  if (!(m >= 1 && m <= 12 && d >= 1 && d <= 31)) return null;
  return dayNumber(`${String(y).padStart(4, '0')}-${String(m).padStart(2, '0')}-${String(d).padStart(2, '0')}`);
}

const TIME = String.raw`(?:[T ]\d{1,2}:\d{2}(?::\d{2}(?:\.\d+)?)?(?:Z|[+-]\d{2}:?\d{2})?)?`;
const RE_ISO = new RegExp(String.raw`^(\d{4})[-/.](\d{1,2})[-/.](\d{1,2})${TIME}$`);
const RE_DOTS = new RegExp(String.raw`^(\d{1,2})\.(\d{1,2})\.(\d{2,4})${TIME}$`);
const RE_SLASH = new RegExp(String.raw`^(\d{1,2})[/-](\d{1,2})[/-](\d{2,4})${TIME}$`);
const RE_DMONY = new RegExp(String.raw`^(\d{1,2})[ -]([A-Za-z]{3,9})\.?[ ,-]+(\d{2,4})${TIME}$`);
const RE_MONDY = new RegExp(String.raw`^([A-Za-z]{3,9})\.?[ -](\d{1,2}),?[ ](\d{2,4})${TIME}$`);

function monthOf(name: string): number {
  const i = MONTHS.indexOf(name.slice(0, 3).toLowerCase());
  return i < 0 ? 0 : i + 1;
}

/** Slash dates whose order the file itself reveals: 'dmy', 'mdy' or null (every one ambiguous). */
export function slashDateOrder(cells: readonly string[]): 'dmy' | 'mdy' | null {
  for (const c of cells) {
    const m = RE_SLASH.exec(c.trim());
    if (!m) continue;
    if (+m[1] > 12) return 'dmy';
    if (+m[2] > 12) return 'mdy';
  }
  return null;
}

/** A day number, or the problem in words. */
export function parseDate(cell: string, order: 'dmy' | 'mdy' | null): number | string {
  const s = cell.trim();
  if (!s) return 'the date is empty';
  const year = (y: string): number | string => (y.length === 4 ? +y : `the year "${y}" has two digits; write it with four`);
  let m = RE_ISO.exec(s);
  let out: number | null = null;
  if (m) out = ymd(+m[1], +m[2], +m[3]);
  else if ((m = RE_DOTS.exec(s))) {
    const y = year(m[3]);
    if (typeof y === 'string') return y;
    out = ymd(y, +m[2], +m[1]);
  } else if ((m = RE_SLASH.exec(s))) {
    const y = year(m[3]);
    if (typeof y === 'string') return y;
    if (order === null) return `the date "${s}" could be day/month or month/day; choose the date order`;
    out = order === 'dmy' ? ymd(y, +m[2], +m[1]) : ymd(y, +m[1], +m[2]);
  } else if ((m = RE_DMONY.exec(s)) && monthOf(m[2])) {
    const y = year(m[3]);
    if (typeof y === 'string') return y;
    out = ymd(y, monthOf(m[2]), +m[1]);
  } else if ((m = RE_MONDY.exec(s)) && monthOf(m[1])) {
    const y = year(m[3]);
    if (typeof y === 'string') return y;
    out = ymd(y, monthOf(m[1]), +m[2]);
  } else return `"${s}" is not a date this import reads (e.g. 2021-03-14, 14.03.2021, 14/03/2021, 14 Mar 2021)`;
  return out === null ? `"${s}" is not a real calendar date` : out;
}

/** Unit aliases → [stored unit id, factor to multiply the value by]. */
const UNIT_ALIASES: Record<string, [string, number]> = {
  'mg/l': ['mg/L', 1],
  'ug/l': ['ug/L', 1],
  'g/l': ['g/L', 1],
  'ng/l': ['ug/L', 1e-3],
  'mg/m3': ['ug/L', 1],
  'ug/ml': ['mg/L', 1],
  ppm: ['mg/L', 1],
  ppb: ['ug/L', 1],
};

/** A known concentration unit and the factor the value takes, or null. */
export function readUnit(cell: string): [string, number] | null {
  const k = cell.trim().replace(/[µμ]/g, 'u').replace(/\s+/g, '').replace(/³/g, '3').toLowerCase();
  const hit = UNIT_ALIASES[k];
  if (hit && UNITS[hit[0]]?.dimension === 'concentration') return hit;
  return null;
}

const NON_DETECT_WORDS = new Set(['nd', 'n.d.', 'n.d', 'bdl', 'bql', '<rl', '<dl', '<mdl', '<lor', '<loq', 'notdetected', 'u']);
const NON_DETECT_QUALIFIERS = new Set(['<', 'u', 'uj', 'nd', 'bdl', 'n.d.', '<rl']);
const DETECT_QUALIFIERS = new Set(['', '=', 'j', '+', 'e', 'b']);

/** A number; with `decimalComma`, "0,5" reads as 0.5. */
function readNumber(s: string, decimalComma: boolean): number | null {
  let t = s.trim();
  if (decimalComma && /^[+-]?\d*,\d+(?:[eE][+-]?\d+)?$/.test(t)) t = t.replace(',', '.');
  if (!/^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/.test(t)) return null;
  const v = Number(t);
  return Number.isFinite(v) ? v : null;
}

// ------------------------------------------------------------------------------------------------

export interface ImportOptions {
  dateOrder?: DateOrder;
  /** analyte for every row when no column holds it */
  fixedAnalyte?: string;
  /** unit for every row when no column holds it */
  fixedUnit?: string;
}

export interface ImportProblem {
  readonly line: number;
  readonly message: string;
}

export interface ObservationImport {
  /** the rows that passed, ready to join the case */
  readonly results: SamplingResult[];
  /** wells named in the file that the case does not have yet */
  readonly newWells: MonitoringWell[];
  /** bad rows (skipped), each with its line */
  readonly problems: ImportProblem[];
  /** a problem that stops the whole import (missing column, too many results), or null */
  readonly fatal: string | null;
  /** unit conversions and assumptions made, in words */
  readonly notes: string[];
}

function uniqueId(base: string, taken: Set<string>): string {
  const slug = base.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 48) || 'well';
  let id = `mw-${slug}`;
  for (let k = 2; taken.has(id); k++) id = `mw-${slug}-${k}`;
  taken.add(id);
  return id;
}

const nameKey = (s: string) => s.trim().toLowerCase();

/** Step 2: rows → results, with a problem per bad row. Pure; the case is not touched. */
export function importObservations(table: ObservationTable, mapping: ColumnMapping, existing: Monitoring, options: ImportOptions = {}): ObservationImport {
  const fail = (fatal: string): ObservationImport => ({ results: [], newWells: [], problems: [], fatal, notes: [] });
  const col = (r: ColumnRole) => (mapping[r] === null || mapping[r] === undefined ? null : mapping[r]);
  for (const r of COLUMN_ROLES) {
    const c = col(r);
    if (c !== null && (c < 0 || c >= table.header.length || !Number.isInteger(c))) return fail(`the ${ROLE_LABELS[r]} column (${c}) is not a column of this file`);
  }
  const missing: string[] = [];
  if (col('well') === null) missing.push(ROLE_LABELS.well);
  if (col('date') === null) missing.push(ROLE_LABELS.date);
  if (col('value') === null) missing.push(ROLE_LABELS.value);
  if (col('analyte') === null && !options.fixedAnalyte?.trim()) missing.push(`${ROLE_LABELS.analyte} (or one analyte for every row)`);
  let fixedUnit: [string, number] | null = null;
  if (col('unit') === null) {
    fixedUnit = options.fixedUnit ? readUnit(options.fixedUnit) : null;
    if (!fixedUnit) missing.push(`${ROLE_LABELS.unit} (or one unit for every row)`);
  }
  if (missing.length) return fail(`choose the column for: ${missing.join(', ')}`);

  const headerName = (r: ColumnRole) => `"${table.header[col(r)!] ?? ''}"`;
  const cell = (rec: CsvRecord, r: ColumnRole) => {
    const c = col(r);
    return c === null ? '' : (rec.fields[c] ?? '').trim();
  };
  const decimalComma = table.delimiter !== ',';
  let order: 'dmy' | 'mdy' | null = options.dateOrder === 'dmy' || options.dateOrder === 'mdy' ? options.dateOrder : null;
  if (order === null) {
    const cells = table.rows.map((r) => cell(r, 'date'));
    order = slashDateOrder(cells);
    const first = cells.find((d) => RE_SLASH.test(d));
    if (order === null && first !== undefined)
      return fail(`dates such as "${first}" could be day/month or month/day and none in the file settles it; choose the date order (day first or month first)`);
  }

  const problems: ImportProblem[] = [];
  const notes = new Set<string>();
  const results: SamplingResult[] = [];
  const taken = new Set(existing.wells.map((w) => w.id));
  const wellByName = new Map(existing.wells.map((w) => [nameKey(w.name), w]));
  const newWells: MonitoringWell[] = [];
  const seen = new Map<string, number>();
  const existingKeys = new Set(existing.results.map((r) => `${r.wellId}|${r.date}|${nameKey(r.analyte)}|${r.value}|${r.unit}|${r.nonDetect}`));
  const width = table.header.length;

  for (const rec of table.rows) {
    const line = rec.line;
    const bad = (message: string) => problems.push({ line, message });
    if (rec.fields.length !== width) {
      bad(
        `has ${rec.fields.length} field${rec.fields.length === 1 ? '' : 's'} where the header has ${width}` +
          (rec.fields.length === 1 && detectDelimiter(rec.fields[0]) ? ` (it seems to use the ${delimiterName(detectDelimiter(rec.fields[0])!)} instead of the ${delimiterName(table.delimiter)})` : ''),
      );
      continue;
    }
    const wellName = cell(rec, 'well');
    if (!wellName) {
      bad(`the ${ROLE_LABELS.well} (${headerName('well')}) is empty`);
      continue;
    }
    if (wellName.length > 200) {
      bad(`the ${ROLE_LABELS.well} name is longer than 200 characters`);
      continue;
    }
    const day = parseDate(cell(rec, 'date'), order);
    if (typeof day === 'string') {
      bad(`${ROLE_LABELS.date} (${headerName('date')}): ${day}`);
      continue;
    }
    const analyte = col('analyte') === null ? options.fixedAnalyte!.trim() : cell(rec, 'analyte');
    if (!analyte || analyte.length > 100) {
      bad(analyte ? 'the analyte name is longer than 100 characters' : `the ${ROLE_LABELS.analyte} (${headerName('analyte')}) is empty`);
      continue;
    }
    let unit = fixedUnit;
    if (!unit) {
      const u = cell(rec, 'unit');
      unit = readUnit(u);
      if (!unit) {
        bad(u ? `the unit "${u}" is not a concentration unit this import knows (mg/L, µg/L, ng/L, g/L, ppm, ppb)` : `the ${ROLE_LABELS.unit} (${headerName('unit')}) is empty`);
        continue;
      }
    }
    // value, "< value", or a non-detect word with a reporting limit
    const raw = cell(rec, 'value');
    const qual = cell(rec, 'qualifier').toLowerCase();
    let nonDetect = false;
    let value: number | null = null;
    let valueText = raw;
    if (valueText.startsWith('<')) {
      nonDetect = true;
      valueText = valueText.slice(1).trim();
      if (!valueText || NON_DETECT_WORDS.has(raw.toLowerCase().replace(/\s+/g, ''))) valueText = '';
    } else if (NON_DETECT_WORDS.has(valueText.toLowerCase().replace(/\s+/g, ''))) {
      nonDetect = true;
      valueText = '';
    }
    if (col('qualifier') !== null) {
      if (NON_DETECT_QUALIFIERS.has(qual)) nonDetect = true;
      else if (!DETECT_QUALIFIERS.has(qual)) {
        bad(`the qualifier "${cell(rec, 'qualifier')}" is not one this import reads (<, U, UJ, ND for below the limit; J, = or empty for detected)`);
        continue;
      }
    }
    if (valueText) {
      value = readNumber(valueText, decimalComma);
      if (value === null) {
        bad(`the ${ROLE_LABELS.value} "${raw}" (${headerName('value')}) is not a number or "< limit"`);
        continue;
      }
    } else if (nonDetect) {
      const lim = cell(rec, 'limit');
      value = lim ? readNumber(lim, decimalComma) : null;
      if (value === null) {
        bad(
          lim
            ? `the reporting limit "${lim}" is not a number`
            : `"${raw || cell(rec, 'qualifier')}" is below the reporting limit, but no limit is given (map a reporting-limit column or write "< 0.005")`,
        );
        continue;
      }
    } else {
      bad(`the ${ROLE_LABELS.value} (${headerName('value')}) is empty`);
      continue;
    }
    if (value < 0) {
      bad(`the ${ROLE_LABELS.value} ${value} is negative; a concentration is ≥ 0`);
      continue;
    }
    if (nonDetect && !(value > 0)) {
      bad('a result below the reporting limit needs a limit > 0');
      continue;
    }
    const [unitId, factor] = unit;
    if (factor !== 1) notes.add(`values in ${unit === fixedUnit ? options.fixedUnit : cell(rec, 'unit')} were converted to ${UNITS[unitId].label}`);
    if (/^pp[mb]$/i.test(cell(rec, 'unit') || options.fixedUnit || '')) notes.add('ppm and ppb were read as mg/L and µg/L (dilute water at 1 kg/L; common practice)');
    value = value * factor;

    let well = wellByName.get(nameKey(wellName));
    if (!well) {
      const x = col('x') === null ? null : readNumber(cell(rec, 'x'), decimalComma);
      const y = col('y') === null ? null : readNumber(cell(rec, 'y'), decimalComma);
      const top = col('screenTop') === null ? 0 : readNumber(cell(rec, 'screenTop'), decimalComma);
      const bottom = col('screenBottom') === null ? top : readNumber(cell(rec, 'screenBottom'), decimalComma);
      if (top === null || bottom === null || top < 0 || bottom < top) {
        bad(`the screen of new well "${wellName}" must be two depths ≥ 0 below the water table, top above bottom`);
        continue;
      }
      well = {
        id: uniqueId(wellName, taken),
        name: wellName,
        position: x !== null && y !== null ? [x, y] : null,
        screenTop: { value: top, unit: 'm' },
        screenBottom: { value: bottom ?? top, unit: 'm' },
      };
      wellByName.set(nameKey(wellName), well);
      newWells.push(well);
    }
    const result: SamplingResult = { wellId: well.id, date: isoFromDay(day), analyte, value, unit: unitId, nonDetect };
    const key = `${result.wellId}|${result.date}|${nameKey(analyte)}|${result.value}|${result.unit}|${result.nonDetect}`;
    const first = seen.get(key);
    if (first !== undefined) {
      bad(`repeats line ${first} (same well, date, analyte and result); the repeat is skipped`);
      continue;
    }
    if (existingKeys.has(key)) {
      bad('this result is already in the case; skipped');
      continue;
    }
    seen.set(key, line);
    results.push(result);
  }
  if (existing.results.length + results.length > MAX_RESULTS)
    return fail(`the case would hold ${existing.results.length + results.length} results, more than the ${MAX_RESULTS} accepted; import fewer rows`);
  // wells only named by rows that all failed are not added
  const usedWells = new Set(results.map((r) => r.wellId));
  return { results, newWells: newWells.filter((w) => usedWells.has(w.id)), problems, fatal: null, notes: [...notes] };
}

/** Step 3: the accepted import joins the monitoring data — all of it, in one new object. */
export function applyImport(m: Monitoring, imp: ObservationImport): Monitoring {
  if (imp.fatal) return m;
  return { ...m, wells: [...m.wells, ...imp.newWells], results: [...m.results, ...imp.results] };
}

/** The whole path for callers that do not show the mapping step (command line, tests). */
export function importObservationsCsv(text: string, existing: Monitoring, options: ImportOptions & ReadOptions & { mapping?: Partial<ColumnMapping> } = {}): ObservationImport {
  const t = readObservationTable(text, options);
  if (!t.ok) return { results: [], newWells: [], problems: [], fatal: t.problem, notes: [] };
  const mapping = { ...guessMapping(t.table.header), ...options.mapping };
  return importObservations(t.table, mapping, existing, options);
}

