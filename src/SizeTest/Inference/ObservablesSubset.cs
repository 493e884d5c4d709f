using SizeTest.Photometry;

namespace SizeTest.Inference;

/// <summary>Row selections of <see cref="Observables"/> (bootstrap resamples, cross-validation folds).</summary>
public static class ObservablesSubset
{
    /// <summary>The observables of rows <paramref name="rows"/> (repeats allowed), in that order.</summary>
    public static Observables Take(Observables o, ReadOnlySpan<int> rows)
    {
        ArgumentNullException.ThrowIfNull(o);
        var idx = rows.ToArray();
        double[]? Pick(double[]? a) => a is null ? null : Array.ConvertAll(idx, i => a[i]);
        return new Observables(Pick(o.Z)!, Pick(o.LnTheta), Pick(o.LnThetaErr), Pick(o.Mu), Pick(o.MuErr),
            Pick(o.KCorrection), Pick(o.Extinction), Pick(o.Mag), Pick(o.MagErr), o.SizeDefinition,
            Pick(o.Isophote), o.SersicIndex, o.Survey.Take(idx));
    }

    /// <summary>A bootstrap resample: n rows drawn with replacement by <paramref name="rng"/>.</summary>
    public static int[] Resample(int n, Random rng)
    {
        var r = new int[n];
        for (int i = 0; i < n; i++) r[i] = rng.Next(n);
        return r;
    }
}
