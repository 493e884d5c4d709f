using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Files;
using SizeTest.Foundation.Text;
using SizeTest.Distributed;
using SizeTest.Inference;
using SizeTest.Inference.Survey;
using SizeTest.Inference.Evaluation;
using SizeTest.Photometry;
using SizeTest.Studies;
using SizeTest.Foundation.Profiling;

namespace SizeTest.Cli;

/// <summary>What <c>sizetest fit</c> parsed.</summary>
internal sealed record FitArgs(
    string CataloguePath, CatalogueLoadOptions LoadOptions, string OutputPath, bool Force, string? Format,
    IReadOnlyList<Hypothesis> Hypotheses, int Seed, int Starts, int Bootstrap, int CrossValidationFolds, string? ProfileParameter,
    IReadOnlyList<ExpectedRange> Expected, SamplerKind Sampler, int Walkers, int Steps, int MaxSteps, int LivePoints, PhotometryOptions Photometry)
{
    /// <summary>--cv-folds was given on the command line (then above the sample size it is refused, not capped).</summary>
    public bool CvFoldsExplicit { get; init; }
    /// <summary>Every file the run reads (catalogue, photometry files): an output folder holding one is refused.</summary>
    public IReadOnlyList<string> Inputs { get; init; } = [];
    /// <summary>Largest fraction of objects outside the stated cuts (--max-outside-selection); see <see cref="SelectionConsistency"/>.</summary>
    public double MaxOutsideSelection { get; init; } = SelectionConsistency.DefaultMaxOutsideFraction;
    /// <summary>Survey terms: rebuilds the hypotheses for the loaded sample (group labels, redshift bins, z_err) — this process's
    /// objects and, under MPI, the whole sample's redshift range and counts against a stated --z-prior — or null.</summary>
    public Func<Observables, RedshiftGridSpan?, RedshiftPriorCoverage?, SurveyBinding>? Survey { get; init; }
    /// <summary>The survey request behind <see cref="Survey"/> (its stated photo-z prior is a selection cut for exact redshifts), or null.</summary>
    public SurveyRequest? SurveyTerms { get; init; }
}


/// <summary>
/// <c>sizetest fit …</c> as one process or as <c>mpirun -np N sizetest fit …</c>, on one code path: every process loads
/// its share of the catalogue (<see cref="CatalogueShare"/>; one process: all of it), the processes run
/// <see cref="FitRun"/> together on one <see cref="EvaluationBackend"/> (threads over chunks of rows, or ranks), and
/// rank 0 alone writes the output folder through <see cref="StudyOutputFiles"/> (the writer <c>sizetest run</c> uses)
/// and prints. A failure before the fit (output folder, catalogue) is agreed between the ranks so all exit with the same
/// code and one rank prints it; a failure during the fit aborts all ranks.
/// </summary>
internal static class FitRunner
{
    public static int Run(CliContext context, FitArgs a)
    {
        var timings = StageTimings.Requested ? new StageTimings() : null;
        var ranks = RankContext.Start(); // throws InputException for a wrong launcher (exit 2)
        bool root = ranks.IsRoot;

        OutputFolder? folder = null;
        int code = Agree(context, ranks, () => { if (root) folder = OutputFolder.Begin(a.OutputPath, a.Force, a.Inputs); });
        if (code != 0) return code;

        CatalogueShare? share = null;
        PhotometryResult? built = null;
        SelectionSplit? split = null;
        SurveyBinding? survey = null;
        code = Agree(context, ranks, () =>
        {
            share = CatalogueShare.Load(a.CataloguePath, a.LoadOptions, ranks.Rank, ranks.Size);
            if (root) foreach (var w in share.UnitWarnings) context.Err.WriteLine("sizetest: warning: " + SettingFlags.Text(w));
            timings?.Mark("read catalogue");
            built = ObservablesBuilder.Build(share.Local, a.Photometry);
            // Objects outside a stated cut leave the sample for the reject log before any likelihood (decided below, for all ranks).
            var nuisance = a.Hypotheses[0].Nuisance;
            split = SelectionConsistency.Classify(built.Observables, nuisance, i => share.Local.SourceRows[i], role => role.Name(), a.SurveyTerms);
            if (split.Outside.Count > 0)
            {
                var keep = split.Keep.ToArray();
                var log = new RejectLog(share.Rejects.SourceName);
                foreach (var e in share.Rejects.Entries.Concat(split.Outside).OrderBy(e => e.Row)) log.Add(e);
                share = share with
                {
                    Local = share.Local.Take(keep), Accepted = share.Accepted - split.Outside.Count, // sums over ranks stay right whoever counted the row
                    Rejected = share.Rejected + split.Outside.Count, Rejects = log,
                    ChunkKeys = share.ChunkKeys is { } ck ? keep.Select(i => ck[i]).ToArray() : null,
                };
                built = new PhotometryResult(ObservablesSubset.Take(built.Observables, keep), built.Corrections);
            }
        });
        if (code != 0)
        {
            folder?.Abandon();
            return code;
        }

        // The whole sample's redshift range (every rank gets the same sums), for survey terms bound on a rank's share.
        RedshiftGridSpan? wholeSample = ranks.Size > 1 ? WholeSampleSpan(ranks, built!.Observables) : null;
        // Likewise the counts against a stated --z-prior: the warning and the refusal are decided on the whole sample.
        RedshiftPriorCoverage? wholeCoverage = ranks.Size > 1 && a.SurveyTerms is { } terms ? WholeSampleCoverage(ranks, terms.PriorCoverage(built!.Observables, a.Hypotheses[0].Nuisance.Observable)) : null;
        code = Agree(context, ranks, () =>
        {
            var local = built!.Observables;
            if (a.Survey is { } bindSurvey)
            {
                survey = bindSurvey(local, wholeSample, wholeCoverage);
                a = a with { Hypotheses = survey.Hypotheses };
                if (root && survey.Warning is { } w) context.Err.WriteLine("sizetest: warning: " + TerminalText.Escape(SettingFlags.Text(w)));
                if (root)
                    foreach (var n in survey.Notes.Where(n => n.StartsWith("warning: ", StringComparison.Ordinal))) // e.g. a stated z prior excluding the data
                        context.Err.WriteLine("sizetest: " + TerminalText.Escape(SettingFlags.Text(n)));
            }
            // What the observable kind needs (columns) is checked here on one object, so such errors stop all ranks cleanly.
            if (local.Count > 0)
                foreach (var h in a.Hypotheses)
                    _ = new HypothesisLikelihood(h, ObservablesSubset.Take(local, [0]), new RedshiftGridSpan(local.Z.Min(), local.Z.Max(), local.Count)); // one object of local.Count
            timings?.Mark("observables and selection");
        });
        if (code != 0)
        {
            folder?.Abandon();
            return code;
        }

        // A luminosity window's per-model counts over the whole sample (one process: Bind counted them already).
        if (ranks.Size > 1 && survey is { HasWindow: true })
        {
            var keptHere = new double[survey.Hypotheses.Count + 1];
            var keptAll = new double[keptHere.Length];
            code = Agree(context, ranks, () => survey.WindowObjects(built!.Observables, wholeSample).CopyTo(keptHere, 0));
            if (code == 0)
            {
                keptHere[^1] = built!.Observables.Count;
                ranks.SumAll(keptHere, keptAll);
                code = Agree(context, ranks, () => survey = survey.WithWindowCounts(keptAll[..^1], (long)keptAll[^1]));
            }
            if (code != 0)
            {
                folder?.Abandon();
                return code;
            }
        }

        // The selection decision over all ranks (every rank gets the same sums, so all decide alike).
        var sums = new double[6];
        ranks.SumAll([split!.Outside.Count + built!.Observables.Count, split.Outside.Count,
            split.Outside.Count(e => e.Reason == RejectReason.OutsideSbLimit), split.Outside.Count(e => e.Reason == RejectReason.OutsideMagLimit),
            split.Outside.Count(e => e.Reason == RejectReason.OutsideMinSize), split.Outside.Count(e => e.Reason == RejectReason.OutsideRedshiftPrior)], sums);
        string? selectionWarning = null;
        if (sums[1] > 0)
        {
            try
            {
                var detail = SelectionSplit.Describe([(RejectReason.OutsideSbLimit, (long)sums[2]), (RejectReason.OutsideMagLimit, (long)sums[3]), (RejectReason.OutsideMinSize, (long)sums[4]), (RejectReason.OutsideRedshiftPrior, (long)sums[5])]);
                selectionWarning = SelectionConsistency.Decide((long)sums[1], (long)sums[0], detail, a.MaxOutsideSelection, a.CataloguePath);
                if (root) context.Err.WriteLine($"sizetest: warning: {TerminalText.Escape(selectionWarning)}");
            }
            catch (InputException e)
            {
                folder?.Abandon();
                return root ? context.Fail(e) : ExitCodes.BadInput;
            }
        }

        // From here on the fit needs the catalogue only for its file rows and reject log: let its columns go (memory).
        share = share! with { Local = share.Local.RowsOnly(), Whole = null };
        try
        {
            var totals = share.Combine(ranks);
            var local = built!.Observables;
            if (a.CvFoldsExplicit && a.CrossValidationFolds > totals.Accepted)
                throw new InputException($"--cv-folds {a.CrossValidationFolds} is more than the {totals.Accepted} objects accepted from {a.CataloguePath}; give at most {totals.Accepted} folds, or 0 for no cross-validation");
            var backend = new EvaluationBackend(ranks, local, share.Local.SourceRows, share.ChunkKeys);
            var request = new FitRequest
            {
                Hypotheses = a.Hypotheses,
                Observables = local,
                Backend = backend,
                Source = a.CataloguePath,
                RowsRead = totals.RowsRead,
                Rejected = totals.Rejected,
                Seed = a.Seed,
                Starts = a.Starts,
                Bootstrap = a.Bootstrap,
                CrossValidationFolds = a.CrossValidationFolds,
                ProfileParameter = a.ProfileParameter,
                Expected = a.Expected,
                Sampler = a.Sampler,
                Walkers = a.Walkers,
                Steps = a.Steps,
                MaxSteps = a.MaxSteps,
                LivePoints = a.LivePoints,
                ChainStoreFactory = root && a.Sampler == SamplerKind.Mcmc ? label => new SizeTest.Inference.Sampling.CsvChainStore(folder!.PathOf($"chains_{label}.csv")) : null,
                Timings = timings,
            };
            var result = FitRun.Run(request, root ? new FitProgressReporter(context) : null);
            if (!root) return result.AllConverged ? ExitCodes.Success : ExitCodes.AnalysisFailed; // rank 0 writes and prints
            result = result with { Notes = [.. built.Corrections.Select(c => "photometry: " + c), .. (selectionWarning is null ? [] : new[] { "selection: " + selectionWarning }), .. (survey?.Notes ?? []).Select(c => "survey: " + c),
                .. share.UnitWarnings.Select(w => "catalogue: warning: " + w), .. share.PopulationNotes.Select(n => "catalogue: " + n), .. result.Notes] };
            // Inner stages name settings ({expect}, {col}); the notes written and shown are in the CLI's flags.
            result = result with { Notes = result.Notes.Select(SettingFlags.Text).ToArray() };

            StudyOutputFiles.Write(folder!, result, totals.RejectCsv);
            folder!.Commit();
            folder = null;
            timings?.Mark("write outputs");

            switch (a.Format)
            {
                case "json": context.Out.Write(ResultsJson.Serialize(result)); break;
                case "csv": context.Out.Write(FitTables.Csv(result)); break;
                default: FitTables.WriteTable(context.Out, result); break;
            }
            if (timings is not null)
            {
                timings.Mark("print");
                foreach (var (stage, wall, cpu) in timings.Entries)
                    context.Err.WriteLine(FormattableString.Invariant($"sizetest timing: {stage,-40} wall {wall,7:F3} s  cpu {cpu,7:F3} s"));
                context.Err.WriteLine(FormattableString.Invariant($"sizetest timing: since process start                    wall {(DateTime.Now - System.Diagnostics.Process.GetCurrentProcess().StartTime).TotalSeconds,7:F3} s  cpu {System.Diagnostics.Process.GetCurrentProcess().TotalProcessorTime.TotalSeconds,7:F3} s"));
            }
            if (!result.AllConverged)
            {
                var bad = result.Models.Where(m => !m.Converged).Select(m => $"{m.Name} ({m.ExitReason})");
                context.Err.WriteLine($"sizetest: fit did not converge for {string.Join("; ", bad)}; results were written to {a.OutputPath} but are not reliable");
                return ExitCodes.AnalysisFailed;
            }
            return ExitCodes.Success;
        }
        catch (Exception ex)
        {
            folder?.Abandon();
            if (!root) context.Err.Write($"sizetest: rank {ranks.Rank} of {ranks.Size}: ");
            code = context.Fail(ex);
            if (ranks.Size > 1)
            {
                context.Err.Flush();
                ranks.Abort(code); // the other ranks wait in a collective call
            }
            return code;
        }
    }

    // Objects and redshift bounds of every rank in its own slots, summed over ranks (as EvaluationBackend does); null when empty.
    private static RedshiftPriorCoverage WholeSampleCoverage(IRankReducer ranks, RedshiftPriorCoverage mine)
    {
        var sums = new double[2];
        ranks.SumAll([mine.WithErr, mine.Outside], sums); // counts below 2^53 add exactly in doubles
        return new RedshiftPriorCoverage((long)sums[0], (long)sums[1]);
    }

    private static RedshiftGridSpan? WholeSampleSpan(IRankReducer ranks, Observables local)
    {
        var mine = new double[3 * ranks.Size];
        var all = new double[3 * ranks.Size];
        mine[3 * ranks.Rank] = local.Count;
        if (local.Count > 0) { mine[3 * ranks.Rank + 1] = local.Z.Min(); mine[3 * ranks.Rank + 2] = local.Z.Max(); }
        ranks.SumAll(mine, all);
        long n = 0;
        double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
        for (int r = 0; r < ranks.Size; r++)
        {
            if (all[3 * r] == 0) continue;
            n += (long)all[3 * r];
            lo = Math.Min(lo, all[3 * r + 1]);
            hi = Math.Max(hi, all[3 * r + 2]);
        }
        return n == 0 ? null : new RedshiftGridSpan(lo, hi, (int)Math.Min(n, int.MaxValue));
    }

    // Runs a step on every rank, then agrees on the outcome: when any rank failed, the lowest failing rank prints its
    // error and every rank returns that rank's exit code; 0 when all succeeded.
    private static int Agree(CliContext context, IRankReducer ranks, Action step)
    {
        Exception? error = null;
        try { step(); }
        catch (Exception ex) { error = ex; }
        var local = new double[ranks.Size];
        var all = new double[ranks.Size];
        if (error is not null) local[ranks.Rank] = Math.Max(1, new CliContext(TextWriter.Null, TextWriter.Null, verbose: false).Fail(error));
        ranks.SumAll(local, all);
        int failed = Array.FindIndex(all, v => v != 0);
        if (failed < 0) return ExitCodes.Success;
        if (failed == ranks.Rank)
        {
            if (!ranks.IsRoot) context.Err.Write($"sizetest: rank {ranks.Rank} of {ranks.Size}: ");
            context.Fail(error!);
        }
        return (int)all[failed];
    }
}
