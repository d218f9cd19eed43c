/**
 * Modal dialogs make everything outside them inert, so a notice rendered in document.body while a
 * dialog is open cannot be tapped (its Undo lands on the dialog). Every modal dialog opens through
 * `useModalDialog`, which keeps a stack of the open ones; notices render into the topmost.
 */
import { signal } from '@preact/signals';
import { useEffect } from 'preact/hooks';

const stack = signal<HTMLDialogElement[]>([]);

/** Where content that must stay interactive goes: the topmost open modal dialog, else the body. */
export function topLayerHost(): HTMLElement {
  const s = stack.value;
  return s.length ? s[s.length - 1] : document.body;
}

/** Open the referenced <dialog> as modal on mount and keep it on the stack until unmount. */
export function useModalDialog(ref: { readonly current: HTMLDialogElement | null }): void {
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (!d.open) d.showModal();
    stack.value = [...stack.value, d];
    return () => {
      stack.value = stack.value.filter((x) => x !== d);
    };
  }, []);
}

/** Is a modal dialog open (the page behind it inert)? */
export function modalOpen(): boolean {
  return stack.peek().length > 0;
}
