using System.Numerics;
using System.Runtime.InteropServices;

namespace SizeTest.Inference.Survey;

/// <summary>
/// The linearised photometric-redshift marginal (<see cref="RedshiftMarginal.Linear"/>) of the log-normal size likelihood without a
/// size cut, on flat per-object arrays: ln p_i = ln N(y_i; m(z̄_i), V_i) with V_i = σ_i² + σ_g² + m′_i² s_i², the effective variance of
/// <see cref="SurveySizeLikelihood"/> (its remarks give the terms and sources). With e the distance exponent and s_C = ∂C/∂ln(1+z),
/// m = ln R0 + (a + 2βe) ln(1+z̄) + (2β − 1) ln D_A(z̄) + β C and m′ = (a + 2βe − β s_C)/(1+z̄) + (2β − 1) d ln D_A/dz.
/// </summary>
/// <remarks>
/// <para>Blocks of objects. Grid distances: ln D_A and its slope per object from the node values through the two 4-point stencils.
/// Several (group, bin) cells: each object's coefficients gathered into block arrays (one cell: held in registers). Then one pass in
/// System.Numerics vectors (<c>Vector.Log</c> for ln V) gives r = y − m, V, and the per-object partials d = w r/V (∂/∂m),
/// v = w (r²/V² − 1/V) (2 ∂/∂V) and t = v m′ s² (∂/∂m′); a slice's last vector is masked by lane. ln p = −½(r²/V + ln V) − ½ ln 2π.</para>
/// <para>Gradient: ∂m/∂a = ln(1+z̄), ∂m′/∂a = 1/(1+z̄); ∂V/∂σ_g = 2σ_g; ∂m/∂β = C + 2 ln D_A + 2e ln(1+z̄),
/// ∂m′/∂β = (2e − s_C)/(1+z̄) + 2 d ln D_A/dz; ∂m/∂e = 2β ln(1+z̄), ∂m′/∂e = 2β/(1+z̄); the grid nodes receive −(2β − 1)(d W_k + t W′_k)
/// through the value stencil W and the slope stencil W′ (<see cref="RedshiftGridSlope"/>), which share their nodes. Sums per cell and
/// group, in vectors for one cell; mapped to the free parameters by the caller.</para>
/// </remarks>
internal sealed class LinearisedRedshiftKernel : IRedshiftMarginalKernel
{
    private const double HalfLn2Pi = 0.91893853320467274;
    private const int Block = 256;
    private static readonly int Lanes = LinearisedDistances.Lanes;

    // Per object, padded by one vector (padding: weight 0): ln θ, σ_i², s², ln(1+z̄), 1/(1+z̄), C, weight; fixed cosmology: ln D_A(z̄)
    // and d ln D_A/dz at z̄.
    private readonly double[] _y, _s2, _zVar, _x, _ix, _w;
    private readonly double[]? _c;
    private readonly LinearisedDistances _dist;
    private readonly int[] _group, _cell;
    private readonly bool _oneCell;
    private readonly double _lumZSlope;

    /// <summary>Binds the per-object arrays (object i at its posterior mean z̄_i).</summary>
    /// <param name="y">ln θ_i (radians).</param>
    /// <param name="s2">σ_i², the measurement variance of ln θ_i.</param>
    /// <param name="zVar">s_i², the variance of the object's redshift posterior.</param>
    /// <param name="group">Group of each object.</param>
    /// <param name="cell">(group, bin) cell of each object: group·bins + bin.</param>
    /// <param name="cells">Number of cells.</param>
    /// <param name="weight">Object weights (0: skipped), or null for 1.</param>
    /// <param name="ln1pz">ln(1 + z̄_i).</param>
    /// <param name="lnz">ln z̄_i (grid distances).</param>
    /// <param name="lumBase">C(z̄_i) of the luminosity term, or null without a relation.</param>
    /// <param name="lumZSlope">s_C = ∂C/∂ln(1+z).</param>
    /// <param name="lnDaFixed">ln D_A(z̄_i) for a fixed cosmology, or null (then <paramref name="grid"/>).</param>
    /// <param name="slopeFixed">d ln D_A/dz at z̄_i for a fixed cosmology, or null.</param>
    /// <param name="grid">The stencils of z̄_i on the D_A grid, or null for a fixed cosmology.</param>
    /// <param name="slopeWeights">The slope stencil's 4 weights per object on <paramref name="grid"/> (<see cref="RedshiftGridSlope"/>).</param>
    public LinearisedRedshiftKernel(double[] y, double[] s2, double[] zVar, int[] group, int[] cell, int cells, double[]? weight,
        double[] ln1pz, double[] lnz, double[]? lumBase, double lumZSlope, double[]? lnDaFixed, double[]? slopeFixed, RedshiftGrid? grid, double[]? slopeWeights)
    {
        int n = y.Length;
        _y = LinearisedDistances.Padded(y, n, 0);
        _s2 = LinearisedDistances.Padded(s2, n, 1);
        _zVar = LinearisedDistances.Padded(zVar, n, 0);
        _x = LinearisedDistances.Padded(ln1pz, n, 0);
        _ix = LinearisedDistances.Padded(ln1pz.Select(v => Math.Exp(-v)).ToArray(), n, 0);
        _w = LinearisedDistances.Padded(weight ?? Enumerable.Repeat(1.0, n).ToArray(), n, 0);
        _c = lumBase is null ? null : LinearisedDistances.Padded(lumBase, n, 0);
        _lumZSlope = lumZSlope;
        _group = group;
        _cell = cell;
        _oneCell = cells == 1;
        _dist = new LinearisedDistances(n, lnz, lnDaFixed, slopeFixed, grid, slopeWeights);
    }


    /// <inheritdoc/>
    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveOptimization)]
    public double Sum(ReadOnlySpan<double> lnR0, ReadOnlySpan<double> a, ReadOnlySpan<double> beta, ReadOnlySpan<double> sig, double eExp,
        double[]? grid, int start, int end,
        Span<double> dCell, Span<double> dGroupX, Span<double> dGroupSig, Span<double> dGroupLum, ref double dExp, double[]? nodeAdjoint)
    {
        bool grad = !dCell.IsEmpty, lum = _c is not null, onGrid = _dist.OnGrid;
        int groups = a.Length;
        // Per group: coefficients of ln(1+z̄) and ln D_A in m, of 1/(1+z̄) in m′, and σ_g².
        Span<double> k1 = stackalloc double[groups], k2 = stackalloc double[groups], ks = stackalloc double[groups], sg2 = stackalloc double[groups];
        for (int g = 0; g < groups; g++)
        {
            k1[g] = a[g] + 2 * beta[g] * eExp;
            k2[g] = 2 * beta[g] - 1;
            ks[g] = k1[g] - beta[g] * _lumZSlope;
            sg2[g] = sig[g] * sig[g];
        }
        // Per group: Σ ∂/∂a, Σ v (times σ_g at the end), Σ ∂/∂β; per cell Σ d.
        Span<double> sx = stackalloc double[groups], sv = stackalloc double[groups], sl = stackalloc double[groups], sd = stackalloc double[lnR0.Length];
        sx.Clear(); sv.Clear(); sl.Clear(); sd.Clear();
        bool store = grad && (!_oneCell || onGrid);
        int size = Block + Lanes;
        var pool = System.Buffers.ArrayPool<double>.Shared;
        double[]? daBuf = onGrid ? pool.Rent(size) : null, slBuf = onGrid ? pool.Rent(size) : null;
        double[]? coef = _oneCell ? null : pool.Rent(6 * size);
        double[]? parts = store ? pool.Rent(3 * size) : null;
        var lane = LinearisedDistances.LaneIndex();
        var zero = Vector<double>.Zero;
        Vector<double> accT = zero, accW = zero, accD = zero, accX = zero, accV = zero, accL = zero;
        try
        {
            for (int b0 = start; b0 < end; b0 += Block)
            {
                int nb = Math.Min(end, b0 + Block) - b0, padded = (nb + Lanes - 1) / Lanes * Lanes;
                _dist.Fill(grid, b0, nb, padded, daBuf, slBuf);
                if (coef is not null) Coefficients(lnR0, beta, k1, k2, ks, sg2, b0, nb, padded, coef, size);
                ReadOnlySpan<double> da = _dist.LnDa(b0, daBuf), dsl = _dist.Slope(b0, slBuf);
                var y = _y.AsSpan(b0); var s2 = _s2.AsSpan(b0); var zv = _zVar.AsSpan(b0); var x = _x.AsSpan(b0); var ix = _ix.AsSpan(b0);
                var w = _w.AsSpan(b0);
                var c = lum ? _c.AsSpan(b0) : default;
                Vector<double> c0 = new(lnR0[0]), vk1 = new(k1[0]), vk2 = new(k2[0]), vks = new(ks[0]), vsg2 = new(sg2[0]), vb = new(beta[0]);
                var e2 = new Vector<double>(2 * eExp);
                var es = new Vector<double>(2 * eExp - _lumZSlope);
                for (int t = 0; t < padded; t += Lanes)
                {
                    if (coef is not null)
                    {
                        c0 = LinearisedDistances.Load(coef, t); vk1 = LinearisedDistances.Load(coef, size + t); vk2 = LinearisedDistances.Load(coef, 2 * size + t); vks = LinearisedDistances.Load(coef, 3 * size + t);
                        vsg2 = LinearisedDistances.Load(coef, 4 * size + t); vb = LinearisedDistances.Load(coef, 5 * size + t);
                    }
                    var vx = LinearisedDistances.Load(x, t); var vix = LinearisedDistances.Load(ix, t); var vda = LinearisedDistances.Load(da, t); var vdsl = LinearisedDistances.Load(dsl, t); var vz = LinearisedDistances.Load(zv, t);
                    var slope = vks * vix + vk2 * vdsl;
                    var v = LinearisedDistances.Load(s2, t) + vsg2 + slope * slope * vz;
                    var m = c0 + vk1 * vx + vk2 * vda;
                    if (lum) m += vb * LinearisedDistances.Load(c, t);
                    var r = LinearisedDistances.Load(y, t) - m;
                    var inv = Vector<double>.One / v;
                    var d = r * inv;
                    // Lanes past the slice's end, and objects of weight 0, count for nothing.
                    var wv = Vector.ConditionalSelect(Vector.LessThan(lane, new Vector<double>(nb - t)), LinearisedDistances.Load(w, t), zero);
                    var on = ~Vector.Equals(wv, zero);
                    accT += Vector.ConditionalSelect(on, wv * (d * r + Vector.Log(v)), zero);
                    accW += wv;
                    if (!grad) continue;
                    var pd = Vector.ConditionalSelect(on, wv * d, zero);
                    var pv = Vector.ConditionalSelect(on, wv * (d * d - inv), zero);
                    var pt = pv * slope * vz;
                    if (store)
                    {
                        LinearisedDistances.Store(pd, parts!, t); LinearisedDistances.Store(pv, parts!, size + t); LinearisedDistances.Store(pt, parts!, 2 * size + t);
                    }
                    if (!_oneCell) continue;
                    accD += pd;
                    accX += pd * vx + pt * vix;
                    accV += pv;
                    if (lum) accL += pd * (LinearisedDistances.Load(c, t) + 2 * vda + e2 * vx) + pt * (es * vix + 2 * vdsl);
                }
                if (store) Scatter(k2, eExp, lum, b0, nb, da, dsl, parts!, size, sd, sx, sv, sl, nodeAdjoint);
            }
        }
        finally
        {
            if (daBuf is not null) pool.Return(daBuf);
            if (slBuf is not null) pool.Return(slBuf);
            if (coef is not null) pool.Return(coef);
            if (parts is not null) pool.Return(parts);
        }
        if (grad)
        {
            if (_oneCell)
            {
                sd[0] += Vector.Sum(accD); sx[0] += Vector.Sum(accX); sv[0] += Vector.Sum(accV); sl[0] += Vector.Sum(accL);
            }
            for (int q = 0; q < sd.Length; q++) dCell[q] += sd[q];
            for (int g = 0; g < groups; g++)
            {
                dGroupX[g] += sx[g];
                dGroupSig[g] += sig[g] * sv[g];
                if (lum)
                {
                    dGroupLum[g] += sl[g];
                    dExp += 2 * beta[g] * sx[g];
                }
            }
        }
        return -0.5 * Vector.Sum(accT) - HalfLn2Pi * Vector.Sum(accW);
    }

    // Each object's coefficients (ln R0 of its cell, k1, k2, ks, σ² and β of its group) into six rows of length size (lanes past nb: cell 0).
    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveOptimization)]
    private void Coefficients(ReadOnlySpan<double> lnR0, ReadOnlySpan<double> beta, ReadOnlySpan<double> k1, ReadOnlySpan<double> k2,
        ReadOnlySpan<double> ks, ReadOnlySpan<double> sg2, int b0, int nb, int padded, double[] coef, int size)
    {
        for (int t = 0; t < padded; t++)
        {
            int i = b0 + t, g = t < nb ? _group[i] : 0, q = t < nb ? _cell[i] : 0;
            coef[t] = lnR0[q];
            coef[size + t] = k1[g];
            coef[2 * size + t] = k2[g];
            coef[3 * size + t] = ks[g];
            coef[4 * size + t] = sg2[g];
            coef[5 * size + t] = beta[g];
        }
    }

    // The stored per-object partials d, v, t of objects [b0, b0 + nb): sums per cell and group (several cells) and the grid nodes' adjoint.
    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveOptimization)]
    private void Scatter(ReadOnlySpan<double> k2, double eExp, bool lum, int b0, int nb,
        ReadOnlySpan<double> da, ReadOnlySpan<double> dsl, double[] parts, int size,
        Span<double> sd, Span<double> sx, Span<double> sv, Span<double> sl, double[]? nodeAdjoint)
    {
        var x = _x; var ix = _ix; var c = _c;
        double es = 2 * eExp - _lumZSlope;
        var idx = _dist.Grid?.Index;
        var w = _dist.Grid?.Weights;
        var sw = _dist.SlopeWeights;
        for (int t = 0; t < nb; t++)
        {
            int i = b0 + t, g = _group[i];
            double d = parts[t], v = parts[size + t], s = parts[2 * size + t];
            if (!_oneCell)
            {
                sd[_cell[i]] += d;
                sx[g] += d * x[i] + s * ix[i];
                sv[g] += v;
                if (lum) sl[g] += d * (c![i] + 2 * da[t] + 2 * eExp * x[i]) + s * (es * ix[i] + 2 * dsl[t]);
            }
            if (nodeAdjoint is not null)
            {
                double f = -k2[g];
                int j = idx![i], k = 4 * i;
                nodeAdjoint[j] += f * (d * w![k] + s * sw![k]);
                nodeAdjoint[j + 1] += f * (d * w[k + 1] + s * sw[k + 1]);
                nodeAdjoint[j + 2] += f * (d * w[k + 2] + s * sw[k + 2]);
                nodeAdjoint[j + 3] += f * (d * w[k + 3] + s * sw[k + 3]);
            }
        }
    }



}
