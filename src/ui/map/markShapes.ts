/**
 * The drawn marks themselves (SVG markup, centred on 0,0 in a 32-unit box, colours from the
 * --mark-* variables), without Leaflet: the map's icons (symbols.ts) and the printed site plan
 * (library/SitePlan.tsx) draw the same symbols, so a legend in one matches the other.
 * Constant markup only: no user text is ever put into these strings.
 */
import type { ReceptorKind } from '../../case/schema';

/** A light halo under a mark's outline, so it reads on any background. */
export const halo = 'stroke="var(--mark-halo)" stroke-width="6" paint-order="stroke"';

/** The release: a filled hexagon with a centre dot. */
export const SOURCE_SHAPE = `<polygon points="0,-13 11.3,-6.5 11.3,6.5 0,13 -11.3,6.5 -11.3,-6.5" fill="var(--mark-source)" ${halo}/>
    <polygon points="0,-13 11.3,-6.5 11.3,6.5 0,13 -11.3,6.5 -11.3,-6.5" fill="none" stroke="var(--mark-ink)" stroke-width="2"/>
    <circle r="3.5" fill="var(--mark-ink)"/>`;

/** Each kind of receptor, filled with --mark-receptor (its status colour where it has a result). */
export const RECEPTOR_SHAPES: Readonly<Record<ReceptorKind, string>> = Object.freeze({
  // a well: ring with a cross (the casing seen from above)
  well: `<circle r="10" fill="var(--mark-receptor)" ${halo}/><circle r="10" fill="none" stroke="var(--mark-ink)" stroke-width="2"/>
    <path d="M-10 0H10M0 -10V10" stroke="var(--mark-ink)" stroke-width="2"/>`,
  // a spring: a teardrop
  spring: `<path d="M0 -12 C7 -3 10 2 10 5 A10 10 0 0 1 -10 5 C-10 2 -7 -3 0 -12Z" fill="var(--mark-receptor)" ${halo}/>
    <path d="M0 -12 C7 -3 10 2 10 5 A10 10 0 0 1 -10 5 C-10 2 -7 -3 0 -12Z" fill="none" stroke="var(--mark-ink)" stroke-width="2"/>`,
  // surface water: a square with two waves
  'surface-water': `<rect x="-11" y="-11" width="22" height="22" rx="3" fill="var(--mark-receptor)" ${halo}/>
    <rect x="-11" y="-11" width="22" height="22" rx="3" fill="none" stroke="var(--mark-ink)" stroke-width="2"/>
    <path d="M-7 -2q3.5 -4 7 0t7 0M-7 5q3.5 -4 7 0t7 0" fill="none" stroke="var(--mark-ink)" stroke-width="2"/>`,
  // a property line point: a flag on a post
  'property-line': `<path d="M-8 12V-12H9L4 -6L9 0H-8" fill="var(--mark-receptor)" ${halo}/>
    <path d="M-8 12V-12H9L4 -6L9 0H-8" fill="none" stroke="var(--mark-ink)" stroke-width="2" stroke-linejoin="round"/>`,
  // anything else: a diamond
  other: `<path d="M0 -12L12 0L0 12L-12 0Z" fill="var(--mark-receptor)" ${halo}/>
    <path d="M0 -12L12 0L0 12L-12 0Z" fill="none" stroke="var(--mark-ink)" stroke-width="2"/>`,
});
