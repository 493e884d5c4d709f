using SizeTest.Foundation.Randomness;
namespace SizeTest.Reporting.Data;

/// <summary>
/// Descriptive statistics for the figures: per redshift bin the median (or mean) of a quantity
/// with a bootstrap 68% interval (16th–84th percentiles of the statistic over resamples of the
/// bin's objects; Efron 1979). This summarises data; it fits nothing.
/// </summary>
public static class BinnedStatistics
{
    /// <summary>Which statistic to take in each bin.</summary>
    public enum Statistic
    {
        /// <summary>Median (robust; used for angular sizes).</summary>
        Median,
        /// <summary>Arithmetic mean (used for surface brightness in magnitudes).</summary>
        Mean,
    }

    /// <summary>
    /// Bin edges holding about equal numbers of objects: <paramref name="bins"/> bins between the
    /// smallest and largest of <paramref name="z"/> (fewer when there are too few objects, at
    /// least <paramref name="minPerBin"/> per bin).
    /// </summary>
    public static double[] EqualCountEdges(IReadOnlyList<double> z, int bins, int minPerBin = 5)
    {
        var sorted = z.Where(double.IsFinite).OrderBy(v => v).ToArray();
        if (sorted.Length == 0) return [];
        int n = Math.Max(1, Math.Min(bins, sorted.Length / Math.Max(1, minPerBin)));
        var edges = new double[n + 1];
        edges[0] = sorted[0];
        edges[n] = sorted[^1];
        for (int k = 1; k < n; k++)
        {
            double pos = (double)k * sorted.Length / n;
            int i = Math.Clamp((int)pos, 1, sorted.Length - 1);
            edges[k] = 0.5 * (sorted[i - 1] + sorted[i]);
        }
        return edges;
    }

    /// <summary>
    /// Computes the statistic of <paramref name="values"/> in each bin of <paramref name="z"/>
    /// (bins are [lo, hi), the last one closed) with <paramref name="resamples"/> bootstrap
    /// resamples drawn from <c>SeededRandom.Create(seed)</c>. Bins with no finite value are left out.
    /// </summary>
    public static IReadOnlyList<BinnedValue> Compute(IReadOnlyList<double> z, IReadOnlyList<double> values,
        IReadOnlyList<double> edges, Statistic statistic, int resamples, int seed)
    {
        if (z.Count != values.Count) throw new ArgumentException("z and values differ in length");
        if (resamples < 1) throw new ArgumentOutOfRangeException(nameof(resamples), "need at least one bootstrap resample");
        var rng = SeededRandom.Create(seed);
        var result = new List<BinnedValue>();
        int nb = edges.Count - 1;
        for (int b = 0; b < nb; b++)
        {
            double lo = edges[b], hi = edges[b + 1];
            var inBin = new List<double>();
            var zIn = new List<double>();
            for (int i = 0; i < z.Count; i++)
                if (z[i] >= lo && (z[i] < hi || (b == nb - 1 && z[i] <= hi)) && double.IsFinite(values[i]))
                {
                    inBin.Add(values[i]);
                    zIn.Add(z[i]);
                }
            if (inBin.Count == 0) continue;
            var arr = inBin.ToArray();
            double value = Apply(arr, statistic);
            var boot = new double[resamples];
            var tmp = new double[arr.Length];
            for (int r = 0; r < resamples; r++)
            {
                for (int i = 0; i < arr.Length; i++) tmp[i] = arr[rng.Next(arr.Length)];
                boot[r] = Apply(tmp, statistic);
            }
            Array.Sort(boot);
            var zs = zIn.ToArray();
            Array.Sort(zs);
            result.Add(new BinnedValue(lo, hi, value, Percentile(boot, 0.16), Percentile(boot, 0.84), arr.Length) { ZMedian = Percentile(zs, 0.5) });
        }
        return result;
    }

    private static double Apply(double[] v, Statistic s)
    {
        if (s == Statistic.Mean) return v.Average();
        var c = (double[])v.Clone();
        Array.Sort(c);
        return Percentile(c, 0.5);
    }

    /// <summary>Percentile of sorted data by linear interpolation between order statistics (type 7 of Hyndman &amp; Fan 1996).</summary>
    public static double Percentile(double[] sorted, double p)
    {
        if (sorted.Length == 1) return sorted[0];
        double h = (sorted.Length - 1) * p;
        int i = (int)Math.Floor(h);
        if (i >= sorted.Length - 1) return sorted[^1];
        return sorted[i] + (h - i) * (sorted[i + 1] - sorted[i]);
    }
}
