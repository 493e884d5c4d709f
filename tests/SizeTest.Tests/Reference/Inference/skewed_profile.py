#!/usr/bin/python3
"""A synthetic mock whose size-evolution profile likelihood is skewed (Omega_m free), and its independent profile interval.

Run: /usr/bin/python3 skewed_profile.py  (writes skewed_profile_mock.csv and skewed_profile.json beside it)

Mock (numpy default_rng(7)): 3000 galaxies, flat LCDM H0 = 70, Om0 = 0.3 (astropy FlatLambdaCDM, Tcmb0 = 0),
z uniform in [0.1, 2.5], R = 4 kpc (1+z)^-0.8 with a log-normal scatter of 0.25 in ln R, theta = R / D_A, and observed
ln theta = true ln theta + N(0, 0.1^2) with a quoted error of 0.1 in ln theta.

Model (SizeTest's angular-size likelihood, re-derived here, not imported):
  ln theta_i ~ N( ln R0 + a ln(1+z_i) + ln(1e-3) - ln D_A(z_i; Om),  e_i^2 + (ln10 * s)^2 )
with R0 in kpc, D_A in Mpc, s = scatter_dex. The profile of a maximises over (Om, ln R0, s): ln R0 in closed form
(weighted mean) at fixed s, s by a bounded 1-D search, Om by a bounded 1-D search after a coarse grid (the inner
profile in Om is unimodal here, checked on the grid). The 68% interval is {a : max ln L - ln L_p(a) <= 1/2}, its ends
found with brentq to 1e-7.
"""
import json, math, os
import numpy as np
import scipy, astropy
from scipy.optimize import minimize_scalar, brentq
from astropy.cosmology import FlatLambdaCDM
import astropy.units as u

here = os.path.dirname(os.path.abspath(__file__))
LN10 = math.log(10.0)

rng = np.random.default_rng(7)
N = 3000
z = rng.uniform(0.1, 2.5, N)
R = 4.0 * (1 + z) ** -0.8 * np.exp(rng.normal(0, 0.25, N))
da = FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=0).angular_diameter_distance(z).to(u.Mpc).value
y = np.log(R * 1e-3 / da) + rng.normal(0, 0.1, N)
e = np.full(N, 0.1)
with open(os.path.join(here, "skewed_profile_mock.csv"), "w") as f:
    f.write("# synthetic mock (skewed_profile.py, numpy default_rng(7)): flat LCDM omega_m=0.3 h0=70, 3000 galaxies, z uniform 0.1-2.5, "
            "R0=4 kpc, a=-0.8, 0.25 in ln R, 0.1 in ln theta\n")
    f.write("z,ln_theta_rad,ln_theta_err\n")
    for i in range(N):
        f.write(f"{z[i]!r},{y[i]!r},{e[i]!r}\n")

def lnda(om):
    c = FlatLambdaCDM(H0=70, Om0=om, Tcmb0=0)
    return np.log(c.angular_diameter_distance(z).to(u.Mpc).value)


lnda_cache = {}


def lnda_c(om):
    k = round(om, 12)
    if k not in lnda_cache:
        lnda_cache[k] = lnda(om)
    return lnda_cache[k]


def nuisance_max(a, om):
    t = y - math.log(1e-3) + lnda_c(om) - a * np.log1p(z)   # = ln R0 + noise

    def negll(log_s):
        var = e ** 2 + (LN10 * math.exp(log_s)) ** 2
        w = 1.0 / var
        m = np.sum(w * t) / np.sum(w)
        r = t - m
        return 0.5 * np.sum(r * r * w + np.log(2 * math.pi * var))

    return -minimize_scalar(negll, bounds=(math.log(1e-4), math.log(3.0)), method="bounded", options={"xatol": 1e-10}).fun


def profile(a):
    # Om < 1 keeps astropy's flat closed form real (Ode0 > 0); the maxima used below are well inside (checked).
    grid = np.linspace(0.005, 0.99, 60)
    vals = [nuisance_max(a, o) for o in grid]
    i = int(np.argmax(vals))
    assert 0 < i < len(grid) - 1, f"profile maximum in Om at the grid edge for a = {a}"
    lo, hi = grid[max(i - 1, 0)], grid[min(i + 1, len(grid) - 1)]
    res = minimize_scalar(lambda o: -nuisance_max(a, o), bounds=(lo, hi), method="bounded", options={"xatol": 1e-9})
    return -res.fun, res.x


best = minimize_scalar(lambda a: -profile(a)[0], bounds=(-1.2, -0.4), method="bounded", options={"xatol": 1e-8})
a_hat = best.x
top, om_hat = profile(a_hat)
f = lambda a: top - profile(a)[0] - 0.5
lo = brentq(f, -0.95, a_hat, xtol=1e-7)
hi = brentq(f, a_hat, -0.45, xtol=1e-7)
out = {
    "generator": "skewed_profile.py",
    "versions": {"numpy": np.__version__, "scipy": scipy.__version__, "astropy": astropy.__version__},
    "max_log_likelihood": top,
    "size_evolution": a_hat,
    "omega_m_at_max": om_hat,
    "size_evolution_interval": {"lo": lo, "hi": hi},
    "omega_m_at_hi": profile(hi)[1],
}
with open(os.path.join(here, "skewed_profile.json"), "w") as fh:
    json.dump(out, fh, indent=1)
print(json.dumps(out, indent=1))
