"""Objects of window_mock.csv inside the luminosity window -22 <= M <= -20, with each world model's own D_L, for the
--abs-mag-range tests (LuminosityWindowCliTests). M = m - 5 log10(D_L / 10 pc); no K-correction or extinction.
  lcdm: astropy FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=0).luminosity_distance;
  static-linear (energy-loss flux convention): D_L = (c z / H0) (1+z)^0.5, c = 299792.458 km/s, H0 = 70.
The mock is synthetic: `sizetest simulate --model static-linear --n 800 --z-dist uniform:0.2:1.5
--luminosity-function schechter:-21:-1.2:-24:-18 --size-lum-slope 0.3 --size-evolution 0 --seed 7`.
Run: /usr/bin/python3 window_count.py   (numpy 1.24, astropy 5.2.1); prints the first row's M under lcdm and both counts.
"""
import csv
import os

import astropy
import numpy as np
from astropy.cosmology import FlatLambdaCDM

here = os.path.dirname(os.path.abspath(__file__))
rows = list(csv.DictReader(open(os.path.join(here, "window_mock.csv"))))
z = np.array([float(r["z"]) for r in rows])
m = np.array([float(r["mag"]) for r in rows])
dl = {
    "lcdm": FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=0).luminosity_distance(z).value,
    "static-linear": 299792.458 * z / 70 * np.sqrt(1 + z),
}
print("astropy", astropy.__version__)
for name, d in dl.items():
    M = m - 5 * np.log10(d) - 25
    print(name, "first row M = %.3f" % M[0], "inside [-22, -20]:", int(np.sum((M >= -22) & (M <= -20))), "of", len(M))
