#!/usr/bin/env python3
"""
Vectorised numpy/scipy evaluation of the two concentration grids that `npm run bench` times in
JavaScript, so the benchmark can print a JS/numpy ratio for equal work.

Usage: bench/bench.ts runs `python3 bench/numpy_grids.py` as a child process and talks to it in
lines of JSON (see serve()): first the configuration (tolerances, and lists of Domenico and exact
grids, each with its parameters and the whole JS result as `jsGrid`), answered with the checks
(accuracy of the chosen rule, agreement with the JS grids); then one request per timed
repetition, so bench.ts can interleave numpy's repetitions with its own and both see the same
machine load. Run it by hand with `--self-test` for a built-in invented scenario.

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
  (t = ∞: the erfc factor is 2.) Each erf difference is formed as a difference of erfc values of
the mirrored pair (erf_diff), which keeps its relative accuracy in the far field, as the JS does.

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
sharing the JS grid uses; symmetric y values are mirrored as in the JS grid). τ(w) is closed
form (the positive root of a quadratic in √τ), so no root-finding is needed at the nodes. n is the
smallest value on a ladder whose grid agrees with a much finer rule (1024 points) to the
requested accuracy on every cell; the script prints the accuracy reached. The check is of the
quadrature only; the script also compares the whole-plane limit with the Ogata–Banks closed form,
and bench.ts compares the JS grid (an independent algorithm) with the fine rule.

Accuracy is measured as the JS exact grid states its own (src/core/solutions/patchSource.ts):
|error| ≤ relTol · (largest C/C0 in the column) + absTol, reported as the column-relative error
max |a − b| / (column max of |b| + absTol/relTol). Cell-by-cell relative differences
|a − b| / max(|b|, floor) are printed beside it for information.
"""

import functools
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


def erf_diff(a, b):
    """erf(a) − erf(b) without cancellation where a and b lie on the same side of 0 (the far
    field, where both are near ±1): with the pair mirrored so that a + b ≥ 0 it is
    erfc(b) − erfc(a), a difference of numbers that are small there (as the JS erfDiff)."""
    flip = (a + b) < 0.0
    a2 = np.where(flip, -b, a)
    b2 = np.where(flip, -a, b)
    return erfc(b2) - erfc(a2)


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
    fx *= erf_diff((z + h) * sz, (z - h) * sz)
    fx *= 0.125
    sy = (1.0 / (2.0 * np.sqrt(ay * xs)))[:, None]
    fy = erf_diff((ys + half_w)[None, :] * sy, (ys - half_w)[None, :] * sy)
    fy *= fx[:, None]
    return _mirror_join(fy, start, ys_all.size)


@functools.lru_cache(maxsize=None)
def _legendre(n):
    """n-point Gauss–Legendre rule on [−1, 1], computed once (like the JS rule's constant tables)."""
    return np.polynomial.legendre.leggauss(n)


def _w_nodes(xs, t, u, dx, n):
    """Gauss–Legendre nodes and weights in w for every x column: arrays of shape (nx, n)."""
    g, gw = _legendre(n)
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
    kern *= erf_diff((z + h) * szz, (z - h) * szz)
    sy = (1.0 / (2.0 * math.sqrt(dy) * s))[:, :, None]
    fy = erf_diff((ys + half_w)[None, None, :] * sy, (ys - half_w)[None, None, :] * sy)
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
    q = dict(p, width=1e9, thickness=1e9, decay=0.0, t=t, ys=np.zeros(1))
    got = exact_grid(q, n)[:, 0]
    want = np.array([ogata_banks(x, t, u, d) for x in q["xs"]])
    return rel_diff(got, want, p.get("floor", 1e-12))


def time_figure(fn, min_seconds, min_reps):
    """For --self-test: median seconds of one call; repeats until ≥ min_seconds and ≥ min_reps
    (after a warm-up call)."""
    fn()
    times = []
    while sum(times) < min_seconds or len(times) < min_reps:
        t0 = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t0)
    return statistics.median(times)


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
        "floor": 1e-12,
        "relTol": 1e-6,
        "absTol": 1e-13,
        "domenico": [dict(base, xs=xs, ys=ys, label="self-test")],
        "exact": [dict(base, xs=xs, ys=ys, label="self-test")],
    }


def setup(cfg):
    """Checks (accuracy of the chosen rule, agreement with the JS grids) and the timed
    computations: returns (info, runners), runners a dict name → function returning an array."""
    floor = cfg.get("floor", 1e-12)
    rel_tol = cfg.get("relTol", 1e-6)
    abs_tol = cfg.get("absTol", 1e-13)
    info = {
        "python": platform.python_version(), "numpy": np.__version__, "scipy": scipy.__version__,
        "relTol": rel_tol, "absTol": abs_tol, "floor": floor, "domenico": [], "exact": [],
    }
    runners = {}

    # scipy's erf on the arguments of the lateral factor of the last (unmirrored) Domenico grid,
    # the counterpart of the JS bare erf loop
    lp = cfg["domenico"][-1]
    sy = (1.0 / (2.0 * np.sqrt(lp["ay"] * np.asarray(lp["xs"], dtype=float))))[:, None]
    ys = np.asarray(lp["ys"], dtype=float)[None, :]
    args = np.concatenate([((ys + lp["width"] / 2) * sy).ravel(), ((ys - lp["width"] / 2) * sy).ravel()])
    runners["erf"] = lambda: erf(args)
    info["erfCalls"] = int(args.size)

    def arrays(g):
        """the grid's axes as arrays once, outside every clock (the JS side gets Float64Arrays)"""
        return dict(g, xs=np.asarray(g["xs"], dtype=float), ys=np.asarray(g["ys"], dtype=float), jsGrid=None)

    for k, dp in enumerate(cfg["domenico"]):
        js = dp.get("jsGrid")
        dp = arrays(dp)
        js_col, js_cell = compare_js_grid(domenico_grid(dp), js, rel_tol, abs_tol, floor)
        info["domenico"].append({
            "label": dp.get("label", ""), "cells": len(dp["xs"]) * len(dp["ys"]),
            "jsVsNumpyColumnRel": js_col, "jsVsNumpyCellRel": js_cell,
        })
        runners[f"domenico:{k}"] = lambda dp=dp: domenico_grid(dp)

    for k, ep in enumerate(cfg["exact"]):
        js = ep.get("jsGrid")
        ep = arrays(ep)
        n, tried, fine = choose_nodes(ep, rel_tol, abs_tol, floor)
        js_col, js_cell = compare_js_grid(fine, js, rel_tol, abs_tol, floor)
        info["exact"].append({
            "label": ep.get("label", ""), "cells": len(ep["xs"]) * len(ep["ys"]), "nodes": n,
            "fineNodes": FINE_NODES, "achievedRelError": tried[-1]["relError"],
            "achievedCellRelError": tried[-1]["cellRelError"], "ladder": tried,
            "ogataBanksCheck": ogata_banks_check(dict(ep, floor=floor), n),
            "jsVsFineColumnRel": js_col, "jsVsFineCellRel": js_cell,
        })
        runners[f"exact:{k}"] = lambda ep=ep, n=n: exact_grid(ep, n)
    return info, runners


def serve():
    """Line protocol on stdin/stdout: first line the configuration, answered by {"ready": info};
    then {"run": name, "calls": k} per repetition, answered by {"seconds": s, "calls": k,
    "sink": x} (the clock covers the k calls only; the results are summed into the sink after it
    stops); {"quit": true} ends."""
    cfg = json.loads(sys.stdin.readline())
    info, runners = setup(cfg)
    sys.stdout.write(json.dumps({"ready": info, "runners": sorted(runners)}) + "\n")
    sys.stdout.flush()
    for line in sys.stdin:
        cmd = json.loads(line)
        if cmd.get("quit"):
            break
        fn = runners[cmd["run"]]
        calls = int(cmd.get("calls", 1))
        results = [None] * calls
        t0 = time.perf_counter()
        for c in range(calls):
            results[c] = fn()
        dt = time.perf_counter() - t0
        sink = float(sum(np.sum(r) for r in results))
        sys.stdout.write(json.dumps({"seconds": dt, "calls": calls, "sink": sink}) + "\n")
        sys.stdout.flush()


def self_test():
    info, runners = setup(self_test_input())
    rates = {}
    for name, fn in runners.items():
        med = time_figure(fn, 0.5, 5)
        rates[name] = {"medianSeconds": med}
    json.dump({"info": info, "timings": rates}, sys.stdout, indent=1)
    sys.stdout.write("\n")


if __name__ == "__main__":
    self_test() if "--self-test" in sys.argv else serve()
