/**
 * Display of results (internal m, d, mg/L) in the units the user works in: lengths in the unit of
 * the source width field (m or ft family), concentrations in the unit of the limit, times in days
 * below a year and in years above.
 */
import { fromInternal, UNITS } from '../core/units';
import { currentCase } from './state';
import { formatDuration, screenNumber } from '../case/numbers';

export function lengthUnit(): string {
  const u = currentCase.value.site.source.width.unit;
  return UNITS[u]?.system === 'US' ? 'ft' : 'm';
}

export function concUnit(): string {
  return currentCase.value.contaminant.limit.unit;
}

export function fmtLength(m: number, digits?: number): string {
  const u = lengthUnit();
  return `${screenNumber(m, 'length', fromInternal(m, u), digits)} ${UNITS[u].label}`;
}

export function fmtConc(mgL: number, digits?: number): string {
  const u = concUnit();
  return `${screenNumber(mgL, 'concentration', fromInternal(mgL, u), digits)} ${UNITS[u].label}`;
}

export function fmtTime(d: number | null, digits?: number): string {
  if (d === null) return '—';
  return formatDuration(d, digits);
}
