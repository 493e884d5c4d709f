using System.Diagnostics;
using SizeTest.Inference;
using SizeTest.Inference.Sampling;
using SizeTest.Simulation;

namespace SizeTest.Benchmarks;

/// <summary>
/// Issue 11 target: <c>--sampler mcmc --steps auto</c> to convergence on 2000 galaxies with Ωm free in ≤ 10 s.
/// <c>dotnet run -c Release --project tests/SizeTest.Benchmarks -- --mcmc-timing [MOCK] [stretch|mixture|mix:KDE,DE,STRETCH]</c>: draws mock
/// MOCK of the interval-coverage design (<see cref="IntervalCoverageHarness.Setup"/>), fits it, then times
/// <see cref="PosteriorSampling.Run(HypothesisLikelihood, MaximumLikelihoodResult, ModelFitSummary, FitRequest, int, IProgress{FitProgress}?, CancellationToken)"/>
/// with the given move (default: the default mixture) and prints steps, τ, R̂, ESS, the wall and CPU time of the
/// sampling alone and the process's peak working set.
/// </summary>
public static class McmcTiming
{
    // stretch | mixture (the default) | mix:KDE,DE,STRETCH (weights).
    private static IEnsembleMove? ParseMove(string move)
    {
        if (move == "stretch") return new StretchMove();
        if (!move.StartsWith("mix:", StringComparison.Ordinal)) return null;
        var w = move[4..].Split(',').Select(x => double.Parse(x, System.Globalization.CultureInfo.InvariantCulture)).ToArray();
        var parts = new List<(IEnsembleMove, double)>();
        if (w[0] > 0) parts.Add((new KernelDensityMove(), w[0]));
        if (w[1] > 0) parts.Add((new DifferentialEvolutionMove(), w[1]));
        if (w[2] > 0) parts.Add((new StretchMove(), w[2]));
        return new MixtureMove([.. parts]);
    }

    /// <summary>Runs it.</summary>
    public static void Run(string[] args, TextWriter o)
    {
        int mock = args.Length > 0 ? int.Parse(args[0], System.Globalization.CultureInfo.InvariantCulture) : 0;
        string move = args.Length > 1 ? args[1] : "mixture";
        var (template, h, _) = IntervalCoverageHarness.Setup();
        var spec = template with { Seed = unchecked((long)SimulationRandom.DeriveSeed(IntervalCoverageHarness.Seed, mock)) };
        var obs = MockSurveyGenerator.Generate(spec, parallel: false).ToObservables();
        var lik = h.Bind(obs);
        var fit = MaximumLikelihood.Fit(lik, new OptimizerSettings(Seed: mock + 1));
        var summary = FitSummaries.From(lik, fit);
        var request = new FitRequest
        {
            Hypotheses = [h], Observables = obs, Sampler = SamplerKind.Mcmc, Steps = 0,
            SamplerMove = ParseMove(move),
        };
        var cpu0 = Process.GetCurrentProcess().TotalProcessorTime;
        var sw = Stopwatch.StartNew();
        var (sampled, draws) = PosteriorSampling.Run(lik, fit, summary, request, 17, null, CancellationToken.None);
        sw.Stop();
        var cpu = Process.GetCurrentProcess().TotalProcessorTime - cpu0;
        var c = draws!.Chain!;
        o.WriteLine(FormattableString.Invariant(
            $"mock {mock}, move {move}: {c.Steps} steps x {c.Walkers} walkers, converged {c.Converged}, max tau {c.MaxTau:0.0}, {c.LengthInTau:0} tau, R-hat {c.MaxRhat:0.0000}, min ESS {c.MinEss:0}, acceptance {c.AcceptanceFraction:0.00}; sampling {sw.Elapsed.TotalSeconds:0.00} s wall, {cpu.TotalSeconds:0.00} s CPU; peak working set {Process.GetCurrentProcess().PeakWorkingSet64 / 1048576.0:0} MiB"));
        foreach (var p in sampled.Parameters.Where(p => !p.Fixed))
            o.WriteLine(FormattableString.Invariant($"  {p.Name,-15} {p.Value:G5} [{p.Lo:G5}, {p.Hi:G5}]   MLE {fit.Theta[h.FreeParameters.ToList().FindIndex(q => q.Name == p.Name)]:G5}"));
        o.WriteLine("  " + sampled.ExitReason);
    }
}
