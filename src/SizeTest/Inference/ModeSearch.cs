namespace SizeTest.Inference;

/// <summary>What <see cref="ModeSearch"/> found.</summary>
/// <param name="Best">The global maximum (the multi-start fit, or a higher maximum reached from a profile peak).</param>
/// <param name="Modes">The distinct maxima within <see cref="ModeSearch.ModeWindow"/> in ln L of the best, best first
/// (one entry when the fit is unimodal).</param>
/// <param name="Scans">The whole-range profile scan of each free cosmological parameter, by name.</param>
public sealed record ModeSearchResult(MaximumLikelihoodResult Best, IReadOnlyList<MaximumLikelihoodResult> Modes, IReadOnlyDictionary<string, ProfileSample[]> Scans)
{
    /// <summary>True when more than one distinct maximum lies within the window.</summary>
    public bool Multimodal => Modes.Count > 1;
}

/// <summary>
/// Guards a multi-start fit against a missed maximum: scans the profile likelihood of each free cosmological
/// parameter over its whole bounded range on a coarse grid, then on a finer grid where the coarse profile is high (the
/// nuisance parameters refitted at every point, warm-started from the neighbour), starts a full fit from every local
/// maximum of each scan (and from its end points when they are high), and keeps the distinct maxima.
/// </summary>
/// <remarks>
/// The cosmological parameters enter only through distances, and for an angular-size sample at N ~ 10³ the Ωm profile
/// often has two maxima (one near Ωm → 0, one near 0.5) within Δ ln L &lt; 1 that a handful of local starts can miss.
/// Two maxima are distinct when some free parameter differs by more than its Hessian σ at the better one.
/// </remarks>
public static class ModeSearch
{
    /// <summary>Maxima within this Δ ln L of the best are reported as modes.</summary>
    public const double ModeWindow = 2.0;

    /// <summary>Default number of grid points per level of the scan (so twice this many profile points per parameter).</summary>
    public const int DefaultGridPoints = 24;

    /// <summary>Most profile peaks refitted per scanned parameter (the highest ones).</summary>
    public const int MaxPeaksPerParameter = 6;

    /// <summary>The free parameters scanned: those of the world-model family (not the nuisance model).</summary>
    public static IReadOnlyList<string> ScannedParameters(Hypothesis hypothesis)
    {
        ArgumentNullException.ThrowIfNull(hypothesis);
        var cosmo = hypothesis.Family.Parameters.Select(p => p.Name).ToHashSet(StringComparer.Ordinal);
        return hypothesis.FreeParameters.Where(p => cosmo.Contains(p.Name)).Select(p => p.Name).ToArray();
    }

    /// <summary>Runs the search around the multi-start fit <paramref name="fit"/> of <paramref name="likelihood"/>
    /// (bound to <paramref name="observables"/>).</summary>
    public static ModeSearchResult Run(HypothesisLikelihood likelihood, Photometry.Observables observables, MaximumLikelihoodResult fit, int gridPoints = DefaultGridPoints, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(likelihood);
        var backend = Evaluation.EvaluationBackend.InProcess(observables ?? throw new ArgumentNullException(nameof(observables)));
        return Run(backend, backend.Bind(likelihood.Hypothesis), fit, gridPoints, cancel);
    }

    /// <summary>As <see cref="Run(HypothesisLikelihood, Photometry.Observables, MaximumLikelihoodResult, int, CancellationToken)"/>
    /// with every refit on <paramref name="backend"/>; <paramref name="likelihood"/> is the model bound there.</summary>
    public static ModeSearchResult Run(Evaluation.EvaluationBackend backend, Evaluation.RowSumLikelihood likelihood, MaximumLikelihoodResult fit, int gridPoints = DefaultGridPoints, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(backend);
        ArgumentNullException.ThrowIfNull(likelihood);
        ArgumentNullException.ThrowIfNull(fit);
        var h = likelihood.Hypothesis;
        var scanned = ScannedParameters(h);
        var scans = new Dictionary<string, ProfileSample[]>(StringComparer.Ordinal);
        if (scanned.Count == 0 || !double.IsFinite(fit.LogLikelihood)) return new ModeSearchResult(fit, [fit], scans);
        var candidates = new List<MaximumLikelihoodResult> { fit };
        foreach (var name in scanned)
        {
            cancel.ThrowIfCancellationRequested();
            var refit = new ProfileRefit(backend, likelihood, name) { Covariance = fit.Covariance };
            var scan = Scan(refit, fit.Theta, gridPoints);
            scans[name] = scan;
            foreach (var start in StartPoints(scan))
            {
                // A peak within the fit's σ in every parameter and not above it is the fit itself: a full fit from it
                // would climb back to the same maximum (and count as the same mode), so it is not run.
                if (Coincides(h, fit, start)) continue;
                cancel.ThrowIfCancellationRequested();
                // Without the Hessian first: only a maximum that can be a mode (within the window of the fit, with a margin)
                // gets the confirming restart and the covariance, from where it ended.
                var settings = new OptimizerSettings(Starts: 1, InitialStep: 0.2);
                var f = MaximumLikelihood.Fit(likelihood, likelihood.Posterior, h.FreeParameters, start.Theta, settings, covariance: false);
                if (!double.IsFinite(f.LogLikelihood)) continue;
                if (Objective(h, f) >= Objective(h, fit) - ModeWindow - 1)
                    f = MaximumLikelihood.Fit(likelihood, likelihood.Posterior, h.FreeParameters, f.Theta, settings);
                if (double.IsFinite(f.LogLikelihood)) candidates.Add(f);
            }
        }
        var genuine = candidates.Where(c => IsMaximumAtBounds(backend, likelihood, c)).ToList();
        if (genuine.Count == 0) genuine.Add(fit);
        // The multi-start fit keeps first place unless another maximum is higher by more than the optimiser's own noise
        // (on a plateau, e.g. h0 for sizes alone, every end point ties with it up to rounding).
        double fitObjective = Objective(h, fit), tie = Math.Max(1e-6, 1e-11 * Math.Abs(fitObjective));
        var ordered = genuine.OrderByDescending(c => ReferenceEquals(c, fit) ? fitObjective + tie : Objective(h, c)).ToList();
        var distinct = new List<MaximumLikelihoodResult>();
        foreach (var c in ordered)
            if (!distinct.Any(d => Same(h, d, c))) distinct.Add(c);
        var best = distinct[0];
        if (!ReferenceEquals(best, fit))
        {
            string found = $"global maximum reached from a profile peak of {string.Join(", ", scanned)} (the multi-start fit had stopped {Objective(h, best) - Objective(h, fit):0.###} lower in ln L)";
            best = best with { ExitReason = best.ExitReason.And(found) };
        }
        double topObjective = Objective(h, best);
        var modes = distinct.Select((d, i) => i == 0 ? best : d).Where(d => Objective(h, d) >= topObjective - ModeWindow).ToArray();
        return new ModeSearchResult(best, modes, scans);
    }

    /// <summary>
    /// The two-level scan of one parameter: <paramref name="gridPoints"/> values over the whole bounded range, then as many
    /// again over the part of the range where the coarse profile is within <see cref="ModeWindow"/> + 1 of its maximum
    /// (widened by one coarse step each side), so a narrow maximum between coarse points (e.g. Ωm ≈ 0.02 with σ ≈ 0.02
    /// when the coarse step is 0.2) still shows as a local maximum. Returned ascending in value.
    /// </summary>
    public static ProfileSample[] Scan(ProfileRefit refit, double[] start, int gridPoints = DefaultGridPoints)
    {
        ArgumentNullException.ThrowIfNull(refit);
        ArgumentNullException.ThrowIfNull(start);
        var coarseGrid = ProfileRefit.WholeRangeGrid(refit.Min, refit.Max, gridPoints);
        var coarse = refit.Sweep(coarseGrid, start);
        double top = coarse.Max(c => c.Objective);
        if (!double.IsFinite(top)) return coarse;
        int first = Array.FindIndex(coarse, c => c.Objective >= top - ModeWindow - 1);
        int last = Array.FindLastIndex(coarse, c => c.Objective >= top - ModeWindow - 1);
        double lo = coarseGrid[Math.Max(0, first - 1)], hi = coarseGrid[Math.Min(coarseGrid.Length - 1, last + 1)];
        var fineGrid = Enumerable.Range(1, gridPoints).Select(i => lo + (hi - lo) * i / (gridPoints + 1.0))
            .Where(v => !coarseGrid.Contains(v)).ToArray();
        var best = coarse.OrderByDescending(c => c.Objective).First();
        var fine = refit.Sweep(fineGrid, best.Theta);
        return coarse.Concat(fine).OrderBy(c => c.Value).ToArray();
    }

    /// <summary>Where full fits start from a scan: its local maxima (highest first, at most
    /// <see cref="MaxPeaksPerParameter"/>) and, when within <see cref="ModeWindow"/> + 2 of the scan's maximum, its two end
    /// points (a maximum squeezed against a bound, e.g. Ωm → 0, need not show as a grid peak).</summary>
    public static IEnumerable<ProfileSample> StartPoints(IReadOnlyList<ProfileSample> scan)
    {
        ArgumentNullException.ThrowIfNull(scan);
        var peaks = Peaks(scan).Take(MaxPeaksPerParameter).ToList();
        if (scan.Count == 0) return peaks;
        double top = scan.Max(s => s.Objective);
        foreach (var end in new[] { scan[0], scan[^1] })
            if (end.Objective >= top - ModeWindow - 2 && !peaks.Contains(end)) peaks.Add(end);
        return peaks;
    }

    /// <summary>
    /// Whether a fit that ends on a bound is a maximum there: for every parameter on a bound, the profile one small step
    /// inward (10⁻³ of the range) must not be higher. In the optimiser's logistic coordinates a bound is infinitely far,
    /// so a search can stall against it on a slope that rises inward (e.g. Ωm → 0 beside a narrow maximum at 0.02).
    /// </summary>
    public static bool IsMaximumAtBounds(Evaluation.EvaluationBackend backend, Evaluation.RowSumLikelihood likelihood, MaximumLikelihoodResult f)
    {
        ArgumentNullException.ThrowIfNull(likelihood);
        var h = likelihood.Hypothesis;
        ArgumentNullException.ThrowIfNull(f);
        double here = Objective(h, f);
        for (int j = 0; j < f.Theta.Length && j < f.AtBound.Length; j++)
        {
            if (!f.AtBound[j]) continue;
            var p = h.FreeParameters[j];
            double step = 1e-3 * (p.Max - p.Min);
            double inward = f.Theta[j] - p.Min <= p.Max - f.Theta[j] ? p.Min + step : p.Max - step;
            var s = new ProfileRefit(backend, likelihood, p.Name) { Covariance = f.Covariance }.At(inward, f.Theta);
            if (s.Objective > here + 1e-6) return false;
        }
        return true;
    }

    /// <summary>The penalised ln L of a fit (the quantity compared across maxima).</summary>
    public static double Objective(Hypothesis h, MaximumLikelihoodResult f) => ProfileRefit.Penalised(h, f.Theta, f.LogLikelihood);

    /// <summary>Local maxima of a scan (end points included when higher than their neighbour), highest first.</summary>
    public static IEnumerable<ProfileSample> Peaks(IReadOnlyList<ProfileSample> scan)
    {
        ArgumentNullException.ThrowIfNull(scan);
        const double eps = 1e-3; // ln L noise of the inner refits is ~1e-6; a plateau (e.g. h0 for sizes) has no peak
        var peaks = new List<ProfileSample>();
        for (int i = 0; i < scan.Count; i++)
        {
            double v = scan[i].Objective;
            if (!double.IsFinite(v)) continue;
            bool left = i == 0 || v > scan[i - 1].Objective + eps;
            bool right = i == scan.Count - 1 || v > scan[i + 1].Objective + eps;
            if (left && right && scan.Count > 1) peaks.Add(scan[i]);
        }
        return peaks.OrderByDescending(p => p.Objective);
    }

    private static bool Coincides(Hypothesis h, MaximumLikelihoodResult fit, ProfileSample peak) =>
        fit.Covariance is not null && peak.Objective <= Objective(h, fit) + 1e-6 && Same(h, fit, fit with { Theta = peak.Theta });

    // Two maxima are the same when every free parameter agrees within the Hessian σ of the better one
    // (or, without a covariance, within 1% of its magnitude).
    private static bool Same(Hypothesis h, MaximumLikelihoodResult better, MaximumLikelihoodResult other)
    {
        for (int k = 0; k < better.Theta.Length; k++)
        {
            var p = h.FreeParameters[k];
            double s = better.StandardError(k);
            double tol = double.IsFinite(s) && s > 0 ? s : 0.01 * Math.Max(Math.Abs(better.Theta[k]), 1e-4 * (p.Max - p.Min));
            if (Math.Abs(better.Theta[k] - other.Theta[k]) > tol) return false;
        }
        return true;
    }
}
