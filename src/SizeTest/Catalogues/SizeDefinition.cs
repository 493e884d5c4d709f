using SizeTest.Foundation.Text;

namespace SizeTest.Catalogues;

/// <summary>How the catalogue's angular size was measured. Travels with the sample.</summary>
public enum SizeKind
{
    /// <summary>Half-light (effective) radius R_e.</summary>
    EffectiveRadius,
    /// <summary>Petrosian radius.</summary>
    Petrosian,
    /// <summary>Radius at a fixed observed isophote (see <see cref="SizeDefinition.IsophoteMagPerArcsec2"/>).</summary>
    Isophotal,
    /// <summary>Gaussian full width at half maximum (compact radio sources).</summary>
    GaussianFwhm,
}

/// <summary>The size definition of a sample.</summary>
/// <param name="Kind">Which size.</param>
/// <param name="IsophoteMagPerArcsec2">The isophote level for <see cref="SizeKind.Isophotal"/>, mag/arcsec²; otherwise null.</param>
public sealed record SizeDefinition(SizeKind Kind, double? IsophoteMagPerArcsec2 = null)
{
    /// <summary>The default: effective (half-light) radius.</summary>
    public static SizeDefinition Effective { get; } = new(SizeKind.EffectiveRadius);
}

/// <summary>Reads and writes the text form of a <see cref="SizeDefinition"/> (the <c>--size-def</c> option).</summary>
public static class SizeDefinitions
{
    /// <summary>
    /// Parses <c>effective</c> (also <c>re</c>, <c>half-light</c>), <c>petrosian</c>,
    /// <c>isophotal:LEVEL</c> (LEVEL in mag/arcsec², e.g. <c>isophotal:25</c>) or <c>fwhm</c>
    /// (Gaussian FWHM, also <c>gaussian-fwhm</c>).
    /// </summary>
    public static bool TryParse(string? text, out SizeDefinition definition, out string error)
    {
        definition = SizeDefinition.Effective;
        error = "";
        var t = (text ?? "").Trim().ToLowerInvariant();
        string? arg = null;
        int colon = t.IndexOf(':');
        if (colon >= 0) { arg = t[(colon + 1)..].Trim(); t = t[..colon].Trim(); }
        switch (t)
        {
            case "effective" or "re" or "half-light" or "halflight" or "effective-radius":
                definition = SizeDefinition.Effective;
                return arg is null || Fail(out error, text);
            case "petrosian" or "petro":
                definition = new SizeDefinition(SizeKind.Petrosian);
                return arg is null || Fail(out error, text);
            case "fwhm" or "gaussian-fwhm" or "gaussian":
                definition = new SizeDefinition(SizeKind.GaussianFwhm);
                return arg is null || Fail(out error, text);
            case "isophotal" or "iso":
                if (arg is null || !double.TryParse(arg, System.Globalization.NumberStyles.Float, System.Globalization.CultureInfo.InvariantCulture, out var level) || !double.IsFinite(level))
                {
                    error = $"size definition '{text}' needs an isophote level in mag/arcsec2, e.g. isophotal:25";
                    return false;
                }
                definition = new SizeDefinition(SizeKind.Isophotal, level);
                return true;
            default:
                string hint = NameSuggestions.Closest(t, ["effective", "petrosian", "isophotal", "fwhm"]) is { } close
                    ? NameSuggestions.DidYouMean(close == "isophotal" ? "isophotal:" + (arg ?? "LEVEL") : close) : "";
                error = $"unknown size definition '{text}'{hint}; use effective, petrosian, isophotal:LEVEL or fwhm";
                return false;
        }
    }

    private static bool Fail(out string error, string? text)
    {
        error = $"size definition '{text}' takes no level (only isophotal:LEVEL does)";
        return false;
    }

    /// <summary>The text form, inverse of <see cref="TryParse"/>.</summary>
    public static string Format(SizeDefinition definition) => definition.Kind switch
    {
        SizeKind.EffectiveRadius => "effective",
        SizeKind.Petrosian => "petrosian",
        SizeKind.GaussianFwhm => "fwhm",
        SizeKind.Isophotal => FormattableString.Invariant($"isophotal:{definition.IsophoteMagPerArcsec2}"),
        _ => definition.Kind.ToString(),
    };
}
