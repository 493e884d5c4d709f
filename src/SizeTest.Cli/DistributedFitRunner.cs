using SizeTest.Catalogs;
using SizeTest.Common;
using SizeTest.Distributed;
using SizeTest.Inference;
using SizeTest.Photometry;

namespace SizeTest.Cli;

/// <summary>What <c>sizetest fit</c> parsed, handed to its distributed path.</summary>
internal sealed record DistributedFitArgs(
    string CatalogPath, CatalogLoadOptions LoadOptions, string OutputPath, bool Force, string? Format,
    IReadOnlyList<Hypothesis> Hypotheses, int Seed, int Starts, int Bootstrap, int CrossValidationFolds, string? ProfileParameter,
    IReadOnlyList<ExpectedRange> Expected, string Sampler, int Walkers, int Steps, int LivePoints, PhotometryOptions Photometry);

/// <summary>
/// <c>mpirun -np N sizetest fit …</c>: every rank loads its share of the catalogue (<see cref="CatalogShare"/>), the ranks
/// run <see cref="DistributedFitStudy"/> together, and rank 0 alone writes the output folder (results.json with the
/// single-process schema, results.csv, rejects.csv of all ranks, samples/chains) and prints. A failure before the fit
/// (output folder, catalogue) is agreed between the ranks so all exit with the same code and one rank prints it; a failure
/// during the fit aborts all ranks.
/// </summary>
internal static class DistributedFitRunner
{
    public static int Run(CliContext context, DistributedFitArgs a)
    {
        var ranks = RankContext.Start(); // throws InputException for a wrong launcher (exit 2)
        bool root = ranks.IsRoot;

        OutputFolder? folder = null;
        int code = Agree(context, ranks, () => { if (root) folder = OutputFolder.Begin(a.OutputPath, a.Force); });
        if (code != 0) return code;

        CatalogShare? share = null;
        Observables? local = null, whole = null;
        code = Agree(context, ranks, () =>
        {
            share = CatalogShare.Load(a.CatalogPath, a.LoadOptions, ranks.Rank, ranks.Size);
            local = ObservablesBuilder.Build(share.Local, a.Photometry).Observables;
            if (root && share.Whole is { } w) whole = ObservablesBuilder.Build(w, a.Photometry).Observables;
            // What the observable kind needs (columns) is checked here on one object, so such errors stop all ranks cleanly.
            if (local.Count > 0)
                foreach (var h in a.Hypotheses) _ = new HypothesisLikelihood(h, ObservablesSubset.Take(local, [0]));
        });
        if (code != 0)
        {
            folder?.Abandon();
            return code;
        }

        try
        {
            var totals = share!.Combine(ranks);
            var request = new FitRequest
            {
                Hypotheses = a.Hypotheses,
                Observables = local!,
                Source = a.CatalogPath,
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
                LivePoints = a.LivePoints,
                ChainStoreFactory = root && a.Sampler == "mcmc" ? label => new SizeTest.Inference.Sampling.CsvChainStore(folder!.PathOf($"chains_{label}.csv")) : null,
            };
            if (root && (a.CrossValidationFolds > 1 || a.ProfileParameter is not null))
                context.Err.WriteLine("sizetest fit: under MPI cross-validation and --profile are skipped (a note in results.json says so); run as a single process for them");
            var result = DistributedFitStudy.Run(ranks, request, share.Local.SourceRows, whole, root ? new FitProgressReporter(context) : null);
            if (result is null) return ExitCodes.Success; // not rank 0: nothing to write or print

            AtomicFile.WriteAllText(folder!.PathOf("results.json"), ResultsJson.Serialize(result));
            AtomicFile.WriteAllText(folder.PathOf("results.csv"), FitTables.Csv(result));
            AtomicFile.WriteAllText(folder.PathOf("rejects.csv"), totals.RejectCsv);
            foreach (var draws in result.Samples.Where(x => x.Rows.Count > 0))
                AtomicFile.WriteAllText(folder.PathOf($"samples_{draws.Model}.csv"), FitTables.SamplesCsv(draws));
            folder.Commit();
            folder = null;

            switch (a.Format)
            {
                case "json": context.Out.Write(ResultsJson.Serialize(result)); break;
                case "csv": context.Out.Write(FitTables.Csv(result)); break;
                default: FitTables.WriteTable(context.Out, result); break;
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
