using System.Globalization;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Text;
using SizeTest.Photometry;

namespace SizeTest.Inference.Survey;

/// <summary>
/// What a user asked for on the command line or in a study file's <c>[survey]</c> table, before the sample is known.
/// <see cref="Build"/> turns it into a <see cref="SurveyModel"/> for a loaded sample: group labels (sorted), equal-count bin
/// edges, and photometric-redshift marginalisation by default when the sample carries z_err.
/// </summary>
/// <param name="Relation">Size–luminosity or size–mass relation, or none.</param>
/// <param name="Pivot">Pivots of the relation.</param>
/// <param name="Groups">Fit each group of the sample's group column with its own nuisance parameters.</param>
/// <param name="EvolutionBins">K for binned evolution; null for the power law.</param>
/// <param name="IgnoreZErr">Do not marginalise over redshift errors even when z_err is mapped.</param>
/// <param name="SizeErrors">Size-error model.</param>
/// <param name="AbsMagMin">Luminosity window, bright end (null: open).</param>
/// <param name="AbsMagMax">Luminosity window, faint end (null: open).</param>
/// <param name="RedshiftPriorMin">Flat redshift prior's lower end for photo-z marginalisation (null: the sample's range).</param>
/// <param name="RedshiftPriorMax">Its upper end.</param>
/// <param name="ZMarginal">Null for the default: the linearised marginal for every observable (size: over 200 mocks of the issue's design
/// its 68% intervals of a cover 69.0%, mean bias +0.010 against a half-width of 0.106; sb and joint: docs/survey-catalogues.md), except
/// joint fits of isophotal sizes, which take the quadrature (setting <c>z_marginal</c>).</param>
/// <param name="RedshiftPriorShape">The prior's shape on its range: the sample's deconvolved redshift distribution (default) or flat.</param>
/// <param name="RedshiftNodes">Gauss–Hermite nodes of the photo-z quadrature (2–40), or null for <see cref="DefaultRedshiftNodes"/>
/// (setting <c>z_nodes</c>; only the quadrature uses it).</param>
public sealed record SurveyRequest(
    SizeRelationKind Relation = SizeRelationKind.None,
    LuminosityPivot? Pivot = null,
    bool Groups = false,
    int? EvolutionBins = null,
    bool IgnoreZErr = false,
    SizeErrorKind SizeErrors = SizeErrorKind.LogNormal,
    double? AbsMagMin = null,
    double? AbsMagMax = null,
    double? RedshiftPriorMin = null,
    double? RedshiftPriorMax = null,
    RedshiftMarginal? ZMarginal = null,
    RedshiftPriorShape RedshiftPriorShape = RedshiftPriorShape.Population,
    int? RedshiftNodes = null)
{
    /// <summary>
    /// The default number of Gauss–Hermite nodes of the photo-z quadrature: 7 for size fits (the integrand's width in ln θ is set by
    /// D_A's slope, a few hundredths of the scatter), 20 for sb and joint fits, where (∂m_μ/∂z)² s² ≈ (0.2–0.4 mag)² is as large as the
    /// SB scatter: over 20 sb mocks of 4000 objects 7 nodes biased b by −0.45 half-widths of its 68% interval and 20 nodes by −0.14
    /// (docs/survey-catalogues.md).
    /// </summary>
    public static int DefaultRedshiftNodes(ObservableKind observable) => observable == ObservableKind.Size ? 7 : 20;

    /// <summary>Most EM steps of the population redshift prior (<see cref="PopulationRedshiftPrior.MaxIterations"/>; tests lower it
    /// to make the iteration stop unconverged).</summary>
    internal int PopulationPriorMaxSteps { get; init; } = PopulationRedshiftPrior.MaxIterations;

    /// <summary>Fewest and most nodes of the photo-z quadrature.</summary>
    public const int MinRedshiftNodes = 2, MaxRedshiftNodes = 40;

    /// <summary>Most redshift bins of binned evolution.</summary>
    public const int MaxEvolutionBins = 50;

    /// <summary>
    /// Reads an evolution form, <c>power</c> or <c>binned:K</c> with 2 ≤ K ≤ <see cref="MaxEvolutionBins"/>, as written in
    /// <c>fit --evolution</c> and the study file's <c>survey.evolution</c>: false when the text is neither.
    /// </summary>
    /// <param name="text">The form as written.</param>
    /// <param name="bins">K, or null for the power law.</param>
    public static bool TryParseEvolution(string text, out int? bins)
    {
        bins = null;
        if (text == "power") return true;
        if (text is not null && text.StartsWith("binned:", StringComparison.Ordinal)
            && int.TryParse(text["binned:".Length..], System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out int k)
            && k >= 2 && k <= MaxEvolutionBins)
        {
            bins = k;
            return true;
        }
        return false;
    }

    /// <summary>
    /// " (did you mean 'power'?)" or " (did you mean 'binned:5'?)" for a mistyped evolution form (its part before a colon
    /// within <see cref="NameSuggestions.MaxDistance"/> of <c>power</c> or <c>binned</c>, the bins kept), or empty.
    /// </summary>
    public static string EvolutionHint(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        int colon = text.IndexOf(':', StringComparison.Ordinal);
        string form = colon < 0 ? text : text[..colon];
        return NameSuggestions.Closest(form, ["power", "binned"]) switch
        {
            "power" => NameSuggestions.DidYouMean("power"),
            "binned" => NameSuggestions.DidYouMean("binned:" + (colon < 0 ? "K" : text[(colon + 1)..])),
            _ => "",
        };
    }

    /// <summary>Reads <c>quadrature</c> or <c>linear</c> (fit's z_marginal setting); false (and null) for any other text.</summary>
    public static bool TryParseZMarginal(string? text, out RedshiftMarginal? marginal)
    {
        marginal = text switch { "linear" => RedshiftMarginal.Linear, "quadrature" => RedshiftMarginal.Quadrature, _ => null };
        return marginal is not null;
    }

    /// <summary>Nothing asked.</summary>
    public static SurveyRequest None { get; } = new();

    /// <summary>Most populations a group column may hold: each brings its own R0, a, (β,) scatter, so a column with more labels
    /// is almost surely not a population label (a magnitude, an id) and its fit would have thousands of parameters.</summary>
    public const int MaxGroups = 50;

    // Refuses, before any model is built, a group column with more than MaxGroups labels (its fit would have thousands of
    // parameters and take minutes to reach the small-population refusal of SampleSizeCheck). Counts how many labels one object holds.
    private static void RefuseNonLabelGroups(IReadOnlyList<string> labels, int distinct)
    {
        if (distinct <= MaxGroups) return;
        int single = labels.GroupBy(l => l, StringComparer.Ordinal).Count(c => c.Count() == 1);
        throw SettingProblem.Exception([new(FormattableString.Invariant(
            $"the {{group}} column has {distinct} distinct labels among {labels.Count} objects ({single} of them held by a single object); at most {MaxGroups} populations are fitted, each with its own R0, a and scatter. Is it a population label (e.g. a morphological type), not a measured quantity or an id? Merge the labels into a few populations, or fit without {{group}}"))]);
    }

    /// <summary>
    /// What of this request cannot run with the sample split over MPI ranks (group labels and equal-count bin edges need the whole
    /// sample in one process; a luminosity window runs, its per-model counts summed over ranks), as option names; empty when all of it can.
    /// </summary>
    public IReadOnlyList<string> NeedsWholeSample(bool groupColumn) =>
        [.. (Groups || groupColumn ? new[] { "{group}" } : []), .. (EvolutionBins is not null ? new[] { "{evolution} binned" } : [])];

    /// <summary>
    /// The survey terms a nuisance model carries before the sample is loaded: the size relation and its pivots, which decide what a
    /// selection cut means (<see cref="NuisanceModel.MagLimitIsConditioned"/>); null without a relation. The sample-dependent terms
    /// (groups, bin edges, photo-z) come with <see cref="Build"/>.
    /// </summary>
    public SurveyModel? RelationTerms => Relation == SizeRelationKind.None ? null : new SurveyModel(Relation, Pivot);

    /// <summary>Whether the photometry stage must prepare luminosities or masses.</summary>
    public bool NeedsLuminosity => Relation != SizeRelationKind.None || AbsMagMin is not null || AbsMagMax is not null;

    /// <summary>The survey model for <paramref name="observables"/> and <paramref name="observable"/>; notes say what was decided.</summary>
    /// <param name="observables">The loaded, selected sample (under MPI, this rank's share).</param>
    /// <param name="observable">The fitted observable.</param>
    /// <param name="notes">Receives what was decided.</param>
    /// <param name="distributed">The sample is split over MPI ranks (then the population redshift prior, which needs every object,
    /// is refused: a flat prior must be asked for, so one process and several never differ silently).</param>
    /// <param name="wholeSampleCoverage">Under MPI, the whole sample's counts against the stated redshift prior (the sum of every
    /// rank's <see cref="PriorCoverage"/>), so that the warning and the error are decided alike on every rank; null: count
    /// <paramref name="observables"/>.</param>
    public SurveyModel Build(Observables observables, ObservableKind observable, ICollection<string> notes, bool distributed = false,
        RedshiftPriorCoverage? wholeSampleCoverage = null)
    {
        ArgumentNullException.ThrowIfNull(observables);
        ArgumentNullException.ThrowIfNull(notes);
        IReadOnlyList<string>? groups = null;
        if (Groups)
        {
            var g = observables.Survey.Group ?? throw SettingProblem.Exception([new("{group} needs a group column; name it with {group} COLUMN")]);
            groups = g.Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal).ToArray();
            RefuseNonLabelGroups(g, groups.Count);
            if (groups.Count == 1) notes.Add(SettingProblem.Text($"{{group}}: the group column has a single label '{groups[0]}'; fitting one population."));
        }
        double[]? edges = EvolutionBins is { } k ? SurveyModel.EqualCountEdges(observables.Z, k) : null;
        bool marginalise = MarginalisesRedshift(observables, observable);
        if (!marginalise && observables.Survey.ZErr is not null)
            notes.Add("z_err is mapped but ignored ({ignore_z_err}): redshifts are taken as exact.");
        if (HasStatedRedshiftPrior(observables, observable)) CheckPriorCoversData(wholeSampleCoverage ?? PriorCoverage(observables, observable), notes);
        PopulationRedshiftPrior? population = null;
        if (marginalise && RedshiftPriorShape == RedshiftPriorShape.Population && observables.Count > 0)
        {
            if (distributed)
                throw SettingProblem.Exception([new("the population redshift prior (the default {z_prior_shape} population) is estimated from every object in one process; under mpirun set {z_prior_shape} flat, or fit on one machine")]);
            else
            {
                double lo = RedshiftPriorMin ?? observables.Z.Min(), hi = RedshiftPriorMax ?? observables.Z.Max();
                if (hi > lo)
                {
                    population = PopulationRedshiftPrior.Estimate(observables.Z, observables.Survey.ZErr!, lo, hi, PopulationPriorMaxSteps);
                    if (population.ConvergenceWarning() is { } w) notes.Add(w);
                }
            }
        }
        var marginal = Marginal(observables, observable, marginalise, notes);
        if (RedshiftNodes is not null && !(marginalise && marginal == RedshiftMarginal.Quadrature))
            notes.Add(marginalise
                ? "{z_nodes} is ignored: the linearised photo-z marginal takes no nodes (set {z_marginal} quadrature to use them)."
                : "{z_nodes} is ignored: no redshift is integrated over (no z_err, or {ignore_z_err}).");
        return new SurveyModel(Relation, Pivot, groups is { Count: > 1 } ? groups : null, edges, marginalise, RedshiftNodes ?? DefaultRedshiftNodes(observable), SizeErrors,
            AbsMagMin, AbsMagMax, RedshiftPriorMin, RedshiftPriorMax, marginal,
            population, observables.Survey.Weight is not null);
    }

    // The linearised marginal for every observable, except joint fits of isophotal sizes (the quadrature, said in the notes); a stated
    // z_marginal linear there is refused.
    private RedshiftMarginal Marginal(Observables observables, ObservableKind observable, bool marginalise, ICollection<string> notes)
    {
        bool isophotal = observable == ObservableKind.Joint && observables.SizeDefinition.Kind == Catalogues.SizeKind.Isophotal;
        if (!isophotal) return ZMarginal ?? RedshiftMarginal.Linear;
        if (ZMarginal == RedshiftMarginal.Linear && marginalise)
            throw SettingProblem.Exception([new("{z_marginal} linear cannot take isophotal sizes (the isophotal offset moves non-linearly with the mean SB, which the linearised marginal does not carry); use {z_marginal} quadrature, the default for isophotal joint fits")]);
        if (ZMarginal is null && marginalise)
            notes.Add("photometric redshifts: quadrature used because the sizes are isophotal (their offset ln(r_iso/R_e) moves non-linearly with the mean SB, which the linearised marginal, the default otherwise, does not carry).");
        return ZMarginal ?? RedshiftMarginal.Quadrature;
    }

    /// <summary>
    /// A stated prior that excludes the data (<see cref="RedshiftPriorCoverage"/>, of the whole sample). More than half of the
    /// objects with z_err &gt; 0 outside: a warning note; all of them: an error.
    /// </summary>
    private void CheckPriorCoversData(RedshiftPriorCoverage coverage, ICollection<string> notes)
    {
        if (!coverage.MostOutside) return;
        string range = string.Create(CultureInfo.InvariantCulture, $"[{(RedshiftPriorMin is { } a ? a.ToString("R", CultureInfo.InvariantCulture) : "−∞")}, {(RedshiftPriorMax is { } b ? b.ToString("R", CultureInfo.InvariantCulture) : "∞")}]");
        string what = string.Create(CultureInfo.InvariantCulture, $"{coverage.Outside} of the {coverage.WithErr} objects with z_err > 0 have z_obs more than 3 z_err outside the stated {{z_prior}} {range}");
        if (coverage.AllOutside)
            throw SettingProblem.Exception([new($"{new SettingText(what)}: the prior excludes all of them; widen {{z_prior}} or leave it out (the default is the sample's range)")]);
        notes.Add($"warning: {what}; their fit rests on the prior's tail and may not converge; check {{z_prior}}.");
    }

    /// <summary>The counts of <paramref name="observables"/> against the stated redshift prior (<see cref="RedshiftPriorCoverage"/>),
    /// or zero counts when no stated prior applies (<see cref="HasStatedRedshiftPrior"/>). Under MPI each rank counts its share
    /// and the sums go to <see cref="Build"/>.</summary>
    public RedshiftPriorCoverage PriorCoverage(Observables observables, ObservableKind observable)
    {
        ArgumentNullException.ThrowIfNull(observables);
        if (!HasStatedRedshiftPrior(observables, observable)) return default;
        return RedshiftPriorCoverage.Count(observables.Z, observables.Survey.ZErr!, RedshiftPriorMin ?? double.NegativeInfinity, RedshiftPriorMax ?? double.PositiveInfinity);
    }

    /// <summary>Whether objects are integrated over their redshifts: a z_err column is mapped and not ignored. Every observable
    /// (<paramref name="observable"/>: size, sb and joint alike) has the marginalisation.</summary>
    public bool MarginalisesRedshift(Observables observables, ObservableKind observable) =>
        observables.Survey.ZErr is not null && !IgnoreZErr;

    /// <summary>Whether objects are integrated over their redshifts under a prior with at least one end stated (a selection cut for
    /// objects with exact redshifts, <see cref="OutsideRedshiftPrior"/>).</summary>
    public bool HasStatedRedshiftPrior(Observables observables, ObservableKind observable) =>
        MarginalisesRedshift(observables, observable) && (RedshiftPriorMin is not null || RedshiftPriorMax is not null);

    /// <summary>
    /// Whether object <paramref name="i"/> has no density under the stated redshift prior: it is integrated over redshift
    /// (<see cref="MarginalisesRedshift"/>), a prior end is stated, its z_err is 0 (its redshift is exact) and z lies outside
    /// [<see cref="RedshiftPriorMin"/>, <see cref="RedshiftPriorMax"/>]. (An object with z_err &gt; 0 is integrated under its
    /// truncated normal on the prior instead; without a stated prior the prior is the sample's range.)
    /// </summary>
    public bool OutsideRedshiftPrior(Observables observables, ObservableKind observable, int i) =>
        HasStatedRedshiftPrior(observables, observable) && !(observables.Survey.ZErr![i] > 0)
        && (observables.Z[i] < (RedshiftPriorMin ?? double.NegativeInfinity) || observables.Z[i] > (RedshiftPriorMax ?? double.PositiveInfinity));
}
