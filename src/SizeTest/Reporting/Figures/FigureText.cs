using SizeTest.Reporting.Data;

namespace SizeTest.Reporting.Figures;

/// <summary>Small helpers shared by the figure builders.</summary>
internal static class FigureText
{
    /// <summary>The model with the smallest BIC among those matching <paramref name="filter"/>, or null.</summary>
    public static ModelReport? BestByBic(IReadOnlyList<ModelReport> models, Func<ModelReport, bool> filter) =>
        models.Where(filter).OrderBy(m => m.Fit.Bic).ThenBy(m => m.Fit.Name, StringComparer.Ordinal).FirstOrDefault();

    /// <summary>Smallest and largest positive finite value (1, 10 if none).</summary>
    public static (double Min, double Max) PositiveRange(IEnumerable<double> values)
    {
        double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
        foreach (var v in values)
            if (v > 0 && double.IsFinite(v)) { lo = Math.Min(lo, v); hi = Math.Max(hi, v); }
        if (lo > hi) return (1, 10);
        if (hi <= lo) { lo /= 1.5; hi *= 1.5; }
        return (lo, hi);
    }

    /// <summary>A 2-D histogram of (x, y) on log10-uniform cells (both axes logarithmic unless <paramref name="yLinear"/>).</summary>
    public static DensitySeries Density(string label, IReadOnlyList<double> x, IReadOnlyList<double> y, int nx, int ny, bool xLinear = false, bool yLinear = false)
    {
        var (xe, xi) = Edges(x, nx, !xLinear);
        var (ye, yi) = Edges(y, ny, !yLinear);
        var counts = new double[nx, ny];
        for (int i = 0; i < x.Count; i++)
        {
            int a = xi(x[i]), b = yi(y[i]);
            if (a >= 0 && b >= 0) counts[a, b]++;
        }
        return new DensitySeries(label, xe, ye, counts);
    }

    private static (double[] Edges, Func<double, int> Index) Edges(IReadOnlyList<double> v, int n, bool log)
    {
        var vals = v.Where(t => double.IsFinite(t) && (!log || t > 0)).Select(t => log ? Math.Log10(t) : t).ToArray();
        double lo = vals.Length > 0 ? vals.Min() : 0, hi = vals.Length > 0 ? vals.Max() : 1;
        if (hi <= lo) { lo -= 0.5; hi += 0.5; }
        var edges = new double[n + 1];
        for (int i = 0; i <= n; i++) { double t = lo + (hi - lo) * i / n; edges[i] = log ? Math.Pow(10, t) : t; }
        int Index(double t)
        {
            if (!double.IsFinite(t) || (log && t <= 0)) return -1;
            double u = log ? Math.Log10(t) : t;
            int k = (int)Math.Floor((u - lo) / (hi - lo) * n);
            return k < 0 ? -1 : Math.Min(k, n - 1);
        }
        return (edges, Index);
    }
}
