/**
 * A plan of the site for the printed report, drawn in SVG from the case and its results: plume
 * contours, the release (point and footprint), the receptors with their names, the flow arrow,
 * a scale bar and north. Drawn in local metres east/north of the datum (the geographic frame's
 * tangent plane), north up, one scale in both directions. The basemap is not printed: tiles may
 * be missing offline and their terms differ by server.
 */
import type { Case } from '../../case/schema';
import { makeLocalFrame } from '../../geo/projection';
import type { PreparedCase } from '../../case/prepare';
import { plumeGeoJSON, type Evaluation } from '../results';

const W = 680;
const H = 420;
const PAD = 36;

function niceLength(target: number): number {
  const p = 10 ** Math.floor(Math.log10(target));
  for (const m of [1, 2, 5, 10]) if (m * p >= target) return m * p;
  return 10 * p;
}

export function SitePlan({ c, prepared, results }: { c: Case; prepared: PreparedCase | null; results: Evaluation | null }) {
  const frame = makeLocalFrame(c.site.frame, c.site.datum);
  const en = (p: readonly number[]) => frame.toEN([p[0], p[1]]);
  const pts: [number, number][] = [];
  const src = en(c.site.source.position);
  pts.push(src);
  const foot = c.site.source.footprint?.map(en) ?? null;
  if (foot) pts.push(...foot);
  const recs = c.site.receptors.map((r) => ({ name: r.name, p: en(r.position), id: r.id }));
  pts.push(...recs.map((r) => r.p));
  const bands = (results?.plume ? plumeGeoJSON(results.plume).features : []).map((f) => ({
    threshold: f.properties.threshold,
    polys: f.geometry.coordinates.map((poly) => poly.map((ring) => ring.map(en))),
  }));
  for (const b of bands) for (const poly of b.polys) pts.push(...poly[0]);
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
  const bar = niceLength((W * 0.2) / s);
  const limit = results?.limit ?? null;

  return (
    <figure class="dg-plan">
      <svg viewBox={`0 0 ${W} ${H}`} role="img" aria-label="Site plan with plume contours, release and receptors" data-testid="site-plan">
        <rect x="0" y="0" width={W} height={H} class="dg-plan-bg" />
        {bands.map((b, i) => (
          <path
            key={i}
            d={b.polys.map((poly) => poly.map(path).join('')).join('')}
            class={`dg-plan-band${limit !== null && b.threshold <= limit * 1.000001 ? ' is-limit' : ''}`}
            fill-rule="evenodd"
          />
        ))}
        {foot && <path d={path(foot)} class="dg-plan-foot" />}
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
        <rect x={X(src[0]) - 5} y={Y(src[1]) - 5} width="10" height="10" class="dg-plan-source" />
        {recs.map((r) => (
          <g key={r.id} class="dg-plan-rec">
            <circle cx={X(r.p[0])} cy={Y(r.p[1])} r="6" />
            <text x={X(r.p[0]) + 9} y={Y(r.p[1]) - 8}>
              {r.name}
            </text>
          </g>
        ))}
        <g class="dg-plan-scale" transform={`translate(${PAD} ${H - 18})`}>
          <line x1="0" y1="0" x2={bar * s} y2="0" />
          <line x1="0" y1="-5" x2="0" y2="5" />
          <line x1={bar * s} y1="-5" x2={bar * s} y2="5" />
          <text x={(bar * s) / 2} y="-7" text-anchor="middle">
            {bar >= 1000 ? `${bar / 1000} km` : `${bar} m`}
          </text>
        </g>
        <g class="dg-plan-north" transform={`translate(${W - 28} 34)`}>
          <path d="M0 -18L7 6L0 1L-7 6Z" />
          <text x="0" y="20" text-anchor="middle">
            N
          </text>
        </g>
      </svg>
      <figcaption>
        Site plan{results?.plume ? `, contours at ${Number.isFinite(results.plume.time) ? `${Number((results.plume.time / 365.25).toPrecision(3))} yr` : 'steady state'}` : ''}: the outer line is the
        limit; inner bands are multiples of it. ■ release · ● receptor · arrow: groundwater flow. North up; basemap not printed.
      </figcaption>
    </figure>
  );
}
