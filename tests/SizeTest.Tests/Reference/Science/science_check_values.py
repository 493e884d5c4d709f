#!/usr/bin/python3
"""Re-computes the "computed" check values of docs/science.md §2 with astropy and scipy.

Run with Debian's interpreter (it has python3-astropy 5.2.1, python3-scipy 1.10.1, numpy 1.24.2):

    /usr/bin/python3 tests/SizeTest.Tests/Reference/Science/science_check_values.py

Every value is compared with the number printed in docs/science.md (the DOC table below, copied
from that page) to the number of digits the page shows; the script exits 1 on any mismatch.
It writes nothing.
"""
import sys
import numpy as np
import astropy
import scipy
from scipy import optimize
import astropy.units as u
from astropy.cosmology import FlatLambdaCDM, LambdaCDM, FlatwCDM, Flatw0waCDM

print(f"astropy {astropy.__version__}, scipy {scipy.__version__}, numpy {np.__version__}")
bad = 0


def check(label, got, doc):
    """doc is the printed string; compare to its number of decimals."""
    global bad
    decimals = len(doc.split(".")[1]) if "." in doc else 0
    ok = abs(got - float(doc)) <= 0.5 * 10 ** (-decimals) * 1.0000001 + 1e-12
    if not ok:
        bad += 1
    print(f"{'ok ' if ok else 'BAD'} {label}: computed {got:.{decimals + 2}f}, page {doc}")


def zmax(c):
    f = lambda z: -c.angular_diameter_distance(z).value
    r = optimize.minimize_scalar(f, bounds=(0.5, 4), method="bounded", options={"xatol": 1e-9})
    return r.x, -r.fun


# §2.2 flat ΛCDM H0 = 70, Ωm = 0.3, no radiation
c = FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=0)
table = {0.1: ("418.4545", "380.4132", "460.2999", "1.30130"), 1.0: ("3303.8288", "1651.9144", "6607.6576", "7.71534"),
         2.0: ("5179.8621", "1726.6207", "15539.5862", "10.24036"), 5.0: ("7775.3705", "1295.8951", "46652.2230", "12.31223")}
for z, (dc, da, dl, tl) in table.items():
    check(f"2.2 D_C({z})", c.comoving_distance(z).value, dc)
    check(f"2.2 D_A({z})", c.angular_diameter_distance(z).value, da)
    check(f"2.2 D_L({z})", c.luminosity_distance(z).value, dl)
    check(f"2.2 t_L({z})", c.lookback_time(z).value, tl)
check("2.2 age", c.age(0).value, "13.46698")
zm, dam = zmax(c)
check("2.2 z_max", zm, "1.6054"); check("2.2 D_A,max", dam, "1747.572")

# §2.3 with radiation
cr = FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=2.725, Neff=3.04, m_nu=0 * u.eV)
check("2.3 Ogamma0", cr.Ogamma0 * 1e5, "5.0432"); check("2.3 Onu0", cr.Onu0 * 1e5, "3.4818")
check("2.3 D_C(1)", cr.comoving_distance(1).value, "3303.5264"); check("2.3 D_L(1)", cr.luminosity_distance(1).value, "6607.0529")
check("2.3 age", cr.age(0).value, "13.4617"); check("2.3 z_max", zmax(cr)[0], "1.6051")

# §2.4 other models
models = {
    "EdS": (LambdaCDM(70, 1.0, 0.0, Tcmb0=0), "2508.7765", "1070.6874", "9.31231", "1.2500"),
    "open 0.3": (LambdaCDM(70, 0.3, 0.0, Tcmb0=0), "2795.1560", "1526.9888", "11.29760", "1.9001"),
    "Om 0.3 OL 0.8": (LambdaCDM(70, 0.3, 0.8, Tcmb0=0), "3408.9370", "1587.8885", "13.92250", "1.5556"),
    "Om 0.3 OL 0.5": (LambdaCDM(70, 0.3, 0.5, Tcmb0=0), "3124.8660", "1579.2997", "12.69749", "1.6982"),
    "wCDM -0.9": (FlatwCDM(70, 0.3, w0=-0.9, Tcmb0=0), "3236.6978", "1559.0250", "13.24719", "1.6095"),
    "CPL -0.9 0.2": (Flatw0waCDM(70, 0.3, w0=-0.9, wa=0.2, Tcmb0=0), "3211.3443", "1541.1245", "13.12679", "1.5965"),
}
for name, (m, dc1, da3, age, zm) in models.items():
    check(f"2.4 {name} D_C(1)", m.comoving_distance(1).value, dc1)
    check(f"2.4 {name} D_A(3)", m.angular_diameter_distance(3).value, da3)
    check(f"2.4 {name} age", m.age(0).value, age)
    check(f"2.4 {name} z_max", zmax(m)[0], zm)
milne = LambdaCDM(70, 0.0, 0.0, Tcmb0=0)
check("2.4 Milne D_C(1)", milne.comoving_distance(1).value, "2968.5757")
check("2.4 Milne D_L(1)", milne.luminosity_distance(1).value, "6424.1241")
check("2.4 Milne age", milne.age(0).value, "13.96846")
check("2.4 E(1) flat 0.3", c.efunc(1), "1.7606817")
check("2.4 E(1) Om 0.3 Ok 0.1", LambdaCDM(70, 0.3, 0.6, Tcmb0=0).efunc(1), "1.8439089")
check("2.4 E(2) CPL", models["CPL -0.9 0.2"][0].efunc(2), "3.0596104")
DH = 299792.458 / 70
check("0 D_H", DH, "4282.7494")
check("2.4 static-log d(1)", DH * np.log(2), "2968.5757"); check("2.4 static-lin D_L(1)", DH * np.sqrt(2), "6056.7223")

# §2.5 z_max against Ωm (flat, no radiation)
for om, zm in [(0.2, "1.7615"), (0.24, "1.6888"), (0.3, "1.6054"), (0.5, "1.4364")]:
    check(f"2.5 z_max(Om={om})", zmax(FlatLambdaCDM(70, om, Tcmb0=0))[0], zm)

# §2.6 angle of 10 kpc in arcsec
arc = lambda da: 10e-3 / da * 206264.80624709636
for z, doc in [(0.1, "5.42213"), (1.0, "1.24864"), (3.0, "1.29814")]:
    check(f"2.6 LCDM theta({z})", arc(c.angular_diameter_distance(z).value), doc)
check("2.6 EdS theta(1)", arc(models["EdS"][0].angular_diameter_distance(1).value), "1.64435")
check("2.6 static-lin theta(1)", arc(DH * 1.0), "0.48162")
check("2.6 LCDM theta_min", arc(dam), "1.18029")

# §2.7 dimming
check("2.7 n=4 z=1", 10 * np.log10(2), "3.0103"); check("2.7 n=1 z=3", 2.5 * np.log10(4), "1.5051")

print(f"{bad} mismatches")
sys.exit(1 if bad else 0)
