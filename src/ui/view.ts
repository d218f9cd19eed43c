/**
 * Screen-only state (not part of the case, never saved): the active map tool, the selected map
 * point, the play-back time of the plume animation, and whether basemap tiles are loading.
 */
import { signal } from '@preact/signals';

export type MapTool = 'move' | 'trace-footprint' | 'place-source' | 'add-receptor' | 'add-head' | 'add-monitoring' | 'add-boundary';

export const mapTool = signal<MapTool>('move');
/** id of the selected receptor, head reading or monitoring well */
export const selectedId = signal<string | null>(null);
/** a receptor tapped on the map: its row in the results table is brought into view (`n` counts taps, so the same one twice still asks) */
export const revealRequest = signal<{ id: string; n: number } | null>(null);
/** Select a receptor tapped on the map and ask for its table row to be shown. */
export function selectFromMap(id: string): void {
  selectedId.value = id;
  revealRequest.value = { id, n: (revealRequest.peek()?.n ?? 0) + 1 };
}
/** while the plume animation plays: the time shown, d; null when not playing */
export const playTime = signal<number | null>(null);
/** 'ok' tiles load; 'failed' none could load (offline, no signal) so the site grid shows; 'off' no tile URL */
export const tileState = signal<'loading' | 'ok' | 'failed' | 'off'>('loading');
export type SectionId = 'release' | 'flow' | 'aquifer' | 'risk' | 'results' | 'wells' | 'uncertainty' | 'monitoring';
/** which panel sections are open (several may be) */
export const openSections = signal<Set<SectionId>>(new Set<SectionId>(['release', 'results']));

/** The last point deleted from the map (receptor or water-level well), so it can be put back. */
export const lastDeleted = signal<
  | { what: 'receptor'; index: number; item: import('../case/schema').Receptor; caseId: string }
  | { what: 'head'; index: number; item: import('../case/schema').HeadReading; caseId: string }
  | null
>(null);

/** The settings dialog: closed, open, or open at the case's site coordinates (to place it on the basemap). */
export const settingsOpen = signal<null | 'all' | 'site'>(null);
