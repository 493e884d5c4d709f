using MathNet.Numerics.Distributions;

namespace SizeTest.Inference.Sampling;

/// <summary>
/// Rank-normalised split-R̂ and bulk/tail effective sample sizes of Vehtari, Gelman, Simpson,
/// Carpenter &amp; Bürkner (2021, Bayesian Analysis 16, 667): each chain is split in two halves,
/// all draws are replaced by their normal scores z = Φ⁻¹((r − 3/8)/(S + 1/4)) (r = average rank
/// among all S draws), and the classic potential-scale-reduction and effective-sample-size
/// estimators are applied to the result. R̂ is the larger of the bulk value and the value for
/// the folded draws |θ − median θ| (which detects differing scales); the tail ESS is the smaller
/// of the ESS of the indicators I(θ ≤ q₀.₀₅) and I(θ ≤ q₀.₉₅). The ESS uses Geyer's initial
/// monotone sequence on the multi-chain autocorrelation (Vehtari et al. 2021 §3.2).
/// For an ensemble sampler each walker is treated as one chain.
/// </summary>
public static class RankNormalizedDiagnostics
{
    /// <summary>Rank-normalised split-R̂ (max of bulk and folded). NaN when the draws are constant or chains have fewer than 4 draws.</summary>
    /// <param name="chains">One array per chain, all of the same length.</param>
    public static double SplitRhat(IReadOnlyList<double[]> chains)
    {
        var split = Split(chains);
        if (split is null) return double.NaN;
        double bulk = ClassicRhat(RankNormalize(split));
        double median = Median(split);
        var folded = split.Select(c => c.Select(x => Math.Abs(x - median)).ToArray()).ToArray();
        double tail = ClassicRhat(RankNormalize(folded));
        return double.IsNaN(bulk) || double.IsNaN(tail) ? double.NaN : Math.Max(bulk, tail);
    }

    /// <summary>Bulk effective sample size: ESS of the rank-normalised split chains.</summary>
    /// <param name="chains">One array per chain, all of the same length.</param>
    public static double BulkEss(IReadOnlyList<double[]> chains)
    {
        var split = Split(chains);
        return split is null ? double.NaN : Ess(RankNormalize(split));
    }

    /// <summary>Tail effective sample size: min over the 5% and 95% quantile indicators of the split-chain ESS.</summary>
    /// <param name="chains">One array per chain, all of the same length.</param>
    public static double TailEss(IReadOnlyList<double[]> chains)
    {
        var split = Split(chains);
        if (split is null) return double.NaN;
        var all = split.SelectMany(c => c).ToArray();
        Array.Sort(all);
        double q05 = Quantile(all, 0.05), q95 = Quantile(all, 0.95);
        var lo = split.Select(c => c.Select(x => x <= q05 ? 1.0 : 0.0).ToArray()).ToArray();
        var hi = split.Select(c => c.Select(x => x <= q95 ? 1.0 : 0.0).ToArray()).ToArray();
        return Math.Min(Ess(lo), Ess(hi));
    }

    /// <summary>
    /// Classic (not rank-normalised) potential scale reduction of the given chains, without
    /// splitting: R̂ = √(var⁺/W), var⁺ = (N−1)/N · W + B/N (Gelman &amp; Rubin 1992; Vehtari et al. 2021 eq. 3–4).
    /// </summary>
    /// <param name="chains">At least two chains of equal length ≥ 2.</param>
    public static double ClassicRhat(IReadOnlyList<double[]> chains)
    {
        int m = chains.Count;
        if (m < 2) return double.NaN;
        int n = chains[0].Length;
        if (n < 2) return double.NaN;
        double grand = 0, w = 0;
        var means = new double[m];
        for (int c = 0; c < m; c++)
        {
            if (chains[c].Length != n) throw new ArgumentException("All chains must have the same length.", nameof(chains));
            means[c] = chains[c].Average();
            grand += means[c];
        }
        grand /= m;
        double b = 0;
        for (int c = 0; c < m; c++)
        {
            b += (means[c] - grand) * (means[c] - grand);
            double s2 = 0;
            foreach (var x in chains[c]) s2 += (x - means[c]) * (x - means[c]);
            w += s2 / (n - 1);
        }
        b *= (double)n / (m - 1);
        w /= m;
        if (!(w > 0)) return double.NaN;
        double varPlus = (n - 1.0) / n * w + b / n;
        return Math.Sqrt(varPlus / w);
    }

    /// <summary>
    /// Effective sample size of the given chains (no splitting, no rank normalisation), by the
    /// multi-chain autocorrelation ρ̂_t = 1 − (W − mean_m γ_m(t))/var⁺ summed with Geyer's
    /// initial monotone sequence (Vehtari et al. 2021 §3.2; Geyer 1992, Stat. Sci. 7, 473).
    /// NaN for chains shorter than 4 or zero variance.
    /// </summary>
    /// <param name="chains">Chains of equal length.</param>
    public static double Ess(IReadOnlyList<double[]> chains)
    {
        int m = chains.Count;
        if (m == 0) return double.NaN;
        int n = chains[0].Length;
        if (n < 4) return double.NaN;
        var acovMean = new double[n];
        var chainMeans = new double[m];
        double meanVar = 0;
        var ax = new double[n];
        var ay = new double[n];
        for (int c = 0; c < m; c++)
            if (chains[c].Length != n) throw new ArgumentException("All chains must have the same length.", nameof(chains));
        for (int c = 0; c < m; c += 2)
        {
            bool pair = c + 1 < m;
            Fft.AutocovariancePair(chains[c], pair ? chains[c + 1] : [], ax, pair ? ay : []);
            for (int t = 0; t < n; t++) acovMean[t] += ax[t] / m;
            chainMeans[c] = chains[c].Average();
            meanVar += ax[0] * n / (n - 1.0) / m;
            if (pair)
            {
                for (int t = 0; t < n; t++) acovMean[t] += ay[t] / m;
                chainMeans[c + 1] = chains[c + 1].Average();
                meanVar += ay[0] * n / (n - 1.0) / m;
            }
        }
        double varPlus = meanVar * (n - 1.0) / n;
        if (m > 1)
        {
            double gm = chainMeans.Average(), v = 0;
            foreach (var x in chainMeans) v += (x - gm) * (x - gm);
            varPlus += v / (m - 1);
        }
        if (!(varPlus > 0)) return double.NaN;

        var rho = new double[n];
        rho[0] = 1.0;
        double even = 1.0;
        double odd = 1.0 - (meanVar - acovMean[1]) / varPlus;
        rho[1] = odd;
        int s = 1;
        while (s < n - 5 && even + odd > 0)
        {
            even = 1.0 - (meanVar - acovMean[s + 1]) / varPlus;
            odd = 1.0 - (meanVar - acovMean[s + 2]) / varPlus;
            if (even + odd >= 0)
            {
                rho[s + 1] = even;
                rho[s + 2] = odd;
            }
            s += 2;
        }
        int maxS = s;
        if (even > 0) rho[maxS + 1] = even;
        // Initial monotone sequence: pair sums may not increase.
        for (int t = 1; t <= maxS - 3; t += 2)
        {
            if (rho[t + 1] + rho[t + 2] > rho[t - 1] + rho[t])
            {
                rho[t + 1] = (rho[t - 1] + rho[t]) / 2.0;
                rho[t + 2] = rho[t + 1];
            }
        }
        double sum = 0;
        for (int t = 0; t < maxS; t++) sum += rho[t];
        double tau = -1.0 + 2.0 * sum + rho[maxS + 1];
        double total = (double)m * n;
        tau = Math.Max(tau, 1.0 / Math.Log10(total));
        return total / tau;
    }

    /// <summary>Splits every chain into its first and second half (the middle draw of an odd-length chain is dropped); null when the halves would be shorter than 2.</summary>
    internal static double[][]? Split(IReadOnlyList<double[]> chains)
    {
        if (chains.Count == 0) throw new ArgumentException("At least one chain is needed.", nameof(chains));
        int n = chains[0].Length;
        int half = n / 2;
        if (half < 2) return null;
        var result = new double[2 * chains.Count][];
        for (int c = 0; c < chains.Count; c++)
        {
            if (chains[c].Length != n) throw new ArgumentException("All chains must have the same length.", nameof(chains));
            result[2 * c] = chains[c].AsSpan(0, half).ToArray();
            result[2 * c + 1] = chains[c].AsSpan(n - half, half).ToArray();
        }
        return result;
    }

    /// <summary>Normal scores of the pooled ranks (ties get their average rank), same shape as the input.</summary>
    internal static double[][] RankNormalize(IReadOnlyList<double[]> chains)
    {
        int m = chains.Count, n = chains[0].Length, total = m * n;
        var values = new double[total];
        var index = new int[total];
        for (int c = 0; c < m; c++)
            for (int i = 0; i < n; i++)
            {
                values[c * n + i] = chains[c][i];
                index[c * n + i] = c * n + i;
            }
        Array.Sort(values, index);
        var z = new double[total];
        var table = ScoreTable(total);
        int start = 0;
        while (start < total)
        {
            int end = start;
            while (end + 1 < total && values[end + 1] == values[start]) end++;
            double rank = (start + end) / 2.0 + 1.0;          // average 1-based rank of the tie group
            double score = start == end ? table[start] : Normal.InvCDF(0.0, 1.0, (rank - 0.375) / (total + 0.25));
            for (int k = start; k <= end; k++) z[index[k]] = score;
            start = end + 1;
        }
        var result = new double[m][];
        for (int c = 0; c < m; c++) result[c] = z.AsSpan(c * n, n).ToArray();
        return result;
    }

    private static Tuple<int, double[]>? _lastScores;

    /// <summary>
    /// Normal scores Φ⁻¹((r − 3/8)/(S + 1/4)) for the integer ranks r = 1 … S. The inverse normal CDF
    /// dominates the cost of rank normalisation, and every parameter of a run has the same S, so the
    /// most recent table is kept (swapped atomically; safe for concurrent callers).
    /// </summary>
    private static double[] ScoreTable(int total)
    {
        var cached = Volatile.Read(ref _lastScores);
        if (cached is not null && cached.Item1 == total) return cached.Item2;
        var table = new double[total];
        for (int r = 1; r <= total; r++) table[r - 1] = Normal.InvCDF(0.0, 1.0, (r - 0.375) / (total + 0.25));
        Volatile.Write(ref _lastScores, Tuple.Create(total, table));
        return table;
    }

    private static double Median(IReadOnlyList<double[]> chains)
    {
        var all = chains.SelectMany(c => c).ToArray();
        Array.Sort(all);
        return Quantile(all, 0.5);
    }

    /// <summary>Quantile of sorted data by linear interpolation between order statistics (type 7).</summary>
    internal static double Quantile(double[] sorted, double p)
    {
        double h = (sorted.Length - 1) * p;
        int lo = (int)Math.Floor(h);
        int hi = Math.Min(lo + 1, sorted.Length - 1);
        return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
    }
}
