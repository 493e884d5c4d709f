using System.Buffers;
using SizeTest.Cosmology;

namespace SizeTest.Inference.Likelihood;

/// <summary>
/// The world-model terms of the likelihood: ln D_A per object and the bolometric dimming exponent n, and their
/// derivatives with respect to the free cosmological parameters.
/// </summary>
/// <remarks>
/// <para>Fixed cosmology: exact D_A per object, computed once at bind time; n fixed.</para>
/// <para>Free cosmology: g(z) = ln D_A(z) − ln z on the nodes of a <see cref="RedshiftGrid"/> (cubic stencil per object),
/// computed once per parameter vector. Derivatives ∂g_k/∂θ_c are <b>central differences of the grid itself</b>:
/// g_k(θ_c ± h) from two further world models per free cosmological parameter, h = 10⁻⁴·max(|θ_c|, 0.1) (truncation
/// error ~h²g‴/6 ≈ 10⁻¹⁰ relative, rounding ~10⁻¹³/h ≈ 10⁻⁹; second-order one-sided differences where θ_c ± h leaves the
/// bounds or the model is undefined), interpolated to objects with the same stencil weights as g. The same differences
/// give ∂n/∂θ_c. So the gradient is exact for the interpolated likelihood up to those differences of a smooth grid.</para>
/// </remarks>
internal sealed class DistanceTerms
{
    private readonly Hypothesis _h;
    private readonly ParameterLayout _layout;
    private readonly double[]? _lnDaFixed;
    private readonly double _nFixed;
    private readonly double[]? _gridFixed; // g on the grid when cosmology is fixed but the grid is inherited (profiles)

    public DistanceTerms(Hypothesis hypothesis, ParameterLayout layout, ReadOnlySpan<double> z, bool size, RedshiftGridSpan? sharedGrid)
    {
        _h = hypothesis;
        _layout = layout;
        int n = z.Length;
        CosmologyFree = layout.FreeCosmological.Length > 0;
        if (size && CosmologyFree)
            Grid = sharedGrid is { } span
                ? new RedshiftGrid(z, hypothesis.Nuisance.NodesFor(span.ObjectCount), span.MinZ, span.MaxZ)
                : new RedshiftGrid(z, hypothesis.Nuisance.NodesFor(n));
        _referenceG = ReferenceFor(hypothesis);
        if (CosmologyFree) return;
        var model = CreateModel(hypothesis.FullValues(hypothesis.StartVector()))
                    ?? throw new ArgumentException($"world model '{hypothesis.Family.Name}' cannot be built from its fixed parameters");
        _nFixed = model.BolometricDimmingExponent + hypothesis.Nuisance.DimmingExponentOffset;
        if (!size) return;
        _lnDaFixed = new double[n];
        // In catalogue order: a world model's batch distances take redshifts in any order (no sort of every z).
        model.AngularDiameterDistances(z, _lnDaFixed);
        for (int k = 0; k < n; k++)
        {
            double da = _lnDaFixed[k];
            if (!(da > 0)) throw new ArgumentException($"world model '{hypothesis.Family.Name}' gives a non-positive angular-diameter distance at z = {z[k]}");
            _lnDaFixed[k] = Math.Log(da);
        }
    }

    /// <summary>
    /// The distance terms of <paramref name="hypothesis"/> — <paramref name="parent"/>'s hypothesis with some parameters held
    /// fixed (profile refits) — reusing the parent's per-object work: its grid and stencils when it has one (then, with every
    /// cosmological parameter now fixed, g is computed once on that grid, so profile and full fit share the same
    /// interpolated ln D_A), or its exact per-object ln D_A when the cosmology was already fixed.
    /// </summary>
    /// <remarks>With a grid and the cosmology now fixed, and <paramref name="perObject"/>, ln D_A is interpolated to every
    /// object once here (the same stencil sum as <see cref="LnDaSlice"/>), so the refits' evaluations take the vectorised
    /// exact-distance path with no node adjoint; without it (a kernel that works on the grid values, such as
    /// <see cref="SizeSliceGram"/>) the fixed grid values alone are kept.</remarks>
    public DistanceTerms(Hypothesis hypothesis, ParameterLayout layout, DistanceTerms parent, double[] lnZ, bool perObject)
    {
        _h = hypothesis;
        _layout = layout;
        CosmologyFree = layout.FreeCosmological.Length > 0;
        Grid = parent.Grid;
        _referenceG = parent._referenceG;
        if (CosmologyFree) return;
        var model = CreateModel(hypothesis.FullValues(hypothesis.StartVector()))
                    ?? throw new ArgumentException($"world model '{hypothesis.Family.Name}' cannot be built from its fixed parameters");
        _nFixed = model.BolometricDimmingExponent + hypothesis.Nuisance.DimmingExponentOffset;
        if (Grid is not null)
        {
            _gridFixed = GridValues(model) ?? throw new ArgumentException($"world model '{hypothesis.Family.Name}' gives a non-positive angular-diameter distance on the redshift grid");
            if (perObject)
            {
                _lnDaFixed = new double[lnZ.Length];
                Interpolate(_gridFixed, lnZ, 0, lnZ.Length, _lnDaFixed);
            }
        }
        else _lnDaFixed = parent._lnDaFixed;
    }

    /// <summary>The grid values g of the hypothesis's start model (the reference of <see cref="SizeSliceGram"/>), computed once;
    /// zeros where that model is undefined; null without a grid.</summary>
    public double[]? ReferenceG => Grid is null ? null : _referenceG!.Value;

    private readonly Lazy<double[]>? _referenceG;

    private Lazy<double[]> ReferenceFor(Hypothesis hypothesis) => new(() =>
        (CreateModel(hypothesis.FullValues(hypothesis.StartVector())) is { } m ? GridValues(m) : null) ?? new double[Grid!.Nodes.Length]);

    /// <summary>Whether any world-model parameter is free.</summary>
    public bool CosmologyFree { get; }

    /// <summary>The redshift grid (free cosmology with a size model), else null.</summary>
    public RedshiftGrid? Grid { get; }

    /// <summary>Exact per-object ln D_A (fixed cosmology with a size model), else null.</summary>
    public double[]? FixedLnDa => _lnDaFixed;

    /// <summary>Number of grid nodes (0 without a grid).</summary>
    public int Nodes => Grid is null || _lnDaFixed is not null ? 0 : Grid.Nodes.Length;

    /// <summary>Builds the evaluation state for θ (null: outside the bounds' model domain).</summary>
    public LikelihoodEvaluation? Prepare(double[] theta, double[] values, bool withGradient)
    {
        if (!CosmologyFree) return new LikelihoodEvaluation(theta, values, _gridFixed, _nFixed) { HasGradient = withGradient };
        var model = CreateModel(values);
        if (model is null) return null;
        var g = Grid is null ? null : GridValues(model);
        if (Grid is not null && g is null) return null;
        double dim = model.BolometricDimmingExponent + _h.Nuisance.DimmingExponentOffset;
        if (!withGradient) return new LikelihoodEvaluation(theta, values, g, dim);
        int nc = _layout.FreeCosmological.Length;
        var dg = g is null ? null : new double[nc][];
        var dn = new double[nc];
        var v = (double[])values.Clone();
        for (int c = 0; c < nc; c++)
        {
            int full = _layout.FreeCosmological[c];
            var spec = _h.Parameters[full];
            double x0 = values[full], step = 1e-4 * Math.Max(Math.Abs(x0), 0.1);
            (double[]? G, double N)? At(double x)
            {
                if (!(x >= spec.Min && x <= spec.Max)) return null;
                v[full] = x;
                var m = CreateModel(v);
                v[full] = x0;
                if (m is null) return null;
                var gg = Grid is null ? null : GridValues(m);
                if (Grid is not null && gg is null) return null;
                return (gg, m.BolometricDimmingExponent);
            }
            var plus = At(x0 + step);
            var minus = At(x0 - step);
            int len = g?.Length ?? 0;
            var row = new double[len];
            double nDer;
            if (plus is { } p && minus is { } q)
            {
                for (int k = 0; k < len; k++) row[k] = (p.G![k] - q.G![k]) / (2 * step);
                nDer = (p.N - q.N) / (2 * step);
            }
            else
            {
                // Second-order one-sided: f'(x) ≈ ±(−3f(x) + 4f(x ± h) − f(x ± 2h))/(2h).
                double s = plus is not null ? 1 : -1;
                var f1 = plus ?? minus;
                var f2 = At(x0 + 2 * s * step);
                if (f1 is null || f2 is null) return null;
                for (int k = 0; k < len; k++) row[k] = s * (-3 * g![k] + 4 * f1.Value.G![k] - f2.Value.G![k]) / (2 * step);
                double n0 = model.BolometricDimmingExponent;
                nDer = s * (-3 * n0 + 4 * f1.Value.N - f2.Value.N) / (2 * step);
            }
            if (dg is not null) dg[c] = row;
            dn[c] = nDer;
        }
        return new LikelihoodEvaluation(theta, values, g, dim) { HasGradient = true, GridLnDaOverZDerivatives = dg, DimmingDerivatives = dn };
    }

    private double[]? GridValues(IWorldModel model)
    {
        var nodes = Grid!.Nodes;
        var g = new double[nodes.Length];
        model.AngularDiameterDistances(nodes, g);
        for (int k = 0; k < g.Length; k++)
        {
            if (!(g[k] > 0) || !double.IsFinite(g[k])) return null;
            g[k] = Math.Log(g[k]) - Math.Log(nodes[k]);
        }
        return g;
    }

    /// <summary>The world model for the full parameter values, or null where it is undefined.</summary>
    public IWorldModel? CreateModel(double[] values)
    {
        var dict = new Dictionary<string, double>(_layout.Cosmological.Length);
        foreach (var i in _layout.Cosmological)
            if (!double.IsNaN(values[i])) dict[_h.Parameters[i].Name] = values[i]; // NaN = not given (model default)
        return _h.Family.TryCreate(dict, out var model, out _) ? model : null;
    }

    /// <summary>ln D_A of object <paramref name="i"/>.</summary>
    public double LnDa(LikelihoodEvaluation e, int i, double[] lnZ) =>
        _lnDaFixed is not null ? _lnDaFixed[i] : lnZ[i] + Grid!.Interpolate(e.GridLnDaOverZ, i);

    /// <summary>
    /// ln D_A for rows [start, end): the fixed array itself, or the grid interpolation into a pooled buffer
    /// (<paramref name="rented"/>, to be returned with <see cref="ArrayPool{T}.Shared"/>).
    /// </summary>
    public ReadOnlySpan<double> LnDaSlice(LikelihoodEvaluation e, int start, int end, double[] lnZ, out double[]? rented)
    {
        int len = end - start;
        if (_lnDaFixed is not null) { rented = null; return _lnDaFixed.AsSpan(start, len); }
        rented = ArrayPool<double>.Shared.Rent(len);
        var span = rented.AsSpan(0, len);
        Interpolate(e.GridLnDaOverZ!, lnZ, start, end, span);
        return span;
    }

    // ln D_A of rows [start, end) into span[0 .. end − start): ln z + the object's cubic stencil over g.
    private void Interpolate(double[] g, double[] lnZ, int start, int end, Span<double> span)
    {
        var idx = Grid!.Index;
        var w = Grid.Weights;
        for (int i = start; i < end; i++)
        {
            int j = idx[i], k = 4 * i;
            span[i - start] = lnZ[i] + w[k] * g[j] + w[k + 1] * g[j + 1] + w[k + 2] * g[j + 2] + w[k + 3] * g[j + 3];
        }
    }

    /// <summary>Adds d_t·w_ik to the node adjoint of object <paramref name="i"/>'s stencil (no-op for exact distances).</summary>
    public void Scatter(double[]? nodeAdjoint, int i, double dt)
    {
        if (nodeAdjoint is null || Grid is null) return;
        int j = Grid.Index[i], k = 4 * i;
        var w = Grid.Weights;
        nodeAdjoint[j] += dt * w[k];
        nodeAdjoint[j + 1] += dt * w[k + 1];
        nodeAdjoint[j + 2] += dt * w[k + 2];
        nodeAdjoint[j + 3] += dt * w[k + 3];
    }
}
