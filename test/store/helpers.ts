// Shared helpers for store tests: a fresh fake-indexeddb factory per test (fake-indexeddb keeps
// everything in memory), a valid case to store, and raw-API helpers to build old database versions.
import 'fake-indexeddb/auto';
import { IDBFactory } from 'fake-indexeddb';
import { newCase } from '../../src/case/defaults';
import type { Case } from '../../src/case/schema';

export function freshIndexedDb(): void {
  (globalThis as { indexedDB: IDBFactory }).indexedDB = new IDBFactory();
}

let n = 0;
export function sampleCase(name = `Test case ${++n}`): Case {
  return newCase({ name, now: new Date(Date.UTC(2025, 0, 1, 0, 0, n % 60)) });
}

function req<T>(r: IDBRequest<T>): Promise<T> {
  return new Promise((res, rej) => {
    r.onsuccess = () => res(r.result);
    r.onerror = () => rej(r.error);
  });
}

/** Open `name` at `version` with the raw API, running `upgrade` on the versionchange transaction. */
export function rawOpen(
  name: string,
  version: number,
  upgrade: (db: IDBDatabase, tx: IDBTransaction) => void,
): Promise<IDBDatabase> {
  return new Promise((res, rej) => {
    const r = indexedDB.open(name, version);
    r.onupgradeneeded = () => upgrade(r.result, r.transaction!);
    r.onsuccess = () => res(r.result);
    r.onerror = () => rej(r.error);
  });
}

export async function rawGetAll(db: IDBDatabase, store: string): Promise<unknown[]> {
  return req(db.transaction(store).objectStore(store).getAll());
}
