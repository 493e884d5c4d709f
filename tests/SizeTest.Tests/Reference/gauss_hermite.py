#!/usr/bin/python3
"""Reference Gauss-Hermite nodes/weights for GaussHermiteTests (numpy.polynomial.hermite.hermgauss)."""
import numpy
from numpy.polynomial.hermite import hermgauss
print(f"# numpy {numpy.__version__}")
for m in (7, 20):
    x, w = hermgauss(m)
    print(m, " ".join(f"{v:.15g}" for v in x[-3:]), "|", " ".join(f"{v:.15g}" for v in w[-3:]))
