namespace SizeTest.Photometry;

/// <summary>
/// Where the surface brightness comes from and which measure the observables carry.
/// </summary>
/// <param name="FromMagnitude">True: compute ⟨μ⟩_e = m + 2.5 log10(2π R_e²) from the total magnitude and the size column (R_e in arcsec); false: use the μ column.</param>
/// <param name="InputKind">What the μ column holds (implied <see cref="SurfaceBrightnessKind.MeanWithinEffective"/> when <paramref name="FromMagnitude"/>); null = unspecified.</param>
/// <param name="OutputKind">Measure to convert to with the Sérsic index; null = keep the input.</param>
public sealed record SurfaceBrightnessOption(bool FromMagnitude = false, SurfaceBrightnessKind? InputKind = null, SurfaceBrightnessKind? OutputKind = null)
{
    /// <summary>Use the μ column as it is.</summary>
    public static SurfaceBrightnessOption AsGiven { get; } = new();
}
