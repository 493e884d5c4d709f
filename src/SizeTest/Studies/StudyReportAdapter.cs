using System.Globalization;
using SizeTest.Catalogues;
using SizeTest.Cosmology;
using SizeTest.Inference;
using SizeTest.Reporting.Data;
using SizeTest.Reporting.Pack;
using SizeTest.Simulation;

namespace SizeTest.Studies;

/// <summary>
/// Fills <see cref="ReportData"/> from a study's results: the sample points, per model the best-fit curves with and
/// without evolution (evaluated from the fitted parameters — prediction, not refitting), binned medians and means with
/// bootstrap errors, required evolution, reject reasons, posterior samples and a power curve when present, and the
/// assumptions every conclusion rests on.
/// </summary>
public static class StudyReportAdapter
{
    private static readonly CultureInfo Inv = CultureInfo.InvariantCulture;

    /// <summary>Everything the adapter reads besides the study result.</summary>
    /// <param name="Study">The study definition (settings and report options).</param>
    /// <param name="Load">The catalogue load (sample, reject log, mapping).</param>
    /// <param name="CorrectionLines">The photometry corrections applied, in words (<c>PhotometryResult.Corrections</c>).</param>
    /// <param name="Hypotheses">The hypotheses fitted (for parameter statuses and priors).</param>
    public sealed record Inputs(StudyDefinition Study, CatalogueLoad Load, IReadOnlyList<string> CorrectionLines, IReadOnlyList<Hypothesis> Hypotheses)
    {
        /// <summary>The fitted objects (needed for the binned-evolution figure's bin positions), or null.</summary>
        public Photometry.Observables? Observables { get; init; }

        /// <summary>With binned evolution: each model's power-law counterpart fit, by model label (<see cref="BinnedEvolutionReport.FitPowerLaws"/>).</summary>
        public IReadOnlyDictionary<string, ModelFitSummary> PowerLawFits { get; init; } = new Dictionary<string, ModelFitSummary>();
    }

    /// <summary>Builds the report data; <paramref name="posterior"/>, <paramref name="power"/> and <paramref name="manifest"/> may be null.</summary>
    public static ReportData Build(FitResult result, Inputs inputs, string version, string gitCommit, string catalogueLabel,
        CornerDraws? posterior = null, PowerResult? power = null, RunManifest? manifest = null)
    {
        ArgumentNullException.ThrowIfNull(result);
        ArgumentNullException.ThrowIfNull(inputs);
        var study = inputs.Study;
        var sample = inputs.Load.Rows;
        var points = ObjectPoints.FromRows(sample);
        double zMin = sample.Count > 0 ? sample.Z.Min() : 0.01, zMax = sample.Count > 0 ? sample.Z.Max() : 3;
        if (!(zMax > zMin)) { zMin = Math.Max(1e-3, 0.5 * zMin); zMax = Math.Max(2 * zMax, zMin * 2); }

        var models = new List<ModelReport>();
        foreach (var fit in result.Models)
        {
            var report = new ModelReport(fit)
            {
                RequiredEvolution = result.RequiredEvolution.Where(r => r.Model == fit.Name && !r.Fixed)
                    .Select(r => new EvolutionRequirement(r.Parameter, Describe(r.Parameter), r.Value, r.Lo, r.Hi)).ToArray(),
            };
            if (WorldModels.TryGet(fit.Name, out var family)) report = WithCurves(report, family, fit, study.Nuisance, zMin, zMax, result.Settings.Selection.SbLimit, MedianMuError(points));
            if (inputs.Observables is { } obs && inputs.Hypotheses.FirstOrDefault(h => h.Label == fit.Name) is { } hyp && hyp.Nuisance.SurveyTerms.Binned)
                report = report with
                {
                    BinnedEvolution = BinnedEvolutionReport.For(hyp, fit, obs, inputs.PowerLawFits.GetValueOrDefault(fit.Name)),
                    BinnedSurfaceBrightness = BinnedEvolutionReport.SurfaceBrightnessFor(hyp, fit, obs, inputs.PowerLawFits.GetValueOrDefault(fit.Name)),
                };
            models.Add(report);
        }

        var reasons = inputs.Load.RejectLog.CountsByReason()
            .Select(c => new RejectReasonCount(c.Reason.Code(), c.Count))
            .OrderByDescending(c => c.Count).ThenBy(c => c.Reason, StringComparer.Ordinal).ToArray();
        var data = new ReportData
        {
            Job = new JobSummary(study.Report.Title ?? study.Name, study.StudyFilePath.Replace('\\', '/'), catalogueLabel, version, gitCommit, study.Seed, study.Synthetic)
            {
                Method = Method(study, result),
            },
            Data = new DataSummary(result.RowsRead, result.Accepted, result.Rejected, reasons)
            {
                CompactRadioSources = result.Settings.CompactRadioSources,
                SizeDefinition = result.Settings.CompactRadioSources ? RadioSizeWords
                    : SizeDefinitions.Format(sample.SizeDefinition) switch
                    {
                        "effective" => "effective (half-light) radius",
                        var s => s,
                    },
                Band = sample.Band is { Length: > 0 } b ? string.Join(", ", b.Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal).Take(6)) : "",
            },
            Objects = points,
            Models = models,
            Assumptions = Assumptions(result, inputs),
            SurfaceBrightnessZeroPoint = models.Select(m => m.Fit.Parameters.FirstOrDefault(p => p.Name == NuisanceParameters.Names.Mu0)?.Value).FirstOrDefault(v => v is not null),
            Posterior = posterior,
            Power = power is null ? null : PowerReport.From(power, result.Models.Count > 0 ? result.Models.Max(m => m.N) : (int)result.Accepted, result.Models.Select(m => m.Name).ToArray()),
            // Caveats only: the evolution statements come from the one table of tests (EvolutionTests), the verdict from results.
            ExtraConclusions = result.BayesFactors.Select(bf => string.Create(Inv, $"ln B({WorldModelDisplayNames.For(bf.Favoured)} : {WorldModelDisplayNames.For(bf.Against)}) = {bf.LnB:0.0}{(bf.BicApproximate ? " (BIC approximation)" : "")}: {bf.Strength}."))
                .Concat(result.Notes).ToArray(),
            Verdict = result.Verdict,
            EvolutionTests = Inference.Comparison.EvolutionTestTable.From(result),
            DecisionLines = Inference.Comparison.DecisionSummary.CanTheDataDecide(result),
            SurfaceBrightnessLimit = result.Settings.Selection.SbLimit,
            Bootstrap = result.Bootstrap,
            CrossValidation = result.CrossValidation,
            CrossValidationDifferences = result.CrossValidationDifferences,
            Manifest = manifest,
        };
        return data.WithBins(study.Report.Bins, study.Report.BinResamples, study.Seed);
    }

    /// <summary>The size definition of a compact-radio-source sample (it carries radio flux densities).</summary>
    public const string RadioSizeWords = "angular size of the compact radio structure (core), modelled as a linear size ℓ in pc";

    private static string Describe(string parameter) => (Inference.Comparison.EvolutionTestTable.BaseName(parameter) switch
    {
        NuisanceParameters.Names.SizeEvolution => "size evolution a, R ∝ (1+z)^a",
        NuisanceParameters.Names.SbEvolution => "surface-brightness evolution b, Δμ = −2.5 b log10(1+z)",
        _ => parameter,
    }) + (Inference.Comparison.EvolutionTestTable.GroupOf(parameter) is { } g ? $", group {g}" : "");

    private static string Method(StudyDefinition s, FitResult result)
    {
        // The interval methods actually used (interval_method of every free parameter), e.g. "Hessian and profile-likelihood".
        var used = result.Models.SelectMany(m => m.Parameters).Where(p => !p.Fixed).Select(p => p.IntervalMethod).Distinct().ToList();
        var words = new[] { IntervalMethods.Hessian, IntervalMethods.Profile, IntervalMethods.Posterior, IntervalMethods.Bootstrap }
            .Where(used.Contains).Select(IntervalMethods.Words).ToList();
        string intervals = words.Count == 0 ? "no free parameters"
            : (words.Count == 1 ? words[0] : string.Join(", ", words.Take(words.Count - 1)) + " or " + words[^1]) + " 68% intervals"
              + (words.Count > 1 ? " (each parameter's method in the parameter table and results.json)" : "");
        var parts = new List<string> { $"maximum likelihood ({s.Starts} optimiser start{(s.Starts == 1 ? "" : "s")} per model, {intervals})" };
        if (s.Bootstrap > 0) parts.Add($"{s.Bootstrap} bootstrap resamples per model");
        if (s.CrossValidationFolds > 0) parts.Add($"{s.CrossValidationFolds}-fold cross-validation");
        if (s.Sampler == SamplerKind.Mcmc) parts.Add($"affine-invariant ensemble sampling of the best model ({s.SamplerSteps} steps)");
        parts.Add("models ranked by BIC");
        return string.Join("; ", parts);
    }

    /// <summary>
    /// The fitted model's predictions: θ(z) = R0 (1+z)^a / D_A(z) in arcsec (small-angle, θ = ℓ/D_A) and
    /// μ(z) = μ0 + 2.5 (n − b) log10(1+z) [+ κ (log10 R(z) − log10 R_pivot) with a size–SB relation], n the model's
    /// bolometric dimming exponent plus the study's offset (Tolman 1930) — the mean relations of the likelihood
    /// without the per-object K-corrections. "Without evolution" sets a = 0 and b = 0, keeping R0 and μ0.
    /// </summary>
    private static double MedianMuError(ObjectPoints points)
    {
        var e = points.MuErr?.Where(double.IsFinite).Order().ToArray() ?? [];
        return e.Length == 0 ? 0 : e[e.Length / 2];
    }

    /// <summary>
    /// Expected mean surface brightness of the objects that pass μ &lt; μ_lim when μ at redshift z is Gaussian with
    /// mean m(z) and standard deviation s (intrinsic scatter_mag and the median measurement error in quadrature, as the
    /// cut applies to observed μ). Derivation: for X ~ N(m, s²), E[X | X &lt; L] = m + s E[Z | Z &lt; α] with
    /// α = (L − m)/s and Z standard normal; ∫_{−∞}^{α} z φ(z) dz = −φ(α), so E[Z | Z &lt; α] = −φ(α)/Φ(α) and
    /// E[X | X &lt; L] = m − s φ(α)/Φ(α) (the mean of a truncated normal; Johnson, Kotz &amp; Balakrishnan 1994, §10.1,
    /// from memory). The θ &gt; θ_min cut is independent of μ without the size–SB relation and is not included.
    /// </summary>
    internal static double TruncatedMean(double m, double s, double limit)
    {
        if (!(s > 0)) return m < limit ? m : double.NaN;
        double alpha = (limit - m) / s;
        double cdf = MathNet.Numerics.Distributions.Normal.CDF(0, 1, alpha);
        if (cdf < 1e-12) return double.NaN; // (almost) nothing passes: no mean to draw
        return m - s * MathNet.Numerics.Distributions.Normal.PDF(0, 1, alpha) / cdf;
    }

    private static ModelReport WithCurves(ModelReport report, IWorldModelFamily family, ModelFitSummary fit, NuisanceModel nuisance, double zMin, double zMax,
        double? sbLimit, double muErr)
    {
        var values = fit.Parameters.ToDictionary(p => p.Name, p => p.Value, StringComparer.Ordinal);
        var cosmo = family.Parameters.Where(p => values.ContainsKey(p.Name) && double.IsFinite(values[p.Name]))
            .ToDictionary(p => p.Name, p => values[p.Name], StringComparer.Ordinal);
        if (!family.TryCreate(cosmo, out var model, out _)) return report;
        double Get(string n, double fallback) => values.TryGetValue(n, out var v) && double.IsFinite(v) ? v : fallback;
        // Static models are not defined at z = 0; start at the sample's smallest redshift.
        double lo = Math.Max(zMin, 1e-4);
        if (values.ContainsKey(NuisanceParameters.Names.R0Kpc))
        {
            double r0 = Get(NuisanceParameters.Names.R0Kpc, 5), a = Get(NuisanceParameters.Names.SizeEvolution, 0);
            report = report with
            {
                Theta = Curve.Sample(z => model.AngularSizeArcsec(z, r0 * Math.Pow(1 + z, a)), lo, zMax),
                ThetaNoEvolution = a == 0 ? null : Curve.Sample(z => model.AngularSizeArcsec(z, r0), lo, zMax),
            };
        }
        if (values.ContainsKey(NuisanceParameters.Names.Mu0))
        {
            double mu0 = Get(NuisanceParameters.Names.Mu0, 21), b = Get(NuisanceParameters.Names.SbEvolution, 0), kappa = Get(NuisanceParameters.Names.KormendySlope, 0);
            double n = model.BolometricDimmingExponent + nuisance.DimmingExponentOffset;
            double r0 = Get(NuisanceParameters.Names.R0Kpc, nuisance.PivotSizeKpc), a = Get(NuisanceParameters.Names.SizeEvolution, 0);
            bool relation = nuisance.SizeSbRelation && values.ContainsKey(NuisanceParameters.Names.KormendySlope);
            double Mu(double z, double bb, double aa) =>
                mu0 + 2.5 * (n - bb) * Math.Log10(1 + z)
                + (relation ? kappa * (Math.Log10(r0 * Math.Pow(1 + z, aa)) - Math.Log10(nuisance.PivotSizeKpc)) : 0);
            report = report with
            {
                Mu = Curve.Sample(z => Mu(z, b, a), lo, zMax),
                MuNoEvolution = b == 0 && (!relation || a == 0) ? null : Curve.Sample(z => Mu(z, 0, 0), lo, zMax),
            };
            if (sbLimit is { } lim)
            {
                // With the size–SB relation μ also scatters with log size: add (κ σ_dex)² (Gaussian in log R).
                double sd = Math.Sqrt(Math.Pow(Get(NuisanceParameters.Names.ScatterMag, 0), 2) + muErr * muErr + (relation ? Math.Pow(kappa * Get(NuisanceParameters.Names.ScatterDex, 0), 2) : 0));
                report = report with { MuSelected = Curve.Sample(z => TruncatedMean(Mu(z, b, a), sd, lim), lo, zMax) };
            }
        }
        return report;
    }

    private static IReadOnlyList<Assumption> Assumptions(FitResult result, Inputs inputs)
    {
        var study = inputs.Study;
        var list = new List<Assumption>();
        foreach (var h in inputs.Hypotheses)
        {
            var cosmo = h.Parameters.Where(p => h.Family.Parameters.Any(s => s.Name == p.Name)).ToArray();
            string Words(ParameterSetting p) => p.Status switch
            {
                ParameterStatus.Fixed => double.IsNaN(p.Value) ? $"{p.Name} derived" : string.Create(Inv, $"{p.Name} = {p.Value:0.####} fixed"),
                ParameterStatus.GaussianPrior => string.Create(Inv, $"{p.Name} free with a Gaussian prior N({p.PriorMean:0.####}, {p.PriorSd:0.####}) within [{p.Min:0.###}, {p.Max:0.###}]"),
                _ => string.Create(Inv, $"{p.Name} free in [{p.Min:0.###}, {p.Max:0.###}]"),
            };
            list.Add(new Assumption("cosmology priors",
                $"{h.Label} ({h.Family.Description}): {(cosmo.Length == 0 ? "no cosmological parameters" : string.Join("; ", cosmo.Select(Words)))}."));
        }
        // Each static model's flux convention (D_L = d (1+z)^q), which sets its luminosities and its default dimming.
        var conventions = result.Models.Where(m => m.FluxConvention is not null).Select(m =>
        {
            var q = m.Parameters.FirstOrDefault(p => p.Name == WorldModelParameters.Names.LuminosityExponent);
            var n = m.Parameters.FirstOrDefault(p => p.Name == WorldModelParameters.Names.DimmingExponent);
            return $"{WorldModelDisplayNames.For(m.Name)} ({m.Name}): " + (q is null ? m.FluxConvention : FluxConventions.Words(q.Value, !q.Fixed))
                   + (n is { Fixed: true } ? string.Create(Inv, $", bolometric SB dimming (1+z)^−{n.Value:0.###}") : "");
        }).ToArray();
        if (conventions.Length > 0)
            list.Add(new Assumption("flux convention", "static models' luminosity distance: " + string.Join("; ", conventions) + "."));
        var ev = new List<string>();
        var sv = result.Settings.Survey;
        string relation = sv?.SizeRelation switch { "luminosity" => " (L/L_pivot)^β", "mass" => " (M*/M_pivot)^β", _ => "" };
        string relationWords = sv?.SizeRelation switch
        {
            "luminosity" => string.Create(Inv, $", L from each world model's own D_L (pivot M = {sv.PivotAbsMag:0.##})"),
            "mass" => string.Create(Inv, $", M* scaled to each world model by (D_L/D_L,ref)² (pivot log10 M* = {sv.PivotLogMass:0.##})"),
            _ => "",
        };
        bool binned = sv?.EvolutionBinEdges is not null;
        bool radio = result.Settings.CompactRadioSources;
        if (radio && study.Nuisance.Observable == ObservableKind.Size)
            ev.Add((binned ? $"linear sizes follow ℓ = ℓ_m,k{relation} with one ℓ_m per redshift bin ({sv!.EvolutionBinEdges!.Count - 1} bins) instead of a power law"
                           : $"linear sizes of the compact radio structure follow ℓ(z) = ℓ_m{relation} (1+z)^n (Gurvits, Kellermann & Frey 1999; ℓ_m is r0_kpc, shown in pc, and n is size_evolution)")
                   + relationWords + ", with log-normal intrinsic scatter (scatter_dex)");
        else if (study.Nuisance.Observable != ObservableKind.SurfaceBrightness)
            ev.Add((binned ? $"physical sizes follow R = R0,k{relation} with one R0 per redshift bin ({sv!.EvolutionBinEdges!.Count - 1} bins) instead of a power law"
                           : $"physical sizes follow R(z) = R0{relation} (1+z)^a") + relationWords + ", with log-normal intrinsic scatter (scatter_dex)");
        if (study.Nuisance.Observable != ObservableKind.Size)
            ev.Add((binned ? "surface brightness follows μ = μ0,k + 2.5 n log10(1+z) (one μ0 per redshift bin)" : "surface brightness follows μ = μ0 + 2.5 (n − b) log10(1+z)") +
                   (study.Nuisance.Observable == ObservableKind.Joint && relation.Length > 0 ? " − 2.5 γ log10(L/L_pivot) (γ = sb_luminosity_slope: μ conditional on the luminosity too)" : "") +
                   " with Gaussian intrinsic scatter (scatter_mag); n is the model's bolometric dimming exponent (4 for FLRW, Tolman 1930)" +
                   (study.Nuisance.DimmingExponentOffset != 0 ? string.Create(Inv, $" plus an offset of {study.Nuisance.DimmingExponentOffset:0.##} for the band convention") : ""));
        if (sv?.Groups is { Count: > 0 } groups)
            ev.Add($"each population of the group column ({string.Join(", ", groups)}) has its own " + study.Nuisance.Observable switch
            {
                ObservableKind.Size => binned ? "R0 per bin and scatter_dex" : "R0, a and scatter_dex",
                ObservableKind.SurfaceBrightness => binned ? "μ0 per bin and scatter_mag" : "μ0, b and scatter_mag",
                _ => binned ? "R0 and μ0 per bin, scatter_dex and scatter_mag" : "R0, a, scatter_dex, μ0, b and scatter_mag",
            } + (relation.Length > 0 ? " and β" : "") + "; the world model is shared");
        if (sv?.SizeErrors == "gaussian") ev.Add("size errors are Gaussian in θ as quoted (integrated exactly)");
        if (study.Nuisance.SizeSbRelation)
            ev.Add(string.Create(Inv, $"μ is linked to log10 physical size by a free Kormendy-type slope at pivot {study.Nuisance.PivotSizeKpc:0.##} kpc"));
        var fixedEvolution = inputs.Hypotheses.SelectMany(h => h.Parameters.Where(p => p.Name is NuisanceParameters.Names.SizeEvolution or NuisanceParameters.Names.SbEvolution && !p.IsFree)
            .Select(p => string.Create(Inv, $"{h.Label}: {p.Name} fixed at {p.Value:0.###}"))).ToArray();
        if (fixedEvolution.Length > 0) ev.Add("held fixed: " + string.Join(", ", fixedEvolution));
        list.Add(new Assumption("evolution form", string.Join("; ", ev) + "."));
        var cuts = result.Settings.Selection;
        var cutWords = new List<string>();
        if (cuts.SbLimit is { } sb) cutWords.Add(string.Create(Inv, $"μ < {sb:0.##} mag/arcsec²"));
        if (cuts.MagLimit is { } m) cutWords.Add(string.Create(Inv, $"m < {m:0.##} mag"));
        if (cuts.MinThetaArcsec is { } t) cutWords.Add(string.Create(Inv, $"θ > {t:0.###} arcsec"));
        // A size or joint fit with the size–luminosity relation conditions on the magnitudes a magnitude limit selects on: not a truncation there.
        bool magConditioned = cuts.MagLimit is not null && study.Nuisance.Observable != ObservableKind.SurfaceBrightness && sv?.SizeRelation == "luminosity";
        if (magConditioned) cutWords.RemoveAll(w => w.StartsWith("m <", StringComparison.Ordinal));
        string window = sv is { AbsMagMin: not null } or { AbsMagMax: not null }
            ? string.Create(Inv, $" Only objects with {(sv.AbsMagMin is { } lo ? $"{lo:0.##} ≤ " : "")}M{(sv.AbsMagMax is { } hi ? $" ≤ {hi:0.##}" : "")} are fitted, recomputed for each world model.") : "";
        list.Add(new Assumption("selection model", (cutWords.Count == 0
            ? magConditioned ? "no truncation is modelled." : "no selection cuts are modelled: the sample is taken to be complete in size and surface brightness at every redshift."
            : $"the likelihood is truncated at {string.Join(" and ", cutWords)} (each object's density renormalised by the probability of passing the cuts at its redshift).")
            + (magConditioned ? string.Create(Inv, $" The magnitude limit m < {cuts.MagLimit:0.##} selects on the magnitudes the luminosities come from; the likelihood is conditional on them, so the limit is not a truncation.") : "")
            + window));
        if (sv is { PhotometricRedshifts: true })
            list.Add(new Assumption("redshifts", string.Create(Inv,
                $"photometric: each object is integrated over its redshift, N(z_obs, z_err²) times a {(sv.RedshiftPriorShape == "population" ? "prior deconvolved from the sample's own redshift distribution" : "flat prior")} on {(sv.RedshiftPriorMin is { } a ? $"{a:0.###}" : "the sample's lowest z")} – {(sv.RedshiftPriorMax is { } b ? $"{b:0.###}" : "its highest z")}, by {(sv.ZMarginal == "linear" ? "the linearised (effective-variance) marginal" : $"Gauss–Hermite quadrature with {sv.RedshiftNodes} nodes")}; K-corrections stay at the catalogue's values.")
                + (sv.RedshiftPopulation is { Converged: false } pp ? string.Create(Inv, $" The deconvolved prior's EM iteration did not converge (stopped at {pp.EmSteps} steps, last weight change {pp.FinalChange:G3}): its weights are the last iterate.") : "")));
        list.Add(new Assumption("K-corrections", inputs.CorrectionLines.Count == 0
            ? "no photometric corrections were applied (magnitudes and surface brightnesses as catalogued)."
            : string.Join(" ", inputs.CorrectionLines.Select(l => l.TrimEnd('.') + "."))));
        if (inputs.Load.Mapping.Warnings.Count > 0)
            list.Add(new Assumption("units", string.Join(" ", inputs.Load.Mapping.Warnings.Select(w => StudySettingKeys.Text(w).TrimEnd('.') + "."))));
        list.Add(new Assumption("size definition", (radio
            ? "angular sizes are those of the compact radio structure (core) as catalogued, not galaxy effective radii; the model's size is its linear size ℓ in pc"
            : $"angular sizes are {SizeDefinitions.Format(inputs.Load.Rows.SizeDefinition)} sizes as catalogued") + $"; the mapping used: {string.Join("; ", inputs.Load.DetectionReport.Take(6).Select(StudySettingKeys.Text))}."));
        // Console text pads its columns ("theta     ← theta"); an assumption is prose: one space between words.
        return list.Select(a => a with { Statement = Foundation.Text.ProseText.Collapse(a.Statement) }).ToList();
    }
}
