/**
 * Independent high-precision evaluation of the Ogata–Banks (1961, USGS Prof. Paper 411-A)
 * solution with first-order decay, in the generalised form of van Genuchten & Alves (1982, USDA
 * Tech. Bull. 1661):
 *
 *   C/C0 = ½[exp(x(v−u)/(2D)) erfc((x − ut)/(2√(Dt))) + exp(x(v+u)/(2D)) erfc((x + ut)/(2√(Dt)))],
 *   u = v·√(1 + 4λD/v²) = √(v² + 4λD)
 *
 * with v and D divided by R (decay acting on dissolved and sorbed mass alike, λ not divided).
 * Evaluated literally, term by term, in decimal.js — exp(huge)·erfc(huge) is harmless there, so no
 * rearrangement of the engine's kind is involved. Also gives the condition number
 * κ = Σ_p |p ∂ln C/∂p| over the inputs (central differences in decimal), which bounds what any
 * double-precision evaluation can achieve: error ≲ ε·κ from the rounding of the inputs alone.
 */
import type Decimal from 'decimal.js';
import { erfcD, exactDecimal, makeDecimal, type DecimalCtor } from '../../../scripts/reference/decimal-special.mjs';

export interface ObInput {
  x: number;
  t: number;
  v: number;
  D: number;
  R?: number;
  decay?: number;
}

const Dec: DecimalCtor = makeDecimal(50);

interface DecInput {
  x: Decimal;
  t: Decimal;
  v: Decimal;
  D: Decimal;
  R: Decimal;
  decay: Decimal;
}

function toDec(p: ObInput): DecInput {
  return {
    x: exactDecimal(Dec, p.x),
    t: exactDecimal(Dec, p.t),
    v: exactDecimal(Dec, p.v),
    D: exactDecimal(Dec, p.D),
    R: exactDecimal(Dec, p.R ?? 1),
    decay: exactDecimal(Dec, p.decay ?? 0),
  };
}

/** The two terms of the solution (each already halved), for x > 0, t > 0, D > 0. */
export function ogataBanksTermsDec(q: DecInput): { first: Decimal; second: Decimal } {
  const v = q.v.div(q.R);
  const D = q.D.div(q.R);
  const u = v.times(v).plus(q.decay.times(D).times(4)).sqrt();
  const s = D.times(q.t).sqrt().times(2);
  const twoD = D.times(2);
  const first = q.x.times(v.minus(u)).div(twoD).exp().times(erfcD(Dec, q.x.minus(u.times(q.t)).div(s))).div(2);
  const second = q.x.times(v.plus(u)).div(twoD).exp().times(erfcD(Dec, q.x.plus(u.times(q.t)).div(s))).div(2);
  return { first, second };
}

export function ogataBanksDec(q: DecInput): Decimal {
  const { first, second } = ogataBanksTermsDec(q);
  return first.plus(second);
}

export interface ObReference {
  value: number;
  first: number;
  second: number;
  /** condition number Σ|p ∂lnC/∂p| (0 when C underflows in decimal too) */
  kappa: number;
}

/** Reference value at the exact binary64 inputs, with its condition number. */
export function ogataBanksReference(p: ObInput): ObReference {
  if (!(p.x > 0 && p.t > 0 && p.D > 0)) throw new Error('reference needs x > 0, t > 0, D > 0');
  const q = toDec(p);
  const { first, second } = ogataBanksTermsDec(q);
  const c = first.plus(second);
  let kappa = 0;
  if (c.gt(0)) {
    const h = new Dec('1e-18');
    const lnC = (qq: DecInput) => ogataBanksDec(qq).ln();
    for (const key of ['x', 't', 'v', 'D', 'R', 'decay'] as const) {
      if (q[key].isZero()) continue;
      if (key === 'R' && q.R.eq(1)) continue;
      const up = { ...q, [key]: q[key].times(new Dec(1).plus(h)) };
      const dn = { ...q, [key]: q[key].times(new Dec(1).minus(h)) };
      kappa += lnC(up).minus(lnC(dn)).div(h.times(2)).abs().toNumber();
    }
  }
  return { value: c.toNumber(), first: first.toNumber(), second: second.toNumber(), kappa };
}
