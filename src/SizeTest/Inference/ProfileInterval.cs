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
/// is reached), then brackets each outer crossing and closes in on it with refits (regula falsi). When the profile has several maxima the
/// region may be disjoint; <see cref="ProfileCrossings.Lo"/>–<see cref="ProfileCrossings.Hi"/> is its hull (outermost
/// crossings, so it spans every mode) and <see cref="ProfileCrossings.Regions"/> lists the pieces (the inner crossings
/// bisected the same way).
/// </summary>
public static class ProfileInterval
{
    /// <summary>Drop of the profile from its maximum at the 68% interval ends (χ²₁ 68.27% point / 2 = ½).</summary>
    public const double Level = 0.5;

    /// <summary>Most refits per crossing (safeguarded regula falsi steps, each inside the current bracket). A quadratic
    /// profile needs one or two; a step that fails to halve the bracket is followed by a midpoint step, so the bracket
    /// shrinks at least 2× every second step and 24 steps reach 2⁻¹² of it even for a badly skewed profile.</summary>
    public const int BisectionSteps = 24;

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

    /// <summary>A crossing is accepted when the profile there is within this of the level in the signed-root scale
    /// r = √(2 Δ ln L) (r = 1 at the level; 10⁻³ in r is 10⁻³ of ½ in Δ ln L, and about 10⁻³ σ in the value).</summary>
    public const double RootTolerance = 1e-3;

    // Finds the crossing between a point below the level and one above it by regula falsi with the Illinois modification
    // (Dowell & Jarratt 1971) on g(v) = √(2·max(0, top − ln L_p(v))) − √(2·Level): g is linear in v for a quadratic profile,
    // so the first step lands on the crossing there; the bracket is kept, so it converges anyway. At most BisectionSteps
    // refits, each warm-started from the bracket end above the level; the end is interpolated linearly in g.
    private static double Bisect(ProfileRefit refit, ProfileSample below, ProfileSample above, double level, List<ProfileSample> log)
    {
        double top = level + Level, r0 = Math.Sqrt(2 * Level);
        double G(ProfileSample p) => double.IsFinite(p.Objective) ? Math.Sqrt(2 * Math.Max(0, top - p.Objective)) - r0 : double.PositiveInfinity;
        double gb = G(below), ga = G(above);
        int side = 0;
        bool midpoint = false;
        for (int i = 0; i < BisectionSteps; i++)
        {
            double width = Math.Abs(below.Value - above.Value);
            double v = !midpoint && double.IsFinite(gb) && gb - ga > 0
                ? above.Value + ga / (ga - gb) * (below.Value - above.Value)
                : 0.5 * (below.Value + above.Value);
            // Stay strictly inside the bracket (1% of it from either end).
            double lo = Math.Min(below.Value, above.Value), hi = Math.Max(below.Value, above.Value), pad = 0.01 * (hi - lo);
            v = Math.Clamp(v, lo + pad, hi - pad);
            var mid = refit.At(v, above.Theta);
            log.Add(mid);
            double gm = G(mid);
            if (mid.Objective >= level)
            {
                above = mid; ga = gm;
                if (side == -1) gb *= 0.5; // Illinois: the end kept twice has its value halved
                side = -1;
            }
            else
            {
                below = mid; gb = gm;
                if (side == 1) ga *= 0.5;
                side = 1;
            }
            if (Math.Abs(gm) <= RootTolerance) return mid.Value;
            // Safeguard: a skewed profile (e.g. a refit far out, where ln L falls steeply) makes regula falsi creep from
            // one end; when a step did not halve the bracket, the next one bisects it.
            midpoint = !midpoint && Math.Abs(below.Value - above.Value) > 0.5 * width;
        }
        double fa = G(above), fb = G(below);
        if (!double.IsFinite(fb) || fb - fa <= 0) return 0.5 * (above.Value + below.Value);
        return above.Value + fa / (fa - fb) * (below.Value - above.Value);
    }
}
