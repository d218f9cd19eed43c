// The case store over fake-indexeddb: compare-and-set between two tabs, rename, what-if variants,
// delete with undo, the trash's 30-day keep, search, and the storage-full path.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { freshIndexedDb, sampleCase } from './helpers';
import { CaseStore, StorageFullError, TRASH_KEEP_MS, matchesQuery } from '../../src/store/cases';

beforeEach(freshIndexedDb);
afterEach(() => vi.restoreAllMocks());

describe('CaseStore', () => {
  it('saves a new case at revision 1 and refuses a second "new" save of the same id', async () => {
    const s = await CaseStore.open();
    const c = sampleCase();
    const r1 = await s.save(c, null);
    expect(r1.status).toBe('saved');
    if (r1.status === 'saved') expect(r1.record.revision).toBe(1);
    const r2 = await s.save(c, null);
    expect(r2.status).toBe('conflict');
    s.close();
  });

  it('two tabs: the second save based on a stale revision is refused and shown their record', async () => {
    const tabA = await CaseStore.open({ writer: 'A' });
    const tabB = await CaseStore.open({ writer: 'B' });
    const c = sampleCase('Shared');
    await tabA.save(c, null); // revision 1
    const a2 = await tabA.save({ ...c, notes: 'from A' }, 1); // revision 2
    expect(a2.status).toBe('saved');
    const b = await tabB.save({ ...c, notes: 'from B' }, 1); // B still thinks revision 1
    expect(b.status).toBe('conflict');
    if (b.status === 'conflict') {
      expect(b.theirs?.revision).toBe(2);
      expect(b.theirs?.writer).toBe('A');
      expect((b.theirs?.data as { notes: string }).notes).toBe('from A');
    }
    // nothing of B's was written
    expect(((await tabA.getRecord(c.id))?.data as { notes: string }).notes).toBe('from A');
    // "keep mine" overwrites deliberately; "save mine as a copy" keeps both
    const forced = await tabB.forceSave({ ...c, notes: 'from B' });
    expect(forced.revision).toBe(3);
    const copy = await tabB.saveAsNew({ ...c, notes: 'B copy' }, 'Shared (copy)');
    expect(copy.case.id).not.toBe(c.id);
    expect((await tabA.list()).length).toBe(2);
    tabA.close();
    tabB.close();
  });

  it('lists newest first and searches every word, ignoring case and accents', async () => {
    let t = 1000;
    const s = await CaseStore.open({ now: () => (t += 1000) });
    await s.save(sampleCase('Fuel depot — Étang road'), null);
    await s.save(sampleCase('Dry cleaner, Main St'), null);
    await s.save(sampleCase('Fuel station north'), null);
    expect((await s.list()).map((c) => c.name)).toEqual(['Fuel station north', 'Dry cleaner, Main St', 'Fuel depot — Étang road']);
    expect((await s.search('fuel etang')).map((c) => c.name)).toEqual(['Fuel depot — Étang road']);
    expect((await s.search('  ')).length).toBe(3);
    expect(matchesQuery('Main St', 'st main')).toBe(true);
    s.close();
  });

  it('renames in the list and inside the stored case, and rejects an empty name', async () => {
    const s = await CaseStore.open();
    const c = sampleCase('Old');
    await s.save(c, null);
    const r = await s.rename(c.id, '  New name ');
    expect(r.name).toBe('New name');
    expect(r.revision).toBe(2);
    const loaded = await s.load(c.id);
    expect(loaded?.read.ok && loaded.read.case.name).toBe('New name');
    await expect(s.rename(c.id, '   ')).rejects.toThrow(/1 to 200 characters/);
    s.close();
  });

  it('duplicates as a what-if variant linked to its parent', async () => {
    const s = await CaseStore.open();
    const parent = sampleCase('Base');
    await s.save(parent, null);
    const v = await s.duplicateAsVariant(parent.id);
    expect(v.case.parentId).toBe(parent.id);
    expect(v.case.id).not.toBe(parent.id);
    expect(v.case.name).toBe('Base — what-if');
    expect(v.case.aquifer).toEqual(parent.aquifer);
    expect((await s.list()).length).toBe(2);
    s.close();
  });

  it('delete moves to the trash; undo brings it back unchanged; last-open is cleared', async () => {
    const s = await CaseStore.open();
    const c = sampleCase('Keep me');
    await s.save(c, null);
    await s.setLastOpenId(c.id);
    const before = await s.getRecord(c.id);
    await s.remove(c.id);
    expect(await s.list()).toEqual([]);
    expect(await s.lastOpenId()).toBeUndefined();
    expect((await s.listTrash()).map((t) => t.id)).toEqual([c.id]);
    const back = await s.restore(c.id);
    expect(back).toEqual(before);
    expect(await s.listTrash()).toEqual([]);
    s.close();
  });

  it('restoring over a case stored meanwhile under the same id keeps both', async () => {
    const s = await CaseStore.open();
    const c = sampleCase('Twin');
    await s.save(c, null);
    await s.remove(c.id);
    await s.save(c, null); // e.g. re-imported from a file
    const back = await s.restore(c.id);
    expect(back.id).not.toBe(c.id);
    expect((back.data as { id: string }).id).toBe(back.id);
    expect((await s.list()).length).toBe(2);
    s.close();
  });

  it('purges trash older than 30 days when it opens, and keeps younger entries', async () => {
    let now = Date.UTC(2025, 0, 1);
    const s = await CaseStore.open({ now: () => now });
    const old = sampleCase('Old');
    const young = sampleCase('Young');
    await s.save(old, null);
    await s.save(young, null);
    await s.remove(old.id);
    now += TRASH_KEEP_MS - 1000;
    await s.remove(young.id);
    now += 2000; // old is now 30 days + 1 s in the trash
    s.close();
    const s2 = await CaseStore.open({ now: () => now });
    expect((await s2.listTrash()).map((t) => t.id)).toEqual([young.id]);
    s2.close();
  });

  it('a QuotaExceededError becomes StorageFullError and leaves the stored case as it was', async () => {
    const s = await CaseStore.open();
    const c = sampleCase('Full');
    await s.save(c, null);
    const proto = (globalThis as unknown as { IDBObjectStore: { prototype: { put: unknown } } }).IDBObjectStore.prototype;
    vi.spyOn(proto as { put: () => void }, 'put').mockImplementation(() => {
      throw new DOMException('quota', 'QuotaExceededError');
    });
    const err = await s.save({ ...c, notes: 'lost?' }, 1).catch((e) => e);
    expect(err).toBeInstanceOf(StorageFullError);
    expect(String(err.message)).toMatch(/storage for this app is full/);
    vi.restoreAllMocks();
    const rec = await s.getRecord(c.id);
    expect(rec?.revision).toBe(1);
    expect((rec?.data as { notes: string }).notes).toBe('');
    s.close();
  });
});
