using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;

namespace SizeTest.Inference;

/// <summary>
/// Bounded multi-start maximum likelihood: Nelder–Mead simplex (MathNet.Numerics) in logistic-transformed
/// coordinates (<see cref="BoundedTransform"/>), restarted from the best point until it stops improving,
/// then a numerical Hessian for the covariance and a convergence verdict.
/// </summary>
public static class MaximumLikelihood
{
    /// <summary>Fits <paramref name="likelihood"/> (maximising its <see cref="HypothesisLikelihood.Posterior"/>).</summary>
    /// <param name="likelihood">The bound hypothesis.</param>
    /// <param name="settings">Starts, seed and tolerances.</param>
    /// <param name="start">Starting vector (default: <see cref="HypothesisLikelihood.SuggestStart"/>).</param>
    /// <param name="covariance">Whether to compute the Hessian covariance (bootstrap refits skip it; their verdict
    /// then rests on the optimiser alone).</param>
    public static MaximumLikelihoodResult Fit(HypothesisLikelihood likelihood, OptimizerSettings? settings = null, double[]? start = null, bool covariance = true)
    {
        ArgumentNullException.ThrowIfNull(likelihood);
        return Fit(likelihood, likelihood.Posterior, likelihood.Hypothesis.FreeParameters, start ?? likelihood.SuggestStart(), settings, covariance);
    }

    /// <summary>
    /// The same search for a likelihood given as any <see cref="ILogDensity"/> (e.g. a sum over MPI ranks): maximises
    /// <paramref name="posterior"/> over the bounds of <paramref name="free"/> from <paramref name="start"/>, and reports ln L
    /// from <paramref name="likelihood"/>.
    /// </summary>
    /// <param name="likelihood">ln L over the free parameters (data only).</param>
    /// <param name="posterior">ln L + ln prior, the objective.</param>
    /// <param name="free">The free parameters (bounds and names), in θ order.</param>
    /// <param name="start">Starting vector.</param>
    /// <param name="settings">Starts, seed and tolerances.</param>
    /// <param name="covariance">Whether to compute the Hessian covariance.</param>
    public static MaximumLikelihoodResult Fit(ILogDensity likelihood, ILogDensity posterior, IReadOnlyList<ParameterSetting> free, double[] start,
        OptimizerSettings? settings = null, bool covariance = true)
    {
        ArgumentNullException.ThrowIfNull(likelihood);
        ArgumentNullException.ThrowIfNull(posterior);
        ArgumentNullException.ThrowIfNull(free);
        ArgumentNullException.ThrowIfNull(start);
        settings ??= OptimizerSettings.Default;
        int d = free.Count;
        var min = free.Select(p => p.Min).ToArray();
        var max = free.Select(p => p.Max).ToArray();
        var post = posterior;
        if (d == 0)
        {
            double ll0 = likelihood.LogDensity([]);
            bool ok = double.IsFinite(ll0);
            return new MaximumLikelihoodResult([], ll0, post.LogDensity([]), ok,
                ok ? "nothing to fit: every parameter is fixed" : "the likelihood is not finite at the fixed parameters", 1, 1, 1, new double[0, 0], []);
        }
        var tr = new BoundedTransform(min, max);
        int evals = 0;
        var xbuf = new double[d];
        double Objective(Vector<double> u)
        {
            evals++;
            tr.ToBounded(u.AsArray() ?? u.ToArray(), xbuf);
            double v = -post.LogDensity(xbuf);
            return double.IsFinite(v) ? v : 1e300;
        }
        var objective = ObjectiveFunction.Value(Objective);
        var x0 = start;
        var u0 = new double[d];
        tr.ToUnbounded(x0, u0);
        var rng = new Random(settings.Seed);
        var starts = new List<double[]> { u0 };
        for (int s = 1; s < settings.Starts; s++)
            starts.Add(u0.Select(v => v + Gaussian(rng)).ToArray());

        var ends = new List<(double[] U, double F, string Reason)>();
        foreach (var s in starts) ends.Add(RunOnce(objective, s, settings));
        var best = ends.OrderBy(e => e.F).First();
        int agreeing = ends.Count(e => e.F - best.F < settings.AgreementTolerance);

        // Restart from the best point: Nelder–Mead can stall on a ridge; a fresh simplex must not improve.
        int restarts = 0;
        bool stable = false;
        string reason = best.Reason;
        while (restarts < 4)
        {
            var r = RunOnce(objective, best.U, settings);
            restarts++;
            bool improved = r.F < best.F - 1e-6 * Math.Max(1, Math.Abs(best.F));
            if (r.F < best.F) best = r;
            reason = r.Reason;
            if (!improved) { stable = true; break; }
        }

        var theta = new double[d];
        tr.ToBounded(best.U, theta);
        var atBound = new bool[d];
        for (int j = 0; j < d; j++)
            atBound[j] = Math.Min(theta[j] - min[j], max[j] - theta[j]) <= 1e-6 * (max[j] - min[j]);
        var active = atBound.Select(b => !b).ToArray();
        double[,]? cov = null;
        if (covariance)
        {
            var (hess, he) = FiniteDifferenceHessian.Compute(post, theta, min, max, active);
            evals += he;
            cov = FiniteDifferenceHessian.Covariance(hess, active);
        }
        double ll = likelihood.LogDensity(theta);
        double lp = post.LogDensity(theta);
        evals += 2;

        bool optimiserOk = reason == "converged" && double.IsFinite(ll);
        bool converged = optimiserOk && stable && (cov is not null || !covariance);
        var words = new List<string>();
        if (!double.IsFinite(ll)) words.Add("the likelihood is not finite anywhere the search went (check the data against the model)");
        else if (!optimiserOk) words.Add($"Nelder–Mead stopped without meeting its tolerance ({reason})");
        else if (!stable) words.Add("restarts kept improving the maximum (a ridge or a very flat likelihood)");
        if (double.IsFinite(ll) && cov is null && covariance)
            words.Add("the Hessian is not negative definite (a parameter is unconstrained or degenerate with another, e.g. r0_kpc with h0)");
        var bounds = Enumerable.Range(0, d).Where(j => atBound[j]).Select(j => free[j].Name).ToArray();
        string summary = converged
            ? $"converged: Nelder–Mead met the relative tolerance {settings.Tolerance:g2}, a restart did not improve it, {agreeing} of {starts.Count} starts agree" + (covariance ? ", Hessian negative definite" : "")
            : "not converged: " + string.Join("; ", words);
        if (bounds.Length > 0) summary += $"; at a bound: {string.Join(", ", bounds)} (its interval is one-sided)";
        return new MaximumLikelihoodResult(theta, ll, lp, converged, summary, evals, agreeing, starts.Count, cov, atBound);
    }

    private static (double[] U, double F, string Reason) RunOnce(IObjectiveFunction objective, double[] u0, OptimizerSettings s)
    {
        var nm = new NelderMeadSimplex(s.Tolerance, s.MaxIterations);
        var init = Vector<double>.Build.DenseOfArray(u0);
        var pert = Vector<double>.Build.Dense(u0.Length, s.InitialStep);
        try
        {
            var r = nm.FindMinimum(objective, init, pert);
            string reason = r.ReasonForExit == ExitCondition.Converged ? "converged" : Words(r.ReasonForExit);
            return (r.MinimizingPoint.ToArray(), r.FunctionInfoAtMinimum.Value, reason);
        }
        catch (MaximumIterationsException)
        {
            objective.EvaluateAt(init);
            return (u0, objective.Value, $"hit the iteration cap of {s.MaxIterations}");
        }
    }

    private static string Words(ExitCondition c) => c switch
    {
        ExitCondition.ExceedIterations => "hit the iteration cap",
        ExitCondition.InvalidValues => "the objective returned invalid values",
        ExitCondition.LackOfProgress => "no further progress",
        ExitCondition.ManuallyStopped => "stopped",
        _ => c.ToString(),
    };

    private static double Gaussian(Random rng)
    {
        double u1 = 1.0 - rng.NextDouble(), u2 = rng.NextDouble();
        return Math.Sqrt(-2 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
    }
}
