using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Text;
using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Inference.Survey;
using SizeTest.Photometry;
using SizeTest.Reporting.Pdf;

namespace SizeTest.Studies;

/// <summary>
/// Reads a study file (TOML) into a <see cref="StudyDefinition"/>. Every key is checked: an unknown key, a value of the
/// wrong kind or an inconsistent setting is an <see cref="InputException"/> naming the file, line and column.
/// The layout is documented in docs/study-file.md.
/// </summary>
public static class StudyFileParser
{
    private static readonly Dictionary<string, string> TableKeys = new(StringComparer.Ordinal)
    {
        [""] = "top-level keys are name, seed and the tables [catalogue], [columns], [corrections], [models], [parameters], [selection], [survey], [inference], [expected], [power], [report]",
        ["catalogue"] = "[catalogue] takes path, format, table, size_definition, synthetic, keep",
        ["columns"] = $"[columns] takes one ROLE = \"NAME[:UNIT]\" per role ({string.Join(", ", ColumnRoles.All.Select(r => r.Name()))})",
        ["corrections"] = "[corrections] takes kcorr, extinction, zero_points, band, band_match, sersic_n, sb",
        ["models"] = "[models] takes names, observable, size_sb_relation, pivot_kpc, dimming_offset, grid_nodes, flux_convention and one [models.NAME] table of parameter settings per listed model",
        ["selection"] = "[selection] takes sb_limit, mag_limit, min_size, max_outside_fraction",
        ["survey"] = "[survey] takes size_relation, pivot_abs_mag, pivot_log_mass, pivot_log_lum, abs_mag_range, group, evolution, ignore_z_err, size_errors, z_prior, z_prior_shape, z_marginal, z_nodes, frequency_ghz, spectral_index, ref_cosmology",
        ["inference"] = "[inference] takes starts, bootstrap, cv_folds, sampler, sampler_steps, sampler_max_steps, sampler_walkers",
        ["power"] = "[power] takes results (a power.json written by 'sizetest power')",
        ["report"] = "[report] takes title, paper, formats, figure_width, bins, bin_resamples",
    };

    // The keys of [models] other than its per-model tables.
    private static readonly string[] ModelKeys = ["names", "observable", "size_sb_relation", "pivot_kpc", "dimming_offset", "grid_nodes", FluxConventions.Setting];

    // "; got 'X'" for a value outside the allowed ones, with a did-you-mean among them when it is a string.
    private static string Got(TomlNode node, IReadOnlyList<string> allowed) => node.Scalar switch
    {
        string s => $"; got '{s}'{NameSuggestions.Hint(s, allowed)}",
        { } v => $"; got {Convert.ToString(v, System.Globalization.CultureInfo.InvariantCulture)}",
        _ => "",
    };

    /// <summary>Reads and parses <paramref name="path"/>; the path is kept as given for the manifest.</summary>
    public static StudyDefinition Load(string path)
    {
        string text;
        try
        {
            text = File.ReadAllText(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            throw new InputException($"cannot read the study file ({e.Message.TrimEnd('.')}); check the path", path, inner: e);
        }
        return Parse(text, path, Path.GetDirectoryName(Path.GetFullPath(path))!);
    }

    /// <summary>
    /// Parses study-file text. <paramref name="fileName"/> names the file in errors; relative paths inside are resolved
    /// against <paramref name="baseDirectory"/> (the study file's folder).
    /// </summary>
    public static StudyDefinition Parse(string text, string fileName, string baseDirectory)
    {
        ArgumentNullException.ThrowIfNull(text);
        var root = TomlNode.Parse(text, fileName);
        string name = root.String("name") ?? Path.GetFileNameWithoutExtension(fileName);
        if (name.Length == 0 || name.IndexOfAny(Path.GetInvalidFileNameChars()) >= 0 || name is "." or "..")
            throw root.Get("name")!.Error($"study name '{name}' cannot be a folder name; use letters, digits, '-' and '_'");
        int seed = root.Integer("seed") ?? 1;

        // [catalogue]
        var cat = root.Table("catalogue") ?? throw new InputException("the study file has no [catalogue] table; add [catalogue] with path = \"CATALOGUE\"", fileName, 1, "1");
        var catPathNode = cat.Get("path") ?? throw cat.Error("[catalogue] needs path = \"CATALOGUE\" (relative to the study file)");
        string catPath = catPathNode.Scalar as string ?? throw catPathNode.Error("'catalogue.path' must be a string");
        if (catPath.Trim().Length == 0) throw catPathNode.Error("'catalogue.path' is empty");
        var reader = new ReaderOptions { Format = Format(cat), Table = cat.Get("table") is { } t ? (t.Scalar is long l ? l.ToString(System.Globalization.CultureInfo.InvariantCulture) : t.Scalar as string ?? throw t.Error("'catalogue.table' must be an HDU/table number or name")) : null };
        SizeDefinition? sizeDef = null;
        if (cat.Get("size_definition") is { } sd)
        {
            if (!SizeDefinitions.TryParse(sd.Scalar as string ?? throw sd.Error("'catalogue.size_definition' must be a string"), out var def, out var err)) throw sd.Error(err);
            sizeDef = def;
        }
        bool synthetic = cat.Boolean("synthetic") ?? false;
        var keep = cat.Strings("keep") ?? [];

        // [columns]
        var assignments = new List<ColumnAssignment>();
        if (root.Table("columns") is { } cols)
            foreach (var role in cols.Keys)
            {
                var node = cols.Get(role)!;
                var value = node.Scalar as string ?? throw node.Error($"'columns.{role}' must be a string \"NAME[:UNIT]\"");
                if (!ColumnAssignment.TryParse($"{role}={value}", out var a, out var error)) throw node.Error(error);
                if (assignments.Any(x => x.Role == a.Role)) throw node.Error($"role {a.Role.Name()} is assigned twice; give each role once");
                assignments.Add(a);
            }
        var mapping = new ColumnMapping { Assignments = assignments, SizeDefinition = sizeDef, Keep = keep.ToArray() };

        // [corrections]: the photometry option strings, parsed for syntax now (tables are read when the study runs).
        var corrections = new PhotometryOptionText();
        if (root.Table("corrections") is { } corr)
        {
            corrections = new PhotometryOptionText
            {
                KCorrection = corr.String("kcorr"),
                Extinction = corr.String("extinction"),
                ZeroPoints = corr.String("zero_points"),
                DefaultBand = corr.String("band"),
                BandMatch = corr.String("band_match"),
                SersicIndex = corr.Get("sersic_n") is { } n ? (n.Scalar is string ns ? ns : n.AsNumber().ToString("R", System.Globalization.CultureInfo.InvariantCulture)) : null,
                SurfaceBrightness = corr.String("sb"),
            };
        }

        // [models]
        var modelsNode = root.Table("models") ?? throw new InputException("the study file has no [models] table; add [models] with names = [\"lcdm\", \"tired-light\"]", fileName, 1, "1");
        var namesNode = modelsNode.Get("names") ?? throw modelsNode.Error("[models] needs names = [\"lcdm\", …]");
        var names = modelsNode.Strings("names")!;
        if (names.Count == 0) throw namesNode.Error("'models.names' is empty; name at least one world model");
        foreach (var (n, i) in names.Select((n, i) => (n, i)))
        {
            if (!WorldModels.TryGet(n, out _)) throw (namesNode.Items?[i] ?? namesNode).Error($"unknown world model '{n}'{NameSuggestions.Hint(n, WorldModels.Names)}; known models are {string.Join(", ", WorldModels.Names)}");
            if (names.Take(i).Contains(n)) throw (namesNode.Items?[i] ?? namesNode).Error($"world model '{n}' is listed twice");
        }
        var obsNode = modelsNode.Get("observable");
        var observable = ObservableKind.Size;
        if (obsNode is not null && !(obsNode.Scalar is string obsText && ObservableKinds.TryParse(obsText, out observable)))
            throw obsNode.Error($"'models.observable' must be \"size\", \"sb\" or \"joint\"{Got(obsNode, [.. ObservableKinds.Names])}");

        // [selection]
        var selection = SelectionLimits.None;
        TomlNode? selNode = root.Table("selection");
        if (selNode is not null)
            selection = new SelectionLimits(selNode.Number("sb_limit"), selNode.Number("mag_limit"), selNode.Number("min_size"));
        double maxOutside = selNode?.Number("max_outside_fraction") ?? SelectionConsistency.DefaultMaxOutsideFraction;
        if (!(maxOutside is >= 0 and <= 1)) throw selNode!.Get("max_outside_fraction")!.Error("'selection.max_outside_fraction' must be between 0 and 1");
        var (survey, luminosity, groupColumn) = root.Table("survey") is { } sv ? Survey(sv) : (null, null, null);
        if (groupColumn is not null)
            mapping = mapping with { Assignments = [.. mapping.Assignments.Where(a => a.Role != ColumnRole.Group), new ColumnAssignment(ColumnRole.Group, groupColumn)] };
        // The size relation is known now and decides what a magnitude limit means (SurveyRequest.RelationTerms); the sample's own
        // survey terms are bound once it is loaded.
        var nuisance = new NuisanceModel(observable, selection, modelsNode.Boolean("size_sb_relation") ?? false,
            modelsNode.Number("pivot_kpc") ?? 5.0, modelsNode.Number("dimming_offset") ?? 0.0, modelsNode.Integer("grid_nodes") ?? 96, survey?.RelationTerms);
        try
        {
            (survey is null ? nuisance : nuisance with { Survey = ProvisionalSurvey(survey) }).Validate();
        }
        catch (InputException e) when (e.SettingProblems.Count > 0)
        {
            throw (selNode ?? modelsNode).Error(e.Render(StudySettingKeys.Key));
        }
        catch (ArgumentException e)
        {
            throw (selNode ?? modelsNode).Error(e.Message);
        }

        // [parameters] (every model) and [models.NAME] (one model).
        var families = names.Select(WorldModels.Get).ToArray();
        // With survey terms the parameter names depend on the sample (group labels): names are checked against a
        // provisional survey model here (β, r0_kpc_binK; NAME@GROUP by its NAME) and again once the sample is loaded.
        var named = survey is null ? nuisance : nuisance with { Survey = ProvisionalSurvey(survey) };
        var allKnown = families.SelectMany(f => StudyHypotheses.KnownNames(f, named)).ToHashSet(StringComparer.Ordinal);
        bool grouped = survey?.Groups == true;
        var shared = root.Table("parameters") is { } pt ? Parameters(pt, allKnown, "any listed model with this observable", grouped) : [];
        var perModel = new Dictionary<string, IReadOnlyList<StudyParameter>>(StringComparer.Ordinal);
        var perModelNodes = new Dictionary<string, TomlNode>(StringComparer.Ordinal);
        foreach (var key in modelsNode.Keys)
        {
            if (ModelKeys.Contains(key)) continue;
            var node = modelsNode.Get(key)!;
            if (!node.IsTable || !names.Contains(key))
                throw node.Error($"unknown key 'models.{key}'{NameSuggestions.Hint(key, [.. names, .. ModelKeys])}; {TableKeys["models"]} (listed: {string.Join(", ", names)})");
            perModel[key] = Parameters(node, StudyHypotheses.KnownNames(WorldModels.Get(key), named), $"world model '{key}' with this observable", grouped);
            perModelNodes[key] = node;
        }

        var fluxConvention = FluxConventionSetting(modelsNode, families, root.Table("parameters"), perModelNodes);

        // [expected]
        var expected = new List<ExpectedRange>();
        if (root.Table("expected") is { } ex)
            foreach (var key in ex.Keys)
            {
                var node = ex.Get(key)!;
                if (!allKnown.Contains(key)) throw node.Error($"unknown parameter '{key}' in [expected]{NameSuggestions.Hint(key, allKnown)}; known parameters are {string.Join(", ", allKnown.Order(StringComparer.Ordinal))}");
                var r = node.AsNumbers(2, "[-1.5, -0.7]");
                if (!(r[0] < r[1])) throw node.Error($"'expected.{key}': the lower end must be below the upper end");
                expected.Add(new ExpectedRange(key, r[0], r[1]));
            }

        // [inference]
        var inf = root.Table("inference");
        int starts = inf?.Integer("starts") ?? 4, bootstrap = inf?.Integer("bootstrap") ?? 0, folds = inf?.Integer("cv_folds") ?? 0;
        int steps = inf?.Get("sampler_steps") is { Scalar: string auto } stepsNode
            ? (auto == "auto" ? 0 : throw stepsNode.Error("'inference.sampler_steps' must be \"auto\" or a whole number of steps per walker"))
            : inf?.Integer("sampler_steps") ?? 0;
        int maxSteps = inf?.Integer("sampler_max_steps") ?? Inference.Sampling.ChainMemory.DefaultMaxSteps, walkers = inf?.Integer("sampler_walkers") ?? 32;
        string samplerName = inf?.String("sampler") ?? "none";
        if (starts < 1) throw inf!.Get("starts")!.Error("'inference.starts' must be at least 1");
        if (bootstrap < 0) throw inf!.Get("bootstrap")!.Error("'inference.bootstrap' must be 0 or more");
        if (folds is < 0 or 1) throw inf!.Get("cv_folds")!.Error("'inference.cv_folds' must be 0 (none) or at least 2");
        if (samplerName is not ("none" or "mcmc")) throw inf!.Get("sampler")!.Error($"'inference.sampler' must be \"none\" or \"mcmc\"{Got(inf.Get("sampler")!, ["none", "mcmc"])}");
        if (steps is > 0 and < 100) throw inf!.Get("sampler_steps")!.Error("'inference.sampler_steps' must be \"auto\" or at least 100");
        if (maxSteps < 100) throw inf!.Get("sampler_max_steps")!.Error("'inference.sampler_max_steps' must be at least 100");
        if (walkers is < 4 or > 100_000) throw inf!.Get("sampler_walkers")!.Error("'inference.sampler_walkers' must be between 4 and 100000");

        // [power]
        string? power = null;
        if (root.Table("power") is { } pw && pw.String("results") is { } pr) power = Path.GetFullPath(pr, baseDirectory);

        // [report]
        var report = new StudyReportOptions();
        if (root.Table("report") is { } rep)
        {
            var paper = PaperSize.A4;
            if (rep.Get("paper") is { } pn && !PaperSize.TryParse(pn.Scalar as string, out paper)) throw pn.Error($"'report.paper' must be \"a4\" or \"letter\"{Got(pn, ["a4", "letter"])}");
            report = report with { Title = rep.String("title"), Paper = paper, Bins = rep.Integer("bins") ?? 8, BinResamples = rep.Integer("bin_resamples") ?? 200 };
            if (rep.Get("figure_width") is { } fw)
            {
                if (!Reporting.Figures.FigureWidth.TryParse(fw.Scalar, out var width))
                    throw fw.Error($"'report.figure_width' must be \"single-column\", \"double-column\" or a width in inches between {Reporting.Figures.FigureWidth.MinInches} and {Reporting.Figures.FigureWidth.MaxInches}{Got(fw, ["single-column", "double-column"])}");
                report = report with { FigureWidth = width };
            }
            if (report.Bins < 1) throw rep.Get("bins")!.Error("'report.bins' must be at least 1");
            if (report.BinResamples < 1) throw rep.Get("bin_resamples")!.Error("'report.bin_resamples' must be at least 1");
            var fnode = rep.Get("formats");
            if (fnode is not null)
            {
                var formats = rep.Strings("formats") ?? [];
                for (int i = 0; i < formats.Count; i++)
                    if (!StudyReportOptions.FormatNames.Contains(formats[i]))
                        throw (fnode.Items?[i] ?? fnode).Error($"unknown report format '{formats[i]}'{NameSuggestions.Hint(formats[i], StudyReportOptions.FormatNames)}; formats are {string.Join(", ", StudyReportOptions.FormatNames)}");
                report = report with
                {
                    Html = formats.Contains("html"), Pdf = formats.Contains("pdf"), FigurePng = formats.Contains("png"),
                    FigureSvg = formats.Contains("svg"), FigurePdf = formats.Contains("figure-pdf"),
                };
            }
        }

        root.RejectUnknown(table => TableKeys.TryGetValue(table, out var h) ? h : "see docs/study-file.md");

        var study = new StudyDefinition
        {
            Name = name,
            StudyFilePath = fileName,
            StudyFileText = text,
            BaseDirectory = baseDirectory,
            CataloguePath = Path.GetFullPath(catPath, baseDirectory),
            MaxOutsideSelection = maxOutside,
            Reader = reader,
            Mapping = mapping,
            Synthetic = synthetic,
            Corrections = corrections,
            Models = names,
            Nuisance = nuisance,
            Parameters = shared,
            ModelParameters = perModel,
            Expected = expected,
            Seed = seed,
            Starts = starts,
            Bootstrap = bootstrap,
            CrossValidationFolds = folds,
            Sampler = SamplerKinds.Parse(samplerName),
            SamplerSteps = steps,
            SamplerMaxSteps = maxSteps,
            SamplerWalkers = walkers,
            PowerResultPath = power,
            Survey = survey,
            Luminosity = luminosity,
            Report = report,
            FluxConvention = fluxConvention,
        };
        // Build every hypothesis now, so a setting a model cannot take is reported at parse time with its place.
        foreach (var f in families)
        {
            try
            {
                StudyHypotheses.For(f, study);
            }
            catch (Exception e) when (e is ArgumentException or InputException { SettingProblems.Count: > 0 })
            {
                var at = perModelNodes.GetValueOrDefault(f.Name) ?? root.Get("parameters") ?? modelsNode;
                // The study file has no free/prior lists: a parameter is held by a fixed value in [parameters] or [models.NAME].
                string message = e is InputException ie ? ie.Render(StudySettingKeys.Key) : e.Message;
                throw at.Error(message.Replace("remove it from free/prior", "fix it in the study file"));
            }
        }
        return study;
    }

    // models.flux_convention: the flux convention of every listed static model, as fit's --flux-convention. It sets their
    // luminosity_exponent, so a setting of that parameter as well is refused at its line.
    private static FluxConvention? FluxConventionSetting(TomlNode modelsNode, IWorldModelFamily[] families, TomlNode? shared, IReadOnlyDictionary<string, TomlNode> perModel)
    {
        if (modelsNode.Get(FluxConventions.Setting) is not { } node) return null;
        if (!FluxConventions.TryParse(node.Scalar as string, out var convention))
            throw node.Error($"'models.{FluxConventions.Setting}' must be {string.Join(" or ", FluxConventions.Names.Select(n => $"\"{n}\""))}{Got(node, [.. FluxConventions.Names])}");
        if (FluxConventions.Unused(families, "models") is { } unused) throw node.Error(unused.Render(StudySettingKeys.Key));
        string q = WorldModelParameters.Names.LuminosityExponent;
        foreach (var (table, where) in new[] { (shared, "parameters") }.Concat(perModel.Select(kv => ((TomlNode?)kv.Value, $"models.{kv.Key}"))))
            if (table?.Get(q) is { } set)
                throw set.Error($"'{where}.{q}' and 'models.{FluxConventions.Setting}' (line {node.Line}) both set the static models' luminosity exponent; keep one");
        return convention;
    }

    // [survey]: the study-file form of fit's survey options (docs/study-file.md).
    private static (SurveyRequest, LuminosityOption?, string?) Survey(TomlNode sv)
    {
        var relNode = sv.Get("size_relation");
        var relation = relNode?.Scalar switch
        {
            null or "none" => SizeRelationKind.None,
            "luminosity" => SizeRelationKind.Luminosity,
            "mass" => SizeRelationKind.Mass,
            _ => throw relNode!.Error($"'survey.size_relation' must be \"none\", \"luminosity\" or \"mass\"{Got(relNode, ["none", "luminosity", "mass"])}"),
        };
        var d = LuminosityPivot.Default;
        var pivot = new LuminosityPivot(sv.Number("pivot_abs_mag") ?? d.AbsMag, sv.Number("pivot_log_mass") ?? d.LogMass, sv.Number("pivot_log_lum") ?? d.LogRadioLuminosity);
        double[]? Pair(string key, string example)
        {
            if (sv.Get(key) is not { } node) return null;
            var r = node.AsNumbers(2, example);
            if (!(r[0] < r[1])) throw node.Error($"'survey.{key}': the first value must be below the second (e.g. {example})");
            return r;
        }
        var window = Pair("abs_mag_range", "[-23, -20]");
        var zPrior = Pair("z_prior", "[0.1, 3]");
        string? group = sv.String("group");
        if (group is { Length: 0 }) throw sv.Get("group")!.Error("'survey.group' names the column of population labels; it is empty");
        int? bins = null;
        if (sv.Get("evolution") is { } evNode && !SurveyRequest.TryParseEvolution(evNode.Scalar as string ?? "", out bins))
            throw evNode.Error($"'survey.evolution' must be \"power\" or \"binned:K\" with 2 ≤ K ≤ {SurveyRequest.MaxEvolutionBins}; got '{evNode.Scalar}'{SurveyRequest.EvolutionHint(evNode.Scalar as string ?? "")}");
        var errNode = sv.Get("size_errors");
        var errors = errNode?.Scalar switch
        {
            null or "lognormal" => SizeErrorKind.LogNormal,
            "gaussian" => SizeErrorKind.Gaussian,
            _ => throw errNode!.Error($"'survey.size_errors' must be \"lognormal\" or \"gaussian\"{Got(errNode, ["lognormal", "gaussian"])}"),
        };
        RedshiftMarginal? marginal = null;
        if (sv.Get("z_marginal") is { } zmNode && !SurveyRequest.TryParseZMarginal(zmNode.Scalar as string, out marginal))
            throw zmNode.Error($"'survey.z_marginal' must be \"quadrature\" or \"linear\"{Got(zmNode, ["quadrature", "linear"])}");
        var shapeNode = sv.Get("z_prior_shape");
        var shape = shapeNode?.Scalar switch
        {
            null or "population" => RedshiftPriorShape.Population,
            "flat" => RedshiftPriorShape.Flat,
            _ => throw shapeNode!.Error($"'survey.z_prior_shape' must be \"population\" or \"flat\"{Got(shapeNode, ["population", "flat"])}"),
        };
        int? zNodes = null;
        if (sv.Get("z_nodes") is { } znNode)
        {
            double v = sv.Number("z_nodes") ?? double.NaN;
            if (!(v == Math.Floor(v) && v >= SurveyRequest.MinRedshiftNodes && v <= SurveyRequest.MaxRedshiftNodes))
                throw znNode.Error($"'survey.z_nodes' must be a whole number of nodes, {SurveyRequest.MinRedshiftNodes}–{SurveyRequest.MaxRedshiftNodes}; got '{znNode.Scalar}'");
            zNodes = (int)v;
        }
        var request = new SurveyRequest(relation, pivot, group is not null, bins, sv.Boolean("ignore_z_err") ?? false, errors,
            window?[0], window?[1], zPrior?[0], zPrior?[1], marginal, shape, zNodes);
        if (relation == SizeRelationKind.Mass && window is not null)
            throw sv.Get("abs_mag_range")!.Error("'survey.abs_mag_range' selects on luminosity; it cannot be combined with size_relation = \"mass\"");
        double? freq = sv.Number("frequency_ghz"), alpha = sv.Number("spectral_index");
        var refNode = sv.Get("ref_cosmology");
        if (freq is { } f && !(f > 0)) throw sv.Get("frequency_ghz")!.Error("'survey.frequency_ghz' must be positive");
        if (!request.NeedsLuminosity)
        {
            foreach (var key in new[] { "frequency_ghz", "spectral_index", "ref_cosmology", "pivot_abs_mag", "pivot_log_mass", "pivot_log_lum" })
                if (sv.Get(key) is { } unusedNode)
                    throw unusedNode.Error($"'survey.{key}' needs size_relation = \"luminosity\" or \"mass\", or abs_mag_range");
            return (request, null, group);
        }
        IWorldModel? reference = null;
        if (refNode is not null)
        {
            var hr = refNode.AsNumbers(2, "[70, 0.3]");
            if (!(hr[0] > 0) || !(hr[1] >= 0)) throw refNode.Error("'survey.ref_cosmology' must be [H0, OMEGA_M] with H0 > 0 and Ωm ≥ 0, e.g. [70, 0.3]");
            reference = new LambdaCdmModel(hr[0], hr[1]);
        }
        return (request, new LuminosityOption(relation == SizeRelationKind.Mass, reference, alpha ?? 0.0, freq), group);
    }

    // A survey model with the sample-independent terms (relation, K bins on placeholder edges) for checking names at parse time.
    private static SurveyModel ProvisionalSurvey(SurveyRequest r) =>
        new(r.Relation, r.Pivot, null, r.EvolutionBins is { } k ? Enumerable.Range(0, k + 1).Select(i => (double)i).ToArray() : null,
            false, 7, r.SizeErrors, r.AbsMagMin, r.AbsMagMax, r.RedshiftPriorMin, r.RedshiftPriorMax);

    private static CatalogueFormat? Format(TomlNode cat)
    {
        var node = cat.Get("format");
        return node?.Scalar switch
        {
            null => null,
            "csv" or "text" or "tsv" or "txt" => CatalogueFormat.Text,
            "fits" => CatalogueFormat.Fits,
            "votable" or "vot" => CatalogueFormat.VoTable,
            "parquet" => CatalogueFormat.Parquet,
            _ => throw node.Error($"'catalogue.format' must be \"csv\", \"text\", \"fits\", \"votable\" or \"parquet\" (or left out to detect){Got(node, ["csv", "text", "fits", "votable", "parquet"])}"),
        };
    }

    // A parameter setting: "free", "fixed", a number (fixed there), or a table
    // { fixed = V } | { free = true, min = LO, max = HI } | { prior = [MEAN, SD], min, max }.
    private static IReadOnlyList<StudyParameter> Parameters(TomlNode table, HashSet<string> known, string what, bool grouped = false)
    {
        var list = new List<StudyParameter>();
        foreach (var key in table.Keys)
        {
            var node = table.Get(key)!;
            bool groupName = grouped && key.IndexOf('@', StringComparison.Ordinal) is > 0 and var at && at < key.Length - 1 && known.Contains(key[..at]);
            if (!known.Contains(key) && !groupName)
                throw node.Error($"unknown parameter '{key}' for {what}{NameSuggestions.Hint(key, known)}; known parameters are {string.Join(", ", known.Order(StringComparer.Ordinal))}");
            list.Add(Setting(key, node));
        }
        return list;
    }

    private static StudyParameter Setting(string name, TomlNode node)
    {
        const string Forms = "write \"free\", \"fixed\", a number (fixed at it), { fixed = V }, { free = true, min = LO, max = HI } or { prior = [MEAN, SD] }";
        if (node.Scalar is string s)
            return s switch
            {
                "free" => new StudyParameter(name, ParameterStatus.Free),
                "fixed" => new StudyParameter(name, ParameterStatus.Fixed),
                _ => throw node.Error($"'{node.Path}' = \"{s}\" is not a parameter setting; {Forms}"),
            };
        if (node.Scalar is long or double) return new StudyParameter(name, ParameterStatus.Fixed, node.AsNumber());
        if (!node.IsTable) throw node.Error($"'{node.Path}' is not a parameter setting; {Forms}");
        double? min = node.Number("min"), max = node.Number("max");
        if (min is not null && max is not null && !(min < max)) throw node.Error($"'{node.Path}': min must be below max");
        StudyParameter result;
        if (node.Get("fixed") is { } f)
        {
            result = new StudyParameter(name, ParameterStatus.Fixed, f.AsNumber());
            if (min is not null || max is not null) throw node.Error($"'{node.Path}': a fixed parameter takes no bounds");
        }
        else if (node.Get("prior") is { } p)
        {
            var ms = p.AsNumbers(2, "[0.3, 0.02]");
            if (!(ms[1] > 0)) throw p.Error($"'{p.Path}': the prior standard deviation must be positive");
            result = new StudyParameter(name, ParameterStatus.GaussianPrior, null, ms[0], ms[1], min, max);
        }
        else
        {
            if (node.Boolean("free") is false) throw node.Error($"'{node.Path}': free = false needs a value; write {{ fixed = V }}");
            result = new StudyParameter(name, ParameterStatus.Free, null, null, null, min, max);
        }
        node.RejectUnknown(_ => $"a parameter table takes fixed, free, prior, min, max; {Forms}");
        return result;
    }
}
