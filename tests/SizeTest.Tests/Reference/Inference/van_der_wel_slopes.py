#!/usr/bin/python3
"""Independent reference for RealDataTests: angles and size-evolution slopes of the van der Wel
et al. (2014, ApJ 788, 28) Table 5 copy (binned by rest-frame V luminosity, early and late types
together).

Run from the repository root with Debian's interpreter (python3-astropy 5.2.1, python3-scipy
1.10.1, python3-numpy 1.24.2):

    /usr/bin/python3 tests/SizeTest.Tests/Reference/Inference/van_der_wel_slopes.py

1. Angles: each bin's median size R_e = 10^log10Size kpc (physical, flat ΛCDM H0 = 70, Ωm = 0.3,
   as the paper used) is turned into an angle with astropy's D_A for that cosmology (no
   radiation): θ = R_e / D_A. Written to van_der_wel_angles.csv; SizeTest's test fits these angles,
   so the conversion is not SizeTest's own.
2. Slopes: for every luminosity sequence with at least four redshift bins, the least-squares fit
   of ln θ_i = ln(R0 / D_A(z_i)) + a ln(1+z_i) + ε_i with numpy.linalg.lstsq (the exact linear
   solution), cross-checked with scipy.optimize.least_squares to 1e-6. With equal weights this is the maximum-likelihood fit
   of SizeTest's size model with intrinsic scatter σ (measurement errors zero): a and R0 are the
   least-squares values and σ_ML = sqrt(RSS/n); scatter_dex = σ_ML / ln 10. Written to
   van_der_wel_slopes.csv.

These slopes are of this table (fixed *luminosity*, types mixed); they are not the paper's
published slopes, which are at fixed *stellar mass* and per galaxy type.
"""
import math
import sys
from pathlib import Path

import astropy
import numpy as np
import scipy
from astropy.cosmology import FlatLambdaCDM
from scipy.optimize import least_squares

here = Path(__file__).resolve().parent
table = here / "van_der_Wel_2014_ApJ_788_28_Table5_VLuminosity.txt"
rows = []
for line in table.read_text().splitlines():
    line = line.strip()
    if not line or line.startswith("#"):
        continue
    z, logl, logr, hi, lo = (float(x) for x in line.split())
    rows.append((z, logl, logr))

cosmo = FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=0)
arcsec_per_rad = 180 * 3600 / math.pi
versions = f"astropy {astropy.__version__}, scipy {scipy.__version__}, numpy {np.__version__}"

angles = []
for z, logl, logr in rows:
    da_mpc = cosmo.angular_diameter_distance(z).value
    theta_rad = 10 ** logr * 1e-3 / da_mpc
    angles.append((z, logl, theta_rad * arcsec_per_rad, da_mpc))

with open(here / "van_der_wel_angles.csv", "w") as f:
    f.write(f"# van der Wel et al. 2014 Table 5 (V luminosity) medians as angles; theta = R_e / D_A, flat LCDM H0=70 Om0=0.3 Tcmb0=0; {versions}\n")
    f.write("z,log10_lv,theta_arcsec,d_a_mpc\n")
    for z, logl, th, da in angles:
        f.write(f"{z:.2f},{logl:.2f},{th:.15e},{da:.12f}\n")

out = []
for logl in sorted({r[1] for r in rows}):
    seq = sorted((a for a in angles if a[1] == logl), key=lambda a: a[0])
    if len(seq) < 4:
        continue
    z = np.array([a[0] for a in seq])
    ln_theta = np.log(np.array([a[2] for a in seq]) / arcsec_per_rad)
    ln_da = np.log(np.array([cosmo.angular_diameter_distance(zi).value for zi in z]))
    x = np.log1p(z)
    # model: ln θ = ln R0[Mpc] − ln D_A + a ln(1+z)
    resid = lambda p: ln_theta - (p[0] - ln_da + p[1] * x)
    fit = least_squares(resid, x0=[math.log(5e-3), -1.0], xtol=1e-15, ftol=1e-15, gtol=1e-15)
    design = np.column_stack([np.ones_like(x), x])
    (ln_r0, a), *_ = np.linalg.lstsq(design, ln_theta + ln_da, rcond=None)
    if abs(fit.x[1] - a) > 1e-6 or abs(fit.x[0] - ln_r0) > 1e-6:
        sys.exit(f"least_squares and lstsq disagree for log L = {logl}: {fit.x} vs {(ln_r0, a)}")
    rss = float(np.sum(resid([ln_r0, a]) ** 2))
    scatter_dex = math.sqrt(rss / len(z)) / math.log(10)
    out.append((logl, len(z), a, math.exp(ln_r0) * 1e3, scatter_dex))

with open(here / "van_der_wel_slopes.csv", "w") as f:
    f.write(f"# Least-squares size evolution of each luminosity sequence (>= 4 redshift bins) of van_der_wel_angles.csv; {versions}\n")
    f.write("log10_lv,bins,size_evolution,r0_kpc,scatter_dex\n")
    for logl, n, a, r0, s in out:
        f.write(f"{logl:.2f},{n},{a:.12f},{r0:.12f},{s:.12f}\n")
for row in out:
    print("log L = %.2f: %d bins, a = %.6f, R0 = %.4f kpc, scatter = %.6f dex" % row)
