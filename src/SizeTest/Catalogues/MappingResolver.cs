using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Angles;
using SizeTest.Foundation.Text;

namespace SizeTest.Catalogues;

/// <summary>
/// Turns a <see cref="ColumnMapping"/> and a reader's columns into a <see cref="ResolvedMapping"/>:
/// explicit assignments first, then (for the rest) columns named by role, IVOA UCDs, common
/// names, and error companions (<c>e_X</c>, <c>X_err</c>, <c>MAGERR_AUTO</c> for <c>MAG_AUTO</c>, <c>stat.error;…</c>). Every choice
/// carries its reason.
/// </summary>
public static class MappingResolver
{
    private static readonly Dictionary<ColumnRole, string[]> CommonNames = new()
    {
        [ColumnRole.Z] = ["redshift", "zspec", "zphot", "zbest", "zsp", "zph", "specz", "photz", "photoz", "zhelio", "zcmb", "zgal", "zpeak", "zobs"],
        [ColumnRole.Theta] = ["re", "reff", "rhalf", "r50", "rh", "hlr", "halflightradius", "thetaarcsec", "size", "radius", "angsize", "angularsize", "fwhm", "rpetro", "petrorad", "petror50", "theta50", "thetae"],
        [ColumnRole.Mu] = ["sb", "mue", "mueff", "meansb", "surfacebrightness", "mu0", "sbe", "avgsb", "mumean", "sbmean"],
        // Total magnitudes only: MAG_AUTO, MAG_PETRO, MAG_BEST and MAG_MODEL of source-extraction catalogues, not their isophotal
        // (MAG_ISO, MAG_ISOCOR) or fixed-aperture (MAG_APER) magnitudes, which miss light: those are mapped by hand.
        [ColumnRole.Mag] = ["magnitude", "m", "magauto", "magtot", "mtot", "totalmag", "petromag", "modelmag", "cmodelmag", "magbest", "magpetro", "magmodel"],
        [ColumnRole.Id] = ["objid", "objectid", "sourceid", "name", "objname", "source", "obj", "galaxy", "seq", "number", "srcid", "galid"],
        [ColumnRole.Band] = ["filter", "passband", "bandpass", "filtername"],
        [ColumnRole.AbsMag] = ["absmag", "mabs", "absolutemag", "absolutemagnitude", "magabs"],
        [ColumnRole.LogMass] = ["logmass", "logmstar", "lmass", "lmstar", "logm", "logsm", "logmstellar", "logstellarmass"],
        [ColumnRole.FluxDensity] = ["fluxdensity", "snu", "sint", "stot", "stotal", "speak", "fnu", "flux"],
        [ColumnRole.SersicN] = ["sersicn", "nsersic", "sersic", "nser", "sersicindex", "spheroidsersicn"],
        [ColumnRole.Group] = ["population", "morphtype", "galtype", "subsample"],
        [ColumnRole.Weight] = ["wt", "wgt", "weights"],
    };

    private static string Norm(string s) => new string(s.ToLowerInvariant().Where(char.IsLetterOrDigit).ToArray());

    private static string[] UcdWords(CatalogueColumn c) =>
        string.IsNullOrWhiteSpace(c.Ucd) ? [] : c.Ucd.ToLowerInvariant().Split(';', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries);

    private static bool UcdMatchesValue(ColumnRole role, IEnumerable<string> words) => role switch
    {
        ColumnRole.Z => words.Any(w => w.StartsWith("src.redshift", StringComparison.Ordinal)),
        ColumnRole.Theta => words.Any(w => w.StartsWith("phys.angsize", StringComparison.Ordinal)),
        ColumnRole.Mu => words.Any(w => w.StartsWith("phot.mag.sb", StringComparison.Ordinal)),
        ColumnRole.Mag => words.Any(w => w.StartsWith("phot.mag", StringComparison.Ordinal) && !w.StartsWith("phot.mag.sb", StringComparison.Ordinal)),
        ColumnRole.Id => words.Any(w => w == "meta.id"),
        ColumnRole.Band => words.Any(w => w.StartsWith("instr.bandpass", StringComparison.Ordinal) || w.StartsWith("instr.filter", StringComparison.Ordinal)),
        ColumnRole.AbsMag => words.Any(w => w.StartsWith("phys.magabs", StringComparison.Ordinal)),
        ColumnRole.LogMass => words.Any(w => w.StartsWith("phys.mass", StringComparison.Ordinal)),
        ColumnRole.FluxDensity => words.Any(w => w.StartsWith("phot.flux.density", StringComparison.Ordinal)),
        ColumnRole.SersicN => false, // by SersicIndexColumn, which reads the name and description too
        ColumnRole.Group => words.Any(w => w == "src.class" || w.StartsWith("src.morph.type", StringComparison.Ordinal)),
        ColumnRole.Weight => words.Any(w => w == "stat.weight"),
        _ => false,
    };

    /// <summary>Resolves the mapping. Throws <see cref="InputException"/> for an assignment naming a missing or unreadable column or a unit that does not fit.</summary>
    /// <param name="columns">The reader's columns.</param>
    /// <param name="mapping">What the user said.</param>
    /// <param name="sourceName">The file, for messages.</param>
    public static ResolvedMapping Resolve(IReadOnlyList<CatalogueColumn> columns, ColumnMapping mapping, string sourceName)
    {
        ArgumentNullException.ThrowIfNull(columns);
        ArgumentNullException.ThrowIfNull(mapping);
        var roles = new Dictionary<ColumnRole, RoleBinding>();
        var used = new HashSet<int>();
        var notes = new List<string>();

        // 1. Explicit assignments.
        foreach (var a in mapping.Assignments)
        {
            int idx = FindColumn(columns, a.ColumnName);
            if (idx < 0)
                throw new InputException($"there is no column '{a.ColumnName}' for {a.Role.Name()}{ColumnHint(columns, a.ColumnName)}; the columns are {ListNames(columns)}", sourceName, column: a.ColumnName);
            var col = columns[idx];
            if (!Eligible(a.Role, col))
                throw new InputException($"column '{col.Name}' ({col.NativeType}) cannot hold {a.Role.Name()} values", sourceName, column: col.Name);
            var b = Bind(a.Role, idx, col, a.Unit, "given with {col}", roles, out var problem);
            if (b is null) throw SettingProblem.Input($"{problem}; give the unit with {{col}} {a.Role.Name()}={col.Name}:UNIT", sourceName, column: col.Name);
            if (!string.IsNullOrWhiteSpace(a.Unit) && !string.IsNullOrWhiteSpace(col.Unit) && !CatalogueUnits.SameUnit(a.Unit, col.Unit))
                notes.Add(SettingProblem.Text($"warning: column '{col.Name}' declares unit '{col.Unit.Trim()}' in the file, but {{col}} {a.Role.Name()}={col.Name}:{a.Unit} gives '{a.Unit}'; the given unit is used"));
            roles[a.Role] = b;
            used.Add(idx);
        }

        // 2. Detection of the remaining value roles, then of their errors.
        if (mapping.DetectOthers)
        {
            foreach (var role in new[] { ColumnRole.Z, ColumnRole.Theta, ColumnRole.Mu, ColumnRole.Mag, ColumnRole.Id, ColumnRole.Band,
                         ColumnRole.AbsMag, ColumnRole.LogMass, ColumnRole.FluxDensity, ColumnRole.SersicN, ColumnRole.Group, ColumnRole.Weight })
                if (!roles.ContainsKey(role)) DetectValue(role, columns, used, roles, notes);
            foreach (var role in new[] { ColumnRole.ZErr, ColumnRole.ThetaErr, ColumnRole.MuErr, ColumnRole.MagErr })
                if (!roles.ContainsKey(role)) DetectError(role, columns, used, roles, notes);
        }

        // A value and its error end up in the same unit: an error whose unit was not given follows a value whose unit was
        // given with --col, when the file declared the same unit for both (the user corrected the file's declaration).
        foreach (var err in roles.Values.Where(b => b.Role.ValueRoleOf() is not null && !b.IsRelative && b.UnitReason != "given").ToArray())
        {
            if (!roles.TryGetValue(err.Role.ValueRoleOf()!.Value, out var val) || val.IsRelative || val.UnitReason != "given") continue;
            if (err.Unit == val.Unit && err.Scale == val.Scale) continue;
            string? valFileUnit = columns[val.ColumnIndex].Unit, errFileUnit = columns[err.ColumnIndex].Unit;
            bool follows = string.IsNullOrWhiteSpace(errFileUnit) || (!string.IsNullOrWhiteSpace(valFileUnit) && CatalogueUnits.SameUnit(valFileUnit, errFileUnit));
            if (!follows) continue;
            roles[err.Role] = err with { Unit = val.Unit, Scale = val.Scale, UnitReason = $"same as {val.Role.Name()}" };
            notes.Add(SettingProblem.Text($"warning: {err.Role.Name()} column '{err.ColumnName}' is read in {val.Unit}, the unit given for {val.Role.Name()} column '{val.ColumnName}'")
                      + (string.IsNullOrWhiteSpace(errFileUnit) ? "" : SettingProblem.Text($", not its declared '{errFileUnit.Trim()}'")));
        }

        // A relative error needs its value.
        foreach (var b in roles.Values.Where(b => b.IsRelative).ToArray())
        {
            var valueRole = b.Role.ValueRoleOf()!.Value;
            if (!roles.ContainsKey(valueRole))
                throw SettingProblem.Input($"{b.Role.Name()} is relative ({b.Unit}) but no {valueRole.Name()} column is mapped; map one with {{col}} {valueRole.Name()}=NAME", sourceName, column: b.ColumnName);
        }

        // 3. Kept columns.
        var kept = new List<(string, int)>();
        foreach (var name in mapping.Keep)
        {
            int idx = FindColumn(columns, name);
            if (idx < 0) throw new InputException($"there is no column '{name}' to keep{ColumnHint(columns, name)}; the columns are {ListNames(columns)}", sourceName, column: name);
            if (columns[idx].Kind is ColumnKind.Unsupported or ColumnKind.Boolean)
                throw new InputException($"column '{name}' ({columns[idx].NativeType}) is not numeric and cannot be kept", sourceName, column: name);
            if (!kept.Any(k => k.Item2 == idx)) kept.Add((columns[idx].Name, idx));
        }

        // 4. Size definition.
        SizeDefinition def;
        string defReason;
        if (mapping.SizeDefinition is { } given) { def = given; defReason = "given with {size_def}"; }
        else if (roles.TryGetValue(ColumnRole.Theta, out var th) && Norm(th.ColumnName).Contains("petro"))
        { def = new SizeDefinition(SizeKind.Petrosian); defReason = SettingProblem.Text($"size column '{th.ColumnName}' is named Petrosian"); }
        else if (roles.TryGetValue(ColumnRole.Theta, out th) && Norm(th.ColumnName).Contains("fwhm"))
        { def = new SizeDefinition(SizeKind.GaussianFwhm); defReason = SettingProblem.Text($"size column '{th.ColumnName}' is named FWHM"); }
        else { def = SizeDefinition.Effective; defReason = "default; set another with {size_def}"; }

        return new ResolvedMapping(roles, kept, def, defReason, notes);
    }

    private static string ColumnHint(IReadOnlyList<CatalogueColumn> columns, string name) => NameSuggestions.Hint(name, columns.Select(c => c.Name));

    private static string ListNames(IReadOnlyList<CatalogueColumn> columns)
    {
        var names = columns.Take(30).Select(c => $"'{c.Name}'");
        return string.Join(", ", names) + (columns.Count > 30 ? $" and {columns.Count - 30} more" : "");
    }

    /// <summary>Finds a column by name: exactly, then ignoring case, then as the header writes it with its unit
    /// (<c>theta [arcsec]</c>, <c>Re (mas)</c>, ignoring blanks and case); −1 if absent.</summary>
    public static int FindColumn(IReadOnlyList<CatalogueColumn> columns, string name)
    {
        for (int i = 0; i < columns.Count; i++) if (columns[i].Name == name) return i;
        for (int i = 0; i < columns.Count; i++) if (string.Equals(columns[i].Name, name, StringComparison.OrdinalIgnoreCase)) return i;
        // The header as the file writes it, unit included ("theta [arcsec]", "Re (mas)"): the column whose name and unit it is.
        var asWritten = Compact(name);
        for (int i = 0; i < columns.Count; i++)
            if (columns[i].Unit is { Length: > 0 } u && (asWritten == Compact($"{columns[i].Name}[{u}]") || asWritten == Compact($"{columns[i].Name}({u})"))) return i;
        return -1;
    }

    private static string Compact(string s) => new string(s.Where(c => !char.IsWhiteSpace(c)).ToArray()).ToLowerInvariant();

    private static bool Eligible(ColumnRole role, CatalogueColumn c) =>
        role.IsText() ? c.Kind != ColumnKind.Unsupported : c.Kind is ColumnKind.Real or ColumnKind.Integer or ColumnKind.Text;

    /// <summary>Builds a binding with its unit; null (with <paramref name="problem"/>) when the column's unit does not fit the role.</summary>
    private static RoleBinding? Bind(ColumnRole role, int idx, CatalogueColumn col, string? givenUnit, string reason,
        IReadOnlyDictionary<ColumnRole, RoleBinding> bound, out string problem)
    {
        problem = "";
        string? unit = givenUnit ?? (string.IsNullOrWhiteSpace(col.Unit) ? null : col.Unit.Trim());
        string unitReason = givenUnit is not null ? "given" : unit is not null ? "from the file" : "default";
        switch (role)
        {
            case ColumnRole.Theta:
                if (unit is null) return new RoleBinding(role, idx, col.Name, "arcsec", AngleUnits.RadiansPerArcsec, false, reason, "default; the column has no unit");
                if (CatalogueUnits.TryParseAngle(unit, out var f, out var canon)) return new RoleBinding(role, idx, col.Name, canon, f, false, reason, unitReason);
                problem = $"column '{col.Name}' has unit '{unit}', which is not an angle";
                return null;
            case ColumnRole.ThetaErr:
                if (unit is not null && CatalogueUnits.TryParseRelative(unit, out var rf))
                    return new RoleBinding(role, idx, col.Name, rf == 1 ? "frac" : "%", rf, true, reason, unitReason);
                if (unit is not null)
                {
                    if (CatalogueUnits.TryParseAngle(unit, out var ef, out var ec)) return new RoleBinding(role, idx, col.Name, ec, ef, false, reason, unitReason);
                    problem = $"column '{col.Name}' has unit '{unit}', which is not an angle";
                    return null;
                }
                if (bound.TryGetValue(ColumnRole.Theta, out var th) && !th.IsRelative)
                    return new RoleBinding(role, idx, col.Name, th.Unit, th.Scale, false, reason, "same as theta");
                return new RoleBinding(role, idx, col.Name, "arcsec", AngleUnits.RadiansPerArcsec, false, reason, "default; the column has no unit");
            case ColumnRole.Z or ColumnRole.ZErr:
                if (role == ColumnRole.ZErr && unit is not null && CatalogueUnits.TryParseRelative(unit, out var zf))
                    return new RoleBinding(role, idx, col.Name, zf == 1 ? "frac" : "%", zf, true, reason, unitReason);
                if (unit is null || CatalogueUnits.IsDimensionless(unit)) return new RoleBinding(role, idx, col.Name, "", 1.0, false, reason, "");
                problem = $"column '{col.Name}' has unit '{unit}', but a redshift has none";
                return null;
            case ColumnRole.Mu or ColumnRole.MuErr:
                if (unit is null) return new RoleBinding(role, idx, col.Name, "mag/arcsec2", 1.0, false, reason, "default; the column has no unit");
                if (CatalogueUnits.IsSurfaceBrightness(unit) || CatalogueUnits.IsMagnitude(unit)) return new RoleBinding(role, idx, col.Name, "mag/arcsec2", 1.0, false, reason, unitReason);
                problem = $"column '{col.Name}' has unit '{unit}', which is not mag/arcsec2";
                return null;
            case ColumnRole.Mag or ColumnRole.MagErr:
                if (unit is null) return new RoleBinding(role, idx, col.Name, "mag", 1.0, false, reason, "default; the column has no unit");
                if (CatalogueUnits.IsMagnitude(unit)) return new RoleBinding(role, idx, col.Name, "mag", 1.0, false, reason, unitReason);
                problem = $"column '{col.Name}' has unit '{unit}', which is not a magnitude";
                return null;
            case ColumnRole.AbsMag:
                if (unit is null) return new RoleBinding(role, idx, col.Name, "mag", 1.0, false, reason, "default; the column has no unit");
                if (CatalogueUnits.IsMagnitude(unit)) return new RoleBinding(role, idx, col.Name, "mag", 1.0, false, reason, unitReason);
                problem = $"column '{col.Name}' has unit '{unit}', which is not a magnitude";
                return null;
            case ColumnRole.LogMass:
                if (SurveyRoleUnits.IsLogSolarMass(unit)) return new RoleBinding(role, idx, col.Name, "log(Msun)", 1.0, false, reason, unit is null ? "default; the column has no unit" : unitReason);
                problem = SurveyRoleUnits.IsLinearSolarMass(unit)
                    ? $"column '{col.Name}' holds linear masses ('{unit}'); log_mass takes log10(M/Msun) — convert the column"
                    : $"column '{col.Name}' has unit '{unit}', which is not log10 of a solar mass";
                return null;
            case ColumnRole.FluxDensity:
                if (unit is null) return new RoleBinding(role, idx, col.Name, "Jy", 1.0, false, reason, "default; the column has no unit");
                if (SurveyRoleUnits.TryParseFluxDensity(unit, out var jy, out var jyCanon)) return new RoleBinding(role, idx, col.Name, jyCanon, jy, false, reason, unitReason);
                problem = $"column '{col.Name}' has unit '{unit}', which is not a flux density (Jy, mJy, uJy, W/m2/Hz, erg/s/cm2/Hz)";
                return null;
            case ColumnRole.SersicN or ColumnRole.Weight:
                if (unit is null || CatalogueUnits.IsDimensionless(unit)) return new RoleBinding(role, idx, col.Name, "", 1.0, false, reason, "");
                problem = $"column '{col.Name}' has unit '{unit}', but {role.Name()} has none";
                return null;
            default:
                return new RoleBinding(role, idx, col.Name, "", 1.0, false, reason, "");
        }
    }

    private static void DetectValue(ColumnRole role, IReadOnlyList<CatalogueColumn> columns, HashSet<int> used,
        Dictionary<ColumnRole, RoleBinding> roles, List<string> notes)
    {
        var candidates = new List<(int Index, int Tier, string Reason)>();
        string roleNorm = Norm(role.Name());
        for (int i = 0; i < columns.Count; i++)
        {
            if (used.Contains(i) || !Eligible(role, columns[i])) continue;
            var c = columns[i];
            var words = UcdWords(c);
            if (words.Length > 0 && words[0].StartsWith("stat.", StringComparison.Ordinal)) continue; // an error or statistic, not a value
            string n = Norm(c.Name);
            if (n == roleNorm) candidates.Add((i, 0, "named by role"));
            else if (UcdMatchesValue(role, words)) candidates.Add((i, words.Contains("meta.main") ? 1 : 2, SettingProblem.Text($"UCD {c.Ucd}")));
            else if (role == ColumnRole.SersicN && SersicIndexColumn.Reason(c, words) is { } why)
                candidates.Add((i, words.Contains("meta.main") ? 1 : 2, SettingProblem.Text($"UCD {c.Ucd} and {why}")));
            else if (CommonNames.TryGetValue(role, out var names) && names.Contains(n)) candidates.Add((i, 3, $"common name for {role.Name()}"));
        }
        foreach (var cand in candidates.OrderBy(c => c.Tier).ThenBy(c => c.Index))
        {
            var b = Bind(role, cand.Index, columns[cand.Index], null, cand.Reason, roles, out var problem);
            if (b is null) { notes.Add(SettingProblem.Text($"passed over '{columns[cand.Index].Name}' for {role.Name()}: {problem}")); continue; }
            roles[role] = b;
            used.Add(cand.Index);
            var others = candidates.Where(c => c.Index != cand.Index && !used.Contains(c.Index)).Select(c => $"'{columns[c.Index].Name}'").ToArray();
            if (others.Length > 0) notes.Add(SettingProblem.Text($"for {role.Name()} also possible: {string.Join(", ", others)} (choose with {{col}} {role.Name()}=NAME)"));
            return;
        }
    }

    private static void DetectError(ColumnRole role, IReadOnlyList<CatalogueColumn> columns, HashSet<int> used,
        Dictionary<ColumnRole, RoleBinding> roles, List<string> notes)
    {
        var valueRole = role.ValueRoleOf()!.Value;
        roles.TryGetValue(valueRole, out var value);
        string roleNorm = Norm(role.Name());
        string? v = value is null ? null : Norm(value.ColumnName);
        var candidates = new List<(int Index, int Tier, string Reason)>();
        var inner = value is null ? [] : InnerErrorNames(value.ColumnName);
        for (int i = 0; i < columns.Count; i++)
        {
            if (used.Contains(i) || !Eligible(role, columns[i])) continue;
            var c = columns[i];
            string n = Norm(c.Name);
            var words = UcdWords(c);
            if (n == roleNorm) { candidates.Add((i, 0, "named by role")); continue; }
            if (value is null) continue;
            // A name that pairs with this value column is the most specific sign; a UCD alone fits the error of any value of
            // its kind (a catalogue with MAG_ISO and MAG_AUTO has two stat.error;phot.mag columns).
            bool byName = IsCompanionName(n, v!) || inner.Contains(n);
            bool byUcd = words.Length > 0 && words[0] == "stat.error" && UcdMatchesValue(valueRole, words.Skip(1));
            string companion = SettingProblem.Text($"error companion of '{value.ColumnName}' by name");
            if (byName && byUcd) candidates.Add((i, 1, SettingProblem.Text($"UCD {c.Ucd}, ") + companion));
            else if (byName) candidates.Add((i, 2, companion));
            else if (byUcd) candidates.Add((i, 3, SettingProblem.Text($"UCD {c.Ucd}")));
            else if (words.Length > 0 && words[0] == "stat.error" && i == value.ColumnIndex + 1)
                candidates.Add((i, 4, SettingProblem.Text($"UCD {c.Ucd} next to '{value.ColumnName}'")));
        }
        foreach (var cand in candidates.OrderBy(c => c.Tier).ThenBy(c => c.Index))
        {
            var b = Bind(role, cand.Index, columns[cand.Index], null, cand.Reason, roles, out var problem);
            if (b is null) { notes.Add(SettingProblem.Text($"passed over '{columns[cand.Index].Name}' for {role.Name()}: {problem}")); continue; }
            roles[role] = b;
            used.Add(cand.Index);
            return;
        }
    }

    /// <summary>
    /// The error names made by putting <c>err</c> inside the value's name, at a boundary between its words (split at
    /// non-alphanumerics and lower-to-upper case changes), normalised like <see cref="Norm"/>: <c>MAG_AUTO</c> → <c>magerrauto</c>
    /// (<c>MAGERR_AUTO</c>, the MAGERR_/FLUXERR_ prefixes of source-extraction catalogues), <c>petroMag_r</c> → <c>petromagerrr</c>
    /// (<c>petroMagErr_r</c>), <c>SPHEROID_REFF_WORLD</c> → <c>spheroidrefferrworld</c>. Names with <c>err</c> at either end are
    /// <see cref="IsCompanionName"/>'s.
    /// </summary>
    internal static string[] InnerErrorNames(string valueName)
    {
        var words = ColumnNameWords.Split(valueName);
        var names = new string[Math.Max(0, words.Count - 1)];
        for (int k = 1; k < words.Count; k++) names[k - 1] = string.Concat(words.Take(k)) + "err" + string.Concat(words.Skip(k));
        return names;
    }

    private static bool IsCompanionName(string n, string v) =>
        n == "e" + v || n == v + "err" || n == "err" + v || n == v + "error" || n == "error" + v || n == v + "sigma" ||
        n == "sigma" + v || n == "sig" + v || n == "d" + v || n == v + "unc" || n == "unc" + v || n == "s" + v;
}
