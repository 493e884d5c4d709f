using SizeTest.Foundation.Randomness;
using System.Diagnostics;
using System.Globalization;
using SizeTest.Foundation.Errors;

namespace SizeTest.Inference.Sampling;

/// <summary>
/// Bayesian evidence Z = ∫ L(θ) π(θ) dθ by nested sampling (Skilling 2004, AIP Conf. Proc. 735,
/// 395; Skilling 2006, Bayesian Analysis 1, 833). N live points are drawn from the prior through
/// the inverse-CDF transforms θ = F⁻¹(u) of <see cref="ParameterPrior.FromUnit"/>; at iteration i
/// the worst live point (lowest L) becomes a dead point with prior-mass width
/// w_i = X_{i−1} − X_i, X_i = exp(−i/N), and is replaced by a point drawn from the prior
/// restricted to L &gt; L_i. Z = Σ w_i L_i + (X_end/N) Σ_live L_j, accumulated in log space; the
/// information H = Σ p_i ln L_i − ln Z and the uncertainty σ(ln Z) ≈ √(H/N) (Skilling 2006 §9).
/// Live points tied on the lowest contour (a likelihood plateau, e.g. ln L = −∞ over part of the
/// prior) die together with the shrinkage of a shrinking live set (Fowlie, Handley &amp; Su 2021).
/// </summary>
/// <remarks>
/// Replacement uses slice sampling (Neal 2003, Ann. Stat. 31, 705: stepping out and shrinkage)
/// inside the unit cube, starting from a randomly chosen live point above the contour, along the
/// difference of two other random live points (the differential direction of ensemble slice
/// sampling, Karamanis &amp; Beutler 2021, Stat. Comput. 31, 61), which follows curved and
/// correlated contours and can jump between modes. 10·d steps by default: calibrated against
/// closed-form evidences so that the seed-to-seed scatter of ln Z matches the quoted √(H/N)
/// (docs/sampling.md §3). Slice sampling needs no step-size tuning and always returns a valid
/// point. The run is sequential and fully determined by the seed.
/// </remarks>
public sealed class NestedSampler
{
    private readonly ILogDensity _logLikelihood;
    private readonly ParameterPrior[] _priors;
    private readonly NestedSamplerOptions _options;
    private readonly int _d;

    /// <summary>Creates a sampler for <paramref name="logLikelihood"/> under independent <paramref name="priors"/>.</summary>
    /// <param name="logLikelihood">ln L(θ) (the likelihood only; the prior comes from <paramref name="priors"/>).</param>
    /// <param name="priors">One proper prior per parameter, in parameter order.</param>
    /// <param name="options">Settings; defaults when null.</param>
    /// <exception cref="ArgumentException">Mismatched dimension or invalid settings.</exception>
    public NestedSampler(ILogDensity logLikelihood, IReadOnlyList<ParameterPrior> priors, NestedSamplerOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(logLikelihood);
        ArgumentNullException.ThrowIfNull(priors);
        options ??= new NestedSamplerOptions();
        if (priors.Count != logLikelihood.Dimension || priors.Count < 1)
            throw new ArgumentException($"One prior per parameter is needed: the likelihood has {logLikelihood.Dimension} parameters, {priors.Count} priors were given.", nameof(priors));
        for (int i = 0; i < priors.Count; i++)
        {
            if (priors[i] is null) throw new ArgumentException($"Prior {i} is null.", nameof(priors));
            if (!(priors[i].Max > priors[i].Min) || !double.IsFinite(priors[i].Min) || !double.IsFinite(priors[i].Max))
                throw new ArgumentException($"Prior {i} must have finite bounds with Max > Min.", nameof(priors));
        }
        if (options.LivePoints < 2 * priors.Count + 1 || options.LivePoints < 10)
            throw new ArgumentException($"Nested sampling needs at least max(10, 2d + 1) = {Math.Max(10, 2 * priors.Count + 1)} live points, got {options.LivePoints}.", nameof(options));
        if (!(options.Tolerance > 0)) throw new ArgumentException("The tolerance must be positive.", nameof(options));
        if (options.SliceSteps is < 1) throw new ArgumentException("SliceSteps must be at least 1.", nameof(options));
        if (options.MaxIterations < 1) throw new ArgumentException("MaxIterations must be at least 1.", nameof(options));
        if (options.ParameterNames is { } names && names.Count != priors.Count)
            throw new ArgumentException($"Expected {priors.Count} parameter names, got {names.Count}.", nameof(options));
        _logLikelihood = logLikelihood;
        _priors = [.. priors];
        _options = options;
        _d = priors.Count;
    }

    /// <summary>Runs nested sampling to the tolerance.</summary>
    /// <param name="progress">Receives progress every 100 iterations and at the end; may be null.</param>
    /// <param name="cancellationToken">Checked every iteration.</param>
    /// <exception cref="AnalysisException">The likelihood returned NaN, or no live point has a non-zero likelihood.</exception>
    /// <exception cref="OperationCanceledException">When cancelled.</exception>
    public EvidenceResult Run(IProgress<NestedProgress>? progress = null, CancellationToken cancellationToken = default)
    {
        int n = _options.LivePoints, d = _d;
        int sliceSteps = _options.SliceSteps ?? NestedSamplerOptions.DefaultSliceSteps(d);
        var rng = SeededRandom.Create(_options.Seed);
        var clock = Stopwatch.StartNew();
        var state = new SliceState(d);
        long evaluations = 0;

        var liveU = new double[n][];
        var liveTheta = new double[n][];
        var liveLogL = new double[n];
        for (int k = 0; k < n; k++)
        {
            liveU[k] = new double[d];
            for (int p = 0; p < d; p++) liveU[k][p] = Interior(rng.NextDouble());
            liveTheta[k] = new double[d];
            liveLogL[k] = Evaluate(liveU[k], liveTheta[k], ref evaluations);
        }

        var dead = new List<WeightedDraw>();   // LogWeight holds ln(w_i L_i) until normalised
        double logZ = double.NegativeInfinity, h = 0.0;
        int iteration = 0;
        bool converged = false;
        var exitReason = ExitReason.None;
        var candidate = new double[d];
        var candidateTheta = new double[d];
        int recomputeEvery = Math.Max(1, n / 20);

        double logX = 0.0;                        // ln X of the current contour (X_0 = 1)
        int nextShapeUpdate = 0;
        var tied = new List<int>();
        while (true)
        {
            cancellationToken.ThrowIfCancellationRequested();
            double threshold = double.PositiveInfinity, maxLogL = double.NegativeInfinity;
            for (int k = 0; k < n; k++)
            {
                if (liveLogL[k] < threshold) threshold = liveLogL[k];
                if (liveLogL[k] > maxLogL) maxLogL = liveLogL[k];
            }
            // All live points on the lowest contour die together. With k tied points they are removed one at
            // a time from n, n−1, …, n−k+1 live points, each removal shrinking ln X by 1/(live count), so a
            // plateau holding a fraction f of the mass is compressed by ≈ f (Fowlie, Handley & Su 2021,
            // MNRAS 503, 1199). Without ties (k = 1) this is the usual X_i = exp(−i/N).
            tied.Clear();
            for (int k = 0; k < n; k++) if (liveLogL[k] == threshold) tied.Add(k);
            if (tied.Count == n)
            {
                if (double.IsNegativeInfinity(threshold))
                    throw new AnalysisException(string.Create(CultureInfo.InvariantCulture,
                        $"Nested sampling found no point with a non-zero likelihood (every live point has ln L = −∞ at iteration {iteration + 1}); check the priors and the likelihood's support."));
                // The whole remaining prior mass X lies on one plateau of height L: its evidence X·L is exact
                // and is added below as the live-point contribution.
                converged = true;
                exitReason = new ExitReason(ExitCause.Converged, string.Create(CultureInfo.InvariantCulture,
                    $"all live points lie on one likelihood plateau (ln L = {threshold:G6}); its prior mass was added exactly"));
                break;
            }
            for (int t = 0; t < tied.Count; t++)
            {
                int liveCount = n - t;
                double logWidth = logX + Math.Log(-double.ExpM1(-1.0 / liveCount));   // ln(X − X e^{−1/n})
                double logWt = logWidth + threshold;
                Accumulate(logWt, threshold, ref logZ, ref h);
                dead.Add(new WeightedDraw((double[])liveTheta[tied[t]].Clone(), threshold, logWt));
                logX -= 1.0 / liveCount;
                iteration++;
            }

            double remaining = RemainingLogEvidence(maxLogL + logX, logZ);
            if (progress is not null && iteration / 100 != (iteration - tied.Count) / 100)
                progress.Report(new NestedProgress(iteration, logZ, remaining, _options.Tolerance, threshold, evaluations, clock.Elapsed));
            if (remaining < _options.Tolerance)
            {
                converged = true;
                exitReason = new ExitReason(ExitCause.Converged, string.Create(CultureInfo.InvariantCulture,
                    $"remaining evidence changes ln Z by {remaining:G3} < tolerance {_options.Tolerance:G3}"));
                break;
            }
            if (iteration >= _options.MaxIterations)
            {
                exitReason = new ExitReason(ExitCause.SamplerNotConverged, string.Create(CultureInfo.InvariantCulture,
                    $"stopped at the iteration limit {_options.MaxIterations} with ln Z still uncertain by {remaining:G3} from the live points (tolerance {_options.Tolerance:G3})"));
                break;
            }

            if (iteration >= nextShapeUpdate)
            {
                state.UpdateShape(liveU);
                nextShapeUpdate = iteration + recomputeEvery;
            }
            foreach (int worst in tied)
            {
                int start = PickStart(rng, liveLogL, worst, threshold);
                liveU[start].CopyTo(candidate, 0);
                double candidateLogL = liveLogL[start];
                for (int s = 0; s < sliceSteps; s++)
                {
                    state.DrawDirection(rng, liveU, start, worst);
                    candidateLogL = SliceStep(rng, state, candidate, candidateTheta, candidateLogL, threshold, ref evaluations);
                }
                candidate.CopyTo(liveU[worst], 0);
                for (int p = 0; p < d; p++) liveTheta[worst][p] = _priors[p].FromUnit(candidate[p]);
                liveLogL[worst] = candidateLogL;
            }
        }

        // Final live points: each holds X_end / N of the prior mass.
        double liveLogWidth = logX - Math.Log(n);
        var order = Enumerable.Range(0, n).OrderBy(k => liveLogL[k]).ToArray();
        foreach (int k in order)
        {
            double logWt = liveLogWidth + liveLogL[k];
            Accumulate(logWt, liveLogL[k], ref logZ, ref h);
            dead.Add(new WeightedDraw((double[])liveTheta[k].Clone(), liveLogL[k], logWt));
        }
        clock.Stop();

        var samples = new WeightedDraw[dead.Count];
        double maxL = double.NegativeInfinity;
        for (int i = 0; i < dead.Count; i++)
        {
            samples[i] = dead[i] with { LogWeight = dead[i].LogWeight - logZ };
            maxL = Math.Max(maxL, dead[i].LogLikelihood);
        }
        h = Math.Max(h, 0.0);
        var result = new EvidenceResult
        {
            LogEvidence = logZ,
            LogEvidenceError = Math.Sqrt(h / n),
            Information = h,
            WeightedDraws = samples,
            Iterations = iteration,
            LivePoints = n,
            Evaluations = evaluations,
            MaxLogLikelihood = maxL,
            Seed = _options.Seed,
            Converged = converged,
            ExitReason = exitReason,
            Elapsed = clock.Elapsed,
        };
        progress?.Report(new NestedProgress(iteration, logZ, 0.0, _options.Tolerance, samples[^1].LogLikelihood, evaluations, clock.Elapsed));
        return result;
    }

    /// <summary>ln(Z + ΔZ) − ln Z with ln ΔZ = <paramref name="logRemaining"/>.</summary>
    private static double RemainingLogEvidence(double logRemaining, double logZ)
    {
        if (double.IsNegativeInfinity(logRemaining)) return 0.0;
        if (double.IsNegativeInfinity(logZ)) return double.PositiveInfinity;
        double r = logRemaining - logZ;
        return r > 30 ? r : double.LogP1(Math.Exp(r));
    }

    /// <summary>
    /// Adds one weight to ln Z and updates H by Skilling's recursion
    /// H' = (w L / Z') ln L + (Z / Z') (H + ln Z) − ln Z' (Skilling 2006 §9; Sivia &amp; Skilling 2006 ch. 9).
    /// </summary>
    private static void Accumulate(double logWt, double logL, ref double logZ, ref double h)
    {
        if (double.IsNegativeInfinity(logWt)) return;
        double logZNew = LogAddExp(logZ, logWt);
        double a = Math.Exp(logWt - logZNew);
        double previous = double.IsNegativeInfinity(logZ) ? 0.0 : Math.Exp(logZ - logZNew) * (h + logZ);
        h = a * logL + previous - logZNew;
        logZ = logZNew;
    }

    private static double LogAddExp(double a, double b)
    {
        if (double.IsNegativeInfinity(a)) return b;
        if (double.IsNegativeInfinity(b)) return a;
        return a > b ? a + double.LogP1(Math.Exp(b - a)) : b + double.LogP1(Math.Exp(a - b));
    }

    /// <summary>A random live point strictly above the contour (the caller guarantees one exists).</summary>
    private static int PickStart(Random rng, double[] liveLogL, int worst, double threshold)
    {
        int n = liveLogL.Length;
        int j = rng.Next(n - 1);
        if (j >= worst) j++;
        if (liveLogL[j] > threshold) return j;
        var above = new List<int>();
        for (int k = 0; k < n; k++) if (liveLogL[k] > threshold) above.Add(k);
        return above[rng.Next(above.Count)];
    }

    /// <summary>
    /// One hit-and-run slice step (Neal 2003 §4–5) in the unit cube on the uniform density
    /// restricted to ln L &gt; <paramref name="threshold"/>, along <see cref="SliceState.Direction"/>.
    /// Updates <paramref name="u"/> in place and returns its ln L.
    /// </summary>
    private double SliceStep(Random rng, SliceState state, double[] u, double[] theta, double logL, double threshold, ref long evaluations)
    {
        int d = _d;
        var dir = state.Direction;
        var trial = state.Trial;
        // Initial bracket of width w = 1 (in units of the direction's length) placed at random around 0.
        double left = -rng.NextDouble(), right = left + 1.0;
        int guard = 0;
        while (guard++ < 100 && Inside(u, dir, left, trial, theta, threshold, ref evaluations, out _)) left -= 1.0;
        guard = 0;
        while (guard++ < 100 && Inside(u, dir, right, trial, theta, threshold, ref evaluations, out _)) right += 1.0;
        for (int shrink = 0; shrink < 200; shrink++)
        {
            double t = left + rng.NextDouble() * (right - left);
            if (Inside(u, dir, t, trial, theta, threshold, ref evaluations, out double trialLogL))
            {
                for (int p = 0; p < d; p++) u[p] = trial[p];
                return trialLogL;
            }
            if (t < 0) left = t; else right = t;
        }
        return logL;   // interval collapsed onto the start point: keep it (it satisfies the constraint)
    }

    private bool Inside(double[] u, double[] dir, double t, double[] trial, double[] theta, double threshold, ref long evaluations, out double logL)
    {
        logL = double.NegativeInfinity;
        for (int p = 0; p < _d; p++)
        {
            double x = u[p] + t * dir[p];
            if (!(x > 0.0 && x < 1.0)) return false;
            trial[p] = x;
        }
        logL = Evaluate(trial, theta, ref evaluations);
        return logL > threshold;
    }

    private double Evaluate(double[] u, double[] theta, ref long evaluations)
    {
        for (int p = 0; p < _d; p++) theta[p] = _priors[p].FromUnit(u[p]);
        evaluations++;
        double logL = _logLikelihood.LogDensity(theta);
        if (double.IsNaN(logL))
            throw new AnalysisException(
                $"The log-likelihood returned NaN at ({string.Join(", ", theta.Select((x, i) => $"{ParameterName(i)} = {x.ToString("G6", CultureInfo.InvariantCulture)}"))}); it must return −∞ where the model is undefined, never NaN.");
        return logL;
    }

    private string ParameterName(int i) => _options.ParameterNames is { } names && i < names.Count ? names[i] : $"theta_{i}";

    private static double Interior(double u) => u <= 0.0 ? double.Epsilon : u;

    /// <summary>
    /// Slice directions: the difference of two random live points, or (when the two coincide) a direction
    /// shaped by the live points' covariance (its Cholesky factor); plus scratch arrays.
    /// </summary>
    private sealed class SliceState
    {
        private readonly int _d;
        private readonly double[] _chol;
        private readonly double[] _g;

        public SliceState(int d)
        {
            _d = d;
            _chol = new double[d * d];
            _g = new double[d];
            Direction = new double[d];
            Trial = new double[d];
            for (int i = 0; i < d; i++) _chol[i * d + i] = 0.1;
        }

        public double[] Direction { get; }
        public double[] Trial { get; }

        /// <summary>Cholesky factor of the live points' sample covariance in the unit cube (diagonal fallback if not positive definite).</summary>
        public void UpdateShape(double[][] live)
        {
            int d = _d, n = live.Length;
            var mean = new double[d];
            foreach (var u in live) for (int p = 0; p < d; p++) mean[p] += u[p] / n;
            var cov = new double[d * d];
            foreach (var u in live)
                for (int i = 0; i < d; i++)
                    for (int j = 0; j <= i; j++)
                        cov[i * d + j] += (u[i] - mean[i]) * (u[j] - mean[j]) / (n - 1);
            for (int i = 0; i < d; i++) for (int j = 0; j < i; j++) cov[j * d + i] = cov[i * d + j];
            if (!TryCholesky(cov, d, _chol))
            {
                Array.Clear(_chol);
                for (int i = 0; i < d; i++) _chol[i * d + i] = Math.Sqrt(Math.Max(cov[i * d + i], 1e-24));
            }
        }

        /// <summary>
        /// Direction = u_a − u_b for two distinct live points a, b drawn uniformly from those other than
        /// <paramref name="start"/> (the chain's first point) and <paramref name="replaced"/> (the dead point), so the
        /// direction does not depend on the chain's state and is symmetric (±v equally likely), as hit-and-run needs
        /// (Karamanis &amp; Beutler 2021 §3.2, differential move). Its length is about √2 live-point standard deviations along
        /// it. If the two points coincide, a covariance-shaped direction instead.
        /// </summary>
        public void DrawDirection(Random rng, double[][] live, int start, int replaced)
        {
            int n = live.Length, a, b;
            do a = rng.Next(n); while (a == start || a == replaced);
            do b = rng.Next(n); while (b == start || b == replaced || b == a);
            double norm = 0;
            for (int i = 0; i < _d; i++)
            {
                Direction[i] = live[a][i] - live[b][i];
                norm += Direction[i] * Direction[i];
            }
            if (!(norm > 0)) CovarianceDirection(rng, Direction);
        }

        /// <summary>dir = L g / |g| with g ~ N(0, I): a random direction with length about one live-point standard deviation.</summary>
        private void CovarianceDirection(Random rng, double[] dir)
        {
            int d = _d;
            double norm = 0;
            for (int i = 0; i < d; i++)
            {
                double u1 = 1.0 - rng.NextDouble(), u2 = rng.NextDouble();
                _g[i] = Math.Sqrt(-2.0 * Math.Log(u1)) * Math.Cos(2.0 * Math.PI * u2);
                norm += _g[i] * _g[i];
            }
            norm = Math.Sqrt(norm);
            for (int i = 0; i < d; i++)
            {
                double s = 0;
                for (int j = 0; j <= i; j++) s += _chol[i * d + j] * _g[j];
                dir[i] = s / norm;
            }
        }

        private static bool TryCholesky(double[] a, int d, double[] l)
        {
            Array.Clear(l);
            for (int i = 0; i < d; i++)
                for (int j = 0; j <= i; j++)
                {
                    double s = a[i * d + j];
                    for (int k = 0; k < j; k++) s -= l[i * d + k] * l[j * d + k];
                    if (i == j)
                    {
                        if (!(s > 0)) return false;
                        l[i * d + i] = Math.Sqrt(s);
                    }
                    else l[i * d + j] = s / l[j * d + j];
                }
            return true;
        }
    }
}
