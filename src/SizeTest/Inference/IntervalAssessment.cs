using System.Globalization;
using SizeTest.Photometry;

namespace SizeTest.Inference;

/// <summary>The intervals of one model after <see cref="IntervalAssessment"/>, and what it says about them.</summary>
/// <param name="Summary">The summary with every parameter's interval, <c>interval_method</c>, <c>at_bound</c> and the modes.</param>
/// <param name="Notes">Sentences for the study notes (multimodality, non-quadratic profiles, parameters at a bound).</param>
public sealed record IntervalAssessmentResult(ModelFitSummary Summary, IReadOnlyList<string> Notes);

/// <summary>
/// Honest 68% intervals for a maximum-likelihood fit. The Hessian interval θ̂ ± σ is kept where the profile likelihood is
/// close to quadratic; the profile-likelihood interval (Δ ln L = ½, Wilks 1938) replaces it where
/// <list type="bullet">
/// <item>the profile's ½ crossing differs from θ̂ ± σ by more than <see cref="QuadraticTolerance"/> of σ on either side;</item>
/// <item>the fit is multimodal and the parameter differs between modes by more than its σ (the interval then spans
/// every mode: the hull of the Δ ln L ≤ ½ region);</item>
/// <item>the Hessian gives no finite σ;</item>
/// <item>the maximum sits on a bound: the parameter is flagged <c>at_bound</c> and the interval is one-sided, from the
/// bound to the ½ crossing on the other side.</item>
/// </list>
/// </summary>
/// <remarks>
/// To avoid refits where they are not needed, each interior parameter is first screened with two evaluations of ln L
/// at θ̂ ± Σ·e_j/σ_j, the points where a quadratic log-likelihood's profile of θ_j is ½ below the maximum (the
/// conditional maximum of a Gaussian moves along the covariance column). When ln L there implies a profile width within
/// <see cref="ScreenTolerance"/> of σ on both sides, the Hessian interval is kept without profiling.
/// </remarks>
public static class IntervalAssessment
{
    /// <summary>Relative difference between the profile's and the Hessian's interval ends beyond which the profile is reported.</summary>
    public const double QuadraticTolerance = 0.10;

    /// <summary>Relative width difference the two-point screen accepts without computing the profile.</summary>
    public const double ScreenTolerance = 0.05;

    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>Assesses every free parameter of the fit <paramref name="search"/>.Best of <paramref name="likelihood"/>.</summary>
    public static IntervalAssessmentResult Apply(HypothesisLikelihood likelihood, Observables observables, ModeSearchResult search, ModelFitSummary summary)
    {
        ArgumentNullException.ThrowIfNull(likelihood);
        var backend = Evaluation.EvaluationBackend.InProcess(observables ?? throw new ArgumentNullException(nameof(observables)));
        return Apply(backend, backend.Bind(likelihood.Hypothesis), search, summary);
    }

    /// <summary>As <see cref="Apply(HypothesisLikelihood, Observables, ModeSearchResult, ModelFitSummary)"/> with every
    /// refit on <paramref name="backend"/>; <paramref name="likelihood"/> is the model bound there. With
    /// <paramref name="posteriorFollows"/> a sampler will replace the intervals by posterior percentiles, and the notes say so
    /// instead of saying that the profile interval is reported.</summary>
    public static IntervalAssessmentResult Apply(Evaluation.EvaluationBackend backend, Evaluation.RowSumLikelihood likelihood, ModeSearchResult search, ModelFitSummary summary,
        bool posteriorFollows = false)
    {
        ArgumentNullException.ThrowIfNull(backend);
        ArgumentNullException.ThrowIfNull(likelihood);
        ArgumentNullException.ThrowIfNull(search);
        ArgumentNullException.ThrowIfNull(summary);
        var h = likelihood.Hypothesis;
        var best = search.Best;
        double top = ModeSearch.Objective(h, best);
        var free = h.FreeParameters.Select(p => p.Name).ToList();
        var list = summary.Parameters.ToList();
        var notes = new List<string>();
        var profiled = new List<string>();
        var nonQuadratic = new List<string>();
        var disjoint = new List<string>();
        for (int i = 0; i < list.Count; i++)
        {
            var p = list[i];
            int j = free.IndexOf(p.Name);
            if (p.Fixed || j < 0) { list[i] = p with { IntervalMethod = IntervalMethods.Fixed }; continue; }
            var spec = h.FreeParameters[j];
            double v = best.Theta[j], se = best.StandardError(j);
            bool hasSe = double.IsFinite(se) && se > 0;
            string? atBound = best.AtBound.Length > j && best.AtBound[j] ? (v - spec.Min <= spec.Max - v ? "lower" : "upper") : null;
            bool affected = search.Multimodal && search.Modes.Any(m => Math.Abs(m.Theta[j] - v) > (hasSe ? se : 0));
            bool must = atBound is not null || !hasSe || affected;
            if (!must && QuadraticScreenPasses(likelihood, best, j, top)) continue;

            var refit = new ProfileRefit(backend, likelihood, p.Name) { Covariance = best.Covariance };
            var samples = new List<ProfileSample> { new(v, top, best.LogLikelihood, best.Theta, best.Converged) };
            foreach (var m in search.Modes.Skip(1)) samples.Add(new ProfileSample(m.Theta[j], ModeSearch.Objective(h, m), m.LogLikelihood, m.Theta, m.Converged));
            if (search.Scans.TryGetValue(p.Name, out var scan)) samples.AddRange(scan.Where(s => double.IsFinite(s.Objective)));
            else if (affected)
            {
                // No scan of this parameter: sample the span of the modes so a dip between them is seen (disjoint set).
                double mLo = search.Modes.Min(m => m.Theta[j]), mHi = search.Modes.Max(m => m.Theta[j]);
                var between = Enumerable.Range(1, 12).Select(q => mLo + (mHi - mLo) * q / 13.0).ToArray();
                samples.AddRange(refit.Sweep(between, best.Theta).Where(s => double.IsFinite(s.Objective)));
            }
            var cr = ProfileInterval.Find(refit, samples, hasSe ? se : 0.05 * (spec.Max - spec.Min), top);
            bool differs = !hasSe
                || Math.Abs((v - cr.Lo) / se - 1) > QuadraticTolerance && !(atBound == "lower")
                || Math.Abs((cr.Hi - v) / se - 1) > QuadraticTolerance && !(atBound == "upper");
            if (!(must || differs)) continue;
            double lo = atBound == "lower" ? spec.Min : cr.Lo, hi = atBound == "upper" ? spec.Max : cr.Hi;
            var pieces = cr.Regions.Count > 1 ? cr.Regions.Select(r => new IntervalPiece(r.Lo, r.Hi)).ToArray() : [];
            list[i] = p with { Lo = lo, Hi = hi, IntervalMethod = IntervalMethods.Profile, AtBound = atBound, Regions = pieces };
            if (pieces.Length > 1)
                disjoint.Add(p.Name + " " + string.Join(" ∪ ", pieces.Select(q => FormattableString.Invariant($"[{q.Lo:G3}, {q.Hi:G3}]"))));
            profiled.Add(p.Name);
            if (atBound is not null)
                notes.Add(FormattableString.Invariant($"{summary.Name}: {p.Name} is at its {atBound} bound {(atBound == "lower" ? spec.Min : spec.Max):G4}; its interval is one-sided, [{lo:G4}, {hi:G4}] from the profile likelihood, not a ±σ interval"));
            else if (!affected) nonQuadratic.Add(FormattableString.Invariant($"{p.Name} [{lo:G4}, {hi:G4}]") + (hasSe ? FormattableString.Invariant($" against the Hessian's ±{se:G3}") : " (the Hessian gave no finite σ)"));
        }
        if (nonQuadratic.Count > 0)
            notes.Add($"{summary.Name}: the profile likelihood is not close to quadratic for {string.Join("; ", nonQuadratic)}"
                + (posteriorFollows ? "; " + PosteriorReported : ", so the profile interval is reported"));
        if (disjoint.Count > 0)
            notes.Add($"{summary.Name}: the 68% profile-likelihood set is not one interval: {string.Join("; ", disjoint)} "
                + (posteriorFollows ? $"({PosteriorReported})" : "(lo–hi is their hull, which spans the modes and covers more than 68%; results.json lists the pieces as regions)"));
        IReadOnlyList<FitMode> modes = [];
        if (search.Multimodal)
        {
            modes = search.Modes.Select(m => new FitMode(
                free.Select((n, k) => (n, k)).ToDictionary(t => t.n, t => m.Theta[t.k], StringComparer.Ordinal), m.LogLikelihood)).ToArray();
            var scanned = ModeSearch.ScannedParameters(h);
            string where = string.Join("; ", search.Modes.Select(m => string.Join(", ", scanned.Select(n => string.Create(Inv, $"{n} = {m.Theta[free.IndexOf(n)]:G3}"))) + string.Create(Inv, $" (ln L {m.LogLikelihood:0.00})")));
            notes.Insert(0, $"{summary.Name}: multimodal likelihood: {search.Modes.Count} distinct maxima within Δ ln L < {ModeSearch.ModeWindow:0} ({where}); "
                + (posteriorFollows ? PosteriorReported + " (they span the modes only as far as the chains visited them)"
                    : profiled.Count > 0 ? $"the intervals of {string.Join(", ", profiled)} are profile-likelihood intervals spanning the modes" : "no interval is affected")
                + "; every mode is listed in results.json (modes)");
        }
        return new IntervalAssessmentResult(summary with { Parameters = list, Modes = modes }, notes);
    }

    private const string PosteriorReported = "the reported intervals are the sampler's posterior 16th–84th percentiles instead";

    // ln L at θ̂ ± Σ e_j / σ_j (inside the bounds) should be ½ below the maximum for a quadratic log-likelihood.
    private static bool QuadraticScreenPasses(Evaluation.RowSumLikelihood likelihood, MaximumLikelihoodResult best, int j, double top)
    {
        var cov = best.Covariance;
        if (cov is null) return false;
        var h = likelihood.Hypothesis;
        int d = best.Theta.Length;
        double se = Math.Sqrt(cov[j, j]);
        foreach (int sign in new[] { -1, 1 })
        {
            var x = new double[d];
            for (int k = 0; k < d; k++)
            {
                x[k] = best.Theta[k] + sign * cov[k, j] / se;
                var p = h.FreeParameters[k];
                if (x[k] <= p.Min || x[k] >= p.Max) return false;
            }
            double ll = likelihood.LogDensity(x);
            if (!double.IsFinite(ll)) return false;
            double drop = top - ProfileRefit.Penalised(h, x, ll);
            if (!(drop > 0)) return false;
            double widthRatio = 1 / Math.Sqrt(2 * drop); // Δ = −½ (σ/σ_p)² for a quadratic profile of width σ_p
            if (Math.Abs(widthRatio - 1) > ScreenTolerance) return false;
        }
        return true;
    }
}
