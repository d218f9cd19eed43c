/**
 * A wide table in a box that scrolls sideways on a narrow screen, and says so: while columns lie
 * beyond the right edge, a line above the table says which way to swipe and the edge is shaded
 * (app.css `.dg-scroll-x`). The box is a focusable region, so the keyboard can scroll it too.
 */
import type { ComponentChildren } from 'preact';
import { useEffect, useRef, useState } from 'preact/hooks';

/** 'none': everything fits; 'right': columns lie to the right; 'end': scrolled to the last column. */
type More = 'none' | 'right' | 'end';

function moreOf(el: HTMLElement): More {
  const hidden = el.scrollWidth - el.clientWidth;
  if (hidden <= 1) return 'none';
  return el.scrollLeft >= hidden - 1 ? 'end' : 'right';
}

export function ScrollX({ label, children, testId }: { label: string; children: ComponentChildren; testId?: string }) {
  const ref = useRef<HTMLDivElement>(null);
  const [more, setMore] = useState<More>('none');
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const update = () => setMore(moreOf(el));
    update();
    el.addEventListener('scroll', update, { passive: true });
    const ro = typeof ResizeObserver === 'function' ? new ResizeObserver(update) : null;
    ro?.observe(el);
    if (el.firstElementChild) ro?.observe(el.firstElementChild);
    return () => {
      el.removeEventListener('scroll', update);
      ro?.disconnect();
    };
  }, []);
  return (
    <div class="dg-scroll-x-outer" data-more={more} data-testid={testId}>
      {more !== 'none' && (
        <p class="dg-scroll-cue" aria-hidden="true">
          {more === 'right' ? 'More columns: swipe the table sideways →' : '← Swipe back for the first columns'}
        </p>
      )}
      {/* focusable whether or not it scrolls yet: its width is known only after layout */}
      <div ref={ref} class="dg-scroll-x" tabIndex={0} role="region" aria-label={label}>
        {children}
      </div>
    </div>
  );
}
