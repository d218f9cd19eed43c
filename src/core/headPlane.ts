/**
 * Hydraulic gradient and flow direction from head readings in three or more wells: the plane
 * h = a·x + b·y + c fitted by least squares (exact through three points, the classical
 * "three-point problem"; e.g. Fetter 2001, Applied Hydrogeology, §5.4). Coordinates in metres
 * east (x) and north (y); heads in metres. Flow goes down the gradient, −∇h = −(a, b).
 * Azimuth in degrees clockwise from north, in [0, 360).
 *
 * Numerics: coordinates and heads are centred on their means before forming the 2×2 normal
 * equations, which keeps them well conditioned for map coordinates far from the origin.
 * Collinear wells (the spread across their line below COLLINEAR_RATIO of the spread along it:
 * 1 mm in 10 m, below what positions are known to) cannot define a plane and throw. Nearly
 * collinear wells (ratio below NEAR_COLLINEAR_RATIO) give a warning that states how uncertain the
 * flow direction is: the standard error of the azimuth from the fit's covariance (below) for a
 * head error of HEAD_SIGMA_M.
 *
 * Covariance (ordinary least squares, e.g. Draper & Smith, Applied Regression Analysis, §5): with
 * independent head errors of standard deviation σ, cov(a, b) = σ²·S⁻¹, S the centred scatter
 * matrix [[Σdx², Σdxdy], [Σdxdy, Σdy²]]. The azimuth θ = atan2(−a, −b) has dθ = (b·da − a·db)/g²,
 * so var θ ≈ [b, −a]·cov·[b, −a]ᵀ / g⁴ (first order; large when g is small or S nearly singular).
 */
import { ValidationError, requireFinite, type Warning } from './validation';

export interface HeadPoint {
  x: number;
  y: number;
  head: number;
}

export interface HeadPlaneFit {
  /** the fitted slope of h = a·x + b·y + c: a = ∂h/∂x (east), b = ∂h/∂y (north) */
  a: number;
  b: number;
  gradient: number;
  azimuthDeg: number;
  /** observed − fitted head at each point, m (all 0 for three points) */
  residuals: number[];
  /** root-mean-square residual, m */
  rms: number;
  warnings: Warning[];
}

/** below this ratio of across-line to along-line spread the wells are taken as on one line */
export const COLLINEAR_RATIO = 1e-4;
/** below this ratio the direction is reported with its uncertainty */
export const NEAR_COLLINEAR_RATIO = 0.2;
/** head error assumed for the reported direction uncertainty: 1 cm (common practice for a tape or transducer reading; from memory) */
export const HEAD_SIGMA_M = 0.01;

/** Centred scatter sums of the well positions (and heads), as the fit and its covariance use them. */
function scatter(points: HeadPoint[]) {
  const n = points.length;
  let mx = 0, my = 0, mh = 0;
  for (const p of points) (mx += p.x), (my += p.y), (mh += p.head);
  mx /= n;
  my /= n;
  mh /= n;
  let sxx = 0, sxy = 0, syy = 0, sxh = 0, syh = 0;
  for (const p of points) {
    const dx = p.x - mx, dy = p.y - my, dh = p.head - mh;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
    sxh += dx * dh;
    syh += dy * dh;
  }
  return { mx, my, mh, sxx, sxy, syy, sxh, syh, det: sxx * syy - sxy * sxy };
}

/**
 * Covariance of the fitted gradient components (a = ∂h/∂x, b = ∂h/∂y), in (m/m)², for independent
 * head errors of standard deviation `sigmaHead` (m): σ²·S⁻¹ as [[var a, cov], [cov, var b]].
 * Pure; the uncertainty of the flow direction and of the gradient follows from it.
 */
export function headPlaneCovariance(points: HeadPoint[], sigmaHead: number): [[number, number], [number, number]] {
  const { sxx, sxy, syy, det } = scatter(points);
  const k = (sigmaHead * sigmaHead) / det;
  return [
    [k * syy, -k * sxy],
    [-k * sxy, k * sxx],
  ];
}

/** Standard error of the flow azimuth, degrees (first order), for gradient (a, b) and its covariance. */
export function azimuthStdErrorDeg(a: number, b: number, cov: [[number, number], [number, number]]): number {
  const g2 = a * a + b * b;
  const v = (b * b * cov[0][0] - 2 * a * b * cov[0][1] + a * a * cov[1][1]) / (g2 * g2);
  return (Math.sqrt(Math.max(0, v)) * 180) / Math.PI;
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
  if (!(ratio > COLLINEAR_RATIO))
    throw new ValidationError('headReadings', 'collinear wells', 'wells not all on one line', 'the wells lie on one line (or coincide), so they cannot define the water-table plane and the flow direction is undetermined; add a well off that line');
  const warnings: Warning[] = [];
  const a = (sxh * syy - syh * sxy) / det;
  const b = (syh * sxx - sxh * sxy) / det;
  if (ratio < NEAR_COLLINEAR_RATIO && (a !== 0 || b !== 0)) {
    const se = azimuthStdErrorDeg(a, b, headPlaneCovariance(points, HEAD_SIGMA_M));
    warnings.push({
      code: 'heads-near-collinear',
      message: `The water-level wells lie nearly on one line (spread across it ${(ratio * 100).toPrecision(2)} % of the spread along it), so the flow direction is uncertain: ±${se >= 1 ? se.toFixed(0) : se.toPrecision(2)}° (one standard error for a 1 cm error in each water level). Add a well off that line.`,
      field: 'headReadings',
    });
  }
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
  return { a, b, gradient, azimuthDeg, residuals, rms, warnings };
}

/** The contract form: { gradient, azimuthDeg } only. */
export function threePointGradient(points: HeadPoint[]): { gradient: number; azimuthDeg: number } {
  const f = fitHeadPlane(points);
  return { gradient: f.gradient, azimuthDeg: f.azimuthDeg };
}
