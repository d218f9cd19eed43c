/**
 * The autosave engine. Every change to the open case is saved after a short quiet time (debounce);
 * meanwhile each edit is copied at once to this tab's journal record in IndexedDB (so a hard kill
 * loses at most the edit in flight; src/store/journal.ts), and `emergency()` (called on `pagehide`
 * and when the page is hidden) copies unsaved edits to the synchronous localStorage journal and
 * starts the save. Saves run one at a time, each compare-and-set
 * on the revision the edits started from.
 *
 * - Storage full: the case stays in memory (and in the journal if that has room), the state says
 *   so in plain words, and the save is retried every `retryMs` until it succeeds.
 * - Another tab saved the same case: with nothing unsaved here, this tab takes their version
 *   (`onRemoteUpdate`); with unsaved edits here, saving stops and the state offers the choice
 *   (`resolve('mine' | 'theirs' | 'copy')`). Nothing is overwritten without the user choosing.
 */
import type { Case } from '../case/schema';
import { StorageFullError, type CaseStore } from './cases';
import type { CaseRecord } from './schema';
import { readCaseData } from './caseData';
import type { Journal } from './journal';
import type { CaseChannel, CaseMessage } from './channel';

export type SaveState =
  | { kind: 'saved'; at: number; revision: number }
  | { kind: 'pending' }
  | { kind: 'saving' }
  | { kind: 'storage-full'; message: string }
  | { kind: 'conflict'; theirs: CaseRecord | null; theirsCase: Case | null }
  | { kind: 'error'; message: string };

export type ConflictChoice = 'mine' | 'theirs' | 'copy';

export interface Timers {
  set(fn: () => void, ms: number): unknown;
  clear(handle: unknown): void;
}

export interface AutosaveOptions {
  delayMs?: number;
  retryMs?: number;
  journal?: Journal;
  channel?: CaseChannel;
  onState?: (s: SaveState) => void;
  /** another tab saved the open case and nothing was unsaved here: show their version */
  onRemoteUpdate?: (c: Case) => void;
  timers?: Timers;
  now?: () => number;
}

const defaultTimers: Timers = {
  set: (fn, ms) => setTimeout(fn, ms),
  clear: (h) => clearTimeout(h as ReturnType<typeof setTimeout>),
};

export class Autosaver {
  private current: Case | null = null;
  private revision: number | null = null;
  private savedJson: string | null = null;
  private timer: unknown = null;
  private queue: Promise<void> = Promise.resolve();
  private _state: SaveState = { kind: 'saved', at: 0, revision: 0 };
  private readonly delayMs: number;
  private readonly retryMs: number;
  private readonly timers: Timers;
  private readonly now: () => number;
  private readonly unsubscribe: () => void;
  /** the journal record this tab should hold next: a copy of unsaved edits, or none */
  private journalWanted: { kind: 'put'; c: Case; base: number | null } | { kind: 'clear'; id: string } | null = null;
  private journalBusy = false;
  /** resolves when the journal record is up to date (tests, and the fault runs, wait on it) */
  journalIdle: Promise<void> = Promise.resolve();

  constructor(
    private readonly store: CaseStore,
    private readonly opts: AutosaveOptions = {},
  ) {
    this.delayMs = opts.delayMs ?? 600;
    this.retryMs = opts.retryMs ?? 15_000;
    this.timers = opts.timers ?? defaultTimers;
    this.now = opts.now ?? Date.now;
    this.unsubscribe = opts.channel?.subscribe((m) => this.enqueue(() => this.onMessage(m))) ?? (() => {});
  }

  get state(): SaveState {
    return this._state;
  }

  get openCase(): Case | null {
    return this.current;
  }

  get openRevision(): number | null {
    return this.revision;
  }

  isDirty(): boolean {
    return this.current !== null && JSON.stringify(this.current) !== this.savedJson;
  }

  /**
   * Bring this tab's journal record in line with the edits: writes run one at a time, and a
   * newer wish replaces one not yet started, so a drag does not queue up writes.
   */
  private journalRecord(want: NonNullable<Autosaver['journalWanted']>): void {
    this.journalWanted = want;
    if (this.journalBusy) return;
    this.journalBusy = true;
    this.journalIdle = (async () => {
      while (this.journalWanted) {
        const w = this.journalWanted;
        this.journalWanted = null;
        try {
          if (w.kind === 'put') await this.store.putJournal(w.c, w.base, this.now());
          else await this.store.clearJournal(w.id);
        } catch {
          /* the localStorage copy and the autosave remain; a failed copy is not an error to show */
        }
      }
      this.journalBusy = false;
    })();
  }

  private setState(s: SaveState): void {
    this._state = s;
    this.opts.onState?.(s);
  }

  /** Jobs run one at a time in order; a failed job does not stop the ones after it. */
  private enqueue(job: () => Promise<void>): Promise<void> {
    const p = this.queue.then(job);
    this.queue = p.then(
      () => {},
      () => {},
    );
    return p;
  }

  /** Start tracking a case with its stored revision (null: not stored yet, so it is saved). */
  open(c: Case, revision: number | null): void {
    this.cancelTimer();
    this.current = c;
    this.revision = revision;
    this.savedJson = revision === null ? null : JSON.stringify(c);
    if (revision === null) this.schedule();
    else this.setState({ kind: 'saved', at: this.now(), revision });
  }

  /**
   * The case on screen changed. A different id means another case was put on screen: the previous
   * one is saved first, then the new one is looked up in the store.
   */
  change(c: Case): void {
    if (this.current && c.id !== this.current.id) {
      void this.flush();
      void this.enqueue(async () => {
        const rec = await this.store.getRecord(c.id);
        if (rec && JSON.stringify(rec.data) !== JSON.stringify(c)) {
          // A different version of a stored case was put on screen (e.g. an older file copy):
          // never overwrite the stored one unasked.
          this.cancelTimer();
          this.current = c;
          this.revision = rec.revision;
          this.savedJson = null;
          const read = readCaseData(rec.data);
          this.setState({ kind: 'conflict', theirs: rec, theirsCase: read.ok ? read.case : null });
          return;
        }
        this.open(c, rec?.revision ?? null);
      }).catch((e) => this.setState({ kind: 'error', message: `Could not open the case in storage (${String(e)}).` }));
      return;
    }
    if (!this.current) {
      this.current = c;
      this.journalRecord({ kind: 'put', c, base: null });
      this.schedule();
      return;
    }
    this.current = c;
    if (!this.isDirty()) return;
    this.journalRecord({ kind: 'put', c, base: this.revision });
    if (this._state.kind === 'conflict') return; // waiting for the user's choice
    this.schedule();
  }

  private cancelTimer(): void {
    if (this.timer !== null) this.timers.clear(this.timer);
    this.timer = null;
  }

  private schedule(ms = this.delayMs): void {
    this.cancelTimer();
    if (this._state.kind !== 'storage-full' && this._state.kind !== 'error') this.setState({ kind: 'pending' });
    this.timer = this.timers.set(() => {
      this.timer = null;
      void this.flush();
    }, ms);
  }

  /** Save now (if anything is unsaved). Resolves when this save attempt has finished. */
  flush(): Promise<void> {
    this.cancelTimer();
    return this.enqueue(() => this.saveNow());
  }

  /** The page is going away or out of sight: copy unsaved edits synchronously, then save. */
  emergency(): void {
    if (this.current && this.isDirty()) this.opts.journal?.write(this.current, this.revision, this.now());
    void this.flush();
  }

  private async saveNow(): Promise<void> {
    const snapshot = this.current;
    if (!snapshot || !this.isDirty() || this._state.kind === 'conflict') return;
    const json = JSON.stringify(snapshot);
    this.setState({ kind: 'saving' });
    try {
      const r = await this.store.save(snapshot, this.revision);
      if (r.status === 'conflict') {
        const theirsRead = r.theirs ? readCaseData(r.theirs.data) : null;
        this.setState({ kind: 'conflict', theirs: r.theirs, theirsCase: theirsRead?.ok ? theirsRead.case : null });
        return;
      }
      this.markSaved(r.record, json);
      this.opts.channel?.post({ type: 'saved', id: snapshot.id, revision: r.record.revision, writer: this.store.writer });
    } catch (e) {
      if (this.current) this.opts.journal?.write(this.current, this.revision, this.now());
      const message =
        e instanceof StorageFullError
          ? e.message
          : `Saving failed (${e instanceof Error ? e.message : String(e)}). The case is kept on screen; saving is retried.`;
      this.setState(e instanceof StorageFullError ? { kind: 'storage-full', message } : { kind: 'error', message });
      this.schedule(this.retryMs);
    }
  }

  private markSaved(record: CaseRecord, json: string): void {
    this.revision = record.revision;
    this.savedJson = json;
    if (!this.isDirty()) {
      this.opts.journal?.clear(record.id);
      this.journalRecord({ kind: 'clear', id: record.id });
      this.setState({ kind: 'saved', at: this.now(), revision: record.revision });
    } else {
      // the edits made during the save now continue from the revision just written
      if (this.current) this.journalRecord({ kind: 'put', c: this.current, base: record.revision });
      this.schedule();
    }
  }

  private async onMessage(m: CaseMessage): Promise<void> {
    const cur = this.current;
    if (!cur || m.id !== cur.id || m.writer === this.store.writer) return;
    if (m.type === 'saved' && this.revision !== null && m.revision <= this.revision) return;
    const theirs = (await this.store.getRecord(cur.id)) ?? null;
    const theirsRead = theirs ? readCaseData(theirs.data) : null;
    const theirsCase = theirsRead?.ok ? theirsRead.case : null;
    if (!this.isDirty() && theirs && theirsCase) {
      this.journalRecord({ kind: 'clear', id: cur.id });
      this.current = theirsCase;
      this.revision = theirs.revision;
      this.savedJson = JSON.stringify(theirsCase);
      this.setState({ kind: 'saved', at: this.now(), revision: theirs.revision });
      this.opts.onRemoteUpdate?.(theirsCase);
      return;
    }
    this.cancelTimer();
    this.setState({ kind: 'conflict', theirs, theirsCase });
  }

  /**
   * Settle a conflict. Returns the case to show: mine (kept and saved over theirs), theirs, or
   * mine saved as a new copy (theirs stays stored under the original id).
   */
  resolve(choice: ConflictChoice): Promise<Case> {
    let result!: Case;
    return this.enqueue(async () => {
      const st = this._state;
      const mine = this.current;
      if (!mine) throw new Error('no open case');
      if (choice === 'theirs') {
        if (st.kind !== 'conflict' || !st.theirs || !st.theirsCase) {
          throw new Error('Their version is not available (deleted or unreadable); keep yours or save it as a copy.');
        }
        this.current = st.theirsCase;
        this.revision = st.theirs.revision;
        this.savedJson = JSON.stringify(st.theirsCase);
        this.opts.journal?.clear(mine.id);
        this.journalRecord({ kind: 'clear', id: mine.id });
        this.setState({ kind: 'saved', at: this.now(), revision: st.theirs.revision });
        result = st.theirsCase;
        return;
      }
      if (choice === 'mine') {
        const json = JSON.stringify(mine);
        const rec = await this.store.forceSave(mine);
        this.markSaved(rec, json);
        this.opts.channel?.post({ type: 'saved', id: mine.id, revision: rec.revision, writer: this.store.writer });
        result = mine;
        return;
      }
      const copy = await this.store.saveAsNew(mine, `${mine.name} (my copy)`);
      this.opts.journal?.clear(mine.id);
      this.journalRecord({ kind: 'clear', id: mine.id });
      this.current = copy.case;
      this.revision = copy.record.revision;
      this.savedJson = JSON.stringify(copy.case);
      this.setState({ kind: 'saved', at: this.now(), revision: copy.record.revision });
      result = copy.case;
    }).then(() => result);
  }

  dispose(): void {
    this.cancelTimer();
    this.unsubscribe();
  }
}
