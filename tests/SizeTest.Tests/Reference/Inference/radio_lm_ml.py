"""Independent maximum-likelihood fit of the compact-radio-source size relation (Gurvits, Kellermann & Frey 1999)
ln theta_i ~ N(ln l_m + beta ln(L_i / L_pivot) + n ln(1+z_i) - ln D_A(z_i), (theta_err/theta)^2 + (s ln 10)^2),
L_i = 4 pi D_L^2 S_i (1+z)^-(1+alpha), alpha = 0, L_pivot = 1e27 W/Hz, flat LCDM H0 = 70, Om = 0.3 (astropy).
Usage: /usr/bin/python3 radio_lm_ml.py CATALOGUE.csv   (numpy 1.24, scipy 1.10.1, astropy 5.2.1)
Prints l_m in pc with its Hessian 1-sigma, n, beta, s. Used to check RadioLinearSizeTests (l_m away from its bound)."""
import sys
import numpy as np
from scipy.optimize import minimize
from astropy.cosmology import FlatLambdaCDM
import astropy.units as u

d = np.genfromtxt(sys.argv[1], delimiter=",", names=True, dtype=None, encoding="utf-8")
z, th, te, S = d["z"], d["theta"], d["theta_err"], d["flux_density"]
cos = FlatLambdaCDM(H0=70, Om0=0.3)
DA = cos.angular_diameter_distance(z).to(u.kpc).value
DL = cos.luminosity_distance(z).to(u.m).value
L = 4 * np.pi * DL**2 * S * 1e-26 / (1 + z)
lnx = np.log(L / 1e27)
y = np.log(th / 206264.80624709636)  # theta in arcsec -> rad
e2 = (te / th) ** 2

def nll(p):
    lnlm, n, beta, lns = p
    s2 = (np.exp(lns) * np.log(10)) ** 2
    v = e2 + s2
    m = lnlm + beta * lnx + n * np.log1p(z) - np.log(DA)
    return 0.5 * np.sum((y - m) ** 2 / v + np.log(2 * np.pi * v))

r = minimize(nll, [np.log(0.011), 0.0, 0.0, np.log(0.1)], method="Nelder-Mead", options={"xatol": 1e-10, "fatol": 1e-10, "maxiter": 40000})
x = r.x
h = 1e-4
H = np.empty((4, 4))
for i in range(4):
    for j in range(4):
        def f(a, b):
            q = x.copy(); q[i] += a; q[j] += b
            return nll(q)
        H[i, j] = (f(h, h) - f(h, -h) - f(-h, h) + f(-h, -h)) / (4 * h * h)
cov = np.linalg.inv(H)
lm = np.exp(x[0]) * 1000
print(f"lnL {-nll(x):.4f} l_m {lm:.4f} pc +- {lm*np.sqrt(cov[0,0]):.4f}  n {x[1]:.4f} +- {np.sqrt(cov[1,1]):.4f}  beta {x[2]:.4f}  s {np.exp(x[3]):.5f}")
