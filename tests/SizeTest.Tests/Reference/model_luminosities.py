#!/usr/bin/python3
"""Hand values for ModelLuminosityTests (per-model luminosities, issue 12).

Formulas (docs/survey-catalogues.md):
  M = m - 5 log10(D_L / 10 pc) - K - A
  FLRW: D_L from astropy FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=0)
  static-linear: D_L = (cz/H0) (1+z)^q, q = 0.5;  tired-light: D_L = (c/H0) ln(1+z) (1+z)^q
  M_model = M_ref - 5 log10(D_L,model / D_L,ref);  log M_model = log M_ref + 2 log10(D_L,model / D_L,ref)
  L_nu = 4 pi D_L^2 S_nu (1+z)^-(1+alpha),  1 Jy = 1e-26 W m^-2 Hz^-1
"""
import math
import astropy
import numpy
from astropy.cosmology import FlatLambdaCDM
import astropy.units as u

print(f"# astropy {astropy.__version__}, numpy {numpy.__version__}")
c = 299792.458
cosmo = FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=0)
z = 1.0
dl_lcdm = cosmo.luminosity_distance(z).to(u.Mpc).value
dl_lin = c * z / 70 * (1 + z) ** 0.5
dl_tl = c / 70 * math.log(1 + z) * (1 + z) ** 0.5
m, ka = 24.0, 0.3
for name, dl in [("lcdm", dl_lcdm), ("static-linear", dl_lin), ("tired-light", dl_tl)]:
    print(f"{name}: D_L = {dl:.6f} Mpc, M(m=24, K+A=0.3) = {m - 5 * math.log10(dl) - 25 - ka:.9f}")
print(f"abs mag -21 (lcdm ref) in static-linear: {-21 - 5 * math.log10(dl_lin / dl_lcdm):.9f}")
print(f"log mass 11 (lcdm ref) in tired-light: {11 + 2 * math.log10(dl_tl / dl_lcdm):.9f}")
mpc_m = (1 * u.Mpc).to(u.m).value
for name, dl in [("lcdm", dl_lcdm), ("static-linear", dl_lin)]:
    L = 4 * math.pi * (dl * mpc_m) ** 2 * 0.1e-26 / (1 + z) ** (1 + 0.0)
    print(f"{name}: log10 L_nu(S = 0.1 Jy, alpha = 0) = {math.log10(L):.9f}")
