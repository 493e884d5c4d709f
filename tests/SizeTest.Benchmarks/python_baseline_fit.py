#!/usr/bin/python3
"""Python baseline for the whole-process fit timing (issue 11, performance).

The same analysis as `sizetest fit CATALOG --models lcdm,static-linear --free omega_m --observable size --cv-folds 0`,
written the way a careful user of the standard stack would: astropy for the distances, scipy.optimize L-BFGS-B
(bounded, finite-difference gradients) from 4 starts per model, a finite-difference Hessian for the errors.

Model (as in SizeTest): ln theta_i ~ N(ln[R0 (1+z)^a / D_A(z)] + ln 1e-3, s_i^2 + (ln10 * scatter_dex)^2), theta in radians,
R0 in kpc, D_A in Mpc. lcdm: flat LambdaCDM, H0 = 70, no radiation (Tcmb0 = 0), Omega_m free. static-linear: D = cz/H0.

Usage: /usr/bin/python3 python_baseline_fit.py CATALOG.csv
Versions are printed on the first line (measured with Debian's python3-astropy, python3-scipy, python3-numpy).
"""
import sys, csv, math, time
import numpy as np
import scipy, astropy
from scipy.optimize import minimize
from astropy.cosmology import FlatLambdaCDM
from astropy.constants import c as C_LIGHT

RAD_PER_ARCSEC = math.pi / (180 * 3600)
LN10 = math.log(10)
C_KMS = C_LIGHT.to("km/s").value


def load(path):
    with open(path) as f:
        rows = [r for r in f if not r.startswith("#")]
    reader = csv.reader(rows)
    header = [h.strip().lower() for h in next(reader)]
    data = np.array([[float(x) for x in r] for r in reader if r], dtype=float)
    col = {h: i for i, h in enumerate(header)}
    z = data[:, col["z"]]
    theta = data[:, col["theta"]] * RAD_PER_ARCSEC
    err = data[:, col["theta_err"]] * RAD_PER_ARCSEC
    return z, np.log(theta), (err / theta) ** 2


def neg_log_like(ln_da, y, s2, z, r0, a, sd):
    m = math.log(r0) + math.log(1e-3) + a * np.log1p(z) - ln_da
    v = s2 + (LN10 * sd) ** 2
    r = y - m
    return 0.5 * np.sum(r * r / v + np.log(2 * math.pi * v))


def fit(name, objective, x0, bounds, starts=4, seed=1):
    rng = np.random.default_rng(seed)
    best = None
    for s in range(starts):
        start = np.array(x0) if s == 0 else np.clip(np.array(x0) * np.exp(0.3 * rng.standard_normal(len(x0))), [b[0] for b in bounds], [b[1] for b in bounds])
        r = minimize(objective, start, method="L-BFGS-B", bounds=bounds, options={"ftol": 1e-12, "gtol": 1e-8, "maxiter": 2000})
        if best is None or r.fun < best.fun:
            best = r
    x = best.x
    # Central-difference Hessian of the objective.
    d = len(x)
    h = 1e-4 * np.maximum(np.abs(x), 1e-2)
    H = np.zeros((d, d))
    for i in range(d):
        for j in range(i, d):
            def f(di, dj):
                p = x.copy(); p[i] += di; p[j] += dj
                return objective(p)
            H[i, j] = H[j, i] = (f(h[i], h[j]) - f(h[i], -h[j]) - f(-h[i], h[j]) + f(-h[i], -h[j])) / (4 * h[i] * h[j])
    cov = np.linalg.inv(H)
    se = np.sqrt(np.diag(cov))
    print(f"{name}: lnL = {-best.fun:.4f}  " + "  ".join(f"{v:.5g}±{e:.2g}" for v, e in zip(x, se)), flush=True)
    return -best.fun


def main():
    t0 = time.perf_counter()
    print(f"python {sys.version.split()[0]}, numpy {np.__version__}, scipy {scipy.__version__}, astropy {astropy.__version__}")
    z, y, s2 = load(sys.argv[1])
    med_r0 = float(np.exp(np.median(y - math.log(1e-3) + np.log(FlatLambdaCDM(H0=70, Om0=0.3).angular_diameter_distance(z).value))))

    def lcdm(p):
        om, r0, a, sd = p
        ln_da = np.log(FlatLambdaCDM(H0=70, Om0=om).angular_diameter_distance(z).value)
        return neg_log_like(ln_da, y, s2, z, r0, a, sd)

    ln_d_static = np.log(C_KMS / 70 * z)

    def static(p):
        r0, a, sd = p
        return neg_log_like(ln_d_static, y, s2, z, r0, a, sd)

    l1 = fit("lcdm", lcdm, [0.3, med_r0, 0.0, 0.2], [(1e-3, 5), (1e-4, 1e4), (-6, 6), (1e-4, 3)])
    l2 = fit("static-linear", static, [med_r0, 0.0, 0.2], [(1e-4, 1e4), (-6, 6), (1e-4, 3)])
    print(f"delta lnL (lcdm - static-linear) = {l1 - l2:.3f}; n = {len(z)}; {time.perf_counter() - t0:.2f} s")


if __name__ == "__main__":
    main()
