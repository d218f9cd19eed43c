#!/usr/bin/env python3
"""
A vectorised numpy/scipy Monte Carlo screening of the same realisations `npm run bench` screens
in JavaScript (bench/monteCarlo.ts), for a ratio of equal work.

Input (one JSON object on stdin): the limit (mg/L), the horizon (d), the number of timed
repetitions, and for every realisation the Domenico model (v, R, αx, αy, αz, λ, C0, W, H) and
every receptor's position in that realisation's flow frame (x, y, screen top and bottom); the JS
results for the agreement check. Output (one JSON object): seconds per repetition (median), and
the agreement with the JS figures.

Per realisation and receptor, as the JS does for a continuous, constant source (the demo cases
benchmarked): the concentration at the horizon (which is also the peak within it, the
concentration at a fixed point rising monotonically in time), and where it reaches the limit the
first time it does, in closed form (only the x-term depends on t: erfc(a) = q, a = −Φ⁻¹(q/2)/√2,
then a quadratic in √t; the JS's src/core/solutions/domenico.ts domenicoLevelTime), every
realisation-receptor pair at once.

Domenico (1987), as bench/numpy_grids.py evaluates it (λ on dissolved and sorbed mass, u = v/R):
  C = C0/8 · exp[x/(2αx)·(1 − √(1 + 4λαx/u))] · erfc[(x − u·t·√(1 + 4λαx/u)) / (2√(αx·u·t))]
          · [erf((y + W/2)/(2√(αy x))) − erf((y − W/2)/(2√(αy x)))] · Z
with Z = erf((z + H)s) − erf((z − H)s), s = 1/(2√(αz x)), at a point, or its average over the
screen [zt, zb] in closed form through ∫erf(u)du = u·erf(u) + e^(−u²)/√π.
"""
import json
import math
import statistics
import sys
import time

import numpy as np
import scipy
from scipy.special import erf, erfc, ndtri

SQRT_PI = math.sqrt(math.pi)


def erf_diff(a, b):
    flip = (a + b) < 0.0
    a2 = np.where(flip, -b, a)
    b2 = np.where(flip, -a, b)
    return erfc(b2) - erfc(a2)


def G(u):
    return u * erf(u) + np.exp(-u * u) / SQRT_PI


def spread(p):
    """The lateral and vertical factors fy·fz (independent of t) and the x-term's parts at each pair."""
    x = p["x"]
    xs = np.where(x > 0, x, 1.0)
    u = p["v"] / p["R"]
    root = np.sqrt(1.0 + 4.0 * p["decay"] * p["ax"] / u)
    sy = 1.0 / (2.0 * np.sqrt(p["ay"] * xs))
    fy = erf_diff((p["y"] + p["width"] / 2.0) * sy, (p["y"] - p["width"] / 2.0) * sy)
    s = 1.0 / (2.0 * np.sqrt(p["az"] * xs))
    h = p["thickness"]
    zt, zb = p["zTop"], p["zBottom"]
    point = erf_diff((zt + h) * s, (zt - h) * s)
    span = np.where(zb > zt, zb - zt, 1.0)
    avg = (G((zb + h) * s) - G((zt + h) * s) - G((zb - h) * s) + G((zt - h) * s)) / (s * span)
    fz = np.where(zb > zt, avg, point)
    return xs, u * root, p["ax"] * u, np.exp(xs / (2.0 * p["ax"]) * (1.0 - root)), fy * fz


def screen(p, limit, horizon):
    xs, ur, dx, decay, fyz = spread(p)
    scale = p["c0"] * 0.125 * decay * fyz
    at_h = scale * erfc((xs - ur * horizon) / (2.0 * np.sqrt(dx * horizon)))
    at_h = np.where(p["x"] > 0, np.maximum(at_h, 0.0), 0.0)
    hit = at_h >= limit
    # first time at the limit in closed form: erfc(a) = q, a = (x − u't)/(2√(Dt)), s = √t the
    # positive root of u's² + 2a√D s − x = 0 (the form without cancellation for each sign of a)
    idx = np.nonzero(hit)[0]
    q = np.minimum(limit / scale[idx], 2.0)
    a = -ndtri(0.5 * q) * math.sqrt(0.5)
    rd = np.sqrt(dx[idx])
    disc = np.sqrt(a * a * dx[idx] + ur[idx] * xs[idx])
    s = np.where(a >= 0, xs[idx] / (a * rd + disc), (disc - a * rd) / ur[idx])
    arrival = np.full(at_h.size, np.inf)
    arrival[idx] = np.minimum(s * s, horizon)
    return at_h, arrival


def main():
    cfg = json.load(sys.stdin)
    limit, horizon = cfg["limit"], cfg["horizon"]
    m = cfg["receptorsPerRealisation"]
    real = {k: np.repeat(np.asarray(v, dtype=float), m) for k, v in cfg["models"].items()}
    rec = {k: np.asarray(v, dtype=float) for k, v in cfg["receptors"].items()}
    p = {**real, **rec}
    times = []
    for _ in range(cfg["reps"]):
        t0 = time.perf_counter()
        at_h, arrival = screen(p, limit, horizon)
        times.append(time.perf_counter() - t0)
    js_h = np.asarray(cfg["js"]["atHorizon"], dtype=float)
    js_a = np.asarray([math.inf if a is None else a for a in cfg["js"]["arrival"]], dtype=float)
    rel = np.abs(at_h - js_h) / np.maximum(np.abs(js_h), 1e-12 * limit)
    both = np.isfinite(js_a) & np.isfinite(arrival)
    out = {
        "python": sys.version.split()[0],
        "numpy": np.__version__,
        "scipy": scipy.__version__,
        "seconds": statistics.median(times),
        "reps": len(times),
        "atHorizonMaxRel": float(np.max(rel)) if rel.size else 0.0,
        "arrivalMaxAbsDays": float(np.max(np.abs(js_a[both] - arrival[both]))) if both.any() else 0.0,
        "exceedMismatch": int(np.sum(np.isfinite(js_a) != np.isfinite(arrival))),
        "exceeding": int(np.sum(np.isfinite(arrival))),
    }
    print(json.dumps(out))


if __name__ == "__main__":
    main()
