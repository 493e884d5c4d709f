using SizeTest.Photometry;

namespace SizeTest.Inference;

/// <summary>One profile point with the maximising free-parameter vector (the profiled parameter included).</summary>
/// <param name="Value">The profiled parameter's value.</param>
/// <param name="Objective">Penalised ln L (ln L plus the Gaussian prior terms, the quantity the fit maximises up to a
/// constant) maximised over the other parameters.</param>
/// <param name="LogLikelihood">ln L at that maximum (data only).</param>
/// <param name="Theta">The full free-parameter vector at that maximum, in the hypothesis's θ order.</param>
/// <param name="Converged">Whether the inner fit converged.</param>
public sealed record ProfileSample(double Value, double Objective, double LogLikelihood, double[] Theta, bool Converged);

/// <summary>
/// Refits of a hypothesis with one free parameter held at given values (the inner maximisation of a profile
/// likelihood), warm-started from a nearby point's solution.
/// </summary>
public sealed class ProfileRefit
{
    private readonly Hypothesis _h;
    private readonly Evaluation.EvaluationBackend _backend;
    private readonly int _j;
    private readonly Lazy<Evaluation.RowSumLikelihood> _parent;

    /// <summary>Prepares refits of free parameter <paramref name="parameter"/> of <paramref name="hypothesis"/> in this process.</summary>
    public ProfileRefit(Hypothesis hypothesis, Observables observables, string parameter)
        : this(Evaluation.EvaluationBackend.InProcess(observables ?? throw new ArgumentNullException(nameof(observables))), hypothesis, parameter)
    {
    }

    /// <summary>Prepares refits of free parameter <paramref name="parameter"/> of <paramref name="hypothesis"/> on <paramref name="backend"/>
    /// (the hypothesis is bound there once, at the first refit).</summary>
    public ProfileRefit(Evaluation.EvaluationBackend backend, Hypothesis hypothesis, string parameter)
    {
        ArgumentNullException.ThrowIfNull(backend);
        ArgumentNullException.ThrowIfNull(hypothesis);
        _h = hypothesis;
        _parent = new Lazy<Evaluation.RowSumLikelihood>(() => backend.Bind(hypothesis));
        _backend = backend;
        _j = IndexOf(hypothesis, parameter);
        Parameter = parameter;
    }

    /// <summary>Prepares refits of free parameter <paramref name="parameter"/> of the bound likelihood <paramref name="likelihood"/>
    /// on <paramref name="backend"/>: every refit shares its bound rows and redshift grid (<see cref="Evaluation.RowSumLikelihood.WithFixed"/>).</summary>
    public ProfileRefit(Evaluation.EvaluationBackend backend, Evaluation.RowSumLikelihood likelihood, string parameter)
    {
        ArgumentNullException.ThrowIfNull(backend);
        ArgumentNullException.ThrowIfNull(likelihood);
        _h = likelihood.Hypothesis;
        _parent = new Lazy<Evaluation.RowSumLikelihood>(likelihood);
        _backend = backend;
        _j = IndexOf(_h, parameter);
        Parameter = parameter;
    }

    private static int IndexOf(Hypothesis hypothesis, string parameter)
    {
        int j = hypothesis.FreeParameters.ToList().FindIndex(p => p.Name == parameter);
        if (j < 0) throw new ArgumentException($"parameter '{parameter}' is not free in model '{hypothesis.Label}', so it cannot be profiled");
        return j;
    }

    /// <summary>The covariance of a fit of the hypothesis (e.g. the maximum's Hessian covariance), or null. When given with
    /// positive variances, each refit's L-BFGS-B starts from the conditional covariance of the other parameters given this
    /// one, Σ₋ⱼ₋ⱼ − Σ₋ⱼⱼ Σⱼ₋ⱼ / Σⱼⱼ (the inverse Hessian of the inner problem for a quadratic ln L), so warm-started refits take
    /// Newton-like steps at once.</summary>
    public double[,]? Covariance
    {
        get => _covariance;
        init
        {
            _covariance = value;
            _innerInverseHessian = value is null ? null : Conditional(value, _j);
        }
    }

    private readonly double[,]? _covariance;
    private readonly double[,]? _innerInverseHessian;

    private static double[,]? Conditional(double[,] c, int j)
    {
        int d = c.GetLength(0);
        if (d < 2 || c.GetLength(1) != d || !(c[j, j] > 0)) return null;
        var r = new double[d - 1, d - 1];
        for (int a = 0, ra = 0; a < d; a++)
        {
            if (a == j) continue;
            for (int b = 0, rb = 0; b < d; b++)
            {
                if (b == j) continue;
                r[ra, rb++] = c[a, b] - c[a, j] * c[j, b] / c[j, j];
            }
            if (!(r[ra, ra] > 0) || !double.IsFinite(r[ra, ra])) return null; // a parameter at a bound has no curvature here
            ra++;
        }
        return r;
    }

    /// <summary>The profiled parameter.</summary>
    public string Parameter { get; }

    /// <summary>Its index in θ.</summary>
    public int Index => _j;

    /// <summary>Its lower bound.</summary>
    public double Min => _h.FreeParameters[_j].Min;

    /// <summary>Its upper bound.</summary>
    public double Max => _h.FreeParameters[_j].Max;

    /// <summary>The penalised ln L of hypothesis <paramref name="h"/> at full θ: ln L plus the log-densities of its
    /// Gaussian priors (uniform priors are constant inside the bounds and left out).</summary>
    public static double Penalised(Hypothesis h, ReadOnlySpan<double> theta, double logLikelihood)
    {
        ArgumentNullException.ThrowIfNull(h);
        double v = logLikelihood;
        for (int k = 0; k < h.FreeParameters.Count; k++)
            if (h.FreeParameters[k].Status == ParameterStatus.GaussianPrior) v += h.FreeParameters[k].Prior.LogDensity(theta[k]);
        return v;
    }

    /// <summary>Maximises over the other free parameters with this one at <paramref name="value"/>, starting from the
    /// other components of <paramref name="start"/> (a full θ).</summary>
    public ProfileSample At(double value, ReadOnlySpan<double> start)
    {
        var lik = _parent.Value.WithFixed(Parameter, value);
        var fixedH = lik.Hypothesis;
        var s = new double[start.Length - 1];
        for (int k = 0, m = 0; k < start.Length; k++) if (k != _j) s[m++] = start[k];
        var settings = new OptimizerSettings(Starts: 1, InitialStep: 0.2);
        var fit = MaximumLikelihood.Fit(lik, lik.Posterior, fixedH.FreeParameters, s, settings, covariance: false,
            initialInverseHessian: _innerInverseHessian);
        if (!fit.Converged && _innerInverseHessian is not null)
        {
            // The covariance of the fit is a poor model far from the maximum: a refit that fails with it is run again
            // from the scaled identity, and the better of the two is kept (a profile point is a maximum, never a failed run).
            var again = MaximumLikelihood.Fit(lik, lik.Posterior, fixedH.FreeParameters, s, settings, covariance: false);
            if (!(again.LogPosterior < fit.LogPosterior)) fit = again;
        }
        var full = new double[start.Length];
        for (int k = 0, m = 0; k < full.Length; k++) full[k] = k == _j ? value : fit.Theta[m++];
        double ll = fit.LogLikelihood;
        double obj = double.IsFinite(ll) ? Penalised(_h, full, ll) : double.NegativeInfinity;
        return new ProfileSample(value, obj, ll, full, fit.Converged);
    }

    /// <summary>
    /// The profile on <paramref name="grid"/> (ascending), swept outward from the grid point nearest to
    /// <paramref name="start"/>'s value in both directions, each point warm-started from its inner neighbour.
    /// The two directions run in parallel in one process (in order under MPI).
    /// </summary>
    public ProfileSample[] Sweep(IReadOnlyList<double> grid, double[] start)
    {
        ArgumentNullException.ThrowIfNull(grid);
        ArgumentNullException.ThrowIfNull(start);
        var result = new ProfileSample[grid.Count];
        if (grid.Count == 0) return result;
        int c = 0;
        for (int i = 1; i < grid.Count; i++) if (Math.Abs(grid[i] - start[_j]) < Math.Abs(grid[c] - start[_j])) c = i;
        result[c] = At(grid[c], start);
        _backend.ForEach(2, side =>
        {
            // Each side extrapolates only from its own points (the centre included), never from the other side's, which
            // is being computed at the same time.
            if (side == 0) for (int i = c - 1; i >= 0; i--) result[i] = At(grid[i], Warm(grid[i], result[i + 1], i + 2 <= c ? result[i + 2] : null, start));
            else for (int i = c + 1; i < grid.Count; i++) result[i] = At(grid[i], Warm(grid[i], result[i - 1], i - 2 >= c ? result[i - 2] : null, start));
        });
        return result;
    }

    // The start for the refit at value v: the neighbour's solution, extrapolated linearly along the path of the two previous
    // solutions when both are finite (the other parameters then start O(step²) rather than O(step) from their maximum),
    // kept inside the bounds; a failed neighbour (ln L = −∞) is a poor start, so then the original one.
    private double[] Warm(double v, ProfileSample neighbour, ProfileSample? before, double[] start)
    {
        if (!double.IsFinite(neighbour.Objective)) return start;
        if (before is null || !double.IsFinite(before.Objective) || before.Value == neighbour.Value) return neighbour.Theta;
        double t = (v - neighbour.Value) / (neighbour.Value - before.Value);
        var x = new double[neighbour.Theta.Length];
        for (int k = 0; k < x.Length; k++)
        {
            var p = _h.FreeParameters[k];
            double e = neighbour.Theta[k] + t * (neighbour.Theta[k] - before.Theta[k]), room = 1e-9 * (p.Max - p.Min);
            x[k] = neighbour.Theta[k] > p.Min + room && neighbour.Theta[k] < p.Max - room
                ? Math.Clamp(e, p.Min + room, p.Max - room) // interior: stay interior
                : neighbour.Theta[k]; // on a bound: stay there
        }
        return x;
    }

    /// <summary>A grid over the whole bounded range: <paramref name="points"/> values evenly spaced, or evenly spaced in
    /// ln for a positive range spanning more than a factor 100 (scale parameters such as r0_kpc).</summary>
    public static double[] WholeRangeGrid(double min, double max, int points)
    {
        if (points < 2) throw new ArgumentOutOfRangeException(nameof(points), "a profile grid needs at least 2 points");
        bool log = min > 0 && max / min > 100;
        return Enumerable.Range(0, points).Select(i =>
        {
            double f = i / (double)(points - 1);
            double v = log ? Math.Exp(Math.Log(min) + f * (Math.Log(max) - Math.Log(min))) : min + f * (max - min);
            return i == 0 ? min : i == points - 1 ? max : v;
        }).ToArray();
    }
}
