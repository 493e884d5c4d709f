using System.Globalization;

namespace SizeTest.Cosmology;

/// <summary>
/// A static Euclidean world model: space does not expand, light loses energy on its way,
/// and a source at redshift z sits at distance d(z) (<see cref="StaticDistanceLaw"/>).
/// There is no E(z); distances are closed forms.
/// </summary>
/// <remarks>
/// <para>Angular size: θ = ℓ/d, so D_A := d (Euclidean geometry, no aberration).</para>
/// <para>Flux convention, explicit: F = L/[4π d² (1+z)^{2q}], i.e. D_L = d (1+z)^q with the
/// luminosity exponent q (parameter <c>luminosity_exponent</c>): q = 1/2 when photons only
/// lose energy (the convention of Lerner, Falomo &amp; Scarpa 2014, IJMPD 23, 1450058, for the
/// static Euclidean universe with a linear Hubble law) — the default; q = 1 when the
/// photon arrival rate is also diluted by (1+z) (common practice for tired-light variants).</para>
/// <para>Bolometric surface brightness then dims as (1+z)^−n with n = 2q (n = 1 by default);
/// the parameter <c>dimming_exponent</c> may set n on its own (default: n = 2q).</para>
/// <para>Redshifts must be finite and 0 &lt; z ≤ <see cref="FlrwModel.MaxRedshift"/>: at z = 0 the
/// source would sit on the observer (θ infinite), so z ≤ 0 throws
/// <see cref="ArgumentOutOfRangeException"/>. The transverse comoving distance is not defined
/// (NaN); the lookback time is the light-travel time d/c.</para>
/// </remarks>
public sealed class StaticEuclideanModel : IWorldModel
{
    private readonly double _q;

    /// <summary>Builds a static model.</summary>
    /// <param name="law">Distance law.</param>
    /// <param name="hubbleConstant">H0 in km/s/Mpc (&gt; 0).</param>
    /// <param name="luminosityExponent">q in D_L = d (1+z)^q; 0.5 energy loss only, 1 with time dilation.</param>
    /// <param name="dimmingExponent">Bolometric SB dimming exponent n; null = 2q.</param>
    /// <exception cref="ArgumentException">Invalid values.</exception>
    public StaticEuclideanModel(StaticDistanceLaw law, double hubbleConstant = 70, double luminosityExponent = 0.5, double? dimmingExponent = null)
    {
        if (Check(hubbleConstant, luminosityExponent, dimmingExponent) is { } error) throw new ArgumentException(error);
        Law = law;
        HubbleConstant = hubbleConstant;
        _q = luminosityExponent;
        BolometricDimmingExponent = dimmingExponent ?? 2.0 * luminosityExponent;
        HubbleDistance = PhysicalConstants.SpeedOfLightKmPerS / hubbleConstant;
        ParameterValues = new Dictionary<string, double>
        {
            [WorldModelParameters.H0.Name] = hubbleConstant,
            [WorldModelParameters.LuminosityExponent.Name] = luminosityExponent,
            [WorldModelParameters.DimmingExponent.Name] = BolometricDimmingExponent,
        };
    }

    internal static string? Check(double h0, double q, double? n)
    {
        if (!(h0 > 0) || !double.IsFinite(h0)) return $"h0 must be a positive number of km/s/Mpc; got {h0}.";
        if (!double.IsFinite(q)) return $"luminosity_exponent must be finite; got {q}.";
        if (n is { } nn && !double.IsFinite(nn)) return $"dimming_exponent must be finite; got {nn}.";
        return null;
    }

    /// <summary>The distance law.</summary>
    public StaticDistanceLaw Law { get; }

    /// <inheritdoc/>
    public string Name => Law == StaticDistanceLaw.Linear ? "static-linear" : "tired-light";

    /// <inheritdoc/>
    public bool IsExpanding => false;

    /// <inheritdoc/>
    public double HubbleConstant { get; }

    /// <summary>Hubble distance c/H0 in Mpc.</summary>
    public double HubbleDistance { get; }

    /// <summary>Luminosity exponent q: D_L = d (1+z)^q.</summary>
    public double LuminosityExponent => _q;

    /// <inheritdoc/>
    public double BolometricDimmingExponent { get; }

    /// <inheritdoc/>
    public IReadOnlyDictionary<string, double> ParameterValues { get; }

    /// <inheritdoc/>
    public bool Defines(DistanceQuantity quantity) => quantity != DistanceQuantity.TransverseComoving;

    /// <summary>Distance d(z) in Mpc: D_H z (linear) or D_H ln(1+z) (logarithmic).</summary>
    public double Distance(double z)
    {
        Check(z);
        return Law == StaticDistanceLaw.Linear ? HubbleDistance * z : HubbleDistance * FlrwModel.Log1P(z);
    }

    /// <inheritdoc/>
    public double AngularDiameterDistance(double z) => Distance(z);

    /// <inheritdoc/>
    public double LuminosityDistance(double z) => Distance(z) * Math.Pow(1.0 + z, _q);

    /// <inheritdoc/>
    public double ComovingDistance(double z) => Distance(z);

    /// <inheritdoc/>
    public double TolmanDimmingMagnitudes(double z) => TolmanDimming.Magnitudes(BolometricDimmingExponent, z);

    /// <inheritdoc/>
    public double AngularSizeArcsec(double z, double sizeKpc) => sizeKpc / 1000.0 / AngularDiameterDistance(z) * SizeTest.Foundation.Angles.AngleUnits.ArcsecPerRadian;

    /// <summary>Not defined in a static model: NaN (after checking z).</summary>
    public double TransverseComovingDistance(double z)
    {
        Check(z);
        return double.NaN;
    }

    /// <summary>Light-travel time d/c in Gyr.</summary>
    public double LookbackTime(double z) => Distance(z) / HubbleDistance * (PhysicalConstants.HubbleTimeGyrTimesH0 / HubbleConstant);

    /// <inheritdoc/>
    public void AngularDiameterDistances(ReadOnlySpan<double> z, Span<double> result)
    {
        if (result.Length != z.Length)
            throw new ArgumentException($"The result span has length {result.Length} but there are {z.Length} redshifts.", nameof(result));
        for (int i = 0; i < z.Length; i++) result[i] = Distance(z[i]);
    }

    private static void Check(double z)
    {
        if (!(z > 0.0 && z <= FlrwModel.MaxRedshift))
            throw new ArgumentOutOfRangeException(nameof(z), z, string.Create(CultureInfo.InvariantCulture,
                $"A static world model needs a redshift 0 < z ≤ {FlrwModel.MaxRedshift:G} (at z = 0 the source is at the observer); got {z}."));
    }
}
