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
import { UNITS, convert, type Dimension } from '../core/units';
import { INTERNAL_UNIT } from './fields';

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
