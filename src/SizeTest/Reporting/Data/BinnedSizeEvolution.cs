namespace SizeTest.Reporting.Data;

/// <summary>
/// A model's required size evolution without a power law (<c>--evolution binned:K</c>): the fitted R0 of each redshift bin
/// for one population, and the same model fitted with R0 (1+z)^a on the same objects, drawn over the bins.
/// </summary>
/// <remarks>
/// Where a bin is drawn: with ln θ_i = ln R0_k − ln D_A(z_i) + ε_i and Var ε_i = s² + σ_i² (s = ln 10 · scatter_dex, σ_i the
/// error of ln θ_i), the maximum-likelihood ln R0_k of a bin is the precision-weighted mean of ln θ_i + ln D_A(z_i)
/// (weights v_i = w_i/(s² + σ_i²), w_i the object weights). If the truth is R0 (1+z)^a, its expectation is
/// ln R0 + a Σ v_i ln(1+z_i)/Σ v_i, so the bin estimates the power law exactly at
/// 1 + z_eff = exp(Σ v_i ln(1+z_i)/Σ v_i) (derived here; selection truncations, photo-z and Gaussian θ errors make this
/// approximate). Drawn there, the bins lie on the power law when the power law holds.
/// </remarks>
/// <param name="Group">Population label; empty for a single population.</param>
/// <param name="Bins">The bins in increasing redshift.</param>
public sealed record BinnedSizeEvolution(string Group, IReadOnlyList<BinnedSize> Bins)
{
    /// <summary>The same model's power-law fit for this population, or null when that fit was not made or failed.</summary>
    public PowerLawSize? PowerLaw { get; init; }
}

/// <summary>One redshift bin of a binned-evolution fit.</summary>
/// <param name="ZLow">Lower bin edge (observed redshift).</param>
/// <param name="ZHigh">Upper bin edge.</param>
/// <param name="ZEffective">Where the bin estimates a power law exactly (see <see cref="BinnedSizeEvolution"/>).</param>
/// <param name="R0Kpc">Fitted physical size of the bin, kpc (<c>r0_kpc_binK</c>).</param>
/// <param name="Lo">Lower end of its 68% interval.</param>
/// <param name="Hi">Upper end of its 68% interval.</param>
/// <param name="Count">Objects in the bin (this population).</param>
public sealed record BinnedSize(double ZLow, double ZHigh, double ZEffective, double R0Kpc, double Lo, double Hi, int Count);

/// <summary>A power-law size evolution R(z) = R0 (1+z)^a with the 68% interval of a.</summary>
/// <param name="R0Kpc">R0, kpc.</param>
/// <param name="SizeEvolution">a.</param>
/// <param name="Lo">Lower end of a's 68% interval.</param>
/// <param name="Hi">Upper end of a's 68% interval.</param>
public sealed record PowerLawSize(double R0Kpc, double SizeEvolution, double Lo, double Hi)
{
    /// <summary>R(z) = R0 (1+z)^a in kpc.</summary>
    public double At(double z) => R0Kpc * Math.Pow(1 + z, SizeEvolution);
}
