/**
 * The probability-of-exceedance contours on the site map: after a Monte Carlo run of the case as
 * it is now, the lines where P(C > limit) at the map's time is 5, 50 and 95 % (case/exceedanceMap.ts),
 * drawn as outlines over the deterministic plume (dotted, dashed, solid as the probability rises),
 * never filled, so the plume's own bands stay readable beneath them. Removed as soon as the case
 * changes (the run is then out of date). Its own module: the site map only creates and destroys it.
 * The key below the map (ExceedanceKey.tsx) says what the lines are and their Monte Carlo error.
 */
import * as L from 'leaflet';
import { effect } from '@preact/signals';
import { currentCase } from '../state';
import { currentRunFor } from '../uncertaintyState';
import { packedPolygons } from '../../geo/contours';
import type { ExceedanceContours } from '../../case/exceedanceMap';

export class ExceedanceLayer {
  private readonly lines: L.Polygon[] = [];
  private drawn: ExceedanceContours | null = null;
  private readonly dispose: () => void;

  constructor(private readonly map: L.Map) {
    this.dispose = effect(() => this.sync(currentRunFor(currentCase.value)?.map ?? null));
  }

  private sync(m: ExceedanceContours | null): void {
    if (m === this.drawn) return;
    this.drawn = m;
    const n = m ? m.levels.length : 0;
    for (let k = 0; k < Math.max(n, this.lines.length); k++) {
      const latlngs = m && k < n ? packedPolygons(m.bands, k).map((poly) => poly.map((ring) => ring.slice(0, -1).map(([x, y]) => L.latLng(y, x)))) : [];
      let line = this.lines[k];
      if (!latlngs.length) {
        line?.remove();
        continue;
      }
      if (!line) {
        line = L.polygon(latlngs, { interactive: false, fill: false, className: `dg-pexceed dg-pexceed-${k}` });
        this.lines[k] = line;
      } else line.setLatLngs(latlngs);
      if (!this.map.hasLayer(line)) line.addTo(this.map);
      line.bringToFront();
    }
  }

  destroy(): void {
    this.dispose();
    for (const l of this.lines) l?.remove();
  }
}
