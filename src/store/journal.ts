/**
 * Safety copies of unsaved edits, replayed at the next start (`recoverJournal`) through the same
 * compare-and-set as any save, so they never overwrite a newer save silently.
 *
 * Two copies, because neither alone survives every way a tab ends:
 * - on every edit, this tab's record in the IndexedDB `journal` store (`CaseStore.putJournal`,
 *   written at once, without the autosave's quiet time). A hard kill of the browser loses at most
 *   the edit whose write was in flight. (localStorage would not do here: Chromium commits it to disk
 *   seconds later, and a killed browser loses it; measured with SIGKILL at 50 ms to 3 s.)
 * - at `pagehide` / hidden, a synchronous `localStorage` copy (`Journal`): an IndexedDB write
 *   started as a tab closes may never commit, while localStorage is flushed when the browser
 *   closes the page normally.
 *
 * Copies are kept per case and per tab (the store's `writer`), so two tabs never overwrite or
 * clear each other's. A tab that is still running holds a Web Lock named after its writer, and
 * its copies are left alone: only the copies of tabs that have ended are replayed. Before a copy
 * is stored as a "(recovered edits)" case, its contents are compared with the stored case
 * (ignoring the edit time), and with the tab's own later saves.
 */
import type { Case } from '../case/schema';
import { readCaseData } from './caseData';
import type { CaseStore } from './cases';

export interface JournalEntry {
  case: Case;
  /** the stored revision the edits started from (null: the case was never stored) */
  baseRevision: number | null;
  at: number;
  /** the tab that made the edits (absent in copies written before copies were kept per tab) */
  writer?: string;
}

/** The part of the Web Storage API the journal uses (tests pass a Map-backed one). */
export interface KeyValueStorage {
  readonly length: number;
  key(i: number): string | null;
  getItem(k: string): string | null;
  setItem(k: string, v: string): void;
  removeItem(k: string): void;
}

const PREFIX = 'downgradient:unsaved:';

export class Journal {
  /** `writer`: this tab's CaseStore.writer (copies are kept per case and tab) */
  constructor(
    private readonly storage: KeyValueStorage | null,
    readonly writer?: string,
  ) {}

  private key(id: string): string {
    return PREFIX + id + (this.writer ? `|${this.writer}` : '');
  }

  /** Returns false when the copy could not be written (no storage, or it is full). */
  write(c: Case, baseRevision: number | null, at = Date.now()): boolean {
    if (!this.storage) return false;
    try {
      this.storage.setItem(this.key(c.id), JSON.stringify({ case: c, baseRevision, at, writer: this.writer } satisfies JournalEntry));
      return true;
    } catch {
      return false;
    }
  }

  /** Drop this tab's copy for the case (`key`: another entry's storage key, as `entries` lists it). */
  clear(id: string, key = this.key(id)): void {
    try {
      this.storage?.removeItem(key);
    } catch {
      /* nothing to do: a stale entry is replayed harmlessly by compare-and-set */
    }
  }

  entries(): { id: string; key: string; entry: JournalEntry | null; raw: string }[] {
    const out: { id: string; key: string; entry: JournalEntry | null; raw: string }[] = [];
    if (!this.storage) return out;
    for (let i = 0; i < this.storage.length; i++) {
      const k = this.storage.key(i);
      if (!k || !k.startsWith(PREFIX)) continue;
      const raw = this.storage.getItem(k) ?? '';
      const [id, keyWriter] = k.slice(PREFIX.length).split('|');
      let entry: JournalEntry | null = null;
      try {
        const o = JSON.parse(raw) as JournalEntry;
        entry = readEntry(o.case, o.baseRevision, o.at, typeof o.writer === 'string' ? o.writer : keyWriter);
      } catch {
        entry = null;
      }
      out.push({ id, key: k, entry, raw });
    }
    return out;
  }
}

function readEntry(data: unknown, baseRevision: unknown, at: unknown, writer: string | undefined): JournalEntry | null {
  const read = readCaseData(data);
  if (!read.ok || !(baseRevision === null || Number.isInteger(baseRevision))) return null;
  return { case: read.case, baseRevision: baseRevision as number | null, at: Number(at) || 0, writer };
}

/** The writers (tabs) still running: each holds a Web Lock named by `tabLockName`. */
export type LiveWriters = () => Promise<Set<string>>;

export const tabLockName = (writer: string) => `downgradient-tab:${writer}`;

/** Hold this tab's lock for as long as the tab lives (released by the browser when it ends). */
export function holdTabLock(writer: string): void {
  const locks = (globalThis.navigator as Navigator | undefined)?.locks;
  if (!locks) return;
  void locks.request(tabLockName(writer), () => new Promise<void>(() => {})).catch(() => {});
}

/** The writers of the tabs running now, from the held Web Locks (none known without the API). */
export const liveWritersFromLocks: LiveWriters = async () => {
  const locks = (globalThis.navigator as Navigator | undefined)?.locks;
  const out = new Set<string>();
  if (!locks) return out;
  try {
    const q = await locks.query();
    for (const l of q.held ?? []) if (l.name?.startsWith('downgradient-tab:')) out.add(l.name.slice('downgradient-tab:'.length));
  } catch {
    /* no lock information: every copy is replayed */
  }
  return out;
};

/** Two versions of a case hold the same contents (the time of the last edit aside). */
export function sameContents(a: unknown, b: unknown): boolean {
  const strip = (x: unknown) => (x && typeof x === 'object' ? JSON.stringify({ ...(x as object), modified: null }) : JSON.stringify(x));
  return strip(a) === strip(b);
}

export interface Recovery {
  id: string;
  outcome: 'saved' | 'saved-as-copy' | 'already-saved' | 'unreadable';
  name: string;
  /** id of the copy, when the edits were saved as a copy */
  copyId?: string;
}

interface Copy {
  id: string;
  writer: string | undefined;
  entry: JournalEntry;
  /** drops this copy once it is dealt with */
  clear: () => Promise<void> | void;
}

/**
 * Replay unsaved edits left by tabs that have ended (both copies, per case and tab; the newer of
 * the two copies of one tab wins). Edits based on the stored revision, or on a later revision the
 * same tab saved itself, are saved; edits whose contents are already stored are dropped; edits
 * overtaken by another tab's save are saved as a copy (nothing is lost). An unreadable entry is
 * left in place (and reported) rather than deleted. Copies of tabs still running are left alone.
 */
export async function recoverJournal(store: CaseStore, journal: Journal, liveWriters: LiveWriters = liveWritersFromLocks): Promise<Recovery[]> {
  const out: Recovery[] = [];
  const live = await liveWriters();
  const copies = new Map<string, Copy[]>();
  const add = (c: Copy) => {
    const k = `${c.id}|${c.writer ?? ''}`;
    copies.set(k, [...(copies.get(k) ?? []), c]);
  };
  for (const { id, key, entry } of journal.entries()) {
    if (entry?.writer && live.has(entry.writer)) continue;
    if (!entry) {
      out.push({ id, outcome: 'unreadable', name: id });
      continue;
    }
    add({ id, writer: entry.writer, entry, clear: () => journal.clear(id, key) });
  }
  for (const rec of await store.journalRecords()) {
    if (live.has(rec.writer)) continue;
    const entry = readEntry(rec.data, rec.baseRevision, rec.at, rec.writer);
    if (!entry) {
      out.push({ id: rec.caseId, outcome: 'unreadable', name: rec.caseId });
      continue;
    }
    add({ id: rec.caseId, writer: rec.writer, entry, clear: () => store.clearJournal(rec.caseId, rec.writer) });
  }
  for (const group of copies.values()) {
    const newest = group.reduce((a, b) => (b.entry.at > a.entry.at ? b : a));
    out.push(await replay(store, newest));
    for (const c of group) await c.clear();
  }
  return out;
}

async function replay(store: CaseStore, { id, writer, entry }: Copy): Promise<Recovery> {
  const name = entry.case.name;
  const stored = await store.getRecord(id);
  if (stored && sameContents(stored.data, entry.case)) return { id, outcome: 'already-saved', name };
  // the same tab saved a later revision itself: its unsaved edits continue from that save
  const base = stored && writer && stored.writer === writer ? stored.revision : entry.baseRevision;
  const r = await store.save(entry.case, base);
  if (r.status === 'saved') return { id, outcome: 'saved', name };
  const copy = await store.saveAsNew(entry.case, `${name} (recovered edits)`);
  return { id, outcome: 'saved-as-copy', name: copy.case.name, copyId: copy.case.id };
}
