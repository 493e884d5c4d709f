namespace SizeTest.Photometry;

/// <summary>Which surface-brightness measure a value is.</summary>
public enum SurfaceBrightnessKind
{
    /// <summary>⟨μ⟩_e: mean surface brightness inside the effective (half-light) radius.</summary>
    MeanWithinEffective,
    /// <summary>μ_e: surface brightness at the effective radius.</summary>
    AtEffective,
    /// <summary>μ_0: central surface brightness of the Sérsic fit.</summary>
    Central,
}

/// <summary>
/// Surface-brightness definitions and conversions between them (mag/arcsec², any one
/// photometric system; the builder works in AB).
/// </summary>
public static class SurfaceBrightness
{
    /// <summary>
    /// ⟨μ⟩_e = m + 2.5 log10(2π R_e²), R_e in arcsec: half the total flux spread uniformly over
    /// the circle of radius R_e (Graham &amp; Driver 2005, PASA 22, 118, eq. 12 rearranged; common practice).
    /// </summary>
    /// <param name="totalMag">Total apparent magnitude m.</param>
    /// <param name="effectiveRadiusArcsec">Effective (half-light) radius R_e in arcsec, &gt; 0.</param>
    public static double MeanWithinEffective(double totalMag, double effectiveRadiusArcsec) =>
        totalMag + 2.5 * Math.Log10(2.0 * Math.PI * effectiveRadiusArcsec * effectiveRadiusArcsec);

    /// <summary>
    /// Observed surface brightness of a source of rest-frame surface brightness
    /// <paramref name="muRest"/>: μ_obs = μ_rest + 2.5 n log10(1+z) + K + A (Tolman 1930 dimming with
    /// bolometric exponent n — 4 for FLRW — plus the Hogg et al. 2002 K-correction, which holds the
    /// bandwidth term, plus extinction). Add any evolution term to <paramref name="muRest"/>.
    /// </summary>
    public static double Observed(double muRest, double z, double bolometricDimmingExponent, double kCorrection = 0.0, double extinction = 0.0) =>
        muRest + 2.5 * bolometricDimmingExponent * Math.Log10(1.0 + z) + kCorrection + extinction;

    /// <summary>
    /// The offset that converts a surface brightness of kind <paramref name="from"/> into kind
    /// <paramref name="to"/> for a Sérsic profile of index n: μ_to = μ_from + Offset. Uses
    /// <see cref="SersicProfile.MeanMinusEffective"/> and <see cref="SersicProfile.CentralMinusEffective"/>.
    /// </summary>
    public static double ConversionOffset(SurfaceBrightnessKind from, SurfaceBrightnessKind to, double sersicN)
    {
        if (from == to) return 0.0;
        return RelativeToEffective(to, sersicN) - RelativeToEffective(from, sersicN);
    }

    /// <summary>μ_kind − μ_e for a Sérsic profile of index n (0 for <see cref="SurfaceBrightnessKind.AtEffective"/>).</summary>
    public static double RelativeToEffective(SurfaceBrightnessKind kind, double sersicN) => kind switch
    {
        SurfaceBrightnessKind.AtEffective => 0.0,
        SurfaceBrightnessKind.MeanWithinEffective => SersicProfile.MeanMinusEffective(sersicN),
        SurfaceBrightnessKind.Central => SersicProfile.CentralMinusEffective(sersicN),
        _ => throw new ArgumentOutOfRangeException(nameof(kind), kind, null),
    };

    /// <summary>Short name used in option strings and descriptions: <c>mean</c>, <c>effective</c>, <c>central</c>.</summary>
    public static string Token(SurfaceBrightnessKind kind) => kind switch
    {
        SurfaceBrightnessKind.MeanWithinEffective => "mean",
        SurfaceBrightnessKind.AtEffective => "effective",
        SurfaceBrightnessKind.Central => "central",
        _ => throw new ArgumentOutOfRangeException(nameof(kind), kind, null),
    };
}
