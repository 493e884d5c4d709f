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

    /// <summary>
    /// For each curve, the labels of earlier curves it coincides with: equal within <paramref name="tolerance"/> (in y
    /// units, or in dex when <paramref name="logY"/>) at every shared x. Such curves hide each other, so their legend
    /// entries say "(coincides with …)".
    /// </summary>
    public static IReadOnlyList<string> CoincidesWith(IReadOnlyList<(string Label, Curve? Curve)> curves, double tolerance, bool logY)
    {
        var result = new string[curves.Count];
        for (int i = 0; i < curves.Count; i++)
        {
            result[i] = "";
            if (curves[i].Curve is not { } ci) continue;
            var same = new List<string>();
            for (int j = 0; j < i; j++)
            {
                if (curves[j].Curve is not { } cj) continue;
                bool all = true; int shared = 0;
                for (int k = 0; k < ci.X.Count && all; k++)
                {
                    double other = cj.At(ci.X[k], logY);
                    if (!double.IsFinite(other)) continue;
                    shared++;
                    double d = logY ? Math.Abs(Math.Log10(ci.Y[k] / other)) : Math.Abs(ci.Y[k] - other);
                    if (!(d <= tolerance)) all = false;
                }
                if (all && shared > 1) same.Add(curves[j].Label);
            }
            if (same.Count > 0) result[i] = $" (coincides with {string.Join(", ", same)})";
        }
        return result;
    }
}
