/**
 * The cases on the device: list and search, load, save with compare-and-set, rename, duplicate as
 * a what-if variant, delete to the trash with undo, and the last-open case.
 *
 * Every save names the revision it was based on. Inside one readwrite transaction the stored
 * revision is read and compared; if another tab saved in between, nothing is written and the
 * caller gets their record back to offer a choice (keep mine / take theirs / save mine as a copy).
 *
 * Writes that fail because the device is out of space throw `StorageFullError`; nothing stored
 * is changed by a failed transaction (IndexedDB aborts it as a whole).
 */
import type { IDBPDatabase } from 'idb';
import type { Case } from '../case/schema';
import { newId } from '../case/defaults';
import { openCaseDb, type ConnectionEvent } from './db';
import type { CaseDB, CaseRecord, JournalRecord, TrashRecord } from './schema';
import { readCaseData, type ReadResult } from './caseData';

/** Deleted cases stay restorable this long (then they are purged when the store opens). */
export const TRASH_KEEP_MS = 30 * 24 * 3600 * 1000;

export class StorageFullError extends Error {
  constructor(cause?: unknown) {
    super(
      'The device storage for this app is full: the latest changes are kept on screen but could not be saved. ' +
        'Free space (delete old cases or export them to files), then saving resumes by itself.',
    );
    this.name = 'StorageFullError';
    this.cause = cause;
  }
}

export function isQuotaError(e: unknown): boolean {
  if (!e || typeof e !== 'object') return false;
  const n = (e as { name?: string }).name;
  const inner = (e as { cause?: unknown }).cause;
  return n === 'QuotaExceededError' || n === 'StorageFullError' || (inner !== undefined && isQuotaError(inner));
}

/** What the library lists: the record without its case data, and whether it needs repair. */
export type CaseSummary = Omit<CaseRecord, 'writer' | 'data'> & {
  /** why the stored case cannot be screened as it is (unreadable, or a value the checks refuse), in words; null: it can */
  problem: string | null;
};

export type SaveResult =
  | { status: 'saved'; record: CaseRecord }
  | { status: 'conflict'; theirs: CaseRecord | null };

export interface StoreOptions {
  dbName?: string;
  /** identifies this tab in records it writes */
  writer?: string;
  events?: (e: ConnectionEvent) => void;
  now?: () => number;
  /** the complete checks of a stored case's data (the app passes the screening checks): a problem in words, or null */
  check?: (data: unknown) => string | null;
}

function summary(r: CaseRecord, check?: (data: unknown) => string | null): CaseSummary {
  let problem: string | null;
  try {
    problem = check ? check(r.data) : null;
  } catch (e) {
    problem = e instanceof Error ? e.message : String(e);
  }
  return { id: r.id, name: r.name, parentId: r.parentId, created: r.created, savedAt: r.savedAt, revision: r.revision, problem };
}

/** Case-insensitive, accent-insensitive match on every word of the query. */
export function matchesQuery(name: string, query: string): boolean {
  const fold = (s: string) => s.normalize('NFD').replace(/\p{M}/gu, '').toLowerCase();
  const hay = fold(name);
  return fold(query)
    .split(/\s+/)
    .filter(Boolean)
    .every((w) => hay.includes(w));
}

export class CaseStore {
  private db: IDBPDatabase<CaseDB> | null = null;
  private opening: Promise<IDBPDatabase<CaseDB>> | null = null;
  readonly writer: string;
  private readonly now: () => number;

  private constructor(private readonly opts: StoreOptions) {
    this.writer = opts.writer ?? newId();
    this.now = opts.now ?? Date.now;
  }

  static async open(opts: StoreOptions = {}): Promise<CaseStore> {
    const s = new CaseStore(opts);
    await s.connection();
    await s.purgeTrash();
    return s;
  }

  /** The open connection; reopened after it was closed for another tab's upgrade or dropped. */
  private async connection(): Promise<IDBPDatabase<CaseDB>> {
    if (this.db) return this.db;
    if (!this.opening) {
      this.opening = openCaseDb({
        name: this.opts.dbName,
        events: (e) => {
          if (e.type !== 'blocked') this.db = null;
          this.opts.events?.(e);
        },
      }).then(
        (db) => {
          this.db = db;
          this.opening = null;
          return db;
        },
        (err) => {
          this.opening = null;
          throw err;
        },
      );
    }
    return this.opening;
  }

  close(): void {
    this.db?.close();
    this.db = null;
  }

  private async write<T>(fn: (db: IDBPDatabase<CaseDB>) => Promise<T>): Promise<T> {
    const db = await this.connection();
    try {
      return await fn(db);
    } catch (e) {
      if (isQuotaError(e)) throw new StorageFullError(e);
      throw e;
    }
  }

  async list(): Promise<CaseSummary[]> {
    const db = await this.connection();
    const all = await db.getAllFromIndex('cases', 'by-saved');
    return all.reverse().map((r) => summary(r, this.opts.check));
  }

  async search(query: string): Promise<CaseSummary[]> {
    const all = await this.list();
    return query.trim() ? all.filter((c) => matchesQuery(c.name, query)) : all;
  }

  async getRecord(id: string): Promise<CaseRecord | undefined> {
    return (await this.connection()).get('cases', id);
  }

  async load(id: string): Promise<{ record: CaseRecord; read: ReadResult } | undefined> {
    const record = await this.getRecord(id);
    return record ? { record, read: readCaseData(record.data) } : undefined;
  }

  private toRecord(c: Case, revision: number): CaseRecord {
    return {
      id: c.id,
      name: c.name,
      parentId: c.parentId,
      created: c.created,
      savedAt: this.now(),
      revision,
      writer: this.writer,
      data: c,
    };
  }

  /**
   * Save `c` if the stored revision is still `baseRevision` (null: the case must not exist yet).
   * Otherwise nothing is written and the stored record is returned as `theirs`.
   */
  async save(c: Case, baseRevision: number | null): Promise<SaveResult> {
    return this.write(async (db) => {
      const tx = db.transaction('cases', 'readwrite');
      const stored = await tx.store.get(c.id);
      const current = stored ? stored.revision : null;
      if (current !== baseRevision) {
        await tx.done;
        return { status: 'conflict', theirs: stored ?? null } as const;
      }
      const record = this.toRecord(c, (current ?? 0) + 1);
      await tx.store.put(record);
      await tx.done;
      return { status: 'saved', record } as const;
    });
  }

  /** Overwrite whatever is stored (the user chose "keep mine" after a conflict). */
  async forceSave(c: Case): Promise<CaseRecord> {
    return this.write(async (db) => {
      const tx = db.transaction('cases', 'readwrite');
      const stored = await tx.store.get(c.id);
      const record = this.toRecord(c, (stored?.revision ?? 0) + 1);
      await tx.store.put(record);
      await tx.done;
      return record;
    });
  }

  /** Store a case under a fresh id (a copy, an import that collides, a recovered edit). */
  async saveAsNew(c: Case, name?: string): Promise<{ case: Case; record: CaseRecord }> {
    const stamp = new Date(this.now()).toISOString();
    const copy: Case = { ...structuredClone(c), id: newId(), name: name ?? c.name, created: stamp, modified: stamp };
    const r = await this.save(copy, null);
    if (r.status !== 'saved') throw new Error('a new case id collided with a stored case');
    return { case: copy, record: r.record };
  }

  /** Rename in the store (the case inside the record is renamed too). */
  async rename(id: string, name: string): Promise<CaseRecord> {
    const trimmed = name.trim();
    if (trimmed.length < 1 || trimmed.length > 200) {
      throw new RangeError('Case name: 1 to 200 characters (spaces at either end are dropped).');
    }
    return this.write(async (db) => {
      const tx = db.transaction('cases', 'readwrite');
      const stored = await tx.store.get(id);
      if (!stored) throw new Error(`no stored case with id ${id}`);
      const data =
        stored.data && typeof stored.data === 'object'
          ? { ...(stored.data as object), name: trimmed, modified: new Date(this.now()).toISOString() }
          : stored.data;
      const record: CaseRecord = { ...stored, name: trimmed, data, revision: stored.revision + 1, savedAt: this.now(), writer: this.writer };
      await tx.store.put(record);
      await tx.done;
      return record;
    });
  }

  /** A what-if variant of a stored case: a copy with a new id whose parent is the original. */
  async duplicateAsVariant(id: string, name?: string): Promise<{ case: Case; record: CaseRecord }> {
    const loaded = await this.load(id);
    if (!loaded) throw new Error(`no stored case with id ${id}`);
    if (!loaded.read.ok) throw new Error(`cannot duplicate: ${loaded.read.error}`);
    const parent = loaded.read.case;
    const variant: Case = { ...structuredClone(parent), parentId: parent.id };
    return this.saveAsNew(variant, name ?? `${parent.name} — what-if`);
  }

  /** Move a case to the trash (restorable with `restore` until purged). */
  async remove(id: string): Promise<TrashRecord> {
    return this.write(async (db) => {
      const tx = db.transaction(['cases', 'trash', 'meta'], 'readwrite');
      const stored = await tx.objectStore('cases').get(id);
      if (!stored) throw new Error(`no stored case with id ${id}`);
      const entry: TrashRecord = { id, deletedAt: this.now(), record: stored };
      await tx.objectStore('trash').put(entry);
      await tx.objectStore('cases').delete(id);
      if ((await tx.objectStore('meta').get('lastOpenId')) === id) await tx.objectStore('meta').delete('lastOpenId');
      await tx.done;
      return entry;
    });
  }

  /** Undo a delete. If a case with that id was stored meanwhile, the restored one gets a new id. */
  async restore(id: string): Promise<CaseRecord> {
    return this.write(async (db) => {
      const tx = db.transaction(['cases', 'trash'], 'readwrite');
      const entry = await tx.objectStore('trash').get(id);
      if (!entry) throw new Error(`no deleted case with id ${id}`);
      let record = entry.record;
      if (await tx.objectStore('cases').get(id)) {
        const nid = newId();
        record = { ...record, id: nid, data: { ...(record.data as object), id: nid }, revision: 1 };
      }
      await tx.objectStore('cases').put(record);
      await tx.objectStore('trash').delete(id);
      await tx.done;
      return record;
    });
  }

  async listTrash(): Promise<TrashRecord[]> {
    const db = await this.connection();
    return (await db.getAllFromIndex('trash', 'by-deleted')).reverse();
  }

  /** Drop trash entries older than `TRASH_KEEP_MS`. Returns how many were dropped. */
  async purgeTrash(): Promise<number> {
    const db = await this.connection();
    const tx = db.transaction('trash', 'readwrite');
    const cutoff = this.now() - TRASH_KEEP_MS;
    let n = 0;
    let cursor = await tx.store.index('by-deleted').openCursor(IDBKeyRange.upperBound(cutoff));
    while (cursor) {
      await cursor.delete();
      n++;
      cursor = await cursor.continue();
    }
    await tx.done;
    return n;
  }

  // ---- the journal of unsaved edits (src/store/journal.ts) ----------------------------------

  /** Keep a copy of this tab's unsaved edits of `c` (one record per case and tab, replaced). */
  async putJournal(c: Case, baseRevision: number | null, at = this.now()): Promise<void> {
    const rec: JournalRecord = { key: `${c.id}|${this.writer}`, caseId: c.id, writer: this.writer, baseRevision, at, data: c };
    await this.write((db) => db.put('journal', rec));
  }

  /** Drop a journal record (by default this tab's for the case). */
  async clearJournal(caseId: string, writer = this.writer): Promise<void> {
    await this.write((db) => db.delete('journal', `${caseId}|${writer}`));
  }

  async journalRecords(): Promise<JournalRecord[]> {
    return (await this.connection()).getAll('journal');
  }

  async lastOpenId(): Promise<string | undefined> {
    return (await this.connection()).get('meta', 'lastOpenId');
  }

  async setLastOpenId(id: string): Promise<void> {
    await this.write(async (db) => {
      await db.put('meta', id, 'lastOpenId');
    });
  }
}
