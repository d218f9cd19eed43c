/**
 * The site map: a Leaflet map kept in step with the current case and the latest results.
 * Positions in the case are [x, y] = [lon, lat] (geographic) or [east, north] metres (local);
 * both become Leaflet's LatLng(y, x) — the local frame uses Leaflet's plain CRS, one unit a metre.
 *
 * Gestures by tool: move (pan; drag marks), trace-footprint (finger traces the release outline),
 * place-source (tap puts the release point), add-receptor and add-head (tap adds a point).
 * The flow arrow's round handle turns the flow direction when the flow is given by direction.
 */
import L from 'leaflet';
import { effect } from '@preact/signals';
import type { Case, Position } from '../../case/schema';
import { makeLocalFrame } from '../../geo/projection';
import { ringCentroid } from '../../geo/rings';
import { currentCase, currentResults, updateCase, registerMapElement } from '../state';
import { mapTool, selectedId, tileState } from '../view';
import { settings } from '../settings';
import { currentPlume, preparedCase } from '../evaluation';
import { sourceIcon, receptorIcon, headIcon, flowHandleIcon } from './symbols';
import { SiteGridLayer, NorthArrow } from './siteGrid';
import { newId } from '../../case/defaults';
import { moveSource } from '../frame';
import type { Evaluation, PlumeLayer } from '../results';

export const toLatLng = (p: Position): L.LatLng => L.latLng(p[1], p[0]);
export const toPosition = (ll: L.LatLng): Position => [ll.lng, ll.lat];

/** Flow arrow length on screen, px (it shows a direction, not a distance). */
const ARROW_PX = 110;

export class SiteMap {
  readonly map: L.Map;
  private readonly frame: Case['site']['frame'];
  private disposers: (() => void)[] = [];
  private tiles: L.TileLayer | null = null;
  private grid: SiteGridLayer;
  private gridOn = false;
  private source: L.Marker;
  private footprint: L.Polygon;
  private sourcePlane: L.Polyline;
  private flowLine: L.Polyline;
  private flowHandle: L.Marker;
  private receptors = new Map<string, L.Marker>();
  private heads = new Map<string, L.Marker>();
  /** the plume's band paths by band index (see syncPlume) */
  private bands: L.Polygon[] = [];
  private plumeDrawn: PlumeLayer | null = null;
  private tracing: L.LatLng[] | null = null;
  private traceLine: L.Polyline;
  private tileLoads = 0;
  private tileErrors = 0;
  /** called after contours are on screen (latency measurement) */
  onPlumeDrawn: ((p: PlumeLayer) => void) | null = null;

  constructor(el: HTMLElement, c: Case) {
    this.frame = c.site.frame;
    const local = this.frame === 'local';
    this.map = L.map(el, {
      crs: local ? L.CRS.Simple : L.CRS.EPSG3857,
      minZoom: local ? -6 : 2,
      maxZoom: local ? 6 : 21,
      zoomSnap: 0.25,
      attributionControl: true,
      zoomControl: true,
      keyboard: true,
      tapHold: true,
    } as L.MapOptions);
    this.map.attributionControl.setPrefix(false);
    registerMapElement(el);
    L.control.scale({ metric: true, imperial: true, position: 'bottomleft', maxWidth: 140 }).addTo(this.map);
    new NorthArrow({ position: 'topright' }).addTo(this.map);

    const lf = makeLocalFrame(c.site.frame, c.site.datum);
    this.grid = new SiteGridLayer({
      toEN: (ll) => lf.toEN(clampLL(ll, local)),
      fromEN: (en) => toLatLng(lf.fromEN(en)),
    });

    this.footprint = L.polygon([], { className: 'dg-footprint', interactive: false });
    this.sourcePlane = L.polyline([], { className: 'dg-source-plane', interactive: false });
    this.flowLine = L.polyline([], { className: 'dg-flow-arrow', interactive: false });
    this.traceLine = L.polyline([], { className: 'dg-trace', interactive: false });
    this.source = L.marker(toLatLng(c.site.source.position), {
      icon: sourceIcon(),
      draggable: true,
      keyboard: true,
      title: 'Release (drag to move)',
      zIndexOffset: 1000,
    });
    this.flowHandle = L.marker(toLatLng(c.site.source.position), {
      icon: flowHandleIcon(),
      draggable: true,
      keyboard: true,
      title: 'Flow direction (drag to turn)',
      zIndexOffset: 1100,
    });
    for (const l of [this.footprint, this.sourcePlane, this.flowLine, this.traceLine, this.source]) l.addTo(this.map);

    this.wireGestures();
    this.fitCase(c);
    this.disposers.push(effect(() => this.syncBasemap(settings.value.tileUrl, settings.value.tileAttribution)));
    this.disposers.push(effect(() => this.syncCase(currentCase.value, selectedId.value, currentResults.value)));
    this.disposers.push(effect(() => this.syncPlume(currentPlume.value)));
    this.disposers.push(
      effect(() => {
        // the source plane the solutions use: across the flow at the release, the width they use
        const p = preparedCase.value;
        if (!p) {
          setPathLatLngs(this.sourcePlane, []);
          return;
        }
        const w = p.derived.width / 2;
        setPathLatLngs(this.sourcePlane, [toLatLng(p.toMap(0, -w)), toLatLng(p.toMap(0, w))]);
      }),
    );
    this.disposers.push(effect(() => this.syncFlowArrow(currentCase.value, currentResults.value?.derived.azimuthDeg ?? null)));
    this.disposers.push(
      effect(() => {
        el.dataset.tool = mapTool.value;
        if (mapTool.value === 'trace-footprint') this.map.dragging.disable();
        else this.map.dragging.enable();
      }),
    );
    this.map.on('zoom move resize', () => this.syncFlowArrow(currentCase.peek(), currentResults.peek()?.derived.azimuthDeg ?? null));
  }

  destroy(): void {
    for (const d of this.disposers) d();
    registerMapElement(null);
    this.map.remove();
  }

  fitCase(c: Case): void {
    const pts = [c.site.source.position, ...c.site.receptors.map((r) => r.position)];
    if (c.site.flow.method === 'heads') pts.push(...c.site.flow.readings.map((r) => r.position));
    if (c.site.source.footprint) pts.push(...c.site.source.footprint);
    const lf = makeLocalFrame(c.site.frame, c.site.datum);
    const ens = pts.map((p) => lf.toEN(p));
    const es = ens.map((p) => p[0]);
    const ns = ens.map((p) => p[1]);
    const pad = Math.max(60, 0.2 * Math.max(Math.max(...es) - Math.min(...es), Math.max(...ns) - Math.min(...ns)));
    const sw = toLatLng(lf.fromEN([Math.min(...es) - pad, Math.min(...ns) - pad]));
    const ne = toLatLng(lf.fromEN([Math.max(...es) + pad, Math.max(...ns) + pad]));
    this.map.fitBounds(L.latLngBounds(sw, ne), { animate: false });
  }

  // ---- basemap ---------------------------------------------------------------------------
  private syncBasemap(url: string, attribution: string): void {
    if (this.tiles) {
      this.tiles.remove();
      this.tiles = null;
    }
    if (this.frame === 'local' || url === '') {
      tileState.value = 'off';
      this.showGrid(true);
      return;
    }
    this.tileLoads = 0;
    this.tileErrors = 0;
    tileState.value = 'loading';
    this.showGrid(false);
    const tiles = L.tileLayer(url, { attribution, maxZoom: 21, maxNativeZoom: 19, crossOrigin: true, errorTileUrl: '' });
    tiles.on('tileload', () => {
      this.tileLoads++;
      tileState.value = 'ok';
      this.showGrid(false);
    });
    tiles.on('tileerror', (e: L.TileErrorEvent) => {
      this.tileErrors++;
      (e.tile as HTMLElement).style.visibility = 'hidden';
      if (this.tileLoads === 0) {
        tileState.value = 'failed';
        this.showGrid(true);
      }
    });
    tiles.addTo(this.map);
    this.tiles = tiles;
    if (typeof navigator !== 'undefined' && navigator.onLine === false) {
      tileState.value = 'failed';
      this.showGrid(true);
    }
  }

  private showGrid(on: boolean): void {
    if (on === this.gridOn) return;
    this.gridOn = on;
    if (on) this.grid.addTo(this.map);
    else this.grid.remove();
    this.map.getContainer().classList.toggle('dg-map-gridded', on);
  }

  // ---- case → layers ---------------------------------------------------------------------
  private syncCase(c: Case, sel: string | null, results: Evaluation | null): void {
    const src = c.site.source;
    if (!this.source.getLatLng().equals(toLatLng(src.position))) this.source.setLatLng(toLatLng(src.position));
    setPathLatLngs(this.footprint, src.footprint ? src.footprint.map(toLatLng) : []);

    const seen = new Set<string>();
    for (const r of c.site.receptors) {
      seen.add(r.id);
      let m = this.receptors.get(r.id);
      const status = results?.receptors.find((x) => x.id === r.id)?.status ?? null;
      const key = `${r.kind}|${r.name}|${status}|${sel === r.id}`;
      if (!m) {
        m = L.marker(toLatLng(r.position), { draggable: true, keyboard: true, title: r.name });
        const id = r.id;
        m.on('drag', () => this.moveReceptor(id, m!.getLatLng()));
        m.on('dragend', () => this.moveReceptor(id, m!.getLatLng()));
        m.on('click', () => (selectedId.value = id));
        m.addTo(this.map);
        this.receptors.set(r.id, m);
      }
      if ((m as unknown as { _dgKey?: string })._dgKey !== key) {
        m.setIcon(receptorIcon(r.kind, r.name, status, sel === r.id));
        (m as unknown as { _dgKey?: string })._dgKey = key;
      }
      if (!m.getLatLng().equals(toLatLng(r.position))) m.setLatLng(toLatLng(r.position));
    }
    for (const [id, m] of this.receptors) if (!seen.has(id)) (m.remove(), this.receptors.delete(id));

    const readings = c.site.flow.method === 'heads' ? c.site.flow.readings : [];
    const seenH = new Set<string>();
    for (const h of readings) {
      seenH.add(h.id);
      let m = this.heads.get(h.id);
      const label = `${h.name}: ${h.head.value} ${h.head.unit}`;
      const key = `${label}|${sel === h.id}`;
      if (!m) {
        m = L.marker(toLatLng(h.position), { draggable: true, keyboard: true, title: h.name });
        const id = h.id;
        m.on('dragend', () => this.moveHead(id, m!.getLatLng()));
        m.on('click', () => (selectedId.value = id));
        m.addTo(this.map);
        this.heads.set(h.id, m);
      }
      if ((m as unknown as { _dgKey?: string })._dgKey !== key) {
        m.setIcon(headIcon(label, sel === h.id));
        (m as unknown as { _dgKey?: string })._dgKey = key;
      }
      if (!m.getLatLng().equals(toLatLng(h.position))) m.setLatLng(toLatLng(h.position));
    }
    for (const [id, m] of this.heads) if (!seenH.has(id)) (m.remove(), this.heads.delete(id));
  }

  /** The arrow from the release along the flow; its handle turns it when the flow is a direction. */
  private syncFlowArrow(c: Case, fittedAzimuth: number | null): void {
    const az = c.site.flow.method === 'direction' ? c.site.flow.azimuthDeg : fittedAzimuth;
    const from = toLatLng(c.site.source.position);
    if (az === null || !Number.isFinite(az) || !this.map.getSize().x) {
      setPathLatLngs(this.flowLine, []);
      this.flowHandle.remove();
      return;
    }
    const p0 = this.map.latLngToContainerPoint(from);
    const rad = (az * Math.PI) / 180;
    const dir = L.point(Math.sin(rad), -Math.cos(rad));
    const tip = p0.add(dir.multiplyBy(ARROW_PX));
    const side = L.point(-dir.y, dir.x);
    const barb = (s: number) => this.map.containerPointToLatLng(tip.subtract(dir.multiplyBy(16)).add(side.multiplyBy(9 * s)));
    const tipLL = this.map.containerPointToLatLng(tip);
    const startLL = this.map.containerPointToLatLng(p0.add(dir.multiplyBy(24)));
    setPathLatLngs(this.flowLine, [[startLL, tipLL], [barb(1), tipLL, barb(-1)]]);
    if (c.site.flow.method === 'direction') {
      if (!this.dragging) this.flowHandle.setLatLng(this.map.containerPointToLatLng(p0.add(dir.multiplyBy(ARROW_PX + 22))));
      if (!this.map.hasLayer(this.flowHandle)) this.flowHandle.addTo(this.map);
    } else this.flowHandle.remove();
  }
  private dragging = false;

  /**
   * The plume bands: one SVG path per non-empty band, kept from one result to the next (the path
   * is updated in place, not rebuilt), drawn from the worker's packed coordinates without
   * building GeoJSON. SVG rather than canvas: the band colours come from the stylesheet (light
   * and dark themes) by class. Order as the bands' index: the limit band last, on top, so the
   * inner bands show through its translucent fill.
   */
  private syncPlume(p: PlumeLayer | null): void {
    if (p === this.plumeDrawn) return;
    this.plumeDrawn = p;
    const n = p ? p.thresholds.length : 0;
    let reorder = false;
    for (let k = 0; k < Math.max(n, this.bands.length); k++) {
      const latlngs = p && k < n ? bandLatLngs(p, k) : [];
      let band = this.bands[k];
      if (latlngs.length === 0) {
        if (band && this.map.hasLayer(band)) band.remove();
        continue;
      }
      const style = { fillOpacity: 0.45 + (0.4 * k) / Math.max(1, n) };
      if (!band) {
        band = L.polygon(latlngs, { interactive: false, className: `dg-band dg-band-${Math.min(k, 3)}`, weight: k === 0 ? 2.5 : 1.5, ...style });
        this.bands[k] = band;
      } else {
        band.setLatLngs(latlngs);
        if (band.options.fillOpacity !== style.fillOpacity) band.setStyle(style);
      }
      if (!this.map.hasLayer(band)) {
        band.addTo(this.map);
        reorder = true;
      }
    }
    // each band in turn to the back: the highest lowest, the limit band on top of them
    if (reorder) for (const band of this.bands) if (band && this.map.hasLayer(band)) band.bringToBack();
    const done = this.onPlumeDrawn;
    if (done && p) requestAnimationFrame(() => done(p));
  }

  // ---- gestures --------------------------------------------------------------------------
  private wireGestures(): void {
    const map = this.map;
    this.source.on('drag', () => this.moveSource(this.source.getLatLng()));
    this.source.on('dragend', () => this.moveSource(this.source.getLatLng()));
    this.flowHandle.on('dragstart', () => (this.dragging = true));
    this.flowHandle.on('drag', () => this.turnFlow(this.flowHandle.getLatLng()));
    this.flowHandle.on('dragend', () => {
      this.dragging = false;
      this.turnFlow(this.flowHandle.getLatLng());
      this.syncFlowArrow(currentCase.peek(), null);
    });
    map.on('click', (e: L.LeafletMouseEvent) => {
      const tool = mapTool.peek();
      const at = toPosition(e.latlng);
      if (tool === 'place-source') {
        this.moveSource(e.latlng);
        mapTool.value = 'move';
      } else if (tool === 'add-receptor') {
        const id = newId();
        updateCase((d) => {
          const n = d.site.receptors.length + 1;
          d.site.receptors.push({
            id,
            name: `Receptor ${n}`,
            kind: 'well',
            position: at,
            screenTop: { value: 0, unit: 'm' },
            screenBottom: { value: 5, unit: 'm' },
            pumping: false,
            pumpingRate: null,
          });
        });
        selectedId.value = id;
        mapTool.value = 'move';
      } else if (tool === 'add-head') {
        const id = newId();
        updateCase((d) => {
          if (d.site.flow.method !== 'heads') d.site.flow = { method: 'heads', readings: [] };
          const n = d.site.flow.readings.length + 1;
          d.site.flow.readings.push({ id, name: `MW-${n}`, position: at, head: { value: 10, unit: 'm' } });
        });
        selectedId.value = id;
      }
    });

    // tracing: one finger (or the mouse) draws the outline; lifting it closes the polygon
    const el = map.getContainer();
    el.addEventListener('pointerdown', (ev) => {
      if (mapTool.peek() !== 'trace-footprint' || !ev.isPrimary) return;
      if ((ev.target as HTMLElement).closest('.leaflet-control')) return;
      ev.preventDefault();
      el.setPointerCapture(ev.pointerId);
      this.tracing = [map.mouseEventToLatLng(ev as unknown as MouseEvent)];
      this.traceLine.setLatLngs(this.tracing);
    });
    el.addEventListener('pointermove', (ev) => {
      if (!this.tracing) return;
      const ll = map.mouseEventToLatLng(ev as unknown as MouseEvent);
      const last = this.tracing[this.tracing.length - 1];
      if (map.latLngToContainerPoint(last).distanceTo(map.latLngToContainerPoint(ll)) < 6) return;
      this.tracing.push(ll);
      this.traceLine.setLatLngs(this.tracing);
    });
    const finish = () => {
      const pts = this.tracing;
      this.tracing = null;
      this.traceLine.setLatLngs([]);
      if (!pts) return;
      const ring = simplifyTrace(pts.map((ll) => map.latLngToContainerPoint(ll))).map((p) => toPosition(map.containerPointToLatLng(p)));
      if (ring.length < 3) return;
      const c = currentCase.peek();
      const lf = makeLocalFrame(c.site.frame, c.site.datum);
      const centre = lf.fromEN(ringCentroid(ring.map((p) => lf.toEN(p))));
      updateCase((d) => {
        d.site.source.footprint = ring;
        d.site.source.position = centre;
      });
      mapTool.value = 'move';
    };
    el.addEventListener('pointerup', finish);
    el.addEventListener('pointercancel', () => {
      this.tracing = null;
      this.traceLine.setLatLngs([]);
    });
  }

  private moveSource(ll: L.LatLng): void {
    const to = toPosition(ll);
    const from = currentCase.peek().site.source.position;
    if (from[0] === to[0] && from[1] === to[1]) return;
    updateCase((d) => moveSource(d, to));
  }

  private moveReceptor(id: string, ll: L.LatLng): void {
    const to = toPosition(ll);
    updateCase((d) => {
      const r = d.site.receptors.find((x) => x.id === id);
      if (r) r.position = to;
    });
  }

  private moveHead(id: string, ll: L.LatLng): void {
    const to = toPosition(ll);
    updateCase((d) => {
      if (d.site.flow.method !== 'heads') return;
      const r = d.site.flow.readings.find((x) => x.id === id);
      if (r) r.position = to;
    });
  }

  private turnFlow(ll: L.LatLng): void {
    const c = currentCase.peek();
    if (c.site.flow.method !== 'direction') return;
    // the web map is conformal, so the on-screen angle is the direction on the ground
    const p0 = this.map.latLngToContainerPoint(toLatLng(c.site.source.position));
    const p1 = this.map.latLngToContainerPoint(ll);
    if (p0.distanceTo(p1) < 8) return;
    let az = (Math.atan2(p1.x - p0.x, -(p1.y - p0.y)) * 180) / Math.PI;
    az = Math.round(((az % 360) + 360) % 360) % 360;
    if (az === c.site.flow.azimuthDeg) return;
    updateCase((d) => {
      if (d.site.flow.method === 'direction') d.site.flow.azimuthDeg = az;
    });
  }
}

const pathKeys = new WeakMap<L.Path, string>();
/**
 * setLatLngs only when the points changed: every edit re-derives the release outline, source
 * plane and flow arrow, and rewriting an unchanged SVG path makes the browser repaint the map.
 */
function setPathLatLngs(line: L.Polyline | L.Polygon, latlngs: L.LatLng[] | L.LatLng[][]): void {
  const key = (latlngs as (L.LatLng | L.LatLng[])[]).map((a) => (Array.isArray(a) ? a.map((ll) => `${ll.lat},${ll.lng}`).join(';') : `${a.lat},${a.lng}`)).join('|');
  if (pathKeys.get(line) === key) return;
  pathKeys.set(line, key);
  line.setLatLngs(latlngs);
}

/** Band k of the plume as Leaflet polygons (rings without the closing vertex, which Leaflet drops). */
function bandLatLngs(p: PlumeLayer, k: number): L.LatLng[][][] {
  const { bandPolygons, polygonRings, ringVertices, coords } = p.bands;
  const out: L.LatLng[][][] = [];
  for (let q = bandPolygons[k]; q < bandPolygons[k + 1]; q++) {
    const rings: L.LatLng[][] = [];
    for (let r = polygonRings[q]; r < polygonRings[q + 1]; r++) {
      const ring: L.LatLng[] = [];
      for (let v = ringVertices[r]; v < ringVertices[r + 1] - 1; v++) ring.push(L.latLng(coords[2 * v + 1], coords[2 * v]));
      rings.push(ring);
    }
    out.push(rings);
  }
  return out;
}

function clampLL(ll: L.LatLng, local: boolean): Position {
  if (local) return [ll.lng, ll.lat];
  return [Math.max(-180, Math.min(180, ll.lng)), Math.max(-89.9, Math.min(89.9, ll.lat))];
}

/** Tolerance of the traced outline's simplification, screen px (a finger's wobble). */
const TRACE_TOLERANCE_PX = 3;

/**
 * The traced outline with the finger's wobble removed (Leaflet's own Douglas–Peucker on screen
 * points, which keeps the first and last points) and, when the finger came back to where it
 * started, without the closing point.
 */
function simplifyTrace(pts: L.Point[]): L.Point[] {
  const out = pts.length < 4 ? pts : L.LineUtil.simplify(pts, TRACE_TOLERANCE_PX);
  if (out.length > 3 && out[0].distanceTo(out[out.length - 1]) < TRACE_TOLERANCE_PX * 2) out.pop();
  return out;
}
