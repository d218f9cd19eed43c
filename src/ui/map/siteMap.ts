/**
 * The site map: a Leaflet map kept in step with the current case and the latest results.
 * Positions in the case are [x, y] = [lon, lat] (geographic) or [east, north] metres (local);
 * both become Leaflet's LatLng(y, x) — the local frame uses Leaflet's plain CRS, one unit a metre.
 *
 * Gestures by tool: move (pan; drag marks), trace-footprint (finger traces the release outline),
 * place-source (tap puts the release point), add-receptor, add-head and add-monitoring (tap adds a
 * point; the monitoring wells are their own layer, monitoringLayer.ts).
 * The flow arrow's round handle turns the flow direction when the flow is given by direction.
 */
import * as L from 'leaflet';
import { computed, effect, signal } from '@preact/signals';
import type { Case, Position } from '../../case/schema';
import { makeLocalFrame } from '../../geo/projection';
import { currentCase, currentResults, updateCase, registerMapElement } from '../state';
import { mapTool, selectedId, tileState, playTime, selectFromMap } from '../view';
import { bandFillOpacity } from './bandStyle';
import { settings } from '../settings';
import { currentPlume, preparedCase } from '../evaluation';
import { sourceIcon, receptorIcon, headIcon, flowHandleIcon } from './symbols';
import { SiteGridLayer, NorthArrow } from './siteGrid';
import { declutter, symbolRect, type Rect } from './declutter';
import { shownQuantity, unitSystem } from '../../case/unitSystem';
import { formatSig } from '../../case/numbers';
import { UNITS } from '../../core/units';
import { MonitoringLayer } from './monitoringLayer';
import { ExceedanceLayer } from './exceedanceLayer';
import { attributionHtml } from './attribution';
import { newHeadReading, newId, newReceptor } from '../../case/defaults';
import { moveSource, setFootprint } from '../frame';
import type { Evaluation, PlumeLayer } from '../results';
import { WellLayers, headForm, showHeadLines, travelMarks } from './wellLayers';
import { ParticleLayerView } from './particleLayer';
import { particleCaseKey, particleLayer, particleRun, showParticleLayer } from '../particleState';

export const toLatLng = (p: Position): L.LatLng => L.latLng(p[1], p[0]);

/** Why the map's last update failed (a mark that cannot be drawn), in words; null when it drew. */
export const mapFailure = signal<string | null>(null);

const failures = new Map<string, string>();
/** A map update that fails is reported on the map, not thrown into the edit that caused it. */
function guarded(part: string, update: () => void): void {
  try {
    update();
    failures.delete(part);
  } catch (e) {
    failures.set(part, e instanceof Error ? e.message : String(e));
  }
  const first = failures.values().next().value ?? null;
  if (mapFailure.peek() !== first) mapFailure.value = first;
}
export const toPosition = (ll: L.LatLng): Position => [ll.lng, ll.lat];

/** Flow arrow length on screen, px (it shows a direction, not a distance). */
const ARROW_PX = 110;
/** Room kept between the framed case and the map's edge, px (a mark's touch target and a label's height). */
const FRAME_PAD_PX = 44;
/** The smallest ground a frame shows, m (a new case: the release alone). */
const FRAME_MIN_SPAN_M = 120;
/** A mark's label starts this far from the mark's centre, px (app.css .dg-mark-label). */
const LABEL_CLASSES = ['dg-label-right', 'dg-label-left', 'dg-label-above', 'dg-label-below', 'dg-label-hidden'];

export class SiteMap {
  readonly map: L.Map;
  private readonly frame: Case['site']['frame'];
  private disposers: (() => void)[] = [];
  private tiles: L.TileLayer | null = null;
  private grid: SiteGridLayer;
  private scale: L.Control.Scale | null = null;
  private gridOn = false;
  private source: L.Marker;
  private footprint: L.Polygon;
  private sourcePlane: L.Polyline;
  private flowLine: L.Polyline;
  private flowHandle: L.Marker;
  private receptors = new Map<string, L.Marker>();
  private heads = new Map<string, L.Marker>();
  private monitoring: MonitoringLayer | null = null;
  private exceedance: ExceedanceLayer | null = null;
  /** the plume's band paths by band index (see syncPlume) */
  private bands: L.Polygon[] = [];
  private plumeDrawn: PlumeLayer | null = null;
  private tracing: L.LatLng[] | null = null;
  private traceLine: L.Polyline;
  private tileLoads = 0;
  private tileErrors = 0;
  /** capture zones, time-of-travel marks and boundary lines (wellLayers.ts) */
  private wells: WellLayers;
  /** the particle plume (particleLayer.ts) */
  private particles: ParticleLayerView;
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
    new NorthArrow({ position: 'topright' }).addTo(this.map);

    const lf = makeLocalFrame(c.site.frame, c.site.datum);
    this.grid = new SiteGridLayer({
      toEN: (ll) => lf.toEN(clampLL(ll, local)),
      fromEN: (en) => toLatLng(lf.fromEN(en)),
      system: () => unitSystem(currentCase.peek()),
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

    this.wells = new WellLayers(this.map);
    this.particles = new ParticleLayerView(this.map);
    this.wireGestures();
    this.fitTo(this.frameTargets(c, null));
    this.disposers.push(effect(() => this.syncBasemap(settings.value.tileUrl, settings.value.tileAttribution)));
    // the scale bar and the site grid's labels follow the case's unit system (metres, or feet and
    // miles): redone when the system changes, not with every edit (a computed notifies only on a new value)
    const system = computed(() => unitSystem(currentCase.value));
    this.disposers.push(
      effect(() => {
        const us = system.value === 'US';
        this.scale?.remove();
        this.scale = L.control.scale({ metric: !us, imperial: us, position: 'bottomleft', maxWidth: 140 }).addTo(this.map);
        this.grid.controlsMoved();
        this.grid.redraw();
      }),
    );
    this.disposers.push(effect(() => guarded('marks', () => this.syncCase(currentCase.value, selectedId.value, currentResults.value))));
    this.disposers.push(effect(() => guarded('plume', () => this.syncPlume(currentPlume.value))));
    this.exceedance = new ExceedanceLayer(this.map);
    this.monitoring = new MonitoringLayer(this.map, (moved) => {
      this.placeLabels();
      if (this.synced && moved.length && !this.innerView().contains(L.latLngBounds(moved))) this.bringIntoView(L.latLngBounds(moved));
    });
    this.disposers.push(effect(() => guarded('capture zones', () => this.wells.syncZones(currentResults.value?.wells ?? null, travelMarks.value))));
    this.disposers.push(
      effect(() =>
        guarded('boundary lines', () => {
          this.wells.syncBoundaries(currentCase.value);
          this.placeLabels();
        }),
      ),
    );
    this.disposers.push(
      effect(() =>
        guarded('head lines', () => {
          if (this.wells.syncHeads(currentResults.value?.wells?.headContours ?? null, showHeadLines.value, headForm.value)) this.placeLabels();
        }),
      ),
    );
    this.disposers.push(
      effect(() => {
        const run = particleRun.value;
        const current = run.caseKey === particleCaseKey(currentCase.value);
        guarded('particles', () => this.particles.sync(particleLayer.value, showParticleLayer.value, current, run.status === 'done'));
      }),
    );
    this.disposers.push(effect(() => (playTime.value === null ? guarded('frame', () => this.framePlume()) : undefined)));
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
    this.disposers.push(effect(() => guarded('arrow', () => this.syncFlowArrow(currentCase.value, currentResults.value?.derived.azimuthDeg ?? null))));
    this.disposers.push(
      effect(() => {
        el.dataset.tool = mapTool.value;
        // while tracing, the finger draws: neither the map nor any mark moves under it
        const tracing = mapTool.value === 'trace-footprint';
        if (tracing) this.map.dragging.disable();
        else this.map.dragging.enable();
        if (mapTool.value !== 'add-boundary') this.wells.cancelTap();
        for (const m of [this.source, this.flowHandle, ...this.receptors.values(), ...this.heads.values(), ...this.wells.handles()]) {
          if (!m.dragging) continue;
          if (tracing) m.dragging.disable();
          else m.dragging.enable();
        }
      }),
    );
    this.map.on('zoom move resize', () => guarded('arrow', () => this.syncFlowArrow(currentCase.peek(), currentResults.peek()?.derived.azimuthDeg ?? null)));
    // the user's own pan or zoom ends the map's framing (until the frame button)
    this.map.on('movestart zoomstart', () => {
      if (this.framing === 0) this.autoFrame = false;
    });
    this.map.on('moveend zoomend resize', () => this.placeLabels());
    this.map.on('resize', () =>
      guarded('frame', () => {
        if (this.autoFrame) this.fitTo(this.frameTargets(currentCase.peek(), this.framablePlume()));
      }),
    );
    new FrameControl({ position: 'topleft' }, () => this.frameCase()).addTo(this.map);
  }

  /** set when the map is taken down: a label placement queued for the next frame then does nothing */
  private removed = false;

  destroy(): void {
    this.removed = true;
    for (const d of this.disposers) d();
    this.monitoring?.destroy();
    this.exceedance?.destroy();
    this.wells.destroy();
    registerMapElement(null);
    this.map.remove();
  }

  // ---- framing ---------------------------------------------------------------------------
  /**
   * The map frames the case by itself (on opening: the release, the receptors, the water-level
   * and monitoring wells and the limit contour at the view time; again when the plume or a point set from the
   * panel leaves the view) until the user pans or zooms. After that it leaves the view alone, but
   * a point placed outside it still comes into view (the view grows just enough). The frame
   * button hands the framing back to the map.
   */
  private autoFrame = true;
  /** whether the first plume of the opened case has been framed */
  private plumeFramed = false;
  /** > 0 while the map itself moves the view (so its move events are not taken for the user's) */
  private framing = 0;

  /** Everything the frame holds: the case's points, and the limit contour of the plume on screen. */
  private frameTargets(c: Case, plume: PlumeLayer | null): L.LatLngBounds {
    const pts = [c.site.source.position, ...c.site.receptors.map((r) => r.position)];
    if (c.site.flow.method === 'heads') pts.push(...c.site.flow.readings.map((r) => r.position));
    for (const w of c.monitoring.wells) if (w.position) pts.push(w.position);
    if (c.site.source.footprint) pts.push(...c.site.source.footprint);
    const b = L.latLngBounds(pts.map(toLatLng));
    const limitBand = plume ? bandBounds(plume, 0) : null;
    if (limitBand) b.extend(limitBand);
    // a little ground around a lone point, so a new case does not open at the closest zoom
    const lf = makeLocalFrame(c.site.frame, c.site.datum);
    const sw = lf.toEN(toPosition(b.getSouthWest()));
    const ne = lf.toEN(toPosition(b.getNorthEast()));
    const pad = Math.max(0, (FRAME_MIN_SPAN_M - Math.max(ne[0] - sw[0], ne[1] - sw[1])) / 2);
    if (pad > 0) {
      b.extend(toLatLng(lf.fromEN([sw[0] - pad, sw[1] - pad])));
      b.extend(toLatLng(lf.fromEN([ne[0] + pad, ne[1] + pad])));
    }
    return b;
  }

  /** The plume on screen when it shows the case as it is now, at its view time (not while playing). */
  private framablePlume(): PlumeLayer | null {
    const p = currentPlume.peek();
    return p && p.caseStamp === currentCase.peek().modified && playTime.peek() === null ? p : null;
  }

  private fitTo(b: L.LatLngBounds): void {
    if (!this.map.getSize().x) return;
    this.framing++;
    try {
      this.map.fitBounds(b, { paddingTopLeft: [FRAME_PAD_PX + 16, FRAME_PAD_PX], paddingBottomRight: [FRAME_PAD_PX, FRAME_PAD_PX], animate: false, maxZoom: this.frame === 'local' ? 4 : 19 });
    } finally {
      this.framing--;
    }
    this.placeLabels();
  }

  /** Frame the whole case (the frame button, opening a case) and let the map frame it from now on. */
  frameCase(): void {
    this.autoFrame = true;
    this.fitTo(this.frameTargets(currentCase.peek(), this.framablePlume()));
  }

  /** Centre the map on a case position (the receptor list's "Show on map"). */
  panToPosition(p: Position): void {
    this.map.panTo(toLatLng(p));
  }

  /** The view, inset by the padding the frame keeps (a point there is comfortably in view). */
  private innerView(): L.LatLngBounds {
    const size = this.map.getSize();
    const inset = Math.min(FRAME_PAD_PX / 2, size.x / 4, size.y / 4);
    return L.latLngBounds(
      this.map.containerPointToLatLng(L.point(inset, size.y - inset)),
      this.map.containerPointToLatLng(L.point(size.x - inset, inset)),
    );
  }

  /** A point set from outside the map (the panel, an undo) lies outside the view: bring it in. */
  private bringIntoView(ll: L.LatLng | L.LatLngBounds): void {
    if (!this.map.getSize().x || this.innerView().contains(ll)) return;
    if (this.autoFrame) this.fitTo(this.frameTargets(currentCase.peek(), this.framablePlume()));
    else this.fitTo(this.map.getBounds().extend(ll));
  }

  /** A new plume for the case on screen: frame it on opening, and follow it while the map frames. */
  private framePlume(): void {
    const p = this.framablePlume();
    if (!p || !this.autoFrame) return;
    const band = bandBounds(p, 0);
    if (!this.plumeFramed || (band && !this.innerView().contains(band))) this.fitTo(this.frameTargets(currentCase.peek(), p));
    this.plumeFramed = true;
  }

  // ---- labels ----------------------------------------------------------------------------
  private labelsQueued = false;
  /**
   * Keep every mark's label inside the map: to the right of the mark where it fits, else to the
   * left, else on the roomier side cut short (the full name is in the mark's accessible name and
   * in the receptor list).
   */
  placeLabels(): void {
    if (this.labelsQueued) return;
    this.labelsQueued = true;
    requestAnimationFrame(() => {
      this.labelsQueued = false;
      // the map may have been taken down (another case opened) before this frame
      if (this.removed) return;
      const size = this.map.getSize();
      if (!size.x) return;
      // every labelled mark, the selected one first, then receptors, water levels, monitoring wells
      // (declutter.ts: right, left, above, below, else hidden; nothing overprints)
      const sel = selectedId.peek();
      const groups = [this.receptors, this.heads, this.monitoring?.marks ?? new Map<string, L.Marker>()];
      const entries: { id: string; el: HTMLElement; label: HTMLElement; rank: number; x: number; y: number }[] = [];
      const symbols: Rect[] = [];
      const controls: Rect[] = [];
      for (const m of [this.source, this.flowHandle]) {
        const p = this.map.latLngToContainerPoint(m.getLatLng());
        symbols.push(symbolRect(p.x, p.y));
      }
      groups.forEach((g, rank) => {
        for (const [id, m] of g) {
          const el = m.getElement();
          const p = this.map.latLngToContainerPoint(m.getLatLng());
          symbols.push(symbolRect(p.x, p.y));
          const label = el?.querySelector<HTMLElement>('.dg-mark-label');
          if (!el || !label) continue;
          el.classList.remove(...LABEL_CLASSES);
          label.style.maxWidth = '';
          label.style.marginLeft = '';
          entries.push({ id: `${rank}:${id}`, el, label, rank: id === sel ? -1 : rank, x: p.x, y: p.y });
        }
      });
      const box = this.map.getContainer().getBoundingClientRect();
      this.map.getContainer().querySelectorAll('.leaflet-control').forEach((c) => {
        const r = c.getBoundingClientRect();
        if (r.width && r.height) controls.push({ x: r.left - box.left, y: r.top - box.top, w: r.width, h: r.height });
      });
      entries.sort((a, b) => a.rank - b.rank);
      const placed = declutter(
        entries.map((e) => ({ id: e.id, x: e.x, y: e.y, w: e.label.offsetWidth, h: e.label.offsetHeight, keep: e.rank < 0 })),
        symbols,
        controls,
        size.x,
        size.y,
      );
      for (const e of entries) {
        const p = placed.get(e.id);
        e.el.classList.add(p?.side ? `dg-label-${p.side}` : 'dg-label-hidden');
        if (p?.maxWidth) e.label.style.maxWidth = `${p.maxWidth}px`;
        // slid sideways from centred (above or below, at the view's edge): the centring transform stays
        if (p?.shift) e.label.style.marginLeft = `${p.shift}px`;
      }
      // then the head lines' labels, clear of the marks, their labels as placed, the controls and
      // anything laid over the map (notices, the stale-plume message, a tool's hint)
      const taken: Rect[] = [...symbols, ...controls];
      const rectOf = (el: Element): Rect | null => {
        const r = el.getBoundingClientRect();
        return r.width && r.height ? { x: r.left - box.left, y: r.top - box.top, w: r.width, h: r.height } : null;
      };
      for (const e of entries) {
        const r = e.el.classList.contains('dg-label-hidden') ? null : rectOf(e.label);
        if (r) taken.push(r);
      }
      const wrap = this.map.getContainer().closest('.dg-map-wrap') ?? document.body;
      for (const el of [...wrap.querySelectorAll('.dg-map-stale, .dg-tool-hint'), ...document.querySelectorAll('.dg-notices > *')]) {
        const r = rectOf(el);
        if (r) taken.push(r);
      }
      guarded('well-field labels', () => this.wells.placeLabels(taken));
    });
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
    const tiles = L.tileLayer(url, { attribution: attributionHtml(attribution), maxZoom: 21, maxNativeZoom: 19, crossOrigin: true, errorTileUrl: '' });
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
    const moved: L.LatLng[] = [];
    if (!this.source.getLatLng().equals(toLatLng(src.position))) this.source.setLatLng(toLatLng(src.position));
    setPathLatLngs(this.footprint, src.footprint ? src.footprint.map(toLatLng) : []);

    const seen = new Set<string>();
    for (const r of c.site.receptors) {
      seen.add(r.id);
      let m = this.receptors.get(r.id);
      const status = results?.receptors.find((x) => x.id === r.id)?.status ?? null;
      const key = `${r.kind}|${r.name}|${status}|${sel === r.id}`;
      if (!m) {
        // created with its own icon: Leaflet's default marker image is never requested
        m = L.marker(toLatLng(r.position), { icon: receptorIcon(r.kind, r.name, status, sel === r.id), draggable: true, keyboard: true, title: r.name });
        if (this.synced) moved.push(m.getLatLng());
        const id = r.id;
        m.on('drag', () => this.moveReceptor(id, m!.getLatLng()));
        m.on('dragend', () => this.moveReceptor(id, m!.getLatLng()));
        m.on('click', () => selectFromMap(id));
        m.addTo(this.map);
        this.receptors.set(r.id, m);
      }
      if ((m as unknown as { _dgKey?: string })._dgKey !== key) {
        m.setIcon(receptorIcon(r.kind, r.name, status, sel === r.id));
        (m as unknown as { _dgKey?: string })._dgKey = key;
        this.placeLabels();
      }
      if (!m.getLatLng().equals(toLatLng(r.position))) {
        m.setLatLng(toLatLng(r.position));
        moved.push(m.getLatLng());
      }
    }
    for (const [id, m] of this.receptors) if (!seen.has(id)) (m.remove(), this.receptors.delete(id));

    const readings = c.site.flow.method === 'heads' ? c.site.flow.readings : [];
    const seenH = new Set<string>();
    readings.forEach((h, i) => {
      seenH.add(h.id);
      let m = this.heads.get(h.id);
      // the water level as its field shows it (the case's unit system, or the field's own unit)
      const level = shownQuantity(c, `site.flow.readings[${i}].head`, h.head);
      const label = `${h.name}: ${level === h.head ? h.head.value : formatSig(level.value, 5)} ${UNITS[level.unit]?.label ?? level.unit}`;
      const key = `${label}|${sel === h.id}`;
      if (!m) {
        m = L.marker(toLatLng(h.position), { icon: headIcon(label, sel === h.id), draggable: true, keyboard: true, title: h.name });
        if (this.synced) moved.push(m.getLatLng());
        const id = h.id;
        m.on('dragend', () => this.moveHead(id, m!.getLatLng()));
        m.on('click', () => (selectedId.value = id));
        m.addTo(this.map);
        this.heads.set(h.id, m);
      }
      if ((m as unknown as { _dgKey?: string })._dgKey !== key) {
        m.setIcon(headIcon(label, sel === h.id));
        (m as unknown as { _dgKey?: string })._dgKey = key;
        this.placeLabels();
      }
      if (!m.getLatLng().equals(toLatLng(h.position))) {
        m.setLatLng(toLatLng(h.position));
        moved.push(m.getLatLng());
      }
    });
    for (const [id, m] of this.heads) if (!seenH.has(id)) (m.remove(), this.heads.delete(id));
    this.synced = true;
    // labels are placed again when a mark moved, came or went, or the flow turned (a new icon
    // places them above); an edit of anything else leaves them, and no layout is forced for it
    const places = [c.site.source.position, ...c.site.receptors.map((r) => r.position), ...readings.map((h) => h.position)];
    const placesKey = JSON.stringify([places, c.site.flow.method === 'direction' ? c.site.flow.azimuthDeg : (results?.derived.azimuthDeg ?? null)]);
    if (placesKey !== this.labelPlacesKey) {
      this.labelPlacesKey = placesKey;
      this.placeLabels();
    }
    // a point added or moved from outside the map (the panel, an undo) that is out of view
    if (moved.length) {
      const b = L.latLngBounds(moved);
      if (!this.innerView().contains(b)) this.bringIntoView(b);
    }
  }
  /** whether the case's points have been put on the map once (later additions are new) */
  private synced = false;
  /** the marks' places (and the flow's direction) when syncCase last placed the labels */
  private labelPlacesKey = '';

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
      const style = { fillOpacity: bandFillOpacity(k, n) };
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
    this.framePlume();
    const done = this.onPlumeDrawn;
    if (done && p) requestAnimationFrame(() => done(p));
  }

  // ---- gestures --------------------------------------------------------------------------
  private wireGestures(): void {
    const map = this.map;
    // a mark is a button (role=button, tabbable): Enter or Space on it acts as a tap, as Leaflet 1.9
    // no longer turns a keypress into a click (a monitoring well's mark opens its results, a
    // receptor's selects it)
    map.getContainer().addEventListener('keydown', (e) => {
      const el = e.target as HTMLElement;
      if ((e.key === 'Enter' || e.key === ' ') && el.classList?.contains('leaflet-marker-icon')) {
        e.preventDefault();
        el.click();
      }
    });
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
        updateCase((d) => void d.site.receptors.push(newReceptor(at, d.site.receptors.length, id)));
        selectedId.value = id;
        mapTool.value = 'move';
      } else if (tool === 'add-boundary') {
        if (this.wells.tap(e.latlng)) mapTool.value = 'move';
      } else if (tool === 'add-head') {
        const id = newId();
        updateCase((d) => {
          if (d.site.flow.method !== 'heads') d.site.flow = { method: 'heads', readings: [] };
          d.site.flow.readings.push(newHeadReading(at, d.site.flow.readings.length, id));
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
      updateCase((d) => setFootprint(d, ring));
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

/** The extent of band k of the plume (null: the band is empty). */
function bandBounds(p: PlumeLayer, k: number): L.LatLngBounds | null {
  const { bandPolygons, polygonRings, ringVertices, coords } = p.bands;
  if (k + 1 >= bandPolygons.length || bandPolygons[k] === bandPolygons[k + 1]) return null;
  const v0 = ringVertices[polygonRings[bandPolygons[k]]];
  const v1 = ringVertices[polygonRings[bandPolygons[k + 1]]];
  let x0 = Infinity, x1 = -Infinity, y0 = Infinity, y1 = -Infinity;
  for (let v = v0; v < v1; v++) {
    const x = coords[2 * v], y = coords[2 * v + 1];
    if (x < x0) x0 = x;
    if (x > x1) x1 = x;
    if (y < y0) y0 = y;
    if (y > y1) y1 = y;
  }
  return v1 > v0 ? L.latLngBounds(L.latLng(y0, x0), L.latLng(y1, x1)) : null;
}

/** The frame button: shows the whole case again and lets the map frame it from then on. */
const FrameControl = L.Control.extend({
  initialize(this: L.Control & { onFrame: () => void }, options: L.ControlOptions, onFrame: () => void) {
    L.Util.setOptions(this, options);
    this.onFrame = onFrame;
  },
  onAdd(this: L.Control & { onFrame: () => void }) {
    const bar = L.DomUtil.create('div', 'leaflet-bar dg-frame-control');
    const b = L.DomUtil.create('button', 'dg-frame-btn', bar) as HTMLButtonElement;
    b.type = 'button';
    b.setAttribute('aria-label', 'Show the whole case');
    b.title = 'Show the whole case';
    b.innerHTML = '<svg viewBox="0 0 24 24" width="24" height="24" aria-hidden="true"><path d="M3 9V3h6M15 3h6v6M21 15v6h-6M9 21H3v-6" fill="none" stroke="currentColor" stroke-width="2.5" stroke-linecap="round"/></svg>';
    L.DomEvent.disableClickPropagation(bar);
    L.DomEvent.on(b, 'click', () => this.onFrame());
    return bar;
  },
}) as unknown as new (options: L.ControlOptions, onFrame: () => void) => L.Control;

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
