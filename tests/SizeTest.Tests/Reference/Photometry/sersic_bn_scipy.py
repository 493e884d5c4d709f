#!/usr/bin/python3
"""Reference b_n for the Sersic profile: the root of P(2n, b_n) = 1/2 (regularised lower
incomplete gamma), computed with scipy.special.gammaincinv. Run with Debian's /usr/bin/python3.
Writes sersic_bn_scipy.csv beside this script."""
import os
import scipy
from scipy.special import gammaincinv, gammainc

here = os.path.dirname(os.path.abspath(__file__))
ns = [0.2, 0.3, 0.5, 0.75, 1.0, 1.5, 2.0, 2.5, 3.0, 4.0, 5.0, 6.0, 8.0, 10.0, 15.0, 20.0]
with open(os.path.join(here, "sersic_bn_scipy.csv"), "w") as f:
    f.write(f"# b_n from scipy {scipy.__version__} special.gammaincinv(2n, 0.5); check column = gammainc(2n, b_n)\n")
    f.write("n,b_n,check\n")
    for n in ns:
        b = gammaincinv(2 * n, 0.5)
        f.write(f"{n!r},{b!r},{gammainc(2 * n, b)!r}\n")
