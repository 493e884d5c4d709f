using SizeTest.Cosmology;
using SizeTest.Foundation.Errors;
using SizeTest.Inference.Likelihood;
using SizeTest.Photometry;

namespace SizeTest.Inference.Survey;

/// <summary>
/// The surface-brightness and joint (ln θ, μ) likelihoods with the survey terms of a <see cref="SurveyModel"/>: photometric-redshift
/// marginalisation, populations with their own nuisance parameters, binned evolution (R0 and μ0 per redshift bin), the size–luminosity
/// (size–mass) relation, weights and the per-model luminosity window. The per-object terms come from <see cref="SurveyRows"/>;
/// <see cref="HypothesisLikelihood"/> delegates its rows here when any survey term is active and the observable is sb or joint.
/// </summary>
/// <remarks>
/// <para>Means at redshift z for object i in group g and redshift bin k (x = ln(1+z), ℓ = log10(1+z)):
/// ln R̄ = ln R0_{g(,k)} + a_g x + β_g ln(L_i/L_pivot) (binned evolution drops a_g x), m_t = ln R̄ + ln(10⁻³) − ln D_A(z) (R0 in kpc,
/// D_A in Mpc) and m_μ = μ0_{g(,k)} + 2.5 (n − b_g) ℓ + K_i + A_i + κ (ln R̄ − ln R_pivot) − (2.5/ln10) γ_g ln(L_i/L_pivot) (binned evolution
/// drops b_g: μ0 per bin; γ = <c>sb_luminosity_slope</c>, joint fits with a size relation only, <see cref="NuisanceParameters.SbLuminositySlope"/>),
/// n the world model's bolometric dimming exponent plus the flux-convention offset (Tolman 1930), ln(L_i/L_pivot) = C_i + 2 ln D_L(z)
/// with ln D_L = ln D_A + e x (<see cref="ModelLuminosity"/>). Covariance as the built-in joint model:
/// [[σ_t,i² + σ_g², κσ_g²], [κσ_g², σ_μ,i² + s_μ,g² + κ²σ_g²]] (σ_g = ln10·scatter_dex@g, κ = kormendy_slope/ln10, shared);
/// surface brightness alone: μ_i ~ N(m_μ, σ_μ,i² + s_μ,g²). The selection truncation (<see cref="SelectionTruncation"/>: SB limit,
/// magnitude limit, minimum size; with the size–luminosity relation the magnitude limit selects on the conditioning luminosities and is
/// left out, <see cref="HypothesisLikelihood"/>) and the isophotal correction (<see cref="IsophotalCorrection"/>) are those of the built-in kernels,
/// evaluated with these means.</para>
/// <para>Photometric redshifts: p_i = ∫ p_i(θ, μ | z) N(z; z_obs, σ_z²) π(z) dz over the nodes of <see cref="SurveyRows"/>; at each node
/// the dimming 2.5 (n − b) ℓ, D_A (joint) and the luminosity move with z, the truncation is taken at that node, and K and A are held at
/// the catalogue's values (computed for z_obs). An isophotal node where the model's central SB is fainter than the isophote gets no
/// density; an object with none left has ln L = −∞.</para>
/// <para>The linearised marginal (<see cref="RedshiftMarginal.Linear"/>, the default except for isophotal sizes): each object once, at the
/// mean z̄ of its redshift posterior under the prior (<see cref="SurveyRows.LinearisedCentres"/>), with the covariance C + s² g gᵀ
/// (s² that posterior's variance; the multivariate effective variance, Clutton-Brock 1967; Orear 1982): g = (∂m_t/∂z, ∂m_μ/∂z) at z̄,
/// ∂m_μ/∂z = 2.5 (n − b)/(ln10 (1+z̄)) + κ d ln R̄/dz − (2.5/ln10) γ d ln L/dz, ∂m_t/∂z = d ln R̄/dz − d ln D_A/dz,
/// d ln R̄/dz = a/(1+z̄) + β d ln L/dz, d ln L/dz = (2e − s_C)/(1+z̄) + 2 d ln D_A/dz (s_C = −∂C/∂ln(1+z); d ln D_A/dz from the grid
/// interpolant's derivative, <see cref="RedshiftGridSlope"/>); K and A stay at the catalogue's values, as in the quadrature, so they
/// have no slope. Surface brightness alone: μ ~ N(m_μ(z̄), σ_μ,i² + s_μ² + (∂m_μ/∂z)² s²), without a cut on the block-vectorised
/// <see cref="LinearisedRedshiftKernel"/> (distances 0, β = 0); joint without a cut on the block-vectorised <see cref="LinearisedJointKernel"/>. A selection cut is linearised too: its truncation is taken at z̄ with the
/// effective covariance. Isophotal sizes are refused (their offset is non-linear in m_μ; <see cref="SurveyRequest"/> defaults them to the
/// quadrature). Gradient: ∂ℓ/∂g_t = s²(2D_Vt g_t + D_C g_μ), ∂ℓ/∂g_μ = s²(2D_Vμ g_μ + D_C g_t), chained through g's dependence on a, b, β, γ, κ,
/// e, n (θ_c) and d ln D_A/dz (the slope stencil onto the grid nodes).</para>
/// <para>Gradient: analytic, all in θ (<see cref="ModelAdjoint.Direct"/>) except the distances (node adjoint). With d_t, d_μ, D_Vt, D_Vμ,
/// D_C the per-point partials of the bivariate Gaussian (as <see cref="JointKernel"/>): ∂/∂R0 = (d_t + κd_μ)/R0, ∂/∂a = (d_t + κd_μ)x,
/// ∂/∂β = (d_t + κd_μ) ln(L/L_pivot), ∂/∂scatter_dex = 2σ ln10 (D_Vt + κ²D_Vμ + κD_C), ∂/∂μ0 = d_μ, ∂/∂b = −2.5 d_μ ℓ,
/// ∂/∂scatter_mag = 2 s_μ D_Vμ, ∂/∂kormendy_slope = [d_μ(ln R̄ − ln R_pivot) + 2κσ²D_Vμ + σ²D_C]/ln10, ∂/∂γ = −2.5 d_μ ln(L/L_pivot)/ln10,
/// ∂/∂ln D_A = d_t(2β − 1) + 2(κβ − 2.5γ/ln10) d_μ, ∂/∂e = 2x [β (d_t + κd_μ) − 2.5γ d_μ/ln10], ∂/∂θ_c = 2.5 d_μ ℓ ∂n/∂θ_c; photometric redshifts weight each node's partials by its posterior share.</para>
/// </remarks>
internal sealed class SurveyJointLikelihood : IObservableKernel
{
    private const double Ln10 = ModelPoint.Ln10, HalfLn2Pi = GaussianCore.HalfLn2Pi;
    // −2.5 / ln 10: magnitudes per unit of ln L (Δμ = −2.5 γ log10(L/L_pivot) = SbMagPerLn · γ · ln(L/L_pivot)).
    private const double SbMagPerLn = -2.5 / Ln10;

    private readonly ParameterLayout _layout;
    private readonly ObjectColumns _cols;
    private readonly SurveyRows _rows;
    private readonly SelectionTruncation? _cut;
    private readonly IsophotalCorrection? _isophotal;
    private readonly bool _joint, _hasLum, _expanding;
    private readonly int _groups, _bins, _iLumExp = -1, _iKormendy = -1;
    private readonly double _eFixed, _lnPivot;
    private readonly double[]? _lnDaFixed;
    private readonly RedshiftGrid? _grid;
    private readonly int[] _radiusIndex, _evolutionIndex, _scatterIndex, _slopeIndex, _sbSlopeIndex, _mu0Index, _sbEvolutionIndex, _scatterMagIndex;
    // Surface brightness with photometric redshifts and no cut: the block-vectorised quadrature or linearised marginal (null otherwise:
    // the per-object path).
    private readonly IRedshiftMarginalKernel? _sbKernel;
    // Joint fits with the linearised marginal and no cut: the block-vectorised kernel (null otherwise).
    private readonly LinearisedJointKernel? _jointKernel;
    // Linearised photo-z marginal (one node per object, at z̄): 1/(1+z̄) and 1/z̄ per object.
    private readonly bool _linear;
    private readonly double[] _inv1pz = [], _invZ = [];

    /// <summary>Notes for the results (what the survey terms did).</summary>
    public IReadOnlyList<string> Notes { get; }

    /// <summary>Each object's weight under this model (null: all 1): the weight column times the luminosity window.</summary>
    internal double[]? RowWeights => _rows.Weight;

    /// <param name="h">The hypothesis (observable sb or joint, with survey terms).</param>
    /// <param name="layout">Its parameter layout.</param>
    /// <param name="o">The objects.</param>
    /// <param name="cols">Their bound columns (μ, and ln θ for joint).</param>
    /// <param name="distances">The distance terms (exact ln D_A or the redshift grid; joint only).</param>
    /// <param name="cut">The selection truncation, or null.</param>
    /// <param name="isophotal">The isophotal correction (joint with isophotal sizes), or null.</param>
    /// <param name="gridMinZ">Lower end of the redshift grid.</param>
    /// <param name="gridMaxZ">Upper end of the redshift grid.</param>
    /// <param name="priorMinZ">Lower end of the photo-z prior.</param>
    /// <param name="priorMaxZ">Upper end of the photo-z prior.</param>
    /// <param name="startModel">The world model at its start (or fixed) parameters.</param>
    /// <param name="wholeSample">These objects are the whole sample (false: a part of it, which cannot judge an empty luminosity window).</param>
    public SurveyJointLikelihood(Hypothesis h, ParameterLayout layout, Observables o, ObjectColumns cols, DistanceTerms distances, SelectionTruncation? cut,
        IsophotalCorrection? isophotal, double gridMinZ, double gridMaxZ, double priorMinZ, double priorMaxZ, IWorldModel startModel, bool wholeSample = true)
    {
        var sv = h.Nuisance.SurveyTerms;
        _layout = layout;
        _cols = cols;
        _cut = cut;
        _isophotal = isophotal;
        _joint = h.Nuisance.Observable == ObservableKind.Joint;
        _hasLum = sv.Relation != SizeRelationKind.None;
        _expanding = h.Family.IsExpanding;
        _eFixed = ModelLuminosity.DistanceExponent(startModel);
        _lnPivot = Math.Log(h.Nuisance.PivotSizeKpc);
        _lnDaFixed = distances.FixedLnDa;
        _grid = distances.Grid;
        string own = (_joint ? "R0, a, scatter_dex" + (_hasLum ? ", β" : "") + ", " : "") + "mu0, b, scatter_mag";
        // Surface brightness alone has no distances: the photo-z nodes need no grid stencils.
        _rows = new SurveyRows(h, o, own, fixedCosmology: !_joint || _lnDaFixed is not null, _grid, gridMinZ, gridMaxZ, priorMinZ, priorMaxZ, startModel, wholeSample);
        _linear = _rows.MarginalisesRedshift && _rows.Marginal == RedshiftMarginal.Linear;
        if (_linear && isophotal is not null)
            throw SettingProblem.Exception([new("{z_marginal} linear cannot take isophotal sizes (the isophotal offset moves non-linearly with the mean SB, which the linearised marginal does not carry); use {z_marginal} quadrature, the default for isophotal joint fits")]);
        _groups = _rows.GroupCount;
        _bins = _rows.BinCount;
        if (_rows.MarginalisesRedshift && !_joint && cut is null) _sbKernel = SbKernel(_rows, cols, _bins, _linear);
        if (_linear && _joint && cut is null)
        {
            var cell = new int[_rows.Count];
            var ym = new double[_rows.Count];
            for (int i = 0; i < cell.Length; i++)
            {
                cell[i] = _rows.Group[i] * _bins + _rows.Bin[i];
                ym[i] = cols.Mu[i] - cols.Correction[i];
            }
            _jointKernel = new LinearisedJointKernel(cols.LnTheta, ym, cols.VarLnTheta, cols.VarMu, _rows.RedshiftVariance, _rows.Group, cell, _rows.Weight,
                _rows.NodeLn1pZ, _rows.NodeLnZ, _hasLum ? _rows.NodeLuminosityBase : null, _rows.LuminosityZSlope, _lnPivot,
                _rows.NodeLnDaFixed, _rows.LnDaSlopeFixed, _rows.NodeGrid, _rows.SlopeWeights);
        }
        if (_linear)
        {
            _inv1pz = _rows.NodeLn1pZ.Select(x => Math.Exp(-x)).ToArray();
            _invZ = _rows.NodeLnZ.Select(x => Math.Exp(-x)).ToArray();
        }

        var byName = new Dictionary<string, int>(StringComparer.Ordinal);
        for (int i = 0; i < h.Parameters.Count; i++) byName[h.Parameters[i].Name] = i;
        int Need(string name) => byName.TryGetValue(name, out var i) ? i : throw new ArgumentException($"hypothesis has no parameter '{name}'");
        _radiusIndex = Filled(_groups * _bins);
        _mu0Index = Filled(_groups * _bins);
        _evolutionIndex = Filled(_groups);
        _scatterIndex = Filled(_groups);
        _slopeIndex = Filled(_groups);
        _sbSlopeIndex = Filled(_groups);
        _sbEvolutionIndex = Filled(_groups);
        _scatterMagIndex = Filled(_groups);
        var labels = sv.GroupLabels;
        for (int g = 0; g < _groups; g++)
        {
            string l = labels[g];
            for (int k = 0; k < _bins; k++)
            {
                if (_joint) _radiusIndex[g * _bins + k] = Need(SurveyModel.Named(sv.Binned ? $"r0_kpc_bin{k + 1}" : NuisanceParameters.Names.R0Kpc, l));
                _mu0Index[g * _bins + k] = Need(SurveyModel.Named(sv.Binned ? $"mu0_bin{k + 1}" : NuisanceParameters.Names.Mu0, l));
            }
            if (_joint)
            {
                if (!sv.Binned) _evolutionIndex[g] = Need(SurveyModel.Named(NuisanceParameters.Names.SizeEvolution, l));
                _scatterIndex[g] = Need(SurveyModel.Named(NuisanceParameters.Names.ScatterDex, l));
                if (_hasLum)
                {
                    _slopeIndex[g] = Need(SurveyModel.Named(NuisanceParameters.Names.SizeLuminositySlope, l));
                    _sbSlopeIndex[g] = Need(SurveyModel.Named(NuisanceParameters.Names.SbLuminositySlope, l));
                }
            }
            if (!sv.Binned) _sbEvolutionIndex[g] = Need(SurveyModel.Named(NuisanceParameters.Names.SbEvolution, l));
            _scatterMagIndex[g] = Need(SurveyModel.Named(NuisanceParameters.Names.ScatterMag, l));
        }
        if (h.Nuisance.SizeSbRelation) _iKormendy = Need(NuisanceParameters.Names.KormendySlope);
        if (_hasLum) _iLumExp = h.Parameters.Select((p, i) => (p, i)).FirstOrDefault(t => t.p.Name == WorldModelParameters.Names.LuminosityExponent && t.p.IsFree, (null!, -1)).Item2;

        var notes = new List<string>(_rows.Notes);
        if (_rows.MarginalisesRedshift && !_linear)
            notes.Add("photometric redshifts (" + (_joint ? "joint" : "surface brightness") + "): at each redshift node the dimming 2.5 (n − b) log10(1+z)" +
                      (_joint ? ", D_A" : "") + (_rows.HasLuminosity ? ", the luminosities" : "") + (_cut is not null ? " and the selection truncation" : "") +
                      " move with z; K-corrections and extinctions are held at the catalogue's values.");
        if (_linear)
            notes.Add("photometric redshifts (" + (_joint ? "joint" : "surface brightness") + ", linearised): the slope ∂m/∂z at z̄ carries the dimming 2.5 (n − b)/(ln10 (1+z̄))" +
                      (_joint ? ", D_A's slope" : "") + (_rows.HasLuminosity ? ", the luminosities' slope" : "") +
                      "; K-corrections and extinctions are held at the catalogue's values (no slope)" +
                      (_cut is not null ? "; the selection truncation is taken at z̄ with the effective covariance (linearised too)" : "") + ".");
        if (_joint && _hasLum)
            notes.Add("size–" + (sv.Relation == SizeRelationKind.Mass ? "mass" : "luminosity") + " relation in the joint fit: sizes and surface brightnesses are both " +
                      "conditional on each object's " + (sv.Relation == SizeRelationKind.Mass ? "stellar mass" : "luminosity") + ", computed with each world model's own D_L " +
                      "(μ's mean is μ0 + 2.5 (n − b) log10(1+z) + K + A − 2.5 γ log10(X/X_pivot), γ = sb_luminosity_slope, plus κ times the relation's mean size). " +
                      "Where μ and L come from one photometry (μ = m + 5 log10 θ + 2.5 log10 2π), γ = 1 − 2β and b = −2a without a size–SB slope; " +
                      "the μ and size scatters are then one scatter, which this model takes as independent, so its intervals on b, μ0 and γ are too narrow. " +
                      "b is the SB change at fixed luminosity here, not luminosity evolution, so it is not judged against the expected range of luminosity evolution.");
        if (h.Nuisance.MagLimitIsConditioned) notes.Add(NuisanceModel.ConditionedMagLimitNote);
        Notes = notes;
    }

    private static int[] Filled(int n) => Enumerable.Repeat(-1, n).ToArray();

    // μ_i ~ N(μ0 + K_i + A_i + 2.5 (n − b) log10(1+z), σ_μ,i² + s_μ²) as the size kernels' Gaussian without distances: y = μ − K − A.
    // Linearised: LinearisedRedshiftKernel with ln D_A and its slope 0 and β = 0, so m = μ0 + k ln(1+z̄), m′ = k/(1+z̄) and
    // V = σ_μ,i² + s_μ² + m′² s² (k = 2.5 (n − b)/ln 10, the group's "a").
    private static IRedshiftMarginalKernel SbKernel(SurveyRows rows, ObjectColumns cols, int bins, bool linear)
    {
        int n = rows.Count;
        var y = new double[n];
        var cell = new int[n];
        for (int i = 0; i < n; i++)
        {
            y[i] = cols.Mu[i] - cols.Correction[i];
            cell[i] = rows.Group[i] * bins + rows.Bin[i];
        }
        if (linear)
        {
            var none = new double[n];
            return new LinearisedRedshiftKernel(y, cols.VarMu, rows.RedshiftVariance, rows.Group, cell, rows.GroupCount * bins, rows.Weight, rows.NodeLn1pZ,
                rows.NodeLnZ, null, 0, none, none, null, null);
        }
        return new RedshiftQuadratureKernel(rows.NodesPerObject, y, cols.VarMu, rows.Group, cell, rows.Weight, rows.NodeLn1pZ, rows.NodeLnZ, rows.NodeLogWeight,
            null, null, null);
    }

    /// <inheritdoc/>
    public double Sum(LikelihoodEvaluation e, in ModelPoint p, int start, int end) =>
        _sbKernel is not null ? SbKernelSum(e, start, end, null) : _jointKernel is not null ? JointKernelSum(e, start, end, null) : Accumulate(e, start, end, null);

    /// <inheritdoc/>
    public double SumWithAdjoint(LikelihoodEvaluation e, in ModelPoint p, int start, int end, ModelAdjoint adjoint) =>
        _sbKernel is not null ? SbKernelSum(e, start, end, adjoint) : _jointKernel is not null ? JointKernelSum(e, start, end, adjoint) : Accumulate(e, start, end, adjoint);

    // The linearised joint marginal without a cut on the kernel, its partial sums mapped to the free parameters once (see AddPartials and
    // AddSlopePartials for the per-object forms).
    private double JointKernelSum(LikelihoodEvaluation e, int start, int end, ModelAdjoint? adj)
    {
        var v = e.Values;
        int gb = _groups * _bins;
        Span<double> lnR0 = stackalloc double[gb], mu0 = stackalloc double[gb];
        Span<double> a = stackalloc double[_groups], sig = stackalloc double[_groups], beta = stackalloc double[_groups], nb = stackalloc double[_groups],
            sm = stackalloc double[_groups], gam = stackalloc double[_groups];
        for (int q = 0; q < gb; q++)
        {
            lnR0[q] = Math.Log(v[_radiusIndex[q]]);
            mu0[q] = v[_mu0Index[q]];
        }
        for (int g = 0; g < _groups; g++)
        {
            a[g] = _evolutionIndex[g] >= 0 ? v[_evolutionIndex[g]] : 0;
            sig[g] = Ln10 * v[_scatterIndex[g]];
            beta[g] = _slopeIndex[g] >= 0 ? v[_slopeIndex[g]] : 0;
            nb[g] = e.Dimming - (_sbEvolutionIndex[g] >= 0 ? v[_sbEvolutionIndex[g]] : 0);
            sm[g] = v[_scatterMagIndex[g]];
            gam[g] = _sbSlopeIndex[g] >= 0 ? v[_sbSlopeIndex[g]] : 0;
        }
        double kap = _iKormendy >= 0 ? v[_iKormendy] / Ln10 : 0;
        double eExp = _expanding ? 2.0 : _iLumExp >= 0 && double.IsFinite(v[_iLumExp]) ? v[_iLumExp] : _eFixed;
        var point = new LinearisedJointKernel.Point(lnR0, mu0, a, sig, beta, nb, sm, gam, kap, eExp);
        if (adj is null) return _jointKernel!.Sum(point, e.GridLnDaOverZ, start, end, null, null);
        var s = new LinearisedJointKernel.Partials(gb, _groups);
        double value = _jointKernel!.Sum(point, e.GridLnDaOverZ, start, end, s, adj.NodeAdjoint);
        var direct = adj.Direct ??= new double[_layout.FreeCount];
        for (int q = 0; q < gb; q++)
        {
            Add(direct, _radiusIndex[q], s.Size[q] / v[_radiusIndex[q]]);
            Add(direct, _mu0Index[q], s.Mu0[q]);
        }
        double sumDmL10 = 0;
        for (int g = 0; g < _groups; g++)
        {
            Add(direct, _evolutionIndex[g], s.A[g]);
            Add(direct, _sbEvolutionIndex[g], -2.5 * s.Dimming[g] / Ln10);
            sumDmL10 += s.Dimming[g] / Ln10;
            Add(direct, _scatterIndex[g], 2 * sig[g] * Ln10 * s.Sig2[g]);
            Add(direct, _scatterMagIndex[g], 2 * sm[g] * s.Sm2[g]);
            if (_hasLum)
            {
                Add(direct, _slopeIndex[g], s.Beta[g]);
                Add(direct, _sbSlopeIndex[g], s.Gam[g]);
            }
        }
        if (_hasLum) Add(direct, _iLumExp, s.EExp);
        if (_iKormendy >= 0) Add(direct, _iKormendy, s.Kappa / Ln10);
        AddDimming(e, direct, sumDmL10);
        return value;
    }

    // The surface-brightness quadrature or linearised marginal without a cut on the kernel: mean μ0 per cell, slope 2.5 (n − b_g)/ln 10 in ln(1+z), scatter s_μ,g;
    // the kernel's partials are ∂/∂μ0 per cell, Σ ∂/∂m ln(1+z) per group (so ∂/∂b = −2.5/ln10 times it, ∂/∂θ_c = 2.5/ln10 ∂n/∂θ_c times
    // their sum) and ∂/∂s_μ per group.
    private double SbKernelSum(LikelihoodEvaluation e, int start, int end, ModelAdjoint? adj)
    {
        var v = e.Values;
        int gb = _groups * _bins;
        Span<double> mu0 = stackalloc double[gb], slope = stackalloc double[_groups], zero = stackalloc double[_groups], sm = stackalloc double[_groups];
        for (int q = 0; q < gb; q++) mu0[q] = v[_mu0Index[q]];
        for (int g = 0; g < _groups; g++)
        {
            slope[g] = 2.5 * (e.Dimming - (_sbEvolutionIndex[g] >= 0 ? v[_sbEvolutionIndex[g]] : 0)) / Ln10;
            sm[g] = v[_scatterMagIndex[g]];
        }
        double dExp = 0;
        if (adj is null) return _sbKernel!.Sum(mu0, slope, zero, sm, 0, null, start, end, default, default, default, default, ref dExp, null);
        Span<double> dCell = stackalloc double[gb], dX = stackalloc double[_groups], dS = stackalloc double[_groups];
        double value = _sbKernel!.Sum(mu0, slope, zero, sm, 0, null, start, end, dCell, dX, dS, default, ref dExp, null);
        var direct = adj.Direct ??= new double[_layout.FreeCount];
        for (int q = 0; q < gb; q++) Add(direct, _mu0Index[q], dCell[q]);
        double sumDmL10 = 0;
        for (int g = 0; g < _groups; g++)
        {
            Add(direct, _sbEvolutionIndex[g], -2.5 * dX[g] / Ln10);
            Add(direct, _scatterMagIndex[g], dS[g]);
            sumDmL10 += dX[g] / Ln10;
        }
        AddDimming(e, direct, sumDmL10);
        return value;
    }

    // ∂/∂θ_c of the dimming term 2.5 (n − b) ℓ: 2.5 Σ w ∂/∂m_μ ℓ · ∂n/∂θ_c.
    private void AddDimming(LikelihoodEvaluation e, double[] direct, double sumDmL10)
    {
        if (e.DimmingDerivatives is not { } dn) return;
        for (int c = 0; c < _layout.FreeCosmological.Length; c++)
            Add(direct, _layout.FreeCosmological[c], 2.5 * sumDmL10 * dn[c]);
    }

    // Per-evaluation constants of one group (and bin).
    private struct GroupPoint
    {
        public double A, Sig, Beta, B, Sm, Gam;
    }

    // One point's partials: ∂ℓ/∂m_t, ∂ℓ/∂m_μ (isophotal slope included), ∂ℓ/∂V_t, ∂ℓ/∂V_μ, ∂ℓ/∂C, and ln R̄ and ln(L/L_pivot) at the point;
    // linearised photo-z: ∂ℓ/∂g_t and ∂ℓ/∂g_μ of the slope g = ∂(m_t, m_μ)/∂z, d ln R̄/dz and d ln(L/L_pivot)/dz at z̄.
    private struct Partials
    {
        public double Dt, Dm, Dvt, Dvm, Dc, LnSize, LnLum, Pt, Pm, SizeSlope, LumSlope;
    }

    // The linearised marginal at z̄ of object i: the effective-variance slope enters as V += s² g gᵀ (see the remarks).
    private readonly struct Linearised(double zVar, double inv1pz, double lnDaSlope)
    {
        public double ZVar { get; } = zVar;
        public double Inv1pz { get; } = inv1pz;
        public double LnDaSlope { get; } = lnDaSlope;
    }

    private double Accumulate(LikelihoodEvaluation e, int start, int end, ModelAdjoint? adj)
    {
        var v = e.Values;
        int gb = _groups * _bins;
        Span<double> lnR0 = stackalloc double[gb], mu0 = stackalloc double[gb];
        var gp = new GroupPoint[_groups];
        for (int q = 0; q < gb; q++)
        {
            lnR0[q] = _radiusIndex[q] >= 0 ? Math.Log(v[_radiusIndex[q]]) : 0;
            mu0[q] = v[_mu0Index[q]];
        }
        for (int g = 0; g < _groups; g++)
            gp[g] = new GroupPoint
            {
                A = _evolutionIndex[g] >= 0 ? v[_evolutionIndex[g]] : 0,
                Sig = _scatterIndex[g] >= 0 ? Ln10 * v[_scatterIndex[g]] : 0,
                Beta = _slopeIndex[g] >= 0 ? v[_slopeIndex[g]] : 0,
                B = _sbEvolutionIndex[g] >= 0 ? v[_sbEvolutionIndex[g]] : 0,
                Sm = v[_scatterMagIndex[g]],
                Gam = _sbSlopeIndex[g] >= 0 ? v[_sbSlopeIndex[g]] : 0,
            };
        double kap = _iKormendy >= 0 ? v[_iKormendy] / Ln10 : 0;
        double eExp = _expanding ? 2.0 : _iLumExp >= 0 && double.IsFinite(v[_iLumExp]) ? v[_iLumExp] : _eFixed;
        double dimming = e.Dimming;
        double[]? direct = null;
        double[]? nodeA = adj?.NodeAdjoint;
        if (adj is not null) direct = adj.Direct ??= new double[_layout.FreeCount];
        var rows = _rows;
        var wts = rows.Weight;
        int J = rows.NodesPerObject;
        Span<double> lp = stackalloc double[Math.Max(J, 1)];
        Span<double> lnDaj = stackalloc double[Math.Max(J, 1)];
        var pj = new Partials[Math.Max(J, 1)];
        double acc = 0, sumDmL10 = 0;
        for (int i = start; i < end; i++)
        {
            double w = wts?[i] ?? 1.0;
            if (w == 0) continue;
            int g = rows.Group[i], q0 = g * _bins + rows.Bin[i];
            ref readonly var G = ref gp[g];
            if (!rows.MarginalisesRedshift)
            {
                double lnDa = _joint ? (_lnDaFixed is not null ? _lnDaFixed[i] : rows.LnZ[i] + _grid!.Interpolate(e.GridLnDaOverZ, i)) : 0;
                double li = PointLogDensity(i, lnR0[q0], mu0[q0], G, kap, dimming, eExp, rows.Ln1pZ[i], lnDa, rows.LuminosityBase?[i] ?? 0, adj is not null, out var d);
                if (double.IsNegativeInfinity(li)) return double.NegativeInfinity;
                acc += w * li;
                if (adj is not null)
                {
                    AddPartials(direct!, v, g, q0, w, d, kap, G, eExp, rows.Ln1pZ[i]);
                    sumDmL10 += w * d.Dm * rows.Ln1pZ[i] / Ln10;
                    if (nodeA is not null && _grid is not null) ScatterNodes(nodeA, _grid, i, -w * (d.Dt * (2 * G.Beta - 1) + 2 * (kap * G.Beta + SbMagPerLn * G.Gam) * d.Dm));
                }
                continue;
            }
            if (_linear)
            {
                // One node per object, at z̄: the bivariate (or univariate) Gaussian with covariance C + s² g gᵀ.
                double x = rows.NodeLn1pZ[i];
                double lnDa = 0, lnDaSlope = 0;
                if (_joint)
                {
                    lnDa = rows.NodeLnDaFixed is not null ? rows.NodeLnDaFixed[i] : rows.NodeLnZ[i] + rows.NodeGrid!.Interpolate(e.GridLnDaOverZ, i);
                    lnDaSlope = rows.LnDaSlopeFixed is not null ? rows.LnDaSlopeFixed[i] : _invZ[i] + GridSlope(e.GridLnDaOverZ!, i);
                }
                var lin = new Linearised(rows.RedshiftVariance[i], _inv1pz[i], lnDaSlope);
                double li = PointLogDensity(i, lnR0[q0], mu0[q0], G, kap, dimming, eExp, x, lnDa, rows.HasLuminosity ? rows.NodeLuminosityBase[i] : 0,
                    adj is not null, out var d, lin);
                if (double.IsNegativeInfinity(li)) return double.NegativeInfinity;
                acc += w * li;
                if (adj is null) continue;
                AddPartials(direct!, v, g, q0, w, d, kap, G, eExp, x);
                sumDmL10 += w * (d.Dm * x + d.Pm * lin.Inv1pz) / Ln10;
                AddSlopePartials(direct!, g, w, d, kap, G, lin.Inv1pz);
                if (nodeA is not null && rows.NodeGrid is not null)
                {
                    double f = 2 * (kap * G.Beta + SbMagPerLn * G.Gam);
                    ScatterNodes(nodeA, rows.NodeGrid, i, -w * (d.Dt * (2 * G.Beta - 1) + f * d.Dm));
                    // The slope stencil: ∂g_t/∂S = 2β − 1, ∂g_μ/∂S = 2(κβ + (−2.5/ln10) γ), S = d ln D_A/dz.
                    double fs = -w * (d.Pt * (2 * G.Beta - 1) + f * d.Pm);
                    for (int s = 0, j = rows.NodeGrid.Index[i], k = 4 * i; s < 4; s++) nodeA[j + s] += fs * rows.SlopeWeights![k + s];
                }
                continue;
            }
            double max = double.NegativeInfinity;
            if (!_joint && _cut is null)
            {
                // Surface brightness without a cut: the variance, and so its logarithm, is the same at every node of the object.
                double vs = _cols.VarMu[i] + G.Sm * G.Sm, inv = 1 / vs, c0 = -0.5 * Math.Log(vs) - HalfLn2Pi;
                double mBase = mu0[q0] + _cols.Correction[i], slope = 2.5 * (dimming - G.B) / Ln10;
                for (int j = 0; j < J; j++)
                {
                    int q = i * J + j;
                    double r = _cols.Mu[i] - (mBase + slope * rows.NodeLn1pZ[q]);
                    lp[j] = rows.NodeLogWeight[q] - 0.5 * r * r * inv + c0; // −∞ for a dropped node
                    if (lp[j] > max) max = lp[j];
                    if (adj is not null) pj[j] = new Partials { Dm = r * inv, Dvm = 0.5 * (r * r * inv * inv - inv) };
                }
            }
            else
            {
                for (int j = 0; j < J; j++)
                {
                    int q = i * J + j;
                    if (double.IsNegativeInfinity(rows.NodeLogWeight[q])) { lp[j] = double.NegativeInfinity; continue; }
                    lnDaj[j] = _joint ? (rows.NodeLnDaFixed is not null ? rows.NodeLnDaFixed[q] : rows.NodeLnZ[q] + rows.NodeGrid!.Interpolate(e.GridLnDaOverZ, q)) : 0;
                    lp[j] = rows.NodeLogWeight[q] + PointLogDensity(i, lnR0[q0], mu0[q0], G, kap, dimming, eExp, rows.NodeLn1pZ[q], lnDaj[j],
                        rows.HasLuminosity ? rows.NodeLuminosityBase[q] : 0, adj is not null, out pj[j]);
                    if (lp[j] > max) max = lp[j];
                }
            }
            if (double.IsNegativeInfinity(max)) return double.NegativeInfinity;
            // lp becomes e^(lp − max) (0 for a dropped node), reused for the shares.
            double sum = 0;
            for (int j = 0; j < J; j++) sum += lp[j] = Math.Exp(lp[j] - max);
            acc += w * (max + Math.Log(sum));
            if (adj is null) continue;
            for (int j = 0; j < J; j++)
            {
                if (lp[j] == 0) continue;
                int q = i * J + j;
                double share = w * lp[j] / sum;
                AddPartials(direct!, v, g, q0, share, pj[j], kap, G, eExp, rows.NodeLn1pZ[q]);
                sumDmL10 += share * pj[j].Dm * rows.NodeLn1pZ[q] / Ln10;
                if (nodeA is not null && rows.NodeGrid is not null)
                    ScatterNodes(nodeA, rows.NodeGrid, q, -share * (pj[j].Dt * (2 * G.Beta - 1) + 2 * (kap * G.Beta + SbMagPerLn * G.Gam) * pj[j].Dm));
            }
        }
        if (adj is not null) AddDimming(e, direct!, sumDmL10);
        return acc;
    }

    // ln p(θ_i, μ_i | z) (or ln p(μ_i | z)) at one redshift, with the selection truncation; −∞ where an isophotal object cannot be seen.
    // Linearised (lin.ZVar > 0): the slopes g_μ = 2.5 (n − b)/(ln10 (1+z̄)) + κ d ln R̄/dz − (2.5/ln10) γ d ln L/dz and
    // g_t = d ln R̄/dz − d ln D_A/dz, d ln R̄/dz = a/(1+z̄) + β d ln L/dz, d ln L/dz = (2e − s_C)/(1+z̄) + 2 d ln D_A/dz, add s² g gᵀ to the
    // covariance (the truncation, if any, is taken with it); d.Pt, d.Pm are then ∂ℓ/∂g = s² (2 D_V g + D_C g_other).
    private double PointLogDensity(int i, double lnR0, double mu0, in GroupPoint G, double kap, double dimming, double eExp, double x, double lnDa, double lumBase,
        bool partials, out Partials d, in Linearised lin = default)
    {
        d = default;
        double l10 = x / Ln10, s2z = lin.ZVar;
        double mm = mu0 + 2.5 * (dimming - G.B) * l10 + _cols.Correction[i];
        double gm = 2.5 * (dimming - G.B) * lin.Inv1pz / Ln10;
        if (!_joint)
        {
            double vs = _cols.VarMu[i] + G.Sm * G.Sm + s2z * gm * gm, r = _cols.Mu[i] - mm, inv = 1 / vs;
            double lp = -0.5 * (r * r * inv + Math.Log(vs)) - HalfLn2Pi;
            double smm = 0, svm = 0;
            if (_cut is not null) lp -= partials ? _cut.LogPass(0, mm, 0, vs, 0, out _, out smm, out _, out svm, out _) : _cut.LogPass(0, mm, 0, vs, 0);
            d.Dm = r * inv - smm;
            d.Dvm = 0.5 * (r * r * inv * inv - inv) - svm;
            d.Pm = s2z * 2 * d.Dvm * gm;
            return lp;
        }
        double lnLum = _hasLum ? lumBase + 2 * (lnDa + eExp * x) : 0;
        double lnSize = lnR0 + G.A * x + G.Beta * lnLum;
        double mt = lnSize + ModelPoint.LnKpcPerMpc - lnDa;
        mm += kap * (lnSize - _lnPivot) + SbMagPerLn * G.Gam * lnLum;
        double lumSlope = _hasLum ? (2 * eExp - _rows.LuminosityZSlope) * lin.Inv1pz + 2 * lin.LnDaSlope : 0;
        double sizeSlope = G.A * lin.Inv1pz + G.Beta * lumSlope;
        double gt = sizeSlope - lin.LnDaSlope;
        gm += kap * sizeSlope + SbMagPerLn * G.Gam * lumSlope;
        double isoSlope = 0;
        if (_isophotal is not null)
        {
            if (!_isophotal.TryOffset(mm, i, out double lnRatio, out isoSlope)) return double.NegativeInfinity;
            mt += lnRatio;
        }
        double sig2 = G.Sig * G.Sig, c = kap * sig2 + s2z * gt * gm;
        double vt = _cols.VarLnTheta[i] + sig2 + s2z * gt * gt, vm = _cols.VarMu[i] + G.Sm * G.Sm + kap * kap * sig2 + s2z * gm * gm;
        double det = vt * vm - c * c, idet = 1 / det;
        double rt = _cols.LnTheta[i] - mt, rm = _cols.Mu[i] - mm;
        double value = -0.5 * ((vm * rt * rt - 2 * c * rt * rm + vt * rm * rm) * idet + Math.Log(det)) - 2 * HalfLn2Pi;
        if (!partials)
        {
            if (_cut is not null) value -= _cut.LogPass(mt, mm, vt, vm, c);
            return value;
        }
        double at = (vm * rt - c * rm) * idet, am = (vt * rm - c * rt) * idet;
        double dt = at, dm = am;
        double dvt = 0.5 * (at * at - vm * idet), dvm = 0.5 * (am * am - vt * idet), dc = at * am + c * idet;
        if (_cut is not null)
        {
            value -= _cut.LogPass(mt, mm, vt, vm, c, out double smt, out double smm, out double svt, out double svm, out double sc);
            dt -= smt; dm -= smm; dvt -= svt; dvm -= svm; dc -= sc;
        }
        dm += dt * isoSlope;
        d = new Partials
        {
            Dt = dt, Dm = dm, Dvt = dvt, Dvm = dvm, Dc = dc, LnSize = lnSize, LnLum = lnLum,
            Pt = s2z * (2 * dvt * gt + dc * gm), Pm = s2z * (2 * dvm * gm + dc * gt), SizeSlope = sizeSlope, LumSlope = lumSlope,
        };
        return value;
    }

    // The linearised marginal's slope partials (w ∂ℓ/∂g_t = w Pt, w ∂ℓ/∂g_μ = w Pm) into a, β, γ, κ, b and e (the dimming's θ_c and the
    // grid nodes are added by the caller): ∂g_t/∂a = 1/(1+z̄) and ∂g_μ/∂a = κ/(1+z̄); ∂/∂β: d ln L/dz (times 1 and κ); ∂g_μ/∂γ =
    // −2.5/ln10 d ln L/dz; ∂g_μ/∂κ = d ln R̄/dz; ∂g_μ/∂b = −2.5/(ln10 (1+z̄)); ∂ d ln L/dz/∂e = 2/(1+z̄).
    private void AddSlopePartials(double[] direct, int g, double w, in Partials d, double kap, in GroupPoint G, double inv1pz)
    {
        double pt = w * d.Pt, pm = w * d.Pm;
        Add(direct, _sbEvolutionIndex[g], -2.5 * pm * inv1pz / Ln10);
        if (!_joint) return;
        double pSize = pt + kap * pm; // ∂ℓ/∂(d ln R̄/dz)
        Add(direct, _evolutionIndex[g], pSize * inv1pz);
        if (_hasLum)
        {
            Add(direct, _slopeIndex[g], pSize * d.LumSlope);
            Add(direct, _sbSlopeIndex[g], pm * SbMagPerLn * d.LumSlope);
            Add(direct, _iLumExp, (pSize * G.Beta + pm * SbMagPerLn * G.Gam) * 2 * inv1pz);
        }
        if (_iKormendy >= 0) Add(direct, _iKormendy, pm * d.SizeSlope / Ln10);
    }

    // d(ln D_A − ln z)/dz at object i's z̄ from the grid's node values (RedshiftGridSlope's weights on its node's stencil).
    private double GridSlope(double[] g, int i)
    {
        int j = _rows.NodeGrid!.Index[i], k = 4 * i;
        var w = _rows.SlopeWeights!;
        return w[k] * g[j] + w[k + 1] * g[j + 1] + w[k + 2] * g[j + 2] + w[k + 3] * g[j + 3];
    }

    private void AddPartials(double[] direct, double[] v, int g, int q0, double w, in Partials d, double kap, in GroupPoint G, double eExp, double x)
    {
        double dm = w * d.Dm;
        Add(direct, _mu0Index[q0], dm);
        Add(direct, _sbEvolutionIndex[g], -2.5 * dm * x / Ln10);
        Add(direct, _scatterMagIndex[g], 2 * G.Sm * w * d.Dvm);
        if (!_joint) return;
        double dSize = w * (d.Dt + kap * d.Dm); // ∂ℓ/∂ln R̄
        Add(direct, _radiusIndex[q0], dSize / v[_radiusIndex[q0]]);
        Add(direct, _evolutionIndex[g], dSize * x);
        Add(direct, _scatterIndex[g], 2 * G.Sig * Ln10 * w * (d.Dvt + kap * kap * d.Dvm + kap * d.Dc));
        if (_hasLum)
        {
            Add(direct, _slopeIndex[g], dSize * d.LnLum);
            Add(direct, _sbSlopeIndex[g], dm * SbMagPerLn * d.LnLum);
            Add(direct, _iLumExp, (dSize * 2 * G.Beta + dm * 2 * SbMagPerLn * G.Gam) * x);
        }
        if (_iKormendy >= 0)
        {
            double sig2 = G.Sig * G.Sig;
            Add(direct, _iKormendy, w * (d.Dm * (d.LnSize - _lnPivot) + 2 * kap * sig2 * d.Dvm + sig2 * d.Dc) / Ln10);
        }
    }

    private void Add(double[] direct, int full, double value)
    {
        int j = _layout.FreeIndex(full);
        if (j >= 0) direct[j] += value;
    }

    // The adjoint of RedshiftGrid.Interpolate: value times the row's four stencil weights onto their nodes.
    private static void ScatterNodes(double[] nodeAdjoint, RedshiftGrid grid, int row, double value)
    {
        for (int s = 0, j = grid.Index[row], k = 4 * row; s < 4; s++) nodeAdjoint[j + s] += value * grid.Weights[k + s];
    }

    /// <summary>Data-driven start values for R0 and μ0 (per group and bin): the medians implied by the objects at the start parameters.</summary>
    public void SuggestStart(double[] start, IReadOnlyList<ParameterSetting> free, Hypothesis h, LikelihoodEvaluation e)
    {
        var v = e.Values;
        double eExp = _expanding ? 2.0 : _eFixed;
        var rows = _rows;
        for (int gb = 0; gb < _groups * _bins; gb++)
        {
            var sizes = new List<double>();
            var sbs = new List<double>();
            for (int i = 0; i < rows.Count; i++)
            {
                if (rows.Group[i] * _bins + rows.Bin[i] != gb || (rows.Weight?[i] ?? 1) == 0) continue;
                int g = rows.Group[i];
                double x = rows.Ln1pZ[i];
                double b = _sbEvolutionIndex[g] >= 0 ? v[_sbEvolutionIndex[g]] : 0;
                sbs.Add(_cols.Mu[i] - 2.5 * (e.Dimming - b) * x / Ln10 - _cols.Correction[i]);
                if (!_joint) continue;
                double lnDa = _lnDaFixed is not null ? _lnDaFixed[i] : rows.LnZ[i] + _grid!.Interpolate(e.GridLnDaOverZ, i);
                double t = _cols.LnTheta[i] + lnDa - ModelPoint.LnKpcPerMpc - (_evolutionIndex[g] >= 0 ? v[_evolutionIndex[g]] : 0) * x;
                if (_hasLum) t -= v[_slopeIndex[g]] * (rows.LuminosityBase![i] + 2 * (lnDa + eExp * x));
                if (_isophotal is not null && _isophotal.TryOwnOffset(_cols.Mu[i], i, out double lr)) t -= lr;
                sizes.Add(t);
            }
            Set(start, free, h, _mu0Index[gb], Median(sbs));
            if (_joint && Median(sizes) is { } m && double.IsFinite(m)) Set(start, free, h, _radiusIndex[gb], Math.Exp(m));
        }
    }

    private static double Median(List<double> t)
    {
        if (t.Count == 0) return double.NaN;
        t.Sort();
        return t[t.Count / 2];
    }

    private static void Set(double[] start, IReadOnlyList<ParameterSetting> free, Hypothesis h, int full, double value)
    {
        if (full < 0 || !double.IsFinite(value)) return;
        string name = h.Parameters[full].Name;
        for (int j = 0; j < free.Count; j++)
            if (free[j].Name == name) start[j] = Math.Clamp(value, free[j].Min, free[j].Max);
    }
}
