using SizeTest.Foundation.Errors;
using SizeTest.Photometry;

namespace SizeTest.Inference.Survey;

/// <summary>
/// The survey-scale parts of a nuisance model: a size–luminosity or size–mass relation, populations
/// with their own nuisance parameters, binned evolution, photometric-redshift marginalisation, the size-error model and a
/// per-model luminosity window. The default changes nothing.
/// </summary>
/// <param name="Relation">R ∝ L^β or M^β (parameter <c>size_luminosity_slope</c>), or none.</param>
/// <param name="Pivot">L_pivot / M_pivot (null: <see cref="LuminosityPivot.Default"/>).</param>
/// <param name="Groups">Population labels, in parameter order; each gets its own R0, a, β and scatter (names <c>NAME@GROUP</c>). Null: one population.</param>
/// <param name="EvolutionBinEdges">K + 1 ascending redshift edges: R0 per bin (<c>r0_kpc_bin1…K</c>) instead of R0 (1+z)^a. Null: the power law.</param>
/// <param name="MarginaliseRedshift">Integrate each object over its redshift (z_err), flat prior in z over the grid's range.</param>
/// <param name="RedshiftNodes">Gauss–Hermite nodes of that integral (default 7).</param>
/// <param name="SizeErrors">Log-normal or Gaussian-in-θ size errors.</param>
/// <param name="AbsMagMin">Luminosity window: keep objects with M ≥ this (brighter end), recomputed per world model; null = open.</param>
/// <param name="AbsMagMax">Keep objects with M ≤ this (fainter end); null = open.</param>
/// <param name="RedshiftPriorMin">Lower end of the flat redshift prior of the photo-z marginalisation (null: the sample's lowest z).</param>
/// <param name="RedshiftPriorMax">Upper end of that prior (null: the sample's highest z).</param>
/// <param name="ZMarginal">How each object is integrated over its redshift: quadrature or the linearised (effective-variance) marginal.</param>
/// <param name="RedshiftPopulation">The prior's shape on that range: the sample's deconvolved redshift distribution; null: flat in z.</param>
/// <param name="Weighted">The sample has a weight column: each object's ln L is multiplied by its weight (the survey kernels carry weights, so a weight column alone makes the model active).</param>
public sealed record SurveyModel(
    SizeRelationKind Relation = SizeRelationKind.None,
    LuminosityPivot? Pivot = null,
    IReadOnlyList<string>? Groups = null,
    IReadOnlyList<double>? EvolutionBinEdges = null,
    bool MarginaliseRedshift = false,
    int RedshiftNodes = 7,
    SizeErrorKind SizeErrors = SizeErrorKind.LogNormal,
    double? AbsMagMin = null,
    double? AbsMagMax = null,
    double? RedshiftPriorMin = null,
    double? RedshiftPriorMax = null,
    RedshiftMarginal ZMarginal = RedshiftMarginal.Quadrature,
    PopulationRedshiftPrior? RedshiftPopulation = null,
    bool Weighted = false)
{
    /// <summary>Nothing beyond the basic size model.</summary>
    public static SurveyModel None { get; } = new();

    /// <summary>The pivot (never null).</summary>
    public LuminosityPivot PivotOrDefault => Pivot ?? LuminosityPivot.Default;

    /// <summary>Whether any survey term is active.</summary>
    public bool IsActive => Relation != SizeRelationKind.None || Groups is { Count: > 0 } || EvolutionBinEdges is not null ||
                            MarginaliseRedshift || SizeErrors != SizeErrorKind.LogNormal || HasWindow || Weighted;

    /// <summary>Whether a luminosity window is set.</summary>
    public bool HasWindow => AbsMagMin is not null || AbsMagMax is not null;

    /// <summary>Whether evolution is binned.</summary>
    public bool Binned => EvolutionBinEdges is not null;

    /// <summary>Number of evolution bins (1 for the power law).</summary>
    public int BinCount => EvolutionBinEdges is { } e ? e.Count - 1 : 1;

    /// <summary>The group labels (one empty label when there are no groups).</summary>
    public IReadOnlyList<string> GroupLabels => Groups is { Count: > 0 } g ? g : [""];

    /// <summary>A parameter's name for group <paramref name="group"/> (label empty: the plain name).</summary>
    public static string Named(string name, string group) => group.Length == 0 ? name : $"{name}@{group}";

    /// <summary>Checks consistency; throws <see cref="ArgumentException"/> (or an <see cref="InputException"/> naming settings) with a
    /// user-facing message. Every term runs for every observable except the size–luminosity relation (needs a size model) and Gaussian
    /// size errors (size only).</summary>
    public void Validate(ObservableKind observable)
    {
        if (!IsActive) return;
        if (observable == ObservableKind.SurfaceBrightness && Relation != SizeRelationKind.None)
            throw SettingProblem.Exception([new("the size–luminosity and size–mass relations need a size model: fit them with {observable} size or joint, not sb (drop {size_luminosity} / {size_mass})")]);
        if (observable != ObservableKind.Size && SizeErrors == SizeErrorKind.Gaussian)
            throw SettingProblem.Exception([new("{size_errors} gaussian is built for {observable} size only; fit sb or joint with the log-normal size errors (drop {size_errors} gaussian)")]);
        if (EvolutionBinEdges is { } e)
        {
            if (e.Count < 3) throw SettingProblem.Exception([new("{evolution} binned:K needs K ≥ 2 bins")]);
            for (int k = 1; k < e.Count; k++)
                if (!(e[k] > e[k - 1])) throw new ArgumentException("the evolution bins' redshift edges must increase (too few distinct redshifts for K bins?)");
        }
        if (Groups is { } g && g.Distinct(StringComparer.Ordinal).Count() != g.Count) throw new ArgumentException("group labels must be distinct");
        if (RedshiftPriorMin is { } zl && !(zl > 0)) throw new ArgumentException("the redshift prior's lower end must be > 0");
        if (RedshiftPriorMin is { } z0 && RedshiftPriorMax is { } z1 && !(z0 < z1)) throw SettingProblem.Exception([new("{z_prior} LO:HI needs LO < HI")]);
        if (RedshiftNodes is < 2 or > 40) throw new ArgumentException("the redshift quadrature needs 2–40 nodes");
        if (AbsMagMin is { } lo && AbsMagMax is { } hi && !(lo < hi)) throw SettingProblem.Exception([new("{abs_mag_range} LO:HI needs LO < HI (LO the bright end, e.g. -23:-20)")]);
        if (Relation == SizeRelationKind.Mass && HasWindow) throw SettingProblem.Exception([new("{abs_mag_range} selects on luminosity; it cannot be combined with {size_mass}")]);
    }

    /// <summary>Equal-count redshift bin edges for K bins (edges at the sample quantiles; outer edges at the extreme redshifts).</summary>
    public static double[] EqualCountEdges(IReadOnlyList<double> z, int k)
    {
        ArgumentNullException.ThrowIfNull(z);
        if (k < 2) throw SettingProblem.Exception([new("{evolution} binned:K needs K ≥ 2")]);
        if (z.Count < 2 * k) throw SettingProblem.Exception([new($"{{evolution}} binned:{k} needs at least {2 * k} objects")]);
        var s = z.ToArray();
        Array.Sort(s);
        var edges = new double[k + 1];
        edges[0] = s[0];
        edges[k] = s[^1];
        for (int j = 1; j < k; j++)
        {
            double pos = (double)j * s.Length / k;
            int lo = (int)Math.Floor(pos) - 1;
            edges[j] = 0.5 * (s[Math.Max(lo, 0)] + s[Math.Min(lo + 1, s.Length - 1)]);
        }
        return edges;
    }
}
