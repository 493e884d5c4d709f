using SizeTest.Foundation.Randomness;
using System.Diagnostics;
using System.Globalization;
using MathNet.Numerics.LinearAlgebra;
using SizeTest.Foundation.Errors;

namespace SizeTest.Inference.Sampling;

/// <summary>
/// Affine-invariant ensemble Markov-chain Monte Carlo (Goodman &amp; Weare 2010, CAMCoS 5, 65).
/// The walkers are split into two halves updated alternately; each half's proposals come
/// from the other half only, so they can be evaluated in parallel. Every random number is drawn
/// sequentially from the sampler's own seeded <see cref="Random"/> before the evaluation, so a
/// run gives the same chain for a seed whatever <see cref="EnsembleSamplerOptions.MaxDegreeOfParallelism"/> is.
/// </summary>
/// <remarks>
/// The sampler refuses fewer than 2·d walkers, a starting log density that is NaN or not
/// finite, and a degenerate starting ensemble (walkers linearly dependent, e.g. all equal in
/// some direction), because the stretch move can never leave the subspace they span. A NaN
/// log density during the run raises <see cref="AnalysisException"/>.
/// </remarks>
public sealed class EnsembleSampler
{
    private readonly ILogDensity _density;
    private readonly EnsembleSamplerOptions _options;

    /// <summary>Creates a sampler of <paramref name="logDensity"/> (a log posterior, thread-safe).</summary>
    /// <exception cref="ArgumentException">When the options are invalid (too few walkers, non-positive steps, …).</exception>
    public EnsembleSampler(ILogDensity logDensity, EnsembleSamplerOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(logDensity);
        options ??= new EnsembleSamplerOptions();
        int d = logDensity.Dimension;
        if (d < 1) throw new ArgumentException("The log density must have at least one parameter.", nameof(logDensity));
        if (options.Walkers < 2 * d)
            throw new ArgumentException(
                $"The ensemble sampler needs at least 2 × {d} = {2 * d} walkers for {d} parameters, but {options.Walkers} were requested; use more walkers.",
                nameof(options));
        if (options.Steps < 1) throw new ArgumentException($"Steps must be at least 1, got {options.Steps}.", nameof(options));
        if (options.MaxSteps is { } max && max < options.Steps)
            throw new ArgumentException($"MaxSteps ({max}) must be at least Steps ({options.Steps}).", nameof(options));
        if (options.Thin < 1) throw new ArgumentException($"Thin must be at least 1, got {options.Thin}.", nameof(options));
        if (options.EffectiveBurnIn < 0 || options.EffectiveBurnIn >= options.Steps)
            throw new ArgumentException($"Burn-in must be between 0 and Steps − 1 = {options.Steps - 1}, got {options.EffectiveBurnIn}.", nameof(options));
        if (options.MaxDegreeOfParallelism == 0 || options.MaxDegreeOfParallelism < -1)
            throw new ArgumentException("MaxDegreeOfParallelism must be −1 (all cores) or a positive number.", nameof(options));
        if (options.ParameterNames is { } names && names.Count != d)
            throw new ArgumentException($"Expected {d} parameter names, got {names.Count}.", nameof(options));
        ArgumentNullException.ThrowIfNull(options.Move);
        ArgumentNullException.ThrowIfNull(options.Criteria);
        _density = logDensity;
        _options = options;
    }

    /// <summary>The options of this sampler.</summary>
    public EnsembleSamplerOptions Options => _options;

    /// <summary>
    /// Runs the sampler from <paramref name="start"/> ([walker][parameter], one row per walker).
    /// </summary>
    /// <param name="start">Starting positions, e.g. a small ball around the maximum-likelihood point; copied.</param>
    /// <param name="progress">Receives progress about 100 times per run; may be null.</param>
    /// <param name="cancellationToken">Checked once per step.</param>
    /// <param name="store">An extra store (e.g. <see cref="CsvChainStore"/>) that receives every step; completed on success.</param>
    /// <returns>The chain, acceptance and diagnostics with the convergence verdict.</returns>
    /// <exception cref="ArgumentException">Wrong shape, non-finite coordinates, non-finite starting log density, or a degenerate ensemble.</exception>
    /// <exception cref="AnalysisException">The log density returned NaN during the run.</exception>
    /// <exception cref="OperationCanceledException">When cancelled.</exception>
    public EnsembleRun Run(double[][] start, IProgress<SamplerProgress>? progress = null,
                           CancellationToken cancellationToken = default, IChainStore? store = null)
    {
        var inv = CultureInfo.InvariantCulture;
        int d = _density.Dimension, nw = _options.Walkers, steps = _options.Steps;
        ArgumentNullException.ThrowIfNull(start);
        if (start.Length != nw)
            throw new ArgumentException($"The starting ensemble has {start.Length} walkers but the options ask for {nw}.", nameof(start));
        var positions = new double[nw * d];
        for (int w = 0; w < nw; w++)
        {
            if (start[w] is null || start[w].Length != d)
                throw new ArgumentException($"Starting walker {w} must have {d} coordinates.", nameof(start));
            for (int p = 0; p < d; p++)
            {
                if (!double.IsFinite(start[w][p]))
                    throw new ArgumentException($"Starting walker {w} has a non-finite coordinate {p} ({start[w][p].ToString(inv)}).", nameof(start));
                positions[w * d + p] = start[w][p];
            }
        }
        CheckNotDegenerate(positions, nw, d);

        var names = _options.ParameterNames ?? [.. Enumerable.Range(0, d).Select(i => $"theta_{i}")];
        var parallel = new ParallelOptions
        {
            MaxDegreeOfParallelism = _options.MaxDegreeOfParallelism == -1 ? Environment.ProcessorCount : _options.MaxDegreeOfParallelism,
            CancellationToken = cancellationToken,
        };
        var evaluator = new Evaluator(_density, d, parallel);

        var logProbs = new double[nw];
        evaluator.Evaluate(positions, nw, logProbs);
        for (int w = 0; w < nw; w++)
        {
            if (double.IsNaN(logProbs[w]))
                throw new ArgumentException($"The log density of starting walker {w} is NaN; start every walker where the posterior is defined.", nameof(start));
            if (!double.IsFinite(logProbs[w]))
                throw new ArgumentException(
                    $"The log density of starting walker {w} is {logProbs[w].ToString(inv)} (outside the support or infinite); start every walker inside the prior bounds.",
                    nameof(start));
        }

        var memory = new MemoryChainStore { CapacityLimit = _options.MaxSteps ?? steps };
        memory.Begin(nw, d, names, steps);
        store?.Begin(nw, d, names, steps);

        var rng = SeededRandom.Create(_options.Seed);
        int half0 = nw / 2;
        int[] setA = [.. Enumerable.Range(0, half0)];
        int[] setB = [.. Enumerable.Range(half0, nw - half0)];
        int maxHalf = Math.Max(setA.Length, setB.Length);
        var proposals = new double[maxHalf * d];
        var logFactors = new double[maxHalf];
        var logU = new double[maxHalf];
        var newLogProbs = new double[maxHalf];
        var acceptedStep = new bool[nw];
        var acceptedTotal = new long[nw];
        long evaluations = nw;
        long acceptedAll = 0;
        int reportEvery = Math.Max(1, steps / 100);
        var clock = Stopwatch.StartNew();

        int target = steps;
        int step = 0;
        double? lastTau = null;
        int burnIn;
        ChainDiagnostics diagnostics;
        while (true)
        {
            for (; step < target; step++)
            {
                cancellationToken.ThrowIfCancellationRequested();
                Array.Clear(acceptedStep);
                for (int h = 0; h < 2; h++)
                {
                    var active = h == 0 ? setA : setB;
                    var complement = h == 0 ? setB : setA;
                    int na = active.Length;
                    _options.Move.Propose(positions, d, active, complement, rng, proposals.AsSpan(0, na * d), logFactors.AsSpan(0, na));
                    for (int i = 0; i < na; i++) logU[i] = Math.Log(1.0 - rng.NextDouble());
                    evaluator.Evaluate(proposals, na, newLogProbs);
                    evaluations += na;
                    for (int i = 0; i < na; i++)
                    {
                        double lp = newLogProbs[i];
                        if (double.IsNaN(lp))
                            throw new AnalysisException(
                                $"The log density returned NaN at step {step} for the point ({string.Join(", ", proposals.AsSpan(i * d, d).ToArray().Select(x => x.ToString("G6", inv)))}); the posterior must return −∞ outside its support, never NaN.");
                        int k = active[i];
                        double logRatio = logFactors[i] + lp - logProbs[k];
                        if (lp > double.NegativeInfinity && logU[i] < logRatio)
                        {
                            proposals.AsSpan(i * d, d).CopyTo(positions.AsSpan(k * d, d));
                            logProbs[k] = lp;
                            acceptedStep[k] = true;
                            acceptedTotal[k]++;
                            acceptedAll++;
                        }
                    }
                }
                memory.Append(step, positions, logProbs, acceptedStep);
                store?.Append(step, positions, logProbs, acceptedStep);
                if (progress is not null && ((step + 1) % reportEvery == 0 || step + 1 == target))
                    progress.Report(new SamplerProgress(step + 1, target, (double)acceptedAll / ((long)nw * (step + 1)), clock.Elapsed) { Tau = lastTau });
            }
            burnIn = _options.BurnIn ?? step / 4;
            diagnostics = ChainDiagnostics.Compute(memory, burnIn, _options.Criteria, (double)acceptedAll / ((long)nw * step));
            if (diagnostics.Verdict.Converged || _options.MaxSteps is not { } maxSteps || step >= maxSteps)
                break;
            // Extend: enough steps for MinLengthInTau·τ after the burn-in (+10%), at least half the run again.
            double tau = diagnostics.MaxTau;
            if (double.IsFinite(tau)) lastTau = tau;
            double keptFraction = _options.BurnIn is null ? 0.75 : 1.0;
            double needed = double.IsFinite(tau) ? 1.1 * _options.Criteria.MinLengthInTau * tau / keptFraction + (_options.BurnIn ?? 0) : 0;
            target = (int)Math.Min(maxSteps, Math.Max(step + step / 2.0, needed));
            if (target <= step) break;
            memory.Reserve(target);
            reportEvery = Math.Max(1, target / 100);
        }
        memory.Complete();
        store?.Complete();
        clock.Stop();
        int stepsRun = step;

        var walkerAcceptance = acceptedTotal.Select(a => (double)a / stepsRun).ToArray();
        double acceptance = walkerAcceptance.Average();
        var final = new double[nw][];
        for (int w = 0; w < nw; w++) final[w] = positions.AsSpan(w * d, d).ToArray();
        return new EnsembleRun
        {
            Chain = memory,
            BurnIn = burnIn,
            Thin = _options.Thin,
            AcceptanceFraction = acceptance,
            WalkerAcceptanceFractions = walkerAcceptance,
            Diagnostics = diagnostics,
            FinalPositions = final,
            FinalLogProbabilities = logProbs,
            Seed = _options.Seed,
            MoveName = _options.Move.Name,
            Evaluations = evaluations,
            Elapsed = clock.Elapsed,
        };
    }

    /// <summary>
    /// Makes a starting ensemble: <paramref name="walkers"/> points drawn from a Gaussian ball
    /// around <paramref name="centre"/> with per-parameter standard deviation <paramref name="scale"/>
    /// (e.g. 1e-3 × the parameter's uncertainty), seeded.
    /// </summary>
    public static double[][] GaussianBall(ReadOnlySpan<double> centre, ReadOnlySpan<double> scale, int walkers, int seed)
    {
        if (centre.Length != scale.Length) throw new ArgumentException("Centre and scale must have the same length.");
        var rng = SeededRandom.Create(seed);
        var result = new double[walkers][];
        for (int w = 0; w < walkers; w++)
        {
            result[w] = new double[centre.Length];
            for (int p = 0; p < centre.Length; p++)
            {
                double u1 = 1.0 - rng.NextDouble(), u2 = rng.NextDouble();
                result[w][p] = centre[p] + scale[p] * Math.Sqrt(-2.0 * Math.Log(u1)) * Math.Cos(2.0 * Math.PI * u2);
            }
        }
        return result;
    }

    /// <summary>
    /// Like <see cref="GaussianBall(ReadOnlySpan{double}, ReadOnlySpan{double}, int, int)"/>, but every point
    /// whose log density under <paramref name="density"/> is not finite (e.g. outside a prior bound when the
    /// centre sits near one) is drawn again, up to 1000 times per walker.
    /// </summary>
    /// <exception cref="ArgumentException">When no valid point is found for some walker.</exception>
    public static double[][] GaussianBall(ILogDensity density, ReadOnlySpan<double> centre, ReadOnlySpan<double> scale, int walkers, int seed)
    {
        ArgumentNullException.ThrowIfNull(density);
        if (centre.Length != density.Dimension) throw new ArgumentException("The centre must have one coordinate per parameter.");
        var rng = SeededRandom.Create(seed);
        var result = new double[walkers][];
        for (int w = 0; w < walkers; w++)
        {
            var x = new double[centre.Length];
            bool ok = false;
            for (int attempt = 0; attempt < 1000 && !ok; attempt++)
            {
                for (int p = 0; p < centre.Length; p++)
                {
                    double u1 = 1.0 - rng.NextDouble(), u2 = rng.NextDouble();
                    x[p] = centre[p] + scale[p] * Math.Sqrt(-2.0 * Math.Log(u1)) * Math.Cos(2.0 * Math.PI * u2);
                }
                ok = double.IsFinite(density.LogDensity(x));
            }
            if (!ok)
                throw new ArgumentException($"No starting point with a finite log density was found near the centre for walker {w}; check the centre and the scale.");
            result[w] = x;
        }
        return result;
    }

    /// <summary>
    /// Makes a starting ensemble drawn from the Gaussian N(<paramref name="centre"/>, <paramref name="covariance"/>)
    /// (e.g. the Laplace approximation at the maximum: the inverse negative Hessian), redrawing any point whose log
    /// density under <paramref name="density"/> is not finite (up to 1000 times per walker, then shrinking the spread
    /// by 2 each further 100 tries), seeded. Starting from the approximate posterior rather than a tiny ball shortens the burn-in.
    /// </summary>
    /// <exception cref="ArgumentException">When the covariance is not positive definite or no valid point is found.</exception>
    public static double[][] GaussianStart(ILogDensity density, ReadOnlySpan<double> centre, double[,] covariance, int walkers, int seed)
    {
        ArgumentNullException.ThrowIfNull(density);
        ArgumentNullException.ThrowIfNull(covariance);
        int d = centre.Length;
        if (d != density.Dimension || covariance.GetLength(0) != d || covariance.GetLength(1) != d)
            throw new ArgumentException("The centre and the covariance must match the density's dimension.");
        var chol = Matrix<double>.Build.DenseOfArray(covariance);
        MathNet.Numerics.LinearAlgebra.Factorization.Cholesky<double> factor;
        try { factor = chol.Cholesky(); }
        catch (ArgumentException) { throw new ArgumentException("The starting covariance is not positive definite."); }
        var l = factor.Factor;
        var rng = SeededRandom.Create(seed);
        var result = new double[walkers][];
        var z = new double[d];
        for (int w = 0; w < walkers; w++)
        {
            var x = new double[d];
            bool ok = false;
            double shrink = 1;
            for (int attempt = 0; attempt < 3000 && !ok; attempt++)
            {
                if (attempt >= 1000 && attempt % 100 == 0) shrink *= 0.5;
                for (int p = 0; p < d; p++)
                {
                    double u1 = 1.0 - rng.NextDouble(), u2 = rng.NextDouble();
                    z[p] = Math.Sqrt(-2.0 * Math.Log(u1)) * Math.Cos(2.0 * Math.PI * u2);
                }
                for (int p = 0; p < d; p++)
                {
                    double s = 0;
                    for (int q = 0; q <= p; q++) s += l[p, q] * z[q];
                    x[p] = centre[p] + shrink * s;
                }
                ok = double.IsFinite(density.LogDensity(x));
            }
            if (!ok)
                throw new ArgumentException($"No starting point with a finite log density was found near the centre for walker {w}; check the centre and the covariance.");
            result[w] = x;
        }
        return result;
    }

    /// <summary>
    /// Refuses an ensemble whose centred, per-parameter-standardised coordinates have a
    /// condition number above 10⁸ (the walkers then lie, numerically, in a lower-dimensional
    /// subspace that affine-invariant moves cannot leave).
    /// </summary>
    private static void CheckNotDegenerate(double[] positions, int nw, int d)
    {
        var x = Matrix<double>.Build.Dense(nw, d);
        for (int p = 0; p < d; p++)
        {
            double mean = 0;
            for (int w = 0; w < nw; w++) mean += positions[w * d + p];
            mean /= nw;
            double ss = 0;
            for (int w = 0; w < nw; w++) ss += (positions[w * d + p] - mean) * (positions[w * d + p] - mean);
            double sd = Math.Sqrt(ss / (nw - 1));
            if (!(sd > 0) || sd <= 1e-14 * Math.Max(1.0, Math.Abs(mean)))
                throw new ArgumentException(
                    $"The starting walkers do not spread in parameter {p} (all equal); start them in a small ball, not at one point.", "start");
            for (int w = 0; w < nw; w++) x[w, p] = (positions[w * d + p] - mean) / sd;
        }
        var sv = x.Svd(computeVectors: false).S;
        double cond = sv[0] / sv[d - 1];
        if (!(cond <= 1e8))
            throw new ArgumentException(
                string.Create(CultureInfo.InvariantCulture,
                    $"The starting walkers are linearly dependent (condition number {cond:G3} > 1e8); start them in a ball that spans every parameter direction."),
                "start");
    }

    /// <summary>Evaluates a batch of points, in parallel when allowed; results land by index, so order does not matter.</summary>
    private sealed class Evaluator
    {
        private readonly ILogDensity _density;
        private readonly int _d;
        private readonly ParallelOptions _parallel;
        private readonly Action<int> _body;
        private double[] _points = [];
        private double[] _output = [];

        public Evaluator(ILogDensity density, int d, ParallelOptions parallel)
        {
            _density = density;
            _d = d;
            _parallel = parallel;
            _body = i => _output[i] = _density.LogDensity(_points.AsSpan(i * _d, _d));
        }

        public void Evaluate(double[] points, int count, double[] output)
        {
            if (_parallel.MaxDegreeOfParallelism == 1 || count < 2)
            {
                for (int i = 0; i < count; i++) output[i] = _density.LogDensity(points.AsSpan(i * _d, _d));
                return;
            }
            _points = points;
            _output = output;
            try
            {
                Parallel.For(0, count, _parallel, _body);
            }
            catch (AggregateException ex) when (ex.InnerExceptions.Count == 1)
            {
                // Surface the density's own exception (e.g. an InputException) rather than the wrapper.
                System.Runtime.ExceptionServices.ExceptionDispatchInfo.Capture(ex.InnerExceptions[0]).Throw();
            }
        }
    }
}
