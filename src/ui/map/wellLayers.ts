/**
 * The well field on the map, kept apart from the plume and the marks (siteMap.ts hands it the map):
 * - each pumping well's capture zone (the ground whose water the well draws, as far as traced) and
 *   its time-of-travel marks at 1, 5, 10 and 25 years, for water or for the contaminant (× R), each
 *   labelled, from the receptor worker's results (src/case/wells.ts mapCaptureZones);
 * - the straight boundary lines of the case (a river or lake shore held at constant head, an
 *   impermeable barrier): the stretch between the two points drawn solid, the line's continuation
 *   beyond them dashed (the model takes it as infinitely long), with a handle at each point to drag;
 * - the 'add-boundary' tool: two taps on the map make a new line (a constant-head line by default;
 *   its kind and name are edited in the flow panel).
 * - the lines of equal head around the wells (src/case/headContours.ts: the water level relative to
 *   the release, confined form, at round intervals of the case's length unit), beside the capture
 *   zones, each labelled with its level where a label fits (declutter.ts placeOnLines: clear of the
 *   marks, their labels, the map's controls and notices, and each other); shown or hidden from the
 *   well-field legend (showHeadLines).
 * Each boundary line's name sits on the line where it finds room in the view, placed like the head
 * levels (placeLabels, after the marks' labels).
 * Own panes, so the zones and head lines lie under the plume bands and the boundary lines and
 * labels over them.
 */
import * as L from 'leaflet';
import { signal } from '@preact/signals';
import type { Case, Position } from '../../case/schema';
import type { WellsLayer } from '../results';
import type { HeadContours } from '../../case/headContours';
import { placeOnLines, type Rect } from './declutter';
import { newId } from '../../case/defaults';
import { updateCase } from '../state';
import { escapeHtml } from './symbols';

export type TravelMarks = 'water' | 'contaminant';
/** which time-of-travel marks are drawn (screen-only) */
export const travelMarks = signal<TravelMarks>('water');
/** whether the lines of equal head are drawn (screen-only) */
export const showHeadLines = signal(true);
export type HeadForm = 'confined' | 'unconfined';
/** which form's levels the lines carry: confined (thickness held constant) or unconfined (Dupuit–Forchheimer); screen-only */
export const headForm = signal<HeadForm>('confined');

/** The levels drawn for a form (headContours.ts: the same lattice, each form at its own round levels). */
export function headLevelsOf(h: HeadContours, form: HeadForm): HeadContours['levels'] {
  return form === 'unconfined' ? h.unconfined.levels : h.levels;
}

/** the label box used for placement: 12 px bold digits about 7.5 px wide, 4 px padding, a 1 px border (wells.css .dg-map-text) */
const headLabelSize = (text: string) => ({ w: Math.ceil(7.5 * text.length) + 10, h: 18 });

const toLatLng = (p: Position): L.LatLng => L.latLng(p[1], p[0]);
const toPosition = (ll: L.LatLng): Position => [ll.lng, ll.lat];

function handleIcon(kind: string, label: string): L.DivIcon {
  return L.divIcon({
    html: `<svg viewBox="-16 -16 32 32" width="32" height="32" aria-hidden="true"><rect x="-8" y="-8" width="16" height="16" rx="2" fill="var(--mark-halo)" stroke="var(--mark-ink)" stroke-width="2.5"/></svg><span class="dg-sr">${escapeHtml(label)}</span>`,
    className: `dg-mark dg-boundary-handle dg-boundary-${kind}`,
    iconSize: [44, 44],
    iconAnchor: [22, 22],
  });
}

/** The drawn continuation of a boundary line beyond its point p: three times the stretch q→p (the model's line is unbounded). */
const extend = (p: L.LatLng, q: L.LatLng): L.LatLng => L.latLng(p.lat + 3 * (p.lat - q.lat), p.lng + 3 * (p.lng - q.lng));

/** The longest run of consecutive points of a line inside the view (0..width × 0..height, container pixels). */
function longestRunInView(points: readonly { x: number; y: number }[], width: number, height: number): { x: number; y: number }[] {
  let best: { x: number; y: number }[] = [];
  let run: { x: number; y: number }[] = [];
  for (const c of points) {
    if (c.x >= 0 && c.y >= 0 && c.x <= width && c.y <= height) run.push({ x: c.x, y: c.y });
    else {
      if (run.length > best.length) best = run;
      run = [];
    }
  }
  return run.length > best.length ? run : best;
}

function labelIcon(text: string, className: string): L.DivIcon {
  return L.divIcon({ html: `<span>${escapeHtml(text)}</span>`, className: `dg-map-text ${className}`, iconSize: [0, 0], iconAnchor: [0, 0] });
}

interface DrawnLine {
  key: string;
  line: L.Polyline;
  beyond: L.Polyline;
  label: L.Marker;
  handles: [L.Marker, L.Marker];
}

export class WellLayers {
  private zones: L.Polygon[] = [];
  private marks: L.Path[] = [];
  private markLabels: L.Marker[] = [];
  private lines = new Map<string, DrawnLine>();
  private firstTap: L.Marker | null = null;
  private drawnZones: { w: WellsLayer | null; marks: TravelMarks } | null = null;
  private headLines: L.Polyline[] = [];
  private headLabels: L.Marker[] = [];
  private drawnHeads: { h: HeadContours | null; show: boolean; form: HeadForm } | null = null;

  constructor(private readonly map: L.Map) {
    map.createPane('dg-capture').style.zIndex = '390';
    map.createPane('dg-boundaries').style.zIndex = '420';
  }

  /** the boundary handles (so tracing can disable their dragging) */
  handles(): L.Marker[] {
    return [...this.lines.values()].flatMap((d) => d.handles);
  }

  /** Capture zones and their time-of-travel marks. */
  syncZones(w: WellsLayer | null, marks: TravelMarks): void {
    if (this.drawnZones && this.drawnZones.w === w && this.drawnZones.marks === marks) return;
    this.drawnZones = { w, marks };
    for (const l of [...this.zones, ...this.marks, ...this.markLabels]) l.remove();
    this.zones = [];
    this.marks = [];
    this.markLabels = [];
    if (!w) return;
    for (const z of w.zones) {
      if (z.envelope.length < 3) continue;
      this.zones.push(L.polygon(z.envelope.map(toLatLng), { pane: 'dg-capture', className: 'dg-capture-zone', interactive: false, weight: 2.5 }).addTo(this.map));
      for (const m of marks === 'water' ? z.water : z.contaminant) {
        const pieces = m.front.filter((p) => p.length >= 2).map((p) => p.map(toLatLng));
        if (!pieces.length) continue;
        const opts = { pane: 'dg-capture', className: 'dg-travel-mark', interactive: false, weight: 2 };
        this.marks.push((m.closed ? L.polygon(pieces, { ...opts, fill: false }) : L.polyline(pieces, opts)).addTo(this.map));
        // the label at the mark's middle point (the farthest upgradient of a ring, in the fan's angle order)
        const longest = pieces.reduce((a, b) => (b.length > a.length ? b : a));
        const at = longest[Math.floor(longest.length / 2)];
        this.markLabels.push(L.marker(at, { icon: labelIcon(`${m.years} yr`, 'dg-travel-label'), interactive: false, keyboard: false, pane: 'dg-boundaries' }).addTo(this.map));
      }
    }
  }

  /**
   * The lines of equal head (one polyline per level, its pieces together); their labels are placed
   * by placeLabels, which the site map calls after its own labels (and on every move).
   */
  syncHeads(h: HeadContours | null, show: boolean, form: HeadForm): boolean {
    if (this.drawnHeads && this.drawnHeads.h === h && this.drawnHeads.show === show && this.drawnHeads.form === form) return false;
    this.drawnHeads = { h, show, form };
    for (const l of this.headLines) l.remove();
    this.headLines = [];
    if (!h || !show) {
      this.clearHeadLabels();
      return true;
    }
    for (const lv of headLevelsOf(h, form)) {
      const pieces = lv.lines.filter((p) => p.length >= 2).map((p) => p.map(toLatLng));
      if (!pieces.length) continue;
      this.headLines.push(L.polyline(pieces, { pane: 'dg-capture', className: 'dg-head-line', interactive: false, weight: 1.5 }).addTo(this.map));
    }
    return true;
  }

  private clearHeadLabels(): void {
    for (const m of this.headLabels) m.remove();
    this.headLabels = [];
  }

  /**
   * Labels the head lines for the view as it is: each visible stretch of a line gets its level once,
   * where placeOnLines finds room (clear of `blocked`, the travel-time and boundary labels and each
   * other), else none. Rects in the map container's pixels.
   */
  /**
   * The well field's labels for the view as it is, after the marks' own (`blocked`: the marks, their
   * labels, the controls and notices, in the map container's pixels): each boundary line's name on
   * the line where it finds room in the view (not at its two points' middle, which on a river across
   * the flow is where the plume, the flow handle and the receptors crowd), then the head levels.
   */
  placeLabels(blocked: Rect[]): void {
    this.placeBoundaryLabels(blocked);
    this.placeHeadLabels(blocked);
  }

  private placeBoundaryLabels(blocked: Rect[]): void {
    const size = this.map.getSize();
    const items: { id: string; text: string; points: { x: number; y: number }[]; w: number; h: number }[] = [];
    for (const [id, d] of this.lines) {
      const r = d.label.getElement()?.firstElementChild?.getBoundingClientRect();
      const [a, z] = d.line.getLatLngs() as L.LatLng[];
      // the line as the model takes it (the drawn stretch and its continuation), sampled evenly
      const far = [extend(a, z), extend(z, a)].map((p) => this.map.latLngToContainerPoint(p));
      const points = Array.from({ length: 97 }, (_, k) => ({ x: far[0].x + ((far[1].x - far[0].x) * k) / 96, y: far[0].y + ((far[1].y - far[0].y) * k) / 96 }));
      const run = longestRunInView(points, size.x, size.y);
      if (r?.width && run.length >= 2) items.push({ id, text: '', points: run, w: r.width, h: r.height });
    }
    const placed = placeOnLines(items, blocked, size.x, size.y);
    for (const [id, d] of this.lines) {
      const at = placed.get(id);
      // no room in the view: at the middle of its two points, as drawn first
      const [a, z] = d.line.getLatLngs() as L.LatLng[];
      d.label.setLatLng(at ? this.map.containerPointToLatLng(L.point(at.x, at.y)) : L.latLng((a.lat + z.lat) / 2, (a.lng + z.lng) / 2));
    }
  }

  private placeHeadLabels(blocked: Rect[]): void {
    this.clearHeadLabels();
    const h = this.drawnHeads?.h;
    if (!h || !this.drawnHeads?.show) return;
    const levels = headLevelsOf(h, this.drawnHeads.form);
    const size = this.map.getSize();
    const box = this.map.getContainer().getBoundingClientRect();
    const own: Rect[] = [];
    for (const m of [...this.markLabels, ...[...this.lines.values()].map((d) => d.label)]) {
      const r = m.getElement()?.firstElementChild?.getBoundingClientRect();
      if (r && r.width) own.push({ x: r.left - box.left, y: r.top - box.top, w: r.width, h: r.height });
    }
    const items: { id: string; text: string; points: { x: number; y: number }[]; w: number; h: number }[] = [];
    levels.forEach((lv, k) =>
      lv.lines.forEach((piece, j) => {
        const best = longestRunInView(
          piece.map((p) => this.map.latLngToContainerPoint(toLatLng(p))),
          size.x,
          size.y,
        );
        if (best.length >= 2) items.push({ id: `${k}:${j}`, text: lv.label, points: best, ...headLabelSize(lv.label) });
      }),
    );
    const placed = placeOnLines(items, [...blocked, ...own], size.x, size.y);
    for (const it of items) {
      const at = placed.get(it.id);
      if (!at) continue;
      const ll = this.map.containerPointToLatLng(L.point(at.x, at.y));
      this.headLabels.push(L.marker(ll, { icon: labelIcon(it.text, 'dg-head-label'), interactive: false, keyboard: false, pane: 'dg-boundaries' }).addTo(this.map));
    }
  }

  /** The case's boundary lines, with a draggable handle at each of their two points. */
  syncBoundaries(c: Case): void {
    const bs = c.site.boundaries ?? [];
    const seen = new Set<string>();
    bs.forEach((b, i) => {
      seen.add(b.id);
      const key = JSON.stringify([b.kind, b.name, b.points, i]);
      const old = this.lines.get(b.id);
      if (old && old.key === key) return;
      if (old) this.removeLine(old);
      const a = toLatLng(b.points[0]);
      const z = toLatLng(b.points[1]);
      const name = b.name || `Boundary ${i + 1}`;
      const cls = `dg-boundary dg-boundary-${b.kind}`;
      const line = L.polyline([a, z], { pane: 'dg-boundaries', interactive: false, weight: 5, className: cls });
      const beyond = L.polyline([[extend(a, z), a], [z, extend(z, a)]], { pane: 'dg-boundaries', interactive: false, weight: 3, dashArray: '8 8', className: cls });
      const label = L.marker(L.latLng((a.lat + z.lat) / 2, (a.lng + z.lng) / 2), {
        interactive: false,
        keyboard: false,
        pane: 'dg-boundaries',
        icon: labelIcon(name, `dg-boundary-label dg-boundary-${b.kind}`),
      });
      const id = b.id;
      const handles = [a, z].map((at, k) => {
        const h = L.marker(at, { draggable: true, keyboard: true, title: `${name}: end ${k + 1} (drag to move)`, icon: handleIcon(b.kind, `${name}, end ${k + 1}`) });
        h.on('dragend', () => this.moveEnd(id, k, h.getLatLng()));
        return h;
      }) as [L.Marker, L.Marker];
      for (const l of [line, beyond, label, ...handles]) l.addTo(this.map);
      this.lines.set(b.id, { key, line, beyond, label, handles });
    });
    for (const [id, d] of this.lines)
      if (!seen.has(id)) {
        this.removeLine(d);
        this.lines.delete(id);
      }
  }

  private removeLine(d: DrawnLine): void {
    for (const l of [d.line, d.beyond, d.label, ...d.handles]) l.remove();
  }

  private moveEnd(id: string, k: number, ll: L.LatLng): void {
    updateCase((d) => {
      const b = (d.site.boundaries ?? []).find((x) => x.id === id);
      if (b) b.points[k] = toPosition(ll);
    });
  }

  /** A tap with the 'add-boundary' tool: the first marks one end, the second makes the line. Returns true when the line is made. */
  tap(ll: L.LatLng): boolean {
    if (!this.firstTap) {
      this.firstTap = L.marker(ll, { interactive: false, keyboard: false, icon: handleIcon('pending', 'First end of the new boundary line') }).addTo(this.map);
      return false;
    }
    const a = toPosition(this.firstTap.getLatLng());
    this.cancelTap();
    const z = toPosition(ll);
    if (a[0] === z[0] && a[1] === z[1]) return false;
    updateCase((d) => {
      const list = (d.site.boundaries ??= []);
      list.push({ id: newId(), name: `River or shore ${list.length + 1}`, kind: 'constant-head', points: [a, z] });
    });
    return true;
  }

  /** Forget a first tap (the tool was changed). */
  cancelTap(): void {
    this.firstTap?.remove();
    this.firstTap = null;
  }

  destroy(): void {
    this.cancelTap();
  }
}
