namespace SizeTest.Inference.Evaluation;

/// <summary>
/// ln L of one hypothesis over the rows of an <see cref="EvaluationBackend"/> (optionally re-weighted): each process
/// sums its chunks with <see cref="ISlicedLogLikelihood.Prepare"/>/<see cref="ISlicedLogLikelihood.SumSlice"/> (or
/// <see cref="ISlicedLogLikelihood.SumSliceWithGradient"/>), one collective sum gathers the chunk sums (value and
/// gradient together, 1 + d numbers per chunk), and every process adds them in the global chunk order.
/// </summary>
/// <remarks>Collective under MPI: every process must call <see cref="LogDensity"/> with the same θ in the same order.
/// Thread-safe in a single process.</remarks>
public sealed class RowSumLikelihood : ILogDensityWithGradient
{
    private const int ParallelRows = 65536;
    private readonly EvaluationBackend _backend;
    private readonly HypothesisLikelihood? _local;
    private readonly Photometry.Observables? _localObs; // the rows _local was bound to (re-binding with survey terms)
    private readonly int[] _bounds; // local chunk c = rows [_bounds[c], _bounds[c+1]) of _local
    private readonly PriorTimesLikelihood _posterior;

    internal RowSumLikelihood(EvaluationBackend backend, Hypothesis hypothesis, int[]? multiplicity)
    {
        ArgumentNullException.ThrowIfNull(hypothesis);
        _backend = backend;
        Hypothesis = hypothesis;
        var obs = backend.Local;
        int chunks = backend.LocalChunks;
        _bounds = new int[chunks + 1];
        if (multiplicity is null)
        {
            for (int c = 0; c < chunks; c++) _bounds[c] = backend.ChunkRange(c).Start;
            _bounds[chunks] = obs.Count;
            _localObs = obs.Count > 0 ? obs : null;
            _isWholeSample = true;
            if (obs.Count > 0) _local = new HypothesisLikelihood(hypothesis, obs, backend.GridSpan) { AllowParallel = false };
        }
        else
        {
            if (multiplicity.Length != obs.Count) throw new ArgumentException($"{multiplicity.Length} weights for {obs.Count} objects", nameof(multiplicity));
            var rows = new List<int>();
            for (int c = 0; c < chunks; c++)
            {
                _bounds[c] = rows.Count;
                var (s, e) = backend.ChunkRange(c);
                for (int i = s; i < e; i++)
                    for (int w = multiplicity[i]; w > 0; w--) rows.Add(i);
            }
            _bounds[chunks] = rows.Count;
            if (rows.Count > 0)
            {
                _localObs = ObservablesSubset.Take(obs, System.Runtime.InteropServices.CollectionsMarshal.AsSpan(rows));
                _local = new HypothesisLikelihood(hypothesis, _localObs, backend.GridSpan) { AllowParallel = false };
            }
        }
        _posterior = new PriorTimesLikelihood(this, hypothesis.FreeParameters.Select(p => p.Prior).ToArray());
        (InformationWeight, ModelObjects) = hypothesis.Nuisance.SurveyTerms?.HasWindow == true
            ? SumModelWeights()
            : (multiplicity is null ? backend.TotalWeight : double.NaN, multiplicity is null ? backend.TotalObjects : -1);
    }

    // Σ w and the count of objects with w > 0 under this model's survey weights, over every process (two collective sums, in
    // global chunk order: the same for any number of processes). A rank without rows contributes zeros but still takes part.
    private (double WeightSum, int Objects) SumModelWeights()
    {
        var sums = new double[_backend.TotalChunks];
        var counts = new double[_backend.TotalChunks];
        int off = _backend.ChunkOffset;
        for (int c = 0; c + 1 < _bounds.Length && _local is not null; c++)
        {
            var (w, k) = _local.ModelWeights(_bounds[c], _bounds[c + 1]);
            sums[off + c] = w;
            counts[off + c] = k;
        }
        return (_backend.SumChunks(sums), (int)_backend.SumChunks(counts));
    }

    private RowSumLikelihood(RowSumLikelihood parent, Hypothesis hypothesis, HypothesisLikelihood? local, Photometry.Observables? localObs)
    {
        InformationWeight = parent.InformationWeight;
        ModelObjects = parent.ModelObjects;
        _localObs = localObs;
        _backend = parent._backend;
        Hypothesis = hypothesis;
        _bounds = parent._bounds;
        _local = local;
        _posterior = new PriorTimesLikelihood(this, hypothesis.FreeParameters.Select(p => p.Prior).ToArray());
    }

    /// <summary>
    /// This likelihood's rows re-weighted: local object i counts <paramref name="multiplicity"/>[i] times (0: left out),
    /// the likelihood <see cref="EvaluationBackend.Bind"/> gives for those weights. When every weight is 0 or 1 (a
    /// cross-validation fold) and the kernel can mask rows (<see cref="HypothesisLikelihood.Masked"/>), it reuses these bound
    /// rows, grid and chunks — no copy of the rows, no second bind — and sums the included rows in the same order as a
    /// copy would; otherwise it binds a copy of the rows.
    /// </summary>
    public RowSumLikelihood Reweighted(int[] multiplicity)
    {
        ArgumentNullException.ThrowIfNull(multiplicity);
        if (_local is not null && _isWholeSample && Array.TrueForAll(multiplicity, w => w is 0 or 1))
        {
            if (multiplicity.Length != _local.Count) throw new ArgumentException($"{multiplicity.Length} weights for {_local.Count} objects", nameof(multiplicity));
            if (_local.Masked(Array.ConvertAll(multiplicity, w => (byte)w)) is { } masked)
                return new RowSumLikelihood(this, Hypothesis, masked, _localObs) { _isWholeSample = false };
        }
        return new RowSumLikelihood(_backend, Hypothesis, multiplicity);
    }

    /// <summary>Whether this likelihood masks the rows of a whole-sample one instead of holding a copy (<see cref="Reweighted"/>).</summary>
    internal bool SharesRows => _local?.IsMasked == true;

    // Whether this likelihood is the backend's whole sample, unweighted (the rows Reweighted can mask).
    private bool _isWholeSample;

    /// <summary>
    /// This likelihood with free parameter <paramref name="name"/> held at <paramref name="value"/> (the likelihood of
    /// <c>Hypothesis.WithFixed(name, value)</c> on the same rows and weights), sharing the bound per-object data, the chunks
    /// and the redshift grid (<see cref="HypothesisLikelihood.WithFixed"/>) instead of binding again: the cheap inner
    /// likelihood of profile refits, which then see the same interpolated ln D_A as the full fit. With survey terms the
    /// fixed hypothesis is bound afresh on the same rows.
    /// </summary>
    public RowSumLikelihood WithFixed(string name, double value)
    {
        var fixedH = Hypothesis.WithFixed(name, value);
        if (_local is null) return new RowSumLikelihood(this, fixedH, null, null);
        if (_local.HasSurveyTerms)
            return new RowSumLikelihood(this, fixedH, new HypothesisLikelihood(fixedH, _localObs!, _backend.GridSpan) { AllowParallel = false }, _localObs);
        return new RowSumLikelihood(this, fixedH, _local.WithFixed(name, value), _localObs);
    }

    /// <summary>The hypothesis.</summary>
    public Hypothesis Hypothesis { get; }

    /// <summary>The n of AICc and BIC for this model: Σ w over the objects its likelihood keeps (the weight column times a
    /// luminosity window, which each world model judges with its own D_L, so two models may keep different objects);
    /// <see cref="EvaluationBackend.TotalWeight"/> without a window. NaN for a re-weighted (resampled) likelihood without a window.</summary>
    public double InformationWeight { get; }

    /// <summary>Objects this model's likelihood keeps (weight &gt; 0) over all processes; <see cref="EvaluationBackend.TotalObjects"/>
    /// without a window; −1 for a re-weighted likelihood without a window.</summary>
    public int ModelObjects { get; }

    /// <inheritdoc/>
    public int Dimension => Hypothesis.K;

    /// <summary>ln L + Σ ln prior (the objective of maximum-likelihood fits; see <see cref="HypothesisLikelihood.Posterior"/>).</summary>
    public ILogDensity Posterior => _posterior;

    /// <summary>ln L(θ) over all processes' rows, with all constants; −∞ outside the bounds or where the model is undefined.</summary>
    public double LogDensity(ReadOnlySpan<double> theta) => Evaluate(theta, default, false);

    /// <summary>ln L(θ) and its analytic gradient ∂ln L/∂θ (zero where ln L = −∞), in one collective sum.</summary>
    public double LogDensityAndGradient(ReadOnlySpan<double> theta, Span<double> gradient) => Evaluate(theta, gradient, true);

    private double Evaluate(ReadOnlySpan<double> theta, Span<double> gradient, bool withGradient)
    {
        if (theta.Length != Dimension) throw new ArgumentException($"expected {Dimension} parameters, got {theta.Length}");
        if (withGradient) return EvaluateWithGradient(theta, gradient);
        var slots = new double[_backend.TotalChunks];
        int off = _backend.ChunkOffset, chunks = _bounds.Length - 1;
        if (_local is not null)
        {
            var e = _local.Prepare(theta, false);
            if (e is null)
            {
                for (int c = 0; c < chunks; c++) slots[off + c] = double.NegativeInfinity;
            }
            else if (_backend.Concurrent && _local.Count >= ParallelRows && Environment.ProcessorCount > 1)
            {
                int workers = Math.Min(Environment.ProcessorCount, chunks);
                Parallel.For(0, workers, w =>
                {
                    for (int c = w * chunks / workers, end = (w + 1) * chunks / workers; c < end; c++)
                        slots[off + c] = _local.SumSlice(e, _bounds[c], _bounds[c + 1]);
                });
            }
            else
            {
                for (int c = 0; c < chunks; c++) slots[off + c] = _local.SumSlice(e, _bounds[c], _bounds[c + 1]);
            }
        }
        double ll = _backend.SumChunks(slots);
        return double.IsNaN(ll) ? double.NegativeInfinity : ll;
    }

    // Slots of 1 + d numbers per chunk: the chunk's ln L, then its gradient.
    private double EvaluateWithGradient(ReadOnlySpan<double> theta, Span<double> gradient)
    {
        int d = Dimension, w = 1 + d;
        var slots = new double[_backend.TotalChunks * w];
        int off = _backend.ChunkOffset, chunks = _bounds.Length - 1;
        if (_local is not null)
        {
            var e = _local.Prepare(theta, true);
            if (e is null)
            {
                for (int c = 0; c < chunks; c++) slots[(off + c) * w] = double.NegativeInfinity;
            }
            else
            {
                void Chunk(int c) => slots[(off + c) * w] = _local.SumSliceWithGradient(e, _bounds[c], _bounds[c + 1], slots.AsSpan((off + c) * w + 1, d));
                if (_backend.Concurrent && _local.Count >= ParallelRows && Environment.ProcessorCount > 1)
                {
                    int workers = Math.Min(Environment.ProcessorCount, chunks);
                    Parallel.For(0, workers, k =>
                    {
                        for (int c = k * chunks / workers, end = (k + 1) * chunks / workers; c < end; c++) Chunk(c);
                    });
                }
                else
                    for (int c = 0; c < chunks; c++) Chunk(c);
            }
        }
        var total = _backend.SumAll(slots);
        double ll = 0;
        gradient.Clear();
        for (int c = 0; c < _backend.TotalChunks; c++)
        {
            ll += total[c * w];
            for (int j = 0; j < d; j++) gradient[j] += total[c * w + 1 + j];
        }
        if (!double.IsFinite(ll))
        {
            gradient.Clear();
            return double.NegativeInfinity;
        }
        return ll;
    }
}
