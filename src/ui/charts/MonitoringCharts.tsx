/**
 * The site's measurements beside the model, as pictures (loaded on first use, like the other
 * charts):
 * - WellChart: a monitoring well's measured series drawn on the modelled breakthrough curve at its
 *   screen (the case's solution, the other one dashed when it applies); detected results as filled
 *   dots, results below the reporting limit as open down-pointing triangles at the limit (the
 *   value lies somewhere below), never as a number. After a probabilistic run of the case as it is,
 *   the run's 5–95 % and 25–75 % bands and median at the well behind the curve (computed at the
 *   well's position by the run itself: src/case/uncertainty.ts `monitoringWellBands`).
 * - ModelScatter: every result against the model at its well and date, on logarithmic axes with
 *   the 1:1 line and the band within a factor of ten, and the named summary figures beneath.
 * The figures come from src/case/observations.ts (the same as the report and the command line).
 */
import { useMemo } from 'preact/hooks';
import { BandPaths, BandsKey, Frame, H, LimitLine, M, W, pathOf, solutionKey } from './Charts';
import { concentrationScale, linearScale, logScale, type Scale } from './axes';
import { fromInternal, toInternal, UNITS } from '../../core/units';
import { wellCurve, type ModelComparison, type ObservationSummary } from '../../case/observations';
import { prepareCase } from '../../case/prepare';
import { formatSig } from '../../case/numbers';
import { isoFromDay, monitoringWellKey } from '../../case/monitoring';
import type { Case } from '../../case/schema';
import type { WellBands } from '../../case/uncertainty';
import { currentRunFor } from '../uncertaintyState';

const YEAR = 365.25;

/** A detected result: a filled dot. */
function Detected({ x, y, label }: { x: number; y: number; label: string }) {
  return (
    <circle cx={x} cy={y} r={3.6} class="dg-chart-measured">
      <title>{label}</title>
    </circle>
  );
}

/** A result below the reporting limit: an open triangle pointing down, its top edge at the limit. */
function NonDetect({ x, y, label }: { x: number; y: number; label: string }) {
  return (
    <path d={`M${(x - 4.5).toFixed(1)} ${(y - 1).toFixed(1)}H${(x + 4.5).toFixed(1)}L${x.toFixed(1)} ${(y + 7).toFixed(1)}Z`} class="dg-chart-nondetect">
      <title>{label}</title>
    </path>
  );
}

function MeasuredKey() {
  return (
    <>
      {'  '}
      <svg class="dg-key-mark" viewBox="-6 -6 12 12" width="12" height="12" aria-hidden="true">
        <circle r="3.6" class="dg-chart-measured" />
      </svg>
      measured{'  '}
      <svg class="dg-key-mark" viewBox="-6 -6 12 12" width="12" height="12" aria-hidden="true">
        <path d="M-4.5 -4H4.5L0 4Z" class="dg-chart-nondetect" />
      </svg>
      below the reporting limit (drawn at the limit)
    </>
  );
}

/**
 * The probabilistic run's band at this well: from a run of the case as it is, computed for the
 * well where it is now (`stale`: the run is of this case, but the well was placed, moved or
 * re-screened, or the release date changed, since).
 */
function runBandAt(c: Case, wellId: string): { band: WellBands | null; stale: boolean } {
  const run = currentRunFor(c);
  const well = c.monitoring.wells.find((w) => w.id === wellId);
  if (!run?.wellBands || !well) return { band: null, stale: false };
  const band = run.wellBands.find((b) => b.id === wellId && b.key === monitoringWellKey(c.monitoring, well)) ?? null;
  return { band: band && band.realisations > 0 ? band : null, stale: !band };
}

/** The measured series of one monitoring well on its modelled breakthrough curve. */
export function WellChart({ c, summary, wellId }: { c: Case; summary: ObservationSummary; wellId: string }) {
  const data = useMemo(() => {
    try {
      const prep = prepareCase(c);
      const w = summary.wells.find((x) => x.id === wellId);
      if (!w) return { error: 'This well has no results of the compared analyte.' };
      const other = c.evaluation.solution === 'domenico' ? 'exact' : 'domenico';
      const curve = wellCurve(c, prep, w, c.evaluation.solution === 'exact' ? other : null);
      if (!curve) return { error: w.placed ? 'This well has no results of the compared analyte.' : 'Place the well on the map to draw the model at it.' };
      return { curve, name: w.name, limit: prep.limit, solution: c.evaluation.solution };
    } catch (e) {
      return { error: `The model cannot be drawn at this well: ${e instanceof Error ? e.message : String(e)}` };
    }
  }, [c, summary, wellId]);
  const { band, stale } = runBandAt(c, wellId);
  if ('error' in data) return <p class="dg-help">{data.error}</p>;
  const { curve, name, limit } = data;
  const cu = c.contaminant.limit.unit;
  const tEnd = curve.times[curve.times.length - 1];
  const tu = tEnd > 2 * YEAR ? 'yr' : 'd';
  const toT = (d: number) => fromInternal(d, tu);
  const toC = (v: number) => fromInternal(v, cu);
  const ts = curve.times.map(toT);
  const vs = curve.values.map(toC);
  const alt = curve.alternate?.map(toC) ?? null;
  const lim = toC(limit);
  const pts = curve.points.map((p) => ({ ...p, tt: toT(p.t), v: toC(p.mgL) }));
  // the band on the chart's time axis (a steady-state band, without a release date, drawn flat)
  const steady = band?.times[0] === Infinity;
  // (times past the chart's end, when results were deleted since the run, are left out)
  const shown = band ? (steady ? [0, 0] : Array.from(band.times.keys()).filter((k) => band.times[k] <= tEnd * (1 + 1e-9))) : [];
  const bt = band ? (steady ? [0, toT(tEnd)] : shown.map((k) => toT(band.times[k]))) : [];
  const [p5, p25, p50, p75, p95] = band ? [band.p5, band.p25, band.p50, band.p75, band.p95].map((q) => shown.map((k) => toC(q[k]))) : [[], [], [], [], []];
  const sx = linearScale(Math.min(0, ...pts.map((p) => p.tt)), toT(tEnd), M.l, W - M.r);
  const sy = seriesScale([...vs, ...(alt ?? []), ...p95], pts.map((p) => p.v), lim);
  const cl = UNITS[cu]?.label ?? cu;
  const xLabel = curve.sinceRelease ? `time since the release began (${UNITS[tu].label})` : `time since ${isoFromDay(curve.origin)} (${UNITS[tu].label}; model at steady state: no release date)`;
  return (
    <Frame
      title={`Measured and modelled at ${name}`}
      xLabel={xLabel}
      yLabel={`concentration (${cl})`}
      sx={sx}
      sy={sy}
      testid="well-chart"
      legend={solutionKey(data.solution, !!alt)}
      keyExtra={
        <>
          {band && <BandsKey realisations={band.realisations} />}
          <MeasuredKey />
          {stale && (
            <span class="dg-chart-stale" data-testid="well-band-stale">
              {' '}
              (The probabilistic run was made before this well was placed or changed: run it again to draw its band here.)
            </span>
          )}
        </>
      }
    >
      {band && <BandPaths ts={bt} p5={p5} p25={p25} p50={p50} p75={p75} p95={p95} sx={sx} sy={sy} testid="well-chart-bands" />}
      <LimitLine sy={sy} limit={lim} label={`limit ${formatSig(lim, 3)} ${cl}`} />
      {alt && <path d={pathOf(ts, alt, sx, sy)} class="dg-chart-alt" />}
      <path d={pathOf(ts, vs, sx, sy)} class="dg-chart-line" />
      <g data-testid="well-chart-points">
        {pts.map((p) =>
          p.nonDetect ? (
            <NonDetect key={p.date} x={sx(p.tt)} y={sy(p.v)} label={`${p.date}: < ${formatSig(p.v, 3)} ${cl} (below the reporting limit)`} />
          ) : (
            <Detected key={p.date} x={sx(p.tt)} y={sy(p.v)} label={`${p.date}: ${formatSig(p.v, 3)} ${cl}`} />
          ),
        )}
      </g>
    </Frame>
  );
}

/**
 * The concentration axis of a well's chart: logarithmic when the measured values and the limit
 * span more than two decades (measurements are compared on a log scale; the curve's early near-zero
 * part then sits on the bottom edge), from a tenth of the smallest measured value or limit; else
 * the linear axis the other charts use.
 */
function seriesScale(curve: number[], measured: number[], limit: number): Scale {
  const pos = [...measured, limit].filter((v) => v > 0 && Number.isFinite(v));
  const top = Math.max(...pos, ...curve.filter(Number.isFinite));
  const low = Math.min(...pos);
  if (top / low <= 100) return concentrationScale([...curve, ...measured], limit, H - M.b, M.t);
  return logScale(Math.max(low / 10, top * 1e-8), top * 1.3, H - M.b, M.t, decadeLabel);
}

/** Decade tick labels that fit under the axis: plain up to 1000, else a power of ten. */
function decadeLabel(v: number): string {
  const e = Math.round(Math.log10(v));
  if (e >= -2 && e <= 3) return String(Number(v.toPrecision(3)));
  const sup: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };
  return `10${String(e).split('').map((ch) => sup[ch]).join('')}`;
}

/** Both axes over the same whole decades, so the 1:1 line runs corner to corner. */
function squareDecades(values: number[]): [number, number] {
  const pos = values.filter((v) => v > 0 && Number.isFinite(v));
  if (pos.length === 0) return [1e-3, 1];
  let lo = Math.pow(10, Math.floor(Math.log10(Math.min(...pos))));
  let hi = Math.pow(10, Math.ceil(Math.log10(Math.max(...pos))));
  if (hi / lo < 100) {
    // at least two decades, so the factor-of-ten band has room on both sides of the line
    lo /= 10;
    hi *= 10;
  }
  if (hi / lo > 1e8) lo = hi / 1e8;
  return [lo, hi];
}

/** The plain-words summary figures of the comparison, each named (shared by the panel and its test). */
export function comparisonFigures(k: ModelComparison): { name: string; value: string }[] {
  if (k.detected === 0) return [];
  const factor = (l: number) => {
    const f = Math.pow(10, Math.abs(l));
    return f < 1.05 ? 'the same' : `${formatSig(f, 2)}× ${l > 0 ? 'higher' : 'lower'}`;
  };
  return [
    { name: 'detected results compared', value: String(k.detected) },
    { name: 'within a factor of ten of the model', value: `${k.withinTen} (${Math.round((100 * k.withinTen) / k.detected)} %)` },
    { name: 'within a factor of two', value: `${k.withinTwo} (${Math.round((100 * k.withinTwo) / k.detected)} %)` },
    { name: 'median measured/modelled', value: `measured typically ${factor(k.medianLog10Ratio!)} than modelled` },
    { name: 'geometric-mean ratio (bias)', value: `×${formatSig(Math.pow(10, k.meanLog10Ratio!), 3)}` },
    { name: 'root-mean-square log₁₀ misfit', value: `${formatSig(k.rmsLog10Ratio!, 2)} (a typical factor of ${formatSig(Math.pow(10, k.rmsLog10Ratio!), 2)} either way)` },
  ];
}

/** Every result against the model at its well and sampling time, log–log, 1:1 and ×10 band. */
export function ModelScatter({ c, summary }: { c: Case; summary: ObservationSummary }) {
  const cu = c.contaminant.limit.unit;
  const cl = UNITS[cu]?.label ?? cu;
  const toC = (v: number) => fromInternal(v, cu);
  const floor = toInternal(1e-12, 'mg/L');
  const pts: { x: number; y: number; nd: boolean; label: string }[] = [];
  for (const w of summary.wells)
    for (const p of w.series) {
      if (p.modelled === null || p.modelled < floor) continue;
      pts.push({ x: toC(p.modelled), y: toC(p.mgL), nd: p.nonDetect, label: `${w.name} ${p.date}: ${p.nonDetect ? '< ' : ''}${formatSig(toC(p.mgL), 3)} ${cl} measured, ${formatSig(toC(p.modelled), 3)} ${cl} modelled` });
    }
  const k = summary.comparison;
  if (pts.length === 0)
    return (
      <p class="dg-help" data-testid="scatter-none">
        No result can be drawn against the model yet: it needs placed wells with results after the release date where the model gives a concentration.
      </p>
    );
  const [lo, hi] = squareDecades(pts.flatMap((p) => [p.x, p.y]));
  const sx: Scale = logScale(lo, hi, M.l, W - M.r, decadeLabel);
  const sy: Scale = logScale(lo, hi, H - M.b, M.t, decadeLabel);
  const line = (f: number) => {
    // y = f·x across the square, clipped to it
    const x0 = Math.max(lo, lo / f);
    const x1 = Math.min(hi, hi / f);
    return `M${sx(x0).toFixed(1)} ${sy(f * x0).toFixed(1)}L${sx(x1).toFixed(1)} ${sy(f * x1).toFixed(1)}`;
  };
  // the band between y = x/10 and y = 10x, clipped to the square
  const band = [
    [lo, Math.min(hi, 10 * lo)],
    [hi / 10, hi],
    [hi, hi],
    [hi, hi / 10],
    [Math.min(hi, 10 * lo), lo],
    [lo, lo],
  ]
    .map(([x, y], i) => `${i ? 'L' : 'M'}${sx(x).toFixed(1)} ${sy(y).toFixed(1)}`)
    .join('') + 'Z';
  const figures = comparisonFigures(k);
  return (
    <div class="dg-scatter" data-testid="model-scatter">
      <Frame title="Measured against modelled, every result" xLabel={`modelled (${cl})`} yLabel={`measured (${cl})`} sx={sx} sy={sy} testid="scatter-chart">
        <path d={band} class="dg-chart-band" />
        <path d={line(10)} class="dg-chart-tenfold" />
        <path d={line(0.1)} class="dg-chart-tenfold" />
        <path d={line(1)} class="dg-chart-oneone" />
        <text x={sx(hi) - 4} y={sy(hi) + 14} text-anchor="end" class="dg-chart-tick">
          1:1
        </text>
        <g data-testid="scatter-points">
          {pts.map((p, i) => (p.nd ? <NonDetect key={i} x={sx(p.x)} y={sy(p.y)} label={p.label} /> : <Detected key={i} x={sx(p.x)} y={sy(p.y)} label={p.label} />))}
        </g>
      </Frame>
      <p class="dg-chart-key">
        <span class="dg-key-line dg-key-oneone" aria-hidden="true" />
        1:1 (model equals measurement){'  '}
        <span class="dg-key-swatch dg-key-band" aria-hidden="true" />
        within a factor of ten
        <MeasuredKey />
      </p>
      <ScatterFigures figures={figures} comparison={k} />
    </div>
  );
}

function ScatterFigures({ figures, comparison }: { figures: { name: string; value: string }[]; comparison: ModelComparison }) {
  return (
    <>
      {figures.length > 0 && (
        <dl class="dg-figures" data-testid="scatter-figures">
          {figures.map((f) => (
            <div key={f.name}>
              <dt>{f.name}</dt>
              <dd>{f.value}</dd>
            </div>
          ))}
        </dl>
      )}
      {comparison.modelNothing > 0 && (
        <p class="dg-note">
          Not drawn: {comparison.modelNothing} detected result{comparison.modelNothing === 1 ? '' : 's'} where the model gives practically nothing (below 10⁻¹² mg/L), which logarithmic axes cannot show.
        </p>
      )}
    </>
  );
}
