/**
 * The case's unit system (version 3, optional `units`): SI or US customary for everything shown —
 * input fields, summaries, tables, chart axes, the report and exported files — with per-field
 * overrides. Absent: SI, with each input field shown in the unit it was entered in (the old
 * behaviour). Inside, everything stays in the engine's units (src/core/units.ts).
 *
 * A stored quantity keeps the value and unit the user typed. Switching the system or a field's
 * unit changes only how it is shown (converted and rounded for display); the stored value changes
 * only when the user types a new one, in the unit shown. So a value taken m → ft → m reads exactly
 * as typed: nothing is converted and written back. Conversion factors: NIST SP 811 (2008),
 * Appendix B (foot = 0.3048 m exactly; US gallon = 3.785411784 L exactly), in src/core/units.ts.
 */
import type { Case, Quantity } from './schema';
import { UNITS, convert, fromInternal, type Dimension } from '../core/units';
import { INTERNAL_UNIT } from './fields';
import { screenNumber, type NumberKind } from './numbers';

export type UnitSystem = 'SI' | 'US';

/** The unit each dimension is shown in, per system (a field override or an SI unit typed in an SI case wins). */
export const SYSTEM_UNITS: Readonly<Record<UnitSystem, Readonly<Record<Dimension, string>>>> = {
  // SI shows each dimension in the engine's own unit
  SI: INTERNAL_UNIT,
  US: {
    length: 'ft',
    time: 'd',
    velocity: 'ft/d',
    conductivity: 'K:ft/d',
    // concentrations and partition coefficients are written in mg/L and L/kg in US practice too
    concentration: 'mg/L',
    density: 'lb/ft3',
    partition: 'L/kg',
    diffusion: 'ft2/d',
    rate: '1/d',
    // well rates in US gallons per minute, as US well records and pump curves give them
    flowRate: 'gpm',
    dimensionless: '-',
  },
};

/** The case's system (absent: SI). */
export function unitSystem(c: Pick<Case, 'units'>): UnitSystem {
  return c.units?.system ?? 'SI';
}

/** The unit results of a dimension are shown in (lengths, velocities, …). */
export function resultUnit(c: Pick<Case, 'units'>, dimension: Dimension): string {
  return SYSTEM_UNITS[unitSystem(c)][dimension];
}

/**
 * A result (internal units) as the screen writes it in the case's system: "131 ft", "91.7 gal/min".
 * `kind` sets zero within round-off and the significant digits (numbers.ts).
 */
export function resultText(c: Pick<Case, 'units'>, internal: number, dimension: Dimension, kind: NumberKind, digits?: number): string {
  const u = resultUnit(c, dimension);
  return `${screenNumber(internal, kind, fromInternal(internal, u), digits)} ${UNITS[u].label}`;
}

/** Units that belong to neither system's choice (time, concentration units) count as the system's own. */
function inSystem(unit: string, system: UnitSystem): boolean {
  const d = UNITS[unit];
  return !d || d.dimension === 'time' || d.dimension === 'concentration' || d.dimension === 'partition' || d.system === system;
}

/**
 * The unit a quantity field is shown in: the field's override; else, with no case-wide system, the
 * unit it was typed in; else that unit when it belongs to the case's system; else the system's
 * unit for its dimension.
 */
export function fieldUnit(c: Pick<Case, 'units'>, field: string, stored: Quantity): string {
  const override = c.units?.fields?.[field];
  const dim = UNITS[stored.unit]?.dimension;
  if (override && UNITS[override] && UNITS[override].dimension === dim) return override;
  if (!c.units || !dim) return stored.unit;
  return inSystem(stored.unit, c.units.system) ? stored.unit : SYSTEM_UNITS[c.units.system][dim];
}

/** The stored quantity as shown: in the field's unit, the value exact when no conversion is needed. */
export function shownQuantity(c: Pick<Case, 'units'>, field: string, stored: Quantity): Quantity {
  const unit = fieldUnit(c, field, stored);
  return unit === stored.unit ? stored : { value: convert(stored.value, stored.unit, unit), unit };
}

/** Switch the case-wide system (the stored values stay as typed). */
export function withUnitSystem(c: Case, system: UnitSystem): Case['units'] {
  return { system, fields: { ...(c.units?.fields ?? {}) } };
}

/** Show one field in `unit` (the stored value stays as typed). */
export function withFieldUnit(c: Case, field: string, unit: string): Case['units'] {
  return { system: unitSystem(c), fields: { ...(c.units?.fields ?? {}), [field]: unit } };
}

/** A length of a map's grid or scale bar, in the system's unit: its metres and its label. */
export interface ScaleLength {
  metres: number;
  label: string;
}

/** The smallest 1, 2, 5 × 10ⁿ at or above `target` (in the same unit). */
function niceAtLeast(target: number): number {
  const p = 10 ** Math.floor(Math.log10(target));
  for (const m of [1, 2, 5, 10]) if (m * p >= target * (1 - 1e-12)) return m * p;
  return 10 * p;
}

/**
 * The length unit of maps, scale bars and position fields: SI metres (kilometres from 1000 m up),
 * US customary feet (miles from a mile up). Feet: NIST SP 811 (2008) Appendix B, 0.3048 m exactly.
 */
export function mapLengthUnit(system: UnitSystem): { unit: 'm' | 'ft'; metres: number; big: 'km' | 'mi'; perBig: number } {
  return system === 'US' ? { unit: 'ft', metres: UNITS.ft.factor, big: 'mi', perBig: 5280 } : { unit: 'm', metres: 1, big: 'km', perBig: 1000 };
}

/**
 * A grid or scale label: "250 m", "2 km", "500 ft", "1 mi"; zero within round-off is 0. Counted in
 * kilometres or miles only when the step is a whole number of them (a 10,000 ft grid stays in ft).
 */
export function scaleLabel(metres: number, system: UnitSystem, step = Math.abs(metres)): string {
  const u = mapLengthUnit(system);
  const v = metres / u.metres;
  const s = step / u.metres;
  const whole = Math.abs(s / u.perBig - Math.round(s / u.perBig)) < 1e-9;
  if (s >= u.perBig && whole) return `${Number((v / u.perBig).toPrecision(6))} ${u.big}`;
  const digits = s < 1 ? 1 : 0;
  return `${Math.abs(v) < 1e-9 * Math.max(s, 1) ? 0 : Number(v.toFixed(digits))} ${u.unit}`;
}

/** The shortest 1-2-5 length at least `targetMetres` long in the system's unit (a scale bar). */
export function niceScaleLength(targetMetres: number, system: UnitSystem): ScaleLength {
  const u = mapLengthUnit(system);
  const t = targetMetres / u.metres;
  // past a mile or a kilometre, count in miles or kilometres
  const inUnits = t >= u.perBig ? niceAtLeast(t / u.perBig) * u.perBig : niceAtLeast(t);
  const metres = inUnits * u.metres;
  return { metres, label: scaleLabel(metres, system) };
}

/** A grid step: about `span / count` rounded to 1, 2, 5 × 10ⁿ of the system's unit, in metres. */
export function gridStep(spanMetres: number, count: number, system: UnitSystem): number {
  const u = mapLengthUnit(system);
  return niceAtLeast(spanMetres / u.metres / Math.max(1, count)) * u.metres;
}

/** A length in metres as a position field of the system shows it (m or ft), rounded to 2 decimals. */
export function positionShown(metres: number, system: UnitSystem): number {
  return Number((metres / mapLengthUnit(system).metres).toFixed(2));
}

/** A position typed in the system's unit, in metres. */
export function positionTyped(value: number, system: UnitSystem): number {
  return value * mapLengthUnit(system).metres;
}
