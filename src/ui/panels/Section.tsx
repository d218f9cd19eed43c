/**
 * A panel section: a heading that opens and closes it (a large button, keyboard reachable) and,
 * while closed, a one-line summary of what it holds, so the results stay within reach on a tablet.
 */
import type { ComponentChildren } from 'preact';
import { openSections, type SectionId } from '../view';

export function Section(props: {
  id: SectionId;
  title: string;
  summary: ComponentChildren;
  children: ComponentChildren;
  class?: string;
  /** false: always open (the results, which carry the caution) */
  collapsible?: boolean;
}) {
  const fixed = props.collapsible === false;
  const open = fixed || openSections.value.has(props.id);
  const toggle = () => {
    const s = new Set(openSections.value);
    if (open) s.delete(props.id);
    else s.add(props.id);
    openSections.value = s;
  };
  return (
    <section class={`dg-section${props.class ? ' ' + props.class : ''}`} aria-labelledby={`sec-${props.id}`} data-section={props.id} data-open={open}>
      <h2 id={`sec-${props.id}`}>
        {fixed ? (
          <span class="dg-sec-toggle">
            <span class={`dg-sec-mark dg-sec-${props.id}`} aria-hidden="true" />
            <span class="dg-sec-title">{props.title}</span>
          </span>
        ) : (
        <button type="button" class="dg-sec-toggle" aria-expanded={open} aria-controls={`sec-${props.id}-body`} onClick={toggle}>
          <span class={`dg-sec-mark dg-sec-${props.id}`} aria-hidden="true" />
          <span class="dg-sec-title">{props.title}</span>
          <span class="dg-sec-chevron" aria-hidden="true">
            {open ? '▾' : '▸'}
          </span>
        </button>
        )}
      </h2>
      {!open && <p class="dg-sec-summary">{props.summary}</p>}
      <div id={`sec-${props.id}-body`} hidden={!open}>
        {open && props.children}
      </div>
    </section>
  );
}
