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
 *
 * `confinedHeadLattice`: the confined head on a map lattice, each well's (and image's) distance
 * taken as at least a stated clip radius (field.ts `potential`): the head is exact outside every
 * well's clip circle and held at its value on the circle inside it, so a node on a well gives a
 * finite number, not the −∞ of the line sink.
 */
import { potential, type FlowField } from './field';
import { ValidationError, requireFinite, requireNonNegative, requirePositive } from '../validation';

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

/**
 * Confined heads h_ref + (Φ − Φ_ref)/(K·B) at every node (xs[i], ys[j]), in the core grid's layout
 * values[i·ys.length + j], with r ≥ clipRadius for every well and image (see the header; the
 * reference point's own potential is not clipped). Throws ValidationError for a non-finite node.
 */
export function confinedHeadLattice(
  f: FlowField,
  conductivity: number,
  ref: HeadReference,
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  clipRadius: number,
): Float64Array {
  check(conductivity, ref);
  requireNonNegative('clipRadius', clipRadius);
  const axis = (a: ArrayLike<number>, name: string) => {
    if (!a || typeof a.length !== 'number') throw new ValidationError(name, a, 'a list of coordinates');
    for (let k = 0; k < a.length; k++) requireFinite(`${name}[${k}]`, a[k]);
  };
  axis(xs, 'xs');
  axis(ys, 'ys');
  const T = conductivity * f.thickness;
  const phiRef = potential(f, ref.x, ref.y);
  const out = new Float64Array(xs.length * ys.length);
  for (let i = 0; i < xs.length; i++)
    for (let j = 0; j < ys.length; j++) out[i * ys.length + j] = ref.head + (potential(f, xs[i], ys[j], clipRadius) - phiRef) / T;
  return out;
}
