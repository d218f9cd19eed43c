"""
Reference values of the exact rectangular-source solution on the advancing front (C/C0 between
1e-12 and 1e-6), for test/core/solutions/patchSource.front.test.ts. Independent of the engine: mpmath (arbitrary
precision, 30 digits) integrates the solution in its textbook form over the travel time tau,

  C/C0 = int_0^t f(tau) Y(y, tau) Z(z, tau) dtau
  f    = x / (2 sqrt(pi Dx tau^3)) exp(-(x - v tau)^2 / (4 Dx tau) - lam tau)
  Y    = [erf((y + W/2)/(2 sqrt(Dy tau))) - erf((y - W/2)/(2 sqrt(Dy tau)))] / 2
  Z    = [erf((z + H)/(2 sqrt(Dz tau)))   - erf((z - H)/(2 sqrt(Dz tau)))]   / 2

(Wexler 1992, USGS TWRI 3-B7, the finite patch source; v and D divided by R), with tanh-sinh
quadrature on panels that close geometrically on tau = t, where the front's integrand peaks. Each
value is computed twice (two panel sets, 30 and 40 digits) and kept only if they agree to 1e-15.

Run: python3 scripts/reference/exact_front.py > test/fixtures/exact-front.json   (pip install mpmath)
"""
import json
import mpmath as mp

# parameter sets (invented, screening-plausible): v m/d, dispersivities m, R, decay 1/d, t d,
# source width and thickness m, depth z m; x values on the advancing front
SETS = [
    dict(v=0.3, ax=0.5, ay=0.05, az=0.005, R=1, decay=0, t=1000, width=20, thickness=3, z=1, xs=[400, 410, 421], ys=[0, 12]),
    dict(v=0.3, ax=0.5, ay=0.05, az=0.005, R=1, decay=0.001, t=100, width=20, thickness=3, z=1, xs=[60, 68.5], ys=[0]),
    dict(v=1, ax=2, ay=0.2, az=0.02, R=3, decay=0, t=1000, width=20, thickness=3, z=1, xs=[520, 584.3333333333333], ys=[0]),
    dict(v=0.24, ax=10, ay=1, az=0.1, R=1.8, decay=0.6931471805599453 / 730, t=3652.5, width=30, thickness=4, z=1, xs=[900, 1000, 1100], ys=[0, 60]),
]


def conc(p, x, y, panels):
    v = mp.mpf(p['v']) / p['R']
    Dx = mp.mpf(p['ax']) * p['v'] / p['R']
    Dy = mp.mpf(p['ay']) * p['v'] / p['R']
    Dz = mp.mpf(p['az']) * p['v'] / p['R']
    lam = mp.mpf(p['decay'])
    W = mp.mpf(p['width'])
    H = mp.mpf(p['thickness'])
    x = mp.mpf(x)
    y = mp.mpf(y)
    z = mp.mpf(p['z'])
    t = mp.mpf(p['t'])

    def f(tau):
        if tau <= 0:
            return mp.mpf(0)
        fp = x / (2 * mp.sqrt(mp.pi * Dx * tau**3)) * mp.exp(-(x - v * tau) ** 2 / (4 * Dx * tau) - lam * tau)
        sy = 2 * mp.sqrt(Dy * tau)
        sz = 2 * mp.sqrt(Dz * tau)
        return fp * (mp.erf((y + W / 2) / sy) - mp.erf((y - W / 2) / sy)) / 2 * (mp.erf((z + H) / sz) - mp.erf((z - H) / sz)) / 2

    pts = sorted(set([mp.mpf(0)] + [t * k / panels for k in range(1, panels)] + [t * (1 - mp.mpf(2) ** -k) for k in range(1, 40)] + [t]))
    return mp.quad(f, pts)


out = []
for p in SETS:
    for x in p['xs']:
        for y in p['ys']:
            mp.mp.dps = 30
            a = conc(p, x, y, 8)
            mp.mp.dps = 40
            b = conc(p, x, y, 13)
            assert abs(a - b) <= mp.mpf('1e-15') * abs(b), (x, y, a, b)
            params = {k: p[k] for k in ('v', 'ax', 'ay', 'az', 'R', 'decay', 't', 'width', 'thickness', 'z')}
            out.append({**params, 'x': x, 'y': y, 'c': float(b), 'digits': mp.nstr(b, 20)})
print(json.dumps({'source': 'scripts/reference/exact_front.py (mpmath %s, 30- and 40-digit quadrature agreeing to 1e-15)' % mp.__version__, 'points': out}, indent=1))
