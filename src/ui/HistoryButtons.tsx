/**
 * Undo and redo of whole case edits: two buttons in the header and the shortcuts Ctrl+Z and
 * Ctrl+Shift+Z (or Ctrl+Y; ⌘ on a Mac). The shortcuts act on the case even while a field has
 * focus, instead of the browser's text-edit history, which walks across fields unseen. Inside an
 * open dialog (the case sheet) the browser's own behaviour is kept.
 */
import { useEffect } from 'preact/hooks';
import { canRedo, canUndo, redoEdit, undoEdit } from './state';
import { modalOpen } from './library/topLayer';

export function historyKey(e: Pick<KeyboardEvent, 'key' | 'ctrlKey' | 'metaKey' | 'shiftKey' | 'altKey'>): 'undo' | 'redo' | null {
  if (!(e.ctrlKey || e.metaKey) || e.altKey) return null;
  const k = e.key.toLowerCase();
  if (k === 'z') return e.shiftKey ? 'redo' : 'undo';
  if (k === 'y' && !e.shiftKey) return 'redo';
  return null;
}

export function HistoryButtons() {
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      const what = historyKey(e);
      if (!what || modalOpen()) return;
      e.preventDefault();
      if (what === 'undo') undoEdit();
      else redoEdit();
    };
    window.addEventListener('keydown', onKey, true);
    return () => window.removeEventListener('keydown', onKey, true);
  }, []);
  return (
    <span class="dg-history" role="group" aria-label="Case history">
      <button type="button" class="dg-history-btn" disabled={!canUndo.value} title="Undo the last change (Ctrl+Z)" aria-keyshortcuts="Control+Z" aria-label="Undo" onClick={() => undoEdit()}>
        <span aria-hidden="true">↶</span> <span class="dg-history-word">Undo</span>
      </button>
      <button type="button" class="dg-history-btn" disabled={!canRedo.value} title="Redo (Ctrl+Shift+Z)" aria-keyshortcuts="Control+Shift+Z" aria-label="Redo" onClick={() => redoEdit()}>
        <span aria-hidden="true">↷</span> <span class="dg-history-word">Redo</span>
      </button>
    </span>
  );
}
