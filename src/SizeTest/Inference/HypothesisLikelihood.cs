using SizeTest.Foundation.Errors;
using SizeTest.Cosmology;
using SizeTest.Inference.Likelihood;
using SizeTest.Photometry;

namespace SizeTest.Inference;

/// <summary>
/// The log-likelihood of a <see cref="Hypothesis"/> for a set of <see cref="Observables"/>, over the
/// hypothesis's free parameters. It is a sum over objects: <see cref="Prepare(ReadOnlySpan{double}, bool)"/> computes everything that
/// depends only on the parameters and redshift (D_A on a <see cref="RedshiftGrid"/>), <see cref="SumSlice"/>
/// adds the objects of a row range [start, end), and partial sums add up to <see cref="LogDensity"/>
/// (threads here; ranks later, one reduction per evaluation). <see cref="SumSliceWithGradient"/> gives the analytic gradient
/// of each part (<see cref="ISlicedLogLikelihood"/>).
/// </summary>
/// <remarks>
/// <para>The parts live in <c>Inference/Likelihood/</c>: <see cref="Likelihood.ParameterLayout"/> (indices and the chain rule to θ),
/// <see cref="Likelihood.DistanceTerms"/> (ln D_A on the redshift grid and its cosmological derivatives),
/// <see cref="Likelihood.SizeKernel"/>, <see cref="Likelihood.SurfaceBrightnessKernel"/>, <see cref="Likelihood.JointKernel"/>
/// (with <see cref="Likelihood.IsophotalCorrection"/>), <see cref="Likelihood.SelectionTruncation"/> and the vectorised
/// <see cref="Likelihood.GaussianCore"/>. This class binds them and splits evaluations over threads.</para>
/// <para>Angular size (radians): ln θ_i ~ N(ln[R0 (1+z_i)^a / D_A(z_i)], σ_i² + σ_R²) with σ_R = ln10 · scatter_dex
/// and R0 in kpc (θ = 10⁻³ R[kpc] / D_A[Mpc]). Only R0·H0 is constrained (D_A ∝ 1/H0).</para>
/// <para>Surface brightness (Tolman 1930): μ_i ~ N(μ0 + 2.5 (n − b) log10(1+z_i) + K_i + A_i, σ_μ,i² + σ_μ²), n the
/// world model's bolometric dimming exponent plus <see cref="NuisanceModel.DimmingExponentOffset"/>.</para>
/// <para>Joint: (ln θ_i, μ_i) bivariate Gaussian. With the size–SB relation the intrinsic μ is
/// μ0 + κ (log10 R_true − log10 R_pivot) + dimming + K + A, so the mean μ uses log10 of the mean size
/// R0 (1+z)^a, Var μ gains (κ/ln10)² σ_R² and Cov(ln θ, μ) = (κ/ln10) σ_R².</para>
/// <para>Selection: each density is divided by the probability of passing the cuts at the object's redshift,
/// Φ of the standardised limit (one cut) or the bivariate Φ₂ (two cuts; Genz 2004) [truncated Gaussian,
/// common practice]. The magnitude is m = μ − 5 log10(θ/″) − 2.5 log10(2π).</para>
/// <para>Isophotal sizes (<see cref="Observables.SizeDefinition"/> of kind <see cref="Catalogues.SizeKind.Isophotal"/>; joint
/// only): the mean ln θ becomes ln θ_iso = ln[R0 (1+z)^a / D_A] + ln(r_iso/R_e) with r_iso/R_e from
/// <see cref="IsophotalSize"/> for each object's Sérsic index (<see cref="SurveyObservables.SersicN"/>, the <c>sersic_n</c> column,
/// where mapped; else the sample-wide <see cref="Observables.SersicIndex"/>), the isophote
/// <see cref="Observables.Isophote"/> and the model's mean observed SB at R_e, μ_e,obs = μ0 + 2.5 (n − b) log10(1+z)
/// + K + A (+ κ term), i.e. mu0 is read as the rest-frame SB at R_e (Graham &amp; Driver 2005 eq. 5). Where the model's
/// observed central SB is fainter than the isophote the object could not be in the sample: its density, and the whole
/// ln L, is −∞. The SB scatter is not propagated into ln(r_iso/R_e) (the correction uses the mean μ_e,obs).</para>
/// </remarks>
public sealed class HypothesisLikelihood : ISlicedLogLikelihood
{
    private readonly Hypothesis _h;
    private readonly int _n;
    private readonly ParameterSetting[] _free;
    private readonly ParameterLayout _layout;
    private readonly ObjectColumns _cols;
    private readonly DistanceTerms _distances;
    private readonly IObservableKernel _kernel;
    private readonly IsophotalCorrection? _isophotal;
    private readonly double _lnPivot;
    private readonly PriorTimesLikelihood _posterior;

    /// <summary>Objects per chunk when a single evaluation is split over threads.</summary>
    public const int ChunkSize = 32768;

    /// <summary>Binds <paramref name="hypothesis"/> to <paramref name="observables"/>.</summary>
    /// <param name="hypothesis">The hypothesis.</param>
    /// <param name="observables">The objects.</param>
    /// <param name="sharedGrid">When these objects are one part of a larger sample (a rank's share), the whole sample's
    /// redshift bounds and size: the D_A grid of a free-cosmology fit then spans them, so the parts add up to the
    /// whole-sample likelihood for any split. Null: the grid spans these objects.</param>
    /// <exception cref="InputException">The observables lack what the observable kind needs.</exception>
    public HypothesisLikelihood(Hypothesis hypothesis, Observables observables, RedshiftGridSpan? sharedGrid = null)
    {
        ArgumentNullException.ThrowIfNull(hypothesis);
        ArgumentNullException.ThrowIfNull(observables);
        _h = hypothesis;
        _n = observables.Count;
        var kind = hypothesis.Nuisance.Observable;
        if (_n == 0) throw new InputException("the sample has no accepted objects to fit");
        bool size = kind != ObservableKind.SurfaceBrightness, sb = kind != ObservableKind.Size;
        _cols = ObjectColumns.For(observables, size, sb);
        if (size && observables.SizeDefinition.Kind == Catalogues.SizeKind.Isophotal)
        {
            if (kind != ObservableKind.Joint)
                throw SettingProblem.Exception([new("the sizes are isophotal: fit them with {observable} joint, which predicts each object's isophotal radius from the surface-brightness model (mu0, sb_evolution; hold them with {fix} if they are known)")]);
            if (hypothesis.Nuisance.Cuts.MagLimit is not null)
                throw SettingProblem.Exception([new("{mag_limit} cannot be combined with isophotal sizes (the total magnitude is not a function of the isophotal size); drop the magnitude cut")]);
            var isophote = observables.Isophote ?? throw new InputException("the sizes are isophotal but the observables carry no isophote level; build them with the photometry stage");
            // Each object's own Sérsic index (sersic_n column) where mapped, else the sample-wide index.
            _isophotal = observables.Survey.SersicN is { } perObject
                ? new IsophotalCorrection(perObject, isophote)
                : new IsophotalCorrection(new IsophotalSize(observables.SersicIndex
                    ?? throw SettingProblem.Exception([new("the sizes are isophotal: set a Sérsic index (e.g. {sersic_n} 1) or map a sersic_n column so the fit can predict isophotal radii")])), isophote);
        }
        _free = hypothesis.FreeParameters.ToArray();
        _layout = new ParameterLayout(hypothesis);
        _lnPivot = Math.Log(hypothesis.Nuisance.PivotSizeKpc);
        var survey = hypothesis.Nuisance.SurveyTerms;
        double gridMinZ = sharedGrid?.MinZ ?? observables.Z.Min(), gridMaxZ = sharedGrid?.MaxZ ?? observables.Z.Max();
        // A part of a larger sample (a rank's share, or the CLI's one-object column check) cannot judge sample-wide conditions
        // such as an empty luminosity window.
        bool wholeSample = sharedGrid is null || sharedGrid.ObjectCount == observables.Count;
        double priorMinZ = survey.RedshiftPriorMin ?? gridMinZ, priorMaxZ = survey.RedshiftPriorMax ?? gridMaxZ;
        if (survey.MarginaliseRedshift)
        {
            // Photometric redshifts: a uniform-in-ln z grid over the data and prior range, so the quadrature nodes share its nodes.
            gridMinZ = Math.Min(gridMinZ, priorMinZ);
            gridMaxZ = Math.Max(gridMaxZ, priorMaxZ);
            sharedGrid = new RedshiftGridSpan(gridMinZ, gridMaxZ, sharedGrid?.ObjectCount ?? _n);
        }
        _distances = new DistanceTerms(hypothesis, _layout, observables.Z, size, sharedGrid);
        var cut = SelectionTruncation.For(hypothesis.Nuisance.Cuts);
        if (survey.IsActive)
        {
            var startModel = _distances.CreateModel(hypothesis.FullValues(hypothesis.StartVector()))
                             ?? throw new ArgumentException($"world model '{hypothesis.Family.Name}' cannot be built from its start parameters");
            if (kind == ObservableKind.Size)
                _kernel = _survey = new Survey.SurveySizeLikelihood(hypothesis, _layout, observables, _distances.FixedLnDa, _distances.Grid, gridMinZ, gridMaxZ, priorMinZ, priorMaxZ, startModel, wholeSample);
            else
            {
                // With a size–luminosity relation the fit conditions on the luminosities, which come from the apparent magnitudes: a
                // magnitude limit selects on them and so does not truncate the likelihood (SurveyJointLikelihood's notes say so).
                if (hypothesis.Nuisance.MagLimitIsConditioned)
                    cut = SelectionTruncation.For(hypothesis.Nuisance.Cuts with { MagLimit = null });
                _kernel = _surveyJoint = new Survey.SurveyJointLikelihood(hypothesis, _layout, observables, _cols, _distances, cut, _isophotal, gridMinZ, gridMaxZ, priorMinZ, priorMaxZ, startModel, wholeSample);
            }
        }
        else
            _kernel = kind switch
            {
                ObservableKind.Size => new SizeKernel(_cols, _distances, cut),
                ObservableKind.SurfaceBrightness => new SurfaceBrightnessKernel(_cols, cut),
                _ => new JointKernel(_cols, _distances, cut, _isophotal),
            };
        _posterior = new PriorTimesLikelihood(this, _free.Select(f => f.Prior).ToArray());
    }

    private HypothesisLikelihood(HypothesisLikelihood parent, Hypothesis hypothesis)
    {
        _h = hypothesis;
        _n = parent._n;
        _cols = parent._cols;
        _isophotal = parent._isophotal;
        _free = hypothesis.FreeParameters.ToArray();
        _layout = new ParameterLayout(hypothesis);
        _lnPivot = parent._lnPivot;
        var cut = SelectionTruncation.For(hypothesis.Nuisance.Cuts);
        bool size = hypothesis.Nuisance.Observable == ObservableKind.Size;
        _distances = new DistanceTerms(hypothesis, _layout, parent._distances, parent._cols.LnZ, perObject: !(size && SizeKernel.UsesGrams(_cols, cut)));
        _mask = parent._mask;
        _selected = parent._selected;
        if (_mask is not null && !(size && SizeKernel.SupportsMask(_cols, _distances, cut)))
            throw new InvalidOperationException("the held-fixed likelihood of a row-masked likelihood cannot take the mask");
        _kernel = hypothesis.Nuisance.Observable switch
        {
            ObservableKind.Size => new SizeKernel(_cols, _distances, cut, (parent._kernel as SizeKernel)?.Grams, _mask),
            ObservableKind.SurfaceBrightness => new SurfaceBrightnessKernel(_cols, cut),
            _ => new JointKernel(_cols, _distances, cut, _isophotal),
        };
        AllowParallel = parent.AllowParallel;
        _posterior = new PriorTimesLikelihood(this, _free.Select(f => f.Prior).ToArray());
    }

    // A row-masked view of a parent's rows (cross-validation folds): shares every bound array; only the kernel differs.
    private HypothesisLikelihood(HypothesisLikelihood parent, byte[] mask, int selected, SizeKernel kernel)
    {
        _h = parent._h;
        _n = parent._n;
        _cols = parent._cols;
        _isophotal = parent._isophotal;
        _free = parent._free;
        _layout = parent._layout;
        _lnPivot = parent._lnPivot;
        _distances = parent._distances;
        _mask = mask;
        _selected = selected;
        _kernel = kernel;
        AllowParallel = parent.AllowParallel;
        _posterior = new PriorTimesLikelihood(this, _free.Select(f => f.Prior).ToArray());
    }

    private readonly byte[]? _mask;
    private readonly int _selected = -1;

    /// <summary>Whether this likelihood counts only a row mask's rows of its parent (<see cref="Masked"/>).</summary>
    internal bool IsMasked => _mask is not null;

    /// <summary>
    /// The likelihood of the rows with <paramref name="mask"/>[i] ≠ 0 only, over this likelihood's bound rows, grid and
    /// per-object arrays (no copy of the rows and no second bind) — the same value and gradient, summed in the same
    /// order, as binding a copy of those rows; slices keep this likelihood's row numbering. Null where the kernel cannot
    /// mask rows (<see cref="SizeKernel.SupportsMask"/>: angular sizes with equal ln θ variances, no cut, no survey terms),
    /// or when this likelihood is itself masked: then bind a copy of the rows.
    /// </summary>
    public HypothesisLikelihood? Masked(byte[] mask)
    {
        ArgumentNullException.ThrowIfNull(mask);
        if (mask.Length != _n) throw new ArgumentException($"a mask of {mask.Length} rows for {_n} objects", nameof(mask));
        var cut = SelectionTruncation.For(_h.Nuisance.Cuts);
        if (_mask is not null || HasSurveyTerms || _h.Nuisance.Observable != ObservableKind.Size || !SizeKernel.SupportsMask(_cols, _distances, cut))
            return null;
        int selected = 0;
        foreach (var b in mask) if (b != 0) selected++;
        return new HypothesisLikelihood(this, mask, selected, new SizeKernel(_cols, _distances, cut, null, mask));
    }

    /// <summary>
    /// This likelihood with free parameter <paramref name="name"/> held at <paramref name="value"/> (the likelihood of
    /// <c>Hypothesis.WithFixed(name, value)</c>), sharing the bound per-object data and the redshift grid instead of
    /// binding again — the cheap inner likelihood of profile scans. With a grid, the distances stay the grid's
    /// interpolation, so the profile and the full fit see the same ln L.
    /// </summary>
    /// <exception cref="InvalidOperationException">Survey terms are active (bind <c>Hypothesis.WithFixed</c> instead).</exception>
    public HypothesisLikelihood WithFixed(string name, double value) =>
        !HasSurveyTerms ? new(this, _h.WithFixed(name, value))
            : throw new InvalidOperationException("WithFixed does not carry survey terms; bind hypothesis.WithFixed(name, value) to the observables instead");
    // Survey terms (size–luminosity relation, groups, binned evolution, photometric redshifts, Gaussian size errors,
    // weights, luminosity window): the size kernel when any is active.
    private readonly Survey.SurveySizeLikelihood? _survey;
    // The same terms for surface brightness and joint fits.
    private readonly Survey.SurveyJointLikelihood? _surveyJoint;

    /// <summary>Whether survey terms are active (then <see cref="WithFixed"/> is not available).</summary>
    public bool HasSurveyTerms => _survey is not null || _surveyJoint is not null;

    /// <summary>Notes on the survey terms applied (empty when none).</summary>
    public IReadOnlyList<string> SurveyNotes => _survey?.Notes ?? _surveyJoint?.Notes ?? [];

    /// <summary>Σ w and the number of objects with w &gt; 0 over rows [<paramref name="start"/>, <paramref name="end"/>) under this
    /// model's survey weights (the weight column times the luminosity window; every weight 1 without survey weights).</summary>
    internal (double WeightSum, int Objects) ModelWeights(int start, int end)
    {
        var w = _survey?.RowWeights ?? _surveyJoint?.RowWeights;
        if (w is null) return (end - start, end - start);
        double sum = 0;
        int count = 0;
        for (int i = start; i < end; i++)
        {
            sum += w[i];
            if (w[i] > 0) count++;
        }
        return (sum, count);
    }

    /// <summary>
    /// A data-driven starting vector: the hypothesis's start values, with r0_kpc set to the median physical size
    /// implied by the default world model and mu0 to the median surface brightness corrected for dimming.
    /// </summary>
    public double[] SuggestStart()
    {
        var start = _h.StartVector();
        var e = Prepare(start);
        if (e is null) return start;
        if (_survey is not null) { _survey.SuggestStart(start, _free, _h, e); return start; }
        if (_surveyJoint is not null) { _surveyJoint.SuggestStart(start, _free, _h, e); return start; }
        var p = Point(e);
        for (int j = 0; j < _free.Length; j++)
        {
            var name = _free[j].Name;
            double? guess = null;
            if (name == NuisanceParameters.Names.R0Kpc && _cols.LnTheta.Length == _n)
            {
                var t = new double[_n];
                for (int i = 0; i < _n; i++)
                {
                    t[i] = _cols.LnTheta[i] + _distances.LnDa(e, i, _cols.LnZ) - ModelPoint.LnKpcPerMpc - p.A * _cols.Ln1pZ[i];
                    // Isophotal: undo ln(r_iso/R_e) estimated from the object's own μ (model-independent).
                    if (_isophotal is not null && _isophotal.TryOwnOffset(_cols.Mu[i], i, out double lr)) t[i] -= lr;
                }
                guess = Math.Exp(Median(t));
            }
            else if (name == NuisanceParameters.Names.Mu0 && _cols.Mu.Length == _n)
            {
                var t = new double[_n];
                for (int i = 0; i < _n; i++) t[i] = _cols.Mu[i] - p.TolmanSlope * _cols.Log10OnePlusZ[i] - _cols.Correction[i];
                guess = Median(t);
            }
            if (guess is { } g && double.IsFinite(g)) start[j] = Math.Clamp(g, _free[j].Min, _free[j].Max);
        }
        return start;
    }

    private static double Median(double[] t)
    {
        Array.Sort(t);
        return t.Length % 2 == 1 ? t[t.Length / 2] : 0.5 * (t[t.Length / 2 - 1] + t[t.Length / 2]);
    }

    /// <summary>The hypothesis.</summary>
    public Hypothesis Hypothesis => _h;

    /// <summary>Number of objects n (with a row mask, the rows included).</summary>
    public int Count => _mask is null ? _n : _selected;

    /// <inheritdoc/>
    public int Dimension => _free.Length;

    /// <summary>Whether <see cref="LogDensity"/> may split one evaluation over threads (large samples only). Default true.</summary>
    public bool AllowParallel { get; init; } = true;

    /// <summary>
    /// ln p(θ) = ln L(θ) + Σ ln prior: the log-posterior over the free parameters with each parameter's prior
    /// (uniform on its bounds or truncated Gaussian), with its gradient. Maximum-likelihood fits maximise this (identical to
    /// ln L up to a constant unless a Gaussian prior is set).
    /// </summary>
    public ILogDensityWithGradient Posterior => _posterior;

    /// <summary>Priors of the free parameters, in θ order (for samplers and evidence).</summary>
    public IReadOnlyList<ParameterPrior> Priors => _free.Select(f => f.Prior).ToArray();

    private int Chunks => !AllowParallel || _n < 2 * ChunkSize || Environment.ProcessorCount < 2 ? 1 : (_n + ChunkSize - 1) / ChunkSize;

    /// <summary>ln L(θ) including all constants; −∞ outside the bounds or where the world model is undefined.</summary>
    public double LogDensity(ReadOnlySpan<double> theta)
    {
        var e = Prepare(theta);
        if (e is null) return double.NegativeInfinity;
        int chunks = Chunks;
        double ll;
        if (chunks == 1) ll = SumSlice(e, 0, _n);
        else
        {
            var parts = new double[chunks];
            Parallel.For(0, chunks, c => parts[c] = SumSlice(e, c * ChunkSize, Math.Min(_n, (c + 1) * ChunkSize)));
            ll = 0;
            for (int c = 0; c < chunks; c++) ll += parts[c];
        }
        return double.IsNaN(ll) ? double.NegativeInfinity : ll;
    }

    /// <inheritdoc/>
    public double LogDensityAndGradient(ReadOnlySpan<double> theta, Span<double> gradient)
    {
        gradient.Clear();
        var e = Prepare(theta, true);
        if (e is null) return double.NegativeInfinity;
        int chunks = Chunks;
        var p = Point(e);
        var adjoints = new ModelAdjoint[chunks];
        var parts = new double[chunks];
        if (chunks == 1) { adjoints[0] = new ModelAdjoint(_distances.Nodes); parts[0] = _kernel.SumWithAdjoint(e, p, 0, _n, adjoints[0]); }
        else
            Parallel.For(0, chunks, c =>
            {
                adjoints[c] = new ModelAdjoint(_distances.Nodes);
                parts[c] = _kernel.SumWithAdjoint(e, Point(e), c * ChunkSize, Math.Min(_n, (c + 1) * ChunkSize), adjoints[c]);
            });
        double ll = parts[0];
        for (int c = 1; c < chunks; c++) { ll += parts[c]; adjoints[0].Add(adjoints[c]); }
        if (double.IsNaN(ll) || double.IsNegativeInfinity(ll)) return double.NegativeInfinity;
        _layout.Chain(adjoints[0], p, e, gradient);
        return ll;
    }

    /// <summary>Computes the per-evaluation state, or null when θ is outside the bounds or the model is undefined.</summary>
    public LikelihoodEvaluation? Prepare(ReadOnlySpan<double> theta) => Prepare(theta, false);

    /// <inheritdoc/>
    public LikelihoodEvaluation? Prepare(ReadOnlySpan<double> theta, bool withGradient)
    {
        if (theta.Length != _free.Length) throw new ArgumentException($"expected {_free.Length} parameters, got {theta.Length}");
        for (int j = 0; j < theta.Length; j++)
            if (!(theta[j] >= _free[j].Min && theta[j] <= _free[j].Max)) return null;
        return _distances.Prepare(theta.ToArray(), _h.FullValues(theta), withGradient);
    }

    private ModelPoint Point(LikelihoodEvaluation e) => new(_layout, e.Values, e.Dimming, _lnPivot);

    /// <inheritdoc/>
    public double SumSlice(LikelihoodEvaluation e, int start, int end)
    {
        ArgumentNullException.ThrowIfNull(e);
        if (start < 0 || end > _n || start > end) throw new ArgumentOutOfRangeException(nameof(start));
        return _kernel.Sum(e, Point(e), start, end);
    }

    /// <inheritdoc/>
    public double SumSliceWithGradient(LikelihoodEvaluation evaluation, int start, int end, Span<double> gradient)
    {
        ArgumentNullException.ThrowIfNull(evaluation);
        if (start < 0 || end > _n || start > end) throw new ArgumentOutOfRangeException(nameof(start));
        if (!evaluation.HasGradient) throw new ArgumentException("the evaluation was prepared without gradient terms; call Prepare(theta, withGradient: true)", nameof(evaluation));
        var p = Point(evaluation);
        var adj = new ModelAdjoint(_distances.Nodes);
        double v = _kernel.SumWithAdjoint(evaluation, p, start, end, adj);
        _layout.Chain(adj, p, evaluation, gradient);
        return v;
    }
}
