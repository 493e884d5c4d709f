"""The linearised (effective-variance) photometric-redshift marginal of the surface-brightness and joint likelihoods
(SurveyJointLikelihood with z_marginal linear), computed independently on a small mock: ln L and its gradient.

Each object's redshift posterior N(z; z_obs, z_err^2) on the flat prior [0.3, 2.0] is summarised by its mean zbar and variance s2
(scipy.stats.truncnorm); the likelihood is evaluated once at zbar with the covariance C + s2 g g^T, g = d(m_t, m_mu)/dz at zbar
(Clutton-Brock 1967; Orear 1982, Am. J. Phys. 50, 912):
  m_t  = ln R0 + a ln(1+z) + ln(1e-3) - ln D_A(z)            (R0 kpc, D_A Mpc; astropy FlatLambdaCDM(70, Om, Tcmb0=0))
  m_mu = mu0 + 2.5 (n - b) log10(1+z) + kappa (ln R0 + a ln(1+z) - ln 5),  n = 4, kappa = kormendy_slope / ln 10
  C    = [[theta_rel_err^2 + sig^2, kappa sig^2], [kappa sig^2, mu_err^2 + s_mu^2 + kappa^2 sig^2]],  sig = ln10 scatter_dex
  g    = (a/(1+z) - dlnD_A/dz, 2.5 (n - b)/(ln10 (1+z)) + kappa a/(1+z)),  dlnD_A/dz = (c/H(z))/D_C(z) - 1/(1+z) (exact)
surface brightness alone: mu ~ N(m_mu, mu_err^2 + s_mu^2 + s2 g_mu^2) (kappa = 0). Selection cuts divide by Phi(h/s) of the
effective Gaussian (SB limit: h = mu_lim - m_mu; magnitude limit m = mu - (5/ln10) ln theta_arcsec - 2.5 log10(2 pi)).
The gradient is by central differences with one Richardson step (steps 1e-3 and 5e-4 times max(|p|, 1)).
The mock (photoz_linearised_sb_joint_mock.csv) is drawn here with numpy's default_rng(12).
Run: /usr/bin/python3 photoz_linearised_sb_joint.py > photoz_linearised_sb_joint.txt
"""
import csv
import os
import numpy as np
import scipy
import astropy
from astropy.cosmology import FlatLambdaCDM
from scipy import stats

LN10 = np.log(10.0)
ARCSEC_PER_RAD = 180 * 3600 / np.pi
ZLO, ZHI = 0.3, 2.0
N_DIM = 4.0
HERE = os.path.dirname(os.path.abspath(__file__))
MOCK = os.path.join(HERE, "photoz_linearised_sb_joint_mock.csv")


def draw_mock(n=60):
    rng = np.random.default_rng(12)
    cosmo = FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=0)
    rows = []
    for _ in range(n):
        zt = rng.uniform(ZLO, ZHI)
        z_err = 0.05 * (1 + zt)
        z = max(zt + z_err * rng.standard_normal(), 0.05)
        ln_r = np.log(5.0) - 1.0 * np.log1p(zt) + LN10 * 0.2 * rng.standard_normal()
        theta = np.exp(ln_r) * 1e-3 / cosmo.angular_diameter_distance(zt).value * ARCSEC_PER_RAD
        mu = 21 + 2.5 * (N_DIM - 1) * np.log10(1 + zt) + 0.3 * rng.standard_normal()
        theta *= np.exp(0.05 * rng.standard_normal())
        mu += 0.1 * rng.standard_normal()
        rows.append((z, z_err, theta, 0.05, mu, 0.1))
    with open(MOCK, "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["z", "z_err", "theta_arcsec", "theta_rel_err", "mu", "mu_err"])
        for r in rows:
            w.writerow([repr(float(v)) for v in r])


def read_mock():
    with open(MOCK) as f:
        r = list(csv.DictReader(f))
    return {k: np.array([float(row[k]) for row in r]) for k in r[0]}


def moments(z, s):
    a, b = (ZLO - z) / s, (ZHI - z) / s
    m, v = stats.truncnorm.stats(a, b, loc=z, scale=s, moments="mv")
    return np.asarray(m, float), np.asarray(v, float)


# (observable, SB limit, magnitude limit, size-SB relation, free parameters, fixed Omega_m)
CASES = {
    "sb": ("sb", None, None, False, ["mu0", "sb_evolution", "scatter_mag"], 0.3),
    "sb_sblimit": ("sb", 23.5, None, False, ["mu0", "sb_evolution", "scatter_mag"], 0.3),
    "joint_kormendy": ("joint", None, None, True, ["r0_kpc", "size_evolution", "scatter_dex", "mu0", "sb_evolution", "scatter_mag", "kormendy_slope"], 0.3),
    "joint_maglimit": ("joint", None, 25.0, False, ["r0_kpc", "size_evolution", "scatter_dex", "mu0", "sb_evolution", "scatter_mag"], 0.32),
    "joint_maglimit_omega": ("joint", None, 25.0, False, ["omega_m", "r0_kpc", "size_evolution", "scatter_dex", "mu0", "sb_evolution", "scatter_mag"], None),
}
VALUES = {"r0_kpc": 4.5, "size_evolution": -0.8, "scatter_dex": 0.18, "mu0": 21.2, "sb_evolution": 0.9, "scatter_mag": 0.28,
          "kormendy_slope": 0.4, "omega_m": 0.32}


def ln_l(case, p, d):
    obs, sb_lim, mag_lim, kormendy, _, omega = CASES[case]
    zbar, s2 = moments(d["z"], d["z_err"])
    x, ix = np.log1p(zbar), 1 / (1 + zbar)
    b, mu0, sm = p["sb_evolution"], p["mu0"], p["scatter_mag"]
    mm = mu0 + 2.5 * (N_DIM - b) * x / LN10
    gm = 2.5 * (N_DIM - b) * ix / LN10
    if obs == "sb":
        v = d["mu_err"] ** 2 + sm ** 2 + s2 * gm ** 2
        lp = stats.norm.logpdf(d["mu"], mm, np.sqrt(v))
        if sb_lim is not None:
            lp -= stats.norm.logcdf((sb_lim - mm) / np.sqrt(v))
        return lp.sum()
    cosmo = FlatLambdaCDM(H0=70, Om0=p.get("omega_m", omega), Tcmb0=0)
    da = cosmo.angular_diameter_distance(zbar).value
    dc = cosmo.comoving_distance(zbar).value
    slope = cosmo.hubble_distance.value * cosmo.inv_efunc(zbar) / dc - ix
    a, sig = p["size_evolution"], LN10 * p["scatter_dex"]
    kap = p["kormendy_slope"] / LN10 if kormendy else 0.0
    ln_size = np.log(p["r0_kpc"]) + a * x
    mt = ln_size + np.log(1e-3) - np.log(da)
    mm = mm + kap * (ln_size - np.log(5.0))
    gt = a * ix - slope
    gm = gm + kap * a * ix
    y = np.log(d["theta_arcsec"] / ARCSEC_PER_RAD)
    total = 0.0
    for i in range(len(zbar)):
        g = np.array([gt[i], gm[i]])
        cov = np.array([[d["theta_rel_err"][i] ** 2 + sig ** 2, kap * sig ** 2],
                        [kap * sig ** 2, d["mu_err"][i] ** 2 + sm ** 2 + kap ** 2 * sig ** 2]]) + s2[i] * np.outer(g, g)
        mean = np.array([mt[i], mm[i]])
        total += stats.multivariate_normal.logpdf([y[i], d["mu"][i]], mean, cov)
        if mag_lim is not None:
            c = np.array([-5 / LN10, 1.0])
            offset = -5 / LN10 * np.log(ARCSEC_PER_RAD) - 2.5 * np.log10(2 * np.pi)
            h = mag_lim - offset - c @ mean
            total -= stats.norm.logcdf(h / np.sqrt(c @ cov @ c))
    return total


def gradient(case, p, d):
    g = {}
    for k in CASES[case][4]:
        def f(h):
            q = dict(p)
            q[k] += h
            up = ln_l(case, q, d)
            q[k] -= 2 * h
            return (up - ln_l(case, q, d)) / (2 * h)
        h = 1e-3 * max(abs(p[k]), 1)
        g[k] = (4 * f(h / 2) - f(h)) / 3
    return g


if __name__ == "__main__":
    if not os.path.exists(MOCK):
        draw_mock()
    d = read_mock()
    print(f"# numpy {np.__version__}, scipy {scipy.__version__}, astropy {astropy.__version__}")
    for case in CASES:
        p = {k: VALUES[k] for k in CASES[case][4]}
        print(f"{case} lnL {ln_l(case, p, d):.12f}")
        for k, v in gradient(case, p, d).items():
            print(f"{case} d_{k} {v:.10f}")
