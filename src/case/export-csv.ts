/**
 * CSV files of a screening (RFC 4180, written by csv-write.ts's one rule, re-exported here): the
 * receptor table and the breakthrough curves. Every record has the same number of fields. Numbers
 * are in the units named in each header, with the file rule of src/case/numbers.ts (10 significant
 * digits; zero within round-off written 0), so arithmetic noise such as 149.99999999999994 never
 * reaches a spreadsheet. The screening caution closes each file.
 *
 * Every figure of the receptor table names its method: the analytical columns (`method`: the
 * solution, in uniform flow), and after them the well field's (a pumping well's capture of the
 * release and the contaminant's travel time from it, with their method) and a complete particle
 * run's (export-wells.ts RECEPTOR_WELL_COLUMNS), empty where they do not apply.
 */
import type { Case } from './schema';
import { analyticalMethod, otherSolution, type ExportResults } from './export-results';
import { RECEPTOR_WELL_COLUMNS, receptorWellCells } from './export-wells';
import { statusText, type ReceptorFigure } from '../core';
import { fileNumber, formatSig } from './numbers';
import { KIND_LABEL } from './receptorKinds';
import type { ReceptorKind } from './schema';
import { fromInternal } from '../core/units';
import { withCaution, type Cell } from './csv-write';

export { csvField, csvRecords, withCaution, type Cell } from './csv-write';

const YEAR_D = 365.25;

const time = (v: number | null) => (v === null ? null : fileNumber(v, 'time'));
const years = (v: number | null) => (v === null ? null : fileNumber(v, 'time', v / YEAR_D));
const conc = (v: number) => fileNumber(v, 'concentration');


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
  'method',
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
      analyticalMethod(r.solution),
      r.solution,
      a?.solution ?? null,
      a ? statusText(a.status) : null,
      time(a?.arrival ?? null),
      a ? conc(a.atHorizon) : null,
      a ? conc(a.peak.c) : null,
      a ? time(a.peak.t) : null,
      a ? a.differing.map((f) => FIGURE_COLUMN[f]).join('; ') : null,
      ...receptorWellCells(r, x.id),
    ];
  });
  return withCaution(
    [...RECEPTOR_TABLE_HEADER.map((h) => h.replace('(m)', `(${lengthUnit})`)), ...RECEPTOR_WELL_COLUMNS],
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
