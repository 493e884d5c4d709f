namespace SizeTest.Distributed;

/// <summary>
/// The Gaussian grid likelihood compressed to per-cell sums: for every grid cell j (objects with
/// j ≤ t &lt; j+1) and every measurement-variance class k, the count n, the means of y and of the
/// interpolation weight w = t − j, the centred co-moments S_yy, S_yw, S_ww and the mean variance.
/// One streaming pass over the rows (row group by row group, out of core) builds it; an evaluation then
/// costs O(cells × classes), independent of the number of objects.
/// </summary>
/// <remarks>
/// Inside cell j the gridded model is linear in w: m = g_j + w Δ_j with Δ_j = g_{j+1} − g_j. Hence, exactly,
/// Σ r_i² = S_yy − 2Δ S_yw + Δ² S_ww + n (ȳ − g_j − w̄ Δ)² (the parallel-axis decomposition of a sum of
/// squares). So the χ² term is <b>exact</b> with respect to <see cref="GaussianGridKernel"/> (same grid, same
/// interpolation) for every parameter vector. The variance terms Σ r_i²/(σ_i² + σ_int²) and Σ ln(σ_i² + σ_int²)
/// are exact only when σ_i² is the same for all objects of a (cell, class); otherwise the class's mean variance
/// stands in for each σ_i², an approximation whose size <see cref="MaxRelativeVarianceSpread"/> bounds and the
/// tests and docs/scaling.md quantify. Accumulation uses Welford/Chan updates (Chan, Golub &amp; LeVeque 1979) for
/// numerical stability. Valid for this Gaussian model only: terms that depend on individual objects other than
/// through (y, σ², z) (e.g. per-object selection limits) cannot be compressed this way.
/// </remarks>
public sealed class SufficientStatistics
{
    private static readonly double LnTwoPi = Math.Log(2 * Math.PI);
    private readonly int _cells;
    private readonly long[] _n;
    private readonly double[] _my, _mw, _cyy, _cyw, _cww, _ms2, _mins2, _maxs2;
    private readonly double _lnVarMin, _classStep;

    /// <summary>
    /// Empty statistics for <paramref name="grid"/> with <paramref name="varianceClasses"/> classes of σ² spaced
    /// uniformly in ln σ² over [<paramref name="varianceMin"/>, <paramref name="varianceMax"/>] (values outside go to
    /// the end classes; σ² = 0 to the first). One class suits homoscedastic data.
    /// </summary>
    public SufficientStatistics(LogRedshiftGrid grid, int varianceClasses = 1, double varianceMin = 1e-6, double varianceMax = 1)
    {
        ArgumentNullException.ThrowIfNull(grid);
        if (varianceClasses < 1) throw new ArgumentOutOfRangeException(nameof(varianceClasses));
        if (!(varianceMin > 0) || !(varianceMax >= varianceMin)) throw new ArgumentOutOfRangeException(nameof(varianceMax), "Need 0 < varianceMin ≤ varianceMax.");
        Grid = grid;
        Classes = varianceClasses;
        _cells = grid.Count - 1;
        int size = _cells * varianceClasses;
        _n = new long[size];
        _my = new double[size]; _mw = new double[size];
        _cyy = new double[size]; _cyw = new double[size]; _cww = new double[size];
        _ms2 = new double[size];
        _mins2 = new double[size]; _maxs2 = new double[size];
        Array.Fill(_mins2, double.PositiveInfinity);
        Array.Fill(_maxs2, double.NegativeInfinity);
        _lnVarMin = Math.Log(varianceMin);
        _classStep = varianceClasses == 1 ? 1 : (Math.Log(varianceMax) - _lnVarMin) / varianceClasses;
    }

    /// <summary>The redshift grid (the same as the kernel's).</summary>
    public LogRedshiftGrid Grid { get; }

    /// <summary>Number of variance classes.</summary>
    public int Classes { get; }

    /// <summary>Objects accumulated.</summary>
    public long ObjectCount { get; private set; }

    /// <summary>Number of non-empty (cell, class) bins (the evaluation cost).</summary>
    public int OccupiedBins => _n.Count(c => c > 0);

    /// <summary>
    /// Largest (max σ² − min σ²)/mean σ² over occupied bins: 0 means every variance term is exact;
    /// otherwise the relative error of each bin's variance is at most this value.
    /// </summary>
    public double MaxRelativeVarianceSpread
    {
        get
        {
            double worst = 0;
            for (int b = 0; b < _n.Length; b++)
                if (_n[b] > 0 && _ms2[b] > 0) worst = Math.Max(worst, (_maxs2[b] - _mins2[b]) / _ms2[b]);
            return worst;
        }
    }

    /// <summary>Adds rows [start, end) of <paramref name="columns"/> (which must use the same grid). Call per row group when streaming.</summary>
    public void Add(KernelColumns columns, int start, int end)
    {
        ArgumentNullException.ThrowIfNull(columns);
        if (columns.Grid.Count != Grid.Count || columns.Grid.ZMin != Grid.ZMin || columns.Grid.ZMax != Grid.ZMax)
            throw new ArgumentException("The columns use a different redshift grid.", nameof(columns));
        if (start < 0 || end < start || end > columns.Count) throw new ArgumentOutOfRangeException(nameof(end));
        var y = columns.Value; var s2 = columns.Variance; var t = columns.GridPosition;
        for (int i = start; i < end; i++)
        {
            int j = (int)t[i];
            if (j > _cells - 1) j = _cells - 1;
            double w = t[i] - j;
            int b = j * Classes + ClassOf(s2[i]);
            long n = ++_n[b];
            double dy = y[i] - _my[b], dw = w - _mw[b];
            _my[b] += dy / n;
            _mw[b] += dw / n;
            _cyy[b] += dy * (y[i] - _my[b]);
            _cyw[b] += dy * (w - _mw[b]);
            _cww[b] += dw * (w - _mw[b]);
            _ms2[b] += (s2[i] - _ms2[b]) / n;
            if (s2[i] < _mins2[b]) _mins2[b] = s2[i];
            if (s2[i] > _maxs2[b]) _maxs2[b] = s2[i];
        }
        ObjectCount += end - start;
    }

    private int ClassOf(double variance)
    {
        if (Classes == 1 || !(variance > 0)) return 0;
        int k = (int)Math.Floor((Math.Log(variance) - _lnVarMin) / _classStep);
        return k < 0 ? 0 : k >= Classes ? Classes - 1 : k;
    }

    /// <summary>
    /// ln L for model node values <paramref name="modelGrid"/> and intrinsic scatter <paramref name="sigmaInt"/>,
    /// the same quantity as <see cref="GaussianGridKernel.LogLikelihood"/> over the accumulated rows (see remarks for exactness).
    /// </summary>
    public double LogLikelihood(ReadOnlySpan<double> modelGrid, double sigmaInt)
    {
        if (modelGrid.Length != Grid.Count) throw new ArgumentException("The grid values must have one entry per grid node.", nameof(modelGrid));
        double s2Int = sigmaInt * sigmaInt;
        double sum = 0;
        for (int j = 0; j < _cells; j++)
        {
            double g = modelGrid[j], delta = modelGrid[j + 1] - g;
            for (int k = 0; k < Classes; k++)
            {
                int b = j * Classes + k;
                long n = _n[b];
                if (n == 0) continue;
                double rbar = _my[b] - g - _mw[b] * delta;
                double chi = _cyy[b] - 2 * delta * _cyw[b] + delta * delta * _cww[b] + n * rbar * rbar;
                double v = _ms2[b] + s2Int;
                sum += chi / v + n * (Math.Log(v) + LnTwoPi);
            }
        }
        return -0.5 * sum;
    }
}
