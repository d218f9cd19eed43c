/**
 * A plan of the site for the printed report, drawn in SVG from the case and its results: plume
 * contours, the release (point and footprint), the receptors with their names, the flow arrow,
 * a scale bar (in the case's unit system: m/km or ft/mi) and north. Drawn in local metres east/north of the datum (the geographic frame's
 * tangent plane), north up, one scale in both directions. The basemap is not printed: tiles may
 * be missing offline and their terms differ by server. The release and receptors are the map's
 * own symbols (map/markShapes.ts), each receptor filled with its status colour as on the map;
 * names sit beside their mark on whichever side keeps them inside the plan; a legend under it
 * shows each symbol, colour and band used. After a completed Monte Carlo run of the case as it is,
 * the lines of its probability of exceeding the limit at the same time (as on the map), with their
 * levels in the legend and the run's count, seed and standard error under the plan. Where wells
 * pump, the well field as on the map: each capture zone's outline, the boundary lines (drawn across
 * the plan: the model takes them as unbounded) and the lines of equal water level with their levels
 * (placed by the map's own rule, map/declutter.ts placeOnLines, clear of the marks and names); they
 * do not widen the plan, which stays framed on the release, receptors and plume.
 */
import { niceScaleLength, scaleLabel, unitSystem } from '../../case/unitSystem';
import type { Case } from '../../case/schema';
import { makeLocalFrame } from '../../geo/projection';
import type { PreparedCase } from '../../case/prepare';
import type { ReceptorKind } from '../../case/schema';
import { plumeGeoJSON, type Evaluation } from '../results';
import { RECEPTOR_SHAPES, SOURCE_SHAPE } from '../map/markShapes';
import { kindText } from '../../case/receptorKinds';
import { statusText } from '../../core/results';
import { fmtTime } from '../format';
import { packedPolygons } from '../../geo/contours';
import { currentRunFor } from '../uncertaintyState';
import { placeOnLines, type Rect } from '../map/declutter';

const W = 680;
const H = 420;
const PAD = 36;

/** the marks drawn at this scale of their 32-unit box */
const MARK = 0.7;
/** name labels: 13 px bold, about this wide per character (a generous estimate, so a label never runs off) */
const CHAR_W = 8;
const LABEL_MAX = 30;

/**
 * Where a mark's name goes: right of the mark, or left of it when that would run past the plan's
 * edge; above the mark, or below it near the top. Names longer than LABEL_MAX characters are cut short.
 */
export function labelPlace(x: number, y: number, name: string, width = W, height = H): { x: number; y: number; anchor: 'start' | 'end'; text: string } {
  const text = name.length > LABEL_MAX ? `${name.slice(0, LABEL_MAX - 1)}…` : name;
  const w = text.length * CHAR_W;
  const gap = 16 * MARK + 3;
  const right = x + gap + w <= width - 4;
  const left = x - gap - w >= 4;
  const anchor = right || !left ? 'start' : 'end';
  const lx = anchor === 'start' ? Math.min(x + gap, Math.max(4, width - 4 - w)) : x - gap;
  const ly = y - 10 < 14 ? y + 22 : y - 8;
  return { x: lx, y: Math.min(ly, height - 6), anchor, text };
}

export function SitePlan({ c, prepared, results }: { c: Case; prepared: PreparedCase | null; results: Evaluation | null }) {
  const frame = makeLocalFrame(c.site.frame, c.site.datum);
  const en = (p: readonly number[]) => frame.toEN([p[0], p[1]]);
  const pts: [number, number][] = [];
  const src = en(c.site.source.position);
  pts.push(src);
  const foot = c.site.source.footprint?.map(en) ?? null;
  if (foot) pts.push(...foot);
  const statusOf = new Map(results?.receptors.map((r) => [r.id, r.status]) ?? []);
  const recs = c.site.receptors.map((r) => ({ name: r.name, p: en(r.position), id: r.id, kind: r.kind, status: statusOf.get(r.id) ?? null }));
  pts.push(...recs.map((r) => r.p));
  const bands = (results?.plume ? plumeGeoJSON(results.plume).features : []).map((f) => ({
    threshold: f.properties.threshold,
    polys: f.geometry.coordinates.map((poly) => poly.map((ring) => ring.map(en))),
  }));
  for (const b of bands) for (const poly of b.polys) pts.push(...poly[0]);
  // the probability lines of a completed Monte Carlo run of the case as it is (as on the map)
  const run = currentRunFor(c);
  const pm = run?.status === 'done' && run.result ? run.map : null;
  const chances = pm ? pm.levels.map((level, k) => ({ level, rings: packedPolygons(pm.bands, k).flatMap((poly) => poly.map((ring) => ring.map(en))) })) : [];
  for (const ch of chances) for (const ring of ch.rings) pts.push(...ring);
  let arrow: [[number, number], [number, number]] | null = null;
  if (prepared) {
    const reach = Math.max(results?.plumeLength ?? 0, ...prepared.receptors.map((r) => r.x), 20) * 0.35;
    arrow = [en(prepared.toMap(0, 0)), en(prepared.toMap(reach, 0))];
  }

  let x0 = Math.min(...pts.map((p) => p[0]));
  let x1 = Math.max(...pts.map((p) => p[0]));
  let y0 = Math.min(...pts.map((p) => p[1]));
  let y1 = Math.max(...pts.map((p) => p[1]));
  const span = Math.max(x1 - x0, y1 - y0, 40);
  const cx = (x0 + x1) / 2;
  const cy = (y0 + y1) / 2;
  const s = Math.min((W - 2 * PAD) / Math.max(x1 - x0, span * 0.3), (H - 2 * PAD) / Math.max(y1 - y0, span * 0.3)) * 0.92;
  x0 = cx - (W / 2) / s;
  y1 = cy + (H / 2) / s;
  const X = (e: number) => (e - x0) * s;
  const Y = (n: number) => (y1 - n) * s;
  const path = (ring: [number, number][]) => ring.map((p, i) => `${i ? 'L' : 'M'}${X(p[0]).toFixed(1)} ${Y(p[1]).toFixed(1)}`).join('') + 'Z';
  const open = (line: readonly [number, number][]) => line.map((p, i) => `${i ? 'L' : 'M'}${X(p[0]).toFixed(1)} ${Y(p[1]).toFixed(1)}`).join('');
  // the well field (results.wells): capture zones, boundary lines, lines of equal water level
  const wl = results?.wells ?? null;
  const zones = wl ? wl.zones.filter((z) => z.envelope.length >= 3).map((z) => z.envelope.map(en)) : [];
  const edges = (c.site.boundaries ?? []).map((b) => {
    const a = en(b.points[0]);
    const z = en(b.points[1]);
    const len = Math.hypot(z[0] - a[0], z[1] - a[1]) || 1;
    const far = (4 * Math.max(W, H)) / s / len; // past the plan's edges both ways
    return { kind: b.kind, d: open([[a[0] - far * (z[0] - a[0]), a[1] - far * (z[1] - a[1])], [z[0] + far * (z[0] - a[0]), z[1] + far * (z[1] - a[1])]]) };
  });
  const hc = wl?.headContours && wl.headContours.levels.length ? wl.headContours : null;
  const headLines = hc ? hc.levels.map((lv) => ({ label: lv.label, lines: lv.lines.map((piece) => piece.map(en)) })) : [];
  const headLabels = (() => {
    if (!hc) return [];
    // clear of the release and receptor marks and their names (labelPlace's boxes), the scale and north
    const blocked: Rect[] = [
      { x: X(src[0]) - 12, y: Y(src[1]) - 12, w: 24, h: 24 },
      { x: PAD - 4, y: H - 40, w: W * 0.3, h: 40 },
      { x: W - 48, y: 8, w: 44, h: 52 },
    ];
    for (const r of recs) {
      const x = X(r.p[0]);
      const y = Y(r.p[1]);
      const l = labelPlace(x, y, r.name);
      const w = l.text.length * CHAR_W;
      blocked.push({ x: x - 12, y: y - 12, w: 24, h: 24 }, { x: l.anchor === 'start' ? l.x : l.x - w, y: l.y - 13, w, h: 17 });
    }
    const items = headLines.flatMap((lv, k) =>
      lv.lines.map((line, j) => ({ id: `${k}:${j}`, label: lv.label, points: line.map((p) => ({ x: X(p[0]), y: Y(p[1]) })), w: lv.label.length * 7 + 6, h: 15 })),
    );
    const placed = placeOnLines(items, blocked, W, H);
    return items.flatMap((it) => {
      const at = placed.get(it.id);
      return at ? [{ ...at, label: it.label }] : [];
    });
  })();
  const scale = niceScaleLength((W * 0.2) / s, unitSystem(c));
  const bar = scale.metres;
  const limit = results?.limit ?? null;

  return (
    <figure class="dg-plan">
      <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-label="Site plan with plume contours, release and receptors" data-testid="site-plan">
        <rect x="0" y="0" width={W} height={H} class="dg-plan-bg" />
        {zones.map((z, i) => (
          <path key={`z${i}`} d={path(z)} class="dg-plan-capture" />
        ))}
        {headLines.map((lv, k) => (
          <path key={`h${k}`} d={lv.lines.map(open).join('')} class="dg-plan-head" />
        ))}
        {bands.map((b, i) => (
          <path
            key={i}
            d={b.polys.map((poly) => poly.map(path).join('')).join('')}
            class={`dg-plan-band${limit !== null && b.threshold <= limit * 1.000001 ? ' is-limit' : ''}`}
            fill-rule="evenodd"
          />
        ))}
        {chances.map((ch, k) =>
          ch.rings.length ? <path key={`p${k}`} d={ch.rings.map(path).join('')} class={`dg-plan-pexceed dg-pexceed-${k}`} data-level={ch.level} /> : null,
        )}
        {foot && <path d={path(foot)} class="dg-plan-foot" />}
        {edges.map((e, i) => (
          <path key={`b${i}`} d={e.d} class={`dg-plan-boundary dg-plan-boundary-${e.kind}`} />
        ))}
        {headLabels.map((l, i) => (
          <text key={`hl${i}`} x={l.x.toFixed(1)} y={(l.y + 4).toFixed(1)} text-anchor="middle" class="dg-plan-head-label">
            {l.label}
          </text>
        ))}
        {arrow && (
          <g class="dg-plan-arrow">
            <defs>
              <marker id="dg-plan-head" viewBox="0 0 10 10" refX="9" refY="5" markerWidth="7" markerHeight="7" orient="auto">
                <path d="M0 0L10 5L0 10z" />
              </marker>
            </defs>
            <line x1={X(arrow[0][0])} y1={Y(arrow[0][1])} x2={X(arrow[1][0])} y2={Y(arrow[1][1])} marker-end="url(#dg-plan-head)" />
          </g>
        )}
        <g class="dg-plan-source" transform={`translate(${X(src[0]).toFixed(1)} ${Y(src[1]).toFixed(1)}) scale(${MARK})`} dangerouslySetInnerHTML={{ __html: SOURCE_SHAPE }} />
        {recs.map((r) => {
          const x = X(r.p[0]);
          const y = Y(r.p[1]);
          const l = labelPlace(x, y, r.name);
          return (
            <g key={r.id} class={`dg-plan-rec${r.status ? ` dg-status-${r.status}` : ''}`} data-status={r.status ?? undefined}>
              <g transform={`translate(${x.toFixed(1)} ${y.toFixed(1)}) scale(${MARK})`} dangerouslySetInnerHTML={{ __html: RECEPTOR_SHAPES[r.kind] }} />
              <text x={l.x.toFixed(1)} y={l.y.toFixed(1)} text-anchor={l.anchor} class="dg-plan-label">
                {l.text}
              </text>
            </g>
          );
        })}
        <g class="dg-plan-scale" transform={`translate(${PAD} ${H - 18})`}>
          <line x1="0" y1="0" x2={bar * s} y2="0" />
          <line x1="0" y1="-5" x2="0" y2="5" />
          <line x1={bar * s} y1="-5" x2={bar * s} y2="5" />
          <text x={(bar * s) / 2} y="-7" text-anchor="middle">
            {scale.label}
          </text>
        </g>
        <g class="dg-plan-north" transform={`translate(${W - 28} 34)`}>
          <path d="M0 -18L7 6L0 1L-7 6Z" />
          <text x="0" y="20" text-anchor="middle">
            N
          </text>
        </g>
      </svg>
      <PlanKey
        kinds={[...new Set(recs.map((r) => r.kind))]}
        statuses={[...new Set(recs.map((r) => r.status).filter((x) => x !== null))]}
        bands={bands.length}
        multiples={limit ? bands.slice(1).map((b) => Math.round(b.threshold / limit)) : []}
        flow={!!arrow}
        chances={chances.filter((ch) => ch.rings.length).map((ch) => ({ level: ch.level, k: chances.indexOf(ch) }))}
        capture={zones.length > 0}
        boundaries={[...new Set(edges.map((e) => e.kind))]}
        heads={hc ? `water level relative to the release, every ${Number(hc.step.toPrecision(6))} ${hc.unit}` : null}
      />
      <figcaption>
        Site plan{results?.plume ? `, contours ${Number.isFinite(results.plume.time) ? `after ${fmtTime(results.plume.time)}` : 'at steady state'}` : ''}: the outer line is the limit; inner bands are
        multiples of it.
        {pm && run?.result && (
          <>
            {' '}
            Dotted, dashed and solid lines: where the probability that the concentration exceeds the limit at that time is{' '}
            {pm.levels.map((l) => `${Math.round(100 * l)} %`).join(', ')}, from {pm.realisations} of the {run.result.runs} realisations of the Monte Carlo run (seed {run.result.seed}),
            each ± up to {(100 * pm.maxStandardError).toFixed(1)} % (one standard error); conditional on the chosen distributions and the model’s assumptions.
          </>
        )}
        {zones.length > 0 && ' Capture zones: steady flow, traced to 100 years of water travel.'}
        {hc &&
          ` Lines of equal water level: confined form (saturated thickness held constant), relative to the release, none within ${scaleLabel(hc.clipRadius, unitSystem(c), 1)} of a pumping well.`}{' '}
        North up; basemap not printed.
      </figcaption>
    </figure>
  );
}

/** One symbol of the legend, drawn as on the plan. */
function KeySymbol({ children }: { children: preact.ComponentChildren }) {
  return (
    <svg viewBox="-16 -16 32 32" width="20" height="20" aria-hidden="true">
      {children}
    </svg>
  );
}

const STATUS_ORDER = ['reaches-limit', 'not-reached-in-horizon', 'below-limit'];

/** The plan's legend: the release, each kind of receptor and status colour present, the bands and the flow arrow. */
function PlanKey({
  kinds,
  statuses,
  bands,
  multiples,
  flow,
  chances,
  capture,
  boundaries,
  heads,
}: {
  kinds: ReceptorKind[];
  statuses: string[];
  bands: number;
  multiples: number[];
  flow: boolean;
  chances: { level: number; k: number }[];
  capture: boolean;
  boundaries: string[];
  heads: string | null;
}) {
  return (
    <ul class="dg-plan-key" data-testid="site-plan-key">
      <li data-key="release">
        <KeySymbol>
          <g class="dg-plan-source" dangerouslySetInnerHTML={{ __html: SOURCE_SHAPE }} />
        </KeySymbol>
        release
      </li>
      {kinds.map((k) => (
        <li key={k} data-key={`kind-${k}`}>
          <KeySymbol>
            <g class="dg-plan-rec" dangerouslySetInnerHTML={{ __html: RECEPTOR_SHAPES[k] }} />
          </KeySymbol>
          {kindText(k)}
        </li>
      ))}
      {STATUS_ORDER.filter((st) => statuses.includes(st)).map((st) => (
        <li key={st} data-key={`status-${st}`}>
          <KeySymbol>
            <g class={`dg-plan-rec dg-status-${st}`}>
              <circle r="11" class="dg-plan-status-swatch" />
            </g>
          </KeySymbol>
          {statusText(st)}
        </li>
      ))}
      {bands > 0 && (
        <li data-key="band-limit">
          <KeySymbol>
            <rect x="-13" y="-9" width="26" height="18" class="dg-plan-band is-limit" />
          </KeySymbol>
          above the limit
        </li>
      )}
      {multiples.length > 0 && (
        <li data-key="band-multiple">
          <KeySymbol>
            <rect x="-13" y="-9" width="26" height="18" class="dg-plan-band" />
          </KeySymbol>
          above {multiples.map((m) => `${m}×`).join(', ')} the limit
        </li>
      )}
      {chances.map(({ level, k }) => (
        <li key={`p${k}`} data-key={`pexceed-${k}`}>
          <KeySymbol>
            <path d="M-13 0H13" class={`dg-plan-pexceed dg-pexceed-${k}`} />
          </KeySymbol>
          P(exceeds the limit) {Math.round(100 * level)} %
        </li>
      ))}
      {capture && (
        <li data-key="capture">
          <KeySymbol>
            <rect x="-13" y="-9" width="26" height="18" class="dg-plan-capture" />
          </KeySymbol>
          capture zone
        </li>
      )}
      {boundaries.map((b) => (
        <li key={b} data-key={`boundary-${b}`}>
          <KeySymbol>
            <path d="M-13 0H13" class={`dg-plan-boundary dg-plan-boundary-${b}`} />
          </KeySymbol>
          {b === 'constant-head' ? 'river or shore (constant head)' : 'impermeable boundary'}
        </li>
      ))}
      {heads && (
        <li data-key="heads">
          <KeySymbol>
            <path d="M-13 0H13" class="dg-plan-head" />
          </KeySymbol>
          {heads}
        </li>
      )}
      {flow && (
        <li data-key="flow">
          <KeySymbol>
            <path d="M-13 0H7" class="dg-plan-key-arrow" />
            <path d="M4 -6L13 0L4 6Z" class="dg-plan-key-head" />
          </KeySymbol>
          groundwater flow
        </li>
      )}
    </ul>
  );
}
