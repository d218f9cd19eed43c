/**
 * The header's status area: network state and offline readiness, whether the case is saved,
 * the update prompt, the two-tab conflict choice, and short notices (with Undo after a delete).
 * Everything is visible text or a button; nothing depends on hover.
 */
import { useLayoutEffect, useRef, useState } from 'preact/hooks';
import { createPortal } from 'preact/compat';
import { dismiss, notices, offlineReady, online, saveState, updateWaiting } from '../../app/session';
import { resolveConflict } from '../../app/actions';
import { currentCase } from '../state';
import { reportOpen } from './reportOpen';
import { lazyPart } from '../lazy';
import { topLayerHost, useModalDialog } from './topLayer';
import './library.css';

function SaveChip() {
  const s = saveState.value;
  const text =
    s.kind === 'saved'
      ? 'Saved'
      : s.kind === 'pending' || s.kind === 'saving'
        ? 'Saving…'
        : s.kind === 'storage-full'
          ? 'Storage full'
          : s.kind === 'conflict'
            ? 'Changed elsewhere'
            : 'Not saved yet';
  const title = s.kind === 'saved' ? 'Every change is saved on this device' : undefined;
  const tone = s.kind === 'saved' ? 'ok' : s.kind === 'pending' || s.kind === 'saving' ? 'busy' : 'bad';
  return (
    <span class={`dg-chip is-${tone}`} role="status" aria-label={title} data-testid="save-state" data-state={s.kind}>
      {text}
    </span>
  );
}

function NetChip() {
  if (online.value) return null;
  return (
    <span class="dg-chip is-warn" role="status" data-testid="net-state" data-state="offline" aria-label={offlineReady.value ? 'Offline: the app, its computations and saving keep working on this device' : 'Offline'}>
      Offline
    </span>
  );
}

function ConflictDialog() {
  const s = saveState.value;
  const ref = useRef<HTMLDialogElement>(null);
  useModalDialog(ref);
  if (s.kind !== 'conflict') return null;
  const theirsName = s.theirsCase?.name ?? s.theirs?.name ?? null;
  const when = s.theirs ? new Date(s.theirs.savedAt).toLocaleString() : null;
  return (
    <dialog ref={ref} class="dg-lib-dialog" aria-labelledby="dg-conflict-title" data-testid="conflict-dialog" onCancel={(e) => e.preventDefault()}>
      <h2 id="dg-conflict-title">This case was changed somewhere else</h2>
      <p>
        {s.theirs
          ? `Another tab or window saved “${theirsName}” at ${when}, while this one has changes of its own. Nothing has been overwritten. Choose what to keep:`
          : 'The stored copy of this case was deleted or replaced in another tab or window, while this one has changes of its own. Nothing has been overwritten. Choose what to keep:'}
      </p>
      <div class="dg-lib-grid">
        <button type="button" class="dg-lib-btn is-primary" onClick={() => void resolveConflict('copy')}>
          Save mine as a copy
          <small>both versions are kept</small>
        </button>
        <button type="button" class="dg-lib-btn" onClick={() => void resolveConflict('mine')}>
          Keep mine
          <small>replaces the other version</small>
        </button>
        <button type="button" class="dg-lib-btn" disabled={!s.theirsCase} onClick={() => void resolveConflict('theirs')}>
          Take theirs
          <small>{s.theirsCase ? 'drops the changes made here' : 'not available'}</small>
        </button>
      </div>
      <p class="dg-lib-note">Open now: “{currentCase.value.name}”.</p>
    </dialog>
  );
}

/**
 * Where notices sit on a phone (library.css, max-width 600px): over the top of the map, below the
 * header and the map's tools, which stay usable; the map's top edge is read when notices change and
 * on resize. Elsewhere the stylesheet places them and ignores the value.
 */
function useMapTop(count: number): number | null {
  const [top, setTop] = useState<number | null>(null);
  useLayoutEffect(() => {
    const place = () => {
      const m = document.querySelector('.dg-map');
      const t = m ? m.getBoundingClientRect().top : NaN;
      setTop(Number.isFinite(t) && t > 0 && t < window.innerHeight / 2 ? Math.round(t) + 6 : null);
    };
    place();
    window.addEventListener('resize', place);
    return () => window.removeEventListener('resize', place);
  }, [count]);
  return top;
}

function Notices() {
  const list = notices.value;
  const s = saveState.value;
  const mapTop = useMapTop(list.length + (s.kind === 'storage-full' || s.kind === 'error' ? 1 : 0));
  return createPortal(
    <div class="dg-notices" aria-live="polite" style={mapTop === null ? undefined : { '--dg-notice-top': `${mapTop}px` }}>
      {(s.kind === 'storage-full' || s.kind === 'error') && (
        <div class="dg-notice is-error" role="alert" data-testid="storage-full">
          <p>{s.message}</p>
        </div>
      )}
      {list.map((n) => (
        <div key={n.id} class={`dg-notice is-${n.tone}`}>
          <p>{n.text}</p>
          {n.action && (
            <button
              type="button"
              class="dg-lib-btn is-primary"
              onClick={() => {
                dismiss(n.id);
                void n.action!.run();
              }}
            >
              {n.action.label}
            </button>
          )}
          <button type="button" class="dg-lib-btn" onClick={() => dismiss(n.id)}>
            OK
          </button>
        </div>
      ))}
    </div>,
    topLayerHost(),
  );
}

// the printable report is loaded when it is first opened (src/ui/lazy.tsx)
const ReportHost = lazyPart(() => import('./ReportView').then((m) => m.ReportHost), 'printable report', { overlay: true });

export function StatusArea() {
  const upd = updateWaiting.value;
  return (
    <span class="dg-status">
      <NetChip />
      <SaveChip />
      {upd && (
        <button
          type="button"
          class="dg-lib-btn is-primary"
          data-testid="apply-update"
          aria-label="Update ready: save the case, then restart with the new version"
          onClick={() => void upd.apply()}
        >
          Update ready
        </button>
      )}
      {saveState.value.kind === 'conflict' && createPortal(<ConflictDialog key={String(saveState.value.theirs?.revision)} />, document.body)}
      <Notices />
      {reportOpen.value && <ReportHost />}
    </span>
  );
}
