/**
 * The 7-point Gauss / 15-point Kronrod pair on [−1, 1] (nodes and weights as tabulated in
 * QUADPACK, Piessens et al. 1983, routine QK15; the Gauss–Legendre 7-point weights from
 * Abramowitz & Stegun 1964, Table 25.4). Nodes are listed for x ≥ 0; index 0 is the largest.
 * XGK[1], XGK[3], XGK[5] and XGK[7] = 0 are also the Gauss nodes.
 */
export const XGK = [
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851, 0.864864423359769072789712788640926,
  0.741531185599394439863864773280788, 0.58608723546769113029414483825873, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245, 0,
];
export const WGK = [
  0.02293532201052922496373200805897, 0.063092092629978553290700663189204, 0.104790010322250183839876322541518,
  0.140653259715525918745189590510238, 0.16900472663926790282658342659855, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
];
/** Gauss weights for XGK[1], XGK[3], XGK[5], XGK[7]. */
export const WG = [
  0.129484966168869693270611432679082, 0.27970539148927666790146777142378, 0.381830050505118944950369775488975,
  0.417959183673469387755102040816327,
];

/** The 15 nodes of a panel [a, b] in a fixed order: for k = 0..6: centre − h·XGK[k], centre + h·XGK[k]; then the centre. */
export function panelNodes(a: number, b: number, out: Float64Array): void {
  const c = 0.5 * (a + b);
  const h = 0.5 * (b - a);
  for (let k = 0; k < 7; k++) {
    out[2 * k] = c - h * XGK[k];
    out[2 * k + 1] = c + h * XGK[k];
  }
  out[14] = c;
}

/** Kronrod and Gauss weights in the same node order as panelNodes (Gauss weight 0 for Kronrod-only nodes). */
export const KRONROD_W = new Float64Array(15);
export const GAUSS_W = new Float64Array(15);
for (let k = 0; k < 7; k++) {
  KRONROD_W[2 * k] = WGK[k];
  KRONROD_W[2 * k + 1] = WGK[k];
  const g = k % 2 === 1 ? WG[(k - 1) / 2] : 0;
  GAUSS_W[2 * k] = g;
  GAUSS_W[2 * k + 1] = g;
}
KRONROD_W[14] = WGK[7];
GAUSS_W[14] = WG[3];
