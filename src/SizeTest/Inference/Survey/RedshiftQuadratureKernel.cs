using System.Numerics;
using SizeTest.Inference;
using static System.Runtime.InteropServices.MemoryMarshal;

namespace SizeTest.Inference.Survey;

/// <summary>
/// The photometric-redshift quadrature of the log-normal size likelihood without a size cut, on flat per-node arrays:
/// ln p_i = ln Σ_j W_ij N(y_i; m(z_ij), V_i) with V_i = σ_i² + σ_g² and m(z) = ln R0 + (a + 2βe) ln(1+z) + (2β − 1) ln D_A(z) + β C(z),
/// the mean of <see cref="SurveySizeLikelihood"/> (its remarks give the terms); W_ij are the normalised node weights, 0 for a dropped node.
/// Bound without distances (neither fixed ln D_A nor a grid) the mean is ln R0 + a ln(1+z) + (2β − 1)·0 + β C: with β = 0, no relation and
/// e = 0 this is a Gaussian in y with a mean linear in ln(1+z), which is how <see cref="SurveyJointLikelihood"/> runs the surface-brightness
/// quadrature without a cut (y = μ − K − A, "ln R0" = μ0, a = 2.5 (n − b)/ln 10, σ_i² = σ_μ,i², σ_g = s_μ).
/// </summary>
/// <remarks>
/// <para>Blocks of objects in three passes. Pass 1: each node's residual r and exponent u = −r²/(2V) (≤ 0). Pass 2: e^u in SIMD vectors
/// (System.Numerics <c>Vector.Exp</c>), times W; S_i = Σ_j W_ij e^{u_ij}; ln S_i and ln V_i in vectors, once per object.
/// Pass 3: ln p_i = ln S_i − ½ ln V_i − ½ ln 2π. Without the usual log-sum-exp shift no term overflows; an object whose every node
/// underflows (|r| &gt; 37√V everywhere, ln S &lt; −640) is redone shifted by its largest exponent.</para>
/// <para>Gradient: with shares p_ij = W_ij e^{u_ij}/S_i, ∂ln p_i/∂m = Σ_j p_ij r_ij/V_i and ∂ln p_i/∂σ_g = σ_g(Σ_j p_ij r_ij²/V_i² − 1/V_i),
/// summed per object, then per (group, bin) cell and per group; the caller maps them to the free parameters once per slice
/// (∂m/∂ln R0 = 1, ∂m/∂a = ln(1+z), ∂m/∂β = C + 2 ln D_A + 2e ln(1+z), ∂m/∂e = 2β ln(1+z)). ∂m/∂ln D_A = 2β − 1 goes to the grid nodes
/// through each redshift node's stencil.</para>
/// </remarks>
internal sealed class RedshiftQuadratureKernel : IRedshiftMarginalKernel
{
    private const double HalfLn2Pi = 0.91893853320467274;
    private const int BlockValues = 2048;

    private readonly int _j;
    private readonly double[] _y, _s2;
    private readonly int[] _group, _cell;
    private readonly double[]? _weight;
    private readonly double[] _ln1pz, _lnz, _logW, _w;
    private readonly double[]? _lumBase, _lnDaFixed;
    private readonly RedshiftGrid? _grid;

    /// <summary>Binds the per-object and per-node arrays (node q = i·J + j of object i).</summary>
    /// <param name="nodesPerObject">J.</param>
    /// <param name="y">ln θ_i (radians).</param>
    /// <param name="s2">σ_i², the measurement variance of ln θ_i.</param>
    /// <param name="group">Group of each object.</param>
    /// <param name="cell">(group, bin) cell of each object: group·bins + bin.</param>
    /// <param name="weight">Object weights (0: skipped), or null for 1.</param>
    /// <param name="nodeLn1pz">ln(1 + z_q).</param>
    /// <param name="nodeLnz">ln z_q (grid distances).</param>
    /// <param name="nodeLogW">ln W_q, −∞ for a dropped node; Σ_j W_ij = 1.</param>
    /// <param name="nodeLumBase">C(z_q) of the luminosity term, or null without a relation.</param>
    /// <param name="nodeLnDaFixed">ln D_A(z_q) for a fixed cosmology, or null (then <paramref name="nodeGrid"/>).</param>
    /// <param name="nodeGrid">The stencils of the nodes on the D_A grid, or null for a fixed cosmology (both null: no distance term, ln D_A = 0).</param>
    public RedshiftQuadratureKernel(int nodesPerObject, double[] y, double[] s2, int[] group, int[] cell, double[]? weight,
        double[] nodeLn1pz, double[] nodeLnz, double[] nodeLogW, double[]? nodeLumBase, double[]? nodeLnDaFixed, RedshiftGrid? nodeGrid)
    {
        _j = nodesPerObject;
        _y = y; _s2 = s2; _group = group; _cell = cell; _weight = weight;
        _ln1pz = nodeLn1pz; _lnz = nodeLnz; _logW = nodeLogW; _w = nodeLogW.Select(Math.Exp).ToArray(); _lumBase = nodeLumBase; _lnDaFixed = nodeLnDaFixed; _grid = nodeGrid;
    }

    /// <summary>
    /// Σ_i w_i ln p_i over objects [start, end) and, when <paramref name="dCell"/> is not empty, the partials: per cell Σ w ∂/∂m,
    /// per group Σ w ∂/∂m ln(1+z) (<paramref name="dGroupX"/>), Σ w ∂/∂σ_g (<paramref name="dGroupSig"/>), Σ w ∂/∂m (C + 2 ln D_A + 2e ln(1+z))
    /// (<paramref name="dGroupLum"/>, with a relation), Σ w ∂/∂m 2β ln(1+z) (<paramref name="dExp"/>), and −Σ w ∂/∂m (2β−1) per grid node
    /// (<paramref name="nodeAdjoint"/>, grid distances). The partial spans are added to, not cleared.
    /// </summary>
    public double Sum(ReadOnlySpan<double> lnR0, ReadOnlySpan<double> a, ReadOnlySpan<double> beta, ReadOnlySpan<double> sig, double eExp,
        double[]? grid, int start, int end,
        Span<double> dCell, Span<double> dGroupX, Span<double> dGroupSig, Span<double> dGroupLum, ref double dExp, double[]? nodeAdjoint)
    {
        int J = _j;
        bool grad = !dCell.IsEmpty, lum = _lumBase is not null;
        int block = Math.Max(1, BlockValues / J);
        var pool = System.Buffers.ArrayPool<double>.Shared;
        double[] rBuf = pool.Rent(block * J), eBuf = pool.Rent(block * J), sBuf = pool.Rent(block), lnvBuf = pool.Rent(block);
        double[]? dBuf = lum && grad ? pool.Rent(block * J) : null;
        var idx = _grid?.Index;
        var sw = _grid?.Weights;
        var y = _y; var s2 = _s2; var ln1pz = _ln1pz; var lnz = _lnz; var nodeW = _w; var fixedDa = _lnDaFixed; var lumBase = _lumBase;
        double acc = 0;
        try
        {
            for (int b0 = start; b0 < end; b0 += block)
            {
                int nb = Math.Min(end, b0 + block) - b0, count = nb * J;
                // Pass 1: residuals r and exponents −r²/(2V) per node; V per object.
                for (int t = 0; t < nb; t++)
                {
                    int i = b0 + t, g = _group[i];
                    double bg = beta[g], k1 = a[g] + 2 * bg * eExp, k2 = 2 * bg - 1;
                    double v = s2[i] + sig[g] * sig[g], basis = y[i] - lnR0[_cell[i]], halfInv = 0.5 / v;
                    lnvBuf[t] = v;
                    int q = i * J, o = t * J;
                    for (int j = 0; j < J; j++, q++, o++)
                    {
                        double lnDa = 0;
                        if (fixedDa is not null) lnDa = fixedDa[q];
                        else if (idx is not null)
                        {
                            int s = idx![q], k = 4 * q;
                            lnDa = lnz[q] + sw![k] * grid![s] + sw[k + 1] * grid[s + 1] + sw[k + 2] * grid[s + 2] + sw[k + 3] * grid[s + 3];
                        }
                        double r = basis - k1 * ln1pz[q] - k2 * lnDa;
                        if (lum)
                        {
                            r -= bg * lumBase![q];
                            if (dBuf is not null) dBuf[o] = lumBase[q] + 2 * (lnDa + eExp * ln1pz[q]);
                        }
                        rBuf[o] = r;
                        eBuf[o] = -halfInv * r * r;
                    }
                }
                // Pass 2: e^u in vectors, times the node weights; S per object.
                Exp(eBuf.AsSpan(0, count));
                for (int t = 0; t < nb; t++)
                {
                    int o = t * J, q = (b0 + t) * J;
                    double sum = 0;
                    for (int j = 0; j < J; j++) sum += eBuf[o + j] *= nodeW[q + j];
                    sBuf[t] = sum;
                }
                Exp(sBuf.AsSpan(0, nb), log: true);
                Exp(lnvBuf.AsSpan(0, nb), log: true);
                // Pass 3: ln p per object (an object whose nodes all underflowed is redone with the log-sum-exp shift), partials.
                for (int t = 0; t < nb; t++)
                {
                    int i = b0 + t;
                    double w = _weight?[i] ?? 1.0;
                    if (w == 0) continue;
                    int g = _group[i], o0 = t * J;
                    double lnS = sBuf[t], shift = 0;
                    if (!(lnS > -640)) lnS = Rescale(i, o0, 1 / (s2[i] + sig[g] * sig[g]), rBuf, eBuf, out shift);
                    acc += w * (shift + lnS - 0.5 * lnvBuf[t] - HalfLn2Pi);
                    if (!grad) continue;
                    double sg = sig[g], inv = 1 / (s2[i] + sg * sg);
                    double f = w * Math.Exp(-lnS), sr = 0, srx = 0, sr2 = 0, srl = 0;
                    double k2 = 2 * beta[g] - 1, dn = -f * inv * k2;
                    int q0 = i * J;
                    for (int j = 0; j < J; j++)
                    {
                        double e = eBuf[o0 + j];
                        double r = rBuf[o0 + j], er = e * r;
                        sr += er;
                        srx += er * ln1pz[q0 + j];
                        sr2 += er * r;
                        if (dBuf is not null) srl += er * dBuf[o0 + j];
                        if (nodeAdjoint is not null)
                        {
                            double d = dn * er;
                            int q = q0 + j, s = idx![q], k = 4 * q;
                            nodeAdjoint[s] += d * sw![k];
                            nodeAdjoint[s + 1] += d * sw[k + 1];
                            nodeAdjoint[s + 2] += d * sw[k + 2];
                            nodeAdjoint[s + 3] += d * sw[k + 3];
                        }
                    }
                    double fi = f * inv;
                    dCell[_cell[i]] += fi * sr;
                    dGroupX[g] += fi * srx;
                    dGroupSig[g] += sg * (f * sr2 * inv * inv - w * inv); // f carries w
                    if (lum)
                    {
                        dGroupLum[g] += fi * srl;
                        dExp += fi * srx * 2 * beta[g];
                    }
                }
            }
        }
        finally
        {
            pool.Return(rBuf);
            pool.Return(eBuf);
            pool.Return(sBuf);
            pool.Return(lnvBuf);
            if (dBuf is not null) pool.Return(dBuf);
        }
        return acc;
    }

    // Every node of object i underflowed: e becomes its exponents ln W − r²/(2V) shifted by their largest value M (returned in
    // shift), and the return value is the log of their sum, so ln S = M + it and the shares e/Σe are unchanged.
    private double Rescale(int i, int o0, double inv, double[] r, double[] e, out double shift)
    {
        double max = double.NegativeInfinity;
        for (int j = 0; j < _j; j++)
        {
            e[o0 + j] = _logW[i * _j + j] - 0.5 * inv * r[o0 + j] * r[o0 + j];
            max = Math.Max(max, e[o0 + j]);
        }
        double sum = 0;
        for (int j = 0; j < _j; j++) sum += e[o0 + j] = Math.Exp(e[o0 + j] - max);
        shift = max;
        return Math.Log(sum);
    }

    // e^u (log: ln u) elementwise, in System.Numerics vectors where the hardware has them.
    private static void Exp(Span<double> u, bool log = false)
    {
        int i = 0;
        if (Vector.IsHardwareAccelerated && u.Length >= Vector<double>.Count)
        {
            var v = Cast<double, Vector<double>>(u);
            for (int k = 0; k < v.Length; k++) v[k] = log ? Vector.Log(v[k]) : Vector.Exp(v[k]);
            i = v.Length * Vector<double>.Count;
        }
        for (; i < u.Length; i++) u[i] = log ? Math.Log(u[i]) : Math.Exp(u[i]);
    }
}
