/**
 * The storage and offline layer's state, as signals the library and status components read.
 * Set up by boot(); components never touch IndexedDB or the service worker directly.
 */
import { signal } from '@preact/signals';
import type { CaseStore } from '../store/cases';
import type { Autosaver, SaveState } from '../store/autosave';
import type { StorageInfo } from '../store/quota';

export interface Notice {
  id: number;
  tone: 'info' | 'warn' | 'error';
  text: string;
  /** e.g. "Undo" after a delete */
  action?: { label: string; run: () => void | Promise<void> };
  /** ms on screen; undefined: until dismissed */
  timeoutMs?: number;
}

/** 'pending' until boot has opened the store and the first case is known to be saved */
export const saveState = signal<SaveState>({ kind: 'pending' });
export const online = signal<boolean>(typeof navigator === 'undefined' ? true : navigator.onLine !== false);
/** the app shell is precached: it will open with no network */
export const offlineReady = signal(false);
/** a new version is installed and waiting; `apply` saves, then switches and reloads */
export const updateWaiting = signal<null | { apply: () => Promise<void> }>(null);
export const storage = signal<StorageInfo>({ persisted: null, usage: null, quota: null });
/** set when IndexedDB cannot be opened at all (private mode in some browsers, disabled storage) */
export const storageUnavailable = signal<string | null>(null);
/** bumped whenever the stored list changes, so open lists reload */
export const libraryVersion = signal(0);
export const notices = signal<Notice[]>([]);

export const session: { store: CaseStore | null; autosaver: Autosaver | null } = { store: null, autosaver: null };

let nextNotice = 1;
export function notify(n: Omit<Notice, 'id'>): number {
  const id = nextNotice++;
  notices.value = [...notices.value, { ...n, id }];
  if (n.timeoutMs) setTimeout(() => dismiss(id), n.timeoutMs);
  return id;
}

export function dismiss(id: number): void {
  notices.value = notices.value.filter((n) => n.id !== id);
}

export function libraryChanged(): void {
  libraryVersion.value++;
}
