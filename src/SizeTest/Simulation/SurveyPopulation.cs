using SizeTest.Foundation.Errors;

namespace SizeTest.Simulation;

/// <summary>
/// Survey-scale ingredients of a mock beyond the basic population: a luminosity function with a size–luminosity
/// relation (galaxies), mixed populations, and the radio spectral index used to turn radio luminosities into flux densities.
/// </summary>
/// <remarks>
/// <para>Galaxies with a luminosity function: M ~ Schechter; m = M + 5 log10(D_L/10 pc) with the true model's D_L (no
/// K-correction: the mock is drawn in the rest band); log10 R = log10 R0 − 0.4 β (M − M_pivot) + a log10(1+z) + σ_R ε₁, i.e.
/// R ∝ L^β; the mean SB within R_e follows from m and θ, μ = m + 2.5 log10(2π θ²) (Graham &amp; Driver 2005), so the magnitude
/// limit m &lt; m_lim selects on luminosity only.</para>
/// <para>Radio: S_ν = L_ν (1+z)^{1+α} / (4π D_L²) in Jy (inverse of <c>ModelLuminosity.LogRadioLuminosity</c>).</para>
/// </remarks>
/// <param name="LuminosityFunction">Galaxies: draw absolute magnitudes (null: no luminosities, as before).</param>
/// <param name="SizeLuminositySlope">β in R ∝ L^β for the single population (default 0).</param>
/// <param name="PivotAbsMag">M_pivot of the relation (default −21).</param>
/// <param name="Populations">Mixed populations, each with its own R0, a, β, scatter (empty: one population).</param>
/// <param name="RadioSpectralIndex">α in S_ν ∝ ν^α for radio flux densities (default 0).</param>
public sealed record SurveyPopulation(
    SchechterLuminosityFunction? LuminosityFunction = null,
    double SizeLuminositySlope = 0.0,
    double PivotAbsMag = -21.0,
    IReadOnlyList<MockSubpopulation>? Populations = null,
    double RadioSpectralIndex = 0.0)
{
    /// <summary>The populations (never null).</summary>
    public IReadOnlyList<MockSubpopulation> Groups => Populations ?? [];

    /// <summary>Checks the values; throws an <see cref="Foundation.Errors.InputException"/> naming the setting (<see cref="Foundation.Errors.SettingProblem"/>), or an <see cref="ArgumentException"/> for a value no setting gives, with a user-facing message.</summary>
    public void Validate()
    {
        LuminosityFunction?.Validate();
        if (!double.IsFinite(SizeLuminositySlope) || !double.IsFinite(PivotAbsMag) || !double.IsFinite(RadioSpectralIndex))
            throw new ArgumentException("survey population parameters must be finite numbers");
        if (Groups.Select(g => g.Name).Distinct().Count() != Groups.Count) throw SettingProblem.Input("{population} names must differ");
    }
}
