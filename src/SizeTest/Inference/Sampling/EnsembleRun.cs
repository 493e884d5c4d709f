namespace SizeTest.Inference.Sampling;

/// <summary>The outcome of one ensemble-sampler run.</summary>
public sealed record EnsembleRun
{
    /// <summary>The full chain, every step including burn-in.</summary>
    public required MemoryChainStore Chain { get; init; }

    /// <summary>Steps discarded as burn-in for <see cref="Samples"/> and <see cref="Diagnostics"/>.</summary>
    public required int BurnIn { get; init; }

    /// <summary>Thinning applied to <see cref="Samples"/>.</summary>
    public required int Thin { get; init; }

    /// <summary>Mean acceptance fraction over walkers and all steps.</summary>
    public required double AcceptanceFraction { get; init; }

    /// <summary>Acceptance fraction of each walker.</summary>
    public required IReadOnlyList<double> WalkerAcceptanceFractions { get; init; }

    /// <summary>τ, R̂, ESS per parameter and the convergence verdict (after burn-in).</summary>
    public required ChainDiagnostics Diagnostics { get; init; }

    /// <summary>Final walker positions [walker][parameter] (to continue a run).</summary>
    public required double[][] FinalPositions { get; init; }

    /// <summary>Final log densities per walker.</summary>
    public required double[] FinalLogProbabilities { get; init; }

    /// <summary>Seed the run used.</summary>
    public required int Seed { get; init; }

    /// <summary>Name of the proposal move.</summary>
    public required string MoveName { get; init; }

    /// <summary>Number of log-density evaluations (including the starting ensemble).</summary>
    public required long Evaluations { get; init; }

    /// <summary>Wall time of the run.</summary>
    public required TimeSpan Elapsed { get; init; }

    /// <summary>Whether the verdict says converged.</summary>
    public bool Converged => Diagnostics.Verdict.Converged;

    /// <summary>Kept samples [sample][parameter]: burn-in discarded, thinned, all walkers (a new array on each access).</summary>
    public double[][] Samples => Chain.GetFlatChain(BurnIn, Thin);

    /// <summary>
    /// Percentile (0–100) of parameter <paramref name="parameter"/> over <see cref="Samples"/>,
    /// linear interpolation between order statistics; e.g. 16, 50, 84 for the median and 68% interval.
    /// </summary>
    public double Percentile(int parameter, double percent)
    {
        if (!(percent >= 0 && percent <= 100)) throw new ArgumentOutOfRangeException(nameof(percent));
        var series = Chain.GetWalkerSeries(parameter, BurnIn, Thin);
        var all = series.SelectMany(s => s).ToArray();
        if (all.Length == 0) return double.NaN;
        Array.Sort(all);
        return RankNormalizedDiagnostics.Quantile(all, percent / 100.0);
    }
}
