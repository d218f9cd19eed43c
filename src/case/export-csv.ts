/**
 * CSV files of a screening (RFC 4180): the receptor table and the breakthrough curves. Records end
 * in CRLF; a field holding a comma, a double quote, CR or LF is quoted and its quotes doubled;
 * every record has the same number of fields. Numbers are in the units named in each header, with
 * the file rule of src/case/numbers.ts (10 significant digits; zero within round-off written 0),
 * so arithmetic noise such as 149.99999999999994 never reaches a spreadsheet.
 *
 * A text cell that starts with = + - @ or a tab/CR is prefixed with an apostrophe, so that a
 * spreadsheet does not run it as a formula (OWASP "CSV injection" guidance). Numeric cells are
 * never altered. The screening caution closes each file as a final two-field record padded to
 * the column count, so it travels with the numbers.
 */
import type { Case } from './schema';
import { otherSolution, type ExportResults } from './export-results';
import { statusText, type ReceptorFigure } from '../core';
import { fileNumber, formatSig } from './numbers';
import { KIND_LABEL } from './receptorKinds';
import type { ReceptorKind } from './schema';
import { fromInternal } from '../core/units';

const time = (v: number | null) => (v === null ? null : fileNumber(v, 'time'));
const years = (v: number | null) => (v === null ? null : fileNumber(v, 'time', v / YEAR_D));
const conc = (v: number) => fileNumber(v, 'concentration');

export type Cell = string | number | null;

const YEAR_D = 365.25;

function textCell(s: string): string {
  return /^[=+\-@\t\r]/.test(s) ? `'${s}` : s;
}

export function csvField(v: Cell): string {
  let s: string;
  if (v === null) s = '';
  else if (typeof v === 'number') s = Number.isFinite(v) ? String(v) : '';
  else s = textCell(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function csvRecords(rows: readonly (readonly Cell[])[]): string {
  return rows.map((r) => r.map(csvField).join(',')).join('\r\n') + '\r\n';
}

export function withCaution(header: Cell[], rows: Cell[][], caution: string): string {
  const pad = (r: Cell[]) => [...r, ...Array(Math.max(0, header.length - r.length)).fill('')];
  return csvRecords([header, ...rows, pad(['screening caution', caution])]);
}

export const RECEPTOR_TABLE_HEADER = [
  'receptor',
  'kind',
  'distance from source (m)',
  'downgradient x (m)',
  'across-flow y (m)',
  'screen top below water table (m)',
  'screen bottom below water table (m)',
  'result',
  'first reaches limit (d)',
  'first reaches limit (yr)',
  'at horizon (mg/L)',
  'peak (mg/L)',
  'time of peak (d)',
  'steady state (mg/L)',
  'limit (mg/L)',
  'horizon (d)',
  'solution',
  'other solution',
  'other solution: result',
  'other solution: first reaches limit (d)',
  'other solution: at horizon (mg/L)',
  'other solution: peak (mg/L)',
  'other solution: time of peak (d)',
  'solutions differ in',
] as const;

/** The figures named in the 'solutions differ in' column (core ReceptorFigure). */
const FIGURE_COLUMN: Record<ReceptorFigure, string> = {
  status: 'result',
  arrival: 'first reaches limit',
  atHorizon: 'at horizon',
  peak: 'peak',
  peakTime: 'time of peak',
};


/**
 * The receptor table; lengths in `lengthUnit` (the case's unit system: m or ft), named in the
 * headers; each receptor's kind in the words the screen shows ('Creek, pond or river').
 */
export function receptorTableCsv(r: Omit<ExportResults, 'plume'>, lengthUnit: 'm' | 'ft' = 'm'): string {
  const len = (v: number) => fileNumber(v, 'length', fromInternal(v, lengthUnit));
  const rows: Cell[][] = r.receptors.map((x) => {
    const a = x.alternate ?? null;
    return [
      x.name,
      KIND_LABEL[x.kind as ReceptorKind] ?? x.kind,
      len(x.distance),
      len(x.x),
      len(x.y),
      len(x.zTop),
      len(x.zBottom),
      statusText(x.status),
      time(x.arrival),
      years(x.arrival),
      conc(x.atHorizon),
      conc(x.peak.c),
      time(x.peak.t),
      conc(x.steady),
      conc(r.limit),
      time(r.horizon),
      r.solution,
      a?.solution ?? null,
      a ? statusText(a.status) : null,
      time(a?.arrival ?? null),
      a ? conc(a.atHorizon) : null,
      a ? conc(a.peak.c) : null,
      a ? time(a.peak.t) : null,
      a ? a.differing.map((f) => FIGURE_COLUMN[f]).join('; ') : null,
    ];
  });
  return withCaution(
    RECEPTOR_TABLE_HEADER.map((h) => h.replace('(m)', `(${lengthUnit})`)),
    rows,
    r.caution,
  );
}

/**
 * Breakthrough curves: one row per time, one column per receptor (and the other solution's). Each
 * column names its receptor's distance from the source in `lengthUnit` (the case's system).
 */
export function breakthroughCsv(r: Omit<ExportResults, 'plume'>, lengthUnit: 'm' | 'ft' = 'm'): string {
  const times = r.curveTimes ? Array.from(r.curveTimes) : [];
  const alt = otherSolution(r.solution);
  const header: Cell[] = ['time (d)', 'time (yr)'];
  const cols: ArrayLike<number>[] = [];
  for (const x of r.receptors) {
    const at = `${x.name}, ${formatSig(fromInternal(x.distance, lengthUnit), 4)} ${lengthUnit} from the source`;
    if (x.curve && x.curve.length === times.length) {
      header.push(`${at} (mg/L, ${r.solution})`);
      cols.push(x.curve);
    }
    if (x.curveAlternate && x.curveAlternate.length === times.length) {
      header.push(`${at} (mg/L, ${alt})`);
      cols.push(x.curveAlternate);
    }
  }
  const rows: Cell[][] = times.map((t, i) => [time(t), years(t), ...cols.map((col) => conc(col[i]))]);
  return withCaution(header, rows, r.caution);
}

/** A file name from the case name: letters, digits, dot, dash and underscore only. */
export function fileStem(c: Case): string {
  const s = c.name
    .normalize('NFD')
    .replace(/\p{M}/gu, '')
    .replace(/[^A-Za-z0-9._-]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60);
  return s || 'case';
}
