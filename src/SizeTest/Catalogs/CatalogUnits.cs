using SizeTest.Common;

namespace SizeTest.Catalogs;

/// <summary>
/// Reads the unit strings of catalogues (FITS TUNITn, VOTable unit, IVOA VOUnit 1.0 spellings,
/// and the usual informal ones) for the quantities SizeTest maps.
/// </summary>
public static class CatalogUnits
{
    /// <summary>Radians per degree, π/180 exactly (definition of the degree).</summary>
    public const double RadiansPerDegree = Math.PI / 180.0;

    /// <summary>Radians per arcminute, π/10800 exactly (1′ = 1°/60).</summary>
    public const double RadiansPerArcmin = Math.PI / 10800.0;

    /// <summary>Radians per microarcsecond (1 µas = 10⁻⁶″).</summary>
    public const double RadiansPerMicroarcsec = Units.RadiansPerArcsec / 1e6;

    private static string Squash(string unit) =>
        new string(unit.Trim().ToLowerInvariant().Where(c => !char.IsWhiteSpace(c)).ToArray()).Trim('[', ']', '(', ')');

    /// <summary>
    /// Parses an angle unit: arcsec (<c>arcsec</c>, <c>arcsecond</c>, <c>asec</c>, <c>"</c>, <c>″</c>),
    /// mas (<c>mas</c>, <c>marcsec</c>, <c>milliarcsec</c>), µas (<c>uas</c>, <c>uarcsec</c>), arcmin
    /// (<c>arcmin</c>, <c>amin</c>, <c>'</c>), deg (<c>deg</c>, <c>degree</c>, <c>°</c>), rad (<c>rad</c>, <c>radian</c>), mrad.
    /// </summary>
    /// <param name="unit">The unit text.</param>
    /// <param name="radiansPerUnit">Factor to radians.</param>
    /// <param name="canonical">The canonical spelling (<c>arcsec, mas, uas, arcmin, deg, rad, mrad</c>).</param>
    public static bool TryParseAngle(string? unit, out double radiansPerUnit, out string canonical)
    {
        radiansPerUnit = 0;
        canonical = "";
        if (string.IsNullOrWhiteSpace(unit)) return false;
        var u = Squash(unit);
        if (u.EndsWith('s') && u.Length > 4 && u != "mas" && u != "uas") u = u[..^1]; // plurals: arcsecs, degrees, radians
        (double f, string c)? r = u switch
        {
            "arcsec" or "arcsecond" or "asec" or "\"" or "″" or "sec" => (Units.RadiansPerArcsec, "arcsec"),
            "mas" or "marcsec" or "milliarcsec" or "milliarcsecond" => (Units.RadiansPerMilliarcsec, "mas"),
            "uas" or "µas" or "μas" or "uarcsec" or "microarcsec" or "microarcsecond" => (RadiansPerMicroarcsec, "uas"),
            "arcmin" or "arcminute" or "amin" or "'" or "′" => (RadiansPerArcmin, "arcmin"),
            "deg" or "degree" or "°" or "degr" => (RadiansPerDegree, "deg"),
            "rad" or "radian" => (1.0, "rad"),
            "mrad" or "milliradian" => (1e-3, "mrad"),
            _ => null,
        };
        if (r is null) return false;
        (radiansPerUnit, canonical) = r.Value;
        return true;
    }

    /// <summary>
    /// Whether the unit is surface brightness in mag/arcsec²: <c>mag/arcsec2</c>, <c>mag/arcsec^2</c>,
    /// <c>mag/arcsec**2</c>, <c>mag.arcsec-2</c> (VOUnit), <c>mag arcsec-2</c>, <c>mag/sq.arcsec</c>, with an optional
    /// AB/Vega qualifier.
    /// </summary>
    public static bool IsSurfaceBrightness(string? unit)
    {
        if (string.IsNullOrWhiteSpace(unit)) return false;
        var u = Squash(unit).Replace("(ab)", "").Replace("(vega)", "").Replace("abmag", "mag").Replace("vegamag", "mag");
        u = u.Replace("mags", "mag").Replace("″", "arcsec").Replace("\"", "arcsec").Replace("asec", "arcsec");
        return u is "mag/arcsec2" or "mag/arcsec^2" or "mag/arcsec**2" or "mag.arcsec-2" or "mag.arcsec**-2" or "mag.arcsec^-2"
            or "magarcsec-2" or "magarcsec^-2" or "mag/sq.arcsec" or "mag/sqarcsec" or "mag/arcsec²" or "mag/(arcsec2)"
            or "mag/(arcsec**2)" or "mag/(arcsec^2)" or "mag*arcsec**-2" or "mag/arcsec/arcsec";
    }

    /// <summary>Whether the unit is a magnitude: <c>mag</c>, <c>mags</c>, <c>magnitude</c>, <c>ABmag</c>, <c>mag(AB)</c>, <c>Vegamag</c>, <c>AB</c>.</summary>
    public static bool IsMagnitude(string? unit)
    {
        if (string.IsNullOrWhiteSpace(unit)) return false;
        var u = Squash(unit);
        return u is "mag" or "mags" or "magnitude" or "magnitudes" or "abmag" or "vegamag" or "mag(ab)" or "mag(vega)" or "ab" or "vega" or "mag_ab";
    }

    /// <summary>Whether the unit marks a dimensionless quantity (empty, <c>-</c>, <c>1</c>, <c>""</c>).</summary>
    public static bool IsDimensionless(string? unit)
    {
        if (string.IsNullOrWhiteSpace(unit)) return true;
        var u = Squash(unit);
        return u is "" or "-" or "1" or "none" or "dimensionless" or "redshift" or "z";
    }

    /// <summary>
    /// Whether a mapping unit says that an error is relative to its value: <c>frac</c>,
    /// <c>fraction</c>, <c>relative</c>, <c>rel</c> (factor 1) or <c>%</c>, <c>percent</c> (factor 0.01).
    /// </summary>
    public static bool TryParseRelative(string? unit, out double factor)
    {
        factor = 0;
        if (string.IsNullOrWhiteSpace(unit)) return false;
        switch (Squash(unit))
        {
            case "frac" or "fraction" or "relative" or "rel": factor = 1.0; return true;
            case "%" or "percent" or "pct": factor = 0.01; return true;
            default: return false;
        }
    }
}
