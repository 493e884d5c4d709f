using SizeTest.Cosmology;

namespace SizeTest.Simulation;

/// <summary>
/// The surface-brightness parameters a mock drawn with a luminosity function implies. Such a mock writes μ from its photometry,
/// μ = m + 5 log10 θ + 2.5 log10 2π (+ μ_err noise), not from μ0, b and σ_μ; with m = M + 5 log10(D_L/10 pc), θ = R/D_A and
/// R = R0 (L/L_pivot)^β (1+z)^a, μ = M + 5 log10 R + 5 log10(D_L/D_A) + const. A joint fit with the size–luminosity relation, the
/// generating world model and no size–SB slope (κ = 0), whose μ mean is μ0 + 2.5 (n − b) log10(1+z) − 2.5 γ log10(L/L_pivot), should then
/// find γ = 1 − 2β, b = n − 2e − 2a (D_L = D_A (1+z)^e; b = −2a for FLRW, n = 2e), μ0 = M_pivot + 25 + 5 log10(R0 · 10⁻³ · 206264.8″) +
/// 2.5 log10 2π (R0 in kpc, at z = 0 and M = M_pivot) and σ_μ = 5 σ_R (the size scatter itself, fully correlated with it).
/// </summary>
/// <param name="Mu0">μ0, mag/arcsec².</param>
/// <param name="SbEvolution">b.</param>
/// <param name="SbLuminositySlope">γ (<c>sb_luminosity_slope</c>).</param>
/// <param name="ScatterMag">σ_μ, mag.</param>
public sealed record PhotometricSurfaceBrightness(double Mu0, double SbEvolution, double SbLuminositySlope, double ScatterMag)
{
    /// <summary>The implied values for one population.</summary>
    /// <param name="model">The generating world model.</param>
    /// <param name="pivotAbsMag">M_pivot of the size–luminosity relation.</param>
    /// <param name="r0Kpc">R0, kpc.</param>
    /// <param name="sizeEvolution">a.</param>
    /// <param name="sizeLuminositySlope">β.</param>
    /// <param name="scatterDex">σ_R, dex.</param>
    public static PhotometricSurfaceBrightness For(IWorldModel model, double pivotAbsMag, double r0Kpc, double sizeEvolution, double sizeLuminositySlope, double scatterDex)
    {
        ArgumentNullException.ThrowIfNull(model);
        double mu0 = pivotAbsMag + 25 + 5 * Math.Log10(r0Kpc * 1e-3 * Foundation.Angles.AngleUnits.ArcsecPerRadian) + 2.5 * Math.Log10(2 * Math.PI);
        double b = model.BolometricDimmingExponent - 2 * Photometry.ModelLuminosity.DistanceExponent(model) - 2 * sizeEvolution;
        return new PhotometricSurfaceBrightness(mu0, b, 1 - 2 * sizeLuminositySlope, 5 * scatterDex);
    }
}
