/**
 * The site grid: lines every "nice" number of metres (or feet, in a US customary case) from the
 * site datum, labelled in the case's unit system (src/case/unitSystem.ts gridStep, scaleLabel). It is the
 * map's background when tiles cannot load (offline, no signal) and in the local-coordinates mode,
 * so work continues with a scale bar and north arrow. It lives in its own SVG under Leaflet's
 * panes (showing through wherever no tile is drawn) and is redrawn on every move so it never lags.
 */
import * as L from 'leaflet';
import { gridStep, scaleLabel, type UnitSystem } from '../../case/unitSystem';
import { overlaps, type Rect } from './declutter';

export interface GridFrame {
  toEN(ll: L.LatLng): [number, number];
  fromEN(en: [number, number]): L.LatLng;
  /** the case's unit system, read at each redraw */
  system(): UnitSystem;
}

/** Grid labels are 11 px type (app.css .dg-grid-label): about 6.5 px a character, 11 px tall above the baseline. */
const labelBox = (x: number, baseline: number, text: string): Rect => ({ x, y: baseline - 11, w: 6.5 * text.length, h: 14 });

export class SiteGridLayer extends L.Layer {
  private svg: SVGSVGElement | null = null;
  private host: L.Map | null = null;
  /** the map's controls at the left edge, where the grid's labels sit (measured once per size, not on every move) */
  private controls: { topLeft: Rect[]; bottomLeft: Rect[] } | null = null;
  constructor(private frame: GridFrame) {
    super();
  }

  override onAdd(map: L.Map): this {
    this.host = map;
    this.svg = document.createElementNS('http://www.w3.org/2000/svg', 'svg');
    this.svg.setAttribute('class', 'dg-site-grid');
    this.svg.setAttribute('aria-hidden', 'true');
    map.getContainer().querySelector('.dg-grid-host')?.remove();
    const host = document.createElement('div');
    host.className = 'dg-grid-host';
    host.appendChild(this.svg);
    map.getContainer().appendChild(host);
    map.on('move zoom resize viewreset', this.redraw, this);
    map.on('resize', this.controlsMoved, this);
    this.redraw();
    return this;
  }

  /** The map's controls changed place or size (a resize, a new scale bar): measure them again at the next redraw. */
  controlsMoved(): void {
    this.controls = null;
  }

  private controlBoxes(map: L.Map): { topLeft: Rect[]; bottomLeft: Rect[] } {
    if (this.controls) return this.controls;
    const el = map.getContainer();
    const at = el.getBoundingClientRect();
    const boxes = (corner: string): Rect[] =>
      Array.from(el.querySelectorAll(`.leaflet-${corner} .leaflet-control`), (c) => {
        const r = c.getBoundingClientRect();
        return { x: r.left - at.left - 3, y: r.top - at.top - 3, w: r.width + 6, h: r.height + 6 };
      }).filter((b) => b.w > 6);
    const found = { topLeft: boxes('top.leaflet-left'), bottomLeft: boxes('bottom.leaflet-left') };
    // not laid out yet (the zoom buttons are always there): measure again next time
    if (found.topLeft.length) this.controls = found;
    return found;
  }

  override onRemove(map: L.Map): this {
    map.off('move zoom resize viewreset', this.redraw, this);
    map.off('resize', this.controlsMoved, this);
    this.svg?.parentElement?.remove();
    this.svg = null;
    this.host = null;
    return this;
  }

  redraw(): void {
    const map = this.host;
    const svg = this.svg;
    if (!map || !svg) return;
    const size = map.getSize();
    svg.setAttribute('width', String(size.x));
    svg.setAttribute('height', String(size.y));
    const corners = [
      [0, 0],
      [size.x, 0],
      [0, size.y],
      [size.x, size.y],
    ].map(([x, y]) => this.frame.toEN(map.containerPointToLatLng([x, y])));
    const es = corners.map((c) => c[0]);
    const ns = corners.map((c) => c[1]);
    const e0 = Math.min(...es), e1 = Math.max(...es), n0 = Math.min(...ns), n1 = Math.max(...ns);
    if (![e0, e1, n0, n1].every(Number.isFinite) || e1 - e0 <= 0) return;
    const system = this.frame.system();
    const step = gridStep(Math.max(e1 - e0, n1 - n0), size.x < 500 ? 5 : 8, system);
    const fmt = (v: number) => scaleLabel(v, system, step);
    const controls = this.controlBoxes(map);
    const parts: string[] = [];
    const line = (pts: [number, number][], major: boolean) => {
      const d = pts
        .map((en, k) => {
          const p = map.latLngToContainerPoint(this.frame.fromEN(en));
          return `${k ? 'L' : 'M'}${p.x.toFixed(1)} ${p.y.toFixed(1)}`;
        })
        .join('');
      parts.push(`<path d="${d}" class="${major ? 'dg-grid-major' : 'dg-grid-minor'}"/>`);
    };
    const samples = 8;
    for (let k = Math.ceil(e0 / step); k * step <= e1; k++) {
      const e = k * step;
      const pts: [number, number][] = [];
      for (let k = 0; k <= samples; k++) pts.push([e, n0 + ((n1 - n0) * k) / samples]);
      const major = Math.abs(e) < step / 2;
      line(pts, major);
      const p = map.latLngToContainerPoint(this.frame.fromEN([e, n0 + (n1 - n0) * 0.02]));
      // along the foot of the map; above the scale bar where it would sit under it
      const text = `E ${fmt(e)}`;
      let y = size.y - 8;
      for (const b of controls.bottomLeft) if (overlaps(labelBox(p.x + 4, y, text), b)) y = Math.min(y, b.y - 4);
      parts.push(`<text x="${(p.x + 4).toFixed(1)}" y="${y.toFixed(1)}" class="dg-grid-label">${text}</text>`);
    }
    for (let k = Math.ceil(n0 / step); k * step <= n1; k++) {
      const n = k * step;
      const pts: [number, number][] = [];
      for (let k = 0; k <= samples; k++) pts.push([e0 + ((e1 - e0) * k) / samples, n]);
      line(pts, Math.abs(n) < step / 2);
      const p = map.latLngToContainerPoint(this.frame.fromEN([e0, n]));
      // along the left edge; beside the zoom buttons where it would sit under them
      const text = `N ${fmt(n)}`;
      let x = 6;
      for (const b of [...controls.topLeft, ...controls.bottomLeft]) if (overlaps(labelBox(x, p.y - 4, text), b)) x = Math.max(x, b.x + b.w + 3);
      parts.push(`<text x="${x.toFixed(1)}" y="${(p.y - 4).toFixed(1)}" class="dg-grid-label">${text}</text>`);
    }
    svg.innerHTML = parts.join('');
  }
}

/** North arrow control (north is up in both the web-map projection and the local frame). */
export const NorthArrow = L.Control.extend({
  onAdd() {
    const el = L.DomUtil.create('div', 'dg-north');
    el.setAttribute('role', 'img');
    el.setAttribute('aria-label', 'North is up');
    el.innerHTML = `<svg viewBox="-20 -26 40 52" width="34" height="44" aria-hidden="true">
      <path d="M0 -18L9 12L0 6L-9 12Z" fill="var(--ink)" stroke="var(--paper)" stroke-width="2" stroke-linejoin="round"/>
      <text y="-19" text-anchor="middle" font-size="12" font-weight="700" fill="var(--ink)" stroke="var(--paper)" stroke-width="3" paint-order="stroke">N</text></svg>`;
    return el;
  },
});
