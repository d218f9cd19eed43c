/**
 * Local east/north metres ↔ the flow-aligned frame of the solutions.
 *
 * The flow runs towards azimuth θ (degrees clockwise from north). Downgradient unit vector
 * d = (sin θ, cos θ) in (east, north); the across-flow unit vector l = (−cos θ, sin θ) is d turned
 * 90° counter-clockwise, i.e. positive to the left looking downgradient. Both frames are
 * right-handed, so the map is a rotation about the source point plus a translation; toFlow and
 * fromFlow are exact inverses up to rounding.
 */
import { sinCosDeg } from './angles';

export interface FlowPoint {
  /** distance downgradient from the source point, m */
  x: number;
  /** distance across the flow, positive to the left looking downgradient, m */
  y: number;
}

function checkPair(p: readonly number[], what: string): void {
  if (!Array.isArray(p) || p.length < 2 || !Number.isFinite(p[0]) || !Number.isFinite(p[1]))
    throw new RangeError(`${what} must be a pair of finite [east, north] metres, got ${JSON.stringify(p)}`);
}

/** [e, n] → flow frame {x, y} about the source at sourceEN */
export function toFlow(
  sourceEN: readonly [number, number],
  azimuthDeg: number,
  pointEN: readonly [number, number],
): FlowPoint {
  checkPair(sourceEN, 'source position');
  checkPair(pointEN, 'point position');
  const [s, c] = sinCosDeg(azimuthDeg);
  const de = pointEN[0] - sourceEN[0];
  const dn = pointEN[1] - sourceEN[1];
  return { x: de * s + dn * c, y: -de * c + dn * s };
}

/** flow frame {x, y} about the source at sourceEN → [e, n] */
export function fromFlow(
  sourceEN: readonly [number, number],
  azimuthDeg: number,
  p: Readonly<FlowPoint>,
): [number, number] {
  checkPair(sourceEN, 'source position');
  if (!p || !Number.isFinite(p.x) || !Number.isFinite(p.y))
    throw new RangeError(`flow-frame point must have finite x and y, got ${JSON.stringify(p)}`);
  const [s, c] = sinCosDeg(azimuthDeg);
  return [sourceEN[0] + p.x * s - p.y * c, sourceEN[1] + p.x * c + p.y * s];
}
