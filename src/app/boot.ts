/**
 * Start-up: opens the case store, replays edits a closed tab left unsaved, opens the last case (or
 * the newest, or a new one), starts autosave, asks for persistent storage, registers the service
 * worker, and hands the header its case menu and status area.
 *
 * If IndexedDB cannot be opened at all, the app still runs on a new case in memory and says so
 * (export keeps the work); nothing is written anywhere else.
 */
import type { ComponentType } from 'preact';
import { effect } from '@preact/signals';
import type { Case } from '../case/schema';
import { newCase } from '../case/defaults';
import { CaseStore } from '../store/cases';
import { Autosaver } from '../store/autosave';
import { Journal, holdTabLock, recoverJournal, type Recovery } from '../store/journal';
import { openCaseChannel } from '../store/channel';
import { requestPersistence } from '../store/quota';
import { currentCase, replaceCase } from '../ui/state';
import { libraryChanged, notify, online, saveState, session, storageUnavailable } from './session';
import { openStoredCase, refreshStorageInfo } from './actions';
import { readCaseData } from '../store/caseData';
import { caseProblem, placementProblem } from '../case/check';
import { registerServiceWorker } from './serviceWorker';
import { CaseMenu, sheet } from '../ui/library/CaseMenu';
import { StatusArea } from '../ui/library/StatusArea';

declare const __DG_SERVICE_WORKER__: boolean | undefined;
const SERVICE_WORKER_BUILD = typeof __DG_SERVICE_WORKER__ !== 'undefined' && __DG_SERVICE_WORKER__;

export interface AppSlots {
  /** case library / files menu shown in the header, provided by the storage layer */
  caseMenu?: ComponentType;
  /** status area (offline indicator, update prompt), provided by the offline layer */
  status?: ComponentType;
}

export interface BootResult {
  initialCase: Case;
  slots: AppSlots;
}

function localStorageOrNull(): Storage | null {
  try {
    return globalThis.localStorage ?? null;
  } catch {
    return null;
  }
}

function reportRecoveries(rs: Recovery[]): void {
  for (const r of rs) {
    if (r.outcome === 'saved') notify({ tone: 'info', text: `Kept the last changes to “${r.name}”, made just before the app closed.`, timeoutMs: 8000 });
    if (r.outcome === 'saved-as-copy')
      notify({ tone: 'warn', text: `Unsaved edits from the last session were overtaken by a later save; they are kept as “${r.name}”.` });
    if (r.outcome === 'unreadable') notify({ tone: 'warn', text: 'A damaged copy of unsaved edits was found and left untouched.' });
  }
}

/** The complete checks of a stored record, as the case list shows them ("needs repair"). */
export function storedCaseProblem(data: unknown): string | null {
  const read = readCaseData(data);
  if (!read.ok) return read.error;
  const p = caseProblem(read.case);
  return p ? p.message : null;
}

/**
 * The case the app starts on: the last one open, unless it cannot be read or no map can be framed
 * on it (a datum or position that cannot be placed); then the newest that can, or a new case. A
 * case passed over is named with what is wrong, kept unchanged and marked in the case list.
 */
async function openInitial(store: CaseStore): Promise<{ c: Case; revision: number | null }> {
  const ids = [...new Set([await store.lastOpenId(), ...(await store.list()).map((s) => s.id)].filter((x): x is string => !!x))];
  let passedOver = 0;
  for (const id of ids) {
    const loaded = await store.load(id);
    if (!loaded) continue;
    const why = loaded.read.ok ? placementProblem(loaded.read.case)?.message ?? null : loaded.read.error;
    if (loaded.read.ok && why === null) return { c: loaded.read.case, revision: loaded.record.revision };
    // the first case passed over is named (it was the one to open); the others are marked in the list
    if (passedOver++ > 0) continue;
    const openable = loaded.read.ok;
    notify({
      tone: 'warn',
      text:
        `“${loaded.record.name}” was not opened at start: ${why}. It is kept on the device unchanged and marked “needs repair” in Cases` +
        (openable ? '; open it to correct the value, or export it as a file.' : '; export it as a file to repair it.'),
      action: openable ? { label: 'Open to repair', run: async () => void (await openStoredCase(id)) } : { label: 'Show in Cases', run: () => void (sheet.value = 'library') },
    });
  }
  return { c: newCase(), revision: null };
}

export async function boot(): Promise<BootResult> {
  const slots: AppSlots = { caseMenu: CaseMenu, status: StatusArea };
  window.addEventListener('online', () => (online.value = true));
  window.addEventListener('offline', () => (online.value = false));

  let store: CaseStore;
  try {
    store = await CaseStore.open({
      check: storedCaseProblem,
      events: (e) => {
        if (e.type === 'blocked') notify({ tone: 'warn', text: 'Close other Downgradient tabs still running an older version so storage can upgrade.' });
      },
    });
  } catch (e) {
    storageUnavailable.value =
      `Cases cannot be stored in this browser (${e instanceof Error ? e.message : String(e)}). ` +
      'You can still screen; use Export to keep your work as a file.';
    saveState.value = { kind: 'error', message: storageUnavailable.value };
    const c = newCase();
    replaceCase(c);
    return { initialCase: c, slots };
  }

  // this tab's edits are journaled under its writer; its lock tells other tabs it is still running
  holdTabLock(store.writer);
  const journal = new Journal(localStorageOrNull(), store.writer);
  try {
    reportRecoveries(await recoverJournal(store, journal));
  } catch {
    notify({ tone: 'warn', text: 'Unsaved edits from the last session could not be replayed yet; they are kept and retried next start.' });
  }
  const { c, revision } = await openInitial(store);

  const autosaver = new Autosaver(store, {
    journal,
    channel: openCaseChannel(),
    onState: (s) => {
      saveState.value = s;
      if (s.kind === 'saved') libraryChanged();
    },
    onRemoteUpdate: (theirs) => {
      replaceCase(theirs);
      notify({ tone: 'info', text: 'This case was changed in another tab or window; showing the latest version.', timeoutMs: 6000 });
    },
  });
  session.store = store;
  session.autosaver = autosaver;

  autosaver.open(c, revision);
  replaceCase(c);
  let lastId = c.id;
  void store.setLastOpenId(c.id).catch(() => {});
  effect(() => {
    const cur = currentCase.value;
    autosaver.change(cur);
    if (cur.id !== lastId) {
      lastId = cur.id;
      void store.setLastOpenId(cur.id).catch(() => {});
    }
  });

  // Flush when the page may be going away: closed tab, app switch, screen off, dead battery.
  window.addEventListener('pagehide', () => autosaver.emergency());
  document.addEventListener('visibilitychange', () => {
    if (document.visibilityState === 'hidden') autosaver.emergency();
  });

  void requestPersistence().then(refreshStorageInfo);
  if (SERVICE_WORKER_BUILD) registerServiceWorker();
  return { initialCase: c, slots };
}
