/**
 * Display of results (internal m, d, mg/L) in the units the user works in: lengths in the unit of
 * the source width field (m or ft family), concentrations in the unit of the limit, times in days
 * below a year and in years above.
 */
import { fromInternal, UNITS } from '../core/units';
import { currentCase } from './state';
import { fmtNum } from './fields';

export function lengthUnit(): string {
  const u = currentCase.value.site.source.width.unit;
  return UNITS[u]?.system === 'US' ? 'ft' : 'm';
}

export function concUnit(): string {
  return currentCase.value.contaminant.limit.unit;
}

export function fmtLength(m: number, digits = 3): string {
  const u = lengthUnit();
  return `${fmtNum(fromInternal(m, u), digits)} ${UNITS[u].label}`;
}

export function fmtConc(mgL: number, digits = 3): string {
  const u = concUnit();
  if (mgL === 0) return `0 ${UNITS[u].label}`;
  return `${fmtNum(fromInternal(mgL, u), digits)} ${UNITS[u].label}`;
}

export function fmtTime(d: number | null, digits = 3): string {
  if (d === null) return '—';
  if (d === Infinity) return 'steady state';
  if (d < 365.25) return `${fmtNum(d, digits)} d`;
  return `${fmtNum(d / 365.25, digits)} yr`;
}
