"""Independent maximum-likelihood fit of a photometric-redshift size sample under a flat redshift prior that cuts the data.

Model (docs/likelihood.md, size observable, log-normal errors): ln θ_i ~ N(ln r0 + a ln(1+z) − ln D_A(z), σ_i² + σ²),
σ_i = θ_err/θ, σ = ln10 · scatter_dex, r0 in kpc; each object integrated over its true redshift under a flat prior on
[lo, hi] times N(z_obs; z, z_err²):
  L_i = ∫_lo^hi N(ln θ_i; μ(z), v_i) N(z; z_obs, z_err²) dz / ∫_lo^hi N(z; z_obs, z_err²) dz,
the denominator a constant of the parameters (the same normalisation as SizeTest's, whose node weights sum to 1).
The integral is taken by scipy.integrate.quad (adaptive, epsabs 0, epsrel 1e-11) on the part of [lo, hi] within 12 σ of
z_obs; D_A from astropy FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=0) tabulated on a 20001-point grid and interpolated by a cubic
spline (error < 1e-9 relative). Nelder–Mead (scipy) from the point given, then a final polish.
Generated with /usr/bin/python3: numpy 1.24.2, scipy 1.10.1, astropy 5.2.1.

usage: photoz_truncated_prior.py CATALOGUE.csv LO HI  → prints ln L, r0_kpc, size_evolution, scatter_dex at the maximum
"""
import sys
import numpy as np
from scipy.integrate import quad
from scipy.interpolate import CubicSpline
from scipy.optimize import minimize
from astropy.cosmology import FlatLambdaCDM

path, lo, hi = sys.argv[1], float(sys.argv[2]), float(sys.argv[3])
d = np.genfromtxt(path, delimiter=',', names=True, dtype=None, encoding=None)
zobs, zerr, th, te = d['z'], d['z_err'], d['theta'], d['theta_err']
y = np.log(th / 206264.80624709636)
s2 = (te / th) ** 2
cos = FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=0)
zg = np.linspace(max(lo, 1e-4), hi, 20001)
lnda = CubicSpline(zg, np.log(cos.angular_diameter_distance(zg).value))


def object_lnl(i, lnr0, a, sig):
    v = s2[i] + sig * sig
    a0, b0 = max(lo, zobs[i] - 12 * zerr[i]), min(hi, zobs[i] + 12 * zerr[i])
    if not b0 > a0:
        a0, b0 = (lo, lo + 1e-6 * (hi - lo)) if zobs[i] < lo else (hi - 1e-6 * (hi - lo), hi)
    gz = lambda z: np.exp(-0.5 * ((z - zobs[i]) / zerr[i]) ** 2)
    def f(z):
        mu = lnr0 + np.log(1e-3) + a * np.log1p(z) - lnda(z)
        return np.exp(-0.5 * (y[i] - mu) ** 2 / v) / np.sqrt(2 * np.pi * v) * gz(z)
    num = quad(f, a0, b0, epsabs=0, epsrel=1e-11, limit=200)[0]
    den = quad(gz, a0, b0, epsabs=0, epsrel=1e-12, limit=200)[0]
    return np.log(num / den)


def nll(p):
    lnr0, a, sd = p
    if sd <= 0: return 1e30
    sig = np.log(10) * sd
    return -sum(object_lnl(i, lnr0, a, sig) for i in range(len(y)))


start = [float(x) for x in sys.argv[4:7]] if len(sys.argv) > 6 else [np.log(8), -1.5, 0.2]
res = minimize(nll, start, method='Nelder-Mead', options={'xatol': 1e-7, 'fatol': 1e-9, 'maxiter': 4000})
res = minimize(nll, res.x, method='Nelder-Mead', options={'xatol': 1e-8, 'fatol': 1e-10, 'maxiter': 4000})
print("lnL %.6f r0_kpc %.6f size_evolution %.6f scatter_dex %.6f" % (-res.fun, np.exp(res.x[0]), res.x[1], res.x[2]))
