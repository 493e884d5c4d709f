namespace SizeTest.Inference.Likelihood;

/// <summary>
/// The angular-size χ² of one row slice as a quadratic form, for equal measurement variances and no selection cut: an
/// evaluation then costs O(grid nodes) instead of O(rows), with the same value and gradient as the per-row sum.
/// </summary>
/// <remarks>
/// <para>The residual of object i is r_i = y_i − (c0 + a x_i − ln D_A,i) with ln D_A,i = ln z_i + Σ_k w_ik g_k (the cubic
/// stencil on the redshift grid) or a fixed per-object ln D_A. Write g = g_ref + δg with g_ref the grid values of a fixed
/// reference model, u_i = y_i + ln z_i + Σ_k w_ik g_ref,k (or y_i + ln D_A,i) and centre u and x on their slice means ū, x̄.
/// Then r_i = bᵢ·β with bᵢ = (u_i − ū, 1, x_i − x̄, w_i1 … w_iK) and β = (1, κ, −a, δg), κ = ū − c0 − a x̄, so
/// Σ r_i² = βᵀ G β with the Gram matrix G = Σ_i bᵢ bᵢᵀ (exact algebra; the weights of an object sit on 4 consecutive
/// nodes, so the node block of G is banded, |k − l| ≤ 3, and kept as its 7 diagonals). G β also gives Σ r_i (row 1), Σ r_i (x_i − x̄) (row 2) and
/// Σ r_i w_ik (rows 3 + k), the sums the gradient needs (<see cref="ModelAdjoint"/>). With one variance v for all rows
/// the Gaussian term is Σ [r_i²/v + ln v] = βᵀGβ / v + n ln v (common practice; docs/likelihood.md).</para>
/// <para>Centring and the reference model keep the entries of G of the size of the residuals' spread, so βᵀGβ loses
/// only a few digits to cancellation near the maximum (measured against the per-row sum in the tests: relative
/// differences ~10⁻¹¹).</para>
/// </remarks>
internal sealed class SizeSliceGram
{
    private readonly int _n, _k;
    private readonly double _uMean, _xMean;
    private readonly double _suu, _su1, _sux, _sx1, _sxx;
    private readonly double[] _bu = [], _b1 = [], _bx = [];
    // The node block by diagonals: _diag[(d + 3)·K + k] = Σ_i w_ik w_i(k+d) for d = −3 … 3 (0 where k + d is off the grid),
    // so row k of the band product is Σ_d _diag[d][k]·δg[k + d], vectorised over k.
    private readonly double[] _diag = [];
    private const int Half = 3, Width = 2 * Half + 1;

    /// <summary>Builds the Gram matrix of rows [start, end).</summary>
    /// <param name="y">ln θ per object.</param>
    /// <param name="x">ln(1+z) per object.</param>
    /// <param name="offset">Fixed per-object ln D_A (no grid), or ln z with a grid.</param>
    /// <param name="grid">The redshift grid (its stencils), or null for fixed distances.</param>
    /// <param name="gRef">The reference grid values g_ref (with a grid).</param>
    /// <param name="start">First row.</param>
    /// <param name="end">One past the last row.</param>
    /// <param name="mask">Null for every row of the slice, or the rows to include (<c>mask[i] != 0</c>, indexed like
    /// <paramref name="y"/>): the same sums, in the same order, as a slice of a copy holding only those rows.</param>
    public SizeSliceGram(double[] y, double[] x, double[] offset, RedshiftGrid? grid, double[]? gRef, int start, int end, byte[]? mask = null)
    {
        _n = end - start;
        FirstRow = start;
        if (mask is not null)
        {
            _n = 0;
            FirstRow = -1;
            for (int i = start; i < end; i++)
                if (mask[i] != 0) { _n++; if (FirstRow < 0) FirstRow = i; }
            if (FirstRow < 0) FirstRow = start;
        }
        _k = grid?.Nodes.Length ?? 0;
        var u = new double[_n];
        double su = 0, sx = 0;
        var idx = grid?.Index;
        var w = grid?.Weights;
        for (int i = start, r = 0; i < end; i++)
        {
            if (mask is not null && mask[i] == 0) continue;
            double ui = y[i] + offset[i];
            if (grid is not null)
            {
                int j = idx![i], q = 4 * i;
                ui += w![q] * gRef![j] + w[q + 1] * gRef[j + 1] + w[q + 2] * gRef[j + 2] + w[q + 3] * gRef[j + 3];
            }
            u[r++] = ui;
            su += ui;
            sx += x[i];
        }
        _uMean = _n > 0 ? su / _n : 0;
        _xMean = _n > 0 ? sx / _n : 0;
        if (_k > 0)
        {
            _bu = new double[_k]; _b1 = new double[_k]; _bx = new double[_k];
            _diag = new double[Width * _k];
        }
        for (int i = start, r = 0; i < end; i++)
        {
            if (mask is not null && mask[i] == 0) continue;
            double uc = u[r++] - _uMean, xc = x[i] - _xMean;
            _suu += uc * uc; _su1 += uc; _sux += uc * xc; _sx1 += xc; _sxx += xc * xc;
            if (_k == 0) continue;
            int j = idx![i], q = 4 * i;
            for (int a = 0; a < 4; a++)
            {
                double wa = w![q + a];
                _bu[j + a] += uc * wa; _b1[j + a] += wa; _bx[j + a] += xc * wa;
                for (int b = 0; b < 4; b++) _diag[(b - a + Half) * _k + j + a] += wa * w[q + b];
            }
        }
    }

    /// <summary>Rows in the slice (the included rows only, with a mask).</summary>
    public int Count => _n;

    /// <summary>The first row included (the slice's start when none is).</summary>
    public int FirstRow { get; }

    /// <summary>
    /// Σ r_i² for the model constants c0, a and grid values g (null for fixed distances); with <paramref name="nodeSums"/>
    /// (length K) also Σ r_i and Σ r_i x_i and, per node, <paramref name="scale"/>·Σ r_i w_ik added into it.
    /// </summary>
    public double SumSquares(double c0, double a, double[]? g, double[]? gRef, Span<double> nodeSums, double scale, out double sumR, out double sumRx)
    {
        double kappa = _uMean - c0 - a * _xMean, ma = -a;
        double r0 = _suu + kappa * _su1 + ma * _sux;
        double r1 = _su1 + kappa * _n + ma * _sx1;
        double r2 = _sux + kappa * _sx1 + ma * _sxx;
        double q = 0;
        if (_k > 0)
        {
            // δg padded by Half zeros on each side, so every diagonal reads in range.
            int len = _k + 2 * Half;
            Span<double> pad = len <= 1024 ? stackalloc double[len] : new double[len];
            pad.Clear();
            var dg = pad.Slice(Half, _k);
            for (int k = 0; k < _k; k++) dg[k] = g![k] - gRef![k];
            r0 += Dot(dg, _bu); r1 += Dot(dg, _b1); r2 += Dot(dg, _bx);
            // Rows 3 + k of G β: the dense columns, then the band (the diagonals).
            Span<double> rows = _k <= 1024 ? stackalloc double[_k] : new double[_k];
            for (int k = 0; k < _k; k++) rows[k] = _bu[k] + kappa * _b1[k] + ma * _bx[k];
            for (int d = 0; d < Width; d++) AddProduct(rows, _diag.AsSpan(d * _k, _k), pad.Slice(d, _k));
            q = Dot(dg, rows);
            if (!nodeSums.IsEmpty)
                for (int k = 0; k < _k; k++) nodeSums[k] += scale * rows[k];
        }
        q += r0 + kappa * r1 + ma * r2;
        sumR = r1;
        sumRx = r2 + _xMean * r1;
        return Math.Max(0, q);
    }

    private static double Dot(ReadOnlySpan<double> a, ReadOnlySpan<double> b)
    {
        int i = 0;
        double sum = 0;
        if (System.Numerics.Vector.IsHardwareAccelerated && a.Length >= System.Numerics.Vector<double>.Count)
        {
            var acc = System.Numerics.Vector<double>.Zero;
            int w = System.Numerics.Vector<double>.Count;
            for (; i <= a.Length - w; i += w) acc += new System.Numerics.Vector<double>(a.Slice(i, w)) * new System.Numerics.Vector<double>(b.Slice(i, w));
            sum = System.Numerics.Vector.Sum(acc);
        }
        for (; i < a.Length; i++) sum += a[i] * b[i];
        return sum;
    }

    // target[k] += a[k]·b[k].
    private static void AddProduct(Span<double> target, ReadOnlySpan<double> a, ReadOnlySpan<double> b)
    {
        int i = 0;
        if (System.Numerics.Vector.IsHardwareAccelerated && target.Length >= System.Numerics.Vector<double>.Count)
        {
            int w = System.Numerics.Vector<double>.Count;
            for (; i <= target.Length - w; i += w)
                (new System.Numerics.Vector<double>(target.Slice(i, w)) + new System.Numerics.Vector<double>(a.Slice(i, w)) * new System.Numerics.Vector<double>(b.Slice(i, w))).CopyTo(target.Slice(i, w));
        }
        for (; i < target.Length; i++) target[i] += a[i] * b[i];
    }
}
