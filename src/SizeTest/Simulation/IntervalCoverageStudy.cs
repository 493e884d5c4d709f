using SizeTest.Inference;

namespace SizeTest.Simulation;

/// <summary>Coverage of one parameter's reported 68% intervals over the mocks of an <see cref="IntervalCoverageStudy"/>.</summary>
/// <param name="Name">Parameter.</param>
/// <param name="Truth">True value.</param>
/// <param name="Covered">Mocks whose reported 68% set contains the truth (<see cref="ParameterEstimate.Contains"/>: the
/// pieces when the profile set is disjoint, else [lo, hi]).</param>
/// <param name="HullCovered">Mocks whose [lo, hi] (the hull, when disjoint) contains the truth.</param>
/// <param name="HessianCovered">Mocks whose plain Hessian interval (θ̂ ± σ of the multi-start fit, before any refinement)
/// contains the truth, for comparison.</param>
/// <param name="Mocks">Mocks fitted.</param>
/// <param name="ByMethod">How many mocks reported each <c>interval_method</c>.</param>
public sealed record CoverageCount(string Name, double Truth, int Covered, int HullCovered, int HessianCovered, int Mocks, IReadOnlyDictionary<string, int> ByMethod)
{
    /// <summary>Covered / Mocks.</summary>
    public double Coverage => Mocks > 0 ? Covered / (double)Mocks : double.NaN;
    /// <summary>HullCovered / Mocks.</summary>
    public double HullCoverage => Mocks > 0 ? HullCovered / (double)Mocks : double.NaN;
    /// <summary>HessianCovered / Mocks.</summary>
    public double HessianCoverage => Mocks > 0 ? HessianCovered / (double)Mocks : double.NaN;
}

/// <summary>The outcome of an interval-coverage study.</summary>
/// <param name="Mocks">Mocks fitted.</param>
/// <param name="Multimodal">Mocks whose fit reported more than one mode.</param>
/// <param name="Parameters">Coverage per free parameter with a known truth.</param>
public sealed record IntervalCoverageResult(int Mocks, int Multimodal, IReadOnlyList<CoverageCount> Parameters)
{
    /// <summary>Per mock (in index order): the reported estimates, the plain Hessian estimates, and whether the fit was multimodal.</summary>
    public IReadOnlyList<(ParameterEstimate[] Reported, ParameterEstimate[] Hessian, bool Multimodal)> PerMock { get; init; } = [];
}

/// <summary>
/// Injection–recovery check of the reported intervals: draws seeded mocks of a design under a known truth, fits one
/// hypothesis to each exactly as a study does (multi-start fit, <see cref="ModelFitRefinement"/>), and counts how often
/// each reported 68% interval contains the truth (nominal 68.3%; binomial s.d. √(0.683·0.317/K)).
/// </summary>
public static class IntervalCoverageStudy
{
    /// <summary>Runs the study over mocks <paramref name="first"/> … first + mocks − 1. Mock k has seed <see cref="SimulationRandom.DeriveSeed"/>(<paramref name="seed"/>, k) and optimiser seed k + 1;
    /// mocks run in parallel into fixed slots, so the result does not depend on the thread count.</summary>
    public static IntervalCoverageResult Run(MockSurveySpec template, Hypothesis hypothesis, IReadOnlyDictionary<string, double> truth,
        int mocks, long seed, int first = 0, int? maxThreads = null, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(template);
        ArgumentNullException.ThrowIfNull(hypothesis);
        ArgumentNullException.ThrowIfNull(truth);
        if (mocks < 1) throw new ArgumentOutOfRangeException(nameof(mocks), "a coverage study needs at least one mock");
        var names = hypothesis.FreeParameters.Select(p => p.Name).Where(truth.ContainsKey).ToArray();
        var reported = new ParameterEstimate[mocks][];
        var hessian = new ParameterEstimate[mocks][];
        var multimodal = new bool[mocks];
        var options = new ParallelOptions { CancellationToken = cancel, MaxDegreeOfParallelism = maxThreads ?? Environment.ProcessorCount };
        Parallel.For(0, mocks, options, k =>
        {
            var spec = template with { Seed = unchecked((long)SimulationRandom.DeriveSeed(seed, first + k)) };
            var obs = MockSurveyGenerator.Generate(spec, parallel: false).ToObservables();
            var lik = hypothesis.Bind(obs);
            var fit = MaximumLikelihood.Fit(lik, new OptimizerSettings(Seed: first + k + 1));
            hessian[k] = FitSummaries.From(lik, fit).Parameters.ToArray();
            var refined = ModelFitRefinement.Run(lik, obs, fit, cancel: cancel);
            reported[k] = refined.Summary.Parameters.ToArray();
            multimodal[k] = refined.Summary.Modes.Count > 1;
        });
        static bool Covers(ParameterEstimate e, double t) => e.Lo <= t && t <= e.Hi;
        var counts = names.Select(n =>
        {
            double t = truth[n];
            var rep = reported.Select(r => r.First(p => p.Name == n)).ToArray();
            var hes = hessian.Select(r => r.First(p => p.Name == n)).ToArray();
            var byMethod = rep.GroupBy(e => e.IntervalMethod).OrderBy(g => g.Key, StringComparer.Ordinal).ToDictionary(g => g.Key, g => g.Count());
            return new CoverageCount(n, t, rep.Count(e => e.Contains(t)), rep.Count(e => Covers(e, t)), hes.Count(e => Covers(e, t)), mocks, byMethod);
        }).ToArray();
        return new IntervalCoverageResult(mocks, multimodal.Count(b => b), counts)
        {
            PerMock = Enumerable.Range(0, mocks).Select(k => (reported[k], hessian[k], multimodal[k])).ToArray(),
        };
    }
}
