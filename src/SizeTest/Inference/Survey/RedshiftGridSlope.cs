namespace SizeTest.Inference.Survey;

/// <summary>
/// The derivative of a <see cref="RedshiftGrid"/>'s interpolant: with g(u) = ln D_A − ln z interpolated by the 4-point Lagrange
/// cubic in u = ln z on uniform nodes u_k = u_0 + k h, g(z) = Σ_k w_k(s) g_{j+k} with s = (ln z − u_0)/h − j, so
/// d g/d z = (1/(z h)) Σ_k w′_k(s) g_{j+k} and d ln D_A/d z = 1/z + d g/d z. The derivative weights of
/// w_0 = −(s−1)(s−2)(s−3)/6, w_1 = s(s−2)(s−3)/2, w_2 = −s(s−1)(s−3)/2, w_3 = s(s−1)(s−2)/6 (the grid's own stencil) are
/// their products differentiated term by term.
/// </summary>
internal static class RedshiftGridSlope
{
    /// <summary>
    /// Four weights per redshift (on the nodes <c>grid.Index[i]…+3</c>, which must be <paramref name="z"/>'s own stencils) giving
    /// d g/d z = Σ_k W_ik g_{Index[i]+k}.
    /// </summary>
    public static double[] Weights(RedshiftGrid grid, ReadOnlySpan<double> z)
    {
        ArgumentNullException.ThrowIfNull(grid);
        if (grid.IsExact) throw new InvalidOperationException("the slope of an exact (distinct-redshift) grid is not defined; build the grid on uniform nodes");
        if (z.Length != grid.Index.Length) throw new ArgumentException($"{z.Length} redshifts for a grid of {grid.Index.Length} stencils", nameof(z));
        var nodes = grid.Nodes;
        double u0 = Math.Log(nodes[0]), h = (Math.Log(nodes[^1]) - u0) / (nodes.Length - 1);
        var w = new double[4 * z.Length];
        for (int i = 0; i < z.Length; i++)
        {
            double s = (Math.Log(z[i]) - u0) / h - grid.Index[i], f = 1 / (z[i] * h);
            double a = s - 1, b = s - 2, c = s - 3;
            w[4 * i] = -f * (b * c + a * c + a * b) / 6;
            w[4 * i + 1] = f * (b * c + s * c + s * b) / 2;
            w[4 * i + 2] = -f * (a * c + s * c + s * a) / 2;
            w[4 * i + 3] = f * (a * b + s * b + s * a) / 6;
        }
        return w;
    }

    /// <summary>
    /// ln D_A(z) and d ln D_A/dz of rows [b0, b0 + nb) of <paramref name="grid"/> from its node values <paramref name="g"/>
    /// (ln D_A − ln z) through the value and slope stencils, into <paramref name="lnDa"/> and <paramref name="slope"/> from index 0
    /// (entries nb up to <paramref name="padded"/>: 0).
    /// </summary>
    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveOptimization)]
    public static void Distances(RedshiftGrid grid, double[] slopeWeights, double[] lnz, double[] invZ, double[] g, int b0, int nb, int padded,
        double[] lnDa, double[] slope)
    {
        var idx = grid.Index;
        var w = grid.Weights;
        var sw = slopeWeights;
        for (int t = 0; t < nb; t++)
        {
            int i = b0 + t, j = idx[i], k = 4 * i;
            double g0 = g[j], g1 = g[j + 1], g2 = g[j + 2], g3 = g[j + 3];
            lnDa[t] = lnz[i] + w[k] * g0 + w[k + 1] * g1 + w[k + 2] * g2 + w[k + 3] * g3;
            slope[t] = invZ[i] + sw[k] * g0 + sw[k + 1] * g1 + sw[k + 2] * g2 + sw[k + 3] * g3;
        }
        Array.Clear(lnDa, nb, padded - nb);
        Array.Clear(slope, nb, padded - nb);
    }
}
