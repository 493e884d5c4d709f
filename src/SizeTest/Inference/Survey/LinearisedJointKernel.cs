using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace SizeTest.Inference.Survey;

/// <summary>
/// The linearised photometric-redshift marginal (<see cref="RedshiftMarginal.Linear"/>) of the joint (ln θ, μ) likelihood without a
/// selection cut or isophotal sizes, on flat per-object arrays: each object once at its posterior mean z̄, bivariate Gaussian with
/// covariance C + s² g gᵀ (the formulas and their sources are in <see cref="SurveyJointLikelihood"/>'s remarks, whose per-object path
/// this reproduces).
/// </summary>
/// <remarks>
/// <para>Blocks of objects. Per block: grid distances (ln D_A and its slope through the value and slope stencils,
/// <see cref="RedshiftGridSlope"/>) and each object's cell and group coefficients gathered into block rows; then one pass in
/// System.Numerics vectors (<c>Vector.Log</c> for ln det) gives the value and the weighted per-object partials ∂ℓ/∂m_t, ∂ℓ/∂m_μ,
/// ∂ℓ/∂V_t, ∂ℓ/∂V_μ, ∂ℓ/∂C, ∂ℓ/∂g_t, ∂ℓ/∂g_μ; a scalar pass sums them per cell and group (and onto the grid nodes). The caller maps the
/// sums to the free parameters once per call.</para>
/// </remarks>
internal sealed class LinearisedJointKernel
{
    private const double HalfLn2Pi = 0.91893853320467274;
    private const double Ln10 = 2.302585092994046, K25 = 2.5 / Ln10, SbMagPerLn = -2.5 / Ln10;
    private static readonly double LnKpcPerMpc = Math.Log(1e-3);
    private const int Block = 256;
    private const int Rows = 8, PartRows = 7;
    private static readonly int Lanes = LinearisedDistances.Lanes;

    // Per object, padded by one vector (padding: weight 0): ln θ, μ − K − A, their variances, s², ln(1+z̄), 1/(1+z̄), C, weight;
    // fixed cosmology: ln D_A(z̄) and d ln D_A/dz.
    private readonly double[] _yt, _ym, _vt, _vm, _zVar, _x, _ix, _w;
    private readonly double[]? _c;
    private readonly LinearisedDistances _dist;
    private readonly int[] _group, _cell;
    private readonly double _lumZSlope, _lnPivot;

    /// <summary>The parameters of one evaluation: per cell ln R0 and μ0, per group a, σ (of ln θ), β, n − b, s_μ, γ; κ, e.</summary>
    public readonly ref struct Point(ReadOnlySpan<double> lnR0, ReadOnlySpan<double> mu0, ReadOnlySpan<double> a, ReadOnlySpan<double> sig,
        ReadOnlySpan<double> beta, ReadOnlySpan<double> nb, ReadOnlySpan<double> sm, ReadOnlySpan<double> gam, double kappa, double eExp)
    {
        /// <summary>ln R0 per cell (kpc).</summary>
        public ReadOnlySpan<double> LnR0 { get; } = lnR0;
        /// <summary>μ0 per cell.</summary>
        public ReadOnlySpan<double> Mu0 { get; } = mu0;
        /// <summary>Size evolution per group (0 for binned evolution).</summary>
        public ReadOnlySpan<double> A { get; } = a;
        /// <summary>σ_g = ln10 · scatter_dex per group.</summary>
        public ReadOnlySpan<double> Sig { get; } = sig;
        /// <summary>Size–luminosity slope per group (0 without a relation).</summary>
        public ReadOnlySpan<double> Beta { get; } = beta;
        /// <summary>n − b per group (dimming exponent minus SB evolution).</summary>
        public ReadOnlySpan<double> Nb { get; } = nb;
        /// <summary>s_μ per group.</summary>
        public ReadOnlySpan<double> Sm { get; } = sm;
        /// <summary>γ (sb_luminosity_slope) per group (0 without a relation).</summary>
        public ReadOnlySpan<double> Gam { get; } = gam;
        /// <summary>κ = kormendy_slope / ln 10 (0 without the size–SB relation).</summary>
        public double Kappa { get; } = kappa;
        /// <summary>Distance exponent e of ln D_L = ln D_A + e ln(1+z).</summary>
        public double EExp { get; } = eExp;
    }

    /// <summary>Weighted partial sums (added to): per cell Σ ∂/∂ln R̄ and Σ ∂/∂μ0; per group Σ ∂/∂a, Σ (∂/∂m_μ ln(1+z) + ∂/∂g_μ/(1+z))
    /// (b and the dimming), Σ (D_Vt + κ² D_Vμ + κ D_C), Σ D_Vμ, Σ ∂/∂β, Σ ∂/∂γ; Σ ∂/∂κ and Σ ∂/∂e.</summary>
    public sealed class Partials(int cells, int groups)
    {
        /// <summary>Per cell Σ ∂ℓ/∂ln R̄.</summary>
        public double[] Size { get; } = new double[cells];
        /// <summary>Per cell Σ ∂ℓ/∂μ0.</summary>
        public double[] Mu0 { get; } = new double[cells];
        /// <summary>Per group Σ ∂ℓ/∂a.</summary>
        public double[] A { get; } = new double[groups];
        /// <summary>Per group Σ ∂ℓ/∂(n − b) · ln10/2.5.</summary>
        public double[] Dimming { get; } = new double[groups];
        /// <summary>Per group Σ (D_Vt + κ² D_Vμ + κ D_C) (∂/∂σ = 2σ times it).</summary>
        public double[] Sig2 { get; } = new double[groups];
        /// <summary>Per group Σ D_Vμ (∂/∂s_μ = 2 s_μ times it).</summary>
        public double[] Sm2 { get; } = new double[groups];
        /// <summary>Per group Σ ∂ℓ/∂β.</summary>
        public double[] Beta { get; } = new double[groups];
        /// <summary>Per group Σ ∂ℓ/∂γ.</summary>
        public double[] Gam { get; } = new double[groups];
        /// <summary>Σ ∂ℓ/∂κ.</summary>
        public double Kappa { get; set; }
        /// <summary>Σ ∂ℓ/∂e.</summary>
        public double EExp { get; set; }
    }

    /// <summary>Binds the per-object arrays (object i at its posterior mean z̄_i; see <see cref="LinearisedRedshiftKernel"/> for the
    /// distance arguments).</summary>
    public LinearisedJointKernel(double[] lnTheta, double[] muCorrected, double[] varLnTheta, double[] varMu, double[] zVar, int[] group, int[] cell,
        double[]? weight, double[] ln1pz, double[] lnz, double[]? lumBase, double lumZSlope, double lnPivot,
        double[]? lnDaFixed, double[]? slopeFixed, RedshiftGrid? grid, double[]? slopeWeights)
    {
        int n = lnTheta.Length;
        _yt = LinearisedDistances.Padded(lnTheta, n, 0);
        _ym = LinearisedDistances.Padded(muCorrected, n, 0);
        _vt = LinearisedDistances.Padded(varLnTheta, n, 1);
        _vm = LinearisedDistances.Padded(varMu, n, 1);
        _zVar = LinearisedDistances.Padded(zVar, n, 0);
        _x = LinearisedDistances.Padded(ln1pz, n, 0);
        _ix = LinearisedDistances.Padded(ln1pz.Select(v => Math.Exp(-v)).ToArray(), n, 0);
        _w = LinearisedDistances.Padded(weight ?? Enumerable.Repeat(1.0, n).ToArray(), n, 0);
        _c = lumBase is null ? null : LinearisedDistances.Padded(lumBase, n, 0);
        _lumZSlope = lumZSlope;
        _lnPivot = lnPivot;
        _group = group;
        _cell = cell;
        _dist = new LinearisedDistances(n, lnz, lnDaFixed, slopeFixed, grid, slopeWeights);
    }


    /// <summary>Σ_i w_i ln p_i over objects [start, end); with <paramref name="partials"/>, their sums (added to) and −Σ w ∂/∂(grid node
    /// value) into <paramref name="nodeAdjoint"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double Sum(in Point p, double[]? grid, int start, int end, Partials? partials, double[]? nodeAdjoint)
    {
        bool grad = partials is not null, lum = _c is not null, onGrid = _dist.OnGrid;
        int size = Block + Lanes;
        var pool = System.Buffers.ArrayPool<double>.Shared;
        double[]? daBuf = onGrid ? pool.Rent(size) : null, slBuf = onGrid ? pool.Rent(size) : null;
        double[] coef = pool.Rent(Rows * size);
        double[]? parts = grad ? pool.Rent(PartRows * size) : null;
        var lane = LinearisedDistances.LaneIndex();
        var zero = Vector<double>.Zero;
        Vector<double> accT = zero, accW = zero;
        var vKap = new Vector<double>(p.Kappa);
        var vKap2 = vKap * vKap;
        var vE2 = new Vector<double>(2 * p.EExp);
        var vEs = new Vector<double>(2 * p.EExp - _lumZSlope);
        var vPiv = new Vector<double>(_lnPivot);
        var vK25 = new Vector<double>(K25);
        var vSbm = new Vector<double>(SbMagPerLn);
        var vKpc = new Vector<double>(LnKpcPerMpc);
        var two = new Vector<double>(2.0);
        var half = new Vector<double>(0.5);
        try
        {
            for (int b0 = start; b0 < end; b0 += Block)
            {
                int nb = Math.Min(end, b0 + Block) - b0, padded = (nb + Lanes - 1) / Lanes * Lanes;
                _dist.Fill(grid, b0, nb, padded, daBuf, slBuf);
                Coefficients(p, b0, nb, padded, coef, size);
                ReadOnlySpan<double> da = _dist.LnDa(b0, daBuf), dsl = _dist.Slope(b0, slBuf);
                var yt = _yt.AsSpan(b0); var ym = _ym.AsSpan(b0); var vt0 = _vt.AsSpan(b0); var vm0 = _vm.AsSpan(b0); var zv = _zVar.AsSpan(b0);
                var x = _x.AsSpan(b0); var ix = _ix.AsSpan(b0); var w = _w.AsSpan(b0);
                var c = lum ? _c.AsSpan(b0) : default;
                for (int t = 0; t < padded; t += Lanes)
                {
                    var lnR0 = LinearisedDistances.Load(coef, t); var mu0 = LinearisedDistances.Load(coef, size + t); var va = LinearisedDistances.Load(coef, 2 * size + t); var sig2 = LinearisedDistances.Load(coef, 3 * size + t);
                    var vb = LinearisedDistances.Load(coef, 4 * size + t); var vnb = LinearisedDistances.Load(coef, 5 * size + t); var sm2 = LinearisedDistances.Load(coef, 6 * size + t); var vg = LinearisedDistances.Load(coef, 7 * size + t);
                    var vx = LinearisedDistances.Load(x, t); var vix = LinearisedDistances.Load(ix, t); var vda = LinearisedDistances.Load(da, t); var vs = LinearisedDistances.Load(dsl, t); var vz = LinearisedDistances.Load(zv, t);
                    Vector<double> lnLum = zero, lumSlope = zero;
                    if (lum)
                    {
                        lnLum = LinearisedDistances.Load(c, t) + two * vda + vE2 * vx;
                        lumSlope = vEs * vix + two * vs;
                    }
                    var lnSize = lnR0 + va * vx + vb * lnLum;
                    var sizeSlope = va * vix + vb * lumSlope;
                    var mt = lnSize + vKpc - vda;
                    var mm = mu0 + vK25 * vnb * vx + vKap * (lnSize - vPiv) + vSbm * vg * lnLum;
                    var gt = sizeSlope - vs;
                    var gm = vK25 * vnb * vix + vKap * sizeSlope + vSbm * vg * lumSlope;
                    var cv = vKap * sig2 + vz * gt * gm;
                    var vt = LinearisedDistances.Load(vt0, t) + sig2 + vz * gt * gt;
                    var vm = LinearisedDistances.Load(vm0, t) + sm2 + vKap2 * sig2 + vz * gm * gm;
                    var det = vt * vm - cv * cv;
                    var idet = Vector<double>.One / det;
                    var rt = LinearisedDistances.Load(yt, t) - mt;
                    var rm = LinearisedDistances.Load(ym, t) - mm;
                    var at = (vm * rt - cv * rm) * idet;
                    var am = (vt * rm - cv * rt) * idet;
                    var wv = Vector.ConditionalSelect(Vector.LessThan(lane, new Vector<double>(nb - t)), LinearisedDistances.Load(w, t), zero);
                    var on = ~Vector.Equals(wv, zero);
                    // rᵀ C⁻¹ r = a_t r_t + a_μ r_μ.
                    accT += Vector.ConditionalSelect(on, wv * (at * rt + am * rm + Vector.Log(det)), zero);
                    accW += wv;
                    if (!grad) continue;
                    var dvt = half * (at * at - vm * idet);
                    var dvm = half * (am * am - vt * idet);
                    var dc = at * am + cv * idet;
                    var pt = vz * (two * dvt * gt + dc * gm);
                    var pm = vz * (two * dvm * gm + dc * gt);
                    var parts0 = parts!;
                    LinearisedDistances.Store(Vector.ConditionalSelect(on, wv * at, zero), parts0, t);
                    LinearisedDistances.Store(Vector.ConditionalSelect(on, wv * am, zero), parts0, size + t);
                    LinearisedDistances.Store(Vector.ConditionalSelect(on, wv * dvt, zero), parts0, 2 * size + t);
                    LinearisedDistances.Store(Vector.ConditionalSelect(on, wv * dvm, zero), parts0, 3 * size + t);
                    LinearisedDistances.Store(Vector.ConditionalSelect(on, wv * dc, zero), parts0, 4 * size + t);
                    LinearisedDistances.Store(Vector.ConditionalSelect(on, wv * pt, zero), parts0, 5 * size + t);
                    LinearisedDistances.Store(Vector.ConditionalSelect(on, wv * pm, zero), parts0, 6 * size + t);
                }
                if (grad) Scatter(p, b0, nb, da, dsl, parts!, size, partials!, nodeAdjoint);
            }
        }
        finally
        {
            if (daBuf is not null) pool.Return(daBuf);
            if (slBuf is not null) pool.Return(slBuf);
            pool.Return(coef);
            if (parts is not null) pool.Return(parts);
        }
        return -0.5 * Vector.Sum(accT) - 2 * HalfLn2Pi * Vector.Sum(accW);
    }

    // Each object's coefficients (ln R0, μ0 of its cell; a, σ², β, n − b, s_μ², γ of its group) into eight rows of length size (lanes past nb: cell 0).
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void Coefficients(in Point p, int b0, int nb, int padded, double[] coef, int size)
    {
        for (int t = 0; t < padded; t++)
        {
            int i = b0 + t, g = t < nb ? _group[i] : 0, q = t < nb ? _cell[i] : 0;
            double s = p.Sig[g], m = p.Sm[g];
            coef[t] = p.LnR0[q];
            coef[size + t] = p.Mu0[q];
            coef[2 * size + t] = p.A[g];
            coef[3 * size + t] = s * s;
            coef[4 * size + t] = p.Beta[g];
            coef[5 * size + t] = p.Nb[g];
            coef[6 * size + t] = m * m;
            coef[7 * size + t] = p.Gam[g];
        }
    }

    // The stored weighted partials of objects [b0, b0 + nb): sums per cell and group, and the grid nodes' adjoint (value and slope stencils).
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void Scatter(in Point p, int b0, int nb, ReadOnlySpan<double> da, ReadOnlySpan<double> dsl, double[] parts, int size, Partials s, double[]? nodeAdjoint)
    {
        double kap = p.Kappa, e = p.EExp, es = 2 * e - _lumZSlope;
        bool lum = _c is not null;
        var idx = _dist.Grid?.Index;
        var gw = _dist.Grid?.Weights;
        var sw = _dist.SlopeWeights;
        double dKap = 0, dE = 0;
        for (int t = 0; t < nb; t++)
        {
            int i = b0 + t, g = _group[i], q = _cell[i];
            double dt = parts[t], dm = parts[size + t], dvt = parts[2 * size + t], dvm = parts[3 * size + t], dc = parts[4 * size + t];
            double pt = parts[5 * size + t], pm = parts[6 * size + t];
            double x = _x[i], ix = _ix[i], beta = p.Beta[g], gam = p.Gam[g], sig2 = p.Sig[g] * p.Sig[g];
            double lnLum = lum ? _c![i] + 2 * da[t] + 2 * e * x : 0, lumSlope = lum ? es * ix + 2 * dsl[t] : 0;
            double lnSize = p.LnR0[q] + p.A[g] * x + beta * lnLum, sizeSlope = p.A[g] * ix + beta * lumSlope;
            double dSize = dt + kap * dm, pSize = pt + kap * pm;
            s.Size[q] += dSize;
            s.Mu0[q] += dm;
            s.A[g] += dSize * x + pSize * ix;
            s.Dimming[g] += dm * x + pm * ix;
            s.Sig2[g] += dvt + kap * kap * dvm + kap * dc;
            s.Sm2[g] += dvm;
            if (lum)
            {
                s.Beta[g] += dSize * lnLum + pSize * lumSlope;
                s.Gam[g] += SbMagPerLn * (dm * lnLum + pm * lumSlope);
                dE += 2 * (beta * dSize + SbMagPerLn * gam * dm) * x + 2 * (beta * pSize + SbMagPerLn * gam * pm) * ix;
            }
            dKap += dm * (lnSize - _lnPivot) + pm * sizeSlope + sig2 * (2 * kap * dvm + dc);
            if (nodeAdjoint is not null && idx is not null)
            {
                double f = 2 * (kap * beta + SbMagPerLn * gam), k2 = 2 * beta - 1;
                double fv = -(dt * k2 + f * dm), fs = -(pt * k2 + f * pm);
                int j = idx![i], k = 4 * i;
                nodeAdjoint[j] += fv * gw![k] + fs * sw![k];
                nodeAdjoint[j + 1] += fv * gw[k + 1] + fs * sw[k + 1];
                nodeAdjoint[j + 2] += fv * gw[k + 2] + fs * sw[k + 2];
                nodeAdjoint[j + 3] += fv * gw[k + 3] + fs * sw[k + 3];
            }
        }
        s.Kappa += dKap;
        s.EExp += dE;
    }



}
