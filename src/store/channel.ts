/**
 * Tabs and windows of the app tell each other about saves over a BroadcastChannel, so a tab showing
 * a case another tab just saved finds out at once (the compare-and-set in the store catches it
 * anyway at the next save, even where BroadcastChannel is missing).
 */
export type CaseMessage =
  | { type: 'saved'; id: string; revision: number; writer: string }
  | { type: 'deleted'; id: string; writer: string };

export interface CaseChannel {
  post(m: CaseMessage): void;
  subscribe(fn: (m: CaseMessage) => void): () => void;
  close(): void;
}

export const CHANNEL_NAME = 'downgradient-cases';

export function openCaseChannel(name = CHANNEL_NAME): CaseChannel {
  if (typeof BroadcastChannel === 'undefined') {
    return { post() {}, subscribe: () => () => {}, close() {} };
  }
  const bc = new BroadcastChannel(name);
  const subs = new Set<(m: CaseMessage) => void>();
  bc.onmessage = (ev: MessageEvent) => {
    const m = ev.data as CaseMessage;
    if (m && typeof m === 'object' && (m.type === 'saved' || m.type === 'deleted') && typeof m.id === 'string') {
      for (const fn of subs) fn(m);
    }
  };
  return {
    post: (m) => bc.postMessage(m),
    subscribe(fn) {
      subs.add(fn);
      return () => subs.delete(fn);
    },
    close: () => bc.close(),
  };
}
