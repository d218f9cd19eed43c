/** The case file's quantity: a finite value with a unit of one dimension (schema.ts re-exports it). */
import './zodConfig';
import { z } from 'zod';
import { UNITS, type Dimension } from '../core/units';

/** A quantity with a unit of the given dimension; the value must be finite. */
export function quantity(dimension: Dimension) {
  return z.object({
    value: z.number().refine(Number.isFinite, { message: 'must be a finite number' }),
    unit: z.string().refine((u) => UNITS[u]?.dimension === dimension, {
      message: `must be a ${dimension} unit (${Object.values(UNITS)
        .filter((d) => d.dimension === dimension)
        .map((d) => d.id)
        .join(', ')})`,
    }),
  });
}
