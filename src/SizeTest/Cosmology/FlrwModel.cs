using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;

namespace SizeTest.Cosmology;

/// <summary>
/// Base of every expanding (FLRW) world model. A model supplies only its inverse Hubble
/// function 1/E(z), E = H(z)/H0, and its density parameters; every distance and time is
/// written once here from it (Hogg 1999, astro-ph/9905116, §§3–7 and eq. 30):
/// D_C = D_H ∫0^z dz′/E(z′); D_M = D_H/√Ωk · sinh(√Ωk D_C/D_H) (Ωk &gt; 0), D_C (Ωk = 0),
/// D_H/√|Ωk| · sin(√|Ωk| D_C/D_H) (Ωk &lt; 0); D_A = D_M/(1+z); D_L = (1+z) D_M;
/// t_L = t_H ∫0^z dz′/[(1+z′)E(z′)]; age = the same integral to z = ∞; with D_H = c/H0 and
/// t_H = 1/H0.
/// </summary>
/// <remarks>
/// <para>Valid redshifts: finite, 0 ≤ z ≤ <see cref="MaxRedshift"/>; others throw
/// <see cref="ArgumentOutOfRangeException"/>. At z = 0 every distance and time is 0.</para>
/// <para>Fast path: scalar and vectorised distances evaluate piecewise Chebyshev tables of the
/// comoving integral χ(x) = ∫0^x (1+z)/E dx in x = ln(1+z) (and of the curvature-mapped
/// D_M/D_H for curved models, and of the lookback integral), built lazily on first use
/// and only as far in z as needed. Cost: a few µs to build the tables to z ≈ 6, then
/// ~10–20 ns per redshift in any order. Accuracy ≤ 1e-12 relative to the adaptive
/// quadrature of <see cref="ComovingDistanceByQuadrature"/> (see DEVELOPERS.md). Subclasses
/// with a closed form set <see cref="HasClosedForm"/> and override the integrals.</para>
/// <para>Instances are immutable apart from the lazily built tables, which are published
/// atomically: concurrent use from several threads is safe.</para>
/// </remarks>
public abstract class FlrwModel : IWorldModel
{
    /// <summary>Largest redshift accepted by the distance methods.</summary>
    public const double MaxRedshift = 1e5;

    private const double InitialPanelWidth = 0.25;
    private const int MaxHalvings = 6;
    // Integral tables: 10 nodes → degree-10 running integral; interpolants: 11 nodes → degree 10.
    // Both give 11 coefficients per panel, which the unrolled hot loop assumes.
    private const int IntegralNodes = 10;
    private const int TransverseNodes = 11;
    internal const int Stride = 11;
    private const double TailTolerance = 1e-10;

    private readonly IReadOnlyDictionary<string, double> _parameterValues;
    private volatile ChebyshevPanelTable? _comoving;
    private volatile ChebyshevPanelTable? _transverse;
    private volatile ChebyshevPanelTable? _lookback;

    /// <summary>Sets the common FLRW quantities.</summary>
    /// <param name="name">Family name (<c>lcdm</c>, ...).</param>
    /// <param name="hubbleConstant">H0 in km/s/Mpc, &gt; 0.</param>
    /// <param name="omegaMatter">Ωm today.</param>
    /// <param name="omegaRadiation">Ωr today (photons + massless neutrinos).</param>
    /// <param name="omegaDarkEnergy">Ω of the dark energy (Λ or w fluid) today.</param>
    /// <param name="parameterValues">The family parameter values, by name.</param>
    /// <param name="omegaCurvature">Ωk; when null, 1 − Ωm − Ωr − Ω_DE.</param>
    protected FlrwModel(string name, double hubbleConstant, double omegaMatter, double omegaRadiation, double omegaDarkEnergy,
        IReadOnlyDictionary<string, double> parameterValues, double? omegaCurvature = null)
    {
        if (!(hubbleConstant > 0) || !double.IsFinite(hubbleConstant))
            throw new ArgumentException($"h0 must be a positive number of km/s/Mpc; got {hubbleConstant}.");
        Name = name;
        HubbleConstant = hubbleConstant;
        OmegaMatter = omegaMatter;
        OmegaRadiation = omegaRadiation;
        OmegaDarkEnergy = omegaDarkEnergy;
        OmegaCurvature = omegaCurvature ?? 1.0 - omegaMatter - omegaRadiation - omegaDarkEnergy;
        HubbleDistance = PhysicalConstants.SpeedOfLightKmPerS / hubbleConstant;
        HubbleTime = PhysicalConstants.HubbleTimeGyrTimesH0 / hubbleConstant;
        _sqrtAbsOmegaK = Math.Sqrt(Math.Abs(OmegaCurvature));
        _parameterValues = parameterValues;
    }

    private readonly double _sqrtAbsOmegaK;

    /// <inheritdoc/>
    public string Name { get; }

    /// <inheritdoc/>
    public bool IsExpanding => true;

    /// <inheritdoc/>
    public double HubbleConstant { get; }

    /// <summary>Bolometric Tolman dimming exponent: 4 in every FLRW model (Tolman 1930).</summary>
    public double BolometricDimmingExponent => 4.0;

    /// <inheritdoc/>
    public IReadOnlyDictionary<string, double> ParameterValues => _parameterValues;

    /// <summary>Matter density parameter Ωm today.</summary>
    public double OmegaMatter { get; }

    /// <summary>Radiation density parameter Ωr today (photons and massless neutrinos).</summary>
    public double OmegaRadiation { get; }

    /// <summary>Dark-energy density parameter today (ΩΛ for a cosmological constant).</summary>
    public double OmegaDarkEnergy { get; }

    /// <summary>Curvature density parameter Ωk = 1 − Ωm − Ωr − Ω_DE (Ωk &gt; 0 is open).</summary>
    public double OmegaCurvature { get; }

    /// <summary>Hubble distance D_H = c/H0 in Mpc.</summary>
    public double HubbleDistance { get; }

    /// <summary>Hubble time t_H = 1/H0 in Gyr (977.792/H0; see <see cref="PhysicalConstants.HubbleTimeGyrTimesH0"/>).</summary>
    public double HubbleTime { get; }

    /// <summary>True when a subclass computes the integrals in closed form (no tables).</summary>
    protected virtual bool HasClosedForm => false;

    /// <summary>
    /// The inverse dimensionless Hubble function 1/E(z) = H0/H(z), for z ≥ 0. Must return NaN
    /// (not throw) where E² ≤ 0. This is the only model-specific member.
    /// </summary>
    public abstract double InverseHubbleFunction(double z);

    /// <summary>Dimensionless Hubble function E(z) = H(z)/H0.</summary>
    public double HubbleFunction(double z) => 1.0 / InverseHubbleFunction(z);

    /// <inheritdoc/>
    public bool Defines(DistanceQuantity quantity) => true;

    /// <summary>Comoving integral χ(z) = ∫0^z dz′/E(z′) = D_C/D_H. Closed-form models override it.</summary>
    protected virtual double ComovingIntegral(double z)
    {
        double x = Log1P(z);
        return x < SmallX ? SmallValue(TableKind.Comoving, x) : EnsureComoving(x).Evaluate(x);
    }

    /// <summary>Lookback integral ∫0^z dz′/[(1+z′)E(z′)] = t_L/t_H. Closed-form models override it.</summary>
    protected virtual double LookbackIntegral(double z)
    {
        double x = Log1P(z);
        return x < SmallX ? SmallValue(TableKind.Lookback, x) : EnsureLookback(x).Evaluate(x);
    }

    /// <summary>Curvature mapping D_M/D_H = S_k(χ) of the comoving integral χ (Hogg 1999 eq. 16).</summary>
    public double TransverseFromComoving(double chi)
    {
        if (OmegaCurvature > 0) return Math.Sinh(_sqrtAbsOmegaK * chi) / _sqrtAbsOmegaK;
        if (OmegaCurvature < 0) return Math.Sin(_sqrtAbsOmegaK * chi) / _sqrtAbsOmegaK;
        return chi;
    }

    /// <inheritdoc/>
    public double ComovingDistance(double z)
    {
        CheckRedshift(z);
        return HubbleDistance * ComovingIntegral(z);
    }

    /// <inheritdoc/>
    public double TransverseComovingDistance(double z)
    {
        CheckRedshift(z);
        return HubbleDistance * TransverseFromComoving(ComovingIntegral(z));
    }

    /// <inheritdoc/>
    public double AngularDiameterDistance(double z) => TransverseComovingDistance(z) / (1.0 + z);

    /// <inheritdoc/>
    public double LuminosityDistance(double z) => TransverseComovingDistance(z) * (1.0 + z);

    /// <inheritdoc/>
    public double TolmanDimmingMagnitudes(double z) => TolmanDimming.Magnitudes(BolometricDimmingExponent, z);

    /// <inheritdoc/>
    public double AngularSizeArcsec(double z, double sizeKpc) => sizeKpc / 1000.0 / AngularDiameterDistance(z) * SizeTest.Foundation.Angles.AngleUnits.ArcsecPerRadian;

    /// <inheritdoc/>
    public double LookbackTime(double z)
    {
        CheckRedshift(z);
        return HubbleTime * LookbackIntegral(z);
    }

    /// <summary>
    /// Age of the universe today in Gyr, t_H ∫0^1 da/(a E) (Hogg 1999 eq. 30 to z = ∞), by
    /// adaptive quadrature in s = √a; +∞ for models without a big bang at finite time
    /// (e.g. pure de Sitter).
    /// </summary>
    public virtual double AgeGyr
    {
        get
        {
            // a = s², da/(a E) = 2 ds/(s E); the integrand vanishes at s → 0 when matter,
            // radiation or curvature dominate early; when it does not, the age is infinite.
            double early = AgeIntegrand(1e-6);
            if (early > 1e-5) return double.PositiveInfinity;
            return HubbleTime * AdaptiveQuadrature.Integrate(AgeIntegrand, 0.0, 1.0, 1e-13);
        }
    }

    private double AgeIntegrand(double s)
    {
        if (s <= 0) return 0.0;
        double z = 1.0 / (s * s) - 1.0;
        double inv = InverseHubbleFunction(z);
        return double.IsFinite(inv) ? 2.0 * inv / s : 0.0;
    }

    /// <summary>
    /// Reference D_C in Mpc by adaptive Gauss–Kronrod quadrature of (1+z)/E over x = ln(1+z)
    /// to 1e-14 relative. Slow (hundreds of calls to 1/E); for tests and checks.
    /// </summary>
    public double ComovingDistanceByQuadrature(double z)
    {
        CheckRedshift(z);
        return HubbleDistance * AdaptiveQuadrature.Integrate(x => Math.Exp(x) * InverseHubbleFunction(Math.Exp(x) - 1.0), 0.0, Log1P(z));
    }

    /// <summary>Reference D_A in Mpc from <see cref="ComovingDistanceByQuadrature"/>.</summary>
    public double AngularDiameterDistanceByQuadrature(double z)
        => HubbleDistance * TransverseFromComoving(ComovingDistanceByQuadrature(z) / HubbleDistance) / (1.0 + z);

    /// <summary>Reference lookback time in Gyr by adaptive quadrature of 1/E over x = ln(1+z).</summary>
    public double LookbackTimeByQuadrature(double z)
    {
        CheckRedshift(z);
        return HubbleTime * AdaptiveQuadrature.Integrate(x => InverseHubbleFunction(Math.Exp(x) - 1.0), 0.0, Log1P(z));
    }

    /// <inheritdoc/>
    /// <remarks>Any order and length; see the class remarks for cost. Throws
    /// <see cref="ArgumentOutOfRangeException"/> naming the first invalid redshift.</remarks>
    public void AngularDiameterDistances(ReadOnlySpan<double> z, Span<double> result) => Evaluate(z, result, Output.AngularDiameter);

    /// <summary>Line-of-sight comoving distances D_C in Mpc for many redshifts (fast path).</summary>
    public void ComovingDistances(ReadOnlySpan<double> z, Span<double> result) => Evaluate(z, result, Output.Comoving);

    /// <summary>Transverse comoving distances D_M in Mpc for many redshifts (fast path).</summary>
    public void TransverseComovingDistances(ReadOnlySpan<double> z, Span<double> result) => Evaluate(z, result, Output.Transverse);

    /// <summary>Luminosity distances D_L in Mpc for many redshifts (fast path).</summary>
    public void LuminosityDistances(ReadOnlySpan<double> z, Span<double> result) => Evaluate(z, result, Output.Luminosity);

    /// <summary>Lookback times in Gyr for many redshifts (fast path).</summary>
    public void LookbackTimes(ReadOnlySpan<double> z, Span<double> result)
    {
        double zMax = CheckAll(z, result);
        if (z.Length == 0) return;
        if (HasClosedForm)
        {
            for (int i = 0; i < z.Length; i++) result[i] = HubbleTime * LookbackIntegral(z[i]);
            return;
        }
        var table = EnsureLookback(Log1P(zMax));
        EvaluateTable(table, TableKind.Lookback, z, result, HubbleTime, divide: false, multiply: false);
    }

    private enum Output { Comoving, Transverse, AngularDiameter, Luminosity }

    private void Evaluate(ReadOnlySpan<double> z, Span<double> result, Output output)
    {
        double zMax = CheckAll(z, result);
        if (z.Length == 0) return;
        if (HasClosedForm)
        {
            for (int i = 0; i < z.Length; i++)
            {
                double chi = ComovingIntegral(z[i]);
                double dm = output == Output.Comoving ? chi : TransverseFromComoving(chi);
                double zp = 1.0 + z[i];
                result[i] = HubbleDistance * (output == Output.AngularDiameter ? dm / zp : output == Output.Luminosity ? dm * zp : dm);
            }
            return;
        }
        double xMax = Log1P(zMax);
        bool transverse = output != Output.Comoving && OmegaCurvature != 0;
        if (transverse && z.Length < TransverseTableMinimumCount && (_transverse is null || _transverse.XMax < xMax))
        {
            // Few redshifts on a curved model without a transverse table yet (the fitter's
            // case): sin/sinh per redshift is cheaper than building that table.
            EvaluateTable(EnsureComoving(xMax), TableKind.Comoving, z, result, 1.0, divide: false, multiply: false);
            for (int i = 0; i < z.Length; i++)
            {
                double dm = HubbleDistance * TransverseFromComoving(result[i]);
                double zp = 1.0 + z[i];
                result[i] = output == Output.AngularDiameter ? dm / zp : output == Output.Luminosity ? dm * zp : dm;
            }
            return;
        }
        var table = transverse ? EnsureTransverse(xMax) : EnsureComoving(xMax);
        EvaluateTable(table, transverse ? TableKind.Transverse : TableKind.Comoving, z, result, HubbleDistance, output == Output.AngularDiameter, output == Output.Luminosity);
    }

    private static double CheckAll(ReadOnlySpan<double> z, Span<double> result)
    {
        if (result.Length != z.Length)
            throw new ArgumentException($"The result span has length {result.Length} but there are {z.Length} redshifts.", nameof(result));
        double zMax = 0.0;
        for (int i = 0; i < z.Length; i++)
        {
            double zi = z[i];
            if (!(zi >= 0.0 && zi <= MaxRedshift))
                throw new ArgumentOutOfRangeException(nameof(z), zi, $"Redshift at index {i} must be finite and in [0, {MaxRedshift:G}] for an FLRW model; got {zi}.");
            if (zi > zMax) zMax = zi;
        }
        return zMax;
    }

    /// <summary>
    /// The hot loop: x = ln(1+z) with the log1p correction, direct panel index, the panel's
    /// degree-10 polynomial in t ∈ [−1, 1] by Estrin's scheme (short dependency chains, so
    /// consecutive redshifts overlap in the pipeline), then D = scale · T(x) · (1+z)^(−1, 0, +1).
    /// Four redshifts at a time share one vector logarithm.
    /// </summary>
    private void EvaluateTable(ChebyshevPanelTable table, TableKind kind, ReadOnlySpan<double> z, Span<double> result, double scale, bool divide, bool multiply)
    {
        if (table.Stride != Stride) throw new InvalidOperationException("Table stride does not match the evaluator.");
        int i = 0;
        if (!DisableVectorPath && Avx2.IsSupported && Fma.IsSupported && z.Length >= 4)
            i = EvaluateTableAvx2(table, kind, z, result, scale, divide, multiply);
        int last = table.PanelCount - 1;
        double invH = table.InversePanelWidth;
        ref double c0 = ref MemoryMarshal.GetReference(table.Monomials);
        for (; i < z.Length; i++)
        {
            double zi = z[i];
            double xi = Log1P(zi);
            double value = scale * (xi < SmallX ? SmallValue(kind, xi) : Panel(ref c0, xi, invH, last));
            result[i] = divide ? value / (1.0 + zi) : multiply ? value * (1.0 + zi) : value;
        }
    }

    /// <summary>
    /// AVX2 version of the hot loop, four redshifts per step: vector log, 32-bit panel
    /// indices, one gather per coefficient, Estrin's scheme in vector FMAs. Returns the
    /// number of elements done (a multiple of 4); the caller finishes the rest. Compiled optimised at once: a fit's set-up calls it a few
    /// times only, which tiered compilation would leave in unoptimised code.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private unsafe int EvaluateTableAvx2(ChebyshevPanelTable table, TableKind kind, ReadOnlySpan<double> z, Span<double> result, double scale, bool divide, bool multiply)
    {
        int n = z.Length & ~3;
        var one = Vector256<double>.One;
        var two = Vector256.Create(2.0);
        var invH = Vector256.Create(table.InversePanelWidth);
        var scaleV = Vector256.Create(scale);
        var small = Vector256.Create(SmallX);
        var lastV = Vector128.Create(table.PanelCount - 1);
        var strideV = Vector128.Create(Stride);
        fixed (double* cp = table.Monomials)
        fixed (double* zp = z)
        fixed (double* rp = result)
        {
            for (int i = 0; i < n; i += 4)
            {
                var zv = Avx.LoadVector256(zp + i);
                var u = one + zv;
                var inv = one / u;
                var x = Vector256.Log(u) + (zv - (u - one)) * inv;
                if (Vector256.LessThanAny(x, small))
                {
                    for (int l = 0; l < 4; l++)
                    {
                        double zi = zp[i + l], xi = Log1P(zi);
                        double value = scale * (xi < SmallX ? SmallValue(kind, xi) : Panel(ref *cp, xi, table.InversePanelWidth, table.PanelCount - 1));
                        rp[i + l] = divide ? value / (1.0 + zi) : multiply ? value * (1.0 + zi) : value;
                    }
                    continue;
                }
                var v = x * invH;
                var j = Sse41.Min(Avx.ConvertToVector128Int32WithTruncation(v), lastV);
                var t = Fma.MultiplyAdd(two, v - Avx.ConvertToVector256Double(j), -one);
                var idx = Sse41.MultiplyLow(j, strideV);
                var t2 = t * t;
                var t4 = t2 * t2;
                var t8 = t4 * t4;
                var q0 = Fma.MultiplyAdd(Avx2.GatherVector256(cp + 1, idx, 8), t, Avx2.GatherVector256(cp, idx, 8));
                var q1 = Fma.MultiplyAdd(Avx2.GatherVector256(cp + 3, idx, 8), t, Avx2.GatherVector256(cp + 2, idx, 8));
                var q2 = Fma.MultiplyAdd(Avx2.GatherVector256(cp + 5, idx, 8), t, Avx2.GatherVector256(cp + 4, idx, 8));
                var q3 = Fma.MultiplyAdd(Avx2.GatherVector256(cp + 7, idx, 8), t, Avx2.GatherVector256(cp + 6, idx, 8));
                var q4 = Fma.MultiplyAdd(Avx2.GatherVector256(cp + 9, idx, 8), t, Avx2.GatherVector256(cp + 8, idx, 8));
                var r0 = Fma.MultiplyAdd(q1, t2, q0);
                var r1 = Fma.MultiplyAdd(q3, t2, q2);
                var r2 = Fma.MultiplyAdd(Avx2.GatherVector256(cp + 10, idx, 8), t2, q4);
                var p = Fma.MultiplyAdd(r2, t8, Fma.MultiplyAdd(r1, t4, r0)) * scaleV;
                if (divide) p *= inv;
                else if (multiply) p *= u;
                Avx.Store(rp + i, p);
            }
        }
        return n;
    }

    /// <summary>Below this many redshifts a curved model maps χ by sin/sinh per redshift instead of building the D_M table.</summary>
    private const int TransverseTableMinimumCount = 4096;

    /// <summary>For benchmarks and tests: forces the scalar hot loop on the calling thread only. Per thread because the
    /// two loops agree to ~1e-15 relative, not bit for bit, and tests running meanwhile on other threads compare results
    /// bit for bit (the rank-invariance test once failed in the last digit while this was a process-wide switch).</summary>
    [ThreadStatic]
    internal static bool DisableVectorPath;

    private enum TableKind { Comoving, Transverse, Lookback }

    /// <summary>Below this x = ln(1+z) the tables are bypassed for a direct 6-point Gauss–Legendre rule.</summary>
    private const double SmallX = 1e-3;

    private static readonly double[] GaussNodes = [-0.9324695142031521, -0.6612093864662645, -0.2386191860831969, 0.2386191860831969, 0.6612093864662645, 0.9324695142031521];
    private static readonly double[] GaussWeights = [0.1713244923791704, 0.3607615730481386, 0.4679139345726910, 0.4679139345726910, 0.3607615730481386, 0.1713244923791704];

    /// <summary>
    /// Near z = 0 the tables lose relative accuracy (the value is a small difference of panel
    /// sums), so for x &lt; 1e-3 the integral is taken directly with 6-point Gauss–Legendre
    /// (error ~ x¹³ f⁽¹²⁾, far below rounding); exactly 0 at z = 0.
    /// </summary>
    [MethodImpl(MethodImplOptions.NoInlining)]
    private double SmallValue(TableKind kind, double x)
    {
        if (x <= 0) return 0.0;
        double half = 0.5 * x, sum = 0.0;
        for (int k = 0; k < GaussNodes.Length; k++)
        {
            double s = half * (GaussNodes[k] + 1.0);
            sum += GaussWeights[k] * (kind == TableKind.Lookback ? LookbackIntegrand(s) : ComovingIntegrand(s));
        }
        sum *= half;
        return kind == TableKind.Transverse ? TransverseFromComoving(sum) : sum;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static double Panel(ref double c0, double x, double invH, int last)
    {
        double v = x * invH;
        int j = (int)v;
        if (j > last) j = last;
        double t = 2.0 * (v - j) - 1.0;
        ref double c = ref Unsafe.Add(ref c0, j * Stride);
        double t2 = t * t, t4 = t2 * t2, t8 = t4 * t4;
        double q0 = Math.FusedMultiplyAdd(Unsafe.Add(ref c, 1), t, c);
        double q1 = Math.FusedMultiplyAdd(Unsafe.Add(ref c, 3), t, Unsafe.Add(ref c, 2));
        double q2 = Math.FusedMultiplyAdd(Unsafe.Add(ref c, 5), t, Unsafe.Add(ref c, 4));
        double q3 = Math.FusedMultiplyAdd(Unsafe.Add(ref c, 7), t, Unsafe.Add(ref c, 6));
        double q4 = Math.FusedMultiplyAdd(Unsafe.Add(ref c, 9), t, Unsafe.Add(ref c, 8));
        double r0 = Math.FusedMultiplyAdd(q1, t2, q0);
        double r1 = Math.FusedMultiplyAdd(q3, t2, q2);
        double r2 = Math.FusedMultiplyAdd(Unsafe.Add(ref c, 10), t2, q4);
        return Math.FusedMultiplyAdd(r2, t8, Math.FusedMultiplyAdd(r1, t4, r0));
    }

    /// <summary>ln(1+z) accurate for small z (log of the rounded 1+z plus the first-order correction).</summary>
    internal static double Log1P(double z)
    {
        double u = 1.0 + z;
        return Math.Log(u) + (z - (u - 1.0)) / u;
    }

    private void CheckRedshift(double z)
    {
        if (!(z >= 0.0 && z <= MaxRedshift))
            throw new ArgumentOutOfRangeException(nameof(z), z, $"Redshift must be finite and in [0, {MaxRedshift:G}] for an FLRW model; got {z}.");
    }

    // ---- lazily built tables ------------------------------------------------------------

    private double ComovingIntegrand(double x)
    {
        double ez = Math.Exp(x);
        return ez * CheckedInverse(ez - 1.0);
    }

    private double LookbackIntegrand(double x) => CheckedInverse(Math.Exp(x) - 1.0);

    private double CheckedInverse(double z)
    {
        double inv = InverseHubbleFunction(z);
        if (!double.IsFinite(inv))
            throw new ArgumentException($"World model '{Name}' with {Describe()} has no big bang: H(z)² ≤ 0 near z = {z:G4}, so no light reaches us from beyond it.");
        return inv;
    }

    /// <summary>Parameter values as "name = value, ..." for messages.</summary>
    protected string Describe() => string.Join(", ", _parameterValues.Select(p => FormattableString.Invariant($"{p.Key} = {p.Value:G6}")));

    internal ChebyshevPanelTable EnsureComoving(double x)
    {
        var table = _comoving;
        if (table is null || table.XMax < x)
        {
            table = BuildOrExtend(table, ComovingIntegrand, x, IntegralNodes, integrate: true);
            _comoving = table;
        }
        return table;
    }

    private ChebyshevPanelTable EnsureLookback(double x)
    {
        var table = _lookback;
        if (table is null || table.XMax < x)
        {
            table = BuildOrExtend(table, LookbackIntegrand, x, IntegralNodes, integrate: true);
            _lookback = table;
        }
        return table;
    }

    internal ChebyshevPanelTable EnsureTransverse(double x)
    {
        var table = _transverse;
        if (table is null || table.XMax < x)
        {
            var comoving = EnsureComoving(x);
            // The interpolant must not reach past the comoving table; start it with the same width.
            double h = table?.PanelWidth ?? comoving.PanelWidth;
            table = BuildOrExtend(table, xx => TransverseFromComoving(EnsureComoving(xx).Evaluate(xx)), x, TransverseNodes, integrate: false, h);
            _transverse = table;
        }
        return table;
    }

    /// <summary>
    /// Builds (or extends) a table to cover x, halving the panel width while the Chebyshev
    /// tail bound exceeds <see cref="TailTolerance"/> (at most <see cref="MaxHalvings"/> times).
    /// </summary>
    private static ChebyshevPanelTable BuildOrExtend(ChebyshevPanelTable? existing, Func<double, double> f, double x, int nodes, bool integrate, double? width = null)
    {
        if (existing is not null)
        {
            int count = (int)(x * existing.InversePanelWidth) + 2;
            var extended = existing.ExtendedTo(f, count, integrate);
            if (extended.TailRatio <= TailTolerance || existing.PanelWidth <= InitialPanelWidth / (1 << MaxHalvings)) return extended;
        }
        double h = Math.Min(width ?? InitialPanelWidth, existing?.PanelWidth ?? InitialPanelWidth);
        ChebyshevPanelTable built;
        for (int halving = 0; ; halving++)
        {
            int count = (int)(x / h) + 2;
            built = integrate ? ChebyshevPanelTable.Integral(f, h, nodes, count) : ChebyshevPanelTable.Interpolant(f, h, nodes, count);
            if (built.TailRatio <= TailTolerance || halving >= MaxHalvings) break;
            h *= 0.5;
        }
        return built;
    }
}
