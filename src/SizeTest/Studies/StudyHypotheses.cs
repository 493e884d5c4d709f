using SizeTest.Cosmology;
using SizeTest.Inference;

namespace SizeTest.Studies;

/// <summary>Turns a study's model list and parameter settings into the hypotheses the fit study compares.</summary>
public static class StudyHypotheses
{
    /// <summary>One hypothesis per world model, in the study's order.</summary>
    /// <exception cref="ArgumentException">A setting is inconsistent with a model (e.g. frees a parameter the likelihood does not see).</exception>
    public static IReadOnlyList<Hypothesis> Build(StudyDefinition study)
    {
        ArgumentNullException.ThrowIfNull(study);
        return study.Models.Select(name => For(WorldModels.Get(name), study)).ToArray();
    }

    /// <summary>
    /// As <see cref="Build"/>, but first refuses a parameter setting that no listed model knows — needed once survey
    /// terms are bound to a sample, because per-group names (<c>NAME@GROUP</c>) can be checked only then.
    /// </summary>
    /// <exception cref="SizeTest.Foundation.Errors.InputException">A setting names a parameter none of the models has.</exception>
    public static IReadOnlyList<Hypothesis> BuildChecked(StudyDefinition study)
    {
        ArgumentNullException.ThrowIfNull(study);
        var families = study.Models.Select(WorldModels.Get).ToArray();
        var known = families.SelectMany(f => KnownNames(f, study.Nuisance)).ToHashSet(StringComparer.Ordinal);
        foreach (var p in study.Parameters.Concat(study.ModelParameters.Values.SelectMany(v => v)))
            if (!known.Contains(p.Name))
                throw new SizeTest.Foundation.Errors.InputException($"the study file sets parameter '{p.Name}', which no model has for this sample; known parameters are {string.Join(", ", known.Order(StringComparer.Ordinal))}",
                    study.StudyFilePath.Length > 0 ? study.StudyFilePath : null);
        return families.Select(f => For(f, study)).ToArray();
    }

    /// <summary>The hypothesis of one world model: the study-wide settings, then that model's own settings on top.</summary>
    public static Hypothesis For(IWorldModelFamily family, StudyDefinition study)
    {
        ArgumentNullException.ThrowIfNull(family);
        ArgumentNullException.ThrowIfNull(study);
        var merged = new Dictionary<string, StudyParameter>(StringComparer.Ordinal);
        var known = KnownNames(family, study.Nuisance);
        foreach (var p in study.Parameters)
            if (known.Contains(p.Name)) merged[p.Name] = p;
        if (study.ModelParameters.TryGetValue(family.Name, out var own))
            foreach (var p in own) merged[p.Name] = p;
        // models.flux_convention fixes a static model's luminosity exponent (the parser refuses a setting of it as well).
        if (study.FluxConvention is { } convention && FluxConventions.Applies(family))
            merged[WorldModelParameters.Names.LuminosityExponent] = new StudyParameter(WorldModelParameters.Names.LuminosityExponent, ParameterStatus.Fixed, convention.LuminosityExponent());
        return Hypothesis.Create(family, study.Nuisance, Overrides(family, study.Nuisance, merged.Values));
    }

    /// <summary>Every parameter name a world model has under the nuisance model (cosmological then nuisance).</summary>
    public static HashSet<string> KnownNames(IWorldModelFamily family, NuisanceModel nuisance) =>
        family.Parameters.Select(p => p.Name)
            .Concat(NuisanceParameters.For(nuisance).Select(p => p.Name))
            .ToHashSet(StringComparer.Ordinal);

    private static ParameterOverrides Overrides(IWorldModelFamily family, NuisanceModel nuisance, IEnumerable<StudyParameter> settings)
    {
        var free = new HashSet<string>(StringComparer.Ordinal);
        var fixedValues = new Dictionary<string, double>(StringComparer.Ordinal);
        var priors = new Dictionary<string, (double, double)>(StringComparer.Ordinal);
        var bounds = new Dictionary<string, (double, double)>(StringComparer.Ordinal);
        var specs = family.Parameters.Concat(NuisanceParameters.For(nuisance)).ToDictionary(p => p.Name, StringComparer.Ordinal);
        foreach (var s in settings)
        {
            var spec = specs[s.Name];
            switch (s.Status)
            {
                case ParameterStatus.Fixed:
                    // A derived default (NaN, e.g. a flat model's Ω_Λ) is what "fixed" already means for a cosmological parameter.
                    if (s.Value is { } v) fixedValues[s.Name] = v;
                    else if (!spec.DefaultIsDerived) fixedValues[s.Name] = spec.Default;
                    break;
                case ParameterStatus.GaussianPrior:
                    priors[s.Name] = (s.PriorMean!.Value, s.PriorSd!.Value);
                    break;
                default:
                    free.Add(s.Name);
                    break;
            }
            if (s.Status != ParameterStatus.Fixed && (s.Min is not null || s.Max is not null))
                bounds[s.Name] = (s.Min ?? spec.Min, s.Max ?? spec.Max);
        }
        return new ParameterOverrides(free, fixedValues, priors, bounds);
    }
}
