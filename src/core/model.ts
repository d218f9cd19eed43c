/**
 * The engine's input: one screening model in internal units (m, d, mg/L), already in the
 * flow-aligned frame. x is distance downgradient from the source plane, y across the flow
 * (source centred on y = 0), z depth below the water table (≥ 0).
 */

export type SolutionKind = 'domenico' | 'exact';

/** How first-order decay acts: on dissolved and sorbed mass alike (λ as given), or on the
 * dissolved phase only (the effective rate in the retarded equation is λ/R). */
export type DecayPhase = 'dissolved-and-sorbed' | 'dissolved-only';

export interface ScreeningModel {
  /** seepage velocity v = K·i/nₑ, m/d (not divided by R) */
  readonly v: number;
  /** longitudinal, transverse horizontal, transverse vertical dispersivity, m */
  readonly ax: number;
  readonly ay: number;
  readonly az: number;
  /** effective molecular diffusion coefficient De = D0·τ, m²/d (0 to leave out) */
  readonly diffusion: number;
  /** retardation factor R ≥ 1 */
  readonly R: number;
  /** first-order decay rate λ, 1/d (0: none) */
  readonly decay: number;
  readonly decayPhase: DecayPhase;
  /** source plane: width across the flow (m), thickness down from the water table (m) */
  readonly width: number;
  readonly thickness: number;
  /** source concentration C0, mg/L */
  readonly c0: number;
  /** first-order decline of the source concentration, 1/d (0: constant source) */
  readonly sourceDecay: number;
  /** release duration, d (Infinity: continuous) */
  readonly duration: number;
  readonly solution: SolutionKind;
}

export interface Point3 {
  readonly x: number;
  readonly y: number;
  readonly z: number;
}
