using System.Buffers;

namespace SizeTest.Inference.Likelihood;

/// <summary>
/// Angular sizes (radians): ln θ_i ~ N(m_t,i, V_t,i), m_t = ln[R0 (1+z_i)^a / D_A(z_i)] (R0 in kpc, D_A in Mpc, θ = 10⁻³R/D_A),
/// V_t = σ_i² + σ², σ = ln10·scatter_dex, optionally truncated by a minimum size (<see cref="SelectionTruncation"/>).
/// Without a cut both paths run on the vectorised <see cref="GaussianCore"/>, or, when every ln θ variance is the same, on
/// one <see cref="SizeSliceGram"/> per row slice (cost independent of the rows).
/// </summary>
/// <remarks>With a row mask (cross-validation folds over the one bound row set) only rows with <c>mask[i] != 0</c> count;
/// the kernel then runs on masked Gram matrices only (<see cref="SupportsMask"/>), which hold exactly the sums a copy of
/// the included rows would.</remarks>
internal sealed class SizeKernel(ObjectColumns cols, DistanceTerms distances, SelectionTruncation? cut,
    SliceGramCache? sharedGrams = null, byte[]? mask = null) : IObservableKernel
{
    /// <summary>Whether a size kernel on these rows, cut and distances can evaluate a row mask (the Gram path).</summary>
    public static bool SupportsMask(ObjectColumns cols, DistanceTerms distances, SelectionTruncation? cut) =>
        UsesGrams(cols, cut) && (distances.FixedLnDa is not null || distances.Grid is not null);

    /// <summary>The row mask (null: every row).</summary>
    public byte[]? Mask => mask;

    // Equal ln θ variances and no cut: each slice's χ² is a quadratic form (SizeSliceGram), built at its first use; a
    // likelihood with parameters held fixed on the same rows and grid (profile refits) shares its parent's.
    private readonly SliceGramCache? _grams =
        !UsesGrams(cols, cut) || (distances.FixedLnDa is null && distances.Grid is null) ? null
            : sharedGrams is not null && distances.FixedLnDa is null ? sharedGrams : new();

    /// <summary>Whether a size kernel on these rows with this cut evaluates through <see cref="SizeSliceGram"/>s.</summary>
    public static bool UsesGrams(ObjectColumns cols, SelectionTruncation? cut) => cut is null && cols.UniformVarLnTheta;

    /// <summary>The slice Gram matrices (null when not used), for a likelihood that shares these rows and grid.</summary>
    public SliceGramCache? Grams => _grams;

    private SizeSliceGram? Gram(int start, int end) =>
        _grams is null || end <= start ? null
            : _grams.GetOrAdd(start, end, static (s, e, k) => k.BuildGram(s, e), this);

    private SizeSliceGram BuildGram(int start, int end) => distances.FixedLnDa is { } fixedLnDa
        ? new SizeSliceGram(cols.LnTheta, cols.Ln1pZ, fixedLnDa, null, null, start, end, mask)
        : new SizeSliceGram(cols.LnTheta, cols.Ln1pZ, cols.LnZ, distances.Grid, distances.ReferenceG, start, end, mask);

    public double Sum(LikelihoodEvaluation e, in ModelPoint p, int start, int end)
    {
        int len = end - start;
        if (Gram(start, end) is { } gram)
        {
            len = gram.Count;
            double v = cols.VarLnTheta[gram.FirstRow] + p.Sigma2;
            double q = gram.SumSquares(p.C0, p.A, e.GridLnDaOverZ, distances.ReferenceG, default, 0, out _, out _);
            return -0.5 * (q / v + len * Math.Log(v)) - GaussianCore.HalfLn2Pi * len;
        }
        if (mask is not null) return MaskWithoutGram(len);
        if (cut is null)
        {
            var lnDa = distances.LnDaSlice(e, start, end, cols.LnZ, out var rented);
            double q = GaussianCore.Sum(cols.LnTheta.AsSpan(start, len), cols.Ln1pZ.AsSpan(start, len), lnDa, cols.VarLnTheta.AsSpan(start, len),
                p.C0, p.A, p.Sigma2, cols.UniformVarLnTheta);
            if (rented is not null) ArrayPool<double>.Shared.Return(rented);
            return -0.5 * q - GaussianCore.HalfLn2Pi * len;
        }
        double acc = 0, sel = 0;
        for (int i = start; i < end; i++)
        {
            double m = p.C0 + p.A * cols.Ln1pZ[i] - distances.LnDa(e, i, cols.LnZ);
            double r = cols.LnTheta[i] - m, v = cols.VarLnTheta[i] + p.Sigma2;
            acc += r * r / v + Math.Log(v);
            sel += cut.LogPass(m, 0, v, 0, 0);
        }
        return -0.5 * acc - sel - GaussianCore.HalfLn2Pi * len;
    }

    public double SumWithAdjoint(LikelihoodEvaluation e, in ModelPoint p, int start, int end, ModelAdjoint adj)
    {
        int len = end - start;
        var nodeA = adj.NodeAdjoint;
        if (Gram(start, end) is { } gram)
        {
            len = gram.Count;
            double v = cols.VarLnTheta[gram.FirstRow] + p.Sigma2, inv = 1 / v;
            double q = gram.SumSquares(p.C0, p.A, e.GridLnDaOverZ, distances.ReferenceG, distances.FixedLnDa is null ? nodeA : default, inv, out double sr, out double srx);
            adj.Dt += sr * inv; adj.DtX += srx * inv; adj.DVt += 0.5 * (q * inv * inv - len * inv);
            return -0.5 * (q * inv + len * Math.Log(v)) - GaussianCore.HalfLn2Pi * len;
        }
        if (mask is not null) return MaskWithoutGram(len);
        if (cut is null)
        {
            if (distances.Grid is { } grid && nodeA is not null) return -0.5 * FusedGridSum(e.GridLnDaOverZ!, grid, p, start, end, adj, nodeA) - GaussianCore.HalfLn2Pi * len;
            var lnDa = distances.LnDaSlice(e, start, end, cols.LnZ, out var rented);
            var d = ArrayPool<double>.Shared.Rent(len);
            double q = GaussianCore.SumWithPartials(cols.LnTheta.AsSpan(start, len), cols.Ln1pZ.AsSpan(start, len), lnDa, cols.VarLnTheta.AsSpan(start, len),
                p.C0, p.A, p.Sigma2, cols.UniformVarLnTheta, d.AsSpan(0, len), out double sd, out double sdx, out double sv);
            adj.Dt += sd; adj.DtX += sdx; adj.DVt += sv;
            ArrayPool<double>.Shared.Return(d);
            if (rented is not null) ArrayPool<double>.Shared.Return(rented);
            return -0.5 * q - GaussianCore.HalfLn2Pi * len;
        }
        double acc = 0, sel = 0;
        for (int i = start; i < end; i++)
        {
            double x = cols.Ln1pZ[i];
            double m = p.C0 + p.A * x - distances.LnDa(e, i, cols.LnZ);
            double r = cols.LnTheta[i] - m, v = cols.VarLnTheta[i] + p.Sigma2, inv = 1 / v;
            acc += r * r * inv + Math.Log(v);
            sel += cut.LogPass(m, 0, v, 0, 0, out double smt, out _, out double svt, out _, out _);
            double dt = r * inv - smt;
            adj.AddObject(dt, 0, 0.5 * (r * r * inv * inv - inv) - svt, 0, 0, x, 0);
            distances.Scatter(nodeA, i, dt);
        }
        return -0.5 * acc - sel - GaussianCore.HalfLn2Pi * len;
    }

    // An empty slice has no rows to mask; any other slice of a masked kernel has a Gram matrix (SupportsMask).
    private static double MaskWithoutGram(int len) =>
        len == 0 ? 0 : throw new InvalidOperationException("a row mask needs the Gram path (equal ln θ variances, no cut, grid or fixed distances)");

    // Grid distances, no cut: one fused pass per object — interpolate ln D_A, residual, partials, and scatter d_t into the
    // four stencil nodes' adjoint — without temporary arrays. Returns Σ[r²/v + ln v].
    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveOptimization)]
    private double FusedGridSum(double[] g, RedshiftGrid grid, in ModelPoint p, int start, int end, ModelAdjoint adj, double[] nodeA)
    {
        var idx = grid.Index;
        var w = grid.Weights;
        var y = cols.LnTheta; var s2 = cols.VarLnTheta; var x = cols.Ln1pZ; var lnz = cols.LnZ;
        double c0 = p.C0, a = p.A, sig2 = p.Sigma2;
        bool uniform = cols.UniformVarLnTheta;
        double q = 0, l = 0, sd = 0, sdx = 0, sv = 0;
        double invU = uniform && end > start ? 1 / (s2[start] + sig2) : 0;
        for (int i = start; i < end; i++)
        {
            int j = idx[i], k = 4 * i;
            double w0 = w[k], w1 = w[k + 1], w2 = w[k + 2], w3 = w[k + 3];
            double lnDa = lnz[i] + w0 * g[j] + w1 * g[j + 1] + w2 * g[j + 2] + w3 * g[j + 3];
            double r = y[i] - (c0 + a * x[i] - lnDa);
            double inv = uniform ? invU : 1 / (s2[i] + sig2);
            double d = r * inv;
            q += d * r;
            if (!uniform) l -= Math.Log(inv);
            sd += d; sdx += d * x[i]; sv += d * d - inv;
            nodeA[j] += d * w0; nodeA[j + 1] += d * w1; nodeA[j + 2] += d * w2; nodeA[j + 3] += d * w3;
        }
        if (uniform) l = (end - start) * Math.Log(1 / invU);
        adj.Dt += sd; adj.DtX += sdx; adj.DVt += 0.5 * sv;
        return q + l;
    }
}
