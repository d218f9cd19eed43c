/**
 * What the case library, file menu and conflict dialog do, over the store and the autosaver.
 * Every action that replaces the case on screen first saves the one that was there.
 */
import type { Case } from '../case/schema';
import { newCase } from '../case/defaults';
import { parseCaseFile, serializeCase, DEFAULT_MAX_BYTES } from '../case/io';
import { currentCase, replaceCase } from '../ui/state';
import type { ConflictChoice } from '../store/autosave';
import { StorageFullError, type CaseStore, type CaseSummary } from '../store/cases';
import { distinctName, sameContent } from '../case/identity';
import { caseProblem } from '../case/check';
import { storageInfo } from '../store/quota';
import { libraryChanged, notify, session, storage } from './session';

function need() {
  const { store, autosaver } = session;
  if (!store || !autosaver) throw new Error('Case storage is not available in this browser; use Export to keep your work.');
  return { store, autosaver };
}

function message(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

export async function refreshStorageInfo(): Promise<void> {
  storage.value = await storageInfo();
}

/** Put a case on screen that the autosaver already tracks at `revision`. */
function show(c: Case, revision: number | null): void {
  const { store, autosaver } = need();
  autosaver.open(c, revision);
  replaceCase(c);
  void store.setLastOpenId(c.id).catch(() => {});
}

export async function openStoredCase(id: string): Promise<boolean> {
  const { store, autosaver } = need();
  await autosaver.flush();
  const loaded = await store.load(id);
  if (!loaded) {
    notify({ tone: 'error', text: 'That case is no longer on this device (deleted in another tab?).', timeoutMs: 8000 });
    libraryChanged();
    return false;
  }
  if (!loaded.read.ok) {
    notify({ tone: 'error', text: `“${loaded.record.name}” cannot be opened: ${loaded.read.error}. It is kept on the device unchanged.` });
    return false;
  }
  show(loaded.read.case, loaded.record.revision);
  return true;
}

export async function startNewCase(): Promise<void> {
  const { autosaver } = need();
  await autosaver.flush();
  const c = newCase();
  show(c, null);
  libraryChanged();
}

export async function renameStored(id: string, name: string): Promise<string | null> {
  const { store, autosaver } = need();
  try {
    if (id === currentCase.peek().id) {
      // the open case: rename on screen, autosave stores it
      const trimmed = name.trim();
      if (trimmed.length < 1 || trimmed.length > 200) return 'Case name: 1 to 200 characters.';
      replaceCase({ ...currentCase.peek(), name: trimmed, modified: new Date().toISOString() });
      await autosaver.flush();
    } else {
      await store.rename(id, name);
    }
    libraryChanged();
    return null;
  } catch (e) {
    return message(e);
  }
}

export async function duplicateAsVariant(id: string): Promise<void> {
  const { store, autosaver } = need();
  await autosaver.flush();
  try {
    const v = await store.duplicateAsVariant(id);
    show(v.case, v.record.revision);
    libraryChanged();
    notify({ tone: 'info', text: `Opened “${v.case.name}”, a what-if copy. The original is unchanged.`, timeoutMs: 6000 });
  } catch (e) {
    notify({ tone: 'error', text: `Could not make a what-if copy: ${message(e)}` });
  }
}

/** Store and open a what-if variant built elsewhere (e.g. fitted to monitoring data); the parent is unchanged. */
export async function openVariant(v: Case): Promise<void> {
  const { store, autosaver } = session;
  if (!store || !autosaver) {
    replaceCase(v);
    return;
  }
  await autosaver.flush();
  try {
    const copy = await store.saveAsNew(v, v.name);
    show(copy.case, copy.record.revision);
    libraryChanged();
    notify({ tone: 'info', text: `Opened “${copy.case.name}”, a what-if variant. The original is unchanged.`, timeoutMs: 6000 });
  } catch (e) {
    notify({ tone: 'error', text: `Could not store the variant: ${message(e)}` });
  }
}

export async function deleteWithUndo(id: string): Promise<void> {
  const { store, autosaver } = need();
  const wasOpen = id === currentCase.peek().id;
  if (wasOpen) await autosaver.flush();
  try {
    const entry = await store.remove(id);
    libraryChanged();
    if (wasOpen) {
      const rest = await store.list();
      if (rest.length) await openStoredCase(rest[0].id);
      else await startNewCase();
    }
    notify({
      tone: 'info',
      text: `Deleted “${entry.record.name}”. It stays recoverable for 30 days.`,
      timeoutMs: 12000,
      action: {
        label: 'Undo',
        run: async () => {
          const back = await store.restore(id);
          libraryChanged();
          if (wasOpen) await openStoredCase(back.id);
        },
      },
    });
  } catch (e) {
    notify({ tone: 'error', text: `Could not delete: ${message(e)}` });
  }
}

export async function restoreDeleted(id: string): Promise<void> {
  const { store } = need();
  try {
    await store.restore(id);
    libraryChanged();
  } catch (e) {
    notify({ tone: 'error', text: `Could not restore: ${message(e)}` });
  }
}

/** "Depot", "Depot (2)" and "Depot (3)" share the base name "Depot" (distinctName's numbering). */
function sameBaseName(a: string, b: string): boolean {
  const base = (n: string) => n.trim().toLowerCase().replace(/ \(\d+\)$/, '');
  return base(a) === base(b);
}

/** The first of `candidates` whose stored inputs equal `c`'s (its name aside: copies are numbered). */
async function findSameContent(store: CaseStore, candidates: CaseSummary[], c: Case): Promise<{ case: Case; revision: number } | null> {
  for (const s of candidates) {
    const loaded = await store.load(s.id);
    if (loaded?.read.ok && sameContent({ ...loaded.read.case, name: c.name }, c)) return { case: loaded.read.case, revision: loaded.record.revision };
  }
  return null;
}

export type ImportOutcome =
  | { ok: true; name: string; note: string | null }
  /** `repairable`: a well-formed case the screening checks refuse; the user may still keep it to repair */
  | { ok: false; errors: string[]; repairable?: Case }
  /** a case with this id or name is stored with other content: the user chooses (`resolveImport`) */
  | { ok: 'choose'; incoming: Case; existing: { id: string; name: string; savedAt: number }; keepBothName: string };

/**
 * Import a case file. A file that is malformed, too large, of an unknown version or hostile is
 * rejected with what is wrong, and nothing stored changes. A case whose content is already stored
 * (same inputs, whatever the id) is opened, not stored again. One that shares its id or name with
 * a stored case of other content is not stored until the user chooses (`resolveImport`): replace
 * the stored case, or keep both, the new one under a distinct name.
 */
export async function importCaseText(text: string, fileName = 'the file'): Promise<ImportOutcome> {
  const parsed = parseCaseFile(text, { maxBytes: DEFAULT_MAX_BYTES });
  if (!parsed.ok) return { ok: false, errors: parsed.errors.map((e) => `${fileName}: ${e}`) };
  // the same complete checks as screening, before anything is stored
  const problem = caseProblem(parsed.case);
  if (problem) return { ok: false, errors: [`${fileName}: ${problem.message}`], repairable: parsed.case };
  return storeImported(parsed.case);
}

/**
 * Keep a case the screening checks refuse, to correct it in the app: stored (under a new id if
 * its id is taken), listed as needing repair, and opened.
 */
export async function importForRepair(c: Case): Promise<ImportOutcome> {
  return storeImported(c, `It is kept on the device to be repaired and marked “needs repair” in Cases; results stay paused until the value is corrected.`);
}

const withRepair = (note: string, repairNote: string | null) => (repairNote ? `${note} ${repairNote}` : note);

async function storeImported(c: Case, repairNote: string | null = null): Promise<ImportOutcome> {
  const { store, autosaver } = need();
  await autosaver.flush();
  try {
    const list = await store.list();
    const byId = list.find((s) => s.id === c.id);
    const byName = list.filter((s) => s.id !== c.id && sameBaseName(s.name, c.name));
    const stored = await findSameContent(store, [...(byId ? [byId] : []), ...byName], c);
    if (stored) {
      show(stored.case, stored.revision);
      return { ok: true, name: c.name, note: withRepair(`This case was already on the device as “${stored.case.name}”; it is now open (nothing was added).`, repairNote) };
    }
    const clash = byId ?? byName.find((s) => s.name.trim().toLowerCase() === c.name.trim().toLowerCase());
    if (clash) {
      return {
        ok: 'choose',
        incoming: c,
        existing: { id: clash.id, name: clash.name, savedAt: clash.savedAt },
        keepBothName: distinctName(c.name, list.map((s) => s.name)),
      };
    }
    const r = await store.save(c, null);
    if (r.status !== 'saved') throw new Error('the case appeared in storage meanwhile; import again');
    show(c, r.record.revision);
    libraryChanged();
    return { ok: true, name: c.name, note: repairNote };
  } catch (e) {
    if (e instanceof StorageFullError) return { ok: false, errors: [e.message] };
    return { ok: false, errors: [`${c.name}: could not be stored: ${message(e)}`] };
  }
}

/** The user's answer to an import that clashes with a stored case. */
export async function resolveImport(
  choice: 'replace' | 'keep-both',
  pending: Extract<ImportOutcome, { ok: 'choose' }>,
): Promise<{ ok: true; name: string } | { ok: false; error: string }> {
  const { store, autosaver } = need();
  await autosaver.flush();
  try {
    if (choice === 'replace') {
      const c: Case = { ...pending.incoming, id: pending.existing.id };
      const record = await store.forceSave(c);
      show(c, record.revision);
      libraryChanged();
      return { ok: true, name: c.name };
    }
    const copy = await store.saveAsNew(pending.incoming, pending.keepBothName);
    show(copy.case, copy.record.revision);
    libraryChanged();
    return { ok: true, name: copy.case.name };
  } catch (e) {
    return { ok: false, error: e instanceof StorageFullError ? e.message : `Could not store the case: ${message(e)}` };
  }
}

/**
 * Open a demo case. A stored copy with the demo's inputs unchanged is opened instead of storing
 * another; if only edited copies are stored, the fresh demo gets a distinct name beside them.
 */
export async function openDemoCase(build: () => Case): Promise<void> {
  const fresh = build();
  const { store, autosaver } = session;
  if (!store || !autosaver) return replaceCase(fresh); // no storage: the demo runs in memory
  await autosaver.flush();
  const list = await store.list();
  const stored = await findSameContent(store, list.filter((s) => sameBaseName(s.name, fresh.name)), fresh);
  if (stored) return show(stored.case, stored.revision);
  const name = distinctName(fresh.name, list.map((s) => s.name));
  if (name !== fresh.name) notify({ tone: 'info', text: `Opened a fresh copy of the demo as “${name}”; your edited “${fresh.name}” is kept.`, timeoutMs: 8000 });
  replaceCase({ ...fresh, name });
}

export function caseFileText(c: Case = currentCase.peek()): string {
  return serializeCase(c);
}

export async function resolveConflict(choice: ConflictChoice): Promise<void> {
  const { autosaver } = need();
  try {
    const c = await autosaver.resolve(choice);
    replaceCase(c);
    libraryChanged();
  } catch (e) {
    notify({ tone: 'error', text: message(e) });
  }
}
