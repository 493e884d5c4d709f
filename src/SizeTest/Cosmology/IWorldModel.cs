using SizeTest.Foundation.Angles;

namespace SizeTest.Cosmology;

/// <summary>
/// A world model with all its parameter values fixed: the rule that turns a redshift into
/// distances and a surface-brightness dimming law. Expanding (FLRW) models and static
/// Euclidean models both implement it; a quantity a model does not define is NaN and
/// <see cref="Defines"/> says so.
/// </summary>
/// <remarks>
/// Units: distances in Mpc, H0 in km/s/Mpc, times in Gyr. Redshift z must be finite and
/// &gt; 0 for static models, ≥ 0 for FLRW models; invalid z throws <see cref="ArgumentOutOfRangeException"/>.
/// </remarks>
public interface IWorldModel
{
    /// <summary>Family name as used on the command line (e.g. <c>lcdm</c>).</summary>
    string Name { get; }

    /// <summary>True for FLRW (expanding) models, false for static Euclidean ones.</summary>
    bool IsExpanding { get; }

    /// <summary>Hubble constant H0 in km/s/Mpc.</summary>
    double HubbleConstant { get; }

    /// <summary>
    /// Bolometric surface-brightness dimming exponent n: SB ∝ (1+z)^−n. 4 for every FLRW
    /// model (Tolman 1930), a model parameter (default 1) for static models.
    /// </summary>
    double BolometricDimmingExponent { get; }

    /// <summary>The parameter values this model was built with, by name.</summary>
    IReadOnlyDictionary<string, double> ParameterValues { get; }

    /// <summary>Whether the model defines <paramref name="quantity"/>.</summary>
    bool Defines(DistanceQuantity quantity);

    /// <summary>Angular-diameter distance D_A(z) in Mpc (small-angle: θ = ℓ / D_A).</summary>
    double AngularDiameterDistance(double z);

    /// <summary>Luminosity distance D_L(z) in Mpc (flux F = L / 4π D_L²).</summary>
    double LuminosityDistance(double z);

    /// <summary>Line-of-sight comoving distance D_C(z) in Mpc; for static models the distance d.</summary>
    double ComovingDistance(double z);

    /// <summary>Transverse comoving distance D_M(z) in Mpc; NaN where not defined.</summary>
    double TransverseComovingDistance(double z);

    /// <summary>Lookback time in Gyr; NaN where not defined.</summary>
    double LookbackTime(double z);

    /// <summary>
    /// Angular-diameter distances for many redshifts at once, without one quadrature per
    /// redshift. <paramref name="result"/> must have the length of <paramref name="z"/>.
    /// </summary>
    void AngularDiameterDistances(ReadOnlySpan<double> z, Span<double> result);

    /// <summary>
    /// Bolometric Tolman surface-brightness dimming at z in magnitudes,
    /// 2.5·n·log10(1+z) with n = <see cref="BolometricDimmingExponent"/> (see <see cref="TolmanDimming"/>).
    /// </summary>
    double TolmanDimmingMagnitudes(double z) => TolmanDimming.Magnitudes(BolometricDimmingExponent, z);

    /// <summary>
    /// Angular size θ in arcsec of an object of proper (physical) size <paramref name="sizeKpc"/>
    /// at redshift z, small-angle θ = ℓ/D_A (static models: D_A = d). +∞ where D_A = 0 (z = 0 in FLRW).
    /// </summary>
    double AngularSizeArcsec(double z, double sizeKpc)
        => sizeKpc / 1000.0 / AngularDiameterDistance(z) * SizeTest.Foundation.Angles.AngleUnits.ArcsecPerRadian;
}

/// <summary>The distance-like quantities a world model may define.</summary>
public enum DistanceQuantity
{
    /// <summary>Line-of-sight comoving distance (or static distance).</summary>
    Comoving,
    /// <summary>Transverse comoving distance.</summary>
    TransverseComoving,
    /// <summary>Angular-diameter distance.</summary>
    AngularDiameter,
    /// <summary>Luminosity distance.</summary>
    Luminosity,
    /// <summary>Lookback time.</summary>
    LookbackTime,
}
