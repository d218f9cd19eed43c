/**
 * The live map controller, if a map is mounted. Its own small module so the panels can reach the
 * map (show a receptor) without importing the map's chunk: the map and Leaflet load on demand
 * (DEVELOPERS.md, "First load").
 */
import type { SiteMap } from './siteMap';

let active: SiteMap | null = null;

/** The live map controller (tests and the latency measurement hook into it); null before the map mounts. */
export function activeSiteMap(): SiteMap | null {
  return active;
}

/** Called by the map panel when its controller is created (m) and destroyed (null). */
export function setActiveSiteMap(m: SiteMap | null, was?: SiteMap): void {
  if (m || active === was) active = m;
}
