/**
 * Display of results (internal m, d, mg/L) in the units the user works in: lengths and velocities
 * in the case's unit system (src/case/unitSystem.ts: SI m, m/d; US customary ft, ft/d),
 * concentrations in the unit of the limit, times in one unit for the whole screen: years when the
 * case's horizon is over two years, else days (numbers.ts timeUnitFor).
 */
import { fromInternal, toInternal, UNITS } from '../core/units';
import { currentCase } from './state';
import { formatDuration, screenNumber, timeUnitFor, type TimeUnit } from '../case/numbers';
import { resultText, resultUnit, shownQuantity } from '../case/unitSystem';
import type { Quantity } from '../case/schema';

export function lengthUnit(): string {
  return resultUnit(currentCase.value, 'length');
}

/** A seepage velocity (internal m/d) in the case's system. */
export function fmtVelocity(mPerDay: number, digits?: number): string {
  return resultText(currentCase.value, mPerDay, 'velocity', 'velocity', digits);
}

/** A pumping rate (internal m³/d) in the case's system: m³/d, or US gal/min. */
export function fmtRate(m3PerDay: number, digits?: number): string {
  return resultText(currentCase.value, m3PerDay, 'flowRate', 'ratio', digits);
}

/** A stored input quantity as its field shows it (the case's system, or the field's own unit). */
export function fmtInput(field: string, q: Quantity, digits = 4): string {
  const s = shownQuantity(currentCase.value, field, q);
  return `${screenNumber(s.value, 'ratio', s.value, digits)} ${UNITS[s.unit]?.label ?? s.unit}`;
}

export function concUnit(): string {
  return currentCase.value.contaminant.limit.unit;
}

export function fmtLength(m: number, digits?: number): string {
  return resultText(currentCase.value, m, 'length', 'length', digits);
}

export function fmtConc(mgL: number, digits?: number): string {
  const u = concUnit();
  return `${screenNumber(mgL, 'concentration', fromInternal(mgL, u), digits)} ${UNITS[u].label}`;
}

/** The time unit of the screen for the case on it (numbers.ts timeUnitFor). */
export function timeUnit(): TimeUnit {
  const h = currentCase.value.evaluation.horizon;
  return timeUnitFor(toInternal(h.value, h.unit));
}

export function fmtTime(d: number | null, digits?: number): string {
  if (d === null) return '—';
  return formatDuration(d, digits, timeUnit());
}
