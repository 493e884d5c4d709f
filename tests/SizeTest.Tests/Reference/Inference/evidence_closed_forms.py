#!/usr/bin/python3
"""Exact evidences of the nested-sampling calibration problems (tests/SizeTest.Tests/Inference/Sampling/EvidenceProblems.cs).

Every likelihood there is a normalised density p(theta) on R^d, and the prior is uniform on a box B of volume V, so
    Z = P(theta in B) / V,   ln Z = ln P(theta in B) - ln V.
P(theta in B) is computed here twice where possible: from scipy.stats (normal and multivariate-normal CDFs) and by
direct numerical integration with scipy.integrate, independently of the C# closed forms.

Run: /usr/bin/python3 evidence_closed_forms.py > evidence_closed_forms.txt   (Debian scipy 1.10.1, numpy 1.24)
"""
import numpy as np
import scipy
from scipy import integrate, stats


def log_volume(box):
    return float(np.sum([np.log(b - a) for a, b in box]))


def gauss3():
    m, s = [0.3, -1.0, 4.2], [0.5, 0.2, 0.8]
    box = [(-5, 5), (-4, 2), (-5, 5)]
    p_cdf = np.prod([stats.norm.cdf(b, mi, si) - stats.norm.cdf(a, mi, si) for (a, b), mi, si in zip(box, m, s)])
    p_int = np.prod([integrate.quad(lambda x, mi=mi, si=si: stats.norm.pdf(x, mi, si), a, b, epsabs=0, epsrel=1e-12, points=[mi])[0]
                     for (a, b), mi, si in zip(box, m, s)])
    return "gauss-3d", box, p_cdf, p_int


def correlated4():
    mean, sd, rho = np.array([0.2, -0.1, 0.5, 0.0]), np.array([0.1, 0.05, 0.2, 0.1]), 0.95
    box = [(-1, 1), (-1, 1), (-2, 3), (-1, 1)]
    idx = np.arange(4)
    cov = np.outer(sd, sd) * rho ** np.abs(idx[:, None] - idx[None, :])
    lo, hi = np.array([a for a, _ in box]), np.array([b for _, b in box])
    p_cdf = stats.multivariate_normal.cdf(hi, mean=mean, cov=cov, lower_limit=lo, abseps=1e-12, releps=1e-12, maxpts=10_000_000)
    # Independent bound: the box holds every marginal to >= 8 sigma, so by the union bound 1 - P <= sum of marginal tails.
    tails = sum(stats.norm.cdf(a, m, s) + stats.norm.sf(b, m, s) for (a, b), m, s in zip(box, mean, sd))
    return "correlated-4d", box, p_cdf, 1.0 - tails


def mixture2():
    w = [0.7, 0.3]
    m = [[-2.0, -2.0], [3.0, 2.5]]
    s = [[0.3, 0.3], [0.15, 0.5]]
    box = [(-5, 5), (-5, 5)]
    p_cdf = sum(wc * np.prod([stats.norm.cdf(b, mk, sk) - stats.norm.cdf(a, mk, sk) for (a, b), mk, sk in zip(box, mc, sc)])
                for wc, mc, sc in zip(w, m, s))

    def pdf(y, x):
        return sum(wc * stats.norm.pdf(x, mc[0], sc[0]) * stats.norm.pdf(y, mc[1], sc[1]) for wc, mc, sc in zip(w, m, s))

    # Integrate each mode's neighbourhood separately (the modes are narrow), plus the rest of the box.
    p_int = 0.0
    xs = [-5, -4, 0, 2, 4, 5]
    ys = [-5, -4, 0, 0.5, 4.5, 5]
    for xa, xb in zip(xs[:-1], xs[1:]):
        for ya, yb in zip(ys[:-1], ys[1:]):
            p_int += integrate.dblquad(pdf, xa, xb, ya, yb, epsabs=1e-14, epsrel=1e-11)[0]
    return "mixture-2d", box, p_cdf, p_int


def twisted4():
    box = [(-7, 7), (-3, 50), (-2, 2), (-2, 2)]
    pair_cov = [[0.04, 0.038], [0.038, 0.04]]
    p_pair = stats.multivariate_normal.cdf([2, 2], mean=[0, 0], cov=pair_cov, lower_limit=[-2, -2], abseps=1e-13, releps=1e-13)
    # (theta0, theta1): theta0 ~ N(0,1), theta1 | theta0 ~ N(theta0^2 - 1, 0.1^2); integrate the joint density numerically.
    def inner(x0):
        c = x0 * x0 - 1
        lo, hi = max(-3, c - 1.5), min(50, c + 1.5)   # 15 sigma of theta1 around its mean; beyond it the density is < 1e-48
        if hi <= lo:
            return 0.0
        return integrate.quad(lambda x1: stats.norm.pdf(x1, c, 0.1), lo, hi, epsabs=0, epsrel=1e-12, points=[c] if lo < c < hi else None)[0]
    p_banana = integrate.quad(lambda x0: stats.norm.pdf(x0) * inner(x0), -7, 7, epsabs=1e-15, epsrel=1e-12, limit=200, points=[-1, 0, 1])[0]
    p_cdf = (stats.norm.cdf(7) - stats.norm.cdf(-7)) * p_pair   # theta1 box [-3, 50] holds every theta0 in [-7, 7] to > 15 sigma
    return "twisted-4d", box, p_cdf, p_banana * p_pair


print(f"# exact ln Z = ln P(theta in box) - ln V of EvidenceProblems.cs; scipy {scipy.__version__}, numpy {np.__version__}")
print("# name           ln_Z_exact        ln_P_stats        ln_P_integrate")
for name, box, p_cdf, p_int in [gauss3(), correlated4(), mixture2(), twisted4()]:
    print(f"{name:<14} {np.log(p_cdf) - log_volume(box):17.10f} {np.log(p_cdf):17.3e} {np.log(p_int):17.3e}")
