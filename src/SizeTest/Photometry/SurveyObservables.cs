namespace SizeTest.Photometry;

/// <summary>
/// The per-object survey quantities the likelihood may use besides redshift, size and surface brightness:
/// redshift errors (photometric redshifts), the data for per-model luminosities, per-object Sérsic indices,
/// population labels and weights. Each part is null when absent.
/// </summary>
/// <param name="ZErr">1σ redshift error per object.</param>
/// <param name="Luminosity">Data for per-model luminosities or masses.</param>
/// <param name="SersicN">Sérsic index per object (overrides the sample-wide index where given).</param>
/// <param name="Group">Population label per object.</param>
/// <param name="Weight">Weight per object (&gt; 0), multiplying its log-likelihood.</param>
/// <param name="CompactRadioSources">The sample carries radio flux densities: its objects are compact radio sources (linear sizes of
/// parsec scale), not galaxies, so expectations published for galaxy sizes do not apply to them.</param>
public sealed record SurveyObservables(
    double[]? ZErr = null,
    LuminosityData? Luminosity = null,
    double[]? SersicN = null,
    string[]? Group = null,
    double[]? Weight = null,
    bool CompactRadioSources = false)
{
    /// <summary>Nothing beyond the basic observables.</summary>
    public static SurveyObservables None { get; } = new();

    /// <summary>The rows <paramref name="idx"/> (repeats allowed).</summary>
    public SurveyObservables Take(int[] idx)
    {
        T[]? Pick<T>(T[]? a) => a is null ? null : Array.ConvertAll(idx, i => a[i]);
        return new SurveyObservables(Pick(ZErr), Luminosity?.Take(idx), Pick(SersicN), Pick(Group), Pick(Weight), CompactRadioSources);
    }

    internal void CheckLength(int n)
    {
        void C<T>(T[]? a, string name) { if (a is not null && a.Length != n) throw new ArgumentException($"{name} has {a.Length} entries, expected {n}"); }
        C(ZErr, "zErr"); C(Luminosity?.Values, "luminosity"); C(Luminosity?.Correction, "luminosity correction");
        C(Luminosity?.LnReferenceDistance, "reference distance"); C(SersicN, "sersicN"); C(Group, "group"); C(Weight, "weight");
    }
}
