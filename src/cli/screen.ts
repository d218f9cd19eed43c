/**
 * Command-line screening: evaluates a case file (any known version) and prints per-receptor
 * results, the derived parameters, warnings and the screening caution.
 *
 *   npm run screen -- <case.json> [--format table|json|csv] [--runs N] [--seed S]
 *                    [--observations results.csv] [--fit parameters] [--variant out.json]
 *                    [--method analytical|particles] [--particles N]
 * A case with monitoring results adds the observation summary (model against data, trend per
 * well, attenuation rates; src/cli/observations.ts) to every format.
 *
 * With --runs or --seed, a Monte Carlo run over the case's uncertain inputs follows the
 * deterministic screening (src/case/uncertainty.ts, the same code and numbers as the app's).
 *
 * Exit codes: 0 screened · 2 usage (bad arguments) · 3 file cannot be read · 4 not a valid case
 * file (JSON, format, version, schema) · 5 a value the engine cannot accept (named by its case
 * field and accepted range) · 1 unexpected failure.
 */
import { readFileSync, statSync } from 'node:fs';
import { decodeText } from '../case/text';
import { formatSig, screenNumber } from '../case/numbers';
import { parseCaseFile, DEFAULT_MAX_BYTES } from '../case/io';
import { screenCase, type ScreeningResult } from '../case/screen';
import { ASSUMPTIONS, SCREENING_CAUTION, WELL_FIELD_ASSUMPTIONS } from '../case/caution';
import { DEFAULT_PARTICLES, runCaseParticles, type CaseParticles } from '../case/particles';
import { ValidationError, SOLUTIONS_DIFFER_ABOVE, statusText } from '../core';
import type { Case } from '../case/schema';
import { csvRecords, type Cell } from '../case/csv-write';
import { resultUnit, unitSystem } from '../case/unitSystem';
import { fromInternal, UNITS, type Dimension } from '../core/units';
import { KIND_LABEL } from '../case/receptorKinds';
import { observationSummary, observationsCsvRows, observationsJson, observationsTable, fitJson, fitLines } from './observations';
import { FIT_PARAMETERS, adoptFitAsVariant, fitCase, type FitParameter, type FitResult } from '../case/fit';
import { applyImport, importObservationsCsv } from '../case/observations-import';
import { serializeCase } from '../case/io';
import { writeFileSync } from 'node:fs';
import { SOLUTION_LABEL } from '../case/export-results';
import { UNCERTAINTY_COLUMNS, distributionRecords, uncertaintyCells } from '../case/export-uncertainty';
import { describeDistribution, describeInSystem, driverSentence, runUncertainty, type Percentiles, type UncertaintyResult } from '../case/uncertainty';

export const EXIT = { ok: 0, unexpected: 1, usage: 2, unreadable: 3, invalidCase: 4, invalidValue: 5 } as const;
type Format = 'table' | 'json' | 'csv';
const YR = 365.25;
/** relative difference above which the other solution's figures are printed beside the main ones */

const HELP = `Downgradient screening from the command line.

Usage:
  npm run screen -- <case.json> [--format table|json|csv] [--runs N] [--seed S]
                    [--method analytical|particles] [--particles N]
  node dist-cli/screen.mjs <case.json> [same options]

Reads a case file (current version 2, or the hand-written compact version 1 described in
src/case/v1.ts), evaluates every receptor against the case's limit over its horizon and prints:
receptor position in the flow frame (x downgradient of the source plane, y across the flow),
first arrival at the limit, concentration at the horizon, peak and its time, status, and the other
solution's figures where the two differ; the derived parameters (seepage velocity, retardation,
dispersivities and the relation used); warnings; and the screening caution.

Probabilistic screening (--runs N and/or --seed S; the other is taken from the case file):
  a Latin hypercube Monte Carlo run of N realisations (1 to 50000) over the inputs the case gives
  distributions (case version 3, "uncertainty"), seeded with the whole number S. Per receptor:
  the probability of reaching the limit within the horizon with its standard error, the 5th, 50th
  and 95th percentiles of the arrival time, the concentration at the horizon and the peak, and the
  inputs that drive the answer. The same case, seed and runs give the same figures as the app.

Monitoring data (case version 3, "monitoring"): every format adds, for the compared analyte, each
monitoring well's Mann-Kendall trend (S, tau, p, Sen's slope, verdict) and point decay rate, the
bulk attenuation and Buscheck & Alcantar biodegradation rates along the centreline, and how far
the model is from the measurements (json: "observations", rates per day).

Monitoring options:
  --observations results.csv   import sampling results (CSV; header names mapped automatically,
                               bad rows reported by line on stderr and skipped) before screening
  --date-order dmy|mdy         for dates like 03/04/2024 when the file does not settle the order
  --fit a,b,...                fit sourceConcentration, halfLife, longitudinalDispersivity and/or
                               flowDirection to the monitoring data (least squares on ln C,
                               non-detects censored) and print the values with 95 % intervals
  --variant out.json           with --fit: write the case with the fitted values as a what-if
                               variant (new id, this case as parent); the case file is not changed
Pumping wells and boundaries (case version 3): a pumping receptor with a rate, in an aquifer
  with a saturated thickness, is an extraction well in steady two-dimensional flow with the
  case's straight boundary lines (image wells). Per pumping well: whether the source lies in its
  capture zone, and the advective travel time of the contaminant from the source (days in json
  and csv, years in the table; null when not captured).

Particles (--method particles, --particles N from 100 to 5000000, default ${DEFAULT_PARTICLES};
  --seed S then seeds the walk, and a Monte Carlo run follows only with --runs): a random-walk
  particle simulation in the same flow, beside the analytical figures. Per receptor: the
  concentration at the horizon with its standard error and the first time the estimate reaches
  the limit; for a pumping well, the concentration of the water it pumps.

Formats:
  table  (default) readable text; times in years, lengths and velocities in the case's unit
         system (m, m/d; or ft, ft/d in a US customary case), concentrations in mg/L
  json   every figure in fixed internal units (m, d, mg/L) whatever the case's system, with a
         "units" key
  csv    one row per receptor, units in the column names: lengths and pumping rates in the
         case's unit system, times in days, concentrations in mg/L; the caution as the last record

Exit codes: 0 screened, 2 bad arguments, 3 file cannot be read, 4 not a valid case file,
5 a value outside its accepted range, 1 unexpected failure.

Screening-level estimates only: local regulators and licensed hydrogeologists decide.`;

interface Args {
  file: string | null;
  format: Format;
  help: boolean;
  runs: number | null;
  seed: number | null;
  observations: string | null;
  fit: FitParameter[] | null;
  variant: string | null;
  dateOrder: 'dmy' | 'mdy' | null;
  method: 'analytical' | 'particles';
  particles: number | null;
}

function parseArgs(argv: string[]): Args | string {
  const a: Args = { file: null, format: 'table', help: false, runs: null, seed: null, observations: null, fit: null, variant: null, dateOrder: null, method: 'analytical', particles: null };
  for (let i = 0; i < argv.length; i++) {
    const s = argv[i];
    if (s === '--help' || s === '-h') a.help = true;
    else if (s === '--format' || s.startsWith('--format=')) {
      const v = s.includes('=') ? s.slice(s.indexOf('=') + 1) : argv[++i];
      if (v !== 'table' && v !== 'json' && v !== 'csv') return `--format must be table, json or csv (got ${v === undefined ? 'nothing' : JSON.stringify(v)})`;
      a.format = v;
    } else if (s === '--method' || s.startsWith('--method=')) {
      const v = s.includes('=') ? s.slice(s.indexOf('=') + 1) : argv[++i];
      if (v !== 'analytical' && v !== 'particles') return `--method must be analytical or particles (got ${v === undefined ? 'nothing' : JSON.stringify(v)})`;
      a.method = v;
    } else if (s === '--runs' || s.startsWith('--runs=') || s === '--seed' || s.startsWith('--seed=') || s === '--particles' || s.startsWith('--particles=')) {
      const name = s.startsWith('--runs') ? 'runs' : s.startsWith('--seed') ? 'seed' : 'particles';
      const v = s.includes('=') ? s.slice(s.indexOf('=') + 1) : argv[++i];
      const n = v === undefined || v.trim() === '' ? Number.NaN : Number(v);
      if (!Number.isFinite(n)) return `--${name} must be a number (got ${v === undefined ? 'nothing' : JSON.stringify(v)})`;
      a[name] = n;
    } else if (s === '--observations' || s.startsWith('--observations=') || s === '--variant' || s.startsWith('--variant=')) {
      const name = s.startsWith('--observations') ? 'observations' : 'variant';
      const v = s.includes('=') ? s.slice(s.indexOf('=') + 1) : argv[++i];
      if (!v) return `--${name} needs a file name`;
      a[name] = v;
    } else if (s === '--date-order' || s.startsWith('--date-order=')) {
      const v = s.includes('=') ? s.slice(s.indexOf('=') + 1) : argv[++i];
      if (v !== 'dmy' && v !== 'mdy') return `--date-order must be dmy (day first) or mdy (month first) (got ${JSON.stringify(v ?? '')})`;
      a.dateOrder = v;
    } else if (s === '--fit' || s.startsWith('--fit=')) {
      const v = s.includes('=') ? s.slice(s.indexOf('=') + 1) : argv[++i];
      const names = (v ?? '').split(',').map((x) => x.trim()).filter(Boolean);
      const bad = names.filter((n) => !(FIT_PARAMETERS as readonly string[]).includes(n));
      if (!names.length || bad.length) return `--fit takes a comma-separated list of ${FIT_PARAMETERS.join(', ')} (got ${JSON.stringify(v ?? '')})`;
      a.fit = names as FitParameter[];
    } else if (s.startsWith('-')) return `unknown option ${s} (see --help)`;
    else if (a.file === null) a.file = s;
    else return `only one case file can be screened at a time (got ${JSON.stringify(a.file)} and ${JSON.stringify(s)})`;
  }
  if (a.variant && !a.fit) return '--variant writes the fitted what-if variant, so it needs --fit';
  return a;
}

// ---------------------------------------------------------------------------------------------
// number formatting

/** three significant figures by the app's one rule (src/case/numbers.ts formatSig: plain notation in the usual range, no trailing zeros) */
const sig = (x: number, digits = 3): string => formatSig(x, digits);
const years = (d: number) => sig(d / YR);

/**
 * Figures in the case's unit system (src/case/unitSystem.ts) for the table and csv formats: `of`
 * a value in internal units, `text` with three significant digits (a length zero within round-off,
 * by the app's rule in src/case/numbers.ts, shows as 0), `label` the unit as written. JSON keeps the contract's fixed units.
 */
function unitsOfCase(c: Case) {
  const unit = (d: Dimension) => resultUnit(c, d);
  const of = (v: number, d: Dimension) => fromInternal(v, unit(d));
  const label = (d: Dimension) => UNITS[unit(d)].label;
  const text = (v: number, d: Dimension, digits = 3) => (d === 'length' ? screenNumber(v, 'length', of(v, d), digits) : sig(of(v, d), digits));
  return { unit, of, label, text };
}
/** a concentration, with enough digits that a value near the limit is not rounded onto it */
function conc(c: number, limit: number): string {
  if (c > 0 && Math.abs(c / limit - 1) < 0.01) return sig(c, 5);
  return sig(c);
}

function arrivalText(arrival: number | null, status: string): string {
  if (arrival !== null) return `${years(arrival)} yr`;
  return status === 'not-reached-in-horizon' ? 'after horizon' : 'never';
}

/** the status in the shared words (core STATUS_WORDS); reaching the limit in capitals, to stand out in plain text */
const statusCell = (status: string): string => (status === 'reaches-limit' ? statusText(status).toUpperCase() : statusText(status));


type Row = ScreeningResult['results'][number];


// ---------------------------------------------------------------------------------------------
// table

function pad(rows: string[][]): string[] {
  const widths = rows[0].map((_, j) => Math.max(...rows.map((r) => r[j].length)));
  return rows.map((r) => r.map((cell, j) => cell.padEnd(widths[j])).join('  ').trimEnd());
}

function wrap(text: string, width = 96, indent = ''): string[] {
  const out: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/)) {
    if (line && (indent + line + ' ' + word).length > width) {
      out.push(indent + line);
      line = word;
    } else line = line ? line + ' ' + word : word;
  }
  if (line) out.push(indent + line);
  return out;
}

const pctConc = (x: Percentiles, limit: number) => [x.p5, x.p50, x.p95].map((v) => (v === null ? '–' : conc(v, limit))).join(' / ');
const pctPercent = (p: number) => `${sig(100 * p, 2)} %`;

function uncertaintyTable(c: Case, u: UncertaintyResult, limit: number): string[] {
  const un = unitsOfCase(c);
  const L: string[] = [];
  L.push(`Probabilistic screening: ${u.runs} realisations, seed ${u.seed} (Latin hypercube; ${SOLUTION_LABEL[u.solution]})`);
  L.push('  Uncertain inputs (sampled independently):');
  for (const i of u.inputs) L.push(...wrap(`- ${i.label}: ${describeInSystem(c, i.input, i.distribution, i.unit)}${i.distribution.note ? ` (${i.distribution.note})` : ''}`, 96, '    ').map((l, k) => (k ? '  ' + l : l)));
  if (u.headPlane)
    L.push(
      ...wrap(
        `- flow direction and gradient: from the least-squares covariance of the plane fitted to the head readings (residual SD ${un.text(u.headPlane.s, 'length')} ${un.label('length')}, ${u.headPlane.dof} degree${u.headPlane.dof === 1 ? '' : 's'} of freedom; a normal approximation that understates the spread with few readings)`,
        96,
        '    ',
      ).map((l, k) => (k ? '  ' + l : l)),
    );
  if (u.refusedCount) L.push(...wrap(`- ${u.refusedCount} realisation(s) refused by the engine and left out, e.g. ${u.refusals[0]?.message}`, 96, '    '));
  L.push('');
  const head = ['  receptor', 'P(reaches limit within horizon)', 'arrival 5th / 50th / 95th', 'C at horizon 5/50/95 (mg/L)', 'peak 5/50/95 (mg/L)'];
  const rows = u.receptors.map((r) => [
    '  ' + (r.name || r.id),
    `${pctPercent(r.pExceed)} ± ${pctPercent(r.pExceedSE)} (95 %: ${pctPercent(r.pExceedInterval[0])}–${pctPercent(r.pExceedInterval[1])})`,
    [r.arrival.p5, r.arrival.p50, r.arrival.p95].map((t) => (t === null ? 'not within horizon' : `${years(t)} yr`)).join(' / '),
    pctConc(r.concentrationAtHorizon, limit),
    pctConc(r.peak, limit),
  ]);
  L.push(...pad([head, ...rows]));
  L.push('  (arrival "not within horizon": at that percentile the realisations do not reach the limit within the horizon)');
  L.push('');
  L.push('Which measurement would settle it (inputs ranked by rank correlation with the peak)');
  for (const r of u.receptors) {
    L.push(`  ${r.name || r.id}:`);
    for (const d of r.drivers.slice(0, 3))
      L.push(...wrap(`- ${d.label} (rank correlation ${d.rankCorrelation.toFixed(2)}): ${driverSentence(d)}. To narrow it: ${d.measure}.`, 96, '      ').map((l, k) => (k ? '  ' + l : '    ' + l.trimStart())));
  }
  L.push('');
  L.push(...wrap(u.caution, 96, '  '));
  return L;
}

function formatTable(c: Case, s: ScreeningResult, source: string, u: UncertaintyResult | null, fit: FitResult | null = null, pt: CaseParticles | null = null): string {
  const p = s.prepared;
  const d = p.derived;
  const m = p.model;
  const un = unitsOfCase(c);
  const len = (v: number, digits?: number) => `${un.text(v, 'length', digits)} ${un.label('length')}`;
  const vel = (v: number) => `${un.text(v, 'velocity')} ${un.label('velocity')}`;
  const L: string[] = [];
  L.push(`Downgradient screening: ${c.name}`);
  L.push(`Units: ${unitSystem(c) === 'US' ? 'US customary' : 'SI'} (lengths in ${un.label('length')}, times in years unless said, concentrations in mg/L)`);
  L.push(`Case file: ${source}`);
  L.push(`Contaminant: ${c.contaminant.name}   source ${sig(m.c0)} mg/L   limit ${sig(p.limit)} mg/L`);
  if (c.contaminant.limitNote) L.push(...wrap(`Limit note: ${c.contaminant.limitNote}`, 96));
  L.push(`Solution: ${SOLUTION_LABEL[m.solution]} (the other solution is computed beside it)`);
  L.push(`Horizon: ${years(p.horizon)} yr (${sig(p.horizon, 5)} d)`);
  L.push('');
  L.push('Derived parameters');
  const disp =
    d.dispersivityRelation.mode === 'given'
      ? 'given'
      : `${d.dispersivityRelation.citation}, scaled from ${len(d.dispersivityRelation.scaleDistance ?? 0)}; αT = ${d.dispersivityRelation.transverseRatio}·αL, αV = ${d.dispersivityRelation.verticalRatio}·αL`;
  const flow = d.headFit
    ? `fitted to ${d.headFit.residuals.length} head readings, largest residual ${len(Math.max(...d.headFit.residuals.map(Math.abs)))}`
    : 'given';
  const decay =
    m.decay > 0
      ? `${sig(m.decay)} 1/d (half-life ${sig(Math.LN2 / m.decay / YR)} yr), on ${m.decayPhase === 'dissolved-only' ? 'the dissolved phase only' : 'dissolved and sorbed mass'}`
      : 'none';
  const kv: [string, string][] = [
    ['flow direction, gradient', `towards ${sig(d.azimuthDeg, 4)}° from north, i = ${sig(d.gradient)} (${flow})`],
    ['hydraulic conductivity K', `${un.text(d.K, 'conductivity')} ${un.label('conductivity')}`],
    ['seepage velocity v = K·i/nₑ', `${vel(d.v)} (${un.text(d.v * YR, 'velocity')} ${un.label('length')}/yr)`],
    ['Kd', `${sig(d.kd)} L/kg${c.contaminant.sorption.mode === 'koc' ? ' (Koc·foc)' : ' (given)'}`],
    ['bulk density ρb', `${un.text(d.bulkDensity, 'density')} ${un.label('density')}${d.bulkDensityEstimated ? ' (2.65·(1 − n), common practice)' : ' (given)'}`],
    ['retardation R = 1 + ρb·Kd/n', `${sig(d.R, 4)}  → contaminant velocity v/R = ${vel(d.v / d.R)}`],
    ['dispersivity αL / αT / αV', `${un.text(d.ax, 'length')} / ${un.text(d.ay, 'length')} / ${len(d.az)} (${disp})`],
    ['molecular diffusion De', d.diffusion > 0 ? `${un.text(d.diffusion, 'diffusion')} ${un.label('diffusion')} (D0·τ)` : 'not included'],
    ['first-order decay λ', decay],
    ['source plane', `width ${len(d.width)}${d.widthFromFootprint ? ' (across-flow extent of the footprint)' : ''}, thickness ${len(m.thickness)}`],
    [
      'source',
      `${m.duration === Infinity ? 'continuous' : `released for ${years(m.duration)} yr`}${m.sourceDecay > 0 ? `, halving every ${years(Math.LN2 / m.sourceDecay)} yr` : ', constant'}`,
    ],
    [
      'plume length to the limit',
      (p.viewTime === Infinity
        ? ''
        : `${s.plumeLength.atViewTime === null ? 'none' : len(s.plumeLength.atViewTime)} at ${years(p.viewTime)} yr; `) +
        `${s.plumeLength.steady === null ? 'none at steady state' : len(s.plumeLength.steady) + ' at steady state'} (centreline, depth ${len(p.depth)})`,
    ],
  ];
  L.push(...pad(kv.map(([k, v]) => ['  ' + k, v])));
  L.push('');
  L.push(`Receptors (x downgradient of the source plane, y across the flow, screen depth below the water table)`);
  if (!s.results.length) L.push('  none in this case');
  else {
    const lu = un.label('length');
    const head = ['  name', 'kind', `x (${lu})`, `y (${lu})`, `screen (${lu})`, 'arrival at limit', 'C at horizon (mg/L)', 'peak (mg/L) at (yr)', 'status'];
    const rows = s.results.map(({ receptor: r, result: x }) => [
      '  ' + (r.name || r.id),
      KIND_LABEL[r.kind],
      un.text(r.x, 'length'),
      un.text(r.y, 'length'),
      `${un.text(r.zTop, 'length')}–${un.text(r.zBottom, 'length')}`,
      arrivalText(x.arrival, x.status),
      conc(x.atHorizon, p.limit),
      `${conc(x.peak.c, p.limit)} at ${years(x.peak.t)}`,
      statusCell(x.status),
    ]);
    L.push(...pad([head, ...rows]));
    const others = s.results.filter(({ result }) => result.alternate?.showBoth);
    if (others.length) {
      L.push('');
      L.push(`Where the other solution gives another result, or any figure differs by more than ${SOLUTIONS_DIFFER_ABOVE * 100} %:`);
      for (const { receptor: r, result: x } of others) {
        const a = x.alternate!;
        L.push(
          `  ${r.name || r.id}: ${SOLUTION_LABEL[a.solution]}: ${statusCell(a.status)}, arrival ${arrivalText(a.arrival, a.status)}, ` +
            `${conc(a.atHorizon, p.limit)} mg/L at the horizon, peak ${conc(a.peak.c, p.limit)} mg/L at ${years(a.peak.t)} yr (${sig(100 * a.relDiff, 2)} % apart)`,
        );
      }
    }
  }
  if (s.captures.length) {
    L.push('');
    L.push(`Pumping wells (steady flow with ${s.wells.boundaries.length ? `${s.wells.boundaries.length} boundary line(s), ` : ''}saturated thickness ${len(s.wells.thickness ?? 0)})`);
    const head = ['  well', `rate (${un.label('flowRate')})`, 'captures the source', 'share of source width', 'travel time from source', `J&T width far upgradient (${un.label('length')})`];
    const rows = s.captures.map((w) => [
      '  ' + (s.results[w.receptorIndex].receptor.name || w.receptorId),
      un.text(w.rate, 'flowRate'),
      w.capturesSource ? 'YES' : 'no',
      `${sig(100 * w.sourceShare, 3)} %`,
      w.travelTimeFromSource === null ? '–' : `${years(w.travelTimeFromSource)} yr (water ${years(w.waterTravelTime as number)} yr)`,
      w.singleWell ? un.text(w.singleWell.widthFarUpgradient, 'length') : '–',
    ]);
    L.push(...pad([head, ...rows]));
    L.push('  (travel time: advective, contaminant = water × R; J&T: Javandel & Tsang 1986 for the well alone in the regional flow)');
  }
  if (pt) {
    L.push('');
    L.push(`Particles: ${pt.particles} particles, seed ${pt.seed} (random walk; method "particles", beside the analytical figures above)`);
    const head = ['  receptor', 'C at horizon (mg/L) ± 1 SE', 'arrival at limit', 'estimator'];
    const rows = pt.receptors.map((x, i) => [
      '  ' + (s.results[i].receptor.name || s.results[i].receptor.id),
      `${conc(x.concentrationAtHorizon, p.limit)} ± ${sig(x.standardError)}`,
      x.arrival === null ? 'not within horizon' : `${years(x.arrival)} yr`,
      x.estimator,
    ]);
    L.push(...pad([head, ...rows]));
    L.push(`  mass: released ${sig(pt.mass.released)}, captured by wells ${sig(pt.mass.captured)}, to boundaries ${sig(pt.mass.outflow)}, decayed ${sig(pt.mass.decayed)}, in the aquifer ${sig(pt.mass.inAquifer)} (mg/L·m³ = g)`);
  }
  if (u) {
    L.push('');
    L.push(...uncertaintyTable(c, u, p.limit));
  }
  const obs = observationSummary(c, p);
  if (obs) {
    L.push('');
    L.push(...observationsTable(c, obs, pad, wrap));
  }
  if (fit) {
    L.push('');
    L.push('Fit to the monitoring data');
    for (const line of fitLines(fit, c)) L.push(...wrap(`- ${line}`, 96, '  ').map((l, i) => (i ? '  ' + l : l)));
  }
  L.push('');
  L.push('Warnings');
  if (!s.warnings.length) L.push('  none');
  for (const w of s.warnings) L.push(...wrap(`- ${w.message}${w.field ? ` [${w.field}]` : ''}`, 96, '  ').map((l, i) => (i ? '  ' + l : l)));
  L.push('');
  L.push('CAUTION');
  L.push(...wrap(SCREENING_CAUTION, 96, '  '));
  L.push('');
  L.push('Assumptions behind these figures');
  for (const a of ASSUMPTIONS) L.push(...wrap(`- ${a.text}`, 96, '  ').map((l, i) => (i ? '  ' + l : l)));
  if (s.wells.field || pt) for (const a of WELL_FIELD_ASSUMPTIONS) L.push(...wrap(`- ${a.text}`, 96, '  ').map((l, i) => (i ? '  ' + l : l)));
  return L.join('\n') + '\n';
}

// ---------------------------------------------------------------------------------------------
// json and csv

/** Per receptor, the shape the command line promises (days, mg/L, null for no arrival within the horizon). */
function receptorUncertaintyJson(u: UncertaintyResult, j: number) {
  const r = u.receptors[j];
  return {
    runs: u.runs,
    seed: u.seed,
    pExceed: r.pExceed,
    pExceedSE: r.pExceedSE,
    arrival: r.arrival,
    concentrationAtHorizon: r.concentrationAtHorizon,
    peak: r.peak,
    drivers: r.drivers.map((d) => ({ input: d.input, rankCorrelation: d.rankCorrelation, pExceedLowThird: d.pExceedLowThird, pExceedHighThird: d.pExceedHighThird })),
  };
}

function particleJson(pt: CaseParticles, j: number) {
  const x = pt.receptors[j];
  return { method: x.method, concentrationAtHorizon: x.concentrationAtHorizon, standardError: x.standardError, arrival: x.arrival, estimator: x.estimator };
}

function captureJson(s: ScreeningResult, j: number) {
  const w = s.captures.find((q) => q.receptorIndex === j);
  if (!w) return {};
  return {
    pumpingRate: w.rate,
    capturesSource: w.capturesSource,
    travelTimeFromSource: w.travelTimeFromSource,
    waterTravelTimeFromSource: w.waterTravelTime,
    sourceShareCaptured: w.sourceShare,
    singleWellCapture: w.singleWell,
  };
}

function formatJson(c: Case, s: ScreeningResult, source: string, u: UncertaintyResult | null, fit: FitResult | null = null, pt: CaseParticles | null = null): string {
  const p = s.prepared;
  const out = {
    case: { id: c.id, name: c.name, file: source, contaminant: c.contaminant.name, limitNote: c.contaminant.limitNote },
    units: { length: 'm', time: 'd', concentration: 'mg/L', velocity: 'm/d', conductivity: 'm/d', partition: 'L/kg', density: 'g/cm3', diffusion: 'm2/d', rate: '1/d', angle: 'degrees clockwise from north' },
    solution: p.model.solution,
    limit: p.limit,
    horizon: p.horizon,
    viewTime: p.viewTime === Infinity ? null : p.viewTime,
    depth: p.depth,
    model: { ...p.model, duration: p.model.duration === Infinity ? null : p.model.duration },
    derived: p.derived,
    plumeLength: s.plumeLength,
    receptors: s.results.map(({ receptor: r, result: x }) => ({
      id: r.id,
      name: r.name,
      kind: r.kind,
      x: r.x,
      y: r.y,
      zTop: r.zTop,
      zBottom: r.zBottom,
      distance: r.distance,
      solution: x.solution,
      arrival: x.arrival,
      atHorizon: x.atHorizon,
      peak: x.peak,
      steady: x.steady,
      status: x.status,
      alternate: x.alternate,
      othersDiffer: x.alternate?.showBoth ?? false,
      method: 'analytical',
      ...captureJson(s, s.results.findIndex((q) => q.receptor === r)),
      ...(pt ? { particles: particleJson(pt, s.results.findIndex((q) => q.receptor === r)) } : {}),
      ...(u ? { uncertainty: receptorUncertaintyJson(u, s.results.indexOf(s.results.find((q) => q.receptor === r)!)) } : {}),
    })),
    ...(u
      ? {
          uncertainty: {
            runs: u.runs,
            seed: u.seed,
            method: 'Latin hypercube (McKay, Beckman & Conover 1979), Philox4x32-10 streams',
            solution: u.solution,
            inputs: u.inputs.map((i) => ({ input: i.input, label: i.label, unit: i.unit ?? null, distribution: i.distribution, described: describeDistribution(i.distribution, i.unit, i.input) })),
            headPlane: u.headPlane,
            refused: u.refusedCount,
            refusals: u.refusals,
            caution: u.caution,
          },
        }
      : {}),
    ...(() => {
      const obs = observationSummary(c, p);
      return obs ? { observations: { ...observationsJson(obs), ...(fit ? { fit: fitJson(fit) } : {}) } } : {};
    })(),
    ...(s.wells.field
      ? {
          wellField: {
            saturatedThickness: s.wells.thickness,
            darcyFlux: s.wells.field.darcyFlux,
            boundaries: s.wells.boundaries.map((b) => ({ id: b.id, name: b.name, kind: b.kind })),
          },
        }
      : {}),
    ...(pt ? { particles: { particles: pt.particles, seed: pt.seed, mass: pt.mass, steps: pt.steps, units: { mass: 'mg/L·m3 (= g)' } } } : {}),
    warnings: [...s.warnings, ...(pt?.warnings ?? [])],
    caution: s.caution,
    assumptions: s.wells.field || pt ? [...ASSUMPTIONS, ...WELL_FIELD_ASSUMPTIONS] : ASSUMPTIONS,
  };
  return JSON.stringify(out, null, 2) + '\n';
}

/** One row per receptor (RFC 4180 via the app's CSV writer, numbers unrounded, lengths and pumping
 * rates in the case's unit system and times in days, concentrations in mg/L, units in the column
 * names), then the caution as a final record, as in the app's CSV exports. */
function formatCsv(c: Case, s: ScreeningResult, u: UncertaintyResult | null, pt: CaseParticles | null = null): string {
  const un = unitsOfCase(c);
  const lu = un.unit('length');
  const qu = un.unit('flowRate') === 'gpm' ? 'gal_per_min' : 'm3_per_d';
  const head: Cell[] = [
    'id', 'name', 'kind', `x_${lu}`, `y_${lu}`, `distance_${lu}`, `screen_top_${lu}`, `screen_bottom_${lu}`, 'solution', 'arrival_d',
    'c_horizon_mg_per_L', 'peak_mg_per_L', 'peak_time_d', 'steady_mg_per_L', 'status', 'limit_mg_per_L', 'horizon_d',
    'other_solution', 'other_status', 'other_arrival_d', 'other_c_horizon_mg_per_L', 'other_peak_mg_per_L', 'other_peak_time_d', 'relative_difference',
    'solutions_differ_in',
    `pumping_rate_${qu}`, 'captures_source', 'travel_time_from_source_d',
    ...(pt ? ['particles_n', 'particles_seed', 'particles_c_horizon_mg_per_L', 'particles_standard_error_mg_per_L', 'particles_arrival_d', 'particles_estimator'] : []),
    ...(u ? UNCERTAINTY_COLUMNS : []),
  ];
  const rows: Cell[][] = s.results.map(({ receptor: r, result: x }) => {
    const a = x.alternate;
    return [
      r.id, r.name, r.kind, ...[r.x, r.y, r.distance, r.zTop, r.zBottom].map((v) => un.of(v, 'length')), x.solution, x.arrival, x.atHorizon, x.peak.c, x.peak.t,
      x.steady, x.status, s.prepared.limit, s.prepared.horizon,
      a?.solution ?? null, a?.status ?? null, a?.arrival ?? null, a?.atHorizon ?? null, a?.peak.c ?? null, a?.peak.t ?? null, a?.relDiff ?? null,
      a ? a.differing.join(' ') : null,
      ...wellCells(s, s.results.findIndex((q) => q.receptor === r), (q) => un.of(q, 'flowRate')),
      ...(pt ? particleCells(pt, s.results.findIndex((q) => q.receptor === r)) : []),
      ...(u ? uncertaintyCells(u, s.results.findIndex((q) => q.receptor === r)) : []),
    ];
  });
  const inputs: Cell[][] = u
    ? [...distributionRecords(u, c).map((r) => [...r, ...Array(head.length - 3).fill('')]), ['probabilistic caution', u.caution, ...Array(head.length - 2).fill('')]]
    : [];
  const caution: Cell[] = ['screening caution', s.caution, ...Array(head.length - 2).fill('')];
  const obs = observationSummary(c, s.prepared);
  return csvRecords([head, ...rows, ...inputs, ...(obs ? observationsCsvRows(obs, head.length) : []), caution]);
}

function wellCells(s: ScreeningResult, j: number, rate: (q: number) => number): Cell[] {
  const w = s.captures.find((q) => q.receptorIndex === j);
  return w ? [rate(w.rate), w.capturesSource ? 'true' : 'false', w.travelTimeFromSource] : [null, null, null];
}

function particleCells(pt: CaseParticles, j: number): Cell[] {
  const x = pt.receptors[j];
  return [pt.particles, pt.seed, x.concentrationAtHorizon, x.standardError, x.arrival, x.estimator];
}


// ---------------------------------------------------------------------------------------------

export function run(argv: string[], out: (s: string) => void, err: (s: string) => void): number {
  const args = parseArgs(argv);
  if (typeof args === 'string') {
    err(`error: ${args}\n`);
    return EXIT.usage;
  }
  if (args.help) {
    out(HELP + '\n');
    return EXIT.ok;
  }
  if (!args.file) {
    err('error: no case file given.\nusage: npm run screen -- <case.json> [--format table|json|csv]   (--help for more)\n');
    return EXIT.usage;
  }
  let text: string;
  try {
    const st = statSync(args.file);
    if (!st.isFile()) throw Object.assign(new Error('not a regular file'), { code: 'EISDIR' });
    if (st.size > DEFAULT_MAX_BYTES) {
      err(`error: ${args.file}: the file is ${st.size} bytes, larger than the ${DEFAULT_MAX_BYTES} bytes accepted for a case file\n`);
      return EXIT.invalidCase;
    }
    const decoded = decodeText(readFileSync(args.file));
    if (!decoded.ok) {
      err(`error: ${args.file} is not a valid case file:\n  - ${decoded.error}\n`);
      return EXIT.invalidCase;
    }
    text = decoded.text;
  } catch (e) {
    const code = (e as { code?: string }).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EACCES' ? 'permission denied' : code === 'EISDIR' ? 'is a directory, not a case file' : (e as Error).message;
    err(`error: cannot read ${args.file}: ${why}\n`);
    return EXIT.unreadable;
  }
  const parsed = parseCaseFile(text);
  if (!parsed.ok) {
    err(`error: ${args.file} is not a valid case file:\n${parsed.errors.map((e) => '  - ' + e).join('\n')}\n`);
    return EXIT.invalidCase;
  }
  let c = parsed.case;
  if (args.observations) {
    let csv: string;
    try {
      const decoded = decodeText(readFileSync(args.observations));
      if (!decoded.ok) {
        err(`error: ${args.observations}: ${decoded.error}\n`);
        return EXIT.invalidCase;
      }
      csv = decoded.text;
    } catch (e) {
      err(`error: cannot read ${args.observations}: ${(e as { code?: string }).code === 'ENOENT' ? 'no such file' : (e as Error).message}\n`);
      return EXIT.unreadable;
    }
    const imp = importObservationsCsv(csv, c.monitoring, { dateOrder: args.dateOrder ?? 'auto' });
    if (imp.fatal) {
      err(`error: ${args.observations}: ${imp.fatal}\n`);
      return EXIT.invalidCase;
    }
    for (const p of imp.problems) err(`warning: ${args.observations}: line ${p.line}: ${p.message}\n`);
    for (const n of imp.notes) err(`note: ${args.observations}: ${n}\n`);
    err(`imported ${imp.results.length} results${imp.newWells.length ? ` and ${imp.newWells.length} new wells` : ''} from ${args.observations}${imp.problems.length ? `; ${imp.problems.length} rows skipped` : ''}\n`);
    c = { ...c, monitoring: applyImport(c.monitoring, imp) };
  }
  let fit: FitResult | null = null;
  let result: ScreeningResult;
  let uncertainty: UncertaintyResult | null = null;
  let particles: CaseParticles | null = null;
  try {
    result = screenCase(c);
    const particleRun = args.method === 'particles' || args.particles !== null;
    if (particleRun) particles = runCaseParticles(c, result.prepared, result.wells, { particles: args.particles ?? undefined, seed: args.seed ?? undefined });
    if (args.runs !== null || (!particleRun && args.seed !== null)) uncertainty = runUncertainty(c, { runs: args.runs ?? undefined, seed: args.seed ?? undefined });
    if (args.fit) fit = fitCase(c, args.fit);
  } catch (e) {
    if (e instanceof ValidationError) {
      err(`error: ${args.file}: ${e.message}\n  field: ${e.field}\n  accepted: ${e.range}\n`);
      return EXIT.invalidValue;
    }
    err(`error: the screening failed unexpectedly: ${(e as Error)?.stack ?? String(e)}\n`);
    return EXIT.unexpected;
  }
  const version = (JSON.parse(text.replace(/^\uFEFF/, '')) as { version?: number }).version;
  const source = `${args.file} (version ${version}${version !== c.version ? `, read as version ${c.version}` : ''})`;
  out(
    args.format === 'json'
      ? formatJson(c, result, args.file, uncertainty, fit, particles)
      : args.format === 'csv'
        ? formatCsv(c, result, uncertainty, particles)
        : formatTable(c, result, source, uncertainty, fit, particles),
  );
  if (fit && args.variant) {
    const now = new Date().toISOString();
    const variant = adoptFitAsVariant(c, fit, `${c.id}-fit-${now.replace(/\D/g, '').slice(0, 14)}`.slice(0, 64), now);
    try {
      writeFileSync(args.variant, serializeCase(variant));
    } catch (e) {
      err(`error: cannot write ${args.variant}: ${(e as Error).message}\n`);
      return EXIT.unreadable;
    }
    err(`wrote the fitted what-if variant to ${args.variant} (the case file itself is unchanged)\n`);
  }
  return EXIT.ok;
}

// Run when executed as the bundled entry point (dist-cli/screen.mjs), not when imported by tests.
const entry = process.argv[1] ?? '';
if (/screen\.(mjs|js)$/.test(entry)) {
  process.exitCode = run(process.argv.slice(2), (s) => process.stdout.write(s), (s) => process.stderr.write(s));
}
