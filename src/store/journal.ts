/**
 * A synchronous safety copy of unsaved edits. IndexedDB writes are asynchronous: when a tab is
 * closed, the app is swiped away or the battery dies, a save started in `pagehide` may never
 * commit. `localStorage` writes are synchronous, so the autosaver copies unsaved edits here at those
 * moments (and when a save fails); the next start replays them through the same compare-and-set as
 * any save (`recoverJournal`), so they never overwrite a newer save silently.
 */
import type { Case } from '../case/schema';
import { readCaseData } from './caseData';
import type { CaseStore } from './cases';

export interface JournalEntry {
  case: Case;
  /** the stored revision the edits started from (null: the case was never stored) */
  baseRevision: number | null;
  at: number;
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
  constructor(private readonly storage: KeyValueStorage | null) {}

  /** Returns false when the copy could not be written (no storage, or it is full). */
  write(c: Case, baseRevision: number | null, at = Date.now()): boolean {
    if (!this.storage) return false;
    try {
      this.storage.setItem(PREFIX + c.id, JSON.stringify({ case: c, baseRevision, at } satisfies JournalEntry));
      return true;
    } catch {
      return false;
    }
  }

  clear(id: string): void {
    try {
      this.storage?.removeItem(PREFIX + id);
    } catch {
      /* nothing to do: a stale entry is replayed harmlessly by compare-and-set */
    }
  }

  entries(): { id: string; entry: JournalEntry | null; raw: string }[] {
    const out: { id: string; entry: JournalEntry | null; raw: string }[] = [];
    if (!this.storage) return out;
    for (let i = 0; i < this.storage.length; i++) {
      const k = this.storage.key(i);
      if (!k || !k.startsWith(PREFIX)) continue;
      const raw = this.storage.getItem(k) ?? '';
      let entry: JournalEntry | null = null;
      try {
        const o = JSON.parse(raw) as JournalEntry;
        const read = readCaseData(o.case);
        if (read.ok && (o.baseRevision === null || Number.isInteger(o.baseRevision))) {
          entry = { case: read.case, baseRevision: o.baseRevision, at: Number(o.at) || 0 };
        }
      } catch {
        entry = null;
      }
      out.push({ id: k.slice(PREFIX.length), entry, raw });
    }
    return out;
  }
}

export interface Recovery {
  id: string;
  outcome: 'saved' | 'saved-as-copy' | 'already-saved' | 'unreadable';
  name: string;
  /** id of the copy, when the edits were saved as a copy */
  copyId?: string;
}

/**
 * Replay unsaved edits left by a tab that closed before saving. Edits based on the stored revision
 * are saved; edits overtaken by a later save elsewhere are saved as a copy (nothing is lost).
 * An unreadable entry is left in place (and reported) rather than deleted.
 */
export async function recoverJournal(store: CaseStore, journal: Journal): Promise<Recovery[]> {
  const out: Recovery[] = [];
  for (const { id, entry } of journal.entries()) {
    if (!entry) {
      out.push({ id, outcome: 'unreadable', name: id });
      continue;
    }
    const stored = await store.getRecord(id);
    if (stored && JSON.stringify(stored.data) === JSON.stringify(entry.case)) {
      journal.clear(id);
      out.push({ id, outcome: 'already-saved', name: entry.case.name });
      continue;
    }
    const r = await store.save(entry.case, entry.baseRevision);
    if (r.status === 'saved') {
      out.push({ id, outcome: 'saved', name: entry.case.name });
    } else {
      const copy = await store.saveAsNew(entry.case, `${entry.case.name} (recovered edits)`);
      out.push({ id, outcome: 'saved-as-copy', name: copy.case.name, copyId: copy.case.id });
    }
    journal.clear(id);
  }
  return out;
}
