/**
 * The header's "Cases" button and the sheet it opens: the cases on this device (search, open,
 * rename, what-if copy, compare, delete with undo, recently deleted), files out and in, and the
 * storage used. All text from cases is rendered as text nodes; no HTML is built from user text.
 */
import { useEffect, useRef, useState } from 'preact/hooks';
import { signal } from '@preact/signals';
import { createPortal } from 'preact/compat';
import type { CaseSummary } from '../../store/cases';
import type { TrashRecord } from '../../store/schema';
import { formatBytes } from '../../store/quota';
import { currentCase } from '../state';
import { libraryVersion, offlineReady, session, storage, storageUnavailable } from '../../app/session';
import {
  deleteWithUndo,
  duplicateAsVariant,
  openStoredCase,
  refreshStorageInfo,
  renameStored,
  restoreDeleted,
  startNewCase,
} from '../../app/actions';
import { lazyPart } from '../lazy';
import { useModalDialog } from './topLayer';
import './library.css';

// files in and out, and the comparison: loaded when first opened (src/ui/lazy.tsx)
const FilesView = lazyPart(() => import('./FilesView').then((m) => m.FilesView), 'files view');
const CompareView = lazyPart(() => import('./CompareView').then((m) => m.CompareView), 'comparison');

export type SheetView = 'library' | 'files' | 'compare';
/** which view the sheet shows; null: closed (other components may open it, e.g. "Export…") */
export const sheet = signal<SheetView | null>(null);
/** ids preselected for the compare view */
export const comparePair = signal<[string | null, string | null]>([null, null]);

export function CaseMenu() {
  return (
    <>
      <button type="button" class="dg-lib-open" aria-haspopup="dialog" aria-label="Cases and files" onClick={() => (sheet.value = 'library')}>
        Cases
      </button>
      {sheet.value && createPortal(<Sheet />, document.body)}
    </>
  );
}

function Sheet() {
  const ref = useRef<HTMLDialogElement>(null);
  useModalDialog(ref);
  useEffect(() => void refreshStorageInfo(), []);
  const view = sheet.value;
  const tab = (v: SheetView, label: string) => (
    <button
      type="button"
      role="tab"
      aria-selected={view === v}
      class={`dg-lib-tab${view === v ? ' is-active' : ''}`}
      onClick={() => (sheet.value = v)}
    >
      {label}
    </button>
  );
  return (
    <dialog
      ref={ref}
      class="dg-lib-sheet"
      aria-label="Cases and files"
      onCancel={(e) => {
        e.preventDefault();
        sheet.value = null;
      }}
    >
      <div class="dg-lib-head">
        <div role="tablist" class="dg-lib-tabs">
          {tab('library', 'On this device')}
          {tab('files', 'Files')}
          {tab('compare', 'Compare')}
        </div>
        <button type="button" class="dg-lib-btn" onClick={() => (sheet.value = null)}>
          Close
        </button>
      </div>
      {storageUnavailable.value && (
        <p class="dg-lib-msg is-error" role="alert">
          {storageUnavailable.value}
        </p>
      )}
      <div class="dg-lib-body">
        {view === 'library' && <LibraryView />}
        {view === 'files' && <FilesView />}
        {view === 'compare' && <CompareView />}
      </div>
    </dialog>
  );
}

function StorageLine() {
  const s = storage.value;
  const used = s.usage !== null && s.quota !== null ? `${formatBytes(s.usage)} used of ${formatBytes(s.quota)} available to this app` : 'Storage use unknown in this browser';
  const kept =
    s.persisted === true
      ? 'Storage is persistent: the browser will not clear these cases on its own.'
      : s.persisted === false
        ? 'The browser may clear these cases when the device runs short of space; export important cases to files.'
        : '';
  return (
    <p class="dg-lib-storage" data-testid="storage-line">
      {used}. {kept} {offlineReady.value ? 'The app itself is kept for use with no network.' : ''}
    </p>
  );
}

function savedLabel(ms: number): string {
  return new Date(ms).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}

function LibraryView() {
  const [query, setQuery] = useState('');
  const [items, setItems] = useState<CaseSummary[]>([]);
  const [trash, setTrash] = useState<TrashRecord[]>([]);
  const [renaming, setRenaming] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const version = libraryVersion.value;
  const openId = currentCase.value.id;

  useEffect(() => {
    const store = session.store;
    if (!store) return;
    let live = true;
    void Promise.all([store.search(query), store.listTrash()]).then(([list, t]) => {
      if (!live) return;
      setItems(list);
      setTrash(t);
    });
    return () => {
      live = false;
    };
  }, [query, version]);

  const names = new Map(items.map((i) => [i.id, i.name]));
  return (
    <section aria-label="Cases on this device">
      <div class="dg-lib-row">
        <input
          type="search"
          class="dg-lib-search"
          placeholder="Search cases by name"
          aria-label="Search cases by name"
          value={query}
          onInput={(e) => setQuery((e.target as HTMLInputElement).value)}
        />
        <button type="button" class="dg-lib-btn is-primary" onClick={() => void startNewCase().then(() => (sheet.value = null))}>
          New case
        </button>
      </div>
      <StorageLine />
      {error && (
        <p class="dg-lib-msg is-error" role="alert">
          {error}
        </p>
      )}
      {items.length === 0 && <p class="dg-lib-empty">{query ? 'No stored case matches that search.' : 'No cases stored yet.'}</p>}
      <ul class="dg-lib-list" data-testid="case-list">
        {items.map((it) => (
          <li key={it.id} class={`dg-lib-item${it.id === openId ? ' is-open' : ''}`} data-case-id={it.id}>
            {renaming === it.id ? (
              <RenameForm
                initial={it.name}
                onDone={async (name) => {
                  if (name === null) return setRenaming(null);
                  const err = await renameStored(it.id, name);
                  setError(err);
                  if (!err) setRenaming(null);
                }}
              />
            ) : (
              <button
                type="button"
                class="dg-lib-name"
                onClick={() => void openStoredCase(it.id).then((ok) => ok && (sheet.value = null))}
              >
                <span class="dg-lib-title">{it.name}</span>
                <span class="dg-lib-meta">
                  {it.id === openId ? 'open now · ' : ''}saved {savedLabel(it.savedAt)}
                  {it.parentId ? ` · what-if of ${names.get(it.parentId) ?? 'a deleted case'}` : ''}
                </span>
                {it.problem && (
                  <span class="dg-lib-repair" data-testid="needs-repair">
                    Needs repair: {it.problem}
                  </span>
                )}
              </button>
            )}
            <div class="dg-lib-actions">
              <button type="button" class="dg-lib-btn" onClick={() => setRenaming(it.id)}>
                Rename
              </button>
              <button type="button" class="dg-lib-btn" onClick={() => void duplicateAsVariant(it.id).then(() => (sheet.value = null))}>
                What-if copy
              </button>
              <button
                type="button"
                class="dg-lib-btn"
                onClick={() => {
                  comparePair.value = [it.parentId ?? openId, it.id];
                  sheet.value = 'compare';
                }}
              >
                Compare
              </button>
              <button type="button" class="dg-lib-btn is-danger" onClick={() => void deleteWithUndo(it.id)}>
                Delete
              </button>
            </div>
          </li>
        ))}
      </ul>
      {trash.length > 0 && (
        <details class="dg-lib-trash">
          <summary>Recently deleted ({trash.length}) — kept 30 days</summary>
          <ul class="dg-lib-list">
            {trash.map((t) => (
              <li key={t.id} class="dg-lib-item">
                <span class="dg-lib-name is-static">
                  <span class="dg-lib-title">{t.record.name}</span>
                  <span class="dg-lib-meta">deleted {savedLabel(t.deletedAt)}</span>
                </span>
                <div class="dg-lib-actions">
                  <button type="button" class="dg-lib-btn" onClick={() => void restoreDeleted(t.id)}>
                    Restore
                  </button>
                </div>
              </li>
            ))}
          </ul>
        </details>
      )}
    </section>
  );
}

function RenameForm({ initial, onDone }: { initial: string; onDone: (name: string | null) => void }) {
  const [value, setValue] = useState(initial);
  const ref = useRef<HTMLInputElement>(null);
  useEffect(() => ref.current?.select(), []);
  return (
    <form
      class="dg-lib-rename"
      onSubmit={(e) => {
        e.preventDefault();
        onDone(value);
      }}
    >
      <input
        ref={ref}
        class="dg-lib-search"
        aria-label="New case name (1 to 200 characters)"
        maxLength={200}
        value={value}
        onInput={(e) => setValue((e.target as HTMLInputElement).value)}
      />
      <button type="submit" class="dg-lib-btn is-primary">
        Save name
      </button>
      <button type="button" class="dg-lib-btn" onClick={() => onDone(null)}>
        Cancel
      </button>
    </form>
  );
}
