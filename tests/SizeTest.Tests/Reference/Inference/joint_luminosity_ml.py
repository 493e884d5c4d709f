"""Independent maximum-likelihood fit of the joint (ln theta, mu) model with the size-luminosity relation, for
JointLuminosityReferenceTests.

Model (SurveyJointLikelihood with kappa = 0, no K-correction or extinction), flat LCDM H0 = 70, Om = 0.3 held fixed:
  L from the apparent magnitude with the model's own D_L: M = m - 5 log10(D_L / 10 pc), ln(L/L_pivot) = -0.4 ln10 (M - M_pivot),
  M_pivot = -21;
  ln theta ~ N(ln R0 + a ln(1+z) + beta ln(L/L_pivot) + ln(1e-3) - ln D_A,  (theta_err/theta)^2 + (ln10 scatter_dex)^2)
      (theta in radians, R0 in kpc, D_A in Mpc);
  mu ~ N(mu0 + 2.5 (4 - b) log10(1+z) - 2.5 gamma log10(L/L_pivot),  mu_err^2 + scatter_mag^2), independent of ln theta.
The catalogue's magnitude limit (m < 24) selects on m, on which this likelihood is conditional: it does not truncate it.
The mock (joint_luminosity_mock.csv, drawn by `sizetest simulate --n 800 --luminosity-function schechter:-21:-1.2:-24:-16
--size-lum-slope 0.3 --mag-limit 24 --z-dist uniform:0.2:2 --seed 17`, synthetic) has mu = m + 5 log10 theta + 2.5 log10 2 pi
(+ mu_err noise), so the expected slopes are gamma = 1 - 2 beta and b = -2 a (derived in NuisanceParameters.SbLuminositySlope).
Optimiser: scipy.optimize.minimize, method BFGS from the truth, then Nelder-Mead polish (xatol 1e-9, fatol 1e-10).
Run: /usr/bin/python3 joint_luminosity_ml.py > joint_luminosity_ml.json   (numpy 1.24, scipy 1.10.1, astropy 5.2.1)
"""
import csv
import json
import os

import astropy
import numpy as np
import scipy
from astropy.cosmology import FlatLambdaCDM
from scipy import optimize

here = os.path.dirname(os.path.abspath(__file__))
rows = list(csv.DictReader(open(os.path.join(here, "joint_luminosity_mock.csv"))))
z = np.array([float(r["z"]) for r in rows])
theta = np.array([float(r["theta"]) for r in rows])
theta_err = np.array([float(r["theta_err"]) for r in rows])
mu = np.array([float(r["mu"]) for r in rows])
mu_err = np.array([float(r["mu_err"]) for r in rows])
mag = np.array([float(r["mag"]) for r in rows])

cosmo = FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=0)
LN10 = np.log(10.0)
ARCSEC_PER_RAD = 180 * 3600 / np.pi
da = cosmo.angular_diameter_distance(z).value
dl = cosmo.luminosity_distance(z).value
absmag = mag - 5 * np.log10(dl) - 25
lnlum = -0.4 * LN10 * (absmag + 21.0)
y = np.log(theta / ARCSEC_PER_RAD)
vt_meas = (theta_err / theta) ** 2
x = np.log1p(z)
names = ["r0_kpc", "size_evolution", "scatter_dex", "size_luminosity_slope", "mu0", "sb_evolution", "scatter_mag", "sb_luminosity_slope"]


def nll(p):
    r0, a, sdex, beta, mu0, b, smag, gam = p
    if r0 <= 0 or sdex <= 0 or smag <= 0:
        return np.inf
    mt = np.log(r0) + a * x + beta * lnlum + np.log(1e-3) - np.log(da)
    vt = vt_meas + (LN10 * sdex) ** 2
    mm = mu0 + 2.5 * (4 - b) * x / LN10 - 2.5 * gam * lnlum / LN10
    vm = mu_err ** 2 + smag ** 2
    return 0.5 * np.sum((y - mt) ** 2 / vt + np.log(2 * np.pi * vt) + (mu - mm) ** 2 / vm + np.log(2 * np.pi * vm))


start = np.array([5.0, -1.0, 0.2, 0.3, 21.0, 2.0, 1.0, 0.4])
r = optimize.minimize(nll, start, method="BFGS", options={"gtol": 1e-8})
r = optimize.minimize(nll, r.x, method="Nelder-Mead", options={"xatol": 1e-9, "fatol": 1e-10, "maxiter": 40000, "maxfev": 40000})
print(json.dumps({
    "generator": "joint_luminosity_ml.py",
    "versions": {"numpy": np.__version__, "scipy": scipy.__version__, "astropy": astropy.__version__},
    "objects": len(z),
    "log_likelihood": -r.fun,
    "parameters": dict(zip(names, map(float, r.x))),
}, indent=2))
