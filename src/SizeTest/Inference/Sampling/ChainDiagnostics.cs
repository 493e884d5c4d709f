using System.Globalization;

namespace SizeTest.Inference.Sampling;

/// <summary>Diagnostics of one parameter's chain.</summary>
/// <param name="Name">Parameter name.</param>
/// <param name="Mean">Posterior mean of the kept samples.</param>
/// <param name="StandardDeviation">Posterior standard deviation of the kept samples.</param>
/// <param name="Tau">Walker-averaged integrated autocorrelation time (steps).</param>
/// <param name="TauWindowReached">Whether Sokal's window condition was met.</param>
/// <param name="EssFromTau">walkers × steps / τ.</param>
/// <param name="SplitRhat">Rank-normalised split-R̂ (Vehtari et al. 2021) over groups of walkers (<see cref="ConvergenceCriteria.RhatGroups"/>).</param>
/// <param name="BulkEss">Bulk ESS (Vehtari et al. 2021).</param>
/// <param name="TailEss">Tail ESS (Vehtari et al. 2021).</param>
public sealed record ParameterDiagnostics(string Name, double Mean, double StandardDeviation, double Tau, bool TauWindowReached,
                                          double EssFromTau, double SplitRhat, double BulkEss, double TailEss)
{
    /// <summary>The smallest of the three ESS figures (NaN if any is NaN).</summary>
    public double MinEss => double.IsNaN(EssFromTau) || double.IsNaN(BulkEss) || double.IsNaN(TailEss)
        ? double.NaN : Math.Min(EssFromTau, Math.Min(BulkEss, TailEss));
}

/// <summary>Diagnostics of a whole ensemble run (after burn-in) and its convergence verdict.</summary>
/// <param name="Parameters">Per-parameter diagnostics.</param>
/// <param name="Steps">Steps used (after burn-in, unthinned).</param>
/// <param name="Walkers">Number of walkers.</param>
/// <param name="AcceptanceFraction">Mean acceptance fraction (NaN when unknown).</param>
/// <param name="Verdict">The convergence verdict.</param>
public sealed record ChainDiagnostics(IReadOnlyList<ParameterDiagnostics> Parameters, int Steps, int Walkers,
                                      double AcceptanceFraction, ConvergenceVerdict Verdict)
{
    /// <summary>Largest τ over parameters.</summary>
    public double MaxTau => Parameters.Count == 0 ? double.NaN : Parameters.Max(p => p.Tau);

    /// <summary>
    /// Computes the diagnostics of the chain in <paramref name="store"/> after discarding
    /// <paramref name="burnIn"/> steps.
    /// </summary>
    public static ChainDiagnostics Compute(MemoryChainStore store, int burnIn, ConvergenceCriteria? criteria = null, double acceptanceFraction = double.NaN)
    {
        ArgumentNullException.ThrowIfNull(store);
        var series = new double[store.Dimension][][];
        for (int p = 0; p < store.Dimension; p++) series[p] = store.GetWalkerSeries(p, burnIn);
        return Compute(series, store.ParameterNames, criteria, acceptanceFraction);
    }

    /// <summary>
    /// Computes diagnostics from per-parameter walker traces.
    /// </summary>
    /// <param name="series">series[p][w][s]: parameter p, walker (chain) w, step s; equal lengths.</param>
    /// <param name="names">Parameter names.</param>
    /// <param name="criteria">Thresholds (defaults when null).</param>
    /// <param name="acceptanceFraction">Mean acceptance fraction, or NaN to skip that check.</param>
    public static ChainDiagnostics Compute(IReadOnlyList<double[][]> series, IReadOnlyList<string> names,
                                           ConvergenceCriteria? criteria = null, double acceptanceFraction = double.NaN)
    {
        ArgumentNullException.ThrowIfNull(series);
        if (names.Count != series.Count) throw new ArgumentException("One name per parameter is needed.", nameof(names));
        criteria ??= new ConvergenceCriteria();
        var inv = CultureInfo.InvariantCulture;
        var checks = new List<ConvergenceCheck>();
        var parameters = new List<ParameterDiagnostics>();
        int walkers = series.Count > 0 ? series[0].Length : 0;
        int steps = walkers > 0 ? series[0][0].Length : 0;

        if (steps < 8)
        {
            checks.Add(new ConvergenceCheck("length", "", steps, 8, false,
                string.Create(inv, $"only {steps} steps after burn-in; at least 8 are needed before any diagnostic can be computed (and far more for convergence)")));
        }

        // The per-parameter work (FFTs, ranks) is independent: compute it in parallel, then build checks in order.
        var computed = new (IntegratedTimeEstimate Tau, double Rhat, double Bulk, double Tail)[series.Count];
        if (steps >= 8)
            Parallel.For(0, series.Count, p =>
            {
                var c = series[p];
                computed[p] = (Autocorrelation.IntegratedTime(c, criteria.WindowConstant),
                               RankNormalizedDiagnostics.SplitRhat(GroupWalkers(c, criteria.RhatGroups)),
                               RankNormalizedDiagnostics.BulkEss(c),
                               RankNormalizedDiagnostics.TailEss(c));
            });

        for (int p = 0; p < series.Count; p++)
        {
            var chains = series[p];
            string name = names[p];
            double mean = 0, m2 = 0;
            long count = 0;
            foreach (var c in chains)
                foreach (var x in c)
                {
                    count++;
                    double delta = x - mean;
                    mean += delta / count;
                    m2 += delta * (x - mean);
                }
            double sd = count > 1 ? Math.Sqrt(m2 / (count - 1)) : double.NaN;
            if (steps < 8)
            {
                parameters.Add(new ParameterDiagnostics(name, count > 0 ? mean : double.NaN, sd, double.NaN, false, double.NaN, double.NaN, double.NaN, double.NaN));
                continue;
            }
            var (tau, rhat, bulk, tail) = computed[p];
            double essTau = (double)walkers * steps / tau.Tau;
            var d = new ParameterDiagnostics(name, mean, sd, tau.Tau, tau.WindowReached, essTau, rhat, bulk, tail);
            parameters.Add(d);

            if (!tau.WindowReached)
                checks.Add(new ConvergenceCheck("tau_window", name, tau.Tau, criteria.WindowConstant, false,
                    string.Create(inv, $"{name}: the autocorrelation time could not be estimated (no window M with M ≥ {criteria.WindowConstant:G3}·τ within {steps} steps); run longer")));
            double lengthInTau = steps / tau.Tau;
            bool lenOk = lengthInTau >= criteria.MinLengthInTau;
            checks.Add(new ConvergenceCheck("length_in_tau", name, lengthInTau, criteria.MinLengthInTau, lenOk,
                string.Create(inv, $"{name}: chain length {steps} steps is {lengthInTau:G3} τ (τ = {tau.Tau:G4} steps); at least {criteria.MinLengthInTau:G3} τ is required")));
            bool rhatOk = rhat <= criteria.MaxRhat;
            checks.Add(new ConvergenceCheck("rhat", name, rhat, criteria.MaxRhat, rhatOk,
                double.IsNaN(rhat)
                    ? $"{name}: split-R̂ could not be computed (constant chains)"
                    : string.Create(inv, $"{name}: rank-normalised split-R̂ = {rhat:F4}; at most {criteria.MaxRhat:G4} is required")));
            double minEss = d.MinEss;
            bool essOk = minEss >= criteria.MinEss;
            checks.Add(new ConvergenceCheck("ess", name, minEss, criteria.MinEss, essOk,
                string.Create(inv, $"{name}: effective sample size {minEss:F0} (bulk {bulk:F0}, tail {tail:F0}, N/τ {essTau:F0}); at least {criteria.MinEss:G4} is required")));
        }

        if (!double.IsNaN(acceptanceFraction))
        {
            bool low = acceptanceFraction < criteria.MinAcceptance, high = acceptanceFraction > criteria.MaxAcceptance;
            checks.Add(new ConvergenceCheck("acceptance", "", acceptanceFraction, high ? criteria.MaxAcceptance : criteria.MinAcceptance, !low && !high,
                string.Create(inv, $"mean acceptance fraction {acceptanceFraction:F3}; between {criteria.MinAcceptance:G3} and {criteria.MaxAcceptance:G3} is required")));
        }
        return new ChainDiagnostics(parameters, steps, walkers, acceptanceFraction, new ConvergenceVerdict(checks));
    }

    /// <summary>
    /// Pools walkers into <paramref name="groups"/> contiguous blocks; each block becomes one
    /// chain whose draws are the block's walkers interleaved step by step (so the first half of
    /// the pooled chain is the first half of the run).
    /// </summary>
    internal static double[][] GroupWalkers(double[][] walkers, int groups)
    {
        if (groups < 1) throw new ArgumentOutOfRangeException(nameof(groups), groups, "At least one group is needed.");
        int nw = walkers.Length, steps = walkers[0].Length;
        int g = Math.Min(groups, nw);
        int perGroup = nw / g;                 // leftover walkers (nw mod g) are not used for R̂
        var result = new double[g][];
        for (int k = 0; k < g; k++)
        {
            var chain = new double[steps * perGroup];
            for (int s = 0; s < steps; s++)
                for (int j = 0; j < perGroup; j++)
                    chain[s * perGroup + j] = walkers[k * perGroup + j][s];
            result[k] = chain;
        }
        return result;
    }
}
