#!/usr/bin/env python3
"""
A vectorised numpy version of the random walk `npm run bench` times in JavaScript
(src/core/particles/walk.ts, timed by bench/particles.ts), for a ratio of equal work.

Input (one JSON object on stdin): the prepared walk as the JS plans it for a demo case: the well
field (regional discharge Q0 = q*B, n_e*B, every singularity x, y, s = Q/2pi, rw^2 including the
image wells, the boundary lines), the source (width, C0 scale, decline), the transport (aL, aT,
De/R, R, the decay rate on particle mass), the output times, the step control eps, the capture
circles of the pumping wells, the observers' disks, the density grid, the particle count and the
number of timed repetitions. Output (one JSON object): seconds per repetition (median), steps,
and the tallies of the last repetition (for the agreement check the JS makes).

The same walk, particle for particle in rule (not in random numbers: numpy's PCG64 normals here,
xoshiro128** with a ziggurat in the JS (src/core/particles/stream.ts), so the two agree within
their statistical error, not bit for bit):
  - release at stratified times t_j = (j + U)/N * T_active, y uniform across the source width,
    mass C0 * H * W * (T_active/N) * q_x(0, y) * exp(-gamma t_j);
  - Ito step X <- X + (u + div D) dt + B xi sqrt(dt), u = v/R, D Scheidegger's tensor
    ((aT|u| + De/R) I + (aL - aT) u u^T/|u|), div D from the analytical velocity gradient;
  - dt = min(time to the next output time, eps/||grad u||), and near each pumping well the
    advective move at most eps * (distance to its capture circle) and 8 D_L dt <= distance^2;
  - within 1.05 r_c of a pumping well: captured (mass into that well at that output interval);
    across a constant-head line: gone; across an impermeable line: reflected;
  - at each output time reached: mass (decayed as m0 exp(-lam (t_k - t0))) into the aquifer total,
    the observers' disks and the density grid's frame.
Vectorised over particles: every iteration takes one step of every particle still walking (each
on its own clock), the set of walking particles compacted as they finish. One thread (numpy's
element-wise operations do not use threads).
"""
import json
import statistics
import sys
import time

import numpy as np

MAX_STEPS_PER_PARTICLE = 200_000


def walk(p, rng):
    f = p["field"]
    sx = np.asarray(f["sx"], dtype=float)
    sy = np.asarray(f["sy"], dtype=float)
    ss = np.asarray(f["ss"], dtype=float)
    sr2 = np.asarray(f["sr2"], dtype=float)
    q0, nB, porosity = f["q0"], f["nB"], f["porosity"]
    lines = f["lines"]
    times = np.asarray(p["times"], dtype=float)
    nt = len(times)
    horizon = times[-1]
    N = p["particles"]
    R, lam, eps = p["R"], p["lam"], p["eps"]
    aL, aT, dm = p["ax"], p["ay"], p["dm"]
    src = p["source"]
    active_end = p["activeEnd"]
    sinks = p["sinks"]
    obs = p["observers"]
    grid = p["grid"]

    def velocity_gradient(x, y):
        """seepage velocity and its gradient (vx, vy, dvx/dx, dvx/dy = dvy/dx, dvy/dy), as field.ts"""
        qx = np.full_like(x, q0)
        qy = np.zeros_like(x)
        axx = np.zeros_like(x)
        ayy = np.zeros_like(x)
        axy = np.zeros_like(x)
        for k in range(len(sx)):
            dx = x - sx[k]
            dy = y - sy[k]
            r2 = dx * dx + dy * dy
            inside = r2 < sr2[k]
            c = ss[k] / np.where(inside, sr2[k], r2)
            qx -= c * dx
            qy -= c * dy
            c2 = np.where(inside, 0.0, c / r2)
            dd = c2 * (dy * dy - dx * dx)
            cin = np.where(inside, c, 0.0)
            axx -= dd + cin
            ayy -= cin - dd
            axy += 2.0 * c2 * dx * dy
        inv = 1.0 / nB
        return qx * inv, qy * inv, axx * inv, axy * inv, ayy * inv

    # ---- release
    j = np.arange(N, dtype=float)
    t = (j + rng.random(N)) / N * active_end
    x = np.zeros(N)
    y = (rng.random(N) - 0.5) * src["width"]
    vx0 = velocity_gradient(x, y)[0]
    mass_scale = src["c0"] * src["thickness"] * src["width"] * (active_end / N)
    m0 = mass_scale * np.maximum(0.0, vx0) * porosity * np.exp(-src["sourceDecay"] * t)
    keep = (t < horizon) & (m0 > 0)
    t, x, y, m0 = t[keep], x[keep], y[keep], m0[keep]
    t0 = t.copy()
    k = np.searchsorted(times, t, side="right")  # first output time > t
    steps = np.zeros(len(t), dtype=np.int64)

    no = len(obs)
    ns = len(sinks)
    obs_mass = np.zeros(no * nt)
    obs_mass2 = np.zeros(no * nt)
    well_mass = np.zeros(ns * nt)
    well_mass2 = np.zeros(ns * nt)
    aquifer_mass = np.zeros(nt)
    every = grid["every"] if grid else 1
    frames = nt // every if grid else 0
    grid_mass = np.zeros(grid["nx"] * grid["ny"] * frames if grid else 0)
    released = float(m0.sum())
    captured = outflow = decayed = 0.0
    stalled = 0
    total_steps = 0
    obs_x = np.array([o["x"] for o in obs])
    obs_y = np.array([o["y"] for o in obs])
    obs_r2 = np.array([o["radius"] ** 2 for o in obs])
    obs_area = 1.0 / (np.pi * obs_r2)

    def finish_in_aquifer(sel):
        nonlocal decayed
        decayed += float((m0[sel] - m0[sel] * np.exp(-lam * (horizon - t0[sel]))).sum())

    walking = k < nt
    finish_in_aquifer(~walking)
    x, y, t, t0, m0, k, steps = (a[walking] for a in (x, y, t, t0, m0, k, steps))

    while len(x) > 0:
        vx, vy, gxx, gxy, gyy = velocity_gradient(x, y)
        ux, uy = vx / R, vy / R
        gx, gxy, gy = gxx / R, gxy / R, gyy / R
        gyx = gxy
        sp = np.sqrt(ux * ux + uy * uy)
        dt = times[k] - t
        gn = np.sqrt(gx * gx + 2.0 * gxy * gxy + gy * gy)
        dt = np.where(gn > 0, np.minimum(dt, eps / np.where(gn > 0, gn, 1.0)), dt)
        DL = aL * sp + dm
        DT = aT * sp + dm
        moving = sp > 0
        sps = np.where(moving, sp, 1.0)
        eLx = np.where(moving, ux / sps, 1.0)
        eLy = np.where(moving, uy / sps, 0.0)
        dspx = eLx * gx + eLy * gyx
        dspy = eLx * gxy + eLy * gy
        b = aL - aT
        div = gx + gy
        ugs = eLx * dspx + eLy * dspy
        driftX = np.where(moving, aT * dspx + b * (gx * eLx + gxy * eLy + eLx * div - eLx * ugs), 0.0)
        driftY = np.where(moving, aT * dspy + b * (gyx * eLx + gy * eLy + eLy * div - eLy * ugs), 0.0)
        ax2 = ux + driftX
        ay2 = uy + driftY
        adv = np.sqrt(ax2 * ax2 + ay2 * ay2)
        into = np.full(len(x), -1)
        for w in range(ns - 1, -1, -1):  # the first well in order wins, as in the JS loop
            s = sinks[w]
            d = np.sqrt((x - s["x"]) ** 2 + (y - s["y"]) ** 2) - s["rc"]
            near = d <= 0.05 * s["rc"]
            into[near] = w
            e = eps * d
            lim = adv * dt > e
            dt = np.where(lim & ~near, e / np.where(adv > 0, adv, 1.0), dt)
            lim = 8.0 * DL * dt > d * d
            dt = np.where(lim & ~near, d * d / np.where(DL > 0, 8.0 * DL, 1.0), dt)
        cap = into >= 0
        if cap.any():
            m = m0[cap] * np.exp(-lam * (t[cap] - t0[cap]))
            idx = into[cap] * nt + k[cap]
            well_mass += np.bincount(idx, weights=m, minlength=ns * nt)
            well_mass2 += np.bincount(idx, weights=m * m, minlength=ns * nt)
            captured += float(m.sum())
            decayed += float((m0[cap] - m).sum())
        steps += 1
        stall = ~cap & (steps > MAX_STEPS_PER_PARTICLE)
        if stall.any():
            stalled += int(stall.sum())
            finish_in_aquifer(stall)
            for kk in range(nt):
                sel = stall & (k <= kk)
                aquifer_mass[kk] += float((m0[sel] * np.exp(-lam * (times[kk] - t0[sel]))).sum())
        go = ~cap & ~stall
        if not go.all():
            x, y, t, t0, m0, k, steps, dt, ux, uy, driftX, driftY, eLx, eLy, DL, DT = (
                a[go] for a in (x, y, t, t0, m0, k, steps, dt, ux, uy, driftX, driftY, eLx, eLy, DL, DT)
            )
        n = len(x)
        if n == 0:
            break
        z = rng.standard_normal((2, n))
        sq = np.sqrt(dt)
        zL = z[0] * np.sqrt(2.0 * DL) * sq
        zT = z[1] * np.sqrt(2.0 * DT) * sq
        nx = x + (ux + driftX) * dt + eLx * zL - eLy * zT
        ny = y + (uy + driftY) * dt + eLy * zL + eLx * zT
        tk = times[k]
        t = np.where(dt == tk - t, tk, t + dt)
        gone = np.zeros(n, dtype=bool)
        for ln in lines:
            d = (nx - ln["px"]) * ln["nx"] + (ny - ln["py"]) * ln["ny"]
            across = d < 0
            if ln["kind"] == "constant-head":
                gone |= across
            else:
                nx = np.where(across, nx - 2.0 * d * ln["nx"], nx)
                ny = np.where(across, ny - 2.0 * d * ln["ny"], ny)
        if gone.any():
            m = m0[gone] * np.exp(-lam * (t[gone] - t0[gone]))
            outflow += float(m.sum())
            decayed += float((m0[gone] - m).sum())
            stay = ~gone
            nx, ny, t, t0, m0, k, steps = (a[stay] for a in (nx, ny, t, t0, m0, k, steps))
        x, y = nx, ny
        total_steps += len(x)
        rec = times[k] <= t  # a step ends at most on the next output time
        if rec.any():
            kr = k[rec]
            xr, yr = x[rec], y[rec]
            m = m0[rec] * np.exp(-lam * (times[kr] - t0[rec]))
            aquifer_mass += np.bincount(kr, weights=m, minlength=nt)
            for o in range(no):
                dx = xr - obs_x[o]
                dy = yr - obs_y[o]
                inside = dx * dx + dy * dy <= obs_r2[o]
                if inside.any():
                    mi = m[inside] * obs_area[o]
                    obs_mass[o * nt:(o + 1) * nt] += np.bincount(kr[inside], weights=mi, minlength=nt)
                    obs_mass2[o * nt:(o + 1) * nt] += np.bincount(kr[inside], weights=mi * mi, minlength=nt)
            if grid:
                g = grid
                on_frame = ((kr + 1) % every == 0) & ((kr + 1) // every <= frames)
                ix = np.floor((xr - g["x0"]) / g["dx"]).astype(np.int64)
                iy = np.floor((yr - g["y0"]) / g["dy"]).astype(np.int64)
                sel = on_frame & (ix >= 0) & (iy >= 0) & (ix < g["nx"]) & (iy < g["ny"])
                if sel.any():
                    frame = (kr[sel] + 1) // every - 1
                    cell = (frame * g["ny"] + iy[sel]) * g["nx"] + ix[sel]
                    grid_mass += np.bincount(cell, weights=m[sel], minlength=len(grid_mass))
            k = k + rec
        done = k >= nt
        if done.any():
            finish_in_aquifer(done)
            stay = ~done
            x, y, t, t0, m0, k, steps = (a[stay] for a in (x, y, t, t0, m0, k, steps))

    return {
        "obsMass": obs_mass.tolist(),
        "obsMass2": obs_mass2.tolist(),
        "wellMass": well_mass.tolist(),
        "wellMass2": well_mass2.tolist(),
        "aquiferMass": aquifer_mass.tolist(),
        "gridMassTotal": float(grid_mass.sum()),
        "released": released,
        "captured": captured,
        "outflow": outflow,
        "decayed": decayed,
        "stalled": stalled,
        "steps": total_steps,
    }


def main():
    p = json.load(sys.stdin)
    rng = np.random.default_rng(p["seed"])
    secs = []
    out = None
    for _ in range(p["reps"]):
        t0 = time.perf_counter()
        out = walk(p, rng)
        secs.append(time.perf_counter() - t0)
    out["seconds"] = statistics.median(secs)
    out["numpy"] = np.__version__
    out["python"] = sys.version.split()[0]
    json.dump(out, sys.stdout)


if __name__ == "__main__":
    main()
