// The autosave engine with hand-driven timers: debounce, the synchronous journal and its replay
// after a "crash", storage full with retry, and two tabs on one case (BroadcastChannel of Node 20
// plus the store's compare-and-set).
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { freshIndexedDb, sampleCase } from './helpers';
import { CaseStore } from '../../src/store/cases';
import { Autosaver, type SaveState, type Timers } from '../../src/store/autosave';
import { Journal, recoverJournal, type KeyValueStorage } from '../../src/store/journal';
import { openCaseChannel } from '../../src/store/channel';
import type { Case } from '../../src/case/schema';

class ManualTimers implements Timers {
  pending = new Map<number, { fn: () => void; ms: number }>();
  private n = 0;
  set(fn: () => void, ms: number) {
    this.pending.set(++this.n, { fn, ms });
    return this.n;
  }
  clear(h: unknown) {
    this.pending.delete(h as number);
  }
  fire() {
    const all = [...this.pending.values()];
    this.pending.clear();
    for (const t of all) t.fn();
  }
}

class MemoryStorage implements KeyValueStorage {
  m = new Map<string, string>();
  get length() {
    return this.m.size;
  }
  key(i: number) {
    return [...this.m.keys()][i] ?? null;
  }
  getItem(k: string) {
    return this.m.get(k) ?? null;
  }
  setItem(k: string, v: string) {
    this.m.set(k, v);
  }
  removeItem(k: string) {
    this.m.delete(k);
  }
}

const edit = (c: Case, notes: string): Case => ({ ...c, notes, modified: new Date().toISOString() });
const settle = () => new Promise((r) => setTimeout(r, 20));

beforeEach(freshIndexedDb);
afterEach(() => vi.restoreAllMocks());

describe('Autosaver', () => {
  it('saves a new case, then debounces a burst of edits into one save', async () => {
    const store = await CaseStore.open();
    const timers = new ManualTimers();
    const states: SaveState['kind'][] = [];
    const a = new Autosaver(store, { timers, onState: (s) => states.push(s.kind) });
    const c = sampleCase('Burst');
    a.open(c, null);
    timers.fire();
    await a.flush();
    expect((await store.getRecord(c.id))?.revision).toBe(1);
    a.change(edit(c, 'a'));
    a.change(edit(c, 'ab'));
    a.change(edit(c, 'abc'));
    expect(timers.pending.size).toBe(1); // one debounce timer, restarted by each edit
    timers.fire();
    await a.flush();
    const rec = await store.getRecord(c.id);
    expect(rec?.revision).toBe(2);
    expect((rec?.data as Case).notes).toBe('abc');
    expect(a.state.kind).toBe('saved');
    expect(states).toContain('pending');
    expect(states).toContain('saving');
    a.dispose();
    store.close();
  });

  it('an edit identical to what is stored does not save again', async () => {
    const store = await CaseStore.open();
    const c = sampleCase();
    await store.save(c, null);
    const timers = new ManualTimers();
    const a = new Autosaver(store, { timers });
    a.open(c, 1);
    a.change(structuredClone(c));
    expect(timers.pending.size).toBe(0);
    a.dispose();
    store.close();
  });

  it('closing mid-edit: the journal keeps the edit synchronously and the next start saves it', async () => {
    const storage = new MemoryStorage();
    const store = await CaseStore.open();
    const c = sampleCase('Field visit');
    await store.save(c, null);
    const a = new Autosaver(store, { timers: new ManualTimers(), journal: new Journal(storage, store.writer) });
    a.open(c, 1);
    a.change(edit(c, 'water level 3.2 m'));
    // pagehide: the journal copy is written before anything asynchronous happens
    vi.spyOn(store, 'save').mockImplementation(() => new Promise(() => {})); // the save never commits
    a.emergency();
    expect(storage.length).toBe(1);
    await settle(); // the save job starts (and hangs, as in a tab being killed)
    a.dispose();
    store.close();
    vi.restoreAllMocks();

    const store2 = await CaseStore.open();
    const rec = await recoverJournal(store2, new Journal(storage));
    expect(rec).toEqual([{ id: c.id, outcome: 'saved', name: 'Field visit' }]);
    expect(((await store2.getRecord(c.id))?.data as Case).notes).toBe('water level 3.2 m');
    expect(storage.length).toBe(0);
    store2.close();
  });

  it('a hard kill right after an edit: the edit is already in the IndexedDB journal, and the next start saves it', async () => {
    const store = await CaseStore.open();
    const c = sampleCase('Killed');
    await store.save(c, null);
    const a = new Autosaver(store, { timers: new ManualTimers(), journal: new Journal(new MemoryStorage(), store.writer) });
    a.open(c, 1);
    a.change(edit(c, 'first'));
    a.change(edit(c, 'second')); // replaces the first copy before or after it is written
    await a.journalIdle; // no save ran (the quiet time never ended), no pagehide: a kill
    expect(a.state.kind).toBe('pending');
    a.dispose();
    store.close();

    const store2 = await CaseStore.open();
    const rec = await recoverJournal(store2, new Journal(new MemoryStorage(), store2.writer), async () => new Set());
    expect(rec).toEqual([{ id: c.id, outcome: 'saved', name: 'Killed' }]);
    expect(((await store2.getRecord(c.id))?.data as Case).notes).toBe('second');
    expect(await store2.journalRecords()).toEqual([]);
    store2.close();
  });

  it('the journal record is dropped once the edits are saved', async () => {
    const store = await CaseStore.open();
    const c = sampleCase('Saved normally');
    await store.save(c, null);
    const timers = new ManualTimers();
    const a = new Autosaver(store, { timers });
    a.open(c, 1);
    a.change(edit(c, 'typed'));
    await a.journalIdle;
    expect((await store.journalRecords()).length).toBe(1);
    timers.fire();
    await a.flush();
    await a.journalIdle;
    expect(a.state.kind).toBe('saved');
    expect(await store.journalRecords()).toEqual([]);
    a.dispose();
    store.close();
  });

  it('edits made while a save ran continue from that save: recovery saves them, no "(recovered edits)" copy (issue 14.4)', async () => {
    const store = await CaseStore.open();
    const c = sampleCase('Dragged');
    await store.save(c, null);
    // the tab journaled edit 2 on revision 1, then its save of edit 1 committed as revision 2, then it was killed
    await store.putJournal(edit(c, 'edit 2'), 1);
    await store.save(edit(c, 'edit 1'), 1);
    const rec = await recoverJournal(store, new Journal(null), async () => new Set());
    expect(rec.map((r) => r.outcome)).toEqual(['saved']);
    expect(((await store.getRecord(c.id))?.data as Case).notes).toBe('edit 2');
    expect((await store.list()).length).toBe(1);
    store.close();
  });

  it('a copy whose contents are already stored (only the edit time differs) makes no copy', async () => {
    const storage = new MemoryStorage();
    const store = await CaseStore.open();
    const c = sampleCase('Same');
    await store.save(c, null);
    await store.save(edit(c, 'theirs'), 1); // another tab saved revision 2
    new Journal(storage, 'another-tab').write({ ...edit(c, 'theirs'), modified: '2030-01-01T00:00:00.000Z' }, 1);
    const rec = await recoverJournal(store, new Journal(storage, store.writer), async () => new Set());
    expect(rec.map((r) => r.outcome)).toEqual(['already-saved']);
    expect((await store.list()).length).toBe(1);
    expect(storage.length).toBe(0);
    store.close();
  });

  it('the copies of a tab that is still running are left alone', async () => {
    const store = await CaseStore.open();
    const c = sampleCase('Open elsewhere');
    await store.save(c, null);
    await store.putJournal(edit(c, 'still typing'), 1);
    const rec = await recoverJournal(store, new Journal(null), async () => new Set([store.writer]));
    expect(rec).toEqual([]);
    expect((await store.journalRecords()).length).toBe(1);
    expect(((await store.getRecord(c.id))?.data as Case).notes).not.toBe('still typing');
    store.close();
  });

  it('recovery never overwrites a newer save from elsewhere: the edits become a copy', async () => {
    const storage = new MemoryStorage();
    const store = await CaseStore.open();
    const c = sampleCase('Contested');
    await store.save(c, null);
    new Journal(storage).write(edit(c, 'mine'), 1);
    await store.save(edit(c, 'theirs'), 1); // another tab saved revision 2 meanwhile
    const rec = await recoverJournal(store, new Journal(storage));
    expect(rec[0].outcome).toBe('saved-as-copy');
    expect(((await store.getRecord(c.id))?.data as Case).notes).toBe('theirs');
    expect(((await store.getRecord(rec[0].copyId!))?.data as Case).notes).toBe('mine');
    store.close();
  });

  it('an unreadable journal entry is reported and left in place', async () => {
    const storage = new MemoryStorage();
    storage.setItem('downgradient:unsaved:x', '{not json');
    const store = await CaseStore.open();
    expect(await recoverJournal(store, new Journal(storage))).toEqual([{ id: 'x', outcome: 'unreadable', name: 'x' }]);
    expect(storage.length).toBe(1);
    store.close();
  });

  it('storage full: keeps the case in memory and the journal, says so, retries and then saves', async () => {
    const storage = new MemoryStorage();
    const store = await CaseStore.open();
    const c = sampleCase('Big');
    await store.save(c, null);
    const timers = new ManualTimers();
    const a = new Autosaver(store, { timers, retryMs: 5000, journal: new Journal(storage) });
    a.open(c, 1);
    const proto = (globalThis as unknown as { IDBObjectStore: { prototype: { put: () => void } } }).IDBObjectStore.prototype;
    const spy = vi.spyOn(proto, 'put').mockImplementation(() => {
      throw new DOMException('quota', 'QuotaExceededError');
    });
    a.change(edit(c, 'large notes'));
    await a.flush();
    expect(a.state.kind).toBe('storage-full');
    if (a.state.kind === 'storage-full') expect(a.state.message).toMatch(/full/);
    expect(a.openCase?.notes).toBe('large notes');
    expect(storage.length).toBe(1);
    expect([...timers.pending.values()].map((t) => t.ms)).toEqual([5000]);
    spy.mockRestore();
    timers.fire();
    await a.flush();
    expect(a.state.kind).toBe('saved');
    expect(((await store.getRecord(c.id))?.data as Case).notes).toBe('large notes');
    expect(storage.length).toBe(0);
    a.dispose();
    store.close();
  });

  it('two tabs: a clean tab takes the other tab’s save; a tab with edits is offered the choice', async () => {
    const c = sampleCase('Two windows');
    const storeA = await CaseStore.open({ writer: 'A' });
    const storeB = await CaseStore.open({ writer: 'B' });
    await storeA.save(c, null);
    const chA = openCaseChannel('test-two-tabs');
    const chB = openCaseChannel('test-two-tabs');
    const shownB: Case[] = [];
    const tA = new ManualTimers();
    const tB = new ManualTimers();
    const a = new Autosaver(storeA, { timers: tA, channel: chA });
    const b = new Autosaver(storeB, { timers: tB, channel: chB, onRemoteUpdate: (x) => shownB.push(x) });
    a.open(c, 1);
    b.open(c, 1);

    a.change(edit(c, 'A1'));
    await a.flush();
    await settle();
    expect(shownB.map((x) => x.notes)).toEqual(['A1']);
    expect(b.openRevision).toBe(2);

    // now both edit; A saves first
    b.change(edit(shownB[0], 'B2'));
    a.change(edit(shownB[0], 'A2'));
    await a.flush();
    await settle();
    expect(b.state.kind).toBe('conflict');
    await b.flush(); // refuses to save while the conflict stands
    expect(((await storeA.getRecord(c.id))?.data as Case).notes).toBe('A2');

    const copy = await b.resolve('copy');
    expect(copy.id).not.toBe(c.id);
    expect(copy.notes).toBe('B2');
    expect(((await storeA.getRecord(c.id))?.data as Case).notes).toBe('A2');
    expect((await storeA.list()).length).toBe(2);

    a.dispose();
    b.dispose();
    chA.close();
    chB.close();
    storeA.close();
    storeB.close();
  });

  it('conflict found by compare-and-set alone (no channel): keep mine or take theirs', async () => {
    const c = sampleCase('No channel');
    const storeA = await CaseStore.open({ writer: 'A' });
    const storeB = await CaseStore.open({ writer: 'B' });
    await storeA.save(c, null);
    const b = new Autosaver(storeB, { timers: new ManualTimers() });
    b.open(c, 1);
    await storeA.save(edit(c, 'A'), 1);
    b.change(edit(c, 'B'));
    await b.flush();
    expect(b.state.kind).toBe('conflict');
    if (b.state.kind === 'conflict') expect(b.state.theirsCase?.notes).toBe('A');
    const kept = await b.resolve('mine');
    expect(kept.notes).toBe('B');
    const rec = await storeA.getRecord(c.id);
    expect(rec?.revision).toBe(3);
    expect((rec?.data as Case).notes).toBe('B');

    await storeA.save(edit(c, 'A again'), 3);
    b.change(edit(kept, 'B again'));
    await b.flush();
    const taken = await b.resolve('theirs');
    expect(taken.notes).toBe('A again');
    expect(b.isDirty()).toBe(false);
    b.dispose();
    storeA.close();
    storeB.close();
  });
});

describe('Autosaver, switching cases', () => {
  it('saves the previous case, then stores a new one put on screen', async () => {
    const store = await CaseStore.open();
    const a = new Autosaver(store, { timers: new ManualTimers() });
    const c1 = sampleCase('First');
    a.open(c1, null);
    a.change(edit(c1, 'edited first'));
    const c2 = sampleCase('Second');
    a.change(c2);
    await a.flush();
    await a.flush();
    expect(((await store.getRecord(c1.id))?.data as Case).notes).toBe('edited first');
    expect((await store.getRecord(c2.id))?.revision).toBe(1);
    a.dispose();
    store.close();
  });

  it('a different version of a stored case put on screen is not saved over it unasked', async () => {
    const store = await CaseStore.open();
    const c1 = sampleCase('Stored');
    await store.save(edit(c1, 'newer, stored'), null);
    const other = sampleCase('Other');
    const a = new Autosaver(store, { timers: new ManualTimers() });
    a.open(other, null);
    await a.flush();
    a.change(edit(c1, 'older file copy'));
    await a.flush();
    expect(a.state.kind).toBe('conflict');
    expect(((await store.getRecord(c1.id))?.data as Case).notes).toBe('newer, stored');
    a.dispose();
    store.close();
  });
});
