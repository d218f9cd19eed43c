"""Reference values for the uncertainty tests (test/fixtures/uncertainty.json), from scipy and numpy.

Regenerate:  python3 scripts/reference/uncertainty-fixtures.py > test/fixtures/uncertainty.json
Every value here comes from scipy/numpy, an implementation independent of the project's own code.
"""
import json
import numpy as np
import scipy
from scipy import special, stats

out = {"generator": "scripts/reference/uncertainty-fixtures.py", "scipy": scipy.__version__, "numpy": np.__version__}

# standard normal quantile Φ⁻¹(p) = scipy.special.ndtri, across AS 241's three branches
ps = [1e-300, 1e-100, 1e-30, 1e-12, 1e-11, 2.3e-8, 1e-6, 0.001, 0.02, 0.0749, 0.075, 0.076, 0.2, 0.3, 0.45, 0.5,
      0.55, 0.7, 0.9, 0.924, 0.925, 0.926, 0.99, 0.999999, 1 - 1e-10, 1 - 2**-53]
out["ndtri"] = [[p, float(special.ndtri(p))] for p in ps]
zs = [-37.0, -20.0, -8.0, -3.0, -1.0, -0.1, 0.0, 0.5, 1.0, 2.5, 5.0, 8.0]
out["ndtr"] = [[z, float(special.ndtr(z))] for z in zs]

# quantiles (ppf) of each distribution kind, parameters as the app states them
qs = [1e-6, 0.01, 0.1, 0.25, 0.5, 0.75, 0.9, 0.99, 1 - 1e-6]
def dist(name, params, frozen):
    return {"name": name, "params": params, "q": qs, "ppf": [float(frozen.ppf(q)) for q in qs],
            "cdfAt": [float(x) for x in frozen.ppf([0.05, 0.5, 0.95])], "cdf": [0.05, 0.5, 0.95]}

z95 = float(special.ndtri(0.95))
sigma_range = np.log(30.0 / 0.3) / (2 * z95)
out["distributions"] = [
    dist("uniform", {"kind": "uniform", "low": 0.25, "high": 0.4}, stats.uniform(loc=0.25, scale=0.15)),
    dist("log-uniform", {"kind": "log-uniform", "low": 0.01, "high": 100}, stats.loguniform(0.01, 100)),
    dist("triangular", {"kind": "triangular", "low": 0.1, "mode": 0.2, "high": 0.6}, stats.triang(c=(0.2 - 0.1) / 0.5, loc=0.1, scale=0.5)),
    dist("normal", {"kind": "normal", "mean": 135.0, "sd": 10.0}, stats.norm(loc=135.0, scale=10.0)),
    dist("lognormal", {"kind": "lognormal", "median": 12.0, "gsd": 3.0}, stats.lognorm(s=np.log(3.0), scale=12.0)),
    dist("lognormal-range", {"kind": "lognormal-range", "low": 0.3, "high": 30, "percentile": 5},
         stats.lognorm(s=sigma_range, scale=np.sqrt(0.3 * 30))),
    dist("truncated normal", {"kind": "normal", "mean": 0.3, "sd": 0.1, "truncate": {"low": 0.05, "high": 0.5}},
         stats.truncnorm(a=(0.05 - 0.3) / 0.1, b=(0.5 - 0.3) / 0.1, loc=0.3, scale=0.1)),
    dist("upper-tail truncated normal", {"kind": "normal", "mean": 0.0, "sd": 1.0, "truncate": {"low": 6.0}},
         stats.truncnorm(a=6.0, b=np.inf)),
    dist("truncated lognormal", {"kind": "lognormal", "median": 0.2, "gsd": 1.5, "truncate": {"high": 0.45}},
         stats.truncnorm(a=-np.inf, b=np.log(0.45 / 0.2) / np.log(1.5), loc=np.log(0.2), scale=np.log(1.5))),
]
# the truncated lognormal is exp of a truncated normal: transform its quantiles
tl = out["distributions"][-1]
tl["ppf"] = [float(np.exp(v)) for v in tl["ppf"]]
tl["cdfAt"] = [float(np.exp(v)) for v in tl["cdfAt"]]

# percentiles (numpy's default 'linear', Hyndman & Fan definition 7)
rng = np.random.default_rng(20261203)
vals = rng.lognormal(0.0, 1.0, 37)
pq = [0.0, 0.05, 0.25, 0.5, 0.75, 0.95, 1.0]
out["percentiles"] = {"values": vals.tolist(), "q": pq, "expected": [float(np.percentile(vals, 100 * q)) for q in pq]}

# Spearman rank correlation with ties (scipy.stats.spearmanr averages tied ranks)
x = rng.normal(size=60)
y = np.where(x + 0.7 * rng.normal(size=60) > 0.3, np.round(x + rng.normal(size=60), 1), 0.0)  # many ties at 0
out["spearman"] = {"x": x.tolist(), "y": y.tolist(), "rho": float(stats.spearmanr(x, y).statistic)}

# Wilson score interval (scipy.stats.binomtest(...).proportion_ci(method='wilson'))
out["wilson"] = []
for k, n in [(0, 50), (3, 50), (25, 50), (50, 50), (612, 1000), (1, 20000)]:
    ci = stats.binomtest(k, n).proportion_ci(confidence_level=0.95, method="wilson")
    out["wilson"].append({"k": k, "n": n, "low": float(ci.low), "high": float(ci.high)})

# Kolmogorov–Smirnov critical value at the 1 % level for large n: sqrt(-ln(0.005)/2) (asymptotic)
out["ksAsymptotic01"] = float(stats.kstwobign.ppf(0.99))

# least-squares plane h = a x + b y + c through head readings: covariance of (a, b) = s² (XᵀX)⁻¹ with
# the full (uncentred) design matrix [x, y, 1], by numpy.linalg (another route than the centred one)
pts = np.array([[0.0, 0.0, 20.31], [150.0, 10.0, 20.02], [30.0, 120.0, 20.20], [160.0, 140.0, 19.93], [80.0, 60.0, 20.14]])
X = np.column_stack([pts[:, 0], pts[:, 1], np.ones(len(pts))])
coef, res, *_ = np.linalg.lstsq(X, pts[:, 2], rcond=None)
r = pts[:, 2] - X @ coef
s2 = float(r @ r) / (len(pts) - 3)
cov = s2 * np.linalg.inv(X.T @ X)
out["plane"] = {"points": pts.tolist(), "a": float(coef[0]), "b": float(coef[1]), "caa": float(cov[0, 0]), "cab": float(cov[0, 1]), "cbb": float(cov[1, 1])}

print(json.dumps(out, indent=1))
