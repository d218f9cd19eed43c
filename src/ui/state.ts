/**
 * App state shared by the screen and the storage layer.
 *
 * - `currentCase`: the case on screen (a signal; treat its value as immutable).
 * - `updateCase(mutator)`: edit a copy of the case and publish it with `modified` stamped now.
 * - `replaceCase(c)`: put a whole case on screen (opening from the library or a file, demo cases).
 * - `currentResults`: the latest screening results for `currentCase`, produced off the main thread
 *   (see `evaluation.ts`); `null` until the first results arrive or while the inputs are invalid.
 *   `results.caseStamp === currentCase.value.modified` says the results belong to the current case.
 * - `getMapElement()`: the map's DOM element (for a report snapshot), or null before the map mounts.
 *
 * The storage layer autosaves by subscribing: `effect(() => save(currentCase.value))`.
 */
import { signal, computed, type ReadonlySignal } from '@preact/signals';
import type { Case } from '../case/schema';
import { newCase } from '../case/defaults';
import type { Evaluation } from './results';

export const currentCase = signal<Case>(newCase());

function stampAfter(previous: string): string {
  // `modified` must move forward even when two edits land within one millisecond.
  const now = Date.now();
  const prev = Date.parse(previous);
  const t = Number.isFinite(prev) && prev >= now ? prev + 1 : now;
  return new Date(t).toISOString();
}

/** Edit the current case: `mutator` changes a deep copy, which then replaces the current case. */
export function updateCase(mutator: (draft: Case) => void): void {
  const prev = currentCase.value;
  const draft = structuredClone(prev);
  mutator(draft);
  draft.modified = stampAfter(prev.modified);
  currentCase.value = draft;
}

/** Put a whole case on screen, as it is (its `modified` is kept). */
export function replaceCase(c: Case): void {
  currentCase.value = structuredClone(c);
}

const resultsSignal = signal<Evaluation | null>(null);
export const currentResults: ReadonlySignal<Evaluation | null> = computed(() => resultsSignal.value);

/** Used by the evaluation loop only. */
export function publishResults(r: Evaluation | null): void {
  resultsSignal.value = r;
}

let mapElement: HTMLElement | null = null;
/** The map container element (Leaflet panes, contours, markers), for report snapshots. */
export function getMapElement(): HTMLElement | null {
  return mapElement;
}
/** Called by the map component when it mounts and unmounts. */
export function registerMapElement(el: HTMLElement | null): void {
  mapElement = el;
}
