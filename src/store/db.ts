/**
 * Opening the case database. A connection closes itself when another tab asks to upgrade
 * (`blocking`), so a newer app version in one tab is never stuck behind an older one; a tab whose
 * upgrade waits on others (`blocked`) and a connection the browser drops (`terminated`) are
 * reported through `events`, and the store reopens on its next use.
 */
import { openDB, type IDBPDatabase } from 'idb';
import { DB_NAME, DB_VERSION, upgradeDatabase, type CaseDB } from './schema';

export type ConnectionEvent =
  | { type: 'blocked' }
  | { type: 'closed-for-upgrade' }
  | { type: 'terminated' };

export interface OpenOptions {
  name?: string;
  events?: (e: ConnectionEvent) => void;
}

export async function openCaseDb(opts: OpenOptions = {}): Promise<IDBPDatabase<CaseDB>> {
  const events = opts.events ?? (() => {});
  const db = await openDB<CaseDB>(opts.name ?? DB_NAME, DB_VERSION, {
    upgrade(database, oldVersion, _newVersion, tx) {
      // idb does not wait for this promise; a failure aborts the versionchange transaction, which
      // rejects openDB below (and leaves the old data as it was).
      tx.done.catch(() => {}); // the abort surfaces as openDB's rejection
      upgradeDatabase(database, oldVersion, tx).catch(() => tx.abort());
    },
    blocked() {
      events({ type: 'blocked' });
    },
    blocking() {
      db.close();
      events({ type: 'closed-for-upgrade' });
    },
    terminated() {
      events({ type: 'terminated' });
    },
  });
  return db;
}
