"""Plain (unaccelerated) EM for the population redshift prior of photoz_truncated_prior_mock.csv (synthetic, 400 objects),
run far past SizeTest's stopping rule, as the reference for PopulationRedshiftPriorTests
(TheAcceleratedIterationReachesPlainEmsMaximumOnACommittedSample).

The estimator (PopulationRedshiftPrior, docs/survey-catalogues.md): on [min z_obs, max z_obs], K = clamp(round(range / median
z_err), 4, 40) Gaussian components of width s = h/2 at the centres of K equal bins of width h; weights p maximise
  ln L(p) = Σ_i ln Σ_k p_k N(z_i; c_k, s² + σ_i²)
on the simplex, by the EM map p_k ← p_k (1/N) Σ_i L_ik / Σ_j p_j L_ij from flat weights. Here EM runs until no weight moves by
more than 1e-12 in a step (or 2 000 000 steps), and ln L at that point is printed with the weights.
Generated with /usr/bin/python3, numpy 1.24.2:  python3 population_em_reference.py > population_em_reference.txt
"""
import csv
import os

import numpy as np

here = os.path.dirname(os.path.abspath(__file__))
rows = list(csv.DictReader(open(os.path.join(here, "photoz_truncated_prior_mock.csv"))))
z = np.array([float(r["z"]) for r in rows])
e = np.array([float(r["z_err"]) for r in rows])
lo, hi = z.min(), z.max()
med = np.sort(e[e > 0])[len(e[e > 0]) // 2]
k = int(np.clip(np.round((hi - lo) / med), 4, 40))  # C#'s Math.Round is round-half-even, as numpy's
h = (hi - lo) / k
s = 0.5 * h
c = lo + (np.arange(k) + 0.5) * h
v = s * s + e[:, None] ** 2
L = np.exp(-0.5 * (z[:, None] - c[None, :]) ** 2 / v) / np.sqrt(2 * np.pi * v)
p = np.full(k, 1.0 / k)
steps = 0
while steps < 2_000_000:
    den = L @ p
    q = p * (L / den[:, None]).mean(axis=0)
    q /= q.sum()
    steps += 1
    change = np.abs(q - p).max()
    p = q
    if change <= 1e-12:
        break
lnl = np.log(L @ p).sum()
print(f"numpy {np.__version__}")
print(f"components {k} width {s:.12g} plain_em_steps {steps} last_change {change:.3g}")
print(f"lnL {lnl:.10f}")
print("weights " + " ".join(f"{w:.8e}" for w in p))
