using System.CommandLine;
using System.Globalization;
using SizeTest.Foundation.Errors;
using SizeTest.Cosmology;
using SizeTest.Inference.Survey;
using SizeTest.Photometry;
using SizeTest.Foundation.Text;

namespace SizeTest.Cli;

/// <summary>
/// The <c>fit</c> options for survey catalogues (size–luminosity/mass relation, groups, binned evolution, photometric
/// redshifts, size-error model, luminosity window). Collects values only; the physics is in <see cref="SurveyRequest"/>.
/// </summary>
internal sealed class SurveyCliOptions
{
    private static Option<double?> Number(string name, string description) => CliOptions.Number(name, description);

    public Option<bool> SizeLuminosity { get; } = new("--size-luminosity") { Description = "Size and joint observables: R = R0 (L/L_pivot)^β (1+z)^a with L from each world model's own D_L (parameter size_luminosity_slope); radio: ℓ = ℓ_m L^β (1+z)^n from flux_density." };
    public Option<bool> SizeMass { get; } = new("--size-mass") { Description = "Size and joint observables: R = R0 (M*/M_pivot)^β (1+z)^a from the log_mass column, scaled to each world model by (D_L/D_L,ref)²." };
    public Option<double?> PivotAbsMag { get; } = Number("--pivot-abs-mag", "Pivot absolute magnitude of the size–luminosity relation (default −21).");
    public Option<double?> PivotLogMass { get; } = Number("--pivot-log-mass", "Pivot log10(M*/Msun) of the size–mass relation (default 10.7).");
    public Option<double?> PivotLogLum { get; } = Number("--pivot-log-lum", "Radio: pivot log10(L_ν / W Hz⁻¹) (default 27).");
    public Option<string?> AbsMagRange { get; } = new("--abs-mag-range") { Description = "LO:HI: fit only objects with LO ≤ M ≤ HI (e.g. -23:-20), M recomputed for each world model with its own D_L." };
    public Option<string?> Group { get; } = new("--group") { Description = "COLUMN: population label column; each group gets its own R0, a, β and scatter (sb, joint: also μ0, b and SB scatter; names NAME@GROUP); the world model is shared." };
    public Option<string> Evolution { get; } = new("--evolution") { Description = "Size evolution: power ((1+z)^a, default) or binned:K (R0, and μ0 in sb and joint fits, free in K equal-count redshift bins).", DefaultValueFactory = _ => "power" };
    public Option<bool> IgnoreZErr { get; } = new("--ignore-z-err") { Description = "Take redshifts as exact even when a z_err column is mapped (default: marginalise each object over its redshift)." };
    public Option<string> SizeErrors { get; } = new Option<string>("--size-errors") { Description = "Size-error model: lognormal (σ_lnθ = σ_θ/θ) or gaussian (exact for errors quoted in θ; --observable size only).", DefaultValueFactory = _ => "lognormal" }.AcceptOnlyFromAmong("lognormal", "gaussian");
    public Option<string?> ZPrior { get; } = new("--z-prior") { Description = "LO:HI: the range of the redshift prior of the photometric-redshift marginalisation (default: the sample's redshift range)." };
    public Option<string?> ZMarginal { get; } = new Option<string?>("--z-marginal") { Description = "Photometric redshifts: linear (effective variance: the covariance gains (∂m/∂z)² s² about each object's redshift posterior under the prior, one evaluation per object; the default) or quadrature (Gauss–Hermite over each object's z; the default for joint fits of isophotal sizes)." }.AcceptOnlyFromAmong("quadrature", "linear");
    public Option<string> ZPriorShape { get; } = new Option<string>("--z-prior-shape") { Description = "population|flat: the redshift prior's shape on its range: the sample's redshift distribution deconvolved from the z errors (default), or flat in z.", DefaultValueFactory = _ => "population" }.AcceptOnlyFromAmong("population", "flat");
    public Option<double?> FrequencyGhz { get; } = Number("--frequency-ghz", "Radio: observing frequency of flux_density in GHz (recorded with the luminosities).");
    public Option<double?> SpectralIndex { get; } = Number("--spectral-index", "Radio: spectral index α, S_ν ∝ ν^α, in L_ν = 4π D_L² S_ν (1+z)^−(1+α) (default 0).");
    public Option<string?> RefCosmology { get; } = new("--ref-cosmology") { Description = "H0:OMEGA_M of the flat ΛCDM in which the catalogue computed abs_mag or log_mass (default 70:0.3)." };

    public Option<int?> ZNodes { get; } = new Option<int?>("--z-nodes") { Description = $"Photometric redshifts with --z-marginal quadrature: Gauss–Hermite nodes per object, {SurveyRequest.MinRedshiftNodes}–{SurveyRequest.MaxRedshiftNodes} (default {SurveyRequest.DefaultRedshiftNodes(SizeTest.Inference.ObservableKind.Size)} for size fits, {SurveyRequest.DefaultRedshiftNodes(SizeTest.Inference.ObservableKind.Joint)} for sb and joint fits; the cost grows in proportion)." };
    public IEnumerable<Option> All => [SizeLuminosity, SizeMass, PivotAbsMag, PivotLogMass, PivotLogLum, AbsMagRange, Group, Evolution, IgnoreZErr, SizeErrors, ZPrior, ZPriorShape, ZMarginal, ZNodes, FrequencyGhz, SpectralIndex, RefCosmology];

    public void AddTo(Command command)
    {
        foreach (var o in All) command.Options.Add(o);
    }

    /// <summary>What was asked.</summary>
    public SurveyRequest Request(ParseResult parse)
    {
        bool lum = parse.GetValue(SizeLuminosity), mass = parse.GetValue(SizeMass);
        if (lum && mass) throw new InputException("--size-luminosity and --size-mass exclude each other; choose one");
        var d = LuminosityPivot.Default;
        var pivot = new LuminosityPivot(parse.GetValue(PivotAbsMag) ?? d.AbsMag, parse.GetValue(PivotLogMass) ?? d.LogMass, parse.GetValue(PivotLogLum) ?? d.LogRadioLuminosity);
        var (mLo, mHi) = parse.GetValue(AbsMagRange) is { } r ? Range(r, "--abs-mag-range", "-23:-20") : ((double?)null, (double?)null);
        var (zLo, zHi) = parse.GetValue(ZPrior) is { } zp ? Range(zp, "--z-prior", "0.1:3") : ((double?)null, (double?)null);
        int? nodes = parse.GetValue(ZNodes);
        if (nodes is { } zn && zn is < SurveyRequest.MinRedshiftNodes or > SurveyRequest.MaxRedshiftNodes)
            throw new InputException($"--z-nodes {zn} is outside {SurveyRequest.MinRedshiftNodes}–{SurveyRequest.MaxRedshiftNodes}");
        return new SurveyRequest(lum ? SizeRelationKind.Luminosity : mass ? SizeRelationKind.Mass : SizeRelationKind.None, pivot,
            parse.GetValue(Group) is not null, EvolutionBins(parse.GetValue(Evolution) ?? "power"), parse.GetValue(IgnoreZErr),
            parse.GetValue(SizeErrors) == "gaussian" ? SizeErrorKind.Gaussian : SizeErrorKind.LogNormal, mLo, mHi, zLo, zHi,
            parse.GetValue(ZMarginal) switch { "quadrature" => RedshiftMarginal.Quadrature, "linear" => RedshiftMarginal.Linear, _ => null },
            parse.GetValue(ZPriorShape) == "flat" ? RedshiftPriorShape.Flat : RedshiftPriorShape.Population, nodes);
    }

    /// <summary>The luminosity preparation for the photometry stage, or null when no relation or window is asked.</summary>
    public LuminosityOption? Luminosity(ParseResult parse, SurveyRequest request)
    {
        if (!request.NeedsLuminosity)
        {
            foreach (var o in new Option[] { FrequencyGhz, SpectralIndex, RefCosmology, PivotAbsMag, PivotLogMass, PivotLogLum })
                if (parse.GetResult(o) is { Implicit: false })
                    throw new InputException($"{o.Name} needs --size-luminosity, --size-mass or --abs-mag-range");
            return null;
        }
        IWorldModel? reference = null;
        if (parse.GetValue(RefCosmology) is { } rc)
        {
            var p = rc.Split(':');
            if (p.Length != 2 || !double.TryParse(p[0], NumberStyles.Float, CultureInfo.InvariantCulture, out var h0) ||
                !double.TryParse(p[1], NumberStyles.Float, CultureInfo.InvariantCulture, out var om) || !(h0 > 0) || !(om >= 0))
                throw new InputException($"--ref-cosmology '{rc}' must be H0:OMEGA_M, e.g. 70:0.3");
            reference = new LambdaCdmModel(h0, om);
        }
        if (parse.GetValue(FrequencyGhz) is { } f && !(f > 0)) throw new InputException("--frequency-ghz must be positive");
        return new LuminosityOption(request.Relation == SizeRelationKind.Mass, reference, parse.GetValue(SpectralIndex) ?? 0.0, parse.GetValue(FrequencyGhz));
    }

    /// <summary>Parses <c>--evolution power|binned:K</c>: null for the power law, else K.</summary>
    public static int? EvolutionBins(string text) =>
        SurveyRequest.TryParseEvolution(text, out var bins) ? bins
            : throw new InputException($"--evolution must be power or binned:K with 2 ≤ K ≤ {SurveyRequest.MaxEvolutionBins} (e.g. binned:5); got '{text}'{SurveyRequest.EvolutionHint(text)}");

    /// <summary>Parses <c>LO:HI</c> (either end may be negative).</summary>
    public static (double? Lo, double? Hi) Range(string text, string option, string example)
    {
        int colon = text.IndexOf(':', 1);
        if (colon > 0 && double.TryParse(text[..colon], NumberStyles.Float, CultureInfo.InvariantCulture, out var lo) &&
            double.TryParse(text[(colon + 1)..], NumberStyles.Float, CultureInfo.InvariantCulture, out var hi) && double.IsFinite(lo) && double.IsFinite(hi))
        {
            if (!(lo < hi)) throw new InputException($"{option} '{text}': LO must be below HI (e.g. {example})");
            return (lo, hi);
        }
        throw new InputException($"{option} '{text}' must be LO:HI, e.g. {option} {example}");
    }
}
