using SizeTest.Foundation.Errors;

namespace SizeTest.Simulation;

/// <summary>
/// The true galaxy population of a mock survey: the nuisance model of the size and surface-brightness
/// tests, in the parameter names the fitter reports (<c>r0_kpc</c>, <c>size_evolution</c>, <c>scatter_dex</c>,
/// <c>mu0</c>, <c>sb_evolution</c>, <c>scatter_mag</c>, <c>kormendy_slope</c>).
/// </summary>
/// <remarks>
/// <para>Size: log10 R_e = log10[R0 (1+z)^a] + σ_R ε₁ (R_e in kpc, ε₁ ~ N(0,1)); size evolution as in
/// Lubin &amp; Sandage 2001 / van der Wel et al. 2014 (R ∝ (1+z)^a, a &lt; 0 smaller in the past).</para>
/// <para>Surface brightness, mean within R_e (mag/arcsec²): μ = μ0 + 2.5 n log10(1+z) − 2.5 b log10(1+z)
/// + κ (log10 R_e − log10 R_pivot) + σ_μ ε₂, with n the world model's bolometric dimming exponent
/// (Tolman 1930: 4 for FLRW) and κ an optional Kormendy-type slope that correlates size and SB at fixed z
/// (Kormendy 1977 [from memory]); κ = 0 draws them independently.</para>
/// </remarks>
/// <param name="R0Kpc">Effective radius at z = 0, kpc (default 5).</param>
/// <param name="SizeEvolution">a in R ∝ (1+z)^a (default −1, as van der Wel et al. 2014 late types ≈ −0.75, early −1.48).</param>
/// <param name="ScatterDex">Intrinsic scatter of log10 R_e, dex (default 0.2; van der Wel et al. 2014: ≲ 0.2 dex).</param>
/// <param name="Mu0">Mean SB within R_e at z = 0 (and at the pivot size when κ ≠ 0), mag/arcsec² (default 21).</param>
/// <param name="SbEvolution">b in Δμ = −2.5 b log10(1+z) (b &gt; 0 brighter in the past; default 1).</param>
/// <param name="ScatterMag">Intrinsic SB scatter, mag (default 0.3).</param>
/// <param name="KormendySlope">κ = dμ/dlog10 R at fixed z, mag/arcsec² per dex (default 0: no size–SB correlation).</param>
/// <param name="PivotSizeKpc">R_pivot of the size–SB relation, kpc (default 5, the fitter's default pivot).</param>
public sealed record GalaxyPopulation(
    double R0Kpc = 5.0,
    double SizeEvolution = -1.0,
    double ScatterDex = 0.2,
    double Mu0 = 21.0,
    double SbEvolution = 1.0,
    double ScatterMag = 0.3,
    double KormendySlope = 0.0,
    double PivotSizeKpc = 5.0)
{
    /// <summary>Checks the values; throws an <see cref="Foundation.Errors.InputException"/> naming the setting (<see cref="Foundation.Errors.SettingProblem"/>), or an <see cref="ArgumentException"/> for a value no setting gives, with a user-facing message.</summary>
    public void Validate()
    {
        if (!(R0Kpc > 0) || !double.IsFinite(R0Kpc)) throw SettingProblem.Input($"{{r0_kpc}} must be a positive size in kpc; got {R0Kpc}");
        if (!(ScatterDex >= 0) || !double.IsFinite(ScatterDex)) throw SettingProblem.Input($"{{scatter_dex}} must be ≥ 0; got {ScatterDex}");
        if (!(ScatterMag >= 0) || !double.IsFinite(ScatterMag)) throw SettingProblem.Input($"{{scatter_mag}} must be ≥ 0; got {ScatterMag}");
        if (!double.IsFinite(SizeEvolution) || !double.IsFinite(SbEvolution) || !double.IsFinite(Mu0) || !double.IsFinite(KormendySlope))
            throw new ArgumentException("galaxy population parameters must be finite numbers");
        if (!(PivotSizeKpc > 0)) throw new ArgumentException($"the pivot size must be positive; got {PivotSizeKpc}");
    }
}
