using System.CommandLine;
using System.Globalization;
using SizeTest.Foundation.Errors;
using SizeTest.Simulation;

namespace SizeTest.Cli;

/// <summary>
/// The options that describe a mock survey (population, design, errors, selection), shared by
/// <c>simulate</c> and <c>power</c>. Collects values only; the physics is in <see cref="MockSurveyGenerator"/>.
/// </summary>
internal sealed class MockSurveyOptions
{
    private static Option<double?> Number(string name, string description) => CliOptions.Number(name, description);

    public Option<int?> Count { get; }
    public Option<string> Kind { get; } = new Option<string>("--kind")
    {
        Description = "Objects to draw: galaxy (effective radius and mean SB within it) or radio (compact radio sources, Gurvits et al. 1999 linear size).",
        DefaultValueFactory = _ => "galaxy",
    }.AcceptOnlyFromAmong("galaxy", "radio");
    public Option<string> ZDist { get; } = new("--z-dist")
    {
        Description = "Redshift distribution: uniform:ZMIN:ZMAX, survey:PEAK[:ZMIN:ZMAX] (N(z) ∝ z² exp(−(z/z0)^1.5) peaking at PEAK) or hist:FILE (rows 'z_lo z_hi weight'). Default uniform:0.1:3.",
        DefaultValueFactory = _ => "uniform:0.1:3",
    };
    public Option<double?> R0Kpc { get; } = Number("--r0-kpc", "Galaxies: effective radius at z = 0 in kpc (default 5).");
    public Option<double?> LinearSizePc { get; } = Number("--lm-pc", "Radio: linear size ℓ_m in pc (default 11.03, Cao et al. 2017).");
    public Option<double?> LuminosityExponent { get; } = Number("--lum-exponent", "Radio: β in ℓ = ℓ_m (L/L_pivot)^β (1+z)^n (default 0).");
    public Option<double?> LogLumMean { get; } = Number("--log-lum-mean", "Radio: mean log10 L (W/Hz) (default 27).");
    public Option<double?> LogLumSd { get; } = Number("--log-lum-sd", "Radio: spread of log10 L in dex (default 0.5).");
    public Option<double?> SizeEvolution { get; } = Number("--size-evolution", "Size evolution a in R ∝ (1+z)^a (galaxies, default −1; radio n, default 0).");
    public Option<double?> ScatterDex { get; } = Number("--scatter-dex", "Intrinsic scatter of log10 size in dex (galaxies default 0.2, radio 0.1).");
    public Option<double?> Mu0 { get; } = Number("--mu0", "Galaxies: mean SB within R_e at z = 0 in mag/arcsec2 (default 21).");
    public Option<double?> SbEvolution { get; } = Number("--sb-evolution", "Galaxies: SB evolution b, Δμ = −2.5 b log10(1+z) (default 1).");
    public Option<double?> ScatterMag { get; } = Number("--scatter-mag", "Galaxies: intrinsic SB scatter in mag (default 0.3).");
    public Option<double?> KormendySlope { get; } = Number("--kormendy-slope", "Galaxies: size–SB correlation dμ/dlog10 R in mag per dex at pivot 5 kpc (default 0: independent).");
    public Option<double?> SbLimit { get; } = Number("--sb-limit", "Galaxies: keep only μ_obs < LIMIT (mag/arcsec2).");
    public Option<double?> MagLimit { get; } = Number("--mag-limit", "Galaxies: keep only m_obs < LIMIT, m = μ − 2.5 log10(2π θ²).");
    public Option<double?> MinSize { get; } = Number("--min-size", "Keep only θ_obs > SIZE (arcsec; resolution limit).");
    public Option<double?> SizeErrFrac { get; } = Number("--size-err-frac", "Fractional size error (default 0.05).");
    public Option<double?> SizeErrFloor { get; } = Number("--size-err-floor", "Size-error floor in arcsec, added in quadrature, relative to the median size at z (default 0).");
    public Option<double?> MuErr { get; } = Number("--mu-err", "Galaxies: SB measurement error in mag (default 0.1).");
    public Option<double?> PhotoZErr { get; } = Number("--photoz-err", "Photometric-redshift error σ in σ(1+z) (default 0: spectroscopic).");

    public Option<string?> LuminosityFunction { get; } = CliOptions.Text("--luminosity-function", "Galaxies: draw absolute magnitudes from a Schechter function, schechter:MSTAR:ALPHA[:BRIGHT:FAINT] (e.g. schechter:-21:-1.2:-24:-16); writes the apparent magnitude m = M + 5 log10(D_L/10 pc) and μ from m and θ.");
    public Option<double?> SizeLuminositySlope { get; } = Number("--size-lum-slope", "Galaxies with --luminosity-function: β in R ∝ L^β (default 0).");
    public Option<double?> PivotAbsMag { get; } = Number("--pivot-abs-mag", "Galaxies: pivot absolute magnitude of R ∝ (L/L_pivot)^β (default −21).");
    public Option<string[]> Population { get; } = new("--population")
    {
        Description = "Galaxies: a population NAME:FRACTION:R0_KPC:A[:BETA[:SCATTER_DEX]] with its own sizes; repeat for a mixed sample (labels go to the group column).",
    };
    public Option<string> SizeErrors { get; } = new Option<string>("--size-errors")
    {
        Description = "Size-error model: lognormal (ln θ scattered), gaussian (θ scattered, theta_err a fraction of the median θ at z) or gaussian-own (theta_err a fraction of each object's own θ).",
        DefaultValueFactory = _ => "lognormal",
    }.AcceptOnlyFromAmong("lognormal", "gaussian", "gaussian-own");
    public Option<double?> SizeErrFracAtZMax { get; } = Number("--size-err-frac-zmax", "Fractional size error at the N(z)'s z_max; it grows linearly in z from --size-err-frac at z_min.");
    public Option<double?> SpectralIndex { get; } = Number("--spectral-index", "Radio: spectral index α in S_ν ∝ ν^α for the written flux densities (default 0).");

    public MockSurveyOptions(string countDescription)
    {
        Count = new Option<int?>("--n") { Description = countDescription };
    }

    public void AddTo(Command command, bool includeCount = true)
    {
        if (includeCount) command.Options.Add(Count);
        foreach (var o in new Option[] { Kind, ZDist, R0Kpc, LinearSizePc, LuminosityExponent, LogLumMean, LogLumSd, SizeEvolution, ScatterDex,
                     Mu0, SbEvolution, ScatterMag, KormendySlope, SbLimit, MagLimit, MinSize, SizeErrFrac, SizeErrFloor, MuErr, PhotoZErr,
                     LuminosityFunction, SizeLuminositySlope, PivotAbsMag, Population, SizeErrors, SizeErrFracAtZMax, SpectralIndex })
            command.Options.Add(o);
    }

    /// <summary>The object kind chosen.</summary>
    public MockObjectKind KindOf(ParseResult parse) => parse.GetValue(Kind) == "radio" ? MockObjectKind.CompactRadio : MockObjectKind.Galaxy;

    /// <summary>Builds the design for <paramref name="count"/> objects.</summary>
    public SurveyDesign Design(ParseResult parse, int count)
    {
        var kind = KindOf(parse);
        if (kind == MockObjectKind.CompactRadio)
            foreach (var o in new Option[] { Mu0, SbEvolution, ScatterMag, KormendySlope, SbLimit, MagLimit, MuErr, R0Kpc, LuminosityFunction, SizeLuminositySlope, PivotAbsMag, Population })
                if (parse.GetResult(o) is not null)
                    throw new ArgumentException($"{o.Name} applies to --kind galaxy only (radio sources have a linear size ℓ_m: --lm-pc, and no surface brightness).");
        if (kind == MockObjectKind.Galaxy)
            foreach (var o in new[] { LinearSizePc, LuminosityExponent, LogLumMean, LogLumSd, SpectralIndex })
                if (parse.GetResult(o) is not null)
                    throw new ArgumentException($"{o.Name} applies to --kind radio only.");
        var d = new MeasurementErrors();
        var errors = new MeasurementErrors(
            parse.GetValue(SizeErrFrac) ?? d.SizeErrorFraction,
            parse.GetValue(SizeErrFloor) ?? d.SizeErrorFloorArcsec,
            kind == MockObjectKind.Galaxy ? parse.GetValue(MuErr) ?? d.MuErrorMag : 0.0,
            parse.GetValue(PhotoZErr) ?? d.PhotoZError,
            parse.GetValue(SizeErrors) switch { "gaussian" => SizeErrorModel.Gaussian, "gaussian-own" => SizeErrorModel.GaussianOwnSize, _ => SizeErrorModel.LogNormal },
            parse.GetValue(SizeErrFracAtZMax));
        var selection = new MockSelection(parse.GetValue(SbLimit), parse.GetValue(MagLimit), parse.GetValue(MinSize));
        return new SurveyDesign(count, Redshifts(parse.GetValue(ZDist) ?? "uniform:0.1:3"), kind, errors, selection);
    }

    /// <summary>The galaxy population from the options (defaults where not given).</summary>
    public GalaxyPopulation Galaxies(ParseResult parse)
    {
        var d = new GalaxyPopulation();
        return new GalaxyPopulation(parse.GetValue(R0Kpc) ?? d.R0Kpc, parse.GetValue(SizeEvolution) ?? d.SizeEvolution,
            parse.GetValue(ScatterDex) ?? d.ScatterDex, parse.GetValue(Mu0) ?? d.Mu0, parse.GetValue(SbEvolution) ?? d.SbEvolution,
            parse.GetValue(ScatterMag) ?? d.ScatterMag, parse.GetValue(KormendySlope) ?? d.KormendySlope, d.PivotSizeKpc);
    }

    /// <summary>The radio-source population from the options (defaults where not given).</summary>
    public RadioSourcePopulation Radio(ParseResult parse)
    {
        var d = new RadioSourcePopulation();
        return new RadioSourcePopulation(parse.GetValue(LinearSizePc) ?? d.LinearSizePc, parse.GetValue(LuminosityExponent) ?? d.LuminosityExponent,
            parse.GetValue(SizeEvolution) ?? d.SizeEvolution, parse.GetValue(ScatterDex) ?? d.ScatterDex,
            parse.GetValue(LogLumMean) ?? d.LogLuminosityMean, parse.GetValue(LogLumSd) ?? d.LogLuminositySd, d.LogLuminosityPivot);
    }

    /// <summary>The survey ingredients (luminosity function, size–luminosity slope, populations, spectral index).</summary>
    public SurveyPopulation Survey(ParseResult parse)
    {
        var lf = parse.GetValue(LuminosityFunction) is { } text ? ParseLuminosityFunction(text) : null;
        if (lf is null && parse.GetResult(SizeLuminositySlope) is not null)
            throw new ArgumentException("--size-lum-slope needs --luminosity-function (sizes scale with the drawn luminosities)");
        var pops = (parse.GetValue(Population) ?? []).Select(MockSubpopulation.Parse).ToArray();
        if (pops.Any(p => p.SizeLuminositySlope != 0) && lf is null)
            throw new ArgumentException("a --population with a non-zero BETA needs --luminosity-function");
        return new SurveyPopulation(lf, parse.GetValue(SizeLuminositySlope) ?? 0.0, parse.GetValue(PivotAbsMag) ?? -21.0, pops, parse.GetValue(SpectralIndex) ?? 0.0);
    }

    /// <summary>Parses <c>schechter:MSTAR:ALPHA[:BRIGHT:FAINT]</c>.</summary>
    public static SchechterLuminosityFunction ParseLuminosityFunction(string text)
    {
        var p = text.Split(':');
        string hint = "write schechter:MSTAR:ALPHA[:BRIGHT:FAINT], e.g. schechter:-21:-1.2:-24:-16";
        if (p[0] != "schechter" || (p.Length != 3 && p.Length != 5)) throw new ArgumentException($"--luminosity-function '{text}': {hint}");
        var v = p.Skip(1).Select(x => double.TryParse(x, NumberStyles.Float, CultureInfo.InvariantCulture, out var d) && double.IsFinite(d)
            ? d : throw new ArgumentException($"--luminosity-function '{text}': '{x}' is not a number; {hint}")).ToArray();
        var lf = v.Length == 2 ? new SchechterLuminosityFunction(v[0], v[1]) : new SchechterLuminosityFunction(v[0], v[1], v[2], v[3]);
        lf.Validate();
        return lf;
    }

    /// <summary>Parses <c>--z-dist</c>, reading a histogram file for <c>hist:FILE</c>.</summary>
    public static RedshiftDistribution Redshifts(string text)
    {
        if (text.StartsWith("hist:", StringComparison.Ordinal))
            return RedshiftHistogramFile.Read(text["hist:".Length..]);
        if (!RedshiftDistribution.TryParse(text, out var dist, out var error)) throw SettingProblem.Input(error);
        return dist!;
    }

    /// <summary>Formats a number for messages.</summary>
    public static string Num(double v) => v.ToString("G6", CultureInfo.InvariantCulture);
}
