/**
 * Parts of the screen that the first view does not need (the printable report, the comparison,
 * files in and out, the charts) are separate chunks, loaded with import() when first shown, so the
 * map and the inputs appear sooner on a tablet with a poor signal. The service worker precaches
 * every chunk (vite.config.ts, workbox globPatterns), so they open offline as well.
 *
 * `lazyPart(load, what)` gives a component that shows "Loading the <what>…" until its chunk has
 * arrived (a few milliseconds from the precache), then the part itself; if the chunk cannot be
 * loaded it says so, with a button to try again. `preload()` starts the load early. `npm run build`
 * prints the size of what stays in the first load against its budget.
 */
import type { ComponentType } from 'preact';
import { createPortal } from 'preact/compat';
import { useEffect, useState } from 'preact/hooks';

export type LazyPart<P> = ComponentType<P> & { preload(): Promise<unknown> };

export interface LazyOptions {
  /** show the loading state as a box over the page (for parts that open over the screen) */
  overlay?: boolean;
  /** a class for the loading box, so it holds the part's place (the map's area) and nothing jumps */
  holder?: string;
}

export function lazyPart<P extends object>(load: () => Promise<ComponentType<P>>, what: string, options: LazyOptions = {}): LazyPart<P> {
  let loaded: ComponentType<P> | null = null;
  const holder = options.holder ? ` ${options.holder}` : '';
  let pending: Promise<ComponentType<P>> | null = null;
  const preload = () =>
    (pending ??= load().then(
      (c) => (loaded = c),
      (e: unknown) => {
        pending = null; // a later attempt loads again
        throw e;
      },
    ));

  function Lazy(props: P) {
    const [attempt, setAttempt] = useState(0);
    const [error, setError] = useState<string | null>(null);
    const [, setReady] = useState(false);
    useEffect(() => {
      if (loaded || error) return;
      let live = true;
      preload().then(
        () => live && setReady(true),
        (e: unknown) => live && setError(e instanceof Error ? e.message : String(e)),
      );
      return () => void (live = false);
    }, [attempt, error]);
    if (loaded) {
      const Part = loaded;
      return <Part {...props} />;
    }
    const box = error ? (
      <div class={`dg-lazy is-error${options.overlay ? ' is-overlay' : ''}${holder}`} role="alert">
        <span>
          The {what} could not be loaded ({error}). If the app was installed only partly, reconnect once.
        </span>
        <button
          type="button"
          class="dg-lazy-retry"
          onClick={() => {
            setError(null);
            setAttempt((a) => a + 1);
          }}
        >
          Try again
        </button>
      </div>
    ) : (
      <div class={`dg-lazy${options.overlay ? ' is-overlay' : ''}${holder}`} role="status" aria-live="polite">
        Loading the {what}…
      </div>
    );
    return options.overlay ? createPortal(box, document.body) : box;
  }
  Lazy.displayName = `Lazy(${what})`;
  return Object.assign(Lazy, { preload });
}
