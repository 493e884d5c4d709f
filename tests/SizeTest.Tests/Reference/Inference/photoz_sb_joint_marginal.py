"""One object's photometric-redshift marginal in the surface-brightness and joint likelihoods (SurveyJointLikelihood).

p = int_prior p(obs | z) N(z; z_obs, z_err^2) dz / int_prior N(z; z_obs, z_err^2) dz, flat prior in z on [0.1, 2.5],
with p(obs | z) the truncated Gaussian of the built-in kernels (SB limit for sb, magnitude limit for joint).
Adaptive quadrature (scipy.integrate.quad, epsabs 0, epsrel 1e-12); D_A from astropy FlatLambdaCDM(70, 0.3, Tcmb0=0).
Run: /usr/bin/python3 photoz_sb_joint_marginal.py > photoz_sb_joint_marginal.txt  (numpy 1.24, scipy 1.10.1, astropy 5.2.1)
"""
import numpy as np
import scipy
import astropy
from astropy.cosmology import FlatLambdaCDM
from scipy import integrate, stats

cosmo = FlatLambdaCDM(H0=70, Om0=0.3, Tcmb0=0)
LN10 = np.log(10.0)
ARCSEC_PER_RAD = 180 * 3600 / np.pi

# object and parameters (as in the test)
z_obs, z_err = 0.8, 0.09
theta_arcsec, rel_err = 0.45, 0.05
mu, mu_err = 23.1, 0.1
R0, a, scatter_dex = 5.0, -1.0, 0.2
mu0, b, scatter_mag = 21.0, 1.0, 0.3
n_dim = 4.0  # FLRW bolometric dimming exponent
sb_limit, mag_limit = 23.5, 23.5
zlo, zhi = 0.1, 2.5

y = np.log(theta_arcsec / ARCSEC_PER_RAD)
sig = LN10 * scatter_dex


def mean_mu(z):
    return mu0 + 2.5 * (n_dim - b) * np.log10(1 + z)


def p_sb(z):
    m = mean_mu(z)
    v = mu_err ** 2 + scatter_mag ** 2
    return stats.norm.pdf(mu, m, np.sqrt(v)) / stats.norm.cdf((sb_limit - m) / np.sqrt(v))


def p_joint(z):
    mt = np.log(R0) + a * np.log1p(z) + np.log(1e-3) - np.log(cosmo.angular_diameter_distance(z).value)
    mm = mean_mu(z)
    vt, vm = rel_err ** 2 + sig ** 2, mu_err ** 2 + scatter_mag ** 2
    dens = stats.norm.pdf(y, mt, np.sqrt(vt)) * stats.norm.pdf(mu, mm, np.sqrt(vm))
    # magnitude m = mu - (5/ln10) ln theta_rad - (5/ln10) ln(arcsec/rad) - 2.5 log10(2 pi)
    cx = -5 / LN10
    mean_mag = mm + cx * mt + cx * np.log(ARCSEC_PER_RAD) - 2.5 * np.log10(2 * np.pi)
    sd = np.sqrt(cx * cx * vt + vm)
    return dens / stats.norm.cdf((mag_limit - mean_mag) / sd)


def marginal(f):
    g = lambda z: f(z) * stats.norm.pdf(z, z_obs, z_err)
    num = integrate.quad(g, zlo, zhi, epsabs=0, epsrel=1e-12, limit=200, points=[z_obs])[0]
    den = stats.norm.cdf((zhi - z_obs) / z_err) - stats.norm.cdf((zlo - z_obs) / z_err)
    return np.log(num / den)


print(f"# numpy {np.__version__}, scipy {scipy.__version__}, astropy {astropy.__version__}")
print(f"ln_p_sb {marginal(p_sb):.12f}")
print(f"ln_p_joint {marginal(p_joint):.12f}")
print(f"ln_p_sb_at_zobs {np.log(p_sb(z_obs)):.12f}")
print(f"ln_p_joint_at_zobs {np.log(p_joint(z_obs)):.12f}")
