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
               (sb ? "(and μ0 − 2.5 b log10(1+z) for the surface brightnesses; the figure draws the R0 bins, results.json has the mu0_binK) " : "") +
               "on the same objects (maximum likelihood, not part of the comparison): " + string.Join("; ", parts);
    }

    /// <summary>
    /// Per population, the bins of <paramref name="fit"/> (a binned fit of <paramref name="hypothesis"/> to
    /// <paramref name="observables"/>) with their effective redshifts, and the power law of <paramref name="powerLaw"/>
    /// when given. Empty when the hypothesis is not binned.
    /// </summary>
    public static IReadOnlyList<BinnedSizeEvolution> For(Hypothesis hypothesis, ModelFitSummary fit, Observables observables, ModelFitSummary? powerLaw)
    {
        ArgumentNullException.ThrowIfNull(hypothesis);
        ArgumentNullException.ThrowIfNull(fit);
        ArgumentNullException.ThrowIfNull(observables);
        var sv = hypothesis.Nuisance.SurveyTerms;
        if (sv.EvolutionBinEdges is not { } edges) return [];
        int bins = sv.BinCount;
        var labels = sv.GroupLabels;
        var group = observables.Survey.Group;
        var weight = observables.Survey.Weight;
        var err = observables.LnThetaErr;
        var est = fit.Parameters.ToDictionary(p => p.Name, StringComparer.Ordinal);
        var list = new List<BinnedSizeEvolution>();
        foreach (var g in labels)
        {
            double scatterDex = est.TryGetValue(SurveyModel.Named(NuisanceParameters.Names.ScatterDex, g), out var sc) ? sc.Value : double.NaN;
            double s2 = Math.Pow(Math.Log(10) * scatterDex, 2);
            var sumV = new double[bins];
            var sumVx = new double[bins];
            var count = new int[bins];
            for (int i = 0; i < observables.Count; i++)
            {
                if (g.Length > 0 && (group is null || group[i] != g)) continue;
                double w = weight?[i] ?? 1;
                if (!(w > 0)) continue;
                double z = observables.Z[i];
                int k = 0;
                while (k < bins - 1 && z >= edges[k + 1]) k++; // the likelihood's own assignment (SurveySizeLikelihood)
                double sigma = err?[i] ?? 0;
                double v = w / (s2 + sigma * sigma);
                if (!double.IsFinite(v)) v = w;
                sumV[k] += v;
                sumVx[k] += v * Math.Log(1 + z);
                count[k]++;
            }
            var rows = new List<BinnedSize>();
            for (int k = 0; k < bins; k++)
            {
                if (!est.TryGetValue(SurveyModel.Named($"r0_kpc_bin{k + 1}", g), out var r) || count[k] == 0) continue;
                rows.Add(new BinnedSize(edges[k], edges[k + 1], Math.Exp(sumVx[k] / sumV[k]) - 1, r.Value, r.Lo, r.Hi, count[k]));
            }
            PowerLawSize? law = null;
            if (powerLaw is not null)
            {
                var pe = powerLaw.Parameters.ToDictionary(p => p.Name, StringComparer.Ordinal);
                if (pe.TryGetValue(SurveyModel.Named(NuisanceParameters.Names.R0Kpc, g), out var r0) && pe.TryGetValue(SurveyModel.Named(NuisanceParameters.Names.SizeEvolution, g), out var a))
                    law = new PowerLawSize(r0.Value, a.Value, a.Lo, a.Hi);
            }
            list.Add(new BinnedSizeEvolution(g, rows) { PowerLaw = law });
        }
        return list;
    }
}
