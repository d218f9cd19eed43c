/**
 * The particle plume on the map: the bands C ≥ limit, 10× … of the latest particle run at the time
 * shown (src/ui/particleRun.ts), drawn as outlines (no fill) over the analytical plume so the two
 * can be compared; dashed while the run is partial or out of date. Own pane, above the plume bands.
 */
import * as L from 'leaflet';
import type { ParticleLayer } from '../particleState';
import { packedPolygons } from '../../geo/contours';

export class ParticleLayerView {
  private drawn: L.Polygon[] = [];
  private key: unknown = null;

  constructor(private readonly map: L.Map) {
    map.createPane('dg-particles').style.zIndex = '410';
  }

  sync(layer: ParticleLayer | null, shown: boolean, current: boolean, complete: boolean): void {
    const key = [layer, shown, current, complete];
    if (this.key && (this.key as unknown[]).every((v, i) => v === key[i])) return;
    this.key = key;
    for (const p of this.drawn) p.remove();
    this.drawn = [];
    if (!layer || !shown) return;
    layer.thresholds.forEach((_, k) => {
      const polys = packedPolygons(layer.bands, k);
      if (!polys.length) return;
      const latlngs = polys.map((rings) => rings.map((ring) => ring.slice(0, -1).map((p) => L.latLng(p[1], p[0]))));
      this.drawn.push(
        L.polygon(latlngs, {
          pane: 'dg-particles',
          interactive: false,
          fill: false,
          weight: k === 0 ? 3 : 2,
          className: `dg-particle-band dg-particle-band-${Math.min(k, 3)}${current && complete ? '' : ' is-partial'}`,
        }).addTo(this.map),
      );
    });
  }
}
