/**
 * Hydraulic gradient and flow direction from head readings in three or more wells: the plane
 * h = a·x + b·y + c fitted by least squares (exact through three points, the classical
 * "three-point problem"; e.g. Fetter 2001, Applied Hydrogeology, §5.4). Coordinates in metres
 * east (x) and north (y); heads in metres. Flow goes down the gradient, −∇h = −(a, b).
 * Azimuth in degrees clockwise from north, in [0, 360).
 *
 * Numerics: coordinates and heads are centred on their means before forming the 2×2 normal
 * equations, which keeps them well conditioned for map coordinates far from the origin.
 * Near-collinear wells (smallest/largest spread ratio below 0.05) give a warning; collinear ones
 * (ratio below 1e-9) cannot define a plane and throw.
 */
import { ValidationError, requireFinite, type Warning } from './validation';

export interface HeadPoint {
  x: number;
  y: number;
  head: number;
}

export interface HeadPlaneFit {
  gradient: number;
  azimuthDeg: number;
  /** observed − fitted head at each point, m (all 0 for three points) */
  residuals: number[];
  /** root-mean-square residual, m */
  rms: number;
  warnings: Warning[];
}

export function fitHeadPlane(points: HeadPoint[]): HeadPlaneFit {
  if (!Array.isArray(points) || points.length < 3)
    throw new ValidationError('headReadings', Array.isArray(points) ? points.length : points, 'at least 3 wells with heads');
  const n = points.length;
  let mx = 0;
  let my = 0;
  let mh = 0;
  points.forEach((p, i) => {
    requireFinite(`headReadings[${i}].x`, p?.x);
    requireFinite(`headReadings[${i}].y`, p?.y);
    requireFinite(`headReadings[${i}].head`, p?.head);
    mx += p.x;
    my += p.y;
    mh += p.head;
  });
  mx /= n;
  my /= n;
  mh /= n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  let sxh = 0;
  let syh = 0;
  for (const p of points) {
    const dx = p.x - mx;
    const dy = p.y - my;
    const dh = p.head - mh;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
    sxh += dx * dh;
    syh += dy * dh;
  }
  // spread of the well positions: eigenvalues of the 2×2 scatter matrix
  const tr = sxx + syy;
  const det = sxx * syy - sxy * sxy;
  const disc = Math.sqrt(Math.max(0, (tr * tr) / 4 - det));
  const lMax = tr / 2 + disc;
  const lMin = Math.max(0, tr / 2 - disc);
  const ratio = lMax > 0 ? Math.sqrt(lMin / lMax) : 0;
  if (!(ratio > 1e-9))
    throw new ValidationError('headReadings', 'collinear wells', 'wells not all on one line', 'the wells lie on one line (or coincide), so they cannot define the water-table plane; add a well off that line');
  const warnings: Warning[] = [];
  if (ratio < 0.05)
    warnings.push({
      code: 'heads-near-collinear',
      message: `The head wells lie nearly on one line (spread ratio ${ratio.toFixed(3)}); the flow direction across that line is poorly determined.`,
      field: 'headReadings',
    });
  const a = (sxh * syy - syh * sxy) / det;
  const b = (syh * sxx - sxh * sxy) / det;
  const residuals = points.map((p) => p.head - (mh + a * (p.x - mx) + b * (p.y - my)));
  const rms = Math.sqrt(residuals.reduce((s, r) => s + r * r, 0) / n);
  const gradient = Math.hypot(a, b);
  let azimuthDeg = 0;
  if (gradient > 0) {
    azimuthDeg = (Math.atan2(-a, -b) * 180) / Math.PI;
    if (azimuthDeg < 0) azimuthDeg += 360;
    if (azimuthDeg >= 360) azimuthDeg -= 360;
  } else {
    warnings.push({ code: 'heads-flat', message: 'The heads define a flat water table: no flow direction.', field: 'headReadings' });
  }
  return { gradient, azimuthDeg, residuals, rms, warnings };
}

/** The contract form: { gradient, azimuthDeg } only. */
export function threePointGradient(points: HeadPoint[]): { gradient: number; azimuthDeg: number } {
  const f = fitHeadPlane(points);
  return { gradient: f.gradient, azimuthDeg: f.azimuthDeg };
}
