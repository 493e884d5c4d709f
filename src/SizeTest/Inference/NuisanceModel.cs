using SizeTest.Foundation.Errors;

namespace SizeTest.Inference;

/// <summary>
/// The non-cosmological part of a hypothesis: which observable is fitted, whether a size–surface-brightness
/// relation links them, the dimming-exponent convention and the selection cuts.
/// </summary>
/// <param name="Observable">Size, surface brightness or both.</param>
/// <param name="Selection">Selection cuts modelled as truncations.</param>
/// <param name="SizeSbRelation">Joint mode only: μ depends on log10 physical size with slope <c>kormendy_slope</c>,
/// so the SB test is done at matched physical size (μ0 is the SB at <paramref name="PivotSizeKpc"/>).</param>
/// <param name="PivotSizeKpc">Reference physical size of the size–SB relation, kpc.</param>
/// <param name="DimmingExponentOffset">Added to the world model's bolometric dimming exponent n; use −1 for
/// f_ν (AB) band magnitudes and +1 for f_λ ones when the K-correction does not already remove the bandwidth
/// term (Tolman 1930; common practice). 0 (default) means bolometric or K-corrected to the rest band.</param>
/// <param name="GridNodes">Redshift-grid nodes for ln D_A (16–1024), or 0 (default) for automatic: 48 nodes below
/// 20 000 objects (cubic interpolation error in ln D_A ≲ 1e-6 over 0.01 &lt; z &lt; 10), 96 above.</param>
/// <param name="Survey">Survey-scale terms (size–luminosity relation, groups, binned evolution, photometric redshifts, size-error
/// model, luminosity window); null = none.</param>
public sealed record NuisanceModel(
    ObservableKind Observable,
    SelectionLimits? Selection = null,
    bool SizeSbRelation = false,
    double PivotSizeKpc = 5.0,
    double DimmingExponentOffset = 0.0,
    int GridNodes = 0,
    Survey.SurveyModel? Survey = null)
{
    /// <summary>The survey terms (never null).</summary>
    public Survey.SurveyModel SurveyTerms => Survey ?? Inference.Survey.SurveyModel.None;

    /// <summary>The selection cuts (never null).</summary>
    public SelectionLimits Cuts => Selection ?? SelectionLimits.None;

    /// <summary>Checks consistency; throws an <see cref="Foundation.Errors.InputException"/> naming the setting (<see cref="Foundation.Errors.SettingProblem"/>), or an <see cref="ArgumentException"/> for a value no setting gives, with a user-facing message.</summary>
    public void Validate()
    {
        var s = Cuts;
        if (Observable == ObservableKind.Size && s.SbLimit is not null)
            throw SettingProblem.Input("a surface-brightness limit needs {observable} sb or joint (a size-only fit has no surface-brightness model)");
        if (Observable == ObservableKind.SurfaceBrightness && s.MinThetaArcsec is not null)
            throw SettingProblem.Input("a minimum size needs {observable} size or joint (a surface-brightness-only fit has no size model)");
        // A magnitude limit is modelled in two ways: as a truncation in μ and θ together (joint: m = μ − 5 log10 θ − 2.5 log10 2π), or,
        // with the size–luminosity relation, not at all, because the fit conditions on the magnitudes the limit selects on.
        if (s.MagLimit is not null && Observable != ObservableKind.Joint && SurveyTerms.Relation != Inference.Survey.SizeRelationKind.Luminosity)
            throw SettingProblem.Input(MagLimitProblem(Observable, SurveyTerms.Relation));
        int cuts = (s.SbLimit is null ? 0 : 1) + (s.MagLimit is null ? 0 : 1) + (s.MinThetaArcsec is null ? 0 : 1);
        if (cuts > 2)
            throw SettingProblem.Input("at most two selection cuts can be modelled together (the joint truncation is bivariate); drop one of {sb_limit}, {mag_limit}, {min_size}");
        if (s.MinThetaArcsec is { } t && !(t > 0))
            throw SettingProblem.Input("{min_size} must be positive (arcsec)");
        if (SizeSbRelation && Observable != ObservableKind.Joint)
            throw SettingProblem.Input("the size–surface-brightness relation needs {observable} joint");
        if (!(PivotSizeKpc > 0)) throw new ArgumentException("the pivot size must be positive (kpc)");
        SurveyTerms.Validate(Observable);
        if (GridNodes != 0 && GridNodes is < 16 or > 1024) throw new ArgumentException("the redshift grid needs 16 to 1024 nodes (or 0 for automatic)");
    }

    /// <summary>
    /// A joint fit with a size relation: surface brightness is conditional on each object's luminosity (or mass) too
    /// (<c>sb_luminosity_slope</c>), so b is the SB change at fixed luminosity (<see cref="NuisanceParameters.SbLuminositySlope"/>).
    /// </summary>
    public bool SbAtFixedLuminosity => Observable == ObservableKind.Joint && SurveyTerms.Relation != Inference.Survey.SizeRelationKind.None;

    /// <summary>
    /// The magnitude limit selects on the magnitudes the luminosities come from, which a size or joint fit with the size–luminosity
    /// relation conditions on: there it is not a truncation of the likelihood (<see cref="Inference.Survey.SurveySizeLikelihood"/>,
    /// <see cref="Inference.Survey.SurveyJointLikelihood"/>). The selection depends only on (m, z), so p(θ | z, L, selected) = p(θ | z, L).
    /// </summary>
    public bool MagLimitIsConditioned => Observable != ObservableKind.SurfaceBrightness && SurveyTerms.Relation == Inference.Survey.SizeRelationKind.Luminosity && Cuts.MagLimit is not null;

    /// <summary>The note of a fit whose magnitude limit is conditioned on (<see cref="MagLimitIsConditioned"/>).</summary>
    public const string ConditionedMagLimitNote =
        "magnitude limit with the size–luminosity relation: the limit selects on the apparent magnitude the luminosities come from, which the fit " +
        "conditions on, so it does not truncate the likelihood; the rows outside it are rejected against the magnitude column.";

    // Why a magnitude limit cannot be modelled in a size or sb fit without the size–luminosity relation, and what to do instead.
    private static string MagLimitProblem(ObservableKind observable, Inference.Survey.SizeRelationKind relation) => observable switch
    {
        ObservableKind.SurfaceBrightness =>
            "a magnitude limit cannot be modelled in a surface-brightness-only fit ({observable} sb): m = μ − 5 log10 θ − 2.5 log10 2π selects on sizes and surface brightnesses together, " +
            "and this fit has no size model; fit {observable} joint (the limit is then a truncation in μ and θ), or {observable} size with {size_luminosity} " +
            "(the sizes are then conditional on the magnitudes the limit selects on, so it does not bias them)",
        _ when relation == Inference.Survey.SizeRelationKind.Mass =>
            "a magnitude limit cannot be modelled in a size-only fit ({observable} size) with {size_mass}: the limit selects on luminosity, which the size–mass relation " +
            "does not condition on; use {size_luminosity} (the sizes are then conditional on the magnitudes the limit selects on), or fit {observable} joint " +
            "(the limit is then a truncation in μ and θ)",
        _ =>
            "a magnitude limit cannot be modelled in a size-only fit ({observable} size) without the size–luminosity relation: the limit selects on m = μ − 5 log10 θ − 2.5 log10 2π, " +
            "which a size-only fit does not describe; add {size_luminosity} (the sizes are then conditional on the magnitudes in the mag column, so the limit does not " +
            "bias them), or fit {observable} joint (the limit is then a truncation in μ and θ)",
    };

    /// <summary>The node count used for a sample of <paramref name="objects"/> objects.</summary>
    public int NodesFor(int objects) => GridNodes != 0 ? GridNodes : objects < 20000 ? 48 : 96;
}
