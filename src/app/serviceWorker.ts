/**
 * Service-worker registration and updates (workbox-window). The worker itself is generated at
 * build by vite-plugin-pwa (precached app shell, runtime tile cache; see vite.config.ts) and
 * exists only in the production build.
 *
 * A new version installs in the background and waits. The status area offers "Update"; applying
 * it first saves the open case (and refuses while it cannot be saved, e.g. storage full), then
 * tells the waiting worker to take over, and reloads once it controls the page. Unsaved work is
 * never discarded by an update.
 *
 * workbox-window is loaded on demand (import()), after the first screen: registering the worker is
 * not needed to show it (see src/ui/lazy.tsx on what the first load carries).
 */
import type { Workbox } from 'workbox-window';
import { offlineReady, updateWaiting, notify, session } from './session';

export async function saveBeforeReload(): Promise<boolean> {
  const a = session.autosaver;
  if (!a) return true;
  await a.flush();
  if (a.isDirty()) {
    a.emergency();
    notify({
      tone: 'warn',
      text: 'The update waits: the latest changes could not be saved yet. Free some space or export the case, then update.',
      timeoutMs: 10000,
    });
    return false;
  }
  return true;
}

function offlineUnavailable(e: unknown): void {
  // e.g. service workers disabled (private windows, policies): the app still works and saves
  console.warn('service worker registration failed', e);
  notify({
    tone: 'warn',
    text: 'Offline use is not available in this browser session (the browser does not allow the app to install itself here). Everything else works, and cases are still saved on this device.',
  });
}

export async function registerServiceWorker(url = './sw.js'): Promise<Workbox | null> {
  if (!('serviceWorker' in navigator)) return null;
  let wb: Workbox;
  try {
    wb = new (await import('workbox-window')).Workbox(url, { type: 'classic' });
  } catch (e) {
    offlineUnavailable(e);
    return null;
  }
  let reloading = false;

  const reloadOnce = () => {
    if (reloading) return;
    reloading = true;
    window.location.reload();
  };
  let applying = false;

  const offerUpdate = () => {
    updateWaiting.value = {
      apply: async () => {
        if (!(await saveBeforeReload())) return;
        applying = true;
        wb.messageSkipWaiting();
      },
    };
  };
  // A controlled page switches on `controlling`; a page the old version never controlled (the
  // first visit) sees only the new version's activation.
  wb.addEventListener('controlling', () => applying && reloadOnce());
  wb.addEventListener('activated', () => applying && reloadOnce());

  wb.addEventListener('waiting', offerUpdate);
  wb.addEventListener('activated', (e) => {
    if (e.isUpdate) return;
    offlineReady.value = true;
    notify({ tone: 'info', text: 'Downgradient is now kept on this device: it opens, computes and saves with no network.', timeoutMs: 8000 });
  });
  wb.addEventListener('controlling', () => {
    offlineReady.value = true;
  });
  wb.register()
    .then((reg) => {
      if (navigator.serviceWorker.controller) offlineReady.value = true;
      // look for a new version when the app comes back to the foreground, at most hourly
      let last = Date.now();
      document.addEventListener('visibilitychange', () => {
        if (document.visibilityState === 'visible' && navigator.onLine && Date.now() - last > 3600_000) {
          last = Date.now();
          void reg?.update().catch(() => {});
        }
      });
    })
    .catch(offlineUnavailable);
  return wb;
}
