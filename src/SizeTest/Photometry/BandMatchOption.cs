namespace SizeTest.Photometry;

/// <summary>How an observed band is chosen for each object.</summary>
public enum BandMatchMode
{
    /// <summary>The observed band whose effective wavelength is nearest (in ln λ) to λ_rest(1+z).</summary>
    Nearest,
    /// <summary>Linear interpolation in ln λ between the two bands that bracket λ_rest(1+z); nearest outside the range.</summary>
    Interpolate,
}

/// <summary>One observed band available for band matching.</summary>
/// <param name="Name">Band name (used for zero points and extinction coefficients).</param>
/// <param name="MuColumn">Column with the surface brightness in this band.</param>
/// <param name="MuErrColumn">Column with its 1σ error, or null.</param>
/// <param name="EffectiveLambdaAngstrom">Effective wavelength, Å (the pivot wavelength when <paramref name="Response"/> is given).</param>
/// <param name="Response">Filter curve, or null to treat the band as narrow at its effective wavelength.</param>
public sealed record ObservedBand(string Name, string MuColumn, string? MuErrColumn, double EffectiveLambdaAngstrom, FilterResponse? Response = null);

/// <summary>
/// Band matching: several observed bands and one rest-frame target band. Per object the band
/// (or pair of bands) nearest to λ_target(1+z) supplies the surface brightness, and the
/// K-correction option supplies the residual K between that band and the target.
/// </summary>
/// <param name="Bands">Observed bands (at least one), any order.</param>
/// <param name="TargetLambdaAngstrom">Effective wavelength of the rest-frame target band, Å.</param>
/// <param name="TargetBand">Target filter curve, or null (narrow band at <paramref name="TargetLambdaAngstrom"/>).</param>
/// <param name="Mode">Nearest or interpolated.</param>
public sealed record BandMatchOption(IReadOnlyList<ObservedBand> Bands, double TargetLambdaAngstrom, FilterResponse? TargetBand = null, BandMatchMode Mode = BandMatchMode.Nearest);
