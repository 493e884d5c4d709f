using System.Buffers;
using System.Numerics;
using System.Runtime.InteropServices;
using SizeTest.Common;
using SizeTest.Cosmology;
using SizeTest.Photometry;

namespace SizeTest.Inference;

/// <summary>
/// The log-likelihood of a <see cref="Hypothesis"/> for a set of <see cref="Observables"/>, over the
/// hypothesis's free parameters. It is a sum over objects: <see cref="Prepare(ReadOnlySpan{double}, bool)"/> computes everything that
/// depends only on the parameters and redshift (D_A on a <see cref="RedshiftGrid"/>), <see cref="SumSlice"/>
/// adds the objects of a row range [start, end), and partial sums add up to <see cref="LogDensity"/>
/// (threads here; ranks later, one reduction per evaluation).
/// </summary>
/// <remarks>
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
/// <para>Isophotal sizes (<see cref="Observables.SizeDefinition"/> of kind <see cref="Catalogs.SizeKind.Isophotal"/>; joint
/// only): the mean ln θ becomes ln θ_iso = ln[R0 (1+z)^a / D_A] + ln(r_iso/R_e) with r_iso/R_e from
/// <see cref="IsophotalSize"/> for the Sérsic index <see cref="Observables.SersicIndex"/>, the isophote
/// <see cref="Observables.Isophote"/> and the model's mean observed SB at R_e, μ_e,obs = μ0 + 2.5 (n − b) log10(1+z)
/// + K + A (+ κ term), i.e. mu0 is read as the rest-frame SB at R_e (Graham &amp; Driver 2005 eq. 5). Where the model's
/// observed central SB is fainter than the isophote the object could not be in the sample: its density, and the whole
/// ln L, is −∞. The SB scatter is not propagated into ln(r_iso/R_e) (the correction uses the mean μ_e,obs).</para>
/// </remarks>
public sealed class HypothesisLikelihood : ISlicedLogLikelihood
{
    private const double Ln10 = 2.302585092994046;
    private const double HalfLn2Pi = 0.91893853320467274;
    private static readonly double LnKpcPerMpc = Math.Log(1e-3);

    private readonly Hypothesis _h;
    private readonly int _n;
    private readonly ObservableKind _kind;
    private readonly double[] _y = [], _s2y = [], _mu = [], _s2mu = [], _corr = [], _negCorr = [], _l10, _ln1pz, _lnz;
    private readonly bool _uniformS2y, _uniformS2mu;
    private readonly double[]? _lnDaFixed;
    private readonly double _nFixed;
    private readonly bool _cosmoFree;
    private readonly RedshiftGrid? _grid;
    private readonly int _iR0 = -1, _iA = -1, _iSd = -1, _iMu0 = -1, _iB = -1, _iSm = -1, _iK = -1;
    private readonly int[] _cosmoIdx;
    private readonly double _lnThetaMin, _sbLimit, _magLimit;
    private readonly bool _hasThetaCut, _hasSbCut, _hasMagCut;
    private readonly double _lnPivot;
    private readonly ParameterSetting[] _free;
    private readonly bool _isophotal;
    private readonly double[] _isophote = [];
    private readonly IsophotalSize? _isoSize;
    private readonly LogPosteriorDensity _posterior;

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
        _kind = hypothesis.Nuisance.Observable;
        if (_n == 0) throw new InputException("the sample has no accepted objects to fit");
        bool size = _kind != ObservableKind.SurfaceBrightness, sb = _kind != ObservableKind.Size;
        if (size)
        {
            _y = observables.LnTheta ?? throw new InputException("fitting angular sizes needs a 'theta' column; map it with --col theta=NAME");
            _s2y = Square(observables.LnThetaErr, _n);
            _uniformS2y = Array.TrueForAll(_s2y, x => x == _s2y[0]);
        }
        if (sb)
        {
            _mu = observables.Mu ?? throw new InputException("fitting surface brightness needs a 'mu' column; map it with --col mu=NAME");
            _s2mu = Square(observables.MuErr, _n);
            _corr = new double[_n];
            for (int i = 0; i < _n; i++)
                _corr[i] = (observables.KCorrection?[i] ?? 0) + (observables.Extinction?[i] ?? 0);
            _negCorr = Array.ConvertAll(_corr, c => -c);
            _uniformS2mu = Array.TrueForAll(_s2mu, x => x == _s2mu[0]);
        }
        if (size && observables.SizeDefinition.Kind == Catalogs.SizeKind.Isophotal)
        {
            if (_kind != ObservableKind.Joint)
                throw new InputException("the sizes are isophotal: fit them with --observable joint, which predicts each object's isophotal radius from the surface-brightness model (mu0, sb_evolution; hold them with --fix if they are known)");
            if (hypothesis.Nuisance.Cuts.MagLimit is not null)
                throw new InputException("--mag-limit cannot be combined with isophotal sizes (the total magnitude is not a function of the isophotal size); drop the magnitude cut");
            _isophote = observables.Isophote ?? throw new InputException("the sizes are isophotal but the observables carry no isophote level; build them with the photometry stage");
            double sersicN = observables.SersicIndex ?? throw new InputException("the sizes are isophotal: set a Sérsic index (e.g. --sersic-n 1) so the fit can predict isophotal radii");
            _isoSize = new IsophotalSize(sersicN);
            _isophotal = true;
        }
        _l10 = new double[_n];
        _ln1pz = new double[_n];
        _lnz = new double[_n];
        for (int i = 0; i < _n; i++)
        {
            double z = observables.Z[i];
            if (!(z > 0) || !double.IsFinite(z)) throw new InputException($"object {i + 1} has redshift {z}; fits need z > 0");
            _ln1pz[i] = Math.Log(1 + z);
            _l10[i] = _ln1pz[i] / Ln10;
            _lnz[i] = Math.Log(z);
        }

        var ps = hypothesis.Parameters;
        _free = hypothesis.FreeParameters.ToArray();
        var cosmo = new List<int>();
        for (int i = 0; i < ps.Count; i++)
        {
            switch (ps[i].Name)
            {
                case "r0_kpc": _iR0 = i; break;
                case "size_evolution": _iA = i; break;
                case "scatter_dex": _iSd = i; break;
                case "mu0": _iMu0 = i; break;
                case "sb_evolution": _iB = i; break;
                case "scatter_mag": _iSm = i; break;
                case "kormendy_slope": _iK = i; break;
                default: if (!NuisanceParameters.IsSurveyName(ps[i].Name)) cosmo.Add(i); break;
            }
        }
        _cosmoIdx = cosmo.ToArray();
        _cosmoFree = _cosmoIdx.Any(i => ps[i].IsFree);
        var cuts = hypothesis.Nuisance.Cuts;
        _hasThetaCut = cuts.MinThetaArcsec is not null;
        _lnThetaMin = _hasThetaCut ? Math.Log(cuts.MinThetaArcsec!.Value * Units.RadiansPerArcsec) : 0;
        _hasSbCut = cuts.SbLimit is not null;
        _sbLimit = cuts.SbLimit ?? 0;
        _hasMagCut = cuts.MagLimit is not null;
        _magLimit = cuts.MagLimit ?? 0;
        _lnPivot = Math.Log(hypothesis.Nuisance.PivotSizeKpc);

        var survey = hypothesis.Nuisance.SurveyTerms;
        double gridMinZ = sharedGrid?.MinZ ?? observables.Z.Min(), gridMaxZ = sharedGrid?.MaxZ ?? observables.Z.Max();
        double priorMinZ = survey.RedshiftPriorMin ?? gridMinZ, priorMaxZ = survey.RedshiftPriorMax ?? gridMaxZ;
        if (survey.MarginaliseRedshift) { gridMinZ = Math.Min(gridMinZ, priorMinZ); gridMaxZ = Math.Max(gridMaxZ, priorMaxZ); }
        if (size && _cosmoFree && survey.MarginaliseRedshift)
            // Photometric redshifts: a uniform-in-ln z grid over the prior range, so the quadrature nodes share its nodes.
            _grid = new RedshiftGrid(observables.Z, hypothesis.Nuisance.NodesFor(sharedGrid?.ObjectCount ?? _n), gridMinZ, gridMaxZ);
        else if (size && _cosmoFree)
            _grid = sharedGrid is { } span
                ? new RedshiftGrid(observables.Z, hypothesis.Nuisance.NodesFor(span.ObjectCount), span.MinZ, span.MaxZ)
                : new RedshiftGrid(observables.Z, hypothesis.Nuisance.NodesFor(_n));
        if (!_cosmoFree)
        {
            var model = CreateModel(hypothesis.FullValues(hypothesis.StartVector()))
                        ?? throw new ArgumentException($"world model '{hypothesis.Family.Name}' cannot be built from its fixed parameters");
            _nFixed = model.BolometricDimmingExponent + hypothesis.Nuisance.DimmingExponentOffset;
            if (size)
            {
                _lnDaFixed = new double[_n];
                var da = new double[_n];
                var zs = observables.Z.ToArray();
                // Exact D_A per object when cosmology is fixed (computed once).
                var order = Enumerable.Range(0, _n).ToArray();
                Array.Sort(zs, order);
                model.AngularDiameterDistances(zs, da);
                for (int k = 0; k < _n; k++)
                {
                    if (!(da[k] > 0)) throw new ArgumentException($"world model '{hypothesis.Family.Name}' gives a non-positive angular-diameter distance at z = {zs[k]}");
                    _lnDaFixed[order[k]] = Math.Log(da[k]);
                }
            }
        }
        if (survey.IsActive)
        {
            var startModel = CreateModel(hypothesis.FullValues(hypothesis.StartVector()))
                             ?? throw new ArgumentException($"world model '{hypothesis.Family.Name}' cannot be built from its start parameters");
            _survey = new Survey.SurveySizeLikelihood(hypothesis, observables, _lnDaFixed, _grid, gridMinZ, gridMaxZ, priorMinZ, priorMaxZ, startModel);
        }
        _posterior = new LogPosteriorDensity(this);
    }

    // Survey terms (size–luminosity relation, groups, binned evolution, photometric redshifts, Gaussian size errors,
    // weights, luminosity window): when set, rows are summed by this object instead of the built-in size model.
    private readonly Survey.SurveySizeLikelihood? _survey;

    /// <summary>Notes on the survey terms applied (empty when none).</summary>
    public IReadOnlyList<string> SurveyNotes => _survey?.Notes ?? [];

    /// <summary>
    /// A data-driven starting vector: the hypothesis's start values, with r0_kpc set to the median physical size
    /// implied by the default world model and mu0 to the median surface brightness corrected for dimming.
    /// </summary>
    public double[] SuggestStart()
    {
        var start = _h.StartVector();
        var e = Prepare(start);
        if (e is null) return start;
        var free = _free;
        if (_survey is not null) { _survey.SuggestStart(start, free, _h, e); return start; }
        for (int j = 0; j < free.Length; j++)
        {
            var name = free[j].Name;
            double? guess = null;
            if (name == "r0_kpc" && _y.Length == _n)
            {
                var t = new double[_n];
                for (int i = 0; i < _n; i++)
                {
                    t[i] = _y[i] + LnDa(e, i) - LnKpcPerMpc - e.Values[_iA] * _ln1pz[i];
                    // Isophotal: undo ln(r_iso/R_e) estimated from the object's own μ (model-independent).
                    if (_isophotal && _isoSize!.TryLnRadiusRatio(_mu[i], _isophote[i], out double lr)) t[i] -= lr;
                }
                guess = Math.Exp(Median(t));
            }
            else if (name == "mu0" && _mu.Length == _n)
            {
                var t = new double[_n];
                for (int i = 0; i < _n; i++) t[i] = _mu[i] - 2.5 * (e.Dimming - e.Values[_iB]) * _l10[i] - _corr[i];
                guess = Median(t);
            }
            if (guess is { } g && double.IsFinite(g)) start[j] = Math.Clamp(g, free[j].Min, free[j].Max);
        }
        return start;
    }

    private static double Median(double[] t)
    {
        Array.Sort(t);
        return t.Length % 2 == 1 ? t[t.Length / 2] : 0.5 * (t[t.Length / 2 - 1] + t[t.Length / 2]);
    }

    private static double[] Square(double[]? e, int n)
    {
        var s = new double[n];
        if (e is not null)
            for (int i = 0; i < n; i++) s[i] = e[i] * e[i];
        return s;
    }

    /// <summary>The hypothesis.</summary>
    public Hypothesis Hypothesis => _h;

    /// <summary>Number of objects n.</summary>
    public int Count => _n;

    /// <inheritdoc/>
    public int Dimension => _free.Length;

    /// <summary>Whether <see cref="LogDensity"/> may split one evaluation over threads (large samples only). Default true.</summary>
    public bool AllowParallel { get; init; } = true;

    /// <summary>
    /// ln p(θ) = ln L(θ) + Σ ln prior: the log-posterior over the free parameters with each parameter's prior
    /// (uniform on its bounds or truncated Gaussian). Maximum-likelihood fits maximise this (identical to
    /// ln L up to a constant unless a Gaussian prior is set).
    /// </summary>
    public ILogDensityWithGradient Posterior => _posterior;

    /// <summary>Priors of the free parameters, in θ order (for samplers and evidence).</summary>
    public IReadOnlyList<ParameterPrior> Priors => _free.Select(f => f.Prior).ToArray();

    /// <summary>ln L(θ) including all constants; −∞ outside the bounds or where the world model is undefined.</summary>
    public double LogDensity(ReadOnlySpan<double> theta)
    {
        var e = Prepare(theta);
        if (e is null) return double.NegativeInfinity;
        double ll;
        if (!AllowParallel || _n < 2 * ChunkSize || Environment.ProcessorCount < 2)
            ll = SumSlice(e, 0, _n);
        else
        {
            int chunks = (_n + ChunkSize - 1) / ChunkSize;
            var parts = new double[chunks];
            Parallel.For(0, chunks, c => parts[c] = SumSlice(e, c * ChunkSize, Math.Min(_n, (c + 1) * ChunkSize)));
            ll = 0;
            for (int c = 0; c < chunks; c++) ll += parts[c];
        }
        return double.IsNaN(ll) ? double.NegativeInfinity : ll;
    }

    /// <summary>Computes the per-evaluation state, or null when θ is outside the bounds or the model is undefined.</summary>
    public LikelihoodEvaluation? Prepare(ReadOnlySpan<double> theta) => Prepare(theta, false);

    /// <inheritdoc/>
    public LikelihoodEvaluation? Prepare(ReadOnlySpan<double> theta, bool withGradient)
    {
        if (theta.Length != _free.Length) throw new ArgumentException($"expected {_free.Length} parameters, got {theta.Length}");
        for (int j = 0; j < theta.Length; j++)
            if (!(theta[j] >= _free[j].Min && theta[j] <= _free[j].Max)) return null;
        var values = _h.FullValues(theta);
        if (!_cosmoFree) return new LikelihoodEvaluation(theta.ToArray(), values, null, _nFixed) { HasGradient = withGradient };
        var model = CreateModel(values);
        if (model is null) return null;
        double[]? g = null;
        if (_grid is not null)
        {
            var nodes = _grid.Nodes;
            g = new double[nodes.Length];
            model.AngularDiameterDistances(nodes, g);
            for (int k = 0; k < g.Length; k++)
            {
                if (!(g[k] > 0) || !double.IsFinite(g[k])) return null;
                g[k] = Math.Log(g[k]) - Math.Log(nodes[k]);
            }
        }
        return new LikelihoodEvaluation(theta.ToArray(), values, g, model.BolometricDimmingExponent + _h.Nuisance.DimmingExponentOffset) { HasGradient = withGradient };
    }

    /// <inheritdoc/>
    /// <remarks>Interim: central differences of <see cref="SumSlice"/> (the analytic form replaces it).</remarks>
    public double SumSliceWithGradient(LikelihoodEvaluation evaluation, int start, int end, Span<double> gradient)
    {
        ArgumentNullException.ThrowIfNull(evaluation);
        double f = SumSlice(evaluation, start, end);
        var t = evaluation.Theta.ToArray();
        for (int j = 0; j < t.Length; j++)
        {
            double h = 1e-6 * Math.Max(Math.Abs(t[j]), 1e-3 * (_free[j].Max - _free[j].Min));
            double lo = Math.Max(_free[j].Min, t[j] - h), hi = Math.Min(_free[j].Max, t[j] + h);
            double tj = t[j];
            t[j] = hi; var ep = Prepare(t, false);
            t[j] = lo; var em = Prepare(t, false);
            t[j] = tj;
            gradient[j] = ep is null || em is null || hi == lo ? 0 : (SumSlice(ep, start, end) - SumSlice(em, start, end)) / (hi - lo);
        }
        return f;
    }

    /// <inheritdoc/>
    public double LogDensityAndGradient(ReadOnlySpan<double> theta, Span<double> gradient)
    {
        gradient.Clear();
        var e = Prepare(theta, true);
        if (e is null) return double.NegativeInfinity;
        int d = _free.Length;
        int chunks = !AllowParallel || _n < 2 * ChunkSize || Environment.ProcessorCount < 2 ? 1 : (_n + ChunkSize - 1) / ChunkSize;
        var parts = new double[chunks];
        var grads = new double[chunks * d];
        if (chunks == 1) parts[0] = SumSliceWithGradient(e, 0, _n, grads);
        else Parallel.For(0, chunks, c => parts[c] = SumSliceWithGradient(e, c * ChunkSize, Math.Min(_n, (c + 1) * ChunkSize), grads.AsSpan(c * d, d)));
        double ll = 0;
        for (int c = 0; c < chunks; c++)
        {
            ll += parts[c];
            for (int j = 0; j < d; j++) gradient[j] += grads[c * d + j];
        }
        if (double.IsNaN(ll) || double.IsNegativeInfinity(ll)) { gradient.Clear(); return double.NegativeInfinity; }
        return ll;
    }

    private IWorldModel? CreateModel(double[] values)
    {
        var dict = new Dictionary<string, double>(_cosmoIdx.Length);
        foreach (var i in _cosmoIdx)
            if (!double.IsNaN(values[i])) dict[_h.Parameters[i].Name] = values[i]; // NaN = not given (model default)
        return _h.Family.TryCreate(dict, out var model, out _) ? model : null;
    }

    /// <summary>Sum of per-object log densities (with all constants) over rows [start, end).</summary>
    public double SumSlice(LikelihoodEvaluation e, int start, int end)
    {
        ArgumentNullException.ThrowIfNull(e);
        if (start < 0 || end > _n || start > end) throw new ArgumentOutOfRangeException(nameof(start));
        if (_survey is not null) return _survey.SumSlice(e, start, end);
        return _kind switch
        {
            ObservableKind.Size => SizeSlice(e, start, end),
            ObservableKind.SurfaceBrightness => SbSlice(e, start, end),
            _ => _isophotal ? IsophotalJointSlice(e, start, end) : JointSlice(e, start, end),
        };
    }

    private double LnDa(LikelihoodEvaluation e, int i) =>
        _lnDaFixed is not null ? _lnDaFixed[i] : _lnz[i] + _grid!.Interpolate(e.GridG, i);

    private double SizeSlice(LikelihoodEvaluation e, int start, int end)
    {
        var v = e.Values;
        double c0 = Math.Log(v[_iR0]) + LnKpcPerMpc, a = v[_iA];
        double sig = Ln10 * v[_iSd], sig2 = sig * sig;
        int len = end - start;
        if (_hasThetaCut)
        {
            double acc = 0, sel = 0;
            for (int i = start; i < end; i++)
            {
                double m = c0 + a * _ln1pz[i] - LnDa(e, i);
                double r = _y[i] - m;
                double var = _s2y[i] + sig2;
                acc += r * r / var + Math.Log(var);
                sel += NormalMath.LogPhi((m - _lnThetaMin) / Math.Sqrt(var));
            }
            return -0.5 * acc - sel - HalfLn2Pi * len;
        }
        double[]? rented = null;
        ReadOnlySpan<double> lnDa;
        if (_lnDaFixed is not null) lnDa = _lnDaFixed.AsSpan(start, len);
        else
        {
            rented = ArrayPool<double>.Shared.Rent(len);
            var span = rented.AsSpan(0, len);
            var g = e.GridG!;
            var idx = _grid!.Index;
            var w = _grid.Weights;
            for (int i = start; i < end; i++)
            {
                int j = idx[i], k = 4 * i;
                span[i - start] = _lnz[i] + w[k] * g[j] + w[k + 1] * g[j + 1] + w[k + 2] * g[j + 2] + w[k + 3] * g[j + 3];
            }
            lnDa = span;
        }
        double result = -0.5 * GaussianSum(_y.AsSpan(start, len), _ln1pz.AsSpan(start, len), lnDa, _s2y.AsSpan(start, len), c0, a, sig2, _uniformS2y)
                        - HalfLn2Pi * len;
        if (rented is not null) ArrayPool<double>.Shared.Return(rented);
        return result;
    }

    /// <summary>
    /// Σ [r²/v + ln v] with r = y − (c0 + slope·x − offset), v = s2 + extra: the Gaussian core of the size and SB
    /// models, vectorised (System.Numerics.Vector). With uniform s2 the logarithm is taken once.
    /// </summary>
    private static double GaussianSum(ReadOnlySpan<double> y, ReadOnlySpan<double> x, ReadOnlySpan<double> offset, ReadOnlySpan<double> s2,
        double c0, double slope, double extra, bool uniformS2)
    {
        int n = y.Length, i = 0;
        double q = 0, l = 0;
        if (uniformS2)
        {
            double var = (n > 0 ? s2[0] : 0) + extra, inv = 1 / var;
            if (Vector.IsHardwareAccelerated && n >= Vector<double>.Count)
            {
                var vc = new Vector<double>(c0);
                var vs = new Vector<double>(slope);
                var acc = Vector<double>.Zero;
                var yv = MemoryMarshal.Cast<double, Vector<double>>(y);
                var xv = MemoryMarshal.Cast<double, Vector<double>>(x);
                var ov = MemoryMarshal.Cast<double, Vector<double>>(offset);
                for (int k = 0; k < yv.Length; k++)
                {
                    var r = yv[k] - (vc + vs * xv[k] - ov[k]);
                    acc += r * r;
                }
                q = Vector.Sum(acc);
                i = yv.Length * Vector<double>.Count;
            }
            for (; i < n; i++)
            {
                double r = y[i] - (c0 + slope * x[i] - offset[i]);
                q += r * r;
            }
            return q * inv + n * Math.Log(var);
        }
        if (Vector.IsHardwareAccelerated && n >= Vector<double>.Count)
        {
            var vc = new Vector<double>(c0);
            var vs = new Vector<double>(slope);
            var ve = new Vector<double>(extra);
            var accQ = Vector<double>.Zero;
            var accL = Vector<double>.Zero;
            var yv = MemoryMarshal.Cast<double, Vector<double>>(y);
            var xv = MemoryMarshal.Cast<double, Vector<double>>(x);
            var ov = MemoryMarshal.Cast<double, Vector<double>>(offset);
            var sv = MemoryMarshal.Cast<double, Vector<double>>(s2);
            for (int k = 0; k < yv.Length; k++)
            {
                var r = yv[k] - (vc + vs * xv[k] - ov[k]);
                var var = sv[k] + ve;
                accQ += r * r / var;
                accL += Vector.Log(var);
            }
            q = Vector.Sum(accQ);
            l = Vector.Sum(accL);
            i = yv.Length * Vector<double>.Count;
        }
        for (; i < n; i++)
        {
            double r = y[i] - (c0 + slope * x[i] - offset[i]);
            double var = s2[i] + extra;
            q += r * r / var;
            l += Math.Log(var);
        }
        return q + l;
    }

    private double SbSlice(LikelihoodEvaluation e, int start, int end)
    {
        var v = e.Values;
        double mu0 = v[_iMu0], slope = 2.5 * (e.Dimming - v[_iB]);
        double sm = v[_iSm], sm2 = sm * sm;
        if (!_hasSbCut)
        {
            // m = μ0 + slope·log10(1+z) − (−K−A): same Gaussian core as the size model.
            return -0.5 * GaussianSum(_mu.AsSpan(start, end - start), _l10.AsSpan(start, end - start), _negCorr.AsSpan(start, end - start),
                _s2mu.AsSpan(start, end - start), mu0, slope, sm2, _uniformS2mu) - HalfLn2Pi * (end - start);
        }
        double acc = 0, sel = 0;
        for (int i = start; i < end; i++)
        {
            double m = mu0 + slope * _l10[i] + _corr[i];
            double r = _mu[i] - m;
            double var = _s2mu[i] + sm2;
            acc += r * r / var + Math.Log(var);
            if (_hasSbCut) sel += NormalMath.LogPhi((_sbLimit - m) / Math.Sqrt(var));
        }
        return -0.5 * acc - sel - HalfLn2Pi * (end - start);
    }

    // Magnitude from (ln θ, μ): m = μ − (5/ln10) ln θ_arcsec − 2.5 log10(2π).
    private static readonly double MagFromLnTheta = -5.0 / Ln10;
    private static readonly double MagOffset = -5.0 / Ln10 * Math.Log(Units.ArcsecPerRadian) - 2.5 * Math.Log10(2 * Math.PI);

    private double JointSlice(LikelihoodEvaluation e, int start, int end)
    {
        var v = e.Values;
        double lnR0 = Math.Log(v[_iR0]), c0 = lnR0 + LnKpcPerMpc, a = v[_iA];
        double sig = Ln10 * v[_iSd], sig2 = sig * sig;
        double mu0 = v[_iMu0], slope = 2.5 * (e.Dimming - v[_iB]);
        double sm = v[_iSm], sm2 = sm * sm;
        double kap = _iK >= 0 ? v[_iK] / Ln10 : 0; // dμ/d ln R
        double covInt = kap * sig2, varMuInt = sm2 + kap * kap * sig2;
        double acc = 0, sel = 0;
        bool anyCut = _hasThetaCut || _hasSbCut || _hasMagCut;
        Span<double> cx = stackalloc double[2], cy = stackalloc double[2], hh = stackalloc double[2];
        for (int i = start; i < end; i++)
        {
            double lnSizeMean = lnR0 + a * _ln1pz[i];
            double mt = c0 + a * _ln1pz[i] - LnDa(e, i);
            double mm = mu0 + slope * _l10[i] + _corr[i] + kap * (lnSizeMean - _lnPivot);
            double vt = _s2y[i] + sig2, vm = _s2mu[i] + varMuInt, c = covInt;
            double det = vt * vm - c * c;
            double rt = _y[i] - mt, rm = _mu[i] - mm;
            acc += (vm * rt * rt - 2 * c * rt * rm + vt * rm * rm) / det + Math.Log(det);
            if (!anyCut) continue;
            // Each cut is a linear functional s·(ln θ, μ) + o compared with a limit; write all as "w < h".
            int nc = 0;
            if (_hasThetaCut) { cx[nc] = -1; cy[nc] = 0; hh[nc] = mt - _lnThetaMin; nc++; }
            if (_hasSbCut) { cx[nc] = 0; cy[nc] = 1; hh[nc] = _sbLimit - mm; nc++; }
            if (_hasMagCut) { cx[nc] = MagFromLnTheta; cy[nc] = 1; hh[nc] = _magLimit - (mm + MagFromLnTheta * mt + MagOffset); nc++; }
            double s0 = Math.Sqrt(cx[0] * cx[0] * vt + 2 * cx[0] * cy[0] * c + cy[0] * cy[0] * vm);
            if (nc == 1) { sel += NormalMath.LogPhi(hh[0] / s0); continue; }
            double s1 = Math.Sqrt(cx[1] * cx[1] * vt + 2 * cx[1] * cy[1] * c + cy[1] * cy[1] * vm);
            double rho = (cx[0] * cx[1] * vt + (cx[0] * cy[1] + cy[0] * cx[1]) * c + cy[0] * cy[1] * vm) / (s0 * s1);
            sel += NormalMath.LogBivariatePhi(hh[0] / s0, hh[1] / s1, rho);
        }
        return -0.5 * acc - sel - 2 * HalfLn2Pi * (end - start);
    }

    // The joint model with isophotal sizes: JointSlice plus ln(r_iso/R_e) on the mean ln θ (kept separate so the
    // non-isophotal loop is untouched). The magnitude cut is refused at bind time.
    private double IsophotalJointSlice(LikelihoodEvaluation e, int start, int end)
    {
        var v = e.Values;
        double lnR0 = Math.Log(v[_iR0]), c0 = lnR0 + LnKpcPerMpc, a = v[_iA];
        double sig = Ln10 * v[_iSd], sig2 = sig * sig;
        double mu0 = v[_iMu0], slope = 2.5 * (e.Dimming - v[_iB]);
        double sm = v[_iSm], sm2 = sm * sm;
        double kap = _iK >= 0 ? v[_iK] / Ln10 : 0; // dμ/d ln R
        double covInt = kap * sig2, varMuInt = sm2 + kap * kap * sig2;
        var iso = _isoSize!;
        double acc = 0, sel = 0;
        bool anyCut = _hasThetaCut || _hasSbCut || _hasMagCut;
        Span<double> cx = stackalloc double[2], cy = stackalloc double[2], hh = stackalloc double[2];
        for (int i = start; i < end; i++)
        {
            double lnSizeMean = lnR0 + a * _ln1pz[i];
            double mt = c0 + a * _ln1pz[i] - LnDa(e, i);
            double mm = mu0 + slope * _l10[i] + _corr[i] + kap * (lnSizeMean - _lnPivot);
            // ln θ_iso = ln θ_e + ln(r_iso/R_e)(μ_e,obs); −∞ where the isophote is not reached.
            if (!iso.TryLnRadiusRatio(mm, _isophote[i], out double lnRatio)) return double.NegativeInfinity;
            mt += lnRatio;
            double vt = _s2y[i] + sig2, vm = _s2mu[i] + varMuInt, c = covInt;
            double det = vt * vm - c * c;
            double rt = _y[i] - mt, rm = _mu[i] - mm;
            acc += (vm * rt * rt - 2 * c * rt * rm + vt * rm * rm) / det + Math.Log(det);
            if (!anyCut) continue;
            // Each cut is a linear functional s·(ln θ, μ) + o compared with a limit; write all as "w < h".
            int nc = 0;
            if (_hasThetaCut) { cx[nc] = -1; cy[nc] = 0; hh[nc] = mt - _lnThetaMin; nc++; }
            if (_hasSbCut) { cx[nc] = 0; cy[nc] = 1; hh[nc] = _sbLimit - mm; nc++; }
            if (_hasMagCut) { cx[nc] = MagFromLnTheta; cy[nc] = 1; hh[nc] = _magLimit - (mm + MagFromLnTheta * mt + MagOffset); nc++; }
            double s0 = Math.Sqrt(cx[0] * cx[0] * vt + 2 * cx[0] * cy[0] * c + cy[0] * cy[0] * vm);
            if (nc == 1) { sel += NormalMath.LogPhi(hh[0] / s0); continue; }
            double s1 = Math.Sqrt(cx[1] * cx[1] * vt + 2 * cx[1] * cy[1] * c + cy[1] * cy[1] * vm);
            double rho = (cx[0] * cx[1] * vt + (cx[0] * cy[1] + cy[0] * cx[1]) * c + cy[0] * cy[1] * vm) / (s0 * s1);
            sel += NormalMath.LogBivariatePhi(hh[0] / s0, hh[1] / s1, rho);
        }
        return -0.5 * acc - sel - 2 * HalfLn2Pi * (end - start);
    }

    private sealed class LogPosteriorDensity(HypothesisLikelihood owner) : ILogDensityWithGradient
    {
        public double LogDensityAndGradient(ReadOnlySpan<double> theta, Span<double> gradient)
        {
            double lp = 0;
            for (int j = 0; j < _priors.Length; j++)
            {
                lp += _priors[j].LogDensity(theta[j]);
                if (double.IsNegativeInfinity(lp)) { gradient.Clear(); return lp; }
            }
            double ll = owner.LogDensityAndGradient(theta, gradient);
            if (double.IsNegativeInfinity(ll)) return ll;
            for (int j = 0; j < _priors.Length; j++) gradient[j] += _priors[j].LogDensityDerivative(theta[j]);
            return lp + ll;
        }

        private readonly ParameterPrior[] _priors = owner._free.Select(f => f.Prior).ToArray();
        public int Dimension => owner.Dimension;
        public double LogDensity(ReadOnlySpan<double> theta)
        {
            double lp = 0;
            for (int j = 0; j < _priors.Length; j++)
            {
                lp += _priors[j].LogDensity(theta[j]);
                if (double.IsNegativeInfinity(lp)) return lp;
            }
            return lp + owner.LogDensity(theta);
        }
    }
}
