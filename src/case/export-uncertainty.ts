/**
 * The probabilistic results as CSV (RFC 4180 through export-csv's writer): the run (seed, runs,
 * method, solution), every distribution, one row per receptor with the exceedance probability,
 * its standard error and Wilson interval and the 5th/50th/95th percentiles (days, mg/L; "not
 * within the horizon" where that percentile never arrives), one row per receptor and driver, and
 * the caution. The same columns serve the command line's CSV (src/cli/screen.ts).
 */
import { csvRecords, type Cell } from './csv-write';
import { describeInSystem, type UncertaintyResult } from './uncertainty';
import type { Case } from './schema';

export const UNCERTAINTY_COLUMNS: readonly string[] = [
  'mc_runs', 'mc_seed', 'p_exceed', 'p_exceed_se', 'p_exceed_low95', 'p_exceed_high95',
  'arrival_p5_d', 'arrival_p50_d', 'arrival_p95_d', 'c_horizon_p5_mg_per_L', 'c_horizon_p50_mg_per_L', 'c_horizon_p95_mg_per_L',
  'peak_p5_mg_per_L', 'peak_p50_mg_per_L', 'peak_p95_mg_per_L', 'drivers',
];

/** The UNCERTAINTY_COLUMNS cells of receptor j. */
export function uncertaintyCells(u: UncertaintyResult, j: number): Cell[] {
  const r = u.receptors[j];
  const t = (v: number | null) => (v === null ? 'not within the horizon' : v);
  return [
    u.runs, u.seed, r.pExceed, r.pExceedSE, r.pExceedInterval[0], r.pExceedInterval[1],
    t(r.arrival.p5), t(r.arrival.p50), t(r.arrival.p95),
    r.concentrationAtHorizon.p5, r.concentrationAtHorizon.p50, r.concentrationAtHorizon.p95,
    r.peak.p5, r.peak.p50, r.peak.p95,
    r.drivers.map((d) => `${d.input} rho=${d.rankCorrelation.toFixed(3)} low=${d.pExceedLowThird.toFixed(3)} high=${d.pExceedHighThird.toFixed(3)}`).join('; '),
  ];
}

/** Records describing the inputs: one per distribution (and the head-fit option), in the units of the case's system. */
export function distributionRecords(u: UncertaintyResult, units: Pick<Case, 'units'> = {}): Cell[][] {
  return [
    ...u.inputs.map((i): Cell[] => ['uncertain input', i.label, describeInSystem(units, i.input, i.distribution, i.unit)]),
    ...(u.headPlane ? [['uncertain input', 'flow direction and gradient', "from the head readings' plane fit (least-squares covariance)"] as Cell[]] : []),
  ];
}

/** The whole probabilistic result as one CSV file (distributions in the units of the case's system). */
export function uncertaintyCsv(u: UncertaintyResult, units: Pick<Case, 'units'> = {}): string {
  const rows: Cell[][] = [
    ['run', 'realisations', 'seed', 'method', 'solution', 'refused'],
    ['Monte Carlo', u.runs, u.seed, 'Latin hypercube (McKay, Beckman & Conover 1979), Philox4x32-10 streams', u.solution, u.refusedCount],
    [],
    ['record', 'input', 'distribution'],
    ...distributionRecords(u, units),
    [],
    ['receptor', ...UNCERTAINTY_COLUMNS],
    ...u.receptors.map((r, j) => [r.name || r.id, ...uncertaintyCells(u, j)]),
    [],
    ['receptor', 'input', 'rank_correlation', 'p_exceed_low_third', 'p_exceed_high_third', 'to_narrow_it'],
    ...u.receptors.flatMap((r) => r.drivers.map((d): Cell[] => [r.name || r.id, d.label, d.rankCorrelation, d.pExceedLowThird, d.pExceedHighThird, d.measure])),
    [],
    ['probabilistic caution', u.caution],
  ];
  return csvRecords(rows);
}
