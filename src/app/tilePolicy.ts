/**
 * Which tile servers the app may contact. The build fixes the list (env `DG_TILE_ORIGINS`, see
 * vite.config.ts), because the Content Security Policy written into index.html at build time
 * allows images from exactly these origins and no others. A tile URL the user types in Settings
 * works only if its origin is on the list; to use your own tile server, build with
 *   DG_TILE_ORIGINS=https://tiles.example.org npm run build
 * (several: comma-separated; the default is OpenStreetMap's standard tile server).
 */
declare const __DG_TILE_ORIGINS__: string[] | undefined;

export const DEFAULT_TILE_ORIGINS = ['https://tile.openstreetmap.org'];

export const ALLOWED_TILE_ORIGINS: readonly string[] =
  typeof __DG_TILE_ORIGINS__ !== 'undefined' ? __DG_TILE_ORIGINS__ : DEFAULT_TILE_ORIGINS;

/** The origin of a tile URL template ({s} subdomains are not supported by the policy). */
export function tileOrigin(template: string): string | null {
  try {
    const u = new URL(template.replace(/\{[a-z]+\}/g, '0'));
    return u.protocol === 'https:' || u.protocol === 'http:' ? u.origin : null;
  } catch {
    return null;
  }
}

/** null when allowed, otherwise a message naming the field and what is accepted. */
export function checkTileOrigin(template: string, allowed: readonly string[] = ALLOWED_TILE_ORIGINS): string | null {
  if (template === '') return null;
  const o = tileOrigin(template);
  if (o && allowed.includes(o)) return null;
  return `Tile URL: this build may load map tiles only from ${allowed.join(', ')} (its security policy blocks other hosts). Rebuild with DG_TILE_ORIGINS set to add a tile server.`;
}
