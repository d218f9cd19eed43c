#!/usr/bin/env node
/**
 * Writes test/fixtures/erf.json: reference values of erf, erfc and erfcx at binary64 arguments,
 * computed with decimal.js at 60 significant digits (methods in decimal-special.mjs: positive
 * series for |x| < 5, continued fraction beyond, reflection for x < 0), stored to 40 digits.
 *
 * Ranges are cut at the branch points of Cody's rational Chebyshev approximations (|x| = 0.46875
 * and 4; W. J. Cody 1969, Math. Comp. 23(107)), so each piece of an implementation built on them is
 * exercised on its own, with the branch points and their neighbouring doubles included.
 *
 * Self-check: in the overlap 4 ≤ x < 5 both decimal paths (series and continued fraction) are
 * evaluated and must agree to 50 digits, or the script stops.
 *
 * Run: node scripts/reference/erf-fixtures.mjs   (deterministic; rerun after any change here)
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { makeDecimal, exactDecimal, erfD, erfcD, erfcxD, erfcBothWays } from './decimal-special.mjs';

const DIGITS = 60;
const STORED = 40;
const D = makeDecimal(DIGITS);

function nextUp(x) {
  const v = new DataView(new ArrayBuffer(8));
  v.setFloat64(0, x);
  let b = v.getBigUint64(0);
  if (x === 0) return Number.MIN_VALUE;
  b = x > 0 ? b + 1n : b - 1n;
  v.setBigUint64(0, b);
  return v.getFloat64(0);
}
function nextDown(x) {
  return -nextUp(-x);
}

function linspace(a, b, n) {
  const out = [];
  for (let i = 0; i < n; i++) out.push(a + ((b - a) * i) / (n - 1));
  return out;
}
function logspace(a, b, n) {
  const la = Math.log10(a);
  const lb = Math.log10(b);
  return linspace(la, lb, n).map((e) => 10 ** e);
}
/** Points strictly inside (a, b) plus both ends and the doubles just inside each end. */
function piece(a, b, n) {
  const pts = linspace(a, b, n);
  pts.push(nextUp(a), nextDown(b));
  return pts;
}

function around(x) {
  return [nextDown(x), x, nextUp(x)];
}

const BRANCH = [0.46875, 4];
const branchPoints = BRANCH.flatMap((b) => [...around(b), ...around(-b)]);
const tiny = [Number.MIN_VALUE, 1e-310, 2.2250738585072014e-308, 1e-300, 1e-100, 1e-20, 1e-10, 1e-8, 1e-5, 1e-3];
const tinyBoth = [...tiny, ...tiny.map((x) => -x)];

const ranges = {
  erf: {
    '[-6,-4]': piece(-6, -4, 25),
    '[-4,-0.46875]': piece(-4, -0.46875, 40),
    '[-0.46875,0.46875]': [...piece(-0.46875, 0.46875, 40), ...tinyBoth],
    '[0.46875,4]': piece(0.46875, 4, 40),
    '[4,6]': piece(4, 6, 25),
    'branch points': branchPoints,
  },
  erfc: {
    '[-6,-4]': piece(-6, -4, 25),
    '[-4,-0.46875]': piece(-4, -0.46875, 40),
    '[-0.46875,0.46875]': [...piece(-0.46875, 0.46875, 40), ...tinyBoth],
    '[0.46875,4]': piece(0.46875, 4, 40),
    '[4,27]': [...piece(4, 27, 120), 26, 26.5, 26.55, 26.6, 26.9, 27.1],
    'branch points': branchPoints,
  },
  erfcx: {
    '[-26,-4]': piece(-26, -4, 45),
    '[-4,-0.46875]': piece(-4, -0.46875, 40),
    '[-0.46875,0.46875]': [...piece(-0.46875, 0.46875, 40), ...tinyBoth],
    '[0.46875,4]': piece(0.46875, 4, 40),
    '[4,50]': piece(4, 50, 60),
    '[50,1e8]': [...logspace(50, 1e8, 60), 1e8],
    'branch points': branchPoints,
  },
};

const evaluators = { erf: erfD, erfc: erfcD, erfcx: erfcxD };

// Self-check of the two decimal paths where both are valid.
for (const x of linspace(4, 4.999, 12)) {
  const { bySeries, byFraction } = erfcBothWays(D, exactDecimal(D, x));
  const rel = bySeries.minus(byFraction).abs().div(byFraction);
  if (rel.gt('1e-50')) throw new Error(`series and continued fraction disagree at ${x}: ${rel}`);
}

const out = {
  generated: 'by scripts/reference/erf-fixtures.mjs — generated, do not edit',
  method: `decimal.js ${DIGITS} significant digits; positive series for |x| < 5, continued fraction (A&S 7.1.14) for x ≥ 5, reflection for x < 0; arguments taken as their exact binary64 values`,
  digits: STORED,
  functions: {},
};

for (const [name, byRange] of Object.entries(ranges)) {
  out.functions[name] = {};
  for (const [range, xs] of Object.entries(byRange)) {
    const seen = new Set();
    const cases = [];
    for (const x of xs) {
      if (seen.has(x)) continue;
      seen.add(x);
      if (JSON.parse(JSON.stringify(x)) !== x) throw new Error(`argument ${x} does not round-trip`);
      const value = evaluators[name](D, exactDecimal(D, x));
      cases.push({ x, expected: value.toSignificantDigits(STORED).toExponential() });
    }
    out.functions[name][range] = cases;
  }
}

const target = fileURLToPath(new URL('../../test/fixtures/erf.json', import.meta.url));
writeFileSync(target, `${JSON.stringify(out, null, 1)}\n`);
const count = Object.values(out.functions).reduce((s, f) => s + Object.values(f).reduce((t, c) => t + c.length, 0), 0);
console.log(`wrote ${target}: ${count} cases`);
