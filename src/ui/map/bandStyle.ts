/**
 * How the plume bands are painted, in one place for the map and its legend. Band k is the area
 * where C ≥ threshold k (the bands nest); each is filled with its theme colour (`--band-k`, app.css)
 * at `bandFillOpacity(k, n)`, the limit band (k = 0) on top. A point inside band k therefore shows
 * bands k, k−1, …, 0 stacked over the map: the legend's swatch is painted the same way, so its
 * colour is the band's as seen on the map in either theme.
 */

/** Fill opacity of band k of n: the higher bands more opaque, so they read through the ones above. */
export function bandFillOpacity(k: number, n: number): number {
  return 0.45 + (0.4 * k) / Math.max(1, n);
}

const bandVar = (k: number) => `var(--band-${Math.min(k, 3)})`;

/**
 * CSS background of band k's legend swatch: bands 0…k as layers (band 0 on top, as on the map)
 * over the map's own paper colour.
 */
export function swatchBackground(k: number, n: number): string {
  const layers: string[] = [];
  for (let j = 0; j <= k; j++) {
    const c = `color-mix(in srgb, ${bandVar(j)} ${Math.round(bandFillOpacity(j, n) * 100)}%, transparent)`;
    layers.push(`linear-gradient(${c}, ${c})`);
  }
  return `${layers.join(', ')}, var(--map-paper)`;
}
