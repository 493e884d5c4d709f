using SizeTest.Cosmology;
using SizeTest.Foundation.Errors;

namespace SizeTest.Inference;

/// <summary>
/// A hypothesis: a world-model family, the status of every parameter (cosmological and nuisance: free,
/// fixed or with a Gaussian prior) and a <see cref="NuisanceModel"/>. Binding it to observables gives the
/// log-likelihood over its free parameters (<see cref="Bind"/>).
/// </summary>
public sealed class Hypothesis
{
    private Hypothesis(IWorldModelFamily family, NuisanceModel nuisance, IReadOnlyList<ParameterSetting> settings, string label)
    {
        Family = family;
        Nuisance = nuisance;
        Parameters = settings;
        Label = label;
        FreeParameters = settings.Where(s => s.IsFree).ToArray();
    }

    /// <summary>The world-model family.</summary>
    public IWorldModelFamily Family { get; }

    /// <summary>Observable, selection, conventions.</summary>
    public NuisanceModel Nuisance { get; }

    /// <summary>Every parameter, cosmological first then nuisance, with its status.</summary>
    public IReadOnlyList<ParameterSetting> Parameters { get; }

    /// <summary>The free parameters in the order of the parameter vector θ.</summary>
    public IReadOnlyList<ParameterSetting> FreeParameters { get; }

    /// <summary>Name for reports: the family name, or a variant label (e.g. <c>lcdm[size_evolution=0]</c>).</summary>
    public string Label { get; }

    /// <summary>Number of free parameters k (Gaussian-prior parameters count as free).</summary>
    public int K => FreeParameters.Count;

    /// <summary>
    /// Builds the default hypothesis for a family and observable, then applies the overrides.
    /// Defaults: cosmological parameters fixed at their defaults (h0 in particular, because for sizes only
    /// R0·H0 is constrained); the nuisance parameters of the observable free.
    /// </summary>
    /// <exception cref="SizeTest.Foundation.Errors.InputException">An override is inconsistent (e.g. frees a parameter that does not enter the likelihood; names the settings {free}, {prior}).</exception>
    public static Hypothesis Create(IWorldModelFamily family, NuisanceModel nuisance, ParameterOverrides? overrides = null)
    {
        ArgumentNullException.ThrowIfNull(family);
        ArgumentNullException.ThrowIfNull(nuisance);
        nuisance.Validate();
        overrides ??= ParameterOverrides.None;
        var settings = new List<ParameterSetting>();
        foreach (var spec in family.Parameters) settings.Add(ParameterSetting.Fixed(spec));
        foreach (var spec in NuisanceParameters.For(nuisance)) settings.Add(ParameterSetting.Free(spec));

        for (int i = 0; i < settings.Count; i++)
        {
            var s = settings[i];
            var spec = s.Spec;
            if (overrides.Free?.Contains(spec.Name) == true) s = ParameterSetting.Free(spec);
            if (overrides.Fixed?.TryGetValue(spec.Name, out var v) == true) s = ParameterSetting.Fixed(spec, v);
            if (overrides.Priors?.TryGetValue(spec.Name, out var p) == true) s = ParameterSetting.WithGaussianPrior(spec, p.Mean, p.Sd);
            if (overrides.Bounds?.TryGetValue(spec.Name, out var b) == true && s.IsFree)
                s = s with { Min = b.Min, Max = b.Max, Value = Math.Clamp(s.Value, b.Min, b.Max) };
            if (s.IsFree && !EntersLikelihood(spec.Name, nuisance, family))
                throw SettingProblem.Input($"parameter '{spec.Name}' does not enter the {Describe(nuisance.Observable)} likelihood of world model '{family.Name}', so it cannot be fitted; remove it from {{free}}/{{prior}}");
            if (s.IsFree && double.IsNaN(s.Value)) s = s with { Value = RealisedDefault(family, spec.Name) ?? 0.5 * (s.Min + s.Max) };
            if (s.IsFree) s = s with { Value = Math.Clamp(s.Value, s.Min, s.Max) };
            s.Validate();
            settings[i] = s;
        }
        return new Hypothesis(family, nuisance, settings, family.Name);
    }

    // The value a model built with all defaults actually uses (for parameters whose default is "not given").
    private static double? RealisedDefault(IWorldModelFamily family, string name)
    {
        try
        {
            return family.Create(new Dictionary<string, double>()).ParameterValues.TryGetValue(name, out var v) && double.IsFinite(v) ? v : null;
        }
        catch (ArgumentException) { return null; }
    }

    /// <summary>A copy with one parameter held fixed (for nested-model tests); the label records the change.</summary>
    public Hypothesis WithFixed(string name, double value)
    {
        var list = Parameters.Select(s => s.Name == name ? ParameterSetting.Fixed(s.Spec, value) : s).ToArray();
        if (!list.Any(s => s.Name == name)) throw new ArgumentException($"hypothesis '{Label}' has no parameter '{name}'");
        list.First(s => s.Name == name).Validate();
        return new Hypothesis(Family, Nuisance, list, $"{Label}[{name}={value.ToString(System.Globalization.CultureInfo.InvariantCulture)}]");
    }

    /// <summary>A copy with a different nuisance model (same parameter statuses where the parameters still apply).</summary>
    public Hypothesis WithNuisance(NuisanceModel nuisance) =>
        Create(Family, nuisance, new ParameterOverrides(
            Free: Parameters.Where(p => p.Status == ParameterStatus.Free).Select(p => p.Name).Where(n => EntersLikelihood(n, nuisance, Family)).ToHashSet(),
            Fixed: Parameters.Where(p => p.Status == ParameterStatus.Fixed).ToDictionary(p => p.Name, p => p.Value)));

    /// <summary>Whether a parameter can be constrained by the observable.</summary>
    public static bool EntersLikelihood(string name, NuisanceModel nuisance, IWorldModelFamily family)
    {
        bool size = nuisance.Observable != ObservableKind.SurfaceBrightness;
        bool sb = nuisance.Observable != ObservableKind.Size;
        if (NuisanceParameters.For(nuisance).Any(p => p.Name == name)) return true;
        if (NuisanceParameters.IsSurveyName(name)) return false;
        if (NuisanceParameters.All.Any(p => p.Name == name)) return false;
        // The dimming exponent (and the flux convention it defaults from) act only on surface brightness.
        // ... and, with a size–luminosity relation, the flux convention sets each object's luminosity (D_L = d (1+z)^q).
        if (name == WorldModelParameters.Names.LuminosityExponent && size && nuisance.SurveyTerms.Relation != Survey.SizeRelationKind.None) return true;
        if (name is WorldModelParameters.Names.DimmingExponent or WorldModelParameters.Names.LuminosityExponent) return sb;
        // Every other cosmological parameter acts through D_A, which only the size model sees
        // (the joint model with a size–SB relation sees it through the physical size too).
        return size && family.Parameters.Any(p => p.Name == name);
    }

    private static string Describe(ObservableKind k) => k switch
    {
        ObservableKind.Size => "angular-size",
        ObservableKind.SurfaceBrightness => "surface-brightness",
        _ => "joint",
    };

    /// <summary>The full parameter values for a free-parameter vector θ (fixed ones at their values).</summary>
    public double[] FullValues(ReadOnlySpan<double> theta)
    {
        var v = new double[Parameters.Count];
        int j = 0;
        for (int i = 0; i < v.Length; i++) v[i] = Parameters[i].IsFree ? theta[j++] : Parameters[i].Value;
        return v;
    }

    /// <summary>The starting vector: each free parameter's start value.</summary>
    public double[] StartVector() => FreeParameters.Select(p => p.Value).ToArray();

    /// <summary>Binds to observables: the log-likelihood over the free parameters.</summary>
    public HypothesisLikelihood Bind(Photometry.Observables observables) => new(this, observables);
}
