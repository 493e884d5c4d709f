using SizeTest.Cosmology;
using SizeTest.Foundation.Errors;

namespace SizeTest.Simulation;

/// <summary>
/// Everything that defines a mock catalogue: the true world model, the true population (galaxies or radio
/// sources, by <see cref="SurveyDesign.Kind"/>), the survey design and the seed. The same spec and seed give the
/// same catalogue bit for bit, whatever the number of threads.
/// </summary>
/// <param name="Model">The true world model (its <see cref="IWorldModel.BolometricDimmingExponent"/> sets the Tolman dimming).</param>
/// <param name="Design">The survey design.</param>
/// <param name="Seed">Seed of every random draw.</param>
/// <param name="Galaxies">Galaxy population (null: defaults), used when the kind is <see cref="MockObjectKind.Galaxy"/>.</param>
/// <param name="RadioSources">Radio-source population (null: defaults), used when the kind is <see cref="MockObjectKind.CompactRadio"/>.</param>
/// <param name="Survey">Luminosity function, size–luminosity relation, populations, radio spectral index (null: none).</param>
public sealed record MockSurveySpec(
    IWorldModel Model,
    SurveyDesign Design,
    long Seed,
    GalaxyPopulation? Galaxies = null,
    RadioSourcePopulation? RadioSources = null,
    SurveyPopulation? Survey = null)
{
    /// <summary>The survey ingredients (never null).</summary>
    public SurveyPopulation SurveyTruth => Survey ?? new SurveyPopulation();

    /// <summary>The galaxy population (never null).</summary>
    public GalaxyPopulation GalaxyTruth => Galaxies ?? new GalaxyPopulation();

    /// <summary>The radio-source population (never null).</summary>
    public RadioSourcePopulation RadioTruth => RadioSources ?? new RadioSourcePopulation();

    /// <summary>Checks the spec; throws an <see cref="Foundation.Errors.InputException"/> naming the setting (<see cref="Foundation.Errors.SettingProblem"/>), or an <see cref="ArgumentException"/> for a value no setting gives, with a user-facing message.</summary>
    public void Validate()
    {
        ArgumentNullException.ThrowIfNull(Model);
        ArgumentNullException.ThrowIfNull(Design);
        Design.Validate();
        if (Design.Kind == MockObjectKind.Galaxy) GalaxyTruth.Validate();
        else RadioTruth.Validate();
        SurveyTruth.Validate();
        if (Design.Kind == MockObjectKind.CompactRadio && (SurveyTruth.LuminosityFunction is not null || SurveyTruth.Groups.Count > 0))
            throw SettingProblem.Input("a luminosity function and {population} apply to {kind} galaxy (radio sources draw log10 L from {log_lum_mean}/{log_lum_sd})");
        if (!Model.IsExpanding && Design.Redshifts.ZMin <= 0)
            throw new ArgumentException($"the static world model '{Model.Name}' needs redshifts above 0");
    }
}
