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
/// nodes, so the node block of G is banded, |k − l| ≤ 3). G β also gives Σ r_i (row 1), Σ r_i (x_i − x̄) (row 2) and
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
    private readonly double[] _band = []; // _band[4k + d] = Σ w_ik w_i(k+d), d = 0..3

    /// <summary>Builds the Gram matrix of rows [start, end).</summary>
    /// <param name="y">ln θ per object.</param>
    /// <param name="x">ln(1+z) per object.</param>
    /// <param name="offset">Fixed per-object ln D_A (no grid), or ln z with a grid.</param>
    /// <param name="grid">The redshift grid (its stencils), or null for fixed distances.</param>
    /// <param name="gRef">The reference grid values g_ref (with a grid).</param>
    /// <param name="start">First row.</param>
    /// <param name="end">One past the last row.</param>
    public SizeSliceGram(double[] y, double[] x, double[] offset, RedshiftGrid? grid, double[]? gRef, int start, int end)
    {
        _n = end - start;
        _k = grid?.Nodes.Length ?? 0;
        var u = new double[_n];
        double su = 0, sx = 0;
        var idx = grid?.Index;
        var w = grid?.Weights;
        for (int i = start; i < end; i++)
        {
            double ui = y[i] + offset[i];
            if (grid is not null)
            {
                int j = idx![i], q = 4 * i;
                ui += w![q] * gRef![j] + w[q + 1] * gRef[j + 1] + w[q + 2] * gRef[j + 2] + w[q + 3] * gRef[j + 3];
            }
            u[i - start] = ui;
            su += ui;
            sx += x[i];
        }
        _uMean = _n > 0 ? su / _n : 0;
        _xMean = _n > 0 ? sx / _n : 0;
        if (_k > 0)
        {
            _bu = new double[_k]; _b1 = new double[_k]; _bx = new double[_k];
            _band = new double[4 * _k];
        }
        for (int i = start; i < end; i++)
        {
            double uc = u[i - start] - _uMean, xc = x[i] - _xMean;
            _suu += uc * uc; _su1 += uc; _sux += uc * xc; _sx1 += xc; _sxx += xc * xc;
            if (_k == 0) continue;
            int j = idx![i], q = 4 * i;
            for (int a = 0; a < 4; a++)
            {
                double wa = w![q + a];
                _bu[j + a] += uc * wa; _b1[j + a] += wa; _bx[j + a] += xc * wa;
                for (int b = a; b < 4; b++) _band[4 * (j + a) + (b - a)] += wa * w[q + b];
            }
        }
    }

    /// <summary>Rows in the slice.</summary>
    public int Count => _n;

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
            Span<double> dg = _k <= 512 ? stackalloc double[_k] : new double[_k];
            for (int k = 0; k < _k; k++) dg[k] = g![k] - gRef![k];
            double tail = 0;
            for (int k = 0; k < _k; k++)
            {
                double d = dg[k];
                r0 += d * _bu[k]; r1 += d * _b1[k]; r2 += d * _bx[k];
                // Row 3 + k of G β: the dense columns, then the band (symmetric: l = k − 3 … k + 3).
                double rk = _bu[k] + kappa * _b1[k] + ma * _bx[k];
                for (int l = Math.Max(0, k - 3); l < k; l++) rk += _band[4 * l + (k - l)] * dg[l];
                for (int l = k; l < Math.Min(_k, k + 4); l++) rk += _band[4 * k + (l - k)] * dg[l];
                tail += d * rk;
                if (!nodeSums.IsEmpty) nodeSums[k] += scale * rk;
            }
            q = tail;
        }
        q += r0 + kappa * r1 + ma * r2;
        sumR = r1;
        sumRx = r2 + _xMean * r1;
        return Math.Max(0, q);
    }
}
