using System.Globalization;

namespace SizeTest.Simulation;

/// <summary>
/// The redshift distribution N(z) of a survey design, sampled by inversion: uniform on
/// [zMin, zMax]; a smooth survey-like N(z) ∝ z² exp[−(z/z0)^1.5] with its peak at a chosen redshift;
/// or a user histogram (piecewise constant). Immutable and thread-safe.
/// </summary>
public sealed class RedshiftDistribution
{
    private const int TableNodes = 4097;
    private readonly double[]? _edges;      // histogram or tabulated CDF: bin edges
    private readonly double[]? _cdf;        // cumulative probability at each edge (0 … 1)
    private readonly bool _linearInBin;     // histogram: uniform within a bin; table: linear inverse CDF

    private RedshiftDistribution(string kind, string text, double zMin, double zMax, double[]? edges, double[]? cdf, bool linear)
    {
        Kind = kind;
        Text = text;
        ZMin = zMin;
        ZMax = zMax;
        _edges = edges;
        _cdf = cdf;
        _linearInBin = linear;
    }

    /// <summary><c>uniform</c>, <c>survey</c> or <c>hist</c>.</summary>
    public string Kind { get; }

    /// <summary>The distribution in the <c>--z-dist</c> text form (a histogram names its file only through the caller).</summary>
    public string Text { get; }

    /// <summary>Smallest redshift drawn.</summary>
    public double ZMin { get; }

    /// <summary>Largest redshift drawn.</summary>
    public double ZMax { get; }

    /// <summary>Uniform on [<paramref name="zMin"/>, <paramref name="zMax"/>], 0 &lt; zMin &lt; zMax.</summary>
    public static RedshiftDistribution Uniform(double zMin, double zMax)
    {
        if (!(zMin > 0) || !(zMax > zMin) || !double.IsFinite(zMax))
            throw new ArgumentException(FormattableString.Invariant($"a uniform redshift range needs 0 < zmin < zmax; got {zMin}:{zMax}"));
        return new RedshiftDistribution("uniform", FormattableString.Invariant($"uniform:{zMin:R}:{zMax:R}"), zMin, zMax, null, null, false);
    }

    /// <summary>
    /// The survey-like N(z) ∝ z² exp[−(z/z0)^1.5] (the shape of Baugh &amp; Efstathiou 1993-style fits to
    /// magnitude-limited surveys [from memory]), truncated to [<paramref name="zMin"/>, <paramref name="zMax"/>].
    /// Its peak, where d ln N/dz = 2/z − 1.5 z^0.5 / z0^1.5 = 0, is z_peak = (4/3)^(2/3) z0, so
    /// z0 = z_peak / (4/3)^(2/3). Defaults: zMin = 0.01, zMax = 4 z_peak (the tail beyond, where (z/z0)^1.5 &gt; 10, is negligible). Sampled by inverting a tabulated CDF (4096 trapezoid panels, uniform within a panel).
    /// </summary>
    public static RedshiftDistribution Survey(double zPeak, double? zMin = null, double? zMax = null)
    {
        if (!(zPeak > 0) || !double.IsFinite(zPeak)) throw new ArgumentException(FormattableString.Invariant($"the survey N(z) peak must be a positive redshift; got {zPeak}"));
        double lo = zMin ?? Math.Min(0.01, zPeak / 10), hi = zMax ?? 4 * zPeak;
        if (!(lo > 0) || !(hi > lo) || zPeak < lo || zPeak > hi) throw new ArgumentException(FormattableString.Invariant($"the survey N(z) range must satisfy 0 < zmin ≤ peak ≤ zmax; got {lo}, {zPeak}, {hi}"));
        double z0 = zPeak / Math.Pow(4.0 / 3.0, 2.0 / 3.0);
        var edges = new double[TableNodes];
        var density = new double[TableNodes];
        for (int k = 0; k < TableNodes; k++)
        {
            edges[k] = lo + (hi - lo) * k / (TableNodes - 1);
            density[k] = edges[k] * edges[k] * Math.Exp(-Math.Pow(edges[k] / z0, 1.5));
        }
        var cdf = new double[TableNodes];
        for (int k = 1; k < TableNodes; k++) cdf[k] = cdf[k - 1] + 0.5 * (density[k] + density[k - 1]) * (edges[k] - edges[k - 1]);
        Normalise(cdf);
        string text = zMin is null && zMax is null ? FormattableString.Invariant($"survey:{zPeak:R}") : FormattableString.Invariant($"survey:{zPeak:R}:{lo:R}:{hi:R}");
        return new RedshiftDistribution("survey", text, lo, hi, edges, cdf, true);
    }

    /// <summary>
    /// A histogram: bins [edges[k], edges[k+1]) with non-negative <paramref name="weights"/>[k] (relative numbers
    /// of objects, not densities); uniform within each bin. Edges strictly increasing, first edge &gt; 0.
    /// </summary>
    public static RedshiftDistribution Histogram(IReadOnlyList<double> edges, IReadOnlyList<double> weights, string? label = null)
    {
        ArgumentNullException.ThrowIfNull(edges);
        ArgumentNullException.ThrowIfNull(weights);
        if (edges.Count != weights.Count + 1 || weights.Count == 0) throw new ArgumentException("a redshift histogram needs n bins with n + 1 edges (at least one bin)");
        if (!(edges[0] > 0)) throw new ArgumentException(FormattableString.Invariant($"a redshift histogram must start above z = 0; its first edge is {edges[0]}"));
        for (int k = 1; k < edges.Count; k++)
            if (!(edges[k] > edges[k - 1]) || !double.IsFinite(edges[k])) throw new ArgumentException(FormattableString.Invariant($"redshift histogram edges must increase; edge {k + 1} ({edges[k]}) is not above edge {k} ({edges[k - 1]})"));
        var cdf = new double[edges.Count];
        for (int k = 0; k < weights.Count; k++)
        {
            if (!(weights[k] >= 0) || !double.IsFinite(weights[k])) throw new ArgumentException(FormattableString.Invariant($"redshift histogram bin {k + 1} has weight {weights[k]}; weights must be finite and ≥ 0"));
            cdf[k + 1] = cdf[k] + weights[k];
        }
        if (!(cdf[^1] > 0)) throw new ArgumentException("a redshift histogram needs at least one bin with positive weight");
        Normalise(cdf);
        return new RedshiftDistribution("hist", label ?? "hist", edges[0], edges[^1], edges.ToArray(), cdf, true);
    }

    /// <summary>
    /// Parses the <c>--z-dist</c> forms <c>uniform:ZMIN:ZMAX</c> and <c>survey:PEAK[:ZMIN:ZMAX]</c>
    /// (histograms are read from a file by the caller and built with <see cref="Histogram"/>). On failure
    /// <paramref name="error"/> is a <see cref="Foundation.Errors.SettingProblem"/> template naming the setting <c>{z_dist}</c>.
    /// </summary>
    public static bool TryParse(string text, out RedshiftDistribution? distribution, out string error)
    {
        distribution = null;
        error = "";
        var parts = (text ?? "").Split(':');
        var nums = new double[parts.Length - 1];
        for (int k = 1; k < parts.Length; k++)
            if (!double.TryParse(parts[k], NumberStyles.Float, CultureInfo.InvariantCulture, out nums[k - 1]))
            {
                error = $"{{z_dist}} '{text}': '{parts[k]}' is not a number";
                return false;
            }
        try
        {
            switch (parts[0])
            {
                case "uniform" when nums.Length == 2:
                    distribution = Uniform(nums[0], nums[1]);
                    return true;
                case "survey" when nums.Length == 1:
                    distribution = Survey(nums[0]);
                    return true;
                case "survey" when nums.Length == 3:
                    distribution = Survey(nums[0], nums[1], nums[2]);
                    return true;
                default:
                    error = $"{{z_dist}} '{text}' is not understood; use uniform:ZMIN:ZMAX, survey:PEAK[:ZMIN:ZMAX] or hist:FILE";
                    return false;
            }
        }
        catch (ArgumentException ex)
        {
            error = $"{{z_dist}} '{text}': {ex.Message}";
            return false;
        }
    }

    /// <summary>Draws one redshift (consumes one uniform deviate).</summary>
    public double Sample(ref SimulationRandom random)
    {
        double u = random.NextOpenDouble();
        if (_edges is null) return ZMin + (ZMax - ZMin) * u;
        var cdf = _cdf!;
        int k = Array.BinarySearch(cdf, u);
        if (k < 0) k = ~k - 1;
        k = Math.Clamp(k, 0, cdf.Length - 2);
        while (cdf[k + 1] <= cdf[k] && k < cdf.Length - 2) k++; // skip empty bins (zero weight)
        double f = (u - cdf[k]) / (cdf[k + 1] - cdf[k]);
        f = Math.Clamp(f, 0.0, 1.0);
        return _edges[k] + f * (_edges[k + 1] - _edges[k]);
    }

    /// <summary>The probability density at z (normalised; 0 outside [ZMin, ZMax]), for tests and figures.</summary>
    public double Density(double z)
    {
        if (!(z >= ZMin && z <= ZMax)) return 0;
        if (_edges is null) return 1.0 / (ZMax - ZMin);
        int k = Array.BinarySearch(_edges, z);
        if (k < 0) k = ~k - 1;
        k = Math.Clamp(k, 0, _edges.Length - 2);
        return (_cdf![k + 1] - _cdf[k]) / (_edges[k + 1] - _edges[k]);
    }

    /// <summary>The cumulative probability P(Z ≤ z).</summary>
    public double Cumulative(double z)
    {
        if (z <= ZMin) return 0;
        if (z >= ZMax) return 1;
        if (_edges is null) return (z - ZMin) / (ZMax - ZMin);
        int k = Array.BinarySearch(_edges, z);
        if (k >= 0) return _cdf![k];
        k = ~k - 1;
        return _cdf![k] + (_cdf[k + 1] - _cdf[k]) * (z - _edges[k]) / (_edges[k + 1] - _edges[k]);
    }

    private static void Normalise(double[] cdf)
    {
        double total = cdf[^1];
        for (int k = 0; k < cdf.Length; k++) cdf[k] /= total;
        cdf[^1] = 1.0;
    }
}
