namespace SizeTest.Inference.Survey;

/// <summary>
/// A photometric-redshift marginal of the log-normal size likelihood without a size cut, on flat per-object arrays bound once:
/// the quadrature (<see cref="RedshiftQuadratureKernel"/>) or the linearised effective variance (<see cref="LinearisedRedshiftKernel"/>).
/// <see cref="SurveySizeLikelihood"/> maps the partial sums to the free parameters once per slice.
/// </summary>
internal interface IRedshiftMarginalKernel
{
    /// <summary>
    /// Σ_i w_i ln p_i over objects [start, end) and, when <paramref name="dCell"/> is not empty, the partials: per (group, bin) cell
    /// Σ w ∂/∂m (∂m/∂ln R0 = 1), per group Σ w ∂/∂a (<paramref name="dGroupX"/>), Σ w ∂/∂σ_g (<paramref name="dGroupSig"/>),
    /// Σ w ∂/∂β (<paramref name="dGroupLum"/>, with a relation), Σ w ∂/∂e (<paramref name="dExp"/>), and −Σ w ∂/∂(ln D_A − ln z at grid
    /// node k) into <paramref name="nodeAdjoint"/> (grid distances). The partial spans are added to, not cleared.
    /// </summary>
    /// <param name="lnR0">ln R0 + ln 10⁻³ per cell.</param>
    /// <param name="a">Size evolution per group (0 for binned evolution).</param>
    /// <param name="beta">Size–luminosity slope per group (0 without a relation).</param>
    /// <param name="sig">Intrinsic scatter σ_g of ln θ per group.</param>
    /// <param name="eExp">Distance exponent e of ln D_L = ln D_A + e ln(1+z).</param>
    /// <param name="grid">The D_A grid's node values ln D_A − ln z (null for a fixed cosmology).</param>
    /// <param name="start">First object.</param>
    /// <param name="end">One past the last object.</param>
    /// <param name="dCell">Partials per cell (empty: value only).</param>
    /// <param name="dGroupX">Partials of a per group.</param>
    /// <param name="dGroupSig">Partials of σ_g per group.</param>
    /// <param name="dGroupLum">Partials of β per group.</param>
    /// <param name="dExp">Partial of e.</param>
    /// <param name="nodeAdjoint">The grid nodes' adjoint, or null.</param>
    double Sum(ReadOnlySpan<double> lnR0, ReadOnlySpan<double> a, ReadOnlySpan<double> beta, ReadOnlySpan<double> sig, double eExp,
        double[]? grid, int start, int end,
        Span<double> dCell, Span<double> dGroupX, Span<double> dGroupSig, Span<double> dGroupLum, ref double dExp, double[]? nodeAdjoint);
}
