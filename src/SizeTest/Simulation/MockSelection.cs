using SizeTest.Foundation.Errors;

namespace SizeTest.Simulation;

/// <summary>
/// Survey selection, applied to the <em>observed</em> values after measurement errors: an object enters the
/// catalogue when μ_obs &lt; <see cref="SbLimit"/>, m_obs &lt; <see cref="MagLimit"/> and θ_obs &gt;
/// <see cref="MinThetaArcsec"/> (each only when set). For galaxies the total magnitude follows from the mean SB
/// within R_e: half the light inside π R_e² gives m = μ − 2.5 log10(2π θ²), θ in arcsec. Compact radio sources have
/// no surface brightness, so only <see cref="MinThetaArcsec"/> applies to them.
/// </summary>
/// <param name="SbLimit">Surface-brightness limit, mag/arcsec², or null.</param>
/// <param name="MagLimit">Total-magnitude limit, mag, or null.</param>
/// <param name="MinThetaArcsec">Smallest resolvable size, arcsec, or null.</param>
public sealed record MockSelection(double? SbLimit = null, double? MagLimit = null, double? MinThetaArcsec = null)
{
    /// <summary>No selection.</summary>
    public static MockSelection None { get; } = new();

    /// <summary>True when no cut is set.</summary>
    public bool IsEmpty => SbLimit is null && MagLimit is null && MinThetaArcsec is null;

    /// <summary>Checks the values; throws an <see cref="Foundation.Errors.InputException"/> naming the setting (<see cref="Foundation.Errors.SettingProblem"/>).</summary>
    public void Validate()
    {
        if (SbLimit is { } s && !double.IsFinite(s)) throw SettingProblem.Input("{sb_limit} must be a finite number of mag/arcsec2");
        if (MagLimit is { } m && !double.IsFinite(m)) throw SettingProblem.Input("{mag_limit} must be a finite magnitude");
        if (MinThetaArcsec is { } t && !(t > 0 && double.IsFinite(t))) throw SettingProblem.Input($"{{min_size}} must be a positive size in arcsec; got {t}");
    }
}
