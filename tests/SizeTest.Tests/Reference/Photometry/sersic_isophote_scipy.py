#!/usr/bin/python3
"""Reference isophotal radii of Sersic profiles, one Sersic index per object, for
IsophotalLikelihoodTests.IsophotalPredictionUsesEachObjectsSersicIndex. Run with Debian's
/usr/bin/python3 (numpy, scipy); writes sersic_isophote_scipy.csv beside this script.

Each object: redshift z, Sersic index n, observed SB at R_e mu_e_obs = mu0 + 2.5 (4 - b) log10(1+z)
(Einstein-de Sitter Tolman dimming n_dim = 4, luminosity evolution b = 1, mu0 = 20), isophote 26.
b_n solves P(2n, b_n) = 1/2 (scipy.special.gammaincinv). The isophotal radius x = r_iso/R_e is the
root, found with scipy.optimize.brentq, of the profile's intensity I(x)/I_e = exp(-b_n (x^(1/n) - 1))
reaching the isophote's intensity 10^(-0.4 (mu_iso - mu_e_obs)); the light fraction inside the
isophote is P(2n, b_n x^(1/n)) (scipy.special.gammainc; Graham & Driver 2005 eqs. 2-5)."""
import math
import os
import numpy
import scipy
from scipy.optimize import brentq
from scipy.special import gammaincinv, gammainc

here = os.path.dirname(os.path.abspath(__file__))
MU0, B, NDIM, MU_ISO = 20.0, 1.0, 4.0, 26.0
objects = [(0.3, 0.8), (0.8, 2.5), (1.5, 6.0), (0.5, 1.0), (1.1, 4.0)]  # (z, n)
with open(os.path.join(here, "sersic_isophote_scipy.csv"), "w") as f:
    f.write(f"# scipy {scipy.__version__}, numpy {numpy.__version__}: mu0 = {MU0}, b = {B}, EdS n_dim = {NDIM}, mu_iso = {MU_ISO}\n")
    f.write("z,n,mu_e_obs,b_n,ln_ratio,light_fraction\n")
    for z, n in objects:
        mu_e = MU0 + 2.5 * (NDIM - B) * math.log10(1 + z)
        b_n = gammaincinv(2 * n, 0.5)
        target = 10 ** (-0.4 * (MU_ISO - mu_e))  # isophote intensity over I_e
        x = brentq(lambda x: math.exp(-b_n * (x ** (1 / n) - 1)) - target, 1e-12, 1e4, xtol=1e-15, rtol=1e-15, maxiter=500)
        f.write(f"{z!r},{n!r},{mu_e!r},{b_n!r},{math.log(x)!r},{gammainc(2 * n, b_n * x ** (1 / n))!r}\n")
