namespace SizeTest.Reporting.Data;

/// <summary>
/// A model's required surface-brightness evolution without a power law (<c>--evolution binned:K</c> in an sb or joint fit): the
/// fitted μ0 of each redshift bin for one population (dimming removed: the world model's 2.5 n log10(1+z) stays in the model),
/// and the same model fitted with μ0 − 2.5 b log10(1+z) on the same objects, drawn over the bins.
/// </summary>
/// <remarks>
/// Where a bin is drawn: with μ_i = μ0_k + 2.5 n ℓ_i + C_i + ε_i (ℓ = log10(1+z), C_i the K-correction and extinction) and
/// Var ε_i = s_μ² + σ_μ,i², the maximum-likelihood μ0_k of a bin is the precision-weighted mean of μ_i − 2.5 n ℓ_i − C_i (weights
/// v_i = w_i/(s_μ² + σ_μ,i²)). If the truth is μ0 − 2.5 b ℓ, its expectation is μ0 − 2.5 b Σ v_i ℓ_i/Σ v_i, so the bin estimates the
/// power law exactly at 1 + z_eff = exp(Σ v_i ln(1+z_i)/Σ v_i), the form of <see cref="BinnedSizeEvolution"/> with the surface
/// brightnesses' weights (derived here; the joint likelihood's size–SB covariance, the size–SB slope κ, selection truncations and
/// photo-z make this approximate).
/// </remarks>
/// <param name="Group">Population label; empty for a single population.</param>
/// <param name="Bins">The bins in increasing redshift.</param>
public sealed record BinnedSurfaceBrightnessEvolution(string Group, IReadOnlyList<BinnedSurfaceBrightness> Bins)
{
    /// <summary>The same model's power-law fit for this population, or null when that fit was not made or failed.</summary>
    public PowerLawSurfaceBrightness? PowerLaw { get; init; }
}

/// <summary>One redshift bin of a binned-evolution sb or joint fit.</summary>
/// <param name="ZLow">Lower bin edge (observed redshift).</param>
/// <param name="ZHigh">Upper bin edge.</param>
/// <param name="ZEffective">Where the bin estimates a power law exactly (see <see cref="BinnedSurfaceBrightnessEvolution"/>).</param>
/// <param name="Mu0">Fitted surface brightness of the bin with the dimming removed, mag/arcsec² (<c>mu0_binK</c>).</param>
/// <param name="Lo">Lower end of its 68% interval.</param>
/// <param name="Hi">Upper end of its 68% interval.</param>
/// <param name="Count">Objects in the bin (this population).</param>
public sealed record BinnedSurfaceBrightness(double ZLow, double ZHigh, double ZEffective, double Mu0, double Lo, double Hi, int Count);

/// <summary>A power-law surface-brightness evolution μ0 − 2.5 b log10(1+z) (dimming removed) with the 68% interval of b.</summary>
/// <param name="Mu0">μ0, mag/arcsec².</param>
/// <param name="SbEvolution">b (L ∝ (1+z)^b).</param>
/// <param name="Lo">Lower end of b's 68% interval.</param>
/// <param name="Hi">Upper end of b's 68% interval.</param>
public sealed record PowerLawSurfaceBrightness(double Mu0, double SbEvolution, double Lo, double Hi)
{
    /// <summary>μ0 − 2.5 b log10(1+z) in mag/arcsec²: what a bin's μ0 measures when the power law holds.</summary>
    public double At(double z) => Mu0 - 2.5 * SbEvolution * Math.Log10(1 + z);
}
