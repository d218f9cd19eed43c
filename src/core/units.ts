/**
 * Units at the edges. Inside the engine everything is SI-based with the day as the time unit:
 * length m, time d, concentration mg/L, density kg/L (= g/cm³), Kd and Koc L/kg, K m/d,
 * diffusion coefficients m²/d, pumping rates m³/d.
 *
 * Each factor converts a value in the named unit to the internal unit (multiply to go in,
 * divide to come out). Exact definitions: international foot = 0.3048 m exactly and
 * US survey foot = 1200/3937 m (NIST Handbook 44, Appendix C; NIST SP 811); US gallon = 231 in³
 * = 3.785411784 L exactly; the Julian year of 365.25 d (IAU) is the "yr" used here; the pound
 * avoirdupois = 0.45359237 kg exactly.
 */

export type Dimension =
  | 'length'
  | 'time'
  | 'velocity'
  | 'conductivity'
  | 'concentration'
  | 'density'
  | 'partition'
  | 'diffusion'
  | 'rate'
  | 'flowRate'
  | 'dimensionless';

const FT = 0.3048;
const GAL_L = 3.785411784;
const YR = 365.25;
const LB_KG = 0.45359237;

export interface UnitDef {
  readonly id: string;
  readonly label: string;
  readonly dimension: Dimension;
  /** multiply a value in this unit by `factor` to get the internal unit */
  readonly factor: number;
  readonly system: 'SI' | 'US';
}

function u(id: string, label: string, dimension: Dimension, factor: number, system: 'SI' | 'US'): UnitDef {
  return { id, label, dimension, factor, system };
}

export const UNITS: Readonly<Record<string, UnitDef>> = Object.freeze(
  Object.fromEntries(
    [
      u('m', 'm', 'length', 1, 'SI'),
      u('cm', 'cm', 'length', 0.01, 'SI'),
      u('km', 'km', 'length', 1000, 'SI'),
      u('ft', 'ft', 'length', FT, 'US'),
      u('mi', 'mi', 'length', 5280 * FT, 'US'),
      u('d', 'days', 'time', 1, 'SI'),
      u('yr', 'years', 'time', YR, 'SI'),
      u('h', 'hours', 'time', 1 / 24, 'SI'),
      u('s', 's', 'time', 1 / 86400, 'SI'),
      u('m/d', 'm/d', 'velocity', 1, 'SI'),
      u('m/yr', 'm/yr', 'velocity', 1 / YR, 'SI'),
      u('ft/d', 'ft/d', 'velocity', FT, 'US'),
      u('ft/yr', 'ft/yr', 'velocity', FT / YR, 'US'),
      u('K:m/d', 'm/d', 'conductivity', 1, 'SI'),
      u('K:m/s', 'm/s', 'conductivity', 86400, 'SI'),
      u('K:cm/s', 'cm/s', 'conductivity', 864, 'SI'),
      u('K:ft/d', 'ft/d', 'conductivity', FT, 'US'),
      // gallons per day per square foot: (gal/d)/ft² = GAL_L·1e-3 m³/d / (FT² m²)
      u('K:gpd/ft2', 'gal/d/ft²', 'conductivity', (GAL_L * 1e-3) / (FT * FT), 'US'),
      u('mg/L', 'mg/L', 'concentration', 1, 'SI'),
      u('ug/L', 'µg/L', 'concentration', 1e-3, 'SI'),
      u('g/L', 'g/L', 'concentration', 1000, 'SI'),
      u('g/cm3', 'g/cm³', 'density', 1, 'SI'),
      u('kg/m3', 'kg/m³', 'density', 1e-3, 'SI'),
      u('lb/ft3', 'lb/ft³', 'density', LB_KG / (FT * FT * FT * 1000), 'US'),
      u('L/kg', 'L/kg', 'partition', 1, 'SI'),
      u('mL/g', 'mL/g', 'partition', 1, 'SI'),
      u('m2/d', 'm²/d', 'diffusion', 1, 'SI'),
      u('m2/s', 'm²/s', 'diffusion', 86400, 'SI'),
      u('cm2/s', 'cm²/s', 'diffusion', 8.64, 'SI'),
      u('ft2/d', 'ft²/d', 'diffusion', FT * FT, 'US'),
      u('1/d', '1/d', 'rate', 1, 'SI'),
      u('1/yr', '1/yr', 'rate', 1 / YR, 'SI'),
      u('m3/d', 'm³/d', 'flowRate', 1, 'SI'),
      u('m3/h', 'm³/h', 'flowRate', 24, 'SI'),
      u('L/s', 'L/s', 'flowRate', 86.4, 'SI'),
      // US gallon per minute: 3.785411784 L × 1440 min/d
      u('gpm', 'gal/min', 'flowRate', GAL_L * 1e-3 * 1440, 'US'),
      u('-', '–', 'dimensionless', 1, 'SI'),
    ].map((d) => [d.id, d]),
  ),
);

export function unitsOf(dimension: Dimension): UnitDef[] {
  return Object.values(UNITS).filter((d) => d.dimension === dimension);
}

export function unitDef(id: string): UnitDef {
  const d = UNITS[id];
  if (!d) throw new Error(`unknown unit "${id}"`);
  return d;
}

/** Value in `unit` → internal unit. */
export function toInternal(value: number, unit: string): number {
  return value * unitDef(unit).factor;
}

/** Internal value → value in `unit`. */
export function fromInternal(value: number, unit: string): number {
  return value / unitDef(unit).factor;
}

export function convert(value: number, from: string, to: string): number {
  const a = unitDef(from);
  const b = unitDef(to);
  if (a.dimension !== b.dimension) throw new Error(`cannot convert ${a.dimension} (${from}) to ${b.dimension} (${to})`);
  return (value * a.factor) / b.factor;
}
