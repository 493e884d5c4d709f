using SizeTest.Inference;
using SizeTest.Foundation.Errors;
using SizeTest.Cosmology;
using SizeTest.Inference.Likelihood;
using SizeTest.Photometry;

namespace SizeTest.Inference.Survey;

/// <summary>
/// The angular-size likelihood with the survey terms of a <see cref="SurveyModel"/>: a size–luminosity (or size–mass)
/// relation with per-model luminosities, populations with their own nuisance parameters, binned evolution,
/// photometric-redshift marginalisation, Gaussian-in-θ size errors, weights and a per-model luminosity window.
/// <see cref="HypothesisLikelihood"/> delegates its rows to this class when any survey term is active.
/// </summary>
/// <remarks>
/// <para>Mean of ln θ_i (radians) for object i in group g and redshift bin k:
/// m_i(z) = ln R0_{g(,k)} + a_g ln(1+z) + β_g ln(L_i/L_pivot) − ln D_A(z) + ln(10⁻³)  (R0 in kpc, D_A in Mpc; binned evolution drops
/// the a term), with ln(L_i/L_pivot) = C_i + 2 ln D_L(z) and ln D_L = ln D_A + e ln(1+z) (<see cref="ModelLuminosity"/>): every world
/// model is judged with its own luminosities. Radio sources: R0 is ℓ_m (in kpc), a is n, β the luminosity exponent (Gurvits,
/// Kellermann &amp; Frey 1999).</para>
/// <para>Log-normal errors: ln θ_i ~ N(m_i, σ_i² + σ_g²), σ_i = σ_θ/θ. Gaussian errors (exact for errors quoted in θ):
/// p(θ_i) = ∫ N(θ_i; e^u, σ_θ²) N(u; m_i, σ_g²) du / P(θ_obs &gt; 0), the integral by 20-point adaptive Gauss–Hermite quadrature
/// centred on the integrand's mode with its curvature as scale (Liu &amp; Pierce 1994, Biometrika 81, 624), and
/// P(θ_obs &gt; 0) = ∫ Φ(e^u/σ_θ) N(u; m_i, σ_g²) du by 20-point Gauss–Hermite on the intrinsic distribution.</para>
/// <para>Photometric redshifts: p_i = ∫ p_i(θ | z) N(z; z_obs, σ_z²) π(z) dz with π flat in z over [z_lo, z_hi] (the stated prior:
/// <see cref="SurveyModel.RedshiftPriorMin"/>…<see cref="SurveyModel.RedshiftPriorMax"/>, default the sample's observed range; σ_z is the
/// quoted z_err, taken as the error at the object's z), by Gauss–Hermite with <see cref="SurveyModel.RedshiftNodes"/> nodes
/// z_ij = z_obs + √2 σ_z x_j (an object whose normal the prior cuts: Gauss–Legendre under the truncated normal, <see cref="TruncatedRedshiftNodes"/>). D_A at the nodes comes from the
/// same redshift grid (its nodes are computed once per parameter vector; fixed cosmology: exact per node). The luminosity of
/// flux-density objects is re-evaluated at each node (flux and magnitudes held fixed, K and A at the catalogue's values).
/// Log-normal errors without a size cut run on the block-vectorised <see cref="RedshiftQuadratureKernel"/> (the linearised marginal below on
/// <see cref="LinearisedRedshiftKernel"/>).
/// <see cref="RedshiftMarginal.Linear"/> instead evaluates each object once, at the mean z̄ of its redshift posterior under the prior
/// (<see cref="SurveyRows.LinearisedCentres"/>), with the scatter σ replaced by √(σ² + m′² s²), s² that posterior's variance and
/// m′ = ∂m/∂z = (a + 2βe − βs_C)/(1+z̄) + (2β − 1) ∂ln D_A/∂z (s_C = ∂C/∂ln(1+z); ∂ln D_A/∂z from the grid interpolant's derivative,
/// <see cref="RedshiftGridSlope"/>): the effective-variance method (Clutton-Brock 1967; Orear 1982, Am. J. Phys. 50, 912). Its gradient
/// chains ∂ℓ/∂σ_eff through σ and m′ (a, β, e and the grid nodes).</para>
/// <para>Each object's log density is multiplied by its weight; objects outside the luminosity window get weight 0. The window is
/// evaluated once, with each world model's start (or fixed) parameters.</para>
/// </remarks>
/// <para>Gradient (<see cref="SumWithAdjoint"/>): analytic. Per point, ∂ℓ/∂m and ∂ℓ/∂σ (log-normal: r/V and σ(r²/V² − 1/V); Gaussian:
/// posterior expectations E[(u − m)/σ²] and E[(u − m)²/σ³] − 1/σ over the same quadrature nodes, minus the derivatives of ln P);
/// then ∂m/∂R0 = 1/R0, ∂m/∂a = ln(1+z), ∂m/∂β = ln(L/L_pivot), ∂m/∂ln D_A = 2β − 1 (to the grid nodes through the stencil weights, as
/// the built-in kernels), ∂m/∂e = 2β ln(1+z); photometric redshifts weight each node's partials by its posterior share.</para>
internal sealed class SurveySizeLikelihood : IObservableKernel
{
    private const double Ln10 = 2.302585092994046;
    private const double HalfLn2Pi = 0.91893853320467274;
    private static readonly double LnKpcPerMpc = Math.Log(1e-3);
    private static readonly GaussHermite Gh12 = new(20);

    private readonly int _n, _groups, _bins, _nodesPerObject;
    private readonly double[] _y, _s2, _theta, _sTheta, _ln1pz, _lnz;
    private readonly double[]? _weight, _lumBase;
    private readonly int[] _group, _bin;
    private readonly int[] _radiusIndex, _evolutionIndex, _scatterIndex, _luminositySlopeIndex;
    private readonly bool _gaussian, _photoZ, _hasLum;
    private readonly double[]? _lnDaFixed;
    private readonly RedshiftGrid? _grid;
    private readonly double _eFixed;
    private readonly int _iLumExp = -1;
    private readonly bool _expanding;
    // --min-size: the density of each object (at each photo-z node) is divided by P(θ_obs > θ_min | z); NaN = no cut.
    private readonly double _minTheta = double.NaN, _lnMinTheta = double.NaN;
    private readonly bool _truncated;
    // Photometric redshifts: per object i, nodes [i*J, (i+1)*J): ln(1+z), ln z, log weight (−∞ = dropped), ln D_A (fixed cosmology), luminosity base.
    private readonly double[] _nodeLn1pz = [], _nodeLnz = [], _nodeLogW = [], _nodeLumBase = [];
    private readonly double[]? _nodeLnDaFixed;
    private readonly RedshiftGrid? _nodeGrid;

    /// <summary>Notes for the results (window membership, prior, quadrature).</summary>
    public IReadOnlyList<string> Notes { get; }

    /// <summary>Each object's weight under this model (null: all 1): the weight column times the luminosity window.</summary>
    internal double[]? RowWeights => _weight;

    private readonly ParameterLayout _layout;

    public SurveySizeLikelihood(Hypothesis h, ParameterLayout layout, Observables o, double[]? lnDaFixed, RedshiftGrid? grid, double gridMinZ, double gridMaxZ,
        double priorMinZ, double priorMaxZ, IWorldModel startModel, bool wholeSample = true)
    {
        var sv = h.Nuisance.SurveyTerms;
        _layout = layout;
        var notes = new List<string>();
        _n = o.Count;
        _y = o.LnTheta ?? throw SettingProblem.Exception([new("fitting angular sizes needs a 'theta' column; map it with {col} theta=NAME")]);
        _s2 = new double[_n];
        _theta = new double[_n];
        _sTheta = new double[_n];
        for (int i = 0; i < _n; i++)
        {
            double rel = o.LnThetaErr?[i] ?? 0;
            _s2[i] = rel * rel;
            _theta[i] = Math.Exp(_y[i]);
            _sTheta[i] = rel * _theta[i];
        }
        _lnDaFixed = lnDaFixed;
        _grid = grid;
        _expanding = h.Family.IsExpanding;
        _eFixed = ModelLuminosity.DistanceExponent(startModel);
        for (int i = 0; i < h.Parameters.Count; i++)
            if (h.Parameters[i].Name == WorldModelParameters.Names.LuminosityExponent && h.Parameters[i].IsFree) _iLumExp = i;

        // --- minimum-size truncation
        if (h.Nuisance.Cuts.MinThetaArcsec is { } tMin)
        {
            _minTheta = tMin * SizeTest.Foundation.Angles.AngleUnits.RadiansPerArcsec;
            _lnMinTheta = Math.Log(_minTheta);
            _truncated = true;
            notes.Add(FormattableString.Invariant($"minimum size: each object's density is divided by P(θ_obs > {tMin:G4}″ | z) under the same size model (") +
                (sv.SizeErrors == SizeErrorKind.Gaussian ? "Gaussian errors: ∫ Φ((e^u − θ_min)/σ_θ) N(u; m, σ²) du" : "log-normal: Φ((m − ln θ_min)/√(σ_i² + σ²))") +
                (sv.MarginaliseRedshift ? sv.ZMarginal == RedshiftMarginal.Linear ? ", with the linearised photo-z variance" : ", at every redshift node of the photo-z integral" : "") + ").");
        }

        // A magnitude limit selects on the magnitudes the luminosities come from, which this likelihood conditions on: no truncation.
        if (h.Nuisance.MagLimitIsConditioned) notes.Add(NuisanceModel.ConditionedMagLimitNote);

        // --- size errors
        _gaussian = sv.SizeErrors == SizeErrorKind.Gaussian;
        if (_gaussian)
        {
            if (o.LnThetaErr is null) throw SettingProblem.Exception([new("{size_errors} gaussian needs a 'theta_err' column (the error quoted in θ)")]);
            for (int i = 0; i < _n; i++)
                if (!(_sTheta[i] > 0)) throw SettingProblem.Exception([new($"{{size_errors}} gaussian needs a positive theta_err for every object; object {i + 1} has none")]);
            notes.Add("size errors: Gaussian in θ with the quoted theta_err, convolved exactly with the log-normal intrinsic scatter (20-point adaptive Gauss–Hermite; Liu & Pierce 1994) and normalised by P(θ_obs > 0). ln L is then a density in θ (per radian), the log-normal model's a density in ln θ: the two differ by Σ ln θ_i, so compare ln L, AIC or BIC between world models of one fit, never across {size_errors} settings.");
        }

        // --- groups, bins, luminosities, weights and window, photometric-redshift nodes (shared with the other survey kernels)
        var rows = new SurveyRows(h, o, "R0, a, scatter" + (sv.Relation != SizeRelationKind.None ? " and β" : ""), lnDaFixed is not null, grid, gridMinZ, gridMaxZ,
            priorMinZ, priorMaxZ, startModel, wholeSample);
        var labels = sv.GroupLabels;
        _ln1pz = rows.Ln1pZ;
        _lnz = rows.LnZ;
        _groups = rows.GroupCount;
        _group = rows.Group;
        _bins = rows.BinCount;
        _bin = rows.Bin;
        _hasLum = sv.Relation != SizeRelationKind.None;
        _lumBase = rows.LuminosityBase;
        _weight = rows.Weight;
        _photoZ = rows.MarginalisesRedshift;
        _nodesPerObject = rows.NodesPerObject;
        _nodeLn1pz = rows.NodeLn1pZ;
        _nodeLnz = rows.NodeLnZ;
        _nodeLogW = rows.NodeLogWeight;
        _nodeLumBase = rows.NodeLuminosityBase;
        _nodeLnDaFixed = rows.NodeLnDaFixed;
        _nodeGrid = rows.NodeGrid;
        _linear = _photoZ && rows.Marginal == RedshiftMarginal.Linear;
        if (_linear)
        {
            _zErr2 = rows.RedshiftVariance;
            _inv1pz = rows.NodeLn1pZ.Select(x => Math.Exp(-x)).ToArray();
            _invZ = rows.NodeLnZ.Select(x => Math.Exp(-x)).ToArray();
            _lnDaSlopeFixed = rows.LnDaSlopeFixed;
            _slopeWeights = rows.SlopeWeights;
            _lumZSlope = rows.LuminosityZSlope;
        }
        notes.AddRange(rows.Notes);

        // --- parameter indices
        _radiusIndex = Enumerable.Repeat(-1, _groups * _bins).ToArray();
        _evolutionIndex = Enumerable.Repeat(-1, _groups).ToArray();
        _scatterIndex = Enumerable.Repeat(-1, _groups).ToArray();
        _luminositySlopeIndex = Enumerable.Repeat(-1, _groups).ToArray();
        var byName = new Dictionary<string, int>(StringComparer.Ordinal);
        for (int i = 0; i < h.Parameters.Count; i++) byName[h.Parameters[i].Name] = i;
        int Need(string name) => byName.TryGetValue(name, out var i) ? i : throw new ArgumentException($"hypothesis has no parameter '{name}'");
        for (int g = 0; g < _groups; g++)
        {
            string l = labels[g];
            for (int k = 0; k < _bins; k++)
                _radiusIndex[g * _bins + k] = Need(SurveyModel.Named(sv.Binned ? $"r0_kpc_bin{k + 1}" : NuisanceParameters.Names.R0Kpc, l));
            if (!sv.Binned) _evolutionIndex[g] = Need(SurveyModel.Named(NuisanceParameters.Names.SizeEvolution, l));
            _scatterIndex[g] = Need(SurveyModel.Named(NuisanceParameters.Names.ScatterDex, l));
            if (sv.Relation != SizeRelationKind.None) _luminositySlopeIndex[g] = Need(SurveyModel.Named(NuisanceParameters.Names.SizeLuminositySlope, l));
        }

        // Log-normal errors without a size cut: the block-vectorised quadrature or linearised marginal.
        if (_photoZ && !_gaussian && !_truncated)
        {
            var cell = new int[_n];
            for (int i = 0; i < _n; i++) cell[i] = _group[i] * _bins + _bin[i];
            _marginal = _linear
                ? new LinearisedRedshiftKernel(_y, _s2, _zErr2, _group, cell, _groups * _bins, _weight, _nodeLn1pz, _nodeLnz, _hasLum ? _nodeLumBase : null,
                    _lumZSlope, _nodeLnDaFixed, _lnDaSlopeFixed, _nodeGrid, _slopeWeights)
                : new RedshiftQuadratureKernel(_nodesPerObject, _y, _s2, _group, cell, _weight, _nodeLn1pz, _nodeLnz, _nodeLogW,
                    _hasLum ? _nodeLumBase : null, _nodeLnDaFixed, _nodeGrid);
        }
        Notes = notes;
    }

    private readonly IRedshiftMarginalKernel? _marginal;
    // Linearised photo-z marginal (one node per object, at its posterior mean z̄): the posterior variance s², 1/(1+z̄), 1/z̄,
    // d ln D_A/dz at z̄ (fixed cosmology) or its weights on the node grid, ∂C/∂ln(1+z).
    private readonly bool _linear;
    private readonly double[] _zErr2 = [], _inv1pz = [], _invZ = [];
    private readonly double[]? _lnDaSlopeFixed, _slopeWeights;
    private readonly double _lumZSlope;

    /// <inheritdoc/>
    public double Sum(LikelihoodEvaluation e, in ModelPoint p, int start, int end) => Accumulate(e, start, end, null);

    /// <inheritdoc/>
    public double SumWithAdjoint(LikelihoodEvaluation e, in ModelPoint p, int start, int end, ModelAdjoint adjoint) => Accumulate(e, start, end, adjoint);

    /// <summary>Sum over rows [start, end) of the weighted per-object log densities (all constants kept).</summary>
    public double SumSlice(LikelihoodEvaluation e, int start, int end) => Accumulate(e, start, end, null);

    private double Accumulate(LikelihoodEvaluation e, int start, int end, ModelAdjoint? adj)
    {
        var v = e.Values;
        int gb = _groups * _bins;
        Span<double> lnR0 = stackalloc double[gb];
        Span<double> a = stackalloc double[_groups], sig = stackalloc double[_groups], beta = stackalloc double[_groups];
        for (int q = 0; q < gb; q++) lnR0[q] = Math.Log(v[_radiusIndex[q]]) + LnKpcPerMpc;
        for (int g = 0; g < _groups; g++)
        {
            a[g] = _evolutionIndex[g] >= 0 ? v[_evolutionIndex[g]] : 0;
            sig[g] = Ln10 * v[_scatterIndex[g]];
            beta[g] = _luminositySlopeIndex[g] >= 0 ? v[_luminositySlopeIndex[g]] : 0;
        }
        double eExp = _expanding ? 2.0 : _iLumExp >= 0 && double.IsFinite(v[_iLumExp]) ? v[_iLumExp] : _eFixed;
        double[]? direct = null;
        double[]? nodeA = adj?.NodeAdjoint;
        if (adj is not null) direct = adj.Direct ??= new double[_layout.FreeCount];
        if (_marginal is not null) return MarginalSum(e, start, end, direct, nodeA, lnR0, a, beta, sig, eExp);
        double acc = 0;
        int J = _nodesPerObject;
        Span<double> lp = stackalloc double[Math.Max(J, 1)];
        Span<double> dmj = stackalloc double[Math.Max(J, 1)];
        Span<double> dsj = stackalloc double[Math.Max(J, 1)];
        Span<double> lnDaj = stackalloc double[Math.Max(J, 1)];
        for (int i = start; i < end; i++)
        {
            double w = _weight?[i] ?? 1.0;
            if (w == 0) continue;
            int g = _group[i], q0 = g * _bins + _bin[i];
            double r0 = lnR0[q0], ag = a[g], bg = beta[g], sg = sig[g];
            if (!_photoZ || _linear)
            {
                var grid = _linear ? _nodeGrid : _grid;
                double ln1pz = _linear ? _nodeLn1pz[i] : _ln1pz[i];
                double lnDa = _linear
                    ? _nodeLnDaFixed is not null ? _nodeLnDaFixed[i] : _nodeLnz[i] + grid!.Interpolate(e.GridLnDaOverZ, i)
                    : _lnDaFixed is not null ? _lnDaFixed[i] : _lnz[i] + grid!.Interpolate(e.GridLnDaOverZ, i);
                double c = _hasLum ? _linear ? _nodeLumBase[i] : _lumBase![i] : 0;
                // Linearised photo-z: the scatter becomes √(σ² + m′² z_err²) with m′ = ∂m/∂z at z_obs (see the remarks).
                double slope = 0, lnDaSlope = 0, sUse = sg;
                if (_linear)
                {
                    lnDaSlope = _lnDaSlopeFixed is not null ? _lnDaSlopeFixed[i] : _invZ[i] + GridSlope(e.GridLnDaOverZ!, i);
                    slope = (ag + 2 * bg * eExp - bg * _lumZSlope) * _inv1pz[i] + (2 * bg - 1) * lnDaSlope;
                    sUse = Math.Sqrt(sg * sg + slope * slope * _zErr2[i]);
                }
                double li = PointLogDensity(i, r0, ag, bg, sUse, eExp, ln1pz, lnDa, c, out double dm, out double ds);
                acc += w * li;
                if (adj is not null)
                {
                    double k = _linear && sUse > 0 ? ds / sUse : 0;
                    AddPartials(direct!, v, g, q0, w * dm, w * (_linear ? k * sg : ds), ln1pz, lnDa, c, bg, eExp);
                    if (nodeA is not null) ScatterNodes(nodeA, grid!, i, -w * dm * (2 * bg - 1));
                    if (_linear) AddSlopePartials(direct!, nodeA, i, g, w * k * slope * _zErr2[i], bg, eExp, lnDaSlope);
                }
            }
            else
            {
                double max = double.NegativeInfinity;
                for (int j = 0; j < J; j++)
                {
                    int q = i * J + j;
                    if (double.IsNegativeInfinity(_nodeLogW[q])) { lp[j] = double.NegativeInfinity; continue; }
                    lnDaj[j] = _nodeLnDaFixed is not null ? _nodeLnDaFixed[q] : _nodeLnz[q] + _nodeGrid!.Interpolate(e.GridLnDaOverZ, q);
                    lp[j] = _nodeLogW[q] + PointLogDensity(i, r0, ag, bg, sg, eExp, _nodeLn1pz[q], lnDaj[j], _lumBase is null ? 0 : _nodeLumBase[q], out dmj[j], out dsj[j]);
                    if (lp[j] > max) max = lp[j];
                }
                double sum = 0;
                for (int j = 0; j < J; j++) sum += Math.Exp(lp[j] - max);
                acc += w * (max + Math.Log(sum));
                if (adj is not null)
                    for (int j = 0; j < J; j++)
                    {
                        if (double.IsNegativeInfinity(lp[j])) continue;
                        int q = i * J + j;
                        double share = w * Math.Exp(lp[j] - max) / sum;
                        AddPartials(direct!, v, g, q0, share * dmj[j], share * dsj[j], _nodeLn1pz[q], lnDaj[j], _lumBase is null ? 0 : _nodeLumBase[q], bg, eExp);
                        if (nodeA is not null) ScatterNodes(nodeA, _nodeGrid!, q, -share * dmj[j] * (2 * bg - 1));
                    }
            }
        }
        return acc;
    }

    // The photo-z marginal's kernel (quadrature or linearised) with its partials summed per cell and group, mapped to the free parameters once.
    private double MarginalSum(LikelihoodEvaluation e, int start, int end, double[]? direct, double[]? nodeA,
        ReadOnlySpan<double> lnR0, ReadOnlySpan<double> a, ReadOnlySpan<double> beta, ReadOnlySpan<double> sig, double eExp)
    {
        double dExp = 0;
        if (direct is null) return _marginal!.Sum(lnR0, a, beta, sig, eExp, e.GridLnDaOverZ, start, end, default, default, default, default, ref dExp, null);
        var v = e.Values;
        int gb = _groups * _bins;
        Span<double> dCell = stackalloc double[gb], dX = stackalloc double[_groups], dS = stackalloc double[_groups], dL = stackalloc double[_groups];
        dCell.Clear(); dX.Clear(); dS.Clear(); dL.Clear();
        double value = _marginal!.Sum(lnR0, a, beta, sig, eExp, e.GridLnDaOverZ, start, end, dCell, dX, dS, dL, ref dExp, nodeA);
        for (int q = 0; q < gb; q++) Add(direct, _radiusIndex[q], dCell[q] / v[_radiusIndex[q]]);
        for (int g = 0; g < _groups; g++)
        {
            Add(direct, _evolutionIndex[g], dX[g]);
            Add(direct, _scatterIndex[g], dS[g] * Ln10);
            if (_hasLum) Add(direct, _luminositySlopeIndex[g], dL[g]);
        }
        if (_hasLum) Add(direct, _iLumExp, dExp);
        return value;
    }

    // d(ln D_A − ln z)/dz at object i's z̄ from the grid's node values (RedshiftGridSlope's weights on its node's stencil).
    private double GridSlope(double[] g, int i)
    {
        int j = _nodeGrid!.Index[i], k = 4 * i;
        var w = _slopeWeights!;
        return w[k] * g[j] + w[k + 1] * g[j + 1] + w[k + 2] * g[j + 2] + w[k + 3] * g[j + 3];
    }

    // ∂ℓ/∂m′ = dSlope into the parameters m′ = (a + 2βe − βs)/(1+z) + (2β − 1) d ln D_A/dz depends on (s = ∂C/∂ln(1+z)), and
    // into the grid nodes through the slope stencil (NodeAdjoint holds −∂ℓ/∂g_k).
    private void AddSlopePartials(double[] direct, double[]? nodeA, int i, int g, double dSlope, double beta, double eExp, double lnDaSlope)
    {
        double x = _inv1pz[i];
        Add(direct, _evolutionIndex[g], dSlope * x);
        if (_hasLum)
        {
            Add(direct, _luminositySlopeIndex[g], dSlope * ((2 * eExp - _lumZSlope) * x + 2 * lnDaSlope));
            Add(direct, _iLumExp, dSlope * 2 * beta * x);
        }
        if (nodeA is not null && _slopeWeights is not null)
        {
            int j = _nodeGrid!.Index[i], k = 4 * i;
            double f = -dSlope * (2 * beta - 1);
            nodeA[j] += f * _slopeWeights[k];
            nodeA[j + 1] += f * _slopeWeights[k + 1];
            nodeA[j + 2] += f * _slopeWeights[k + 2];
            nodeA[j + 3] += f * _slopeWeights[k + 3];
        }
    }

    private void AddPartials(double[] direct, double[] v, int g, int q0, double dm, double ds, double ln1pz, double lnDa, double c, double beta, double eExp)
    {
        Add(direct, _radiusIndex[q0], dm / v[_radiusIndex[q0]]);
        Add(direct, _evolutionIndex[g], dm * ln1pz);
        Add(direct, _scatterIndex[g], ds * Ln10);
        if (_hasLum)
        {
            Add(direct, _luminositySlopeIndex[g], dm * (c + 2 * (lnDa + eExp * ln1pz)));
            Add(direct, _iLumExp, dm * 2 * beta * ln1pz);
        }
    }

    private void Add(double[] direct, int full, double value)
    {
        int j = _layout.FreeIndex(full);
        if (j >= 0) direct[j] += value;
    }

    private static void ScatterNodes(double[] nodeAdjoint, RedshiftGrid grid, int row, double value)
    {
        int j = grid.Index[row], k = 4 * row;
        var w = grid.Weights;
        nodeAdjoint[j] += value * w[k];
        nodeAdjoint[j + 1] += value * w[k + 1];
        nodeAdjoint[j + 2] += value * w[k + 2];
        nodeAdjoint[j + 3] += value * w[k + 3];
    }

    private double PointLogDensity(int i, double lnR0, double a, double beta, double sig, double eExp, double ln1pz, double lnDa, double lumBase,
        out double dm, out double ds)
    {
        double m = lnR0 + a * ln1pz - lnDa;
        if (_hasLum) m += beta * (lumBase + 2 * (lnDa + eExp * ln1pz));
        if (!_gaussian)
        {
            double r = _y[i] - m, var = _s2[i] + sig * sig;
            dm = r / var;
            ds = sig * (r * r / (var * var) - 1 / var);
            double lp = -0.5 * (r * r / var + Math.Log(var)) - HalfLn2Pi;
            if (_truncated)
            {
                // − ln Φ(t), t = (m − ln θ_min)/√V: ∂t/∂m = 1/√V, ∂t/∂σ = −t σ/V (truncated Gaussian, common practice).
                double sd = Math.Sqrt(var), t = (m - _lnMinTheta) / sd, lam = NormalMath.LogPhiDerivative(t);
                lp -= NormalMath.LogPhi(t);
                dm -= lam / sd;
                ds += lam * t * sig / var;
            }
            return lp;
        }
        return GaussianThetaLogDensity(_theta[i], _sTheta[i], m, sig, _truncated ? _minTheta : 0, out dm, out ds);
    }

    /// <summary>
    /// ln [∫ N(θ; e^u, s²) N(u; m, σ²) du / ∫ Φ(e^u/s) N(u; m, σ²) du]: the exact density of a θ measured with Gaussian error s
    /// for a log-normal true size, given that θ_obs &gt; 0 (see the type's remarks for the quadrature).
    /// </summary>
    internal static double GaussianThetaLogDensity(double theta, double s, double m, double sig) => GaussianThetaLogDensity(theta, s, m, sig, 0, out _, out _);

    /// <summary>
    /// As <see cref="GaussianThetaLogDensity(double, double, double, double)"/>, normalised by P(θ_obs &gt; <paramref name="thetaMin"/>)
    /// = ∫ Φ((e^u − θ_min)/s) N(u; m, σ²) du instead (θ_min = 0: θ_obs &gt; 0), with ∂/∂m and ∂/∂σ.
    /// </summary>
    internal static double GaussianThetaLogDensity(double theta, double s, double m, double sig, double thetaMin, out double dm, out double ds)
    {
        double s2 = s * s, sig2 = sig * sig;
        // Mode of f(u) = −(θ − e^u)²/(2s²) − (u − m)²/(2σ²) by Fisher scoring from the precision-weighted start.
        double u = m;
        if (theta > 0)
        {
            double pd = theta * theta / s2, pu = 1 / sig2;
            u = (m * pu + Math.Log(theta) * pd) / (pu + pd);
        }
        for (int it = 0; it < 30; it++)
        {
            double eu = Math.Exp(u);
            double grad = (theta - eu) * eu / s2 - (u - m) / sig2;
            double fisher = eu * eu / s2 + 1 / sig2;
            double step = Math.Clamp(grad / fisher, -2, 2);
            u += step;
            if (Math.Abs(step) < 1e-10) break;
        }
        double e0 = Math.Exp(u);
        double curv = -((theta * e0 - 2 * e0 * e0) / s2 - 1 / sig2);
        if (!(curv > 0)) curv = e0 * e0 / s2 + 1 / sig2;
        double tau = Math.Sqrt(2 / curv);
        double F(double x) { double ex = Math.Exp(x), d = theta - ex, t = x - m; return -d * d / (2 * s2) - t * t / (2 * sig2); }
        double f0 = F(u), sum = 0, e1 = 0, e2 = 0;
        var gh = Gh12;
        for (int j = 0; j < gh.Nodes.Length; j++)
        {
            double x = gh.Nodes[j], uj = u + tau * x;
            double wj = gh.Weights[j] * Math.Exp(F(uj) - f0 + x * x);
            sum += wj;
            e1 += wj * (uj - m);
            e2 += wj * (uj - m) * (uj - m);
        }
        e1 /= sum;
        e2 /= sum;
        double lnI = f0 + Math.Log(tau * sum) - Math.Log(2 * Math.PI * s * sig);
        double p = 0, dp = 0, dps = 0;
        for (int j = 0; j < gh.Nodes.Length; j++)
        {
            double ex = Math.Exp(m + Math.Sqrt(2) * sig * gh.Nodes[j]) / s, t = ex - thetaMin / s;
            p += gh.Weights[j] * NormalMath.Phi(t);
            double dens = gh.Weights[j] * Math.Exp(-0.5 * t * t) / Math.Sqrt(2 * Math.PI) * ex;
            dp += dens;
            dps += dens * Math.Sqrt(2) * gh.Nodes[j];
        }
        // ∂lnI/∂m = E[(u−m)]/σ², ∂lnI/∂σ = E[(u−m)²]/σ³ − 1/σ; ∂lnP = ∂P/P with t_j = (e^{u_j} − θ_min)/s,
        // ∂t_j/∂m = e^{u_j}/s, ∂t_j/∂σ = √2 x_j e^{u_j}/s.
        dm = e1 / sig2 - dp / p;
        ds = e2 / (sig2 * sig) - 1 / sig - dps / p;
        p /= Math.Sqrt(Math.PI);
        return lnI - Math.Log(p);
    }

    /// <summary>Data-driven start values for R0 (per group and bin): the median size implied at the start parameters.</summary>
    public void SuggestStart(double[] start, IReadOnlyList<ParameterSetting> free, Hypothesis h, LikelihoodEvaluation e)
    {
        var v = e.Values;
        double eExp = _expanding ? 2.0 : _eFixed;
        for (int gb = 0; gb < _groups * _bins; gb++)
        {
            var t = new List<double>();
            for (int i = 0; i < _n; i++)
            {
                if (_group[i] * _bins + _bin[i] != gb || (_weight?[i] ?? 1) == 0) continue;
                int g = _group[i];
                double lnDa = _lnDaFixed is not null ? _lnDaFixed[i] : _lnz[i] + _grid!.Interpolate(e.GridLnDaOverZ, i);
                double x = _y[i] + lnDa - LnKpcPerMpc - (_evolutionIndex[g] >= 0 ? v[_evolutionIndex[g]] : 0) * _ln1pz[i];
                if (_hasLum) x -= v[_luminositySlopeIndex[g]] * (_lumBase![i] + 2 * (lnDa + eExp * _ln1pz[i]));
                t.Add(x);
            }
            if (t.Count == 0) continue;
            t.Sort();
            double med = t[t.Count / 2];
            string name = h.Parameters[_radiusIndex[gb]].Name;
            for (int j = 0; j < free.Count; j++)
                if (free[j].Name == name && double.IsFinite(med)) start[j] = Math.Clamp(Math.Exp(med), free[j].Min, free[j].Max);
        }
    }
}
