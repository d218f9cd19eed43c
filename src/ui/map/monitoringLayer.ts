/**
 * The monitoring wells on the site map: one vial mark per placed well (monitoringIcon), labelled
 * with its name and latest result of the compared analyte ("MW-2: < 5 µg/L"), draggable with the
 * pan tool like every mark; a tap selects the well and opens "What was measured?" at its results,
 * trend and measured-against-modelled curve. The "+ Monitoring well" tool places a new well where
 * the map is tapped.
 *
 * Its own module (the site map creates it and asks it for its marks when it frames the case or
 * places labels), so the map's other layers are untouched by it.
 */
import * as L from 'leaflet';
import { effect } from '@preact/signals';
import type { Case } from '../../case/schema';
import { comparedAnalyte, newMonitoringWell, resultText, wellSeries } from '../../case/monitoring';
import { newId } from '../../case/defaults';
import { currentCase, updateCase } from '../state';
import { mapTool, openSections, selectedId } from '../view';
import { monitoringIcon } from './symbols';

const latLng = (p: readonly [number, number]): L.LatLng => L.latLng(p[1], p[0]);

/** The label of a well's mark: its name and its latest result of the compared analyte. */
export function monitoringLabel(c: Case, wellId: string, name: string): string {
  const series = wellSeries(c.monitoring, wellId, comparedAnalyte(c.monitoring, c.contaminant.name));
  const latest = series[series.length - 1];
  return latest ? `${name}: ${resultText(latest)}` : name;
}

/** Select a monitoring well and open the monitoring panel at it. */
export function showMonitoringWell(id: string): void {
  selectedId.value = id;
  if (!openSections.peek().has('monitoring')) openSections.value = new Set([...openSections.peek(), 'monitoring']);
}

export class MonitoringLayer {
  readonly marks = new Map<string, L.Marker>();
  private readonly keys = new Map<string, string>();
  private readonly disposers: (() => void)[] = [];

  /**
   * `changed(moved)`: marks were added or relabelled (the map re-places labels); `moved` holds the
   * positions of marks added or moved from outside the map (the map brings them into view).
   */
  constructor(
    private readonly map: L.Map,
    private readonly changed: (moved: L.LatLng[]) => void,
  ) {
    this.disposers.push(effect(() => this.sync(currentCase.value, selectedId.value)));
    this.disposers.push(
      effect(() => {
        // while tracing the release outline no mark moves under the finger
        const tracing = mapTool.value === 'trace-footprint';
        for (const m of this.marks.values()) (tracing ? m.dragging?.disable() : m.dragging?.enable());
      }),
    );
    const onClick = (e: L.LeafletMouseEvent) => {
      if (mapTool.peek() !== 'add-monitoring') return;
      const id = newId();
      const at: [number, number] = [e.latlng.lng, e.latlng.lat];
      updateCase((d) => void d.monitoring.wells.push(newMonitoringWell(d.monitoring, at, id)));
      mapTool.value = 'move';
      showMonitoringWell(id);
    };
    map.on('click', onClick);
    this.disposers.push(() => map.off('click', onClick));
  }

  destroy(): void {
    for (const d of this.disposers) d();
    for (const m of this.marks.values()) m.remove();
    this.marks.clear();
  }

  private sync(c: Case, sel: string | null): void {
    const moved: L.LatLng[] = [];
    let relabelled = false;
    const seen = new Set<string>();
    for (const w of c.monitoring.wells) {
      if (!w.position) continue;
      seen.add(w.id);
      const label = monitoringLabel(c, w.id, w.name);
      const key = `${w.name}|${label}|${sel === w.id}`;
      let m = this.marks.get(w.id);
      if (!m) {
        m = L.marker(latLng(w.position), { icon: monitoringIcon(w.name, label, sel === w.id), draggable: mapTool.peek() !== 'trace-footprint', keyboard: true, title: `${w.name} (monitoring well)` });
        const id = w.id;
        const mark = m;
        m.on('dragend', () => this.move(id, mark.getLatLng()));
        m.on('click', () => showMonitoringWell(id));
        m.addTo(this.map);
        this.marks.set(w.id, m);
        this.keys.set(w.id, key);
        moved.push(m.getLatLng());
        relabelled = true;
        continue;
      }
      if (this.keys.get(w.id) !== key) {
        m.setIcon(monitoringIcon(w.name, label, sel === w.id));
        this.keys.set(w.id, key);
        relabelled = true;
      }
      if (!m.getLatLng().equals(latLng(w.position))) {
        m.setLatLng(latLng(w.position));
        moved.push(m.getLatLng());
      }
    }
    for (const [id, m] of this.marks)
      if (!seen.has(id)) {
        m.remove();
        this.marks.delete(id);
        this.keys.delete(id);
      }
    if (relabelled || moved.length) this.changed(moved);
  }

  private move(id: string, ll: L.LatLng): void {
    updateCase((d) => {
      const w = d.monitoring.wells.find((x) => x.id === id);
      if (w) w.position = [ll.lng, ll.lat];
    });
  }
}
