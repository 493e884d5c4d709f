using SizeTest.Cosmology;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Text;
using SizeTest.Inference;

namespace SizeTest.Simulation;

/// <summary>
/// The policy of a power analysis's candidate fits, given a mock survey template:
/// <list type="bullet">
/// <item>the observable defaults to <c>joint</c> for galaxies and <c>size</c> for compact radio sources (which have
/// no surface brightness, so only <c>size</c> is allowed for them);</item>
/// <item>the fits model the template's selection cuts that enter the observable (the SB limit unless size-only, the
/// magnitude limit for joint, and for size with the size–luminosity relation, which conditions on it; the smallest size unless SB-only), and the size–SB relation when the truth has a
/// Kormendy slope;</item>
/// <item>the fits take the survey terms the design implies, as <c>fit</c> would for such a catalogue (<see cref="Survey"/>): the
/// size–luminosity relation when galaxies are drawn from a luminosity function (not for SB alone), each population's own
/// nuisance parameters when the design mixes populations, and photometric-redshift marginalisation (with the population prior,
/// estimated per mock) when the mocks have redshift errors;</item>
/// <item>the candidate of the true family is fitted with the true cosmological parameters held fixed (unless the
/// user frees them), the other families at their defaults; the user's fixed values apply to every candidate
/// where the parameter exists.</item>
/// </list>
/// Problems name settings (<see cref="SettingProblem"/>): <c>observable</c>, <c>kind</c>, <c>fix</c>, <c>free</c>.
/// </summary>
public static class PowerCandidates
{
    /// <summary>The observable of the fits: <paramref name="asked"/>, or the default for the template's objects.</summary>
    public static ObservableKind Observable(MockSurveySpec template, ObservableKind? asked)
    {
        var kind = asked ?? (template.Design.Kind == MockObjectKind.Galaxy ? ObservableKind.Joint : ObservableKind.Size);
        if (template.Design.Kind == MockObjectKind.CompactRadio && kind != ObservableKind.Size)
            throw SettingProblem.Exception([new("compact radio sources have no surface brightness: use {observable} size with {kind} radio")]);
        return kind;
    }

    /// <summary>The nuisance model of every candidate: the template's cuts that enter <paramref name="kind"/>.</summary>
    public static NuisanceModel Nuisance(MockSurveySpec template, ObservableKind kind)
    {
        var cuts = template.Design.Cuts;
        var survey = Survey(template, kind);
        // A magnitude limit is a truncation in joint fits, or conditioned on in size fits with the size–luminosity relation.
        bool sizeConditioned = kind == ObservableKind.Size && survey?.Relation == Inference.Survey.SizeRelationKind.Luminosity;
        var selection = new SelectionLimits(
            kind == ObservableKind.Size ? null : cuts.SbLimit,
            kind == ObservableKind.Joint || sizeConditioned ? cuts.MagLimit : null,
            kind == ObservableKind.SurfaceBrightness ? null : cuts.MinThetaArcsec);
        // The parameter names of the survey terms (group labels sorted as SurveyRequest.Build sorts them); each mock's fit rebuilds the
        // model from its own objects (PowerAnalysis), which changes no name.
        var named = survey is null ? null : new Inference.Survey.SurveyModel(survey.Relation, survey.Pivot,
            survey.Groups ? template.SurveyTruth.Groups.Select(g => g.Name).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal).ToArray() : null,
            MarginaliseRedshift: template.Design.MeasurementErrors.PhotoZError > 0);
        return new NuisanceModel(kind, selection, SizeSbRelation: kind == ObservableKind.Joint && template.GalaxyTruth.KormendySlope != 0, Survey: named);
    }

    /// <summary>
    /// The survey terms <c>fit</c> would take for the template's catalogues, or null when the design needs none: the size–luminosity
    /// relation (pivot as drawn) for galaxies from a luminosity function unless <paramref name="kind"/> is sb, populations as groups,
    /// and photometric redshifts (a mock with redshift errors has a z_err column, so <see cref="Inference.Survey.SurveyRequest.Build"/>
    /// marginalises over it by default).
    /// </summary>
    public static Inference.Survey.SurveyRequest? Survey(MockSurveySpec template, ObservableKind kind)
    {
        ArgumentNullException.ThrowIfNull(template);
        bool galaxy = template.Design.Kind == MockObjectKind.Galaxy;
        var sv = template.SurveyTruth;
        var relation = galaxy && sv.LuminosityFunction is not null && kind != ObservableKind.SurfaceBrightness
            ? Inference.Survey.SizeRelationKind.Luminosity : Inference.Survey.SizeRelationKind.None;
        bool groups = galaxy && sv.Groups.Select(g => g.Name).Distinct(StringComparer.Ordinal).Count() > 1;
        bool photoZ = template.Design.MeasurementErrors.PhotoZError > 0;
        if (relation == Inference.Survey.SizeRelationKind.None && !groups && !photoZ) return null;
        return new Inference.Survey.SurveyRequest(relation, relation == Inference.Survey.SizeRelationKind.None ? null : new Photometry.LuminosityPivot(AbsMag: sv.PivotAbsMag),
            Groups: groups);
    }

    /// <summary>What <see cref="Survey"/> chose, in words for the notes.</summary>
    public static IEnumerable<string> SurveyWords(Inference.Survey.SurveyRequest survey, MockSurveySpec template)
    {
        ArgumentNullException.ThrowIfNull(survey);
        ArgumentNullException.ThrowIfNull(template);
        if (survey.Relation == Inference.Survey.SizeRelationKind.Luminosity)
            yield return FormattableString.Invariant($"the size–luminosity relation (pivot M = {template.SurveyTruth.PivotAbsMag:0.##}; in joint fits μ is conditional on L too; the fits condition on the magnitudes a magnitude limit selects on, so it is not a truncation)");
        if (survey.Groups) yield return "one set of nuisance parameters per population";
        if (template.Design.MeasurementErrors.PhotoZError > 0) yield return "each object marginalised over its photometric redshift (population prior estimated from each mock)";
    }

    /// <summary>One hypothesis per family; a fixed or freed name that no candidate has is a problem naming the parameter.</summary>
    public static IReadOnlyList<Hypothesis> Create(IWorldModel trueModel, IEnumerable<IWorldModelFamily> families, NuisanceModel nuisance,
        IReadOnlyDictionary<string, double> userFixed, IReadOnlySet<string> userFree)
    {
        var hypotheses = new List<Hypothesis>();
        foreach (var family in families)
        {
            var fixedValues = family.Name == trueModel.Name
                ? trueModel.ParameterValues.Where(p => family.Parameters.Any(q => q.Name == p.Key) && !userFree.Contains(p.Key)).ToDictionary(p => p.Key, p => p.Value)
                : new Dictionary<string, double>();
            foreach (var (key, value) in userFixed) fixedValues[key] = value;
            var known = family.Parameters.Select(p => p.Name).Concat(NuisanceParameters.For(nuisance).Select(p => p.Name)).ToHashSet();
            hypotheses.Add(Hypothesis.Create(family, nuisance, new ParameterOverrides(
                Free: userFree.Where(known.Contains).ToHashSet(),
                Fixed: fixedValues.Where(kv => known.Contains(kv.Key)).ToDictionary())));
        }
        var allKnown = hypotheses.SelectMany(h => h.Parameters.Select(p => p.Name)).ToHashSet();
        foreach (var name in userFixed.Keys.Concat(userFree))
            if (!allKnown.Contains(name))
                throw SettingProblem.Exception([new($"unknown parameter '{name}' for these models and {{observable}} {nuisance.Observable.Name()}{NameSuggestions.Hint(name, allKnown)}; known parameters are {string.Join(", ", allKnown.Order(StringComparer.Ordinal))}")]);
        return hypotheses;
    }
}
