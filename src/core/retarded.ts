/**
 * The retarded transport parameters of a ScreeningModel: the one place where retardation and the
 * decay phase are applied (the solutions, validation and the case layer all read them from here).
 *
 *   v_R  = v/R                      retarded (contaminant) velocity
 *   Dᵢ_R = (αᵢ·v + De)/R            retarded dispersion coefficients, i = x, y, z
 *   λ_R  = λ                        decay of dissolved and sorbed mass alike
 *        = λ/R                      decay of the dissolved phase only
 *
 * Linear equilibrium sorption divides the whole advection–dispersion equation by R (Freeze &
 * Cherry 1979, section 9.2); decay that acts on the dissolved phase only is divided by it too
 * (Bear 1979, Hydraulics of Groundwater, section 7.7). Exact arithmetic on validated inputs: no
 * intermediate can overflow inside the working range (validation.ts).
 */
import type { ScreeningModel } from './model';

export interface RetardedParameters {
  /** retarded velocity v/R, m/d */
  readonly v: number;
  /** retarded dispersion coefficients (αᵢ·v + De)/R, m²/d */
  readonly Dx: number;
  readonly Dy: number;
  readonly Dz: number;
  /** first-order decay rate in the retarded equation, 1/d */
  readonly lam: number;
}

export function retardedParameters(m: ScreeningModel): RetardedParameters {
  const R = m.R;
  const De = m.diffusion;
  return {
    v: m.v / R,
    Dx: (m.ax * m.v + De) / R,
    Dy: (m.ay * m.v + De) / R,
    Dz: (m.az * m.v + De) / R,
    lam: m.decayPhase === 'dissolved-only' ? m.decay / R : m.decay,
  };
}
