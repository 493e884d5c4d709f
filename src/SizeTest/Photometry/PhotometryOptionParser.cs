using System.Globalization;
using SizeTest.Foundation.Errors;

namespace SizeTest.Photometry;

/// <summary>
/// Parses compact photometry option strings (CLI flags, study-file keys) into
/// <see cref="PhotometryOptions"/>. Items are separated by commas, each <c>key:value</c> split
/// at its first colon (so values may contain colons; file names may not contain commas).
/// Files named in the strings are read through the <c>readText</c> delegate
/// (<see cref="PhotometryFiles.ReadText"/> by default), so the parser itself does no I/O.
/// Every error is an <see cref="InputException"/> whose message names the setting (<see cref="SettingProblem"/>: <c>{kcorr}</c>,
/// <c>{extinction}</c>, <c>{zero_points}</c>, <c>{band}</c>, <c>{band_match}</c>, <c>{sersic_n}</c>, <c>{sb}</c>) and the bad part.
/// </summary>
public static class PhotometryOptionParser
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>Parses all given strings; absent ones keep the defaults of <see cref="PhotometryOptions"/>.</summary>
    public static PhotometryOptions Parse(PhotometryOptionText text, Func<string, string>? readText = null)
    {
        ArgumentNullException.ThrowIfNull(text);
        var o = new PhotometryOptions();
        if (text.KCorrection is { } k) o = o with { KCorrection = ParseKCorrection(k, readText) };
        if (text.Extinction is { } e) o = o with { Extinction = ParseExtinction(e, readText) };
        if (text.ZeroPoints is { } z) o = o with { ZeroPoints = ParseZeroPoints(z, readText) };
        if (text.DefaultBand is { } b)
        {
            if (string.IsNullOrWhiteSpace(b)) throw SettingProblem.Input("{band}: the band name is empty.");
            o = o with { DefaultBand = b.Trim() };
        }
        if (text.BandMatch is { } m) o = o with { BandMatch = ParseBandMatch(m, readText) };
        if (text.SersicIndex is { } n) o = o with { SersicIndex = ParseSersicIndex(n) };
        if (text.SurfaceBrightness is { } s) o = o with { SurfaceBrightness = ParseSurfaceBrightness(s) };
        if (o.KCorrection is KCorrectionOption.Template { ObservedBand: null } && o.BandMatch is null)
            throw SettingProblem.Input("{kcorr} template: give the observed filter curve (filter-obs:FILE) or use {band_match}.");
        return o;
    }

    /// <summary>Parses <c>--kcorr</c>; see <see cref="PhotometryOptionText.KCorrection"/>.</summary>
    public static KCorrectionOption ParseKCorrection(string spec, Func<string, string>? readText = null, string option = "kcorr")
    {
        var items = Items(spec, option);
        var (key, value) = items[0];
        switch (key)
        {
            case "none" when value is null && items.Count == 1:
                return new KCorrectionOption.None();
            case "column" when items.Count == 1:
                return new KCorrectionOption.Column(NonEmpty(value, option, "column:NAME"));
            case "powerlaw" when items.Count == 1:
                return new KCorrectionOption.PowerLaw(Number(value, option, "powerlaw:ALPHA"));
            case "template":
            {
                string file = NonEmpty(value, option, "template:FILE");
                var keys = Keys(items.Skip(1), option, "flux", "filter-obs", "filter-rest", "reference", "reference-obs", "reference-rest", "reference-flux", "wavelength-unit");
                double unit = WavelengthUnit(keys, option);
                var read = readText ?? PhotometryFiles.ReadText;
                var spectrum = Spectrum(file, Density(keys, "flux", option, SpectralDensity.PerWavelength), unit, read);
                var refDensity = Density(keys, "reference-flux", option, SpectralDensity.PerWavelength);
                keys.TryGetValue("reference", out var refBoth);
                SpectralTable? Ref(string k)
                {
                    string? v = keys.TryGetValue(k, out var x) ? x : refBoth;
                    return v is null || v.Equals("ab", StringComparison.OrdinalIgnoreCase) ? null : Spectrum(v, refDensity, unit, read);
                }
                FilterResponse? obs = keys.TryGetValue("filter-obs", out var fo) ? Filter(fo, unit, read) : null;
                FilterResponse? rest = keys.TryGetValue("filter-rest", out var fr) ? Filter(fr, unit, read) : null;
                return new KCorrectionOption.Template(spectrum, obs, rest, Ref("reference-obs"), Ref("reference-rest"));
            }
            default:
                throw SettingProblem.Input($"{{{option}}} '{spec}': expected none, column:NAME, powerlaw:ALPHA or template:FILE[,filter-obs:FILE,filter-rest:FILE,…].");
        }
    }

    /// <summary>Parses <c>--extinction</c>; see <see cref="PhotometryOptionText.Extinction"/>.</summary>
    public static ExtinctionOption ParseExtinction(string spec, Func<string, string>? readText = null, string option = "extinction")
    {
        var items = Items(spec, option);
        var (key, value) = items[0];
        switch (key)
        {
            case "none" when value is null && items.Count == 1:
                return new ExtinctionOption.None();
            case "column" when items.Count == 1:
                return new ExtinctionOption.Column(NonEmpty(value, option, "column:NAME"));
            case "ebv":
            {
                string col = NonEmpty(value, option, "ebv:COLUMN");
                var keys = Keys(items.Skip(1), option, "coeffs");
                if (!keys.TryGetValue("coeffs", out var file))
                    throw SettingProblem.Input($"{{{option}}} '{spec}': ebv:COLUMN needs coeffs:FILE (a table of A_band/E(B-V) per band).");
                var table = TwoColumnText.ParseBandTable((readText ?? PhotometryFiles.ReadText)(file), file, "A_band/E(B-V) coefficient");
                return new ExtinctionOption.ColourExcess(col, table);
            }
            default:
                throw SettingProblem.Input($"{{{option}}} '{spec}': expected none, column:NAME or ebv:COLUMN,coeffs:FILE.");
        }
    }

    /// <summary>Parses <c>--zero-points FILE</c>: rows "band offset" with m_AB = m + offset.</summary>
    public static BandTable ParseZeroPoints(string path, Func<string, string>? readText = null, string option = "zero_points")
    {
        if (string.IsNullOrWhiteSpace(path)) throw SettingProblem.Input($"{{{option}}}: the file name is empty.");
        return TwoColumnText.ParseBandTable((readText ?? PhotometryFiles.ReadText)(path.Trim()), path.Trim(), "AB zero-point offset");
    }

    /// <summary>Parses <c>--sersic-n N</c> (a number in the range of <see cref="SersicProfile"/>).</summary>
    public static double ParseSersicIndex(string text, string option = "sersic_n")
    {
        double n = Number(text, option, "a number such as 1 or 4");
        if (!SersicProfile.IsValidIndex(n))
            throw SettingProblem.Input($"{{{option}}} {text}: the Sérsic index must lie between {SersicProfile.MinIndex.ToString(Inv)} and {SersicProfile.MaxIndex.ToString(Inv)}.");
        return n;
    }

    /// <summary>Parses <c>--sb</c>; see <see cref="PhotometryOptionText.SurfaceBrightness"/>.</summary>
    public static SurfaceBrightnessOption ParseSurfaceBrightness(string spec, string option = "sb")
    {
        var items = Items(spec, option);
        var (key, value) = items[0];
        var keys = Keys(items.Skip(1), option, "to");
        SurfaceBrightnessKind? to = keys.TryGetValue("to", out var t) ? Kind(t, option) : null;
        return key switch
        {
            "column" => new SurfaceBrightnessOption(false, value is null ? null : Kind(value, option), to),
            "from-mag" when value is null => new SurfaceBrightnessOption(true, SurfaceBrightnessKind.MeanWithinEffective, to),
            _ => throw SettingProblem.Input($"{{{option}}} '{spec}': expected column[:mean|effective|central][,to:KIND] or from-mag[,to:KIND]."),
        };
    }

    /// <summary>Parses <c>--band-match</c>; see <see cref="PhotometryOptionText.BandMatch"/>.</summary>
    public static BandMatchOption ParseBandMatch(string spec, Func<string, string>? readText = null, string option = "band_match")
    {
        var items = Items(spec, option);
        var read = readText ?? PhotometryFiles.ReadText;
        double unit = 1.0;
        foreach (var (k, v) in items)
            if (k == "wavelength-unit") unit = Unit(v, option);
        double? targetLambda = null;
        FilterResponse? target = null;
        var mode = BandMatchMode.Nearest;
        var bands = new List<ObservedBand>();
        foreach (var (k, v) in items)
        {
            switch (k)
            {
                case "wavelength-unit":
                    break;
                case "target":
                    (targetLambda, target) = LambdaOrFilter(NonEmpty(v, option, "target:LAMBDA|FILE"), unit, read, "target");
                    break;
                case "mode":
                    mode = v switch
                    {
                        "nearest" => BandMatchMode.Nearest,
                        "interpolate" => BandMatchMode.Interpolate,
                        _ => throw SettingProblem.Input($"{{{option}}}: mode '{v}' is not nearest or interpolate."),
                    };
                    break;
                case "band":
                {
                    string b = NonEmpty(v, option, "band:NAME=MU_COLUMN[/ERR_COLUMN]@LAMBDA|FILE");
                    int eq = b.IndexOf('='), at = b.LastIndexOf('@');
                    if (eq <= 0 || at < eq + 2 || at == b.Length - 1)
                        throw SettingProblem.Input($"{{{option}}}: band '{b}' should read NAME=MU_COLUMN[/ERR_COLUMN]@LAMBDA (or @FILE).");
                    string name = b[..eq].Trim();
                    string cols = b[(eq + 1)..at];
                    int slash = cols.IndexOf('/');
                    string muCol = (slash < 0 ? cols : cols[..slash]).Trim();
                    string? errCol = slash < 0 ? null : cols[(slash + 1)..].Trim();
                    if (muCol.Length == 0 || errCol is { Length: 0 })
                        throw SettingProblem.Input($"{{{option}}}: band '{b}' has an empty column name.");
                    var (lam, curve) = LambdaOrFilter(b[(at + 1)..].Trim(), unit, read, name);
                    bands.Add(new ObservedBand(name, muCol, errCol, lam, curve));
                    break;
                }
                default:
                    throw SettingProblem.Input($"{{{option}}}: unknown item '{k}'; use target:, band:, mode: or wavelength-unit:.");
            }
        }
        if (targetLambda is null) throw SettingProblem.Input($"{{{option}}} '{spec}': give the rest-frame target band (target:LAMBDA or target:FILE).");
        if (bands.Count == 0) throw SettingProblem.Input($"{{{option}}} '{spec}': give at least one observed band (band:NAME=MU_COLUMN@LAMBDA).");
        return new BandMatchOption(bands, targetLambda.Value, target, mode);
    }

    // ---- helpers

    private static List<(string Key, string? Value)> Items(string spec, string option)
    {
        if (string.IsNullOrWhiteSpace(spec)) throw SettingProblem.Input($"{{{option}}}: the value is empty.");
        var list = new List<(string, string?)>();
        foreach (var raw in spec.Split(',', StringSplitOptions.TrimEntries))
        {
            if (raw.Length == 0) throw SettingProblem.Input($"{{{option}}} '{spec}': empty item between commas.");
            int c = raw.IndexOf(':');
            list.Add(c < 0 ? (raw.ToLowerInvariant(), null) : (raw[..c].Trim().ToLowerInvariant(), raw[(c + 1)..].Trim()));
        }
        return list;
    }

    private static Dictionary<string, string> Keys(IEnumerable<(string Key, string? Value)> items, string option, params string[] allowed)
    {
        var d = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var (k, v) in items)
        {
            if (!allowed.Contains(k))
                throw SettingProblem.Input($"{{{option}}}: unknown item '{k}'; allowed here: {string.Join(", ", allowed)}.");
            if (v is null || v.Length == 0) throw SettingProblem.Input($"{{{option}}}: item '{k}' needs a value ({k}:VALUE).");
            if (!d.TryAdd(k, v)) throw SettingProblem.Input($"{{{option}}}: item '{k}' is given twice.");
        }
        return d;
    }

    private static string NonEmpty(string? v, string option, string form) =>
        string.IsNullOrWhiteSpace(v) ? throw SettingProblem.Input($"{{{option}}}: expected {form}.") : v.Trim();

    private static double Number(string? v, string option, string form)
    {
        if (v is null || !double.TryParse(v.Trim(), NumberStyles.Float, Inv, out double x) || !double.IsFinite(x))
            throw SettingProblem.Input($"{{{option}}}: '{v}' is not a number; expected {form}.");
        return x;
    }

    private static SurfaceBrightnessKind Kind(string v, string option) => v.ToLowerInvariant() switch
    {
        "mean" => SurfaceBrightnessKind.MeanWithinEffective,
        "effective" => SurfaceBrightnessKind.AtEffective,
        "central" => SurfaceBrightnessKind.Central,
        _ => throw SettingProblem.Input($"{{{option}}}: surface-brightness kind '{v}' is not mean, effective or central."),
    };

    private static SpectralDensity Density(Dictionary<string, string> keys, string key, string option, SpectralDensity dflt) =>
        !keys.TryGetValue(key, out var v) ? dflt : v.ToLowerInvariant() switch
        {
            "flambda" => SpectralDensity.PerWavelength,
            "fnu" => SpectralDensity.PerFrequency,
            _ => throw SettingProblem.Input($"{{{option}}}: {key}:'{v}' is not flambda or fnu."),
        };

    private static double WavelengthUnit(Dictionary<string, string> keys, string option) =>
        keys.TryGetValue("wavelength-unit", out var v) ? Unit(v, option) : 1.0;

    private static double Unit(string? v, string option) => v?.ToLowerInvariant() switch
    {
        "angstrom" or "a" => 1.0,
        "nm" => 10.0,
        "um" or "micron" => 1e4,
        _ => throw SettingProblem.Input($"{{{option}}}: wavelength-unit '{v}' is not angstrom, nm or um."),
    };

    private static (double Lambda, FilterResponse? Curve) LambdaOrFilter(string v, double unit, Func<string, string> read, string name)
    {
        if (double.TryParse(v, NumberStyles.Float, Inv, out double l))
        {
            if (!(l > 0) || !double.IsFinite(l)) throw new InputException($"band {name}: wavelength {v} must be > 0.");
            return (l * unit, null);
        }
        var f = Filter(v, unit, read, name);
        return (f.PivotWavelengthAngstrom, f);
    }

    private static SpectralTable Spectrum(string file, SpectralDensity density, double unit, Func<string, string> read)
    {
        var t = TwoColumnText.ParseNumeric(read(file), file);
        var lam = Scale(t.First, unit);
        // f_λ per Å: a table in per-nm or per-µm units with a wavelength unit would need rescaling of
        // the values too; the normalisation cancels for templates, and references must be per Å.
        try { return SpectralTable.FromColumns(lam, t.Second, density, file); }
        catch (ArgumentException e) { throw new InputException(e.Message, file, inner: e); }
    }

    private static FilterResponse Filter(string file, double unit, Func<string, string> read, string? name = null)
    {
        var t = TwoColumnText.ParseNumeric(read(file), file);
        try { return FilterResponse.FromColumns(Scale(t.First, unit), t.Second, name ?? Path.GetFileNameWithoutExtension(file)); }
        catch (ArgumentException e) { throw new InputException(e.Message, file, inner: e); }
    }

    private static double[] Scale(double[] a, double f)
    {
        if (f == 1.0) return a;
        var r = new double[a.Length];
        for (int i = 0; i < a.Length; i++) r[i] = a[i] * f;
        return r;
    }
}
