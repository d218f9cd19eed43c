/**
 * Validation of a ScreeningModel: impossible values throw ValidationError (field, value, range);
 * the returned warnings are the engine-level doubts (field-range doubts are the case layer's).
 */
import type { ScreeningModel } from './model';
import { retardedParameters } from './retarded';
import {
  ValidationError,
  requireNonNegative,
  requirePositive,
  requireRetardation,
  WORKING_MAX,
  type Warning,
} from './validation';

export function validateModel(m: ScreeningModel): Warning[] {
  if (m === null || typeof m !== 'object') throw new ValidationError('model', m, 'an object');
  requireNonNegative('v', m.v);
  requireNonNegative('ax', m.ax);
  requireNonNegative('ay', m.ay);
  requireNonNegative('az', m.az);
  requireNonNegative('diffusion', m.diffusion);
  requireRetardation('R', m.R);
  requireNonNegative('decay', m.decay);
  requirePositive('width', m.width);
  requirePositive('thickness', m.thickness);
  requireNonNegative('c0', m.c0);
  requireNonNegative('sourceDecay', m.sourceDecay);
  if (!(m.duration > 0) || (m.duration !== Infinity && !(m.duration <= WORKING_MAX)))
    throw new ValidationError('duration', m.duration, `a number > 0 and ≤ ${WORKING_MAX} (Infinity for a continuous release)`);
  if (m.decayPhase !== 'dissolved-and-sorbed' && m.decayPhase !== 'dissolved-only')
    throw new ValidationError('decayPhase', m.decayPhase, "'dissolved-and-sorbed' or 'dissolved-only'");
  if (m.solution !== 'domenico' && m.solution !== 'exact')
    throw new ValidationError('solution', m.solution, "'domenico' or 'exact'");
  const warnings: Warning[] = [];
  const { Dx } = retardedParameters(m);
  if (m.solution === 'domenico' && !(m.v > 0))
    throw new ValidationError('v', m.v, 'a number > 0 for the Domenico solution (use the exact solution for no flow)');
  if (m.solution === 'domenico' && !domenicoAdmits(m)) {
    const limit = domenicoSourceDecayLimit(m);
    throw new ValidationError(
      'sourceDecay',
      m.sourceDecay,
      `below ${limit.toPrecision(4)} 1/d for the Domenico solution`,
      `the source declines faster than Domenico's closed form can represent with this velocity and dispersion; it must be below ${limit.toPrecision(4)} 1/d (λ + v²/(4·Dx), retarded), or use the exact solution, which has no such limit`,
    );
  }
  if (!(m.v > 0) && !(Dx > 0))
    warnings.push({
      code: 'no-transport',
      message: 'With no flow and no dispersion or diffusion nothing moves away from the source.',
      field: 'v',
    });
  return warnings;
}

/** The fastest source decline Domenico's closed form admits: λ + v²/(4·Dx) with retarded v, Dx. */
export function domenicoSourceDecayLimit(m: ScreeningModel): number {
  const { v, Dx, lam } = retardedParameters(m);
  return Dx > 0 ? lam + (v * v) / (4 * Dx) : Infinity;
}

/** Whether Domenico's closed form applies: v > 0 and the source decline within its limit. */
export function domenicoAdmits(m: ScreeningModel): boolean {
  return m.v > 0 && m.sourceDecay < domenicoSourceDecayLimit(m);
}
