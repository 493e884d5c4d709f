namespace SizeTest.Inference.Survey;

/// <summary>
/// How much of a sample a stated photometric-redshift prior [LO, HI] leaves out: of the objects with z_err &gt; 0
/// (<see cref="WithErr"/>), those whose z_obs lies more than 3 z_err outside it (<see cref="Outside"/>; their likelihood rests
/// on the prior's tail). Counts, so the shares of MPI ranks add (<see cref="Plus"/>) and every rank decides on the whole sample.
/// </summary>
/// <param name="WithErr">Objects with z_err &gt; 0.</param>
/// <param name="Outside">Of those, the ones more than 3 z_err outside [LO, HI].</param>
public readonly record struct RedshiftPriorCoverage(long WithErr, long Outside)
{
    /// <summary>The counts for objects with redshifts <paramref name="z"/> and errors <paramref name="zErr"/> under a prior
    /// on [<paramref name="lo"/>, <paramref name="hi"/>] (an open end is an infinity).</summary>
    public static RedshiftPriorCoverage Count(IReadOnlyList<double> z, IReadOnlyList<double> zErr, double lo, double hi)
    {
        ArgumentNullException.ThrowIfNull(z);
        ArgumentNullException.ThrowIfNull(zErr);
        long withErr = 0, outside = 0;
        for (int i = 0; i < z.Count; i++)
        {
            double s = zErr[i];
            if (!(s > 0)) continue;
            withErr++;
            if (z[i] < lo - 3 * s || z[i] > hi + 3 * s) outside++;
        }
        return new RedshiftPriorCoverage(withErr, outside);
    }

    /// <summary>The counts of two disjoint shares together.</summary>
    public RedshiftPriorCoverage Plus(RedshiftPriorCoverage other) => new(WithErr + other.WithErr, Outside + other.Outside);

    /// <summary>More than half of the objects with z_err &gt; 0 lie outside (a warning).</summary>
    public bool MostOutside => WithErr > 0 && 2 * Outside > WithErr;

    /// <summary>Every object with z_err &gt; 0 lies outside (an error).</summary>
    public bool AllOutside => WithErr > 0 && Outside == WithErr;
}
