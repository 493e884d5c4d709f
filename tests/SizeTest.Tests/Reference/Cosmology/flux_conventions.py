#!/usr/bin/python3
"""Hand values for FluxConventionTests and FitFluxConventionTests (issue 14: the static models' flux convention).

Run with Debian's /usr/bin/python3 (numpy, astropy); writes, beside this script,
  flux_convention_rows.csv    an invented synthetic catalogue (id, z, theta, theta_err, mag), 120 rows
  flux_convention_values.txt  D_L and M = m - 5 log10(D_L / 10 pc) for the first rows under each model and
                              convention, and the number of rows with -22 <= M <= -20 under each.

Formulas (docs/science.md section 1.5, docs/world-models.md):
  static distance d: static-linear d = c z / H0, tired-light d = (c / H0) ln(1 + z)
  flux F = L / [4 pi d^2 (1+z)^(2p)], so D_L = d (1+z)^p with
     energy-loss   (photons lose energy only, F = L / [4 pi d^2 (1+z)]):     p = 1/2
     time-dilation (arrival rate diluted too, F = L / [4 pi d^2 (1+z)^2]):  p = 1
  lcdm: astropy FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=0) luminosity distance (the convention does not apply)
  M = m - 5 log10(D_L / Mpc) - 25   (10 pc = 1e-5 Mpc; no K-correction or extinction)
"""
import math
import os

import astropy
import numpy as np
from astropy.cosmology import FlatLambdaCDM
import astropy.units as u

here = os.path.dirname(os.path.abspath(__file__))
C = 299792.458  # km/s, exact
H0 = 70.0
DH = C / H0
P = {"energy-loss": 0.5, "time-dilation": 1.0}
lcdm = FlatLambdaCDM(H0=H0, Om0=0.3, Tcmb0=0)


def d_static(model, z):
    return DH * z if model == "static-linear" else DH * math.log1p(z)


def d_l(model, convention, z):
    if model == "lcdm":
        return float(lcdm.luminosity_distance(z).to(u.Mpc).value)
    return d_static(model, z) * (1 + z) ** P[convention]


def abs_mag(model, convention, m, z):
    return m - 5 * math.log10(d_l(model, convention, z)) - 25


# An invented sample: z uniform on [0.2, 2], M uniform on [-23, -19] under static-linear energy-loss (so the window
# -22..-20 cuts through it differently under each convention), sizes R = 5 kpc (L/L*)^0.3 (1+z)^-1 x 10^(0.2 N(0,1)).
rng = np.random.default_rng(20240614)
n = 120
rows = []
for i in range(n):
    z = float(rng.uniform(0.2, 2.0))
    m_abs = float(rng.uniform(-23, -19))
    m = m_abs + 5 * math.log10(d_l("static-linear", "energy-loss", z)) + 25
    r_kpc = 5.0 * 10 ** (-0.4 * 0.3 * (m_abs + 21)) * (1 + z) ** -1.0 * 10 ** (0.2 * rng.standard_normal())
    theta = r_kpc / 1000 / float(lcdm.angular_diameter_distance(z).to(u.Mpc).value) * 206264.80624709636
    rows.append((f"F{i + 1:03d}", round(z, 6), round(theta, 6), round(0.05 * theta, 6), round(m, 6)))
with open(os.path.join(here, "flux_convention_rows.csv"), "w") as f:
    f.write("id,z,theta,theta_err,mag\n")
    for r in rows:
        f.write(",".join(str(x) for x in r) + "\n")

out = [f"# astropy {astropy.__version__}, numpy {np.__version__}; c = {C} km/s, H0 = {H0}"]
out.append("# model convention row z mag D_L_Mpc M")
for model in ("static-linear", "tired-light", "lcdm"):
    for conv in P:
        for (rid, z, _, _, m) in rows[:4]:
            out.append(f"{model} {conv} {rid} {z!r} {m!r} {d_l(model, conv, z):.9f} {abs_mag(model, conv, m, z):.9f}")
out.append("# model convention rows_with_-22<=M<=-20")
for model in ("static-linear", "tired-light", "lcdm"):
    for conv in P:
        count = sum(1 for (_, z, _, _, m) in rows if -22 <= abs_mag(model, conv, m, z) <= -20)
        out.append(f"count {model} {conv} {count}")
with open(os.path.join(here, "flux_convention_values.txt"), "w") as f:
    f.write("\n".join(out) + "\n")
print("\n".join(out))
