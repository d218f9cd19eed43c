/**
 * The observation summary in words and table rows, shared by the command line and the printed
 * report (one wording for both). Numbers through src/case/numbers.ts (formatSig: 3 significant digits,
 * 2 for p-values). Concentrations in the case's limit unit; Sen's slope in that unit
 * per year; rates per day with the half-life they correspond to.
 */
import { fromInternal, UNITS } from '../core/units';
import { POINT_RATE_CAUTION } from '../core/trends/index';
import type { Case } from './schema';
import type { ObservationSummary } from './observations';
import { resultText } from './monitoring';
import { formatSig } from './numbers';
import { resultUnit } from './unitSystem';
import { FIT_LABELS, type FitResult } from './fit';

const YEAR = 365.25;


function halfLifeText(rate: number): string {
  if (!(rate > 0)) return 'no decline';
  const d = Math.LN2 / rate;
  return d < YEAR ? `half-life ${formatSig(d, 3)} d` : `half-life ${formatSig(d / YEAR, 3)} yr`;
}

export function rateText(rate: number, interval: readonly [number, number] | null, confidence: number): string {
  const ci = interval ? ` (${Math.round(confidence * 100)} % interval ${formatSig(interval[0], 3)} to ${formatSig(interval[1], 3)})` : ' (no interval)';
  return `${formatSig(rate, 3)} /d${ci}, ${halfLifeText(rate)}`;
}

export const OBSERVATION_TABLE_HEADER = ['well', 'rounds', 'latest', 'trend', 'S', 'p', "Sen's slope", 'point decay rate'];

/** One row per monitoring well with results of the compared analyte. */
export function observationTableRows(c: Case, s: ObservationSummary): string[][] {
  const unit = c.contaminant.limit.unit;
  const label = UNITS[unit]?.label ?? unit;
  return s.wells
    .filter((w) => w.series.length > 0)
    .map((w) => {
      const mk = w.trend.mannKendall;
      const sen = w.trend.sen;
      return [
        w.name + (w.placed ? '' : ' (not on the map)'),
        String(w.trend.rounds),
        w.latest ? `${resultText(w.latest)} (${w.latest.date})` : '—',
        w.trend.verdict,
        mk ? String(mk.s) : '—',
        mk ? formatSig(mk.p, 2) + (mk.pMethod === 'exact' ? ' (exact)' : '') : '—',
        sen ? `${formatSig(fromInternal(sen.slope, unit) * YEAR, 3)} ${label}/yr` : '—',
        w.pointRate ? rateText(w.pointRate.rate, w.pointRate.interval, w.pointRate.confidence) : (w.pointRateNote ?? '—'),
      ];
    });
}

/** The attenuation rates and the model comparison, as sentences. */
export function observationLines(s: ObservationSummary): string[] {
  const lines: string[] = [];
  lines.push(`Analyte compared: ${s.analyte}; release date ${s.releaseDate ?? 'not given (steady state compared)'}.`);
  lines.push(`Model against measurements: ${s.comparison.words}`);
  if (s.bulkRate) {
    lines.push(
      `Bulk attenuation rate along the centreline (${s.bulkRate.used} wells): ${rateText(s.bulkRate.rate, s.bulkRate.interval, s.bulkRate.confidence)}.`,
    );
  }
  if (s.biodegradationRate) {
    const b = s.biodegradationRate;
    lines.push(
      `Biodegradation rate (Buscheck & Alcantar 1995, per Newell et al. 2002): ${rateText(b.rate, b.interval, b.confidence)}` +
        (s.adoptableHalfLife ? `; as the case's half-life ${formatSig(s.adoptableHalfLife / YEAR, 3)} yr.` : '.'),
    );
  }
  if (s.ratesNote) lines.push(s.ratesNote);
  const seen = new Set<string>();
  for (const w of [...s.warnings, ...(s.biodegradationRate?.warnings ?? []), ...(s.bulkRate?.warnings ?? [])]) {
    if (!seen.has(w.message)) {
      seen.add(w.message);
      lines.push(w.message);
    }
  }
  const few = s.wells.filter((w) => w.series.length > 0 && w.trend.warnings.some((x) => x.code === 'trend-few' || x.code === 'trend-too-few'));
  if (few.length) lines.push(`Few sampling rounds at ${few.map((w) => w.name).join(', ')}: treat those trends as provisional (8 or more rounds advised).`);
  if (s.wells.some((w) => w.pointRate)) lines.push(POINT_RATE_CAUTION);
  lines.push(
    'Trend verdicts: p ≤ 0.05 increasing/decreasing, ≤ 0.10 probably, otherwise stable (S ≤ 0 and coefficient of variation < 1) or no trend (common practice). Non-detects are tied below the highest reporting limit (Gilbert 1987).',
  );
  return lines;
}

/** The fit as sentences (command-line table and the app's monitoring panel); αL in the case's length unit (m or ft). */
export function fitLines(f: FitResult, units: Pick<Case, 'units'> = {}): string[] {
  const lu = resultUnit(units, 'length');
  const unit: Record<string, string> = { sourceConcentration: 'mg/L', halfLife: 'd', longitudinalDispersivity: UNITS[lu].label, flowDirection: '° from north' };
  const lines = f.values.map((v) => {
    // the fit works in internal units (m for αL)
    const shown = (x: number) => formatSig(v.parameter === 'longitudinalDispersivity' ? fromInternal(x, lu) : x, 3);
    const iv = v.interval ? `, ${Math.round(f.confidence * 100)} % interval ${shown(v.interval[0])} to ${shown(v.interval[1])}` : ', no interval';
    return `${FIT_LABELS[v.parameter]}: ${shown(v.value)} ${unit[v.parameter]} (case: ${shown(v.start)}${iv})`;
  });
  lines.push(
    `Fitted to ${f.detected} detected results and ${f.nonDetects} below the reporting limit (least squares on ln concentration; non-detects as censored values). Typical misfit ×${Math.exp(f.rmsLn).toFixed(2)} (the case's inputs: ×${Math.exp(f.startRmsLn).toFixed(2)}).`,
  );
  lines.push(...f.warnings);
  lines.push('Intervals are linearised and carry the scatter of the data only; fitted values describe this site\'s data under this model and become a what-if variant only when adopted.');
  return lines;
}

