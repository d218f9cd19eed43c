/**
 * The IndexedDB schema of the cases kept on the device, as a TypeScript type (idb `DBSchema`),
 * and the ladder of upgrades that brings a database of any earlier version to the current one.
 *
 * Versions (each step is one function below; tests build a database at every earlier version
 * with the raw IndexedDB API and open it with this code — test/store/migrations.test.ts):
 *   1  store `cases`, keyPath `id`, the value is the case object itself.
 *   2  `cases` values are wrapped in a `CaseRecord` (revision number for compare-and-set between
 *      tabs, list fields copied out so the library does not parse every case), indexes
 *      `by-saved` and `by-parent`; store `meta` (last-open case, …).
 *   3  store `trash`: deleted cases are moved here (undo, and recovery for 30 days).
 *   4  store `journal`: the copy of unsaved edits each tab writes on every edit (keyed by case and
 *      tab), replayed at the next start after a hard kill (src/store/journal.ts).
 *
 * A record whose case does not validate is never dropped: the migration wraps whatever is there,
 * the library lists it as unreadable, and it can still be exported as raw JSON.
 */
import type { DBSchema, IDBPDatabase, IDBPTransaction, StoreNames } from 'idb';

export const DB_NAME = 'downgradient';
export const DB_VERSION = 4;

/** One stored case. `data` is the case file object (any case-file version; migrated on read). */
export interface CaseRecord {
  id: string;
  /** copied from the case for the library list and search */
  name: string;
  parentId: string | null;
  /** ISO time the case was created (from the case) */
  created: string;
  /** epoch ms of the last save on this device */
  savedAt: number;
  /** increases by one on every save; a save names the revision it started from (compare-and-set) */
  revision: number;
  /** the tab that wrote this revision (so a tab can tell its own saves from another's) */
  writer: string;
  data: unknown;
}

export interface TrashRecord {
  id: string;
  deletedAt: number;
  record: CaseRecord;
}

/** Unsaved edits of one case in one tab, written on every edit until they are saved. */
export interface JournalRecord {
  /** `${caseId}|${writer}` */
  key: string;
  caseId: string;
  /** the tab (CaseStore.writer) that made the edits */
  writer: string;
  /** the stored revision the edits started from (null: the case was never stored) */
  baseRevision: number | null;
  /** epoch ms of the edit */
  at: number;
  data: unknown;
}

export type MetaKey = 'lastOpenId';

export interface CaseDB extends DBSchema {
  cases: {
    key: string;
    value: CaseRecord;
    indexes: { 'by-saved': number; 'by-parent': string };
  };
  trash: {
    key: string;
    value: TrashRecord;
    indexes: { 'by-deleted': number };
  };
  meta: {
    key: MetaKey;
    value: string;
  };
  journal: {
    key: string;
    value: JournalRecord;
  };
}

type UpgradeTx = IDBPTransaction<CaseDB, StoreNames<CaseDB>[], 'versionchange'>;

function str(v: unknown, fallback: string): string {
  return typeof v === 'string' && v.length > 0 ? v : fallback;
}

/** v1 stored the case object itself; wrap it. Exported for the migration tests. */
export function wrapVersion1Value(value: unknown, key: string, now: number): CaseRecord {
  const o = (value !== null && typeof value === 'object' ? value : {}) as Record<string, unknown>;
  const parent = o.parentId;
  return {
    id: key,
    name: str(o.name, 'Unnamed case'),
    parentId: typeof parent === 'string' && parent.length > 0 ? parent : null,
    created: str(o.created, new Date(now).toISOString()),
    savedAt: Number.isFinite(Date.parse(String(o.modified))) ? Date.parse(String(o.modified)) : now,
    revision: 1,
    writer: 'migration',
    data: value,
  };
}

/**
 * Runs inside the versionchange transaction. Only IndexedDB requests may be awaited here: awaiting
 * anything else (fetch, a timer) lets the transaction commit early (see README.md).
 */
export async function upgradeDatabase(
  db: IDBPDatabase<CaseDB>,
  oldVersion: number,
  tx: UpgradeTx,
  now: number = Date.now(),
): Promise<void> {
  if (oldVersion < 1) {
    db.createObjectStore('cases', { keyPath: 'id' });
  }
  if (oldVersion < 2) {
    const cases = tx.objectStore('cases');
    // v1 values were bare cases; rewrite each one in place (same key path).
    let cursor = await cases.openCursor();
    while (cursor) {
      await cursor.update(wrapVersion1Value(cursor.value, String(cursor.key), now));
      cursor = await cursor.continue();
    }
    cases.createIndex('by-saved', 'savedAt');
    cases.createIndex('by-parent', 'parentId');
    db.createObjectStore('meta');
  }
  if (oldVersion < 3) {
    const trash = db.createObjectStore('trash', { keyPath: 'id' });
    trash.createIndex('by-deleted', 'deletedAt');
  }
  if (oldVersion < 4) {
    db.createObjectStore('journal', { keyPath: 'key' });
  }
}
