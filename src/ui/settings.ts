/**
 * Screen settings that belong to the device, not to a case: basemap tile server, theme and map
 * grid resolution. Kept in localStorage (small, synchronous, survives reloads); a damaged entry
 * falls back to the defaults.
 */
import { signal, effect } from '@preact/signals';
import { checkTileOrigin } from '../app/tilePolicy';

export interface ScreenSettings {
  /** XYZ tile URL template ({z}/{x}/{y}, optional {s}); empty: no basemap, site grid only */
  tileUrl: string;
  tileAttribution: string;
  theme: 'light' | 'dark';
  /** nodes per side of the flow-aligned lattice the plume is contoured on */
  gridSize: 64 | 128 | 192 | 256;
}

export const DEFAULT_TILE_URL = 'https://tile.openstreetmap.org/{z}/{x}/{y}.png';
export const DEFAULT_TILE_ATTRIBUTION =
  '© <a href="https://www.openstreetmap.org/copyright">OpenStreetMap</a> contributors';

export const DEFAULT_SETTINGS: ScreenSettings = {
  tileUrl: DEFAULT_TILE_URL,
  tileAttribution: DEFAULT_TILE_ATTRIBUTION,
  theme: 'light',
  gridSize: 128,
};

const KEY = 'downgradient.settings.v1';
const GRID_SIZES = [64, 128, 192, 256];

function load(): ScreenSettings {
  try {
    const raw = globalThis.localStorage?.getItem(KEY);
    if (!raw) return { ...DEFAULT_SETTINGS, theme: prefersDark() ? 'dark' : 'light' };
    const o = JSON.parse(raw) as Partial<ScreenSettings>;
    return {
      tileUrl: typeof o.tileUrl === 'string' ? o.tileUrl : DEFAULT_SETTINGS.tileUrl,
      tileAttribution: typeof o.tileAttribution === 'string' ? o.tileAttribution : DEFAULT_SETTINGS.tileAttribution,
      theme: o.theme === 'dark' ? 'dark' : 'light',
      gridSize: GRID_SIZES.includes(o.gridSize as number) ? (o.gridSize as ScreenSettings['gridSize']) : 128,
    };
  } catch {
    return { ...DEFAULT_SETTINGS };
  }
}

function prefersDark(): boolean {
  try {
    return globalThis.matchMedia?.('(prefers-color-scheme: dark)').matches ?? false;
  } catch {
    return false;
  }
}

export const settings = signal<ScreenSettings>(load());

export function updateSettings(patch: Partial<ScreenSettings>): void {
  settings.value = { ...settings.value, ...patch };
}

effect(() => {
  const s = settings.value;
  try {
    globalThis.localStorage?.setItem(KEY, JSON.stringify(s));
  } catch {
    /* private mode or full storage: settings last for this session only */
  }
  if (typeof document !== 'undefined') document.documentElement.dataset.theme = s.theme;
});

/**
 * A tile URL must be an http(s) URL template with {z}, {x} and {y}, on a tile server this build's
 * security policy allows (src/app/tilePolicy.ts); returns a message naming the field, or null.
 */
export function checkTileUrl(url: string): string | null {
  if (url === '') return null;
  if (!/^https?:\/\//.test(url)) return 'Tile URL: must start with https:// (or http://)';
  for (const k of ['{z}', '{x}', '{y}']) if (!url.includes(k)) return `Tile URL: must contain ${k}`;
  return checkTileOrigin(url);
}
