/**
 * Heads in the steady well field (field.ts) from its discharge potential Φ (discharge per unit
 * width Q = −∇Φ; Strack 1989, Groundwater Mechanics, §8 for the unconfined form):
 * - confined (or unconfined with the saturated thickness B taken constant): Φ = K·B·h + C, so
 *       h = h_ref + (Φ − Φ_ref)/(K·B);
 * - unconfined, Dupuit–Forchheimer (horizontal flow, the head the same over the vertical; Dupuit
 *   1863, Forchheimer 1886): Φ = ½·K·h² + C with h the saturated thickness above the aquifer base,
 *   so
 *       h = √(h_ref² + 2·(Φ − Φ_ref)/K).
 *   The field's regional term −Q₀·x keeps Q₀ = q·B, the discharge per unit width where the
 *   saturated thickness is B; it gives the Dupuit parabola h² = h_ref² − 2Q₀x/K along the flow.
 * The reference is a point where the head is known (for example a constant-head line's stage, or
 * the saturated thickness B at the source). Where the unconfined form has h² ≤ 0 the aquifer would
 * be dewatered (the well cannot deliver its rate there): `unconfinedHead` returns 0 there and
 * `dewatered` says so; no NaN.
 * Inside a well's radius r is taken as rw (field.ts), so the head there is the head at the well face.
 */
import { potential, type FlowField } from './field';
import { requireFinite, requirePositive } from '../validation';

export interface HeadReference {
  readonly x: number;
  readonly y: number;
  /** head at (x, y): above any datum (confined); the saturated thickness above the aquifer base (unconfined) */
  readonly head: number;
}

function check(K: number, ref: HeadReference): void {
  requirePositive('conductivity', K);
  requireFinite('reference.x', ref.x);
  requireFinite('reference.y', ref.y);
  requireFinite('reference.head', ref.head);
}

/** Confined head (or unconfined with B constant) at (x, y): h_ref + (Φ − Φ_ref)/(K·B). */
export function confinedHead(f: FlowField, conductivity: number, ref: HeadReference, x: number, y: number): number {
  check(conductivity, ref);
  return ref.head + (potential(f, x, y) - potential(f, ref.x, ref.y)) / (conductivity * f.thickness);
}

/** h² of the Dupuit–Forchheimer form at (x, y) (≤ 0 where the aquifer would be dewatered). */
function unconfinedSquare(f: FlowField, K: number, ref: HeadReference, x: number, y: number): number {
  check(K, ref);
  requirePositive('reference.head', ref.head);
  return ref.head * ref.head + (2 * (potential(f, x, y) - potential(f, ref.x, ref.y))) / K;
}

/** Unconfined (Dupuit–Forchheimer) saturated thickness above the base at (x, y); 0 where dewatered. */
export function unconfinedHead(f: FlowField, conductivity: number, ref: HeadReference, x: number, y: number): number {
  return Math.sqrt(Math.max(0, unconfinedSquare(f, conductivity, ref, x, y)));
}

/** Whether the Dupuit–Forchheimer form has the aquifer dewatered at (x, y) (h² ≤ 0). */
export function dewatered(f: FlowField, conductivity: number, ref: HeadReference, x: number, y: number): boolean {
  return unconfinedSquare(f, conductivity, ref, x, y) <= 0;
}
