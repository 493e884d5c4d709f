
using SizeTest.Foundation.Angles;

namespace SizeTest.Catalogues;

/// <summary>
/// Reads the unit strings of catalogues (FITS TUNITn, VOTable unit, IVOA VOUnit 1.0 spellings,
/// and the usual informal ones) for the quantities SizeTest maps.
/// </summary>
public static class CatalogueUnits
{
    /// <summary>Radians per degree, π/180 exactly (definition of the degree).</summary>
    public const double RadiansPerDegree = Math.PI / 180.0;

    /// <summary>Radians per arcminute, π/10800 exactly (1′ = 1°/60).</summary>
    public const double RadiansPerArcmin = Math.PI / 10800.0;

    /// <summary>Radians per microarcsecond (1 µas = 10⁻⁶″).</summary>
    public const double RadiansPerMicroarcsec = AngleUnits.RadiansPerArcsec / 1e6;

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
            "arcsec" or "arcsecond" or "asec" or "\"" or "″" or "sec" => (AngleUnits.RadiansPerArcsec, "arcsec"),
            "mas" or "marcsec" or "milliarcsec" or "milliarcsecond" => (AngleUnits.RadiansPerMilliarcsec, "mas"),
            "uas" or "µas" or "μas" or "uarcsec" or "microarcsec" or "microarcsecond" => (RadiansPerMicroarcsec, "uas"),
            "arcmin" or "arcminute" or "amin" or "'" or "′" => (RadiansPerArcmin, "arcmin"),
            "deg" or "degree" or "°" or "degr" => (RadiansPerDegree, "deg"),
            "rad" or "radian" => (1.0, "rad"),
            "mrad" or "milliradian" => (1e-3, "mrad"),
            _ => null,
        };
        if (r is null)
        {
            // A single angle symbol written with an explicit power 1 (FITS 4.0 §4.3: "arcsec**1", "arcsec^(1)", "arcsec+1").
            if (u.IndexOfAny(['*', '^', '+', '(']) < 0 && !u.Any(char.IsAsciiDigit)) return false;
            if (!TryParseProduct(unit.Trim(), out var p) || p.Count != 1 || p.First().Value != 1) return false;
            var sym = p.First().Key;
            return sym.All(char.IsLetter) && TryParseAngle(sym, out radiansPerUnit, out canonical);
        }
        (radiansPerUnit, canonical) = r.Value;
        return true;
    }

    /// <summary>
    /// Whether the unit is surface brightness in mag/arcsec², read by the FITS Standard 4.0 §4.3 / IVOA VOUnit 1.0
    /// grammar (<see cref="TryParseProduct"/>): <c>mag/arcsec2</c>, <c>mag.arcsec-2</c>, <c>arcsec-2 mag</c>,
    /// <c>mag/arcsec**2</c>, <c>mag arcsec^-2</c>, <c>mag arcsec**-2</c>, <c>mag/(arcsec2)</c>, <c>mag/arcsec/arcsec</c>;
    /// also the informal <c>mag/sq.arcsec</c> and an AB/Vega qualifier.
    /// </summary>
    public static bool IsSurfaceBrightness(string? unit)
    {
        if (string.IsNullOrWhiteSpace(unit)) return false;
        var u = unit.Trim().ToLowerInvariant().Replace("(ab)", "").Replace("(vega)", "").Replace("″", "arcsec").Replace("²", "2");
        u = u.Replace("sq.arcsec", "arcsec2").Replace("sqarcsec", "arcsec2");
        if (!TryParseProduct(u, out var powers) || powers.Count != 2) return false;
        return powers.TryGetValue("mag", out var pm) && pm == 1 && powers.TryGetValue("arcsec", out var pa) && pa == -2;
    }

    /// <summary>
    /// Parses a compound unit string into base symbols with integer powers, by the grammar of the FITS Standard 4.0,
    /// §4.3 (Tables 6–9) and IVOA VOUnit 1.0 §2: factors are joined by <c>.</c>, <c>*</c> or spaces (multiplication)
    /// or <c>/</c> (division, applying to the next factor or parenthesised group); a power is written directly after
    /// the symbol (<c>arcsec2</c>, <c>arcsec-2</c>, <c>arcsec+2</c>), or with <c>**</c> or <c>^</c>, optionally in
    /// parentheses (<c>arcsec**(-2)</c>). Symbols are matched case-insensitively (more tolerant than the standard)
    /// and normalised: angle symbols to <c>arcsec, mas, uas, arcmin, deg, rad, mrad</c> (via <see cref="TryParseAngle"/>),
    /// magnitude spellings to <c>mag</c>. Returns false for text this grammar does not cover (numeric factors,
    /// functions such as <c>log()</c>, fractional powers).
    /// </summary>
    /// <param name="unit">The unit text.</param>
    /// <param name="powers">Symbol → net integer power (zero powers removed).</param>
    public static bool TryParseProduct(string? unit, out Dictionary<string, int> powers)
    {
        powers = new Dictionary<string, int>(StringComparer.Ordinal);
        if (string.IsNullOrWhiteSpace(unit)) return false;
        var s = unit.Trim().ToLowerInvariant();
        int pos = 0;
        var result = powers;
        bool ok = ParseSequence(s, ref pos, 1, result) && pos == s.Length;
        foreach (var k in result.Where(kv => kv.Value == 0).Select(kv => kv.Key).ToArray()) result.Remove(k);
        return ok && result.Count > 0;
    }

    private static void SkipSpaces(string s, ref int pos) { while (pos < s.Length && s[pos] == ' ') pos++; }

    // sequence := factor ( sep factor )* ; sep := '.' | '*' (not '**') | ' '+ | '/'
    private static bool ParseSequence(string s, ref int pos, int sign, Dictionary<string, int> acc)
    {
        SkipSpaces(s, ref pos);
        int nextSign = sign;
        bool first = true;
        while (pos < s.Length && s[pos] != ')')
        {
            if (!first)
            {
                int before = pos;
                SkipSpaces(s, ref pos);
                if (pos < s.Length && s[pos] == '/') { nextSign = -sign; pos++; SkipSpaces(s, ref pos); }
                else if (pos < s.Length && (s[pos] == '.' || (s[pos] == '*' && !(pos + 1 < s.Length && s[pos + 1] == '*')))) { nextSign = sign; pos++; SkipSpaces(s, ref pos); }
                else if (pos > before) nextSign = sign; // spaces alone multiply
                else return false;
                if (pos >= s.Length || s[pos] == ')') return false;
            }
            else if (s[pos] == '/') { nextSign = -sign; pos++; SkipSpaces(s, ref pos); } // "/s" means s-1 (FITS 4.0 Table 6)
            if (!ParseFactor(s, ref pos, nextSign, acc)) return false;
            first = false;
            nextSign = sign;
        }
        return !first;
    }

    // factor := '(' sequence ')' power? | symbol power?
    private static bool ParseFactor(string s, ref int pos, int sign, Dictionary<string, int> acc)
    {
        if (pos >= s.Length) return false;
        if (s[pos] == '(')
        {
            pos++;
            var inner = new Dictionary<string, int>(StringComparer.Ordinal);
            if (!ParseSequence(s, ref pos, 1, inner)) return false;
            if (pos >= s.Length || s[pos] != ')') return false;
            pos++;
            if (!ParsePower(s, ref pos, out int gp)) return false;
            foreach (var (k, v) in inner) Add(acc, k, v * gp * sign);
            return true;
        }
        int start = pos;
        while (pos < s.Length && (char.IsLetter(s[pos]) || s[pos] is '"' or '\'' or '°' or '′' or 'µ' or 'μ')) pos++;
        if (pos == start) return false;
        var sym = s[start..pos];
        if (!ParsePower(s, ref pos, out int p)) return false;
        string name;
        if (TryParseAngle(sym, out _, out var canon)) name = canon;
        else if (IsMagnitude(sym)) name = "mag";
        else name = sym;
        Add(acc, name, p * sign);
        return true;
    }

    // power := ( '**' | '^' )? ( integer | '(' integer ')' ) | nothing (power 1)
    private static bool ParsePower(string s, ref int pos, out int power)
    {
        power = 1;
        if (pos >= s.Length) return true;
        bool marked = false;
        if (s.AsSpan(pos).StartsWith("**")) { pos += 2; marked = true; }
        else if (s[pos] == '^') { pos++; marked = true; }
        bool paren = pos < s.Length && s[pos] == '(' && marked;
        if (paren) pos++;
        int start = pos;
        if (pos < s.Length && s[pos] is '+' or '-') pos++;
        while (pos < s.Length && char.IsAsciiDigit(s[pos])) pos++;
        var text = s[start..pos];
        if (text.Length == 0 || text is "+" or "-")
        {
            pos = start;
            if (paren || marked) return false;
            return true;
        }
        if (!int.TryParse(text, System.Globalization.NumberStyles.AllowLeadingSign, System.Globalization.CultureInfo.InvariantCulture, out power)) return false;
        if (paren) { if (pos >= s.Length || s[pos] != ')') return false; pos++; }
        return true;
    }

    private static void Add(Dictionary<string, int> acc, string k, int v) => acc[k] = acc.GetValueOrDefault(k) + v;

    /// <summary>
    /// Whether two unit strings mean the same unit for the quantities SizeTest maps (same angle, both surface
    /// brightness, both magnitudes, both dimensionless, or equal base-symbol powers by <see cref="TryParseProduct"/>).
    /// </summary>
    public static bool SameUnit(string? a, string? b)
    {
        if (IsDimensionless(a) && IsDimensionless(b)) return true;
        if (TryParseAngle(a, out var fa, out _) && TryParseAngle(b, out var fb, out _)) return fa == fb;
        if (IsSurfaceBrightness(a) && IsSurfaceBrightness(b)) return true;
        if (IsMagnitude(a) && IsMagnitude(b)) return true;
        if (TryParseRelative(a, out var ra) && TryParseRelative(b, out var rb)) return ra == rb;
        if (TryParseProduct(a, out var pa) && TryParseProduct(b, out var pb))
            return pa.Count == pb.Count && pa.All(kv => pb.TryGetValue(kv.Key, out var v) && v == kv.Value);
        return string.Equals(a?.Trim(), b?.Trim(), StringComparison.OrdinalIgnoreCase);
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
