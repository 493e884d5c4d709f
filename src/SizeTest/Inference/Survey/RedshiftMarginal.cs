namespace SizeTest.Inference.Survey;

/// <summary>How a photometric-redshift object is integrated over its redshift (setting <c>z_marginal</c>).</summary>
public enum RedshiftMarginal
{
    /// <summary>Gauss–Hermite quadrature of p(θ | z) N(z; z_obs, σ_z²) π(z) over z (exact as the nodes grow; the default).</summary>
    Quadrature,
    /// <summary>
    /// The effective-variance linearisation (Clutton-Brock 1967, Technometrics 9, 261; Orear 1982, Am. J. Phys. 50, 912):
    /// m(z) ≈ m(z_obs) + m′(z_obs)(z − z_obs), so ln θ ~ N(m(z_obs), σ_i² + σ² + m′² σ_z²); exact when m is linear in z over the
    /// error and the prior does not cut the Gaussian. One evaluation per object.
    /// </summary>
    Linear,
}
