#!/usr/bin/python3
"""Independent profile likelihood of omega_m for the committed mock bimodal_omega_m_mock.csv.

Run: /usr/bin/python3 bimodal_profile.py  (writes bimodal_profile.json beside it)

Model (SizeTest's angular-size likelihood, re-derived here, not imported):
  ln theta_i ~ N( ln R0 + a ln(1+z_i) + ln(1e-3) - ln D_A(z_i; omega_m),  e_i^2 + (ln10 * s)^2 )
with R0 in kpc, D_A in Mpc from astropy's FlatLambdaCDM(H0=70, Om0=omega_m, Tcmb0=0), s = scatter_dex.
For each omega_m on a dense grid the nuisance parameters (ln R0, a, s) are maximised with scipy
(closed-form weighted least squares for ln R0 and a at fixed s, then a bounded 1-D search in s).
Output: the profile, its local maxima, the global maximum and the Delta lnL = 1/2 interval (outermost crossings,
linear interpolation between grid points).
"""
import json, math, os, sys
import numpy as np
import scipy, astropy
from scipy.optimize import minimize_scalar
from astropy.cosmology import FlatLambdaCDM

here = os.path.dirname(os.path.abspath(__file__))
data = np.genfromtxt(os.path.join(here, "bimodal_omega_m_mock.csv"), delimiter=",", skip_header=1, names=True)
z, y, e = data["z"], data["ln_theta_rad"], data["ln_theta_err"]
LN10 = math.log(10.0)


def nuisance_max(lnda):
    """max over (ln R0, a, s) of ln L for fixed ln D_A(z)."""
    t = y - math.log(1e-3) + lnda            # = ln R0 + a ln(1+z) + noise
    X = np.column_stack([np.ones_like(z), np.log1p(z)])

    def negll(log_s):
        var = e ** 2 + (LN10 * math.exp(log_s)) ** 2
        w = 1.0 / var
        beta = np.linalg.solve(X.T @ (X * w[:, None]), X.T @ (w * t))
        r = t - X @ beta
        return 0.5 * np.sum(r * r * w + np.log(2 * math.pi * var))

    res = minimize_scalar(negll, bounds=(math.log(1e-3), math.log(3.0)), method="bounded", options={"xatol": 1e-10})
    return -res.fun


def profile(om):
    # astropy returns a complex dtype for Om0 = 0 (pure Lambda); the imaginary part is 0.
    da = np.real(FlatLambdaCDM(H0=70.0, Om0=om, Tcmb0=0.0).angular_diameter_distance(z).value).astype(float)
    return nuisance_max(np.log(da))


grid = np.round(np.arange(0.0, 1.5 + 1e-12, 0.005), 6)
prof = np.array([profile(om) for om in grid])
top_i = int(np.argmax(prof))
top = float(prof[top_i])
peaks = [i for i in range(len(grid)) if (i == 0 or prof[i] > prof[i - 1]) and (i == len(grid) - 1 or prof[i] > prof[i + 1])]
level = top - 0.5
above = np.where(prof >= level)[0]
lo_i, hi_i = int(above[0]), int(above[-1])


def cross(i_above, i_below):
    fa, fb = prof[i_above] - level, prof[i_below] - level
    return float(grid[i_above] + fa / (fa - fb) * (grid[i_below] - grid[i_above]))


lo = float(grid[0]) if lo_i == 0 else cross(lo_i, lo_i - 1)
hi = float(grid[-1]) if hi_i == len(grid) - 1 else cross(hi_i, hi_i + 1)
out = {
    "generator": f"bimodal_profile.py with numpy {np.__version__}, scipy {scipy.__version__}, astropy {astropy.__version__}, python {sys.version.split()[0]}",
    "grid_step": 0.005,
    "global_max": {"omega_m": float(grid[top_i]), "log_likelihood": top},
    "local_maxima": [{"omega_m": float(grid[i]), "log_likelihood": float(prof[i])} for i in peaks],
    "interval": {"lo": lo, "hi": hi},
    "profile": [[float(g), float(p)] for g, p in zip(grid, prof)],
}
with open(os.path.join(here, "bimodal_profile.json"), "w") as f:
    json.dump(out, f, indent=1)
print(json.dumps({k: v for k, v in out.items() if k != "profile"}, indent=1))
