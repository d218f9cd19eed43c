#!/usr/bin/env python3
"""
Vectorised numpy/scipy evaluation of the two concentration grids that `npm run bench` times in
JavaScript, so the benchmark can print a JS/numpy ratio for equal work.

Usage: bench/bench.ts runs `python3 bench/numpy_grids.py` as a child process, writes one JSON
object to its stdin (timing rules, tolerances, and lists of Domenico and exact grids, each with its
parameters and the whole JS result as `jsGrid`) and reads one JSON object from its stdout: for each
grid the median time, cells per second, and the JS grid's difference from the numpy one, and
the rate of scipy's erf on the arguments of the last Domenico grid's lateral factor. Run it by
hand with `--self-test` for a built-in invented scenario without JS grids.

Both grids are evaluated in the flow-aligned frame of the project (x downgradient from the source
plane, y across the flow with the source centred on y = 0, z depth below the water table), with
retardation dividing the velocity and the dispersion coefficients and the decay rate λ acting as
given (on dissolved and sorbed mass alike). C/C0 is returned at index [i, j] for (xs[i], ys[j]).

Domenico (1987) approximation, evaluated with scipy.special.erf/erfc broadcast over the grid and
the same separation the JS code uses (x-only, x-y and x-z factors, and mirroring in y when the
y values are symmetric):
  C/C0 = 1/8 · exp[x/(2αx)·(1 − √(1 + 4λαx R/v))]
             · erfc[(x − (v/R)t·√(1 + 4λαx R/v)) / (2√(αx (v/R) t))]
             · [erf((y + W/2)/(2√(αy x))) − erf((y − W/2)/(2√(αy x)))]
             · [erf((z + H)/(2√(αz x))) − erf((z − H)/(2√(αz x)))]
  (t = ∞: the erfc factor is 2.)

Exact rectangular-source solution (continuous source of width W centred on y = 0 and thickness H
down from the water table on the plane x = 0, semi-infinite aquifer in x and in depth with no flux
through the water table; the patch-source integral as given by Wexler 1992, USGS TWRI 3-B7, with
the water table as a mirror plane):
  C/C0 = ∫₀ᵗ f(τ) · e^(−λτ) · ¼·Y(τ)·Z(τ) dτ,
  f(τ) = x / (2√(π Dx τ³)) · exp(−(x − u τ)²/(4 Dx τ))         (u = v/R, Di = αi·v/R)
  Y(τ) = erf((y + W/2)/(2√(Dy τ))) − erf((y − W/2)/(2√(Dy τ)))
  Z(τ) = erf((z + H)/(2√(Dz τ))) − erf((z − H)/(2√(Dz τ)))
With Y = Z = 2 and λ = 0 the integral is the two-term Ogata–Banks solution, a check made below.
Quadrature: substitute w = (x − uτ)/(2√(Dx τ)), which turns f(τ)dτ into
(2/√π)·e^(−w²)·x/(x + uτ)·dw, a smooth Gaussian-weighted integrand. On each x column the
w-interval is [a, b] with a = max((x − ut)/(2√(Dx t)), −6.5) and b = √(max(a,0)² + 40), so the
left-out tails weigh below e^(−40) relative to what is kept; a fixed n-point Gauss–Legendre rule
is mapped onto [a, b] for every column (the nodes are shared by all cells of a column, the same
sharing the JS grid uses; it mirrors symmetric y values as the JS grid does). n is the smallest value on a ladder whose grid agrees with a much finer
rule (1024 points) to the requested accuracy on every cell; the script prints the accuracy
reached.

Accuracy is measured as the JS exact grid states its own (src/core/solutions/patchSource.ts):
|error| ≤ relTol · (largest C/C0 in the column) + absTol, reported as the column-relative error
max |a − b| / (column max of |b| + absTol/relTol). Cell-by-cell relative differences
|a − b| / max(|b|, floor) are printed beside it for information.
"""

import json
import math
import platform
import statistics
import sys
import time

import numpy as np
import scipy
from scipy.special import erf, erfc

INV_SQRT_PI2 = 2.0 / math.sqrt(math.pi)
W_LOW = -6.5
TAIL = 40.0
NODE_LADDER = (8, 12, 16, 20, 24, 28, 32, 40, 48, 56, 64, 80, 96, 128, 160, 192, 256, 384, 512)
FINE_NODES = 1024


def _mirror_split(ys):
    """When ys is exactly symmetric about 0 (ys[j] = −ys[n−1−j]), as in the JS grids, only the
    half from index n//2 on is evaluated and then mirrored; returns (ys to evaluate, n//2 or 0)."""
    n = ys.size
    if n > 1 and np.array_equal(ys, -ys[::-1]):
        return ys[n // 2:], n // 2
    return ys, 0


def _mirror_join(half_grid, start, ny):
    if start == 0:
        return half_grid
    full = np.empty((half_grid.shape[0], ny))
    full[:, start:] = half_grid
    full[:, :start] = half_grid[:, ::-1][:, :start]
    return full


def domenico_grid(p):
    xs = np.asarray(p["xs"], dtype=float)
    ys_all = np.asarray(p["ys"], dtype=float)
    ys, start = _mirror_split(ys_all)
    z, t, v = p["z"], float(p["t"]), p["v"]
    ax, ay, az = p["ax"], p["ay"], p["az"]
    half_w, h = p["width"] / 2.0, p["thickness"]
    R = p.get("R", 1.0)
    lam = p.get("decay", 0.0)
    u = v / R
    root = math.sqrt(1.0 + 4.0 * lam * ax / u)
    fx = np.exp(xs / (2.0 * ax) * (1.0 - root))
    if math.isfinite(t):
        fx *= erfc((xs - u * t * root) / (2.0 * math.sqrt(ax * u * t)))
    else:
        fx *= 2.0
    sz = 1.0 / (2.0 * np.sqrt(az * xs))
    fx *= erf((z + h) * sz) - erf((z - h) * sz)
    fx *= 0.125
    sy = (1.0 / (2.0 * np.sqrt(ay * xs)))[:, None]
    fy = erf((ys + half_w)[None, :] * sy)
    fy -= erf((ys - half_w)[None, :] * sy)
    fy *= fx[:, None]
    return _mirror_join(fy, start, ys_all.size)


def _w_nodes(xs, t, u, dx, n):
    """Gauss–Legendre nodes and weights in w for every x column: arrays of shape (nx, n)."""
    g, gw = np.polynomial.legendre.leggauss(n)
    if math.isfinite(t):
        a = (xs - u * t) / (2.0 * math.sqrt(dx * t))
        a = np.maximum(a, W_LOW)
    else:
        a = np.full_like(xs, W_LOW)
    b = np.sqrt(np.maximum(a, 0.0) ** 2 + TAIL)
    half = (0.5 * (b - a))[:, None]
    mid = (0.5 * (b + a))[:, None]
    return mid + half * g[None, :], half * gw[None, :]


def exact_grid(p, n):
    xs = np.asarray(p["xs"], dtype=float)
    ys_all = np.asarray(p["ys"], dtype=float)
    ys, start = _mirror_split(ys_all)
    z, t, v = p["z"], float(p["t"]), p["v"]
    R = p.get("R", 1.0)
    lam = p.get("decay", 0.0)
    u = v / R
    dx, dy, dz = p["ax"] * u, p["ay"] * u, p["az"] * u
    half_w, h = p["width"] / 2.0, p["thickness"]
    w, wt = _w_nodes(xs, t, u, dx, n)
    xc = xs[:, None]
    q = np.sqrt(w * w * dx + u * xc)
    sdx = math.sqrt(dx)
    # √τ from w without cancellation on either side of w = 0
    s = np.where(w >= 0.0, xc / (q + np.abs(w) * sdx), (q + np.abs(w) * sdx) / u)
    tau = s * s
    kern = wt * (0.25 * INV_SQRT_PI2) * np.exp(-w * w - lam * tau) * (xc / (xc + u * tau))
    szz = 1.0 / (2.0 * math.sqrt(dz) * s)
    kern *= erf((z + h) * szz) - erf((z - h) * szz)
    sy = (1.0 / (2.0 * math.sqrt(dy) * s))[:, :, None]
    fy = erf((ys + half_w)[None, None, :] * sy)
    fy -= erf((ys - half_w)[None, None, :] * sy)
    # sum over the nodes of each column: (nx, 1, n) @ (nx, n, ny)
    return _mirror_join(np.matmul(kern[:, None, :], fy)[:, 0, :], start, ys_all.size)


def ogata_banks(x, t, u, d):
    a = (x - u * t) / (2.0 * math.sqrt(d * t))
    b = (x + u * t) / (2.0 * math.sqrt(d * t))
    return 0.5 * (erfc(a) + math.exp(u * x / d) * erfc(b))


def rel_diff(a, b, floor):
    """max over cells of |a − b| / max(|b|, floor)"""
    a = np.asarray(a, dtype=float)
    b = np.asarray(b, dtype=float)
    return float(np.max(np.abs(a - b) / np.maximum(np.abs(b), floor))) if a.size else None


def column_rel_diff(a, b, rel_tol, abs_tol):
    """max over cells of |a − b| / (max of |b| in the cell's x column + abs_tol/rel_tol)"""
    a = np.asarray(a, dtype=float)
    b = np.asarray(b, dtype=float)
    col = np.max(np.abs(b), axis=1, keepdims=True) + abs_tol / rel_tol
    return float(np.max(np.abs(a - b) / col))


def choose_nodes(p, rel_tol, abs_tol, floor):
    """Smallest ladder n whose grid agrees with the FINE_NODES rule to rel_tol (column-relative,
    see the header) on every cell."""
    fine = exact_grid(p, FINE_NODES)
    tried = []
    for n in NODE_LADDER:
        g = exact_grid(p, n)
        err = column_rel_diff(g, fine, rel_tol, abs_tol)
        tried.append({"nodes": n, "relError": err, "cellRelError": rel_diff(g, fine, floor)})
        if err <= rel_tol:
            return n, tried, fine
    raise SystemExit(f"no rule on the ladder up to {NODE_LADDER[-1]} nodes reaches {rel_tol}")


def ogata_banks_check(p, n):
    """With a source covering the whole plane (Y = Z = 2) and no decay the integral must equal
    Ogata–Banks: a wide, thick source evaluated on the centreline near the water table."""
    u = p["v"] / p.get("R", 1.0)
    d = p["ax"] * u
    t = float(p["t"]) if math.isfinite(float(p["t"])) else 1e7
    q = dict(p, width=1e9, thickness=1e9, decay=0.0, t=t, ys=[0.0])
    got = exact_grid(q, n)[:, 0]
    want = np.array([ogata_banks(x, t, u, d) for x in q["xs"]])
    return rel_diff(got, want, p.get("floor", 1e-12))


def time_figure(fn, min_seconds, min_reps):
    """Median seconds of one call; repeats until ≥ min_seconds and ≥ min_reps (after a warm-up)."""
    sink = float(np.sum(fn()))
    times = []
    total = 0.0
    while total < min_seconds or len(times) < min_reps:
        t0 = time.perf_counter()
        r = fn()
        dt = time.perf_counter() - t0
        sink += float(r[0, 0]) + float(r[-1, -1])
        times.append(dt)
        total += dt
    return statistics.median(times), len(times), sink


def compare_js_grid(ref, js, rel_tol, abs_tol, floor):
    """A whole JS grid (row-major, index i·ny + j) against a numpy grid: column-relative and
    cell-relative differences (see the header); (None, None) when no JS grid was sent."""
    if js is None:
        return None, None
    js = np.asarray(js, dtype=float).reshape(ref.shape)
    return column_rel_diff(js, ref, rel_tol, abs_tol), rel_diff(js, ref, floor)


def self_test_input():
    xs = list(np.linspace(600 / 64, 600, 64))
    ys = list(np.linspace(-150, 150, 64))
    base = dict(z=1.0, t=3650.0, v=0.3, ax=8.0, ay=0.8, az=0.08, width=30.0, thickness=5.0,
                R=1.8, decay=math.log(2) / 730)
    return {
        "minSeconds": 0.5,
        "minReps": 5,
        "floor": 1e-12,
        "relTol": 1e-6,
        "absTol": 1e-13,
        "domenico": [dict(base, xs=xs, ys=ys, label="self-test")],
        "exact": [dict(base, xs=xs, ys=ys, label="self-test")],
    }


def main():
    if "--self-test" in sys.argv:
        cfg = self_test_input()
    else:
        cfg = json.load(sys.stdin)
    min_s, min_reps = cfg.get("minSeconds", 0.5), cfg.get("minReps", 5)
    floor = cfg.get("floor", 1e-12)
    out = {
        "python": platform.python_version(),
        "numpy": np.__version__,
        "scipy": scipy.__version__,
    }

    # scipy's erf on the arguments of the Domenico lateral factor of the last (unmirrored) grid,
    # the counterpart of the JS bare erf loop
    lp = cfg["domenico"][-1]
    sy = (1.0 / (2.0 * np.sqrt(lp["ay"] * np.asarray(lp["xs"], dtype=float))))[:, None]
    ys = np.asarray(lp["ys"], dtype=float)[None, :]
    args = np.concatenate([((ys + lp["width"] / 2) * sy).ravel(), ((ys - lp["width"] / 2) * sy).ravel()])
    med, reps, sink = time_figure(lambda: erf(args)[None, :], min_s, min_reps)
    out["erf"] = {"calls": int(args.size), "medianSeconds": med, "reps": reps,
                  "callsPerSecond": args.size / med, "sink": sink}

    rel_tol = cfg.get("relTol", 1e-6)
    abs_tol = cfg.get("absTol", 1e-13)
    out["domenico"] = []
    for dp in cfg["domenico"]:
        med, reps, sink = time_figure(lambda: domenico_grid(dp), min_s, min_reps)
        cells = len(dp["xs"]) * len(dp["ys"])
        js_col, js_cell = compare_js_grid(domenico_grid(dp), dp.get("jsGrid"), rel_tol, abs_tol, floor)
        out["domenico"].append({
            "label": dp.get("label", ""), "cells": cells, "medianSeconds": med, "reps": reps,
            "cellsPerSecond": cells / med, "jsVsNumpyColumnRel": js_col, "jsVsNumpyCellRel": js_cell,
            "sink": sink,
        })

    out["exact"] = []
    for ep in cfg["exact"]:
        n, tried, fine = choose_nodes(ep, rel_tol, abs_tol, floor)
        med, reps, sink = time_figure(lambda: exact_grid(ep, n), min_s, min_reps)
        cells = len(ep["xs"]) * len(ep["ys"])
        js_col, js_cell = compare_js_grid(fine, ep.get("jsGrid"), rel_tol, abs_tol, floor)
        out["exact"].append({
            "label": ep.get("label", ""), "cells": cells, "nodes": n, "fineNodes": FINE_NODES,
            "achievedRelError": tried[-1]["relError"], "achievedCellRelError": tried[-1]["cellRelError"],
            "ladder": tried, "ogataBanksCheck": ogata_banks_check(dict(ep, floor=floor), n),
            "medianSeconds": med, "reps": reps, "cellsPerSecond": cells / med,
            "jsVsFineColumnRel": js_col, "jsVsFineCellRel": js_cell, "sink": sink,
        })
    out["relTol"], out["absTol"], out["floor"] = rel_tol, abs_tol, floor
    json.dump(out, sys.stdout)
    sys.stdout.write("\n")


if __name__ == "__main__":
    main()
