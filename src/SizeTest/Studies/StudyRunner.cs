using System.Diagnostics;
using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Files;
using SizeTest.Inference;
using SizeTest.Inference.Sampling;
using SizeTest.Photometry;
using SizeTest.Reporting;
using SizeTest.Reporting.Data;
using SizeTest.Reporting.Pack;
using SizeTest.Simulation;

namespace SizeTest.Studies;

/// <summary>
/// Runs a whole study: loads the catalogue, applies the photometric corrections, fits and ranks every world model,
/// optionally samples the best one, builds the report data and writes the output folder —
/// <c>results.json</c>, <c>results.csv</c>, <c>rejects.csv</c>, <c>report.html</c>, <c>report.pdf</c>,
/// <c>figures/</c>, <c>tables/</c>, <c>manifest.json</c> and <c>report-data.json</c> — through a staging folder that is
/// swapped in only when complete (a failure leaves any previous output untouched).
/// </summary>
public static class StudyRunner
{
    /// <summary>Runs <paramref name="study"/> with <paramref name="options"/>.</summary>
    /// <exception cref="InputException">Bad input (catalogue, corrections, settings) or an existing output folder without force.</exception>
    public static StudyRunOutcome Run(StudyDefinition study, StudyRunOptions options)
    {
        ArgumentNullException.ThrowIfNull(study);
        ArgumentNullException.ThrowIfNull(options);
        var wd = Path.GetFullPath(options.WorkingDirectory ?? Directory.GetCurrentDirectory());
        var started = DateTimeOffset.UtcNow;
        var timings = new List<StageTiming>();
        var clock = Stopwatch.StartNew();
        void Stage(string name) { timings.Add(new StageTiming(name, clock.Elapsed.TotalSeconds)); clock.Restart(); }
        string Rel(string p) => Path.GetRelativePath(wd, Path.GetFullPath(p, wd)).Replace('\\', '/');

        // Refuse settings whose memory the machine does not have, before anything is allocated.
        FitMemoryBudget.Check(StudyHypotheses.Build(study), study.Sampler, study.SamplerWalkers,
            study.SamplerSteps > 0 ? study.SamplerSteps : study.SamplerMaxSteps, 0, study.Bootstrap, study.Starts, options.MaxMemoryBytes);

        // Refuse an existing output before any work.
        var knownInputs = new List<string> { study.CataloguePath };
        if (study.StudyFilePath.Length > 0) knownInputs.Add(Path.GetFullPath(study.StudyFilePath, wd));
        if (study.PowerResultPath is { } powerInput) knownInputs.Add(powerInput);
        var folder = OutputFolder.Begin(options.OutputDirectory, options.Force, knownInputs);
        try
        {
            var inputs = new List<string>();
            if (study.StudyFilePath.Length > 0) inputs.Add(Path.GetFullPath(study.StudyFilePath, wd));

            options.Log?.Invoke($"loading catalogue {Rel(study.CataloguePath)}");
            if (!File.Exists(study.CataloguePath))
                throw new InputException("catalogue file not found; check catalogue.path (it is relative to the study file)", Rel(study.CataloguePath));
            var load = CatalogueLoader.Load(study.CataloguePath, new CatalogueLoadOptions { Reader = study.Reader, Mapping = study.Mapping });
            inputs.Add(study.CataloguePath);
            options.Log?.Invoke($"{load.RowsRead} rows read, {load.Accepted} accepted, {load.Rejected} rejected");
            foreach (var w in load.Mapping.Warnings) options.Log?.Invoke("warning: " + StudySettingKeys.Text(w));
            foreach (var p in load.PopulationLabels) options.Log?.Invoke("note: " + StudySettingKeys.Text(p.Note));
            NoAcceptedRows.ThrowIfEmpty(load, Rel(study.CataloguePath));
            Stage("load");

            string ReadTable(string path)
            {
                var full = Path.GetFullPath(path, study.BaseDirectory);
                folder.AddInput(full);
                var text = PhotometryFiles.ReadText(full);
                inputs.Add(full);
                return text;
            }
            var photometryOptions = PhotometryOptionParser.Parse(study.Corrections, ReadTable);
            if (study.Luminosity is not null) photometryOptions = photometryOptions with { Luminosity = study.Luminosity };
            var photometry = ObservablesBuilder.Build(load.Rows, photometryOptions);
            Stage("photometry");

            var selected = SelectionConsistency.Apply(load, photometry.Observables, study.Nuisance, study.MaxOutsideSelection, study.Survey);
            foreach (var w in selected.Warnings) options.Log?.Invoke("warning: " + w);
            load = selected.Load;
            var hypotheses = StudyHypotheses.Build(study);
            Inference.Survey.SurveyBinding? survey = null;
            if (study.Survey is { } surveyRequest)
            {
                // The survey terms need the loaded sample (group labels, bin edges, z_err): rebuild the hypotheses with them.
                survey = Inference.Survey.SurveyBinding.Bind(surveyRequest, true, selected.Observables, study.Nuisance, hypotheses,
                    nm => StudyHypotheses.BuildChecked(study with { Nuisance = nm }));
                hypotheses = survey.Hypotheses;
                foreach (var note in survey.Notes) options.Log?.Invoke("survey: " + StudySettingKeys.Text(note));
            }
            options.Log?.Invoke($"fitting {string.Join(", ", study.Models)} ({study.Nuisance.Observable.Name()} observable)");
            var observables = selected.Observables;
            int folds = study.CrossValidationFolds > observables.Count ? 0 : study.CrossValidationFolds;
            var result = FitRun.Run(new FitRequest
            {
                Hypotheses = hypotheses,
                Observables = observables,
                Backend = Inference.Evaluation.EvaluationBackend.InProcess(observables, load.Rows.SourceRows),
                Source = Rel(study.CataloguePath),
                RowsRead = load.RowsRead,
                Rejected = load.Rejected,
                Seed = study.Seed,
                Starts = study.Starts,
                Bootstrap = study.Bootstrap,
                CrossValidationFolds = folds,
                Expected = study.Expected,
                Sampler = study.Sampler,
                Walkers = study.SamplerWalkers,
                Steps = study.SamplerSteps,
                MaxSteps = study.SamplerMaxSteps,
                ChainStoreFactory = study.Sampler == SamplerKind.Mcmc ? label => new CsvChainStore(folder.PathOf($"chains_{label}.csv")) : null,
            }, options.FitProgress);
            if (survey is not null) result = result with { Notes = [.. survey.Notes.Select(n => "survey: " + n), .. result.Notes] };
            result = result with { Notes = result.Notes.Select(StudySettingKeys.Text).ToArray() }; // settings as study-file keys
            Stage("fit");
            IReadOnlyDictionary<string, ModelFitSummary> powerLaws = new Dictionary<string, ModelFitSummary>();
            if (hypotheses.Any(h => h.Nuisance.SurveyTerms.Binned))
            {
                // The binned-evolution figure draws each model's power law over its bins: the same model refitted with R0 (1+z)^a.
                options.Log?.Invoke("fitting each model's power-law counterpart for the binned-evolution figure");
                powerLaws = BinnedEvolutionReport.FitPowerLaws(hypotheses, observables, new OptimizerSettings(Starts: study.Starts, Seed: study.Seed));
                result = result with { Notes = [.. result.Notes, BinnedEvolutionReport.Note(hypotheses, powerLaws)] };
                Stage("power-law counterparts");
            }

            // Every model was sampled once inside the fit; the best-ranked model's chain is the one plotted.
            var posterior = result.Models.Count > 0 ? Plotted(result, result.Models[0].Name, hypotheses) : null;

            PowerResult? power = null;
            if (study.PowerResultPath is { } pp)
            {
                if (!File.Exists(pp)) throw new InputException("power result file not found; check power.results (relative to the study file)", Rel(pp));
                try
                {
                    power = PowerResultFiles.ReadJson(File.ReadAllText(pp));
                }
                catch (System.Text.Json.JsonException e)
                {
                    throw new InputException($"not a power.json written by 'sizetest power' ({e.Message.Split(". Path:")[0]})", Rel(pp), (e.LineNumber ?? 0) + 1, inner: e);
                }
                inputs.Add(pp);
            }

            var manifest = new RunManifest
            {
                SizeTestVersion = options.Version,
                GitCommit = options.GitCommit,
                Command = options.Command,
                Seed = study.Seed,
                StudyFilePath = study.StudyFilePath.Length > 0 ? Rel(study.StudyFilePath) : "",
                StudyFileText = study.StudyFileText,
                Inputs = RunManifest.DescribeInputs(inputs, wd),
            };
            var adapterInputs = new StudyReportAdapter.Inputs(study, load, photometry.Corrections, hypotheses) { Observables = observables, PowerLawFits = powerLaws };
            var data = StudyReportAdapter.Build(result, adapterInputs, options.Version, options.GitCommit, Rel(study.CataloguePath), posterior, power, manifest);
            Stage("report data");

            options.Log?.Invoke("writing the report");
            var files = new List<string>(StudyOutputFiles.Write(folder, result, load.RejectLog.ToCsv()));
            files.AddRange(result.Chains.Select(c => $"chains_{c.Model}.csv"));
            var packOptions = new ReportPackOptions
            {
                Html = study.Report.Html, PdfReport = study.Report.Pdf, Png = study.Report.FigurePng,
                Svg = study.Report.FigureSvg, Pdf = study.Report.FigurePdf, Paper = study.Report.Paper,
                FigureWidth = study.Report.FigureWidth,
            };
            // The manifest is written last with the timings of every stage, so write the report with them filled in.
            Stage("write results");
            var finalManifest = manifest with { Volatile = new RunTimings(started, DateTimeOffset.UtcNow, timings.ToArray()) };
            data = data with { Manifest = finalManifest };
            files.AddRange(new ReportPackWriter(packOptions).WriteInto(folder.Staging, ReportContent.From(data)));
            options.BeforeCommit?.Invoke(folder.Staging);
            folder.Commit();
            files.Sort(StringComparer.Ordinal);
            options.Log?.Invoke($"wrote {files.Count} files to {Rel(folder.Target)}");
            return new StudyRunOutcome(result, data, folder.Target, files);
        }
        catch (Exception e)
        {
            folder.Abandon();
            // An inner stage names its settings ({kcorr}, {hdu}, …): a study author wrote keys, not flags.
            if (StudySettingKeys.Respelled(e) is { } respelled && !ReferenceEquals(respelled, e)) throw respelled;
            throw;
        }
    }

    // The kept MCMC draws of one model (θ columns of PosteriorDraws.Rows), as the report's corner plot takes them.
    internal static CornerDraws? Plotted(FitResult result, string model, IReadOnlyList<Hypothesis> hypotheses)
    {
        var draws = result.Samples.FirstOrDefault(x => x.Model == model && x.Sampler == SamplerKind.Mcmc);
        var h = hypotheses.FirstOrDefault(x => x.Label == model);
        if (draws is null || h is null || draws.Rows.Count == 0) return null;
        int d = draws.ParameterNames.Count;
        return new CornerDraws(model, draws.ParameterNames,
            h.FreeParameters.Select(p => p.Spec.Unit.Length == 0 ? "dimensionless" : p.Spec.Unit).ToArray(),
            draws.Rows.Select(r => r[..d]).ToArray());
    }
}
