using SizeTest.Foundation.Errors;

namespace SizeTest.Simulation;

/// <summary>
/// A survey design: how many objects the catalogue holds, of which kind, their redshift distribution,
/// measurement errors and selection.
/// </summary>
/// <remarks>
/// Selection is applied after observation, and the generator keeps drawing until <see cref="Count"/> objects
/// pass (so a catalogue always has exactly <see cref="Count"/> rows); the fraction that passed is reported with
/// the catalogue. Drawing stops with an error when more than <see cref="MaxDrawsPerObject"/> × Count objects were
/// drawn (a selection that almost nothing passes).
/// </remarks>
/// <param name="Count">Objects in the catalogue (after selection), ≥ 1.</param>
/// <param name="Redshifts">N(z) of the drawn (pre-selection) population.</param>
/// <param name="Kind">Galaxies or compact radio sources.</param>
/// <param name="Errors">Measurement errors (null: the defaults of <see cref="MeasurementErrors"/>).</param>
/// <param name="Selection">Selection cuts (null: none).</param>
/// <param name="MaxDrawsPerObject">Cap on draws per catalogued object (default 1000).</param>
public sealed record SurveyDesign(
    int Count,
    RedshiftDistribution Redshifts,
    MockObjectKind Kind = MockObjectKind.Galaxy,
    MeasurementErrors? Errors = null,
    MockSelection? Selection = null,
    int MaxDrawsPerObject = 1000)
{
    /// <summary>The measurement errors (never null).</summary>
    public MeasurementErrors MeasurementErrors => Errors ?? new MeasurementErrors();

    /// <summary>The selection cuts (never null).</summary>
    public MockSelection Cuts => Selection ?? MockSelection.None;

    /// <summary>Checks the design; throws an <see cref="Foundation.Errors.InputException"/> naming the setting (<see cref="Foundation.Errors.SettingProblem"/>), or an <see cref="ArgumentException"/> for a value no setting gives, with a user-facing message.</summary>
    public void Validate()
    {
        ArgumentNullException.ThrowIfNull(Redshifts);
        if (Count < 1) throw SettingProblem.Input($"{{object_count}} must be at least 1; got {Count}");
        if (MaxDrawsPerObject < 1) throw new ArgumentException("the draw cap per object must be at least 1");
        MeasurementErrors.Validate();
        Cuts.Validate();
        if (Kind == MockObjectKind.CompactRadio && (Cuts.SbLimit is not null || Cuts.MagLimit is not null))
            throw SettingProblem.Input("compact radio sources have no surface brightness or magnitude: {sb_limit} and {mag_limit} apply to {kind} galaxy only");
    }
}
