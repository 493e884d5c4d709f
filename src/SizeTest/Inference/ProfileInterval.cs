namespace SizeTest.Inference;

/// <summary>A profile-likelihood interval: the outermost values where the profile crosses its maximum − ½.</summary>
/// <param name="Lo">Lower end (the lower bound itself when the profile stays above the level down to it).</param>
/// <param name="Hi">Upper end (likewise the upper bound).</param>
/// <param name="LoAtBound">The profile is still above the level at the lower bound.</param>
/// <param name="HiAtBound">The profile is still above the level at the upper bound.</param>
/// <param name="Top">The profile's maximum (penalised ln L).</param>
/// <param name="Samples">Every profile point computed, ascending in value (the input ones and the refinements).</param>
/// <param name="Regions">The pieces of the Δ ln L ≤ ½ set, ascending (one piece, [Lo, Hi], unless the profile dips below
/// the level between maxima).</param>
public sealed record ProfileCrossings(double Lo, double Hi, bool LoAtBound, bool HiAtBound, double Top, IReadOnlyList<ProfileSample> Samples,
    IReadOnlyList<(double Lo, double Hi)> Regions);

/// <summary>
/// Finds the 68% profile-likelihood interval {θ_j : max ln L − ln L_p(θ_j) ≤ ½} (Wilks 1938) from a set of profile
/// points: it steps outward past the outermost point above the level until the profile falls below it (or the bound
/// is reached), then brackets each outer crossing and bisects it with refits. When the profile has several maxima the
/// region may be disjoint; <see cref="ProfileCrossings.Lo"/>–<see cref="ProfileCrossings.Hi"/> is its hull (outermost
/// crossings, so it spans every mode) and <see cref="ProfileCrossings.Regions"/> lists the pieces (the inner crossings
/// bisected the same way).
/// </summary>
public static class ProfileInterval
{
    /// <summary>Drop of the profile from its maximum at the 68% interval ends (χ²₁ 68.27% point / 2 = ½).</summary>
    public const double Level = 0.5;

    /// <summary>Bisection steps per crossing (the final bracket is 1/32 of the first, then interpolated linearly).</summary>
    public const int BisectionSteps = 5;

    /// <summary>Computes the interval.</summary>
    /// <param name="refit">The inner maximisation.</param>
    /// <param name="samples">Known profile points (at least one: e.g. the maximum itself, or a scan).</param>
    /// <param name="step">First outward step when no point below the level is known on a side (e.g. the Hessian σ).</param>
    /// <param name="top">The global maximum of the penalised ln L if known (else the samples' maximum).</param>
    public static ProfileCrossings Find(ProfileRefit refit, IEnumerable<ProfileSample> samples, double step, double top = double.NegativeInfinity)
    {
        ArgumentNullException.ThrowIfNull(refit);
        ArgumentNullException.ThrowIfNull(samples);
        var pts = samples.Where(s => s is not null).OrderBy(s => s.Value).ToList();
        if (pts.Count == 0) throw new ArgumentException("a profile interval needs at least one profile point", nameof(samples));
        double range = refit.Max - refit.Min;
        if (!(step > 0) || !double.IsFinite(step)) step = 0.05 * range;
        step = Math.Min(step, 0.25 * range);
        top = Math.Max(top, pts.Max(p => p.Objective));
        double level = top - Level;

        // Lower side: extend until the first point is below the level or sits on the bound.
        double d = step;
        for (int guard = 0; guard < 40 && pts[0].Objective >= level && pts[0].Value > refit.Min; guard++)
        {
            double v = Math.Max(refit.Min, pts[0].Value - d);
            pts.Insert(0, refit.At(v, pts[0].Theta));
            d *= 1.6;
            top = Math.Max(top, pts[0].Objective); level = top - Level;
        }
        d = step;
        for (int guard = 0; guard < 40 && pts[^1].Objective >= level && pts[^1].Value < refit.Max; guard++)
        {
            double v = Math.Min(refit.Max, pts[^1].Value + d);
            pts.Add(refit.At(v, pts[^1].Theta));
            d *= 1.6;
            top = Math.Max(top, pts[^1].Objective); level = top - Level;
        }

        int first = pts.FindIndex(p => p.Objective >= level);
        int last = pts.FindLastIndex(p => p.Objective >= level);
        bool loAtBound = first == 0, hiAtBound = last == pts.Count - 1;
        // Gaps inside [first, last] where the profile dips below the level (between maxima): bracket pairs, captured
        // before the bisections below append to the list.
        var gaps = new List<(ProfileSample AboveL, ProfileSample BelowL, ProfileSample BelowR, ProfileSample AboveR)>();
        for (int i = first; i < last; i++)
        {
            if (pts[i].Objective < level || pts[i + 1].Objective >= level) continue;
            int k = i + 1;
            while (pts[k].Objective < level) k++;
            gaps.Add((pts[i], pts[i + 1], pts[k - 1], pts[k]));
            i = k - 1;
        }
        var (lowBelow, lowAbove, highAbove, highBelow) = (first > 0 ? pts[first - 1] : null, pts[first], pts[last], last < pts.Count - 1 ? pts[last + 1] : null);
        double lo = lowBelow is null ? pts[0].Value : Bisect(refit, lowBelow, lowAbove, level, pts);
        double hi = highBelow is null ? highAbove.Value : Bisect(refit, highBelow, highAbove, level, pts);
        var regions = new List<(double Lo, double Hi)>();
        double start = lo;
        foreach (var g in gaps)
        {
            double end = Bisect(refit, g.BelowL, g.AboveL, level, pts);
            regions.Add((start, end));
            start = Bisect(refit, g.BelowR, g.AboveR, level, pts);
        }
        regions.Add((start, hi));
        pts.Sort((a, b) => a.Value.CompareTo(b.Value));
        return new ProfileCrossings(lo, hi, loAtBound, hiAtBound, top, pts, regions);
    }

    // Bisects between a point below the level and one above it, warm-starting each refit from the point above.
    private static double Bisect(ProfileRefit refit, ProfileSample below, ProfileSample above, double level, List<ProfileSample> log)
    {
        for (int i = 0; i < BisectionSteps; i++)
        {
            var mid = refit.At(0.5 * (below.Value + above.Value), above.Theta);
            log.Add(mid);
            if (mid.Objective >= level) above = mid; else below = mid;
        }
        double fa = above.Objective - level, fb = below.Objective - level;
        if (!double.IsFinite(fb) || fa - fb <= 0) return 0.5 * (above.Value + below.Value);
        return above.Value + fa / (fa - fb) * (below.Value - above.Value);
    }
}
