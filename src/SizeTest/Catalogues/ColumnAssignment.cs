using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Text;

namespace SizeTest.Catalogues;

/// <summary>One explicit role assignment, <c>ROLE=NAME[:UNIT]</c> (the <c>--col</c> option and the study file's <c>[columns]</c> table).</summary>
/// <param name="Role">The role.</param>
/// <param name="ColumnName">The catalogue column (matched exactly first, then ignoring case).</param>
/// <param name="Unit">The unit to read the column in, overriding the file's; for errors also <c>frac</c> or <c>%</c> (relative). Null = the file's unit or the default.</param>
public sealed record ColumnAssignment(ColumnRole Role, string ColumnName, string? Unit = null)
{
    /// <summary>
    /// Parses <c>ROLE=NAME[:UNIT]</c>, e.g. <c>z=zspec</c>, <c>theta=Re:mas</c>, <c>theta_err=e_Re:frac</c>.
    /// The unit is whatever follows the last <c>:</c>. Throws <see cref="InputException"/> with a
    /// one-sentence message on malformed text, an unknown role or a unit the role cannot take.
    /// </summary>
    public static ColumnAssignment Parse(string text)
    {
        if (TryParse(text, out var a, out var error)) return a;
        throw new InputException(error);
    }

    /// <summary>The <c>Try</c> form of <see cref="Parse"/>.</summary>
    public static bool TryParse(string text, out ColumnAssignment assignment, out string error)
    {
        assignment = null!;
        error = "";
        var t = (text ?? "").Trim();
        int eq = t.IndexOf('=');
        if (eq <= 0 || eq == t.Length - 1)
        {
            error = $"column assignment '{text}' is not of the form ROLE=NAME[:UNIT] (e.g. theta=Re:arcsec)";
            return false;
        }
        var roleText = t[..eq].Trim();
        if (!ColumnRoles.TryParse(roleText, out var role))
        {
            var roles = ColumnRoles.All.Select(r => r.Name()).ToArray();
            error = $"unknown column role '{roleText}' in '{text}'{NameSuggestions.Hint(roleText, roles)}; roles are {string.Join(", ", roles)}";
            return false;
        }
        var rest = t[(eq + 1)..].Trim();
        string? unit = null;
        int colon = rest.LastIndexOf(':');
        if (colon >= 0)
        {
            unit = rest[(colon + 1)..].Trim();
            rest = rest[..colon].Trim();
            if (unit.Length == 0) unit = null;
        }
        if (rest.Length == 0)
        {
            error = $"column assignment '{text}' names no column";
            return false;
        }
        if (unit is not null && !UnitFits(role, unit, out var why))
        {
            error = $"unit '{unit}' in '{text}' cannot be used for {role.Name()}: {why}";
            return false;
        }
        assignment = new ColumnAssignment(role, rest, unit);
        return true;
    }

    /// <summary>Whether <paramref name="unit"/> can be given for <paramref name="role"/>; <paramref name="why"/> explains a refusal.</summary>
    public static bool UnitFits(ColumnRole role, string unit, out string why)
    {
        why = "";
        bool relative = CatalogueUnits.TryParseRelative(unit, out _);
        switch (role)
        {
            case ColumnRole.Theta:
                if (CatalogueUnits.TryParseAngle(unit, out _, out _)) return true;
                why = "angles take arcsec, mas, uas, arcmin, deg or rad";
                return false;
            case ColumnRole.ThetaErr:
                if (CatalogueUnits.TryParseAngle(unit, out _, out _) || relative) return true;
                why = "angle errors take arcsec, mas, uas, arcmin, deg, rad, or frac/% for relative errors";
                return false;
            case ColumnRole.Z:
                if (CatalogueUnits.IsDimensionless(unit)) return true;
                why = "redshift has no unit";
                return false;
            case ColumnRole.ZErr:
                if (CatalogueUnits.IsDimensionless(unit) || relative) return true;
                why = "redshift errors have no unit (or frac/% for relative errors)";
                return false;
            case ColumnRole.Mu or ColumnRole.MuErr:
                if (CatalogueUnits.IsSurfaceBrightness(unit) || CatalogueUnits.IsMagnitude(unit)) return true;
                why = "surface brightness is read in mag/arcsec2";
                return false;
            case ColumnRole.Mag or ColumnRole.MagErr:
                if (CatalogueUnits.IsMagnitude(unit)) return true;
                why = "magnitudes are read in mag";
                return false;
            case ColumnRole.AbsMag:
                if (CatalogueUnits.IsMagnitude(unit)) return true;
                why = "absolute magnitudes are read in mag";
                return false;
            case ColumnRole.LogMass:
                if (SurveyRoleUnits.IsLogSolarMass(unit)) return true;
                why = "stellar masses are read as log10(M/Msun): dex or log(Msun)";
                return false;
            case ColumnRole.FluxDensity:
                if (SurveyRoleUnits.TryParseFluxDensity(unit, out _, out _)) return true;
                why = "flux densities take Jy, mJy, uJy, nJy, W/m2/Hz or erg/s/cm2/Hz";
                return false;
            case ColumnRole.SersicN or ColumnRole.Weight:
                if (CatalogueUnits.IsDimensionless(unit)) return true;
                why = $"{role.Name()} has no unit";
                return false;
            default:
                why = "identifiers, bands and groups have no unit";
                return false;
        }
    }
}
