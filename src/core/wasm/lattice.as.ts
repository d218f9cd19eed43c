/**
 * AssemblyScript port of the lattice error function (special/erfLattice.ts) and of the lateral
 * rows built from it (solutions/spread.ts, lateralLattice), compiled to WebAssembly by
 * scripts/build-wasm.mjs into special/latticeWasm.ts. The TypeScript modules stay the reference
 * and the fallback; this port performs the same floating-point operations in the same order, with
 * fdlibm's exp (V8's Math.exp), so on V8 its results are bit for bit those of the TypeScript code
 * (test/core/lattice-wasm.test.ts checks that on a million lattice values, 1500 rows and whole
 * grids). It exists for speed only: two runs of the lattice step in the lanes of 128-bit SIMD, no
 * bounds checks, no boxed numbers, no deoptimisation.
 *
 * Memory (byte offsets, fixed; written by the host at start-up, see special/latticeKernel.ts):
 *   TABLE_AT   the erf/erfc Taylor table of erfTable.ts (NODES·STRIDE doubles)
 *   RULES_AT   per rule r (4, 6, 8 points): nodes c[8], weights w[8]
 *   STEP_AT    the largest step per rule on a grid of |t| (erfLattice.ts's STEP_MAX)
 *   DVAL_AT …  the D_k caches, the row's cut points, the lanes (LANES_AT), the paired run queue
 *              (QUEUE_AT): state of this module, not read by the host
 *   EXPC_AT    expPair's vector constants (stored by reset())
 *   PAIRS_AT   the two lanes' vector state, interleaved (P_k, B_k, e^{−2s²})
 *   WORK_AT    three work arrays of `cap` doubles each: A, B (lattice values), ROW (the output row)
 * Not part of the TypeScript build (tsconfig excludes src/core/wasm).
 */

// ---- exp: fdlibm's __ieee754_exp (Sun Microsystems 1993, freely distributable), the algorithm
// of V8's Math.exp (v8/src/base/ieee754.cc), so both give the same bits (the test compares them on
// 300 000 seeded arguments and the edge cases)

const LN2_HI: f64 = 6.93147180369123816490e-01;
const LN2_LO: f64 = 1.90821492927058770002e-10;
const INV_LN2: f64 = 1.44269504088896338700e+00;
const EXP_P1: f64 = 1.66666666666666019037e-01;
const EXP_P2: f64 = -2.77777777770155933842e-03;
const EXP_P3: f64 = 6.61375632143793436117e-05;
const EXP_P4: f64 = -1.65339022054652515390e-06;
const EXP_P5: f64 = 4.13813679705723846039e-08;
const O_THRESHOLD: f64 = 7.09782712893383973096e+02;
const U_THRESHOLD: f64 = -7.45133219101941108420e+02;
const TWO_M1000: f64 = 9.33263618503218878990e-302;
const EXP_TINY: f64 = 3.725290298461914e-9; // 2⁻²⁸
const EXP_ORDINARY: f64 = 707;

export function fdlibmExp(x: f64): f64 {
  const bits = reinterpret<u64>(x);
  let hx = <u32>(bits >> 32);
  const xsb = hx >> 31;
  hx &= 0x7fffffff;
  let hi: f64 = 0;
  let lo: f64 = 0;
  let k: i32 = 0;
  if (hx >= 0x40862e42) {
    if (hx >= 0x7ff00000) {
      if (((hx & 0xfffff) | <u32>bits) != 0) return x + x;
      return xsb == 0 ? x : 0.0;
    }
    if (x > O_THRESHOLD) return Infinity;
    if (x < U_THRESHOLD) return 0;
  }
  if (hx > 0x3fd62e42) {
    if (hx < 0x3ff0a2b2) {
      if (x == 1.0) return 2.718281828459045;
      hi = x - (xsb == 0 ? LN2_HI : -LN2_HI);
      lo = xsb == 0 ? LN2_LO : -LN2_LO;
      k = 1 - <i32>xsb - <i32>xsb;
    } else {
      k = <i32>(INV_LN2 * x + (xsb == 0 ? 0.5 : -0.5));
      const t = <f64>k;
      hi = x - t * LN2_HI;
      lo = t * LN2_LO;
    }
    x = hi - lo;
  } else if (hx < 0x3e300000) {
    if (1e300 + x > 1) return 1 + x;
  } else k = 0;
  const t = x * x;
  const twopk = k >= -1021 ? reinterpret<f64>(<u64>(0x3ff + k) << 52) : reinterpret<f64>(<u64>(0x3ff + k + 1000) << 52);
  const c = x - t * (EXP_P1 + t * (EXP_P2 + t * (EXP_P3 + t * (EXP_P4 + t * EXP_P5))));
  if (k == 0) return 1 - ((x * c) / (c - 2.0) - x);
  const y = 1 - ((lo - (x * c) / (2.0 - c)) - hi);
  if (k >= -1021) {
    if (k == 1024) return y * 2.0 * 8.98846567431157953865e+307;
    return y * twopk;
  }
  return y * twopk * TWO_M1000;
}

/**
 * fdlibmExp on both lanes of an f64x2, the same bits lane by lane. Where both arguments are
 * ordinary (2⁻²⁸ ≤ |x| ≤ 707, x ≠ 1, so the reduction's k lies in [−1020, 1020] and no branch of
 * fdlibmExp but its main one is taken) the lanes are computed together: fdlibm's k = 0 branch
 * (|x| ≤ ½ln2), 1 − ((x·c)/(c − 2) − x), is the main branch's 1 − ((lo − (x·c)/(2 − c)) − hi) with
 * hi = x, lo = 0 exactly (division is symmetric in sign), and its |x| < 1.5·ln2 branch sets the k,
 * hi and lo the main branch's truncation gives there. Otherwise each lane goes to fdlibmExp.
 */
@inline function expPair(x: v128): v128 {
  const ax = f64x2.abs(x);
  const ordinary = v128.and(v128.and(f64x2.ge(ax, v128.load(X_TINY)), f64x2.le(ax, v128.load(X_ORDINARY))), f64x2.ne(x, v128.load(X_ONE)));
  if (!i64x2.all_true(ordinary)) return f64x2(fdlibmExp(f64x2.extract_lane(x, 0)), fdlibmExp(f64x2.extract_lane(x, 1)));
  // |x| > ½ln2 in fdlibm's test of the high word: hx > 0x3fd62e42
  const reduce = f64x2.ge(ax, v128.load(X_HALF_LN2));
  const half = v128.or(v128.load(X_HALF), v128.and(x, v128.load(X_SIGN)));
  const t = v128.and(f64x2.trunc(f64x2.add(f64x2.mul(v128.load(X_INV_LN2), x), half)), reduce);
  const hi = f64x2.sub(x, f64x2.mul(t, v128.load(X_LN2_HI)));
  const lo = f64x2.mul(t, v128.load(X_LN2_LO));
  const r = f64x2.sub(hi, lo);
  const tt = f64x2.mul(r, r);
  let q = f64x2.add(v128.load(X_P4), f64x2.mul(tt, v128.load(X_P5)));
  q = f64x2.add(v128.load(X_P3), f64x2.mul(tt, q));
  q = f64x2.add(v128.load(X_P2), f64x2.mul(tt, q));
  q = f64x2.add(v128.load(X_P1), f64x2.mul(tt, q));
  const c = f64x2.sub(r, f64x2.mul(tt, q));
  const y = f64x2.sub(v128.load(X_ONE), f64x2.sub(f64x2.sub(lo, f64x2.div(f64x2.mul(r, c), f64x2.sub(v128.load(X_TWO), c))), hi));
  const k = i64x2.extend_low_i32x4_s(i32x4.trunc_sat_f64x2_s_zero(t));
  return f64x2.mul(y, i64x2.shl(i64x2.add(k, v128.load(X_BIAS)), 52));
}

/** expPair for the host's test: e^a into WORK_AT, e^b after it. */
export function expPairAt(a: f64, b: f64): void {
  v128.store(WORK_AT, expPair(f64x2(a, b)));
}

/** the first 64 KiB are left to the compiler's own static data */
const TABLE_AT: usize = 65536;
const INV_H: f64 = 128;
const H: f64 = 1.0 / 128;
const STRIDE: i32 = 9;
const NODES: i32 = 1280;
const SPLIT_NODE: i32 = 64;
const ERF_TABLE_SPLIT: f64 = (<f64>SPLIT_NODE - 0.5) / INV_H;
const TABLE_TOP: f64 = (<f64>NODES - 0.5) / INV_H;
const RULES_AT: usize = TABLE_AT + <usize>(NODES * STRIDE) * 8;
/** the largest step per rule on the |t| grid (erfLattice.ts's STEP_MAX): 3 rules × STEP_POINTS */
const STEP_AT: usize = RULES_AT + 3 * 16 * 8;
const STEP_CELLS: f64 = 16;
const STEP_TOP: f64 = 14;
const STEP_POINTS: i32 = 14 * 16 + 1;
const STEP_END: usize = STEP_AT + <usize>(3 * STEP_POINTS) * 8;
/** D_k per rule (8 slots each), the s² each was formed for (3), the row's cut points (6 × i32) */
const DVAL_AT: usize = (STEP_END + 15) & ~15;
const DSTEP_AT: usize = DVAL_AT + 24 * 8;
const CUTS_AT: usize = DSTEP_AT + 3 * 8;
const WORK_AT: usize = 196608;
/**
 * The two lanes' vector state, interleaved so that the lane loops load and store it as vectors
 * (lane A low, lane B high): P_k at PAIRS_AT + 16k, B_k at PAIRS_AT + 128 + 16k, e^{−2s²} twice at
 * PAIRS_AT + 256. (A vector built from two scalars is a pure value that V8 11 rebuilds inside the
 * loop, two shuffles per factor and step; a load stays a load.)
 */
const PAIRS_AT: usize = WORK_AT - 512;
const Q2_AT: usize = PAIRS_AT + 256;

const LATTICE_CUT: f64 = 10;
const CHUNK: i32 = 64;
const SEGMENT: i32 = 192;
const EXP_ROOM: f64 = 600;
const TWO_OVER_SQRT_PI: f64 = 1.1283791670955126;
const S: f64 = ERF_TABLE_SPLIT;
const INV_SQRT_PI: f64 = 0.56418958354775628695;
const XBIG: f64 = 26.543;
const XHUGE: f64 = 6.71e7;

let cap: i32 = 0;

/** Capacity of each work array in doubles (the host grows memory first). */
export function setCapacity(n: i32): void {
  cap = n;
}
export function workOffset(): usize {
  return WORK_AT;
}
/** Marks the D_k caches empty (the host calls it after writing the rules). */
/**
 * The vector constants of expPair (and nearZero's coefficients), stored once by reset(): loaded from memory they cost one load
 * each where V8 11 would build each splat anew (three instructions) at every use.
 */
const EXPC_AT: usize = 180224;
const X_TINY: usize = EXPC_AT + 0;
const X_ORDINARY: usize = EXPC_AT + 16;
const X_ONE: usize = EXPC_AT + 32;
const X_HALF_LN2: usize = EXPC_AT + 48;
const X_HALF: usize = EXPC_AT + 64;
const X_SIGN: usize = EXPC_AT + 80;
const X_INV_LN2: usize = EXPC_AT + 96;
const X_LN2_HI: usize = EXPC_AT + 112;
const X_LN2_LO: usize = EXPC_AT + 128;
const X_P5: usize = EXPC_AT + 144;
const X_P4: usize = EXPC_AT + 160;
const X_P3: usize = EXPC_AT + 176;
const X_P2: usize = EXPC_AT + 192;
const X_P1: usize = EXPC_AT + 208;
const X_TWO: usize = EXPC_AT + 224;
const X_BIAS: usize = EXPC_AT + 240;
/** nearZero's twelve coefficients, as pairs */
const X_E0: usize = EXPC_AT + 256;
function storeExpConstants(): void {
  v128.store(X_TINY, f64x2.splat(EXP_TINY));
  v128.store(X_ORDINARY, f64x2.splat(EXP_ORDINARY));
  v128.store(X_ONE, f64x2.splat(1.0));
  v128.store(X_HALF_LN2, f64x2.splat(reinterpret<f64>(<u64>0x3fd62e4300000000)));
  v128.store(X_HALF, f64x2.splat(0.5));
  v128.store(X_SIGN, i64x2.splat(0x8000000000000000));
  v128.store(X_INV_LN2, f64x2.splat(INV_LN2));
  v128.store(X_LN2_HI, f64x2.splat(LN2_HI));
  v128.store(X_LN2_LO, f64x2.splat(LN2_LO));
  v128.store(X_P5, f64x2.splat(EXP_P5));
  v128.store(X_P4, f64x2.splat(EXP_P4));
  v128.store(X_P3, f64x2.splat(EXP_P3));
  v128.store(X_P2, f64x2.splat(EXP_P2));
  v128.store(X_P1, f64x2.splat(EXP_P1));
  v128.store(X_TWO, f64x2.splat(2.0));
  v128.store(X_BIAS, i64x2.splat(0x3ff));
  const e: StaticArray<f64> = [E0, E1, E2, E3, E4, E5, E6, E7, E8, E9, E10, E11];
  for (let k = 0; k < 12; k++) v128.store(X_E0 + (<usize>k << 4), f64x2.splat(unchecked(e[k])));
}

export function reset(): void {
  storeExpConstants();
  for (let r = 0; r < 3; r++) store<f64>(DSTEP_AT + (<usize>r << 3), NaN);
  gS2 = NaN;
}
export function tableOffset(): usize {
  return TABLE_AT;
}
export function rulesOffset(): usize {
  return RULES_AT;
}
export function stepTableOffset(): usize {
  return STEP_AT;
}

@inline function tab(k: i32): f64 {
  return load<f64>(TABLE_AT + (<usize>k << 3));
}
@inline function ruleC(r: i32, k: i32): f64 {
  return load<f64>(RULES_AT + (<usize>(r * 16 + k) << 3));
}
@inline function ruleW(r: i32, k: i32): f64 {
  return load<f64>(RULES_AT + (<usize>(r * 16 + 8 + k) << 3));
}
@inline function ruleM(r: i32): i32 {
  return 4 + 2 * r;
}

// ---- Cody's erfc pieces (special/erf.ts), for the table's top and the points past the cut

function erfcxMid(y: f64): f64 {
  let num: f64 = 2.15311535474403846e-8 * y;
  let den: f64 = y;
  num = (num + 0.564188496988670089) * y;
  den = (den + 15.7449261107098347) * y;
  num = (num + 8.88314979438837594) * y;
  den = (den + 117.693950891312499) * y;
  num = (num + 66.1191906371416295) * y;
  den = (den + 537.181101862009858) * y;
  num = (num + 298.635138197400131) * y;
  den = (den + 1621.38957456669019) * y;
  num = (num + 881.95222124176909) * y;
  den = (den + 3290.79923573345963) * y;
  num = (num + 1712.04761263407058) * y;
  den = (den + 4362.61909014324716) * y;
  num = (num + 2051.07837782607147) * y;
  den = (den + 3439.36767414372164) * y;
  return (num + 1230.33935479799725) / (den + 1230.33935480374942);
}

function erfcxLarge(y: f64): f64 {
  if (y >= XHUGE) return INV_SQRT_PI / y;
  const z = 1 / (y * y);
  let num: f64 = 0.0163153871373020978 * z;
  let den: f64 = z;
  num = (num + 0.305326634961232344) * z;
  den = (den + 2.56852019228982242) * z;
  num = (num + 0.360344899949804439) * z;
  den = (den + 1.87295284992346047) * z;
  num = (num + 0.125781726111229246) * z;
  den = (den + 0.527905102951428412) * z;
  num = (num + 0.0160837851487422766) * z;
  den = (den + 0.0605183413124413191) * z;
  const r = (z * (num + 6.58749161529837803e-4)) / (den + 0.00233520497626869185);
  return (INV_SQRT_PI - r) / y;
}

/** erfcxLarge on both lanes (4 < y < XHUGE in each), the same operations lane by lane */
@inline function erfcxLargePair(y: v128): v128 {
  const z = f64x2.div(f64x2.splat(1), f64x2.mul(y, y));
  let num = f64x2.mul(f64x2.splat(0.0163153871373020978), z);
  let den = z;
  num = f64x2.mul(f64x2.add(num, f64x2.splat(0.305326634961232344)), z);
  den = f64x2.mul(f64x2.add(den, f64x2.splat(2.56852019228982242)), z);
  num = f64x2.mul(f64x2.add(num, f64x2.splat(0.360344899949804439)), z);
  den = f64x2.mul(f64x2.add(den, f64x2.splat(1.87295284992346047)), z);
  num = f64x2.mul(f64x2.add(num, f64x2.splat(0.125781726111229246)), z);
  den = f64x2.mul(f64x2.add(den, f64x2.splat(0.527905102951428412)), z);
  num = f64x2.mul(f64x2.add(num, f64x2.splat(0.0160837851487422766)), z);
  den = f64x2.mul(f64x2.add(den, f64x2.splat(0.0605183413124413191)), z);
  const r = f64x2.div(f64x2.mul(z, f64x2.add(num, f64x2.splat(6.58749161529837803e-4))), f64x2.add(den, f64x2.splat(0.00233520497626869185)));
  return f64x2.div(f64x2.sub(f64x2.splat(INV_SQRT_PI), r), y);
}

/** erfc(y), y above the table's top (> 4): Cody's split exponential, as erf.ts's erfc. */
function erfcAboveTable(y: f64): f64 {
  if (y >= XBIG) return 0;
  const ys = Math.floor(y * 16) / 16;
  const del = (y - ys) * (y + ys);
  return fdlibmExp(-ys * ys) * fdlibmExp(-del) * erfcxLarge(y);
}

/** erf.ts's erfcTail (single exponential), y ≥ 0.46875. */
function erfcTail(y: f64): f64 {
  if (y >= XBIG) return 0;
  return fdlibmExp(-y * y) * (y <= 4 ? erfcxMid(y) : erfcxLarge(y));
}

// ---- erfTable.ts

function tablePoly(x: f64): f64 {
  const k = <i32>(x * INV_H + 0.5);
  const d = x - <f64>k * H;
  const b = k * STRIDE;
  const d2 = d * d;
  const d4 = d2 * d2;
  const p01 = tab(b) + tab(b + 1) * d;
  const p23 = tab(b + 2) + tab(b + 3) * d;
  const p45 = tab(b + 4) + tab(b + 5) * d;
  const p67 = tab(b + 6) + tab(b + 7) * d;
  const p03 = p01 + p23 * d2;
  const p47 = p45 + p67 * d2;
  return p03 + (p47 + tab(b + 8) * d4) * d4;
}

function splitValue(y: f64): f64 {
  return y < TABLE_TOP ? tablePoly(y) : erfcAboveTable(y);
}

// ---- erfLattice.ts

let gS2: f64 = NaN;
let gQr0: f64 = 0;
let gQ2: f64 = 0;

@inline function dVal(i: i32): f64 {
  return load<f64>(DVAL_AT + (<usize>i << 3));
}

function ruleFor(delta: f64, tmax: f64): i32 {
  if (!(tmax <= STEP_TOP)) return -1;
  const g = <i32>Math.ceil(tmax * STEP_CELLS);
  for (let r = 0; r < 3; r++) if (delta <= load<f64>(STEP_AT + (<usize>(r * STEP_POINTS + g) << 3))) return r;
  return -1;
}

function roomFor(delta: f64, tmax: f64): f64 {
  return Math.min(Math.sqrt(EXP_ROOM) / delta, EXP_ROOM / (2 * tmax * delta));
}

@inline function outAt(base: usize, o: i32): usize {
  return base + (<usize>o << 3);
}

function pointValue(u: f64): f64 {
  const y = Math.abs(u);
  const v = y > LATTICE_CUT ? erfcTail(y) : splitValue(y);
  return y < S && u < 0 ? -v : v;
}

/**
 * One run of erfLattice.ts's `run` as a resumable state machine ("lane"), so that two runs can
 * share the vector kernel below, one per lane of an f64x2. A lane takes exactly the seeds, chunks
 * and step sequence the scalar run takes; only the steps of two lanes are interleaved.
 */
@unmanaged class Lane {
  w0: f64;
  s: f64;
  as: f64;
  scale: f64;
  t0: f64;
  val: f64;
  Q: f64;
  Qr: f64;
  base: usize;
  ptr: usize;
  dp: isize;
  count: i32;
  i0: i32;
  di: i32;
  /** index of the point the last write reached */
  p: i32;
  /** steps since the segment's seed */
  J: i32;
  /** steps of the current segment still to take (0: an event is due) */
  pending: i32;
  /** steps of the current chunk still to take, the chunk's index and the segment's chunk count */
  chunkLeft: i32;
  chunk: i32;
  chunks: i32;
  /** rule of the segment, −1 outside one */
  rule: i32;
  /** 0 idle, 1 running */
  busy: i32;
}

const LANE_SIZE: usize = 256;
/** per lane: the Lane fields, then the segment's chunks (planSegment): Q at +128, Qr at +160 (4 doubles each), steps at +192 (4 × i32) */
const LANES_AT: usize = CUTS_AT + 64;
const laneA = changetype<Lane>(LANES_AT);
const laneB = changetype<Lane>(LANES_AT + LANE_SIZE);
/** where an idle lane's values land (one unused slot) */
const IDLE_SLOT: usize = LANES_AT + 3 * LANE_SIZE;

@inline function laneHalf(l: Lane): usize {
  return changetype<usize>(l) == LANES_AT ? 0 : 8;
}
@inline function laneP(l: Lane, k: i32): usize {
  return PAIRS_AT + (<usize>k << 4) + laneHalf(l);
}
@inline function laneB_(l: Lane, k: i32): usize {
  return PAIRS_AT + 128 + (<usize>k << 4) + laneHalf(l);
}

function startLane(l: Lane, w0: f64, s: f64, count: i32, base: usize, i0: i32, di: i32): void {
  l.w0 = w0;
  l.s = s;
  l.as = Math.abs(s);
  l.scale = TWO_OVER_SQRT_PI * l.as;
  l.base = base;
  l.count = count;
  l.i0 = i0;
  l.di = di;
  l.dp = <isize>di << 3;
  l.p = 0;
  l.J = 0;
  l.pending = 0;
  l.rule = -1;
  l.busy = 1;
}

/** P_k = w_k·e^{−(w + c_k s)²}, B_k = e^{−2ws}·D_k, zero beyond the rule's m (as erfLattice.ts's seedNodes). */
function seedLane(l: Lane, r: i32, w: f64, s: f64): void {
  const m = ruleM(r);
  const s2 = s * s;
  const stepAt = DSTEP_AT + (<usize>r << 3);
  if (load<f64>(stepAt) != s2) {
    for (let k = 0; k < m; k += 2) v128.store(DVAL_AT + (<usize>(r * 8 + k) << 3), expPair(f64x2(-2 * ruleC(r, k) * s2, -2 * ruleC(r, k + 1) * s2)));
    store<f64>(stepAt, s2);
  }
  const E = fdlibmExp(-2 * w * s);
  for (let k = 0; k < 8; k += 2) {
    if (k < m) {
      const a = w + ruleC(r, k) * s;
      const b = w + ruleC(r, k + 1) * s;
      const g = expPair(f64x2(-a * a, -b * b));
      store<f64>(laneP(l, k), ruleW(r, k) * f64x2.extract_lane(g, 0));
      store<f64>(laneP(l, k + 1), ruleW(r, k + 1) * f64x2.extract_lane(g, 1));
      store<f64>(laneB_(l, k), E * dVal(r * 8 + k));
      store<f64>(laneB_(l, k + 1), E * dVal(r * 8 + k + 1));
    } else {
      store<f64>(laneP(l, k), 0);
      store<f64>(laneP(l, k + 1), 0);
      store<f64>(laneB_(l, k), 1);
      store<f64>(laneB_(l, k + 1), 1);
    }
  }
}

@inline function chunkQ(l: Lane, c: i32): usize {
  return changetype<usize>(l) + 128 + (<usize>c << 3);
}
@inline function chunkQr(l: Lane, c: i32): usize {
  return changetype<usize>(l) + 160 + (<usize>c << 3);
}
@inline function chunkSteps(l: Lane, c: i32): usize {
  return changetype<usize>(l) + 192 + (<usize>c << 2);
}

/**
 * The whole segment a seed starts, planned at once: its first chunk of `first` steps (Q = scale,
 * Qr = e^{−s²}), then the chunks erfLattice.ts's `run` continues with while the rule stays the
 * same, the carried factors keep their room and the segment stays within SEGMENT steps, each with
 * the fresh Q = scale·e^{−s²J²} and Qr = e^{−s²(2J+1)} of erfLattice.ts's gaussAt at its J (they
 * depend on nothing the steps change). The lane loops switch to them at the chunk ends without
 * leaving the loop. At most four chunks: after the first, each is CHUNK steps long unless the run
 * or the segment ends with it.
 */
function planSegment(l: Lane, first: i32): void {
  store<i32>(chunkSteps(l, 0), first);
  let total = first;
  let n = 1;
  let p = l.p + first;
  let J = first;
  const count = l.count;
  const s = l.s;
  const as = l.as;
  while (n < 4 && p < count - 1 && J < SEGMENT) {
    const steps = min(min(count - 1 - p, CHUNK), SEGMENT - J);
    const tEnd = Math.abs(l.w0 + <f64>(p + steps) * s);
    if (ruleFor(as, Math.max(Math.abs(l.w0 + <f64>p * s), tEnd) + as) != l.rule) break;
    if (<f64>(J + steps) > roomFor(as, Math.max(l.t0, tEnd) + as)) break;
    const Jf = <f64>J;
    const g = expPair(f64x2(-gS2 * Jf * Jf, -gS2 * (2 * Jf + 1)));
    store<f64>(chunkQ(l, n), l.scale * f64x2.extract_lane(g, 0));
    store<f64>(chunkQr(l, n), f64x2.extract_lane(g, 1));
    store<i32>(chunkSteps(l, n), steps);
    n++;
    total += steps;
    p += steps;
    J += steps;
  }
  l.chunks = n;
  l.chunk = 0;
  l.chunkLeft = first;
  l.pending = total;
}

/**
 * At a chunk end in the lane loops (na, nb: the next chunk's steps of the lane whose chunk ended,
 * else 0): Q (at = 0) or Qr (at = 32) with that lane's fresh value from planSegment.
 */
@inline function chunkStart(v: v128, a: Lane, b: Lane, na: i32, nb: i32, at: usize): v128 {
  if (na > 0 && na < 1 << 30) v = f64x2.replace_lane(v, 0, load<f64>(chunkQ(a, a.chunk) + at));
  if (nb > 0 && nb < 1 << 30) v = f64x2.replace_lane(v, 1, load<f64>(chunkQ(b, b.chunk) + at));
  return v;
}

/** at a lane's chunk end in the lane loops: the next chunk's steps, or 1 << 30 at the segment's end */
@inline function nextChunk(l: Lane): i32 {
  const c = l.chunk + 1;
  if (c >= l.chunks) return 1 << 30;
  l.chunk = c;
  return load<i32>(chunkSteps(l, c));
}

/**
 * Handles a lane's due event (seed, point-by-point chunk, next chunk of a segment or the end)
 * until it has kernel steps pending or is finished; the same decisions, in the same order, as
 * erfLattice.ts's `run`.
 */
function advance(l: Lane): void {
  while (l.busy != 0 && l.pending == 0) {
    const s = l.s;
    const as = l.as;
    const count = l.count;
    const p = l.p;
    if (p >= count) {
      l.busy = 0;
      return;
    }
    const ws = l.w0 + <f64>p * s;
    const o = l.i0 + p * l.di;
    const val = splitValue(Math.abs(ws));
    store<f64>(outAt(l.base, o), val);
    if (p == count - 1) {
      l.busy = 0;
      return;
    }
    const t0 = Math.abs(ws);
    let len = min(count - 1 - p, CHUNK);
    const tmax = Math.max(t0, Math.abs(l.w0 + <f64>(p + len) * s)) + as;
    const room = roomFor(as, tmax);
    if (room < <f64>len) len = <i32>Math.max(1, Math.floor(room));
    const r = ruleFor(as, tmax);
    if (r < 0) {
      for (let q = 1; q <= len; q++) store<f64>(outAt(l.base, o + q * l.di), splitValue(Math.abs(ws + <f64>q * s)));
      l.p = p + len;
      continue;
    }
    seedLane(l, r, ws, s);
    l.rule = r;
    l.t0 = t0;
    l.val = val;
    l.ptr = outAt(l.base, o);
    l.J = 0;
    l.Q = l.scale;
    l.Qr = gQr0;
    planSegment(l, len);
  }
}

@inline function pair(k: i32): v128 {
  return v128.load(PAIRS_AT + (<usize>k << 4));
}
@inline function pairB(k: i32): v128 {
  return v128.load(PAIRS_AT + 128 + (<usize>k << 4));
}
@inline function unpair(k: i32, v: v128): void {
  v128.store(PAIRS_AT + (<usize>k << 4), v);
}

/**
 * n steps of both lanes at once, lane 0 lane A and lane 1 lane B, with the 4-, 6- or 8-point loop
 * (the larger of their rules): the nodes a smaller rule lacks are 0 (and stay 0), and adding 0
 * changes no sum, so each lane's values are those of its own rule exactly. One function per rule,
 * so a 4-point pair does not pay for eight nodes; the state is loaded from the lanes and stored
 * back. A lane whose chunk ends on the way gets its next chunk's Q and Qr (planSegment) in its
 * half of the vectors, inside the loop. With V8 11 (Node 20) the 4-point loop keeps its state in
 * registers; the 6- and 8-point loops have more live vectors than x64's sixteen registers and
 * spill some. (Tried and measured slower there: a nested loop per chunk, and a loop unrolled by
 * two, whose extra live values made V8 spill in the 4-point loop too.)
 */
function loopTwo4(a: Lane, b: Lane, n: i32): void {
  let val = f64x2(a.val, b.val);
  let Q = f64x2(a.Q, b.Q);
  let Qr = f64x2(a.Qr, b.Qr);
  const q2 = v128.load(Q2_AT);
  let pa = a.ptr;
  let pb = b.ptr;
  const da = a.dp;
  const db = b.dp;
  let v0 = pair(0), v1 = pair(1), v2 = pair(2), v3 = pair(3);
  const c0 = pairB(0), c1 = pairB(1), c2 = pairB(2), c3 = pairB(3);
  // the steps (from this call's start) at which lane A's and lane B's chunks end, and the nearer
  let ea = a.chunkLeft;
  let eb = b.chunkLeft;
  let ev = min(ea, eb);
  for (let r = 1; r <= n; r++) {
    val = f64x2.add(val, f64x2.mul(Q, f64x2.add(f64x2.add(v0, v1), f64x2.add(v2, v3))));
    pa += da;
    pb += db;
    v128.store64_lane(pa, val, 0);
    v128.store64_lane(pb, val, 1);
    v0 = f64x2.mul(v0, c0); v1 = f64x2.mul(v1, c1); v2 = f64x2.mul(v2, c2); v3 = f64x2.mul(v3, c3);
    Q = f64x2.mul(Q, Qr);
    Qr = f64x2.mul(Qr, q2);
    if (r == ev) {
      const na = r == ea ? nextChunk(a) : 0;
      const nb = r == eb ? nextChunk(b) : 0;
      Q = chunkStart(Q, a, b, na, nb, 0);
      Qr = chunkStart(Qr, a, b, na, nb, 32);
      ea += na;
      eb += nb;
      ev = min(ea, eb);
    }
  }
  a.chunkLeft = ea - n;
  b.chunkLeft = eb - n;
  unpair(0, v0); unpair(1, v1); unpair(2, v2); unpair(3, v3);
  storeTwo(a, b, val, Q, Qr, pa, pb);
}

function loopTwo6(a: Lane, b: Lane, n: i32): void {
  let val = f64x2(a.val, b.val);
  let Q = f64x2(a.Q, b.Q);
  let Qr = f64x2(a.Qr, b.Qr);
  const q2 = v128.load(Q2_AT);
  let pa = a.ptr;
  let pb = b.ptr;
  const da = a.dp;
  const db = b.dp;
  let v0 = pair(0), v1 = pair(1), v2 = pair(2), v3 = pair(3), v4 = pair(4), v5 = pair(5);
  const c0 = pairB(0), c1 = pairB(1), c2 = pairB(2), c3 = pairB(3), c4 = pairB(4), c5 = pairB(5);
  // the steps (from this call's start) at which lane A's and lane B's chunks end, and the nearer
  let ea = a.chunkLeft;
  let eb = b.chunkLeft;
  let ev = min(ea, eb);
  for (let r = 1; r <= n; r++) {
    const h = f64x2.add(f64x2.add(f64x2.add(v0, v1), f64x2.add(v2, v3)), f64x2.add(v4, v5));
    val = f64x2.add(val, f64x2.mul(Q, h));
    pa += da;
    pb += db;
    v128.store64_lane(pa, val, 0);
    v128.store64_lane(pb, val, 1);
    v0 = f64x2.mul(v0, c0); v1 = f64x2.mul(v1, c1); v2 = f64x2.mul(v2, c2); v3 = f64x2.mul(v3, c3);
    v4 = f64x2.mul(v4, c4); v5 = f64x2.mul(v5, c5);
    Q = f64x2.mul(Q, Qr);
    Qr = f64x2.mul(Qr, q2);
    if (r == ev) {
      const na = r == ea ? nextChunk(a) : 0;
      const nb = r == eb ? nextChunk(b) : 0;
      Q = chunkStart(Q, a, b, na, nb, 0);
      Qr = chunkStart(Qr, a, b, na, nb, 32);
      ea += na;
      eb += nb;
      ev = min(ea, eb);
    }
  }
  a.chunkLeft = ea - n;
  b.chunkLeft = eb - n;
  unpair(0, v0); unpair(1, v1); unpair(2, v2); unpair(3, v3); unpair(4, v4); unpair(5, v5);
  storeTwo(a, b, val, Q, Qr, pa, pb);
}

function loopTwo8(a: Lane, b: Lane, n: i32): void {
  let val = f64x2(a.val, b.val);
  let Q = f64x2(a.Q, b.Q);
  let Qr = f64x2(a.Qr, b.Qr);
  const q2 = v128.load(Q2_AT);
  let pa = a.ptr;
  let pb = b.ptr;
  const da = a.dp;
  const db = b.dp;
  let v0 = pair(0), v1 = pair(1), v2 = pair(2), v3 = pair(3);
  let v4 = pair(4), v5 = pair(5), v6 = pair(6), v7 = pair(7);
  const c0 = pairB(0), c1 = pairB(1), c2 = pairB(2), c3 = pairB(3);
  const c4 = pairB(4), c5 = pairB(5), c6 = pairB(6), c7 = pairB(7);
  // the steps (from this call's start) at which lane A's and lane B's chunks end, and the nearer
  let ea = a.chunkLeft;
  let eb = b.chunkLeft;
  let ev = min(ea, eb);
  for (let r = 1; r <= n; r++) {
    const h = f64x2.add(f64x2.add(f64x2.add(v0, v1), f64x2.add(v2, v3)), f64x2.add(f64x2.add(v4, v5), f64x2.add(v6, v7)));
    val = f64x2.add(val, f64x2.mul(Q, h));
    pa += da;
    pb += db;
    v128.store64_lane(pa, val, 0);
    v128.store64_lane(pb, val, 1);
    v0 = f64x2.mul(v0, c0); v1 = f64x2.mul(v1, c1); v2 = f64x2.mul(v2, c2); v3 = f64x2.mul(v3, c3);
    v4 = f64x2.mul(v4, c4); v5 = f64x2.mul(v5, c5); v6 = f64x2.mul(v6, c6); v7 = f64x2.mul(v7, c7);
    Q = f64x2.mul(Q, Qr);
    Qr = f64x2.mul(Qr, q2);
    if (r == ev) {
      const na = r == ea ? nextChunk(a) : 0;
      const nb = r == eb ? nextChunk(b) : 0;
      Q = chunkStart(Q, a, b, na, nb, 0);
      Qr = chunkStart(Qr, a, b, na, nb, 32);
      ea += na;
      eb += nb;
      ev = min(ea, eb);
    }
  }
  a.chunkLeft = ea - n;
  b.chunkLeft = eb - n;
  unpair(0, v0); unpair(1, v1); unpair(2, v2); unpair(3, v3);
  unpair(4, v4); unpair(5, v5); unpair(6, v6); unpair(7, v7);
  storeTwo(a, b, val, Q, Qr, pa, pb);
}

@inline function storeTwo(a: Lane, b: Lane, val: v128, Q: v128, Qr: v128, pa: usize, pb: usize): void {
  a.val = f64x2.extract_lane(val, 0);
  b.val = f64x2.extract_lane(val, 1);
  a.Q = f64x2.extract_lane(Q, 0);
  b.Q = f64x2.extract_lane(Q, 1);
  a.Qr = f64x2.extract_lane(Qr, 0);
  b.Qr = f64x2.extract_lane(Qr, 1);
  a.ptr = pa;
  b.ptr = pb;
}

/** n steps of both lanes with the loop of m nodes (the larger rule of the two). */
function loopTwo(a: Lane, b: Lane, m: i32, n: i32): void {
  if (m == 4) loopTwo4(a, b, n);
  else if (m == 6) loopTwo6(a, b, n);
  else loopTwo8(a, b, n);
}

/** Both lanes until one of them reaches the end of its segment. */
function stepTwo(a: Lane, b: Lane): void {
  const n = min(a.pending, b.pending);
  loopTwo(a, b, max(ruleM(a.rule), ruleM(b.rule)), n);
  took(a, n);
  took(b, n);
}

function idleLane(l: Lane): void {
  l.val = 0;
  l.Q = 0;
  l.Qr = 0;
  l.ptr = IDLE_SLOT;
  l.dp = 0;
  l.chunkLeft = 1 << 30;
  for (let k = 0; k < 8; k++) {
    store<f64>(laneP(l, k), 0);
    store<f64>(laneB_(l, k), 1);
  }
}

/** after n kernel steps: the lane's position and segment count move on */
@inline function took(l: Lane, n: i32): void {
  l.pending -= n;
  l.p += n;
  l.J += n;
  if (l.pending == 0) l.rule = -1;
}

// the queue of runs for the two lanes: (w0, s) as f64 and (count, base, i0, di) as i32/usize
const QUEUE_AT: usize = LANES_AT + 4 * LANE_SIZE;
let queued: i32 = 0;
let taken: i32 = 0;

function enqueue(w0: f64, s: f64, count: i32, base: usize, i0: i32, di: i32): void {
  const at = QUEUE_AT + <usize>queued * 64;
  store<f64>(at, w0);
  store<f64>(at + 8, s);
  store<i32>(at + 24, count);
  store<i32>(at + 28, <i32>base);
  store<i32>(at + 32, i0);
  store<i32>(at + 36, di);
  queued++;
}

/** gives the lane the next queued run; false when none is left */
function takeRun(l: Lane): bool {
  if (taken >= queued) return false;
  const at = QUEUE_AT + <usize>taken * 64;
  taken++;
  startLane(l, load<f64>(at), load<f64>(at + 8), load<i32>(at + 24), <usize>load<i32>(at + 28), load<i32>(at + 32), load<i32>(at + 36));
  return true;
}

/** Runs every queued run, two at a time. */
function drain(): void {
  const a = laneA;
  const b = laneB;
  a.busy = 0;
  b.busy = 0;
  for (;;) {
    if (a.busy == 0 && takeRun(a)) advance(a);
    while (a.busy == 0 && takeRun(a)) advance(a);
    while (b.busy == 0 && takeRun(b)) advance(b);
    if (a.busy == 0 && b.busy == 0) break;
    if (a.busy != 0 && b.busy != 0) {
      stepTwo(a, b);
      advance(a);
      advance(b);
    } else {
      // one run left: the same loops with an idle partner whose lane computes zeros into a slot
      const l = a.busy != 0 ? a : b;
      const n = l.pending;
      idleLane(changetype<usize>(l) == changetype<usize>(a) ? b : a);
      loopTwo(a, b, ruleM(l.rule), n);
      took(l, n);
      advance(l);
    }
  }
  queued = 0;
  taken = 0;
}

function boundary(u0: f64, du: f64, n: i32, lim: f64, from: i32, inclusive: bool): i32 {
  const jf = Math.min(<f64>n, Math.max(<f64>from, Math.floor((lim - u0) / du)));
  let j = <i32>jf;
  if (inclusive) {
    while (j > from && u0 + <f64>(j - 1) * du > lim) j--;
    while (j < n && u0 + <f64>j * du <= lim) j++;
  } else {
    while (j > from && u0 + <f64>(j - 1) * du >= lim) j--;
    while (j < n && u0 + <f64>j * du < lim) j++;
  }
  return j;
}

/**
 * pointValue at the points j in [from, to), all beyond the cut (|u| > 10, where it is erfcTail):
 * two at a time, with one expPair.
 */
function beyondCut(u0: f64, du: f64, from: i32, to: i32, base: usize): void {
  let j = from;
  for (; j + 1 < to; j += 2) {
    const y0 = Math.abs(u0 + <f64>j * du);
    const y1 = Math.abs(u0 + <f64>(j + 1) * du);
    let v: v128 = f64x2.splat(0);
    if (y0 < XBIG || y1 < XBIG) {
      // a lane at or past XBIG is 0 (erfcTail's); its lane of the product is not used
      const y = f64x2(y0, y1);
      v = v128.and(f64x2.mul(expPair(f64x2(-y0 * y0, -y1 * y1)), erfcxLargePair(y)), f64x2.lt(y, f64x2.splat(XBIG)));
    }
    store<f64>(outAt(base, j), f64x2.extract_lane(v, 0));
    store<f64>(outAt(base, j + 1), f64x2.extract_lane(v, 1));
  }
  if (j < to) store<f64>(outAt(base, j), pointValue(u0 + <f64>j * du));
}

// erfLattice.ts's erfNearZero: its coefficients and its operations, one point or two at a time
const E0: f64 = 1.1283791670955126;
const E1: f64 = -0.37612638903183754;
const E2: f64 = 0.11283791670955126;
const E3: f64 = -0.026866170645131252;
const E4: f64 = 0.005223977625442188;
const E5: f64 = -0.0008548327023450853;
const E6: f64 = 0.00012055332981789664;
const E7: f64 = -1.492565035840625e-5;
const E8: f64 = 1.6462114365889248e-6;
const E9: f64 = -1.6365844691234924e-7;
const E10: f64 = 1.4807192815879218e-8;
const E11: f64 = -1.2290555301717928e-9;

function erfNearZero(u: f64): f64 {
  const z = u * u;
  const z2 = z * z;
  const z4 = z2 * z2;
  const p03 = E0 + E1 * z + (E2 + E3 * z) * z2;
  const p47 = E4 + E5 * z + (E6 + E7 * z) * z2;
  const p811 = E8 + E9 * z + (E10 + E11 * z) * z2;
  return u * (p03 + (p47 + p811 * z4) * z4);
}

/** (E_k, E_k) pairs, stored by reset() at X_E0 + 16k */
@inline function mulAdd(k: usize, z: v128): v128 {
  return f64x2.add(v128.load(X_E0 + (k << 4)), f64x2.mul(v128.load(X_E0 + ((k + 1) << 4)), z));
}

/** erfNearZero at the points j in [from, to) (all |u| < the split), two at a time. */
function nearZero(u0: f64, du: f64, from: i32, to: i32, base: usize): void {
  let j = from;
  for (; j + 1 < to; j += 2) {
    const u = f64x2(u0 + <f64>j * du, u0 + <f64>(j + 1) * du);
    const z = f64x2.mul(u, u);
    const z2 = f64x2.mul(z, z);
    const z4 = f64x2.mul(z2, z2);
    const p03 = f64x2.add(mulAdd(0, z), f64x2.mul(mulAdd(2, z), z2));
    const p47 = f64x2.add(mulAdd(4, z), f64x2.mul(mulAdd(6, z), z2));
    const p811 = f64x2.add(mulAdd(8, z), f64x2.mul(mulAdd(10, z), z2));
    v128.store(outAt(base, j), f64x2.mul(u, f64x2.add(p03, f64x2.mul(f64x2.add(p47, f64x2.mul(p811, z4)), z4))));
  }
  if (j < to) store<f64>(outAt(base, j), erfNearZero(u0 + <f64>j * du));
}

/** erfLattice.ts's erfLattice into the array at `base` (n ≤ cap). */
function latticeAt(u0: f64, du: f64, n: i32, base: usize): void {
  if (n <= 0) return;
  if (!(du > 0) || n < 4) {
    for (let j = 0; j < n; j++) store<f64>(outAt(base, j), pointValue(u0 + <f64>j * du));
    return;
  }
  const jc = boundary(u0, du, n, -LATTICE_CUT, 0, false);
  const jL = boundary(u0, du, n, -S, jc, true);
  const jR = boundary(u0, du, n, S, jL, false);
  const jC = boundary(u0, du, n, LATTICE_CUT, jR, true);
  beyondCut(u0, du, 0, jc, base);
  beyondCut(u0, du, jC, n, base);
  const s2 = du * du;
  if (gS2 != s2) {
    gS2 = s2;
    const g = expPair(f64x2(-s2, -2 * s2));
    gQr0 = f64x2.extract_lane(g, 0);
    gQ2 = f64x2.extract_lane(g, 1);
    store<f64>(Q2_AT, gQ2);
    store<f64>(Q2_AT + 8, gQ2);
  }
  // the four runs are queued; the caller drains the queue (two lattices' runs share the lanes)
  if (jL > jc) enqueue(-(u0 + <f64>jc * du), -du, jL - jc, base, jc, 1);
  nearZero(u0, du, jL, jR, base);
  if (jC > jR) enqueue(u0 + <f64>(jC - 1) * du, -du, jC - jR, base, jC - 1, -1);
}

/** The lattice into work array B (for the host's erfLattice). */
export function lattice(u0: f64, du: f64, n: i32): void {
  latticeAt(u0, du, n, WORK_AT + (<usize>cap << 3));
  drain();
}

// ---- spread.ts, lateralLattice

function firstPast(u0: f64, du: f64, n: i32, lim: f64, strict: bool): i32 {
  const jf = Math.min(<f64>n, Math.max(0, Math.floor((lim - u0) / du)));
  let j = <i32>jf;
  if (strict) {
    while (j > 0 && u0 + <f64>(j - 1) * du > lim) j--;
    while (j < n && !(u0 + <f64>j * du > lim)) j++;
  } else {
    while (j > 0 && u0 + <f64>(j - 1) * du >= lim) j--;
    while (j < n && !(u0 + <f64>j * du >= lim)) j++;
  }
  return j;
}

@inline function cut(i: i32): i32 {
  return load<i32>(CUTS_AT + (<usize>i << 2));
}
@inline function setCut(i: i32, v: i32): void {
  store<i32>(CUTS_AT + (<usize>i << 2), v);
}

@inline function classK(c: i32): f64 {
  return c == 0 ? -1 : c == 1 ? 0 : 1;
}
@inline function classSign(c: i32): f64 {
  return c == 2 ? -1 : 1;
}

/**
 * spread.ts's lateralLattice with the row written to work array ROW at [0, ny): factor·[erf(a_j) −
 * erf(b_j)] for j ≥ jStart (and the mirrored half when `mirrored`).
 */
export function lateralRow(y0: f64, dy: f64, ny: i32, h: f64, s: f64, mirrored: bool, jStart: i32, factor: f64): void {
  const A = WORK_AT;
  const B = WORK_AT + (<usize>cap << 3);
  const ROW = WORK_AT + (<usize>cap << 4);
  const inv = 1 / s;
  const du = dy * inv;
  const b0 = (y0 - h) * inv;
  latticeAt(b0, du, ny, B);
  const jb1 = firstPast(b0, du, ny, -S, true);
  const jb2 = firstPast(b0, du, ny, S, false);
  let ja1: i32;
  let ja2: i32;
  if (mirrored) {
    ja1 = ny - jb2;
    ja2 = ny - jb1;
  } else {
    const a0 = (y0 + h) * inv;
    latticeAt(a0, du, ny, A);
    ja1 = firstPast(a0, du, ny, -S, true);
    ja2 = firstPast(a0, du, ny, S, false);
  }
  drain();
  setCut(0, jStart);
  setCut(1, max(jStart, ja1));
  setCut(2, max(jStart, ja2));
  setCut(3, max(jStart, jb1));
  setCut(4, max(jStart, jb2));
  setCut(5, ny);
  for (let i = 1; i < 6; i++) {
    const v = cut(i);
    let k = i - 1;
    while (k >= 0 && cut(k) > v) {
      setCut(k + 1, cut(k));
      k--;
    }
    setCut(k + 1, v);
  }
  const capV = 2 * factor;
  for (let c = 0; c < 5; c++) {
    const lo = cut(c);
    const hi = cut(c + 1);
    if (hi <= lo) continue;
    const ca = lo < ja1 ? 0 : lo < ja2 ? 1 : 2;
    const cb = lo < jb1 ? 0 : lo < jb2 ? 1 : 2;
    const K = factor * (classK(ca) - classK(cb));
    const sb = -factor * classSign(cb);
    // two cells at a time: the same operations lane by lane; the clamp f > 0 ? min(f, cap) : 0 as
    // pmin(cap, pmax(0, f)) (pmax(0, f) = 0 < f ? f : 0, pmin(cap, h) = h < cap ? h : cap)
    const vK = f64x2.splat(K);
    const vsb = f64x2.splat(sb);
    const vcap = f64x2.splat(capV);
    const vzero = f64x2.splat(0);
    if (mirrored) {
      const sa = factor * classSign(ca) * (ca == 1 ? -1 : 1);
      const vsa = f64x2.splat(sa);
      let j = lo;
      for (; j + 3 < hi; j += 4) {
        const m = ny - 1 - j;
        const bm0 = v128.load(outAt(B, m - 1));
        const bm1 = v128.load(outAt(B, m - 3));
        const f0 = f64x2.add(f64x2.add(vK, f64x2.mul(vsa, v128.shuffle<f64>(bm0, bm0, 1, 0))), f64x2.mul(vsb, v128.load(outAt(B, j))));
        const f1 = f64x2.add(f64x2.add(vK, f64x2.mul(vsa, v128.shuffle<f64>(bm1, bm1, 1, 0))), f64x2.mul(vsb, v128.load(outAt(B, j + 2))));
        const c0 = f64x2.pmin(vcap, f64x2.pmax(vzero, f0));
        const c1 = f64x2.pmin(vcap, f64x2.pmax(vzero, f1));
        v128.store(outAt(ROW, j), c0);
        v128.store(outAt(ROW, j + 2), c1);
        v128.store(outAt(ROW, m - 1), v128.shuffle<f64>(c0, c0, 1, 0));
        v128.store(outAt(ROW, m - 3), v128.shuffle<f64>(c1, c1, 1, 0));
      }
      for (; j + 1 < hi; j += 2) {
        const m = ny - 1 - j;
        // (B[m], B[m − 1]) from the pair at m − 1
        const bm = v128.shuffle<f64>(v128.load(outAt(B, m - 1)), v128.load(outAt(B, m - 1)), 1, 0);
        const f = f64x2.add(f64x2.add(vK, f64x2.mul(vsa, bm)), f64x2.mul(vsb, v128.load(outAt(B, j))));
        const c = f64x2.pmin(vcap, f64x2.pmax(vzero, f));
        v128.store(outAt(ROW, j), c);
        v128.store(outAt(ROW, m - 1), v128.shuffle<f64>(c, c, 1, 0));
      }
      for (; j < hi; j++) {
        const m = ny - 1 - j;
        let f = K + sa * load<f64>(outAt(B, m)) + sb * load<f64>(outAt(B, j));
        f = f > 0 ? (f < capV ? f : capV) : 0;
        store<f64>(outAt(ROW, j), f);
        store<f64>(outAt(ROW, m), f);
      }
    } else {
      const sa = factor * classSign(ca);
      const vsa = f64x2.splat(sa);
      let j = lo;
      for (; j + 1 < hi; j += 2) {
        const f = f64x2.add(f64x2.add(vK, f64x2.mul(vsa, v128.load(outAt(A, j)))), f64x2.mul(vsb, v128.load(outAt(B, j))));
        v128.store(outAt(ROW, j), f64x2.pmin(vcap, f64x2.pmax(vzero, f)));
      }
      for (; j < hi; j++) {
        const f = K + sa * load<f64>(outAt(A, j)) + sb * load<f64>(outAt(B, j));
        store<f64>(outAt(ROW, j), f > 0 ? (f < capV ? f : capV) : 0);
      }
    }
  }
}
