using SizeTest.Inference;
using SizeTest.Inference.Survey;
using SizeTest.Photometry;
using SizeTest.Reporting.Data;

namespace SizeTest.Studies;

/// <summary>
/// What the report shows of a binned-evolution study (<c>--evolution binned:K</c>): each model's fitted R0 per redshift
/// bin, where each bin is drawn, and the same model fitted again with the power law R0 (1+z)^a on the same objects so the
/// reader sees the shape the model needs beside the one exponent.
/// </summary>
public static class BinnedEvolutionReport
{
    /// <summary>
    /// The power-law counterpart of a binned hypothesis: the same world model, observable and survey terms with
    /// R0 (1+z)^a instead of the bins; every parameter the two share keeps its status, bounds and prior, and R0 and a
    /// (per population) are free.
    /// </summary>
    public static Hypothesis PowerLawCounterpart(Hypothesis binned)
    {
        ArgumentNullException.ThrowIfNull(binned);
        var nuisance = binned.Nuisance with { Survey = binned.Nuisance.SurveyTerms with { EvolutionBinEdges = null } };
        var known = NuisanceParameters.For(nuisance).Select(p => p.Name).Concat(binned.Family.Parameters.Select(p => p.Name)).ToHashSet(StringComparer.Ordinal);
        var shared = binned.Parameters.Where(p => known.Contains(p.Name)).ToArray();
        var overrides = new ParameterOverrides(
            Free: shared.Where(p => p.Status == ParameterStatus.Free).Select(p => p.Name).ToHashSet(StringComparer.Ordinal),
            Fixed: shared.Where(p => p.Status == ParameterStatus.Fixed).ToDictionary(p => p.Name, p => p.Value, StringComparer.Ordinal),
            Priors: shared.Where(p => p.Status == ParameterStatus.GaussianPrior).ToDictionary(p => p.Name, p => (p.PriorMean, p.PriorSd), StringComparer.Ordinal),
            Bounds: shared.Where(p => p.IsFree).ToDictionary(p => p.Name, p => (p.Min, p.Max), StringComparer.Ordinal));
        return Hypothesis.Create(binned.Family, nuisance, overrides);
    }

    /// <summary>
    /// Fits the power-law counterpart of every binned hypothesis by maximum likelihood (keyed by the hypothesis label);
    /// a fit that does not converge is left out (the figure then shows the bins alone).
    /// </summary>
    public static IReadOnlyDictionary<string, ModelFitSummary> FitPowerLaws(IReadOnlyList<Hypothesis> hypotheses, Observables observables, OptimizerSettings settings,
        CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(hypotheses);
        ArgumentNullException.ThrowIfNull(observables);
        var fits = new Dictionary<string, ModelFitSummary>(StringComparer.Ordinal);
        foreach (var h in hypotheses.Where(h => h.Nuisance.SurveyTerms.Binned))
        {
            cancel.ThrowIfCancellationRequested();
            var lik = PowerLawCounterpart(h).Bind(observables);
            var fit = MaximumLikelihood.Fit(lik, settings);
            if (fit.Converged) fits[h.Label] = FitSummaries.From(lik, fit, h.Label);
        }
        return fits;
    }

    /// <summary>The results' note saying what the power law drawn over the bins is, with each model's a and its 68% interval.</summary>
    public static string Note(IReadOnlyList<Hypothesis> hypotheses, IReadOnlyDictionary<string, ModelFitSummary> powerLaws)
    {
        ArgumentNullException.ThrowIfNull(hypotheses);
        ArgumentNullException.ThrowIfNull(powerLaws);
        var inv = System.Globalization.CultureInfo.InvariantCulture;
        var parts = new List<string>();
        foreach (var h in hypotheses.Where(h => h.Nuisance.SurveyTerms.Binned))
        {
            if (!powerLaws.TryGetValue(h.Label, out var f)) { parts.Add($"{h.Label} (power-law fit did not converge)"); continue; }
            var a = f.Parameters.Where(p => p.Name.Split('@')[0] is NuisanceParameters.Names.SizeEvolution or NuisanceParameters.Names.SbEvolution).Select(p =>
                string.Create(inv, $"{p.Name} = {p.Value:0.###} [{p.Lo:0.###}, {p.Hi:0.###}]"));
            parts.Add($"{h.Label}: {string.Join(", ", a)}");
        }
        bool sb = hypotheses.Any(h => h.Nuisance.SurveyTerms.Binned && h.Nuisance.Observable != ObservableKind.Size);
        return "binned evolution: the binned-evolution figure draws over each model's bins the same model refitted with R0 (1+z)^a " +
               (sb ? "(and μ0 − 2.5 b log10(1+z) over the μ0 bins of the surface brightnesses) " : "") +
               "on the same objects (maximum likelihood, not part of the comparison): " + string.Join("; ", parts);
    }

    /// <summary>
    /// Per population, the R0 bins of <paramref name="fit"/> (a binned fit of <paramref name="hypothesis"/> to
    /// <paramref name="observables"/>) with their effective redshifts, and the power law of <paramref name="powerLaw"/>
    /// when given. Empty when the hypothesis is not binned; a population's bins are empty when the fit has no sizes (sb).
    /// </summary>
    public static IReadOnlyList<BinnedSizeEvolution> For(Hypothesis hypothesis, ModelFitSummary fit, Observables observables, ModelFitSummary? powerLaw)
    {
        ArgumentNullException.ThrowIfNull(hypothesis);
        ArgumentNullException.ThrowIfNull(fit);
        ArgumentNullException.ThrowIfNull(observables);
        return PerGroup(hypothesis, fit, observables, powerLaw, NuisanceParameters.Names.ScatterDex, Math.Log(10), observables.LnThetaErr, "r0_kpc_bin",
            NuisanceParameters.Names.R0Kpc, NuisanceParameters.Names.SizeEvolution, (g, bins, r0, a) => new BinnedSizeEvolution(g,
                bins.Select(b => new BinnedSize(b.ZLow, b.ZHigh, b.ZEffective, b.Value.Value, b.Value.Lo, b.Value.Hi, b.Count)).ToList())
            {
                PowerLaw = r0 is not null && a is not null ? new PowerLawSize(r0.Value, a.Value, a.Lo, a.Hi) : null,
            });
    }

    /// <summary>
    /// Per population, the μ0 bins of <paramref name="fit"/> (a binned sb or joint fit of <paramref name="hypothesis"/>) with their
    /// effective redshifts (surface-brightness weights, <see cref="BinnedSurfaceBrightnessEvolution"/>), and μ0 − 2.5 b log10(1+z)
    /// of <paramref name="powerLaw"/> when given. Empty when the hypothesis is not binned or fits sizes alone.
    /// </summary>
    public static IReadOnlyList<BinnedSurfaceBrightnessEvolution> SurfaceBrightnessFor(Hypothesis hypothesis, ModelFitSummary fit, Observables observables,
        ModelFitSummary? powerLaw)
    {
        ArgumentNullException.ThrowIfNull(hypothesis);
        ArgumentNullException.ThrowIfNull(fit);
        ArgumentNullException.ThrowIfNull(observables);
        if (hypothesis.Nuisance.Observable == ObservableKind.Size) return [];
        return PerGroup(hypothesis, fit, observables, powerLaw, NuisanceParameters.Names.ScatterMag, 1, observables.MuErr, "mu0_bin",
            NuisanceParameters.Names.Mu0, NuisanceParameters.Names.SbEvolution, (g, bins, mu0, b) => new BinnedSurfaceBrightnessEvolution(g,
                bins.Select(x => new BinnedSurfaceBrightness(x.ZLow, x.ZHigh, x.ZEffective, x.Value.Value, x.Value.Lo, x.Value.Hi, x.Count)).ToList())
            {
                PowerLaw = mu0 is not null && b is not null ? new PowerLawSurfaceBrightness(mu0.Value, b.Value, b.Lo, b.Hi) : null,
            });
    }

    /// <summary>
    /// For each population: its fitted bins <c>PREFIXk</c> (weights from the scatter <paramref name="scatterName"/> times
    /// <paramref name="scatterScale"/> and the errors <paramref name="error"/>) and the power-law fit's level and exponent
    /// (null without that fit), made into one record by <paramref name="make"/>. Empty when the hypothesis is not binned.
    /// </summary>
    private static List<T> PerGroup<T>(Hypothesis hypothesis, ModelFitSummary fit, Observables observables, ModelFitSummary? powerLaw,
        string scatterName, double scatterScale, double[]? error, string prefix, string levelName, string exponentName,
        Func<string, List<FittedBin>, ParameterEstimate?, ParameterEstimate?, T> make)
    {
        if (hypothesis.Nuisance.SurveyTerms.EvolutionBinEdges is null) return [];
        var est = fit.Parameters.ToDictionary(p => p.Name, StringComparer.Ordinal);
        var law = powerLaw?.Parameters.ToDictionary(p => p.Name, StringComparer.Ordinal);
        var list = new List<T>();
        foreach (var g in hypothesis.Nuisance.SurveyTerms.GroupLabels)
        {
            double s = scatterScale * (est.TryGetValue(SurveyModel.Named(scatterName, g), out var sc) ? sc.Value : double.NaN);
            var bins = Bins(hypothesis, observables, g, s, error, est, prefix);
            list.Add(make(g, bins, law?.GetValueOrDefault(SurveyModel.Named(levelName, g)), law?.GetValueOrDefault(SurveyModel.Named(exponentName, g))));
        }
        return list;
    }

    private readonly record struct FittedBin(double ZLow, double ZHigh, double ZEffective, ParameterEstimate Value, int Count);

    /// <summary>
    /// The fitted bins <c>PREFIXk</c> of population <paramref name="group"/> that hold objects, each at
    /// 1 + z_eff = exp(Σ v_i ln(1+z_i)/Σ v_i), v_i = w_i/(s² + σ_i²) (<paramref name="scatter"/> s and <paramref name="error"/> σ_i
    /// in the units of the binned quantity).
    /// </summary>
    private static List<FittedBin> Bins(Hypothesis hypothesis, Observables observables, string group, double scatter, double[]? error,
        Dictionary<string, ParameterEstimate> est, string prefix)
    {
        var sv = hypothesis.Nuisance.SurveyTerms;
        var edges = sv.EvolutionBinEdges!;
        int bins = sv.BinCount;
        var groups = observables.Survey.Group;
        var weight = observables.Survey.Weight;
        double s2 = scatter * scatter;
        var sumV = new double[bins];
        var sumVx = new double[bins];
        var count = new int[bins];
        for (int i = 0; i < observables.Count; i++)
        {
            if (group.Length > 0 && (groups is null || groups[i] != group)) continue;
            double w = weight?[i] ?? 1;
            if (!(w > 0)) continue;
            double z = observables.Z[i];
            int k = 0;
            while (k < bins - 1 && z >= edges[k + 1]) k++; // the likelihood's own assignment (SurveySizeLikelihood)
            double sigma = error?[i] ?? 0;
            double v = w / (s2 + sigma * sigma);
            if (!double.IsFinite(v)) v = w;
            sumV[k] += v;
            sumVx[k] += v * Math.Log(1 + z);
            count[k]++;
        }
        var rows = new List<FittedBin>();
        for (int k = 0; k < bins; k++)
        {
            if (!est.TryGetValue(SurveyModel.Named($"{prefix}{k + 1}", group), out var r) || count[k] == 0) continue;
            rows.Add(new FittedBin(edges[k], edges[k + 1], Math.Exp(sumVx[k] / sumV[k]) - 1, r, count[k]));
        }
        return rows;
    }
}
