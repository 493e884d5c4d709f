namespace SizeTest.Inference.Survey;

/// <summary>
/// The survey terms a fit ran with, as results.json's <c>settings.survey</c> records them (null there when no survey term was
/// active): what a reader needs to reproduce the fit or to judge its assumptions, without reading the notes.
/// </summary>
/// <param name="SizeRelation"><c>none</c>, <c>luminosity</c> or <c>mass</c>.</param>
/// <param name="PivotAbsMag">Pivot absolute magnitude of the size–luminosity relation (null without it).</param>
/// <param name="PivotLogMass">Pivot log10 stellar mass of the size–mass relation (null without it).</param>
/// <param name="Groups">Population labels, each with its own nuisance parameters (null: one population).</param>
/// <param name="EvolutionBinEdges">Redshift edges of binned evolution (null: the power law).</param>
/// <param name="PhotometricRedshifts">Whether each object was integrated over its redshift (z_err).</param>
/// <param name="ZMarginal"><c>linear</c> or <c>quadrature</c> (null without photometric redshifts).</param>
/// <param name="RedshiftNodes">Nodes per object of the quadrature (null unless it is used).</param>
/// <param name="RedshiftPriorMin">Lower end of the redshift prior as stated (null: the sample's range).</param>
/// <param name="RedshiftPriorMax">Upper end as stated (null: the sample's range).</param>
/// <param name="RedshiftPriorShape"><c>population</c> (deconvolved from the sample) or <c>flat</c> (null without photometric redshifts).</param>
/// <param name="SizeErrors"><c>lognormal</c> or <c>gaussian</c>.</param>
/// <param name="AbsMagMin">Luminosity window, bright end (null: open).</param>
/// <param name="AbsMagMax">Luminosity window, faint end (null: open).</param>
/// <param name="RedshiftPopulation">The population redshift prior used, with its EM convergence (null unless <paramref name="RedshiftPriorShape"/>
/// is <c>population</c>).</param>
public sealed record SurveySettings(
    string SizeRelation, double? PivotAbsMag, double? PivotLogMass, IReadOnlyList<string>? Groups, IReadOnlyList<double>? EvolutionBinEdges,
    bool PhotometricRedshifts, string? ZMarginal, int? RedshiftNodes, double? RedshiftPriorMin, double? RedshiftPriorMax, string? RedshiftPriorShape,
    string SizeErrors, double? AbsMagMin, double? AbsMagMax, PopulationPriorRecord? RedshiftPopulation = null)
{
    /// <summary>The record of <paramref name="survey"/>, or null when none of its terms is active.</summary>
    public static SurveySettings? From(SurveyModel survey)
    {
        ArgumentNullException.ThrowIfNull(survey);
        if (!survey.IsActive) return null;
        bool z = survey.MarginaliseRedshift;
        return new SurveySettings(
            survey.Relation switch { SizeRelationKind.Luminosity => "luminosity", SizeRelationKind.Mass => "mass", _ => "none" },
            survey.Relation == SizeRelationKind.Luminosity ? survey.PivotOrDefault.AbsMag : null,
            survey.Relation == SizeRelationKind.Mass ? survey.PivotOrDefault.LogMass : null,
            survey.Groups is { Count: > 0 } g ? g : null,
            survey.EvolutionBinEdges,
            z,
            z ? survey.ZMarginal == RedshiftMarginal.Linear ? "linear" : "quadrature" : null,
            z && survey.ZMarginal == RedshiftMarginal.Quadrature ? survey.RedshiftNodes : null,
            survey.RedshiftPriorMin, survey.RedshiftPriorMax,
            z ? survey.RedshiftPopulation is null ? "flat" : "population" : null,
            survey.SizeErrors == SizeErrorKind.Gaussian ? "gaussian" : "lognormal",
            survey.AbsMagMin, survey.AbsMagMax,
            z && survey.RedshiftPopulation is { } population ? PopulationPriorRecord.From(population) : null);
    }
}
