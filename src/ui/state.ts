/**
 * App state shared by the screen and the storage layer.
 *
 * - `currentCase`: the case on screen (a signal; treat its value as immutable).
 * - `updateCase(mutator)`: edit a copy of the case and publish it with `modified` stamped now; the
 *   edit joins the case's undo history (edits less than `COALESCE_MS` apart are one step, so a
 *   typed number or a drag on the map undoes as a whole).
 * - `undoEdit()` / `redoEdit()`: step through that history (`canUndo`, `canRedo`); each step is
 *   published as a new edit (stamped now), so it autosaves like any other.
 * - `replaceCase(c)`: put a whole case on screen (opening from the library or a file, demo cases);
 *   another case's arrival clears the history.
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

/** Edits closer together than this are one undo step (typing a number, dragging a mark). */
export const COALESCE_MS = 800;
/** Undo steps kept per open case (a case is a few kB). */
export const HISTORY_LIMIT = 100;

let past: Case[] = [];
let future: Case[] = [];
let lastEditAt = -Infinity;
const historySize = signal({ undo: 0, redo: 0 });
export const canUndo = computed(() => historySize.value.undo > 0);
export const canRedo = computed(() => historySize.value.redo > 0);
/** Bumped by undo and redo: a field being typed in drops its draft text and shows the case's value. */
export const historyEpoch = signal(0);

function publishHistory(): void {
  historySize.value = { undo: past.length, redo: future.length };
}

/** Edit the current case: `mutator` changes a deep copy, which then replaces the current case. */
export function updateCase(mutator: (draft: Case) => void, now: number = Date.now()): void {
  const prev = currentCase.value;
  const draft = structuredClone(prev);
  mutator(draft);
  draft.modified = stampAfter(prev.modified);
  if (past.length === 0 || now - lastEditAt > COALESCE_MS) {
    past.push(prev);
    if (past.length > HISTORY_LIMIT) past.shift();
  }
  lastEditAt = now;
  future = [];
  publishHistory();
  currentCase.value = draft;
}

function step(from: Case[], to: Case[]): boolean {
  const target = from.pop();
  if (!target) return false;
  const cur = currentCase.value;
  to.push(cur);
  lastEditAt = -Infinity; // the next edit starts a step of its own
  currentCase.value = { ...structuredClone(target), modified: stampAfter(cur.modified) };
  historyEpoch.value++;
  publishHistory();
  return true;
}

/** Undo the last edit (whatever field it was); false when there is nothing to undo. */
export function undoEdit(): boolean {
  return step(past, future);
}

/** Redo the last undone edit; false when there is nothing to redo. */
export function redoEdit(): boolean {
  return step(future, past);
}

/** Put a whole case on screen, as it is (its `modified` is kept). Another case clears the history. */
export function replaceCase(c: Case): void {
  if (c.id !== currentCase.peek().id) {
    past = [];
    future = [];
    lastEditAt = -Infinity;
    publishHistory();
  }
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
