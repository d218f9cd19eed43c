/**
 * Map symbols: our own SVG marks as Leaflet divIcons (no default marker images). Every mark sits
 * in a 44 px touch target; the drawn symbol is smaller and carries a dark outline and a light halo
 * so it reads on a basemap, on the site grid and in sunlight.
 */
import * as L from 'leaflet';
import type { ReceptorKind } from '../../case/schema';
import { halo, RECEPTOR_SHAPES, SOURCE_SHAPE } from './markShapes';

const TARGET = 44;

function icon(svg: string, className: string, label: string, visible = ''): L.DivIcon {
  const tag = visible ? `<span class="dg-mark-label" aria-hidden="true">${escapeHtml(visible)}</span>` : '';
  return L.divIcon({
    html: `${tag}${svg}<span class="dg-sr">${escapeHtml(label)}</span>`,
    className: `dg-mark ${className}`,
    iconSize: [TARGET, TARGET],
    iconAnchor: [TARGET / 2, TARGET / 2],
  });
}

export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** The release: a filled hexagon with a centre dot (markShapes.ts). */
export function sourceIcon(): L.DivIcon {
  const svg = `<svg viewBox="-16 -16 32 32" width="32" height="32" aria-hidden="true">${SOURCE_SHAPE}</svg>`;
  return icon(svg, 'dg-mark-source', 'Release');
}

export function receptorIcon(kind: ReceptorKind, name: string, status: string | null, selected: boolean): L.DivIcon {
  const svg = `<svg viewBox="-16 -16 32 32" width="32" height="32" aria-hidden="true">${RECEPTOR_SHAPES[kind]}</svg>`;
  return icon(svg, `dg-mark-receptor${status ? ' dg-status-' + status : ''}${selected ? ' dg-selected' : ''}`, name, name);
}

/** A monitoring well with a water-level reading: an open triangle, apex down (a level mark). */
export function headIcon(label: string, selected: boolean): L.DivIcon {
  const svg = `<svg viewBox="-16 -16 32 32" width="32" height="32" aria-hidden="true">
    <path d="M-11 -8H11L0 11Z" fill="var(--mark-head)" ${halo}/>
    <path d="M-11 -8H11L0 11Z" fill="none" stroke="var(--mark-ink)" stroke-width="2" stroke-linejoin="round"/></svg>`;
  return icon(svg, `dg-mark-head${selected ? ' dg-selected' : ''}`, label, label);
}

/**
 * A monitoring (sampling) well: a sample vial seen side-on, with its fill line — observed, not
 * protected, so it reads apart from the receptors (ring, drop, square, flag, diamond) and from the
 * water-level triangle.
 */
export function monitoringIcon(name: string, label: string, selected: boolean): L.DivIcon {
  const vial = 'M-7 -12H7V4A7 7 0 0 1 -7 4Z';
  const svg = `<svg viewBox="-16 -16 32 32" width="32" height="32" aria-hidden="true">
    <path d="${vial}" fill="var(--mark-monitor)" ${halo}/>
    <path d="${vial}" fill="none" stroke="var(--mark-ink)" stroke-width="2" stroke-linejoin="round"/>
    <path d="M-7 -3H7" stroke="var(--mark-ink)" stroke-width="2"/></svg>`;
  return icon(svg, `dg-mark-monitor${selected ? ' dg-selected' : ''}`, `Monitoring well ${name}${label === name ? '' : `, ${label}`}`, label);
}

/** The flow handle at the arrow's tip: a round grip. */
export function flowHandleIcon(): L.DivIcon {
  const svg = `<svg viewBox="-16 -16 32 32" width="32" height="32" aria-hidden="true">
    <circle r="11" fill="var(--mark-flow)" ${halo}/><circle r="11" fill="none" stroke="var(--mark-ink)" stroke-width="2"/>
    <path d="M-5 -3L0 -8L5 -3M-5 3L0 8L5 3" fill="none" stroke="var(--mark-ink)" stroke-width="2"/></svg>`;
  return icon(svg, 'dg-mark-flow', 'Flow direction handle: drag to turn');
}
