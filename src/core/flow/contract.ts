/**
 * The fixed external contract for wells (any consistent units).
 * - captureZoneSingleWell: Javandel & Tsang (1986, Ground Water 24(5)) for one well pumping Q in
 *   uniform flow of Darcy flux q in an aquifer of thickness B: stagnation point Q/(2πBq)
 *   downgradient of the well, capture width Q/(2Bq) through the well (across the flow) and Q/(Bq)
 *   far upgradient.
 * - wellFieldVelocity: the seepage velocity of the superposed field (field.ts) at (x, y), +x along
 *   the regional flow, rates > 0 for extraction.
 */
import { prepareFlow, velocity, type FlowBoundary, type FlowWell } from './field';
import { ValidationError, requireFinite, requirePositive } from '../validation';

export interface SingleWellInput {
  pumpingRate: number;
  thickness: number;
  darcyFlux: number;
}

export interface SingleWellCapture {
  stagnationDistance: number;
  widthAtWell: number;
  widthFarUpgradient: number;
}

export function captureZoneSingleWell(p: SingleWellInput): SingleWellCapture {
  if (p === null || typeof p !== 'object') throw new ValidationError('input', p, 'an object { pumpingRate, thickness, darcyFlux }');
  const Q = requirePositive('pumpingRate', p.pumpingRate);
  const B = requirePositive('thickness', p.thickness);
  const q = requirePositive('darcyFlux', p.darcyFlux);
  const u = Q / (B * q);
  return { stagnationDistance: u / (2 * Math.PI), widthAtWell: u / 2, widthFarUpgradient: u };
}

export interface WellFieldInput {
  x: number;
  y: number;
  darcyFlux: number;
  porosity: number;
  thickness: number;
  wells: readonly FlowWell[];
  /** optional straight boundaries (aquifer to the left of 1 → 2), see field.ts */
  boundaries?: readonly FlowBoundary[];
}

export function wellFieldVelocity(p: WellFieldInput): { vx: number; vy: number } {
  if (p === null || typeof p !== 'object') throw new ValidationError('input', p, 'an object');
  const x = requireFinite('x', p.x);
  const y = requireFinite('y', p.y);
  const o = { x: 0, y: 0 };
  velocity(prepareFlow(p), x, y, o);
  return { vx: o.x, vy: o.y };
}
