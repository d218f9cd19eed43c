/**
 * Charts in plain SVG: the breakthrough curve at a receptor and the centreline profile. Both have
 * labelled axes with units, the limit as a dashed line, the other solution as a thin dashed curve
 * when it is computed, and a logarithmic concentration axis when the values span many decades.
 * After a Monte Carlo run of the case as it is, the breakthrough chart shows the realisations'
 * 5–95 % and 25–75 % bands and their median behind the deterministic curve. After (and during) a
 * particle run of the case as it is, it also shows the particle curve with its statistical band,
 * ± 2 standard errors: at a pumping well the concentration of the water it delivers (captured
 * mass / pumping rate) as a step over each output interval, elsewhere the disk estimate at each
 * output time.
 */
import type { ComponentChildren } from 'preact';
import { concentrationScale, linearScale, type Scale } from './axes';
import { fromInternal, UNITS } from '../../core/units';
import { timeUnitFor } from '../../case/numbers';

/** The chart's drawing box (viewBox units) and margins, shared with charts/MonitoringCharts.tsx. */
export const W = 360;
export const H = 210;
export const M = { l: 58, r: 12, t: 12, b: 42 };

export function pathOf(xs: number[], ys: number[], sx: (v: number) => number, sy: Scale): string {
  let d = '';
  for (let k = 0; k < xs.length; k++) d += `${k ? 'L' : 'M'}${sx(xs[k]).toFixed(1)} ${sy(ys[k]).toFixed(1)}`;
  return d;
}

export function Frame(props: {
  title: string;
  xLabel: string;
  yLabel: string;
  sx: Scale;
  sy: Scale;
  children: ComponentChildren;
  testid?: string;
  /** names of the solid and dashed curves, shown under the chart */
  legend?: { main: string; alt: string | null };
  /** more entries of the key (drawn overlays), after the limit */
  keyExtra?: ComponentChildren;
}) {
  const { sx, sy } = props;
  return (
    <figure class="dg-chart" data-testid={props.testid}>
      <figcaption>{props.title}</figcaption>
      <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-label={props.title}>
        <rect x={M.l} y={M.t} width={W - M.l - M.r} height={H - M.t - M.b} class="dg-chart-bg" />
        {sy.ticks.map((t) => (
          <g key={'y' + t.value}>
            <line x1={M.l} x2={W - M.r} y1={sy(t.value)} y2={sy(t.value)} class="dg-chart-grid" />
            <text x={M.l - 5} y={sy(t.value) + 4} text-anchor="end" class="dg-chart-tick">
              {t.label}
            </text>
          </g>
        ))}
        {sx.ticks.map((t) => (
          <g key={'x' + t.value}>
            <line y1={M.t} y2={H - M.b} x1={sx(t.value)} x2={sx(t.value)} class="dg-chart-grid" />
            <text y={H - M.b + 15} x={sx(t.value)} text-anchor="middle" class="dg-chart-tick">
              {t.label}
            </text>
          </g>
        ))}
        <line x1={M.l} x2={W - M.r} y1={H - M.b} y2={H - M.b} class="dg-chart-axis" />
        <line x1={M.l} x2={M.l} y1={M.t} y2={H - M.b} class="dg-chart-axis" />
        <text x={(M.l + W - M.r) / 2} y={H - 6} text-anchor="middle" class="dg-chart-label">
          {props.xLabel}
        </text>
        <text transform={`translate(13 ${(M.t + H - M.b) / 2}) rotate(-90)`} text-anchor="middle" class="dg-chart-label">
          {props.yLabel}
        </text>
        {sy.log && (
          <text x={M.l + 4} y={M.t + 11} class="dg-chart-tick" data-testid="log-scale-note">
            log scale
          </text>
        )}
        {props.children}
      </svg>
      {props.legend && (
        <p class="dg-chart-key">
          <span class="dg-key-line" aria-hidden="true" />
          {props.legend.main}
          {props.legend.alt && (
            <>
              {'  '}
              <span class="dg-key-line dg-key-alt" aria-hidden="true" />
              {props.legend.alt}
            </>
          )}{' '}
          <span class="dg-key-line dg-key-limit" aria-hidden="true" />
          limit{props.keyExtra}
        </p>
      )}
    </figure>
  );
}

export function LimitLine({ sy, limit, label }: { sy: Scale; limit: number; label: string }) {
  const y = sy(limit);
  return (
    <g class="dg-chart-limit">
      <line x1={M.l} x2={W - M.r} y1={y} y2={y} />
      <text x={W - M.r - 4} y={y - 5} text-anchor="end">
        {label}
      </text>
    </g>
  );
}

export function solutionKey(solution: string, withAlt: boolean): { main: string; alt: string | null } {
  const name = (s: string) => (s === 'domenico' ? 'Domenico (approximate)' : 'exact solution');
  return { main: name(solution), alt: withAlt ? name(solution === 'domenico' ? 'exact' : 'domenico') : null };
}


/** Percentile bands of a receptor's breakthrough curves over Monte Carlo realisations (internal units: d, mg/L). */
export interface CurveBands {
  readonly times: ArrayLike<number>;
  readonly p5: ArrayLike<number>;
  readonly p25: ArrayLike<number>;
  readonly p50: ArrayLike<number>;
  readonly p75: ArrayLike<number>;
  readonly p95: ArrayLike<number>;
  readonly realisations: number;
}

/** A receptor's particle curve (internal units: d, mg/L), from src/case/particles.ts ParticleFigures. */
export interface ParticleCurve {
  readonly times: readonly number[];
  readonly c: readonly number[];
  readonly se: readonly number[];
  /** a pumping well's water: c[k] is the mean over (t_{k−1}, t_k], drawn as a step */
  readonly pumped: boolean;
  /** the run in words (count, seed, partial), for the key */
  readonly label: string;
}

/** The band ±2 SE and the curve, as points to draw (steps over the intervals for a pumping well). */
export function particlePoints(p: ParticleCurve): { ts: number[]; c: number[]; lo: number[]; hi: number[] } {
  const ts: number[] = [];
  const c: number[] = [];
  const lo: number[] = [];
  const hi: number[] = [];
  const push = (t: number, k: number) => {
    ts.push(t);
    c.push(p.c[k]);
    lo.push(Math.max(0, p.c[k] - 2 * p.se[k]));
    hi.push(p.c[k] + 2 * p.se[k]);
  };
  p.times.forEach((t, k) => {
    if (p.pumped) push(k > 0 ? p.times[k - 1] : 0, k);
    push(t, k);
  });
  return { ts, c, lo, hi };
}

/** The band between two curves as one closed path: along the upper, back along the lower. */
function bandPath(ts: number[], upper: number[], lower: number[], sx: (v: number) => number, sy: Scale): string {
  return `${pathOf(ts, upper, sx, sy)}L${pathOf([...ts].reverse(), [...lower].reverse(), sx, sy).slice(1)}Z`;
}

/** The key's entries for the Monte Carlo bands (5–95 %, 25–75 %, median of n realisations). */
export function BandsKey({ realisations }: { realisations: number }) {
  return (
    <>
      {'  '}
      <span class="dg-key-swatch dg-key-outer" aria-hidden="true" />
      5–95{'\u00a0'}%{' '}
      <span class="dg-key-swatch dg-key-inner" aria-hidden="true" />
      25–75{'\u00a0'}%{' '}
      <span class="dg-key-line dg-key-median" aria-hidden="true" />
      median of {realisations} Monte Carlo realisations
    </>
  );
}

/** The Monte Carlo bands (chart units already converted), drawn behind a deterministic curve. */
export function BandPaths(props: { ts: number[]; p5: number[]; p25: number[]; p50: number[]; p75: number[]; p95: number[]; sx: (v: number) => number; sy: Scale; testid: string }) {
  const { ts, sx, sy } = props;
  return (
    <g class="dg-chart-bands" data-testid={props.testid}>
      <path d={bandPath(ts, props.p95, props.p5, sx, sy)} class="dg-band-outer" />
      <path d={bandPath(ts, props.p75, props.p25, sx, sy)} class="dg-band-inner" />
      <path d={pathOf(ts, props.p50, sx, sy)} class="dg-band-median" />
    </g>
  );
}

export function BreakthroughChart(props: {
  name: string;
  times: number[];
  values: number[];
  alternate: number[] | null;
  solution: string;
  limit: number;
  arrival: number | null;
  horizon: number;
  concUnit: string;
  /** Monte Carlo percentile bands, drawn behind the deterministic curve */
  bands?: CurveBands | null;
  /** the particle curve of a run of this case, with its ± 2 SE band */
  particles?: ParticleCurve | null;
}) {
  const tu = timeUnitFor(props.horizon); // the screen's one time unit (numbers.ts)
  const cu = props.concUnit;
  const toT = (d: number) => fromInternal(d, tu);
  const toC = (c: number) => fromInternal(c, cu);
  const ts = props.times.map(toT);
  const vs = props.values.map(toC);
  const alt = props.alternate?.map(toC) ?? null;
  const lim = toC(props.limit);
  const b = props.bands;
  const bt = b ? Array.from(b.times, toT) : [];
  const [p5, p25, p50, p75, p95] = b ? [b.p5, b.p25, b.p50, b.p75, b.p95].map((q) => Array.from(q, toC)) : [[], [], [], [], []];
  const pp = props.particles ? particlePoints(props.particles) : null;
  const [pt, pc, plo, phi] = pp ? [pp.ts.map(toT), pp.c.map(toC), pp.lo.map(toC), pp.hi.map(toC)] : [[], [], [], []];
  const sx = linearScale(0, toT(props.horizon), M.l, W - M.r);
  const sy = concentrationScale([...vs, ...(alt ?? []), ...p95, ...phi], lim, H - M.b, M.t);
  // the arrival's words sit at the top of the plot; where they would run into the 'log scale'
  // note (top left, about LOG_NOTE_W wide) they go one line lower
  const arrivalX = props.arrival === null ? 0 : Math.min(sx(toT(props.arrival)) + 5, W - M.r - 70);
  const arrivalY = arrivalLabelY(arrivalX, sy.log);
  return (
    <Frame
      title={`Breakthrough at ${props.name}`}
      xLabel={`time since the release began (${UNITS[tu].label})`}
      yLabel={`concentration (${UNITS[cu].label})`}
      sx={sx}
      sy={sy}
      testid="breakthrough-chart"
      legend={solutionKey(props.solution, !!alt)}
      keyExtra={
        <>
          {b && <BandsKey realisations={b.realisations} />}
          {props.particles && (
            <span data-testid="particle-key">
              {'  '}
              <span class="dg-key-line dg-key-particles" aria-hidden="true" />
              {props.particles.label}
              {props.particles.pumped ? ', the water pumped' : ''}{' '}
              <span class="dg-key-swatch dg-key-particle-band" aria-hidden="true" />± 2 standard errors
            </span>
          )}
        </>
      }
    >
      {b && <BandPaths ts={bt} p5={p5} p25={p25} p50={p50} p75={p75} p95={p95} sx={sx} sy={sy} testid="breakthrough-bands" />}
      <LimitLine sy={sy} limit={lim} label={`limit ${Number(lim.toPrecision(3))} ${UNITS[cu].label}`} />
      {alt && <path d={pathOf(ts, alt, sx, sy)} class="dg-chart-alt" />}
      <path d={pathOf(ts, vs, sx, sy)} class="dg-chart-line" />
      {pp && (
        <g class="dg-chart-particles" data-testid="particle-curve">
          <path d={bandPath(pt, phi, plo, sx, sy)} class="dg-chart-particle-band" />
          <path d={pathOf(pt, pc, sx, sy)} class="dg-chart-particle-line" />
        </g>
      )}
      {props.arrival !== null && (
        <g class="dg-chart-arrival">
          <line x1={sx(toT(props.arrival))} x2={sx(toT(props.arrival))} y1={M.t} y2={H - M.b} />
          <circle cx={sx(toT(props.arrival))} cy={sy(lim)} r={4.5} />
          <text x={arrivalX} y={arrivalY} data-testid="arrival-label">
            reaches limit: {Number(toT(props.arrival).toPrecision(3))} {UNITS[tu].label}
          </text>
        </g>
      )}
    </Frame>
  );
}

/** Width of the 'log scale' note, chart units (9 characters of 10 px DejaVu Sans, under 6.2 px each). */
const LOG_NOTE_W = 58;

/**
 * The baseline of the breakthrough chart's "reaches limit" words starting at x: the top line of the
 * plot, or one line lower where a log scale's note (top left, baseline M.t + 11) would be under them.
 */
export function arrivalLabelY(x: number, log: boolean): number {
  return log && x < M.l + 4 + LOG_NOTE_W ? M.t + 27 : M.t + 13;
}

/** Approximate width of a receptor label, chart units (10 px DejaVu Sans averages under 6.2 px a character). */
const labelWidth = (s: string) => 6.2 * s.length + 4;
const LABEL_ROWS = 3;

/**
 * Receptor labels along the profile's distance axis, in rows so that none overprints another:
 * each goes into the lowest row where it clears the labels already there (left to right), cut
 * short when no row has room; receptors past the axis are listed at its right end with their
 * distance (→ name, 866 m).
 */
export function receptorMarks(rs: { name: string; x: number }[], xMax: number, unit: string) {
  const sx = linearScale(0, xMax, M.l, W - M.r);
  const rowEnd: number[] = Array(LABEL_ROWS).fill(-Infinity);
  const out: { name: string; x: number; label: string; row: number; anchor: 'start' | 'middle' | 'end'; beyond: boolean }[] = [];
  let beyondRow = 0;
  for (const r of [...rs].filter((r) => r.x > 0).sort((a, b) => a.x - b.x)) {
    if (r.x > xMax) {
      if (beyondRow < LABEL_ROWS) out.push({ ...r, label: `→ ${r.name}, ${Number(r.x.toPrecision(3))} ${UNITS[unit]?.label ?? unit}`, row: LABEL_ROWS - 1 - beyondRow++, anchor: 'end', beyond: true });
      continue;
    }
    const px = sx(r.x);
    let label = r.name;
    let row = rowEnd.findIndex((end) => end + 4 <= px - labelWidth(label) / 2);
    if (row < 0) {
      // no row with room for the whole name: the row that ends first, the name cut to fit
      row = rowEnd.indexOf(Math.min(...rowEnd));
      const room = Math.max(0, 2 * (px - rowEnd[row] - 4));
      const chars = Math.max(1, Math.floor((room - 4) / 6.2) - 1);
      label = chars < r.name.length ? `${r.name.slice(0, chars)}…` : r.name;
    }
    const w = labelWidth(label);
    // keep the label inside the plot: anchored at its start near the left edge, at its end near the right
    const anchor = px - w / 2 < M.l ? 'start' : px + w / 2 > W - M.r ? 'end' : 'middle';
    const right = anchor === 'start' ? px + w : anchor === 'end' ? px : px + w / 2;
    rowEnd[row] = right;
    out.push({ ...r, label, row, anchor, beyond: false });
  }
  return out;
}

export function ProfileChart(props: {
  xs: number[];
  values: number[];
  alternate: number[] | null;
  solution: string;
  limit: number;
  time: number;
  concUnit: string;
  lengthUnit: string;
  receptors: { name: string; x: number }[];
}) {
  const lu = props.lengthUnit;
  const cu = props.concUnit;
  const toX = (m: number) => fromInternal(m, lu);
  const toC = (c: number) => fromInternal(c, cu);
  const xs = props.xs.map(toX);
  const vs = props.values.map(toC);
  const alt = props.alternate?.map(toC) ?? null;
  const lim = toC(props.limit);
  const sx = linearScale(0, xs[xs.length - 1] ?? 1, M.l, W - M.r);
  const sy = concentrationScale([...vs, ...(alt ?? [])], lim, H - M.b, M.t);
  const when = props.time === Infinity ? 'steady state' : `${Number((props.time / 365.25).toPrecision(3))} yr`;
  return (
    <Frame
      title={`Along the plume centreline (${when})`}
      xLabel={`distance downgradient of the source (${UNITS[lu].label})`}
      yLabel={`concentration (${UNITS[cu].label})`}
      sx={sx}
      sy={sy}
      testid="profile-chart"
      legend={solutionKey(props.solution, !!alt)}
    >
      <LimitLine sy={sy} limit={lim} label={`limit ${Number(lim.toPrecision(3))} ${UNITS[cu].label}`} />
      {alt && <path d={pathOf(xs, alt, sx, sy)} class="dg-chart-alt" />}
      <path d={pathOf(xs, vs, sx, sy)} class="dg-chart-line" />
      {receptorMarks(props.receptors.map((r) => ({ name: r.name, x: toX(r.x) })), sx.domain[1], lu).map((r) =>
        r.beyond ? (
          <text class="dg-chart-receptor dg-chart-beyond" key={r.name + r.x} x={W - M.r - 2} y={H - M.b - 13 - r.row * 12} text-anchor="end">
            {r.label}
          </text>
        ) : (
          <g class="dg-chart-receptor" key={r.name + r.x}>
            <line x1={sx(r.x)} x2={sx(r.x)} y1={H - M.b} y2={H - M.b - 10} />
            <text x={sx(r.x)} y={H - M.b - 13 - r.row * 12} text-anchor={r.anchor}>
              {r.label}
            </text>
          </g>
        ),
      )}
    </Frame>
  );
}
