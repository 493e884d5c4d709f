using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using SizeTest.Catalogs;
using SizeTest.Cosmology;
using SizeTest.Distributed;
using SizeTest.Inference;

namespace SizeTest.Cli;

/// <summary>
/// <c>sizetest ranks</c> (hidden diagnostic verb): shows how SizeTest sees its processes (single process or
/// MPI ranks) and runs the distributed likelihood on a SYNTHETIC catalogue split across the ranks, so
/// <c>mpirun -np N sizetest ranks</c> checks an MPI installation. With <c>--catalog FILE</c> it instead fits the
/// angular sizes of that catalogue with one world model across the ranks (Parquet split by row groups).
/// Only rank 0 prints.
/// </summary>
internal static class RanksCommand
{
    public static Command Create(CliContext context)
    {
        var rows = new Option<long>("--rows") { Description = "Rows of the synthetic catalogue (all ranks together).", DefaultValueFactory = _ => 100_000 };
        var seed = new Option<ulong>("--seed") { Description = "Seed of the synthetic catalogue.", DefaultValueFactory = _ => 1 };
        var threads = new Option<int>("--threads") { Description = "Threads per rank for the likelihood kernel (0 = all cores).", DefaultValueFactory = _ => 0 };
        var format = CliOptions.Format();
        var catalog = new Option<string?>("--catalog") { Description = "Fit this catalogue's angular sizes across the ranks instead of the synthetic check." };
        var model = new Option<string>("--model") { Description = "World model for --catalog.", DefaultValueFactory = _ => "lcdm" };
        var mcmcSteps = new Option<int>("--mcmc-steps") { Description = "With --catalog: also run the ensemble sampler for this many steps (0 = no).", DefaultValueFactory = _ => 0 };
        var command = new Command("ranks", "Show the MPI/single-process set-up and check the distributed likelihood on synthetic rows.")
        {
            Hidden = true,
        };
        command.Options.Add(rows);
        command.Options.Add(seed);
        command.Options.Add(threads);
        command.Options.Add(format);
        command.Options.Add(catalog);
        command.Options.Add(model);
        command.Options.Add(mcmcSteps);
        command.SetAction(parse =>
        {
            long n = parse.GetValue(rows);
            if (n < 1) throw new ArgumentException("--rows must be at least 1.");
            var ranks = RankContext.Start();
            if (parse.GetValue(catalog) is { } path)
                return FitCatalog(context, ranks, path, parse.GetValue(model)!, parse.GetValue(format) == "json", parse.GetValue(mcmcSteps), (int)parse.GetValue(seed));
            var result = DistributedSelfCheck.Run(ranks, n, parse.GetValue(seed), threads: parse.GetValue(threads));
            var output = RootOutput.Writer(ranks, context.Out);
            if (result is null) return ExitCodes.Success;
            if (parse.GetValue(format) == "json")
            {
                output.WriteLine(JsonSerializer.Serialize(new
                {
                    ranks = result.Ranks,
                    rank_count = result.RankCount,
                    rows = result.Rows,
                    rows_rank0 = result.LocalRows,
                    log_likelihood_checks = result.LogLikelihoods,
                    best_fit = result.BestFit,
                    max_log_likelihood = result.MaxLogLikelihood,
                    evaluations = result.Evaluations,
                    seconds_per_evaluation = result.SecondsPerEvaluation,
                    seconds_per_allreduce = result.SecondsPerAllreduce,
                }));
            }
            else
            {
                var c = CultureInfo.InvariantCulture;
                output.WriteLine($"ranks: {result.Ranks}");
                output.WriteLine($"synthetic rows: {result.Rows} ({result.LocalRows} on rank 0)");
                for (int i = 0; i < result.LogLikelihoods.Length; i++)
                    output.WriteLine(string.Format(c, "ln L at check vector {0}: {1:R}", i + 1, result.LogLikelihoods[i]));
                output.WriteLine(string.Format(c, "best fit ln R0 = {0:F6}, a = {1:F6}, sigma_int = {2:F6} (ln L = {3:R}, {4} evaluations)",
                    result.BestFit[0], result.BestFit[1], result.BestFit[2], result.MaxLogLikelihood, result.Evaluations));
                output.WriteLine(string.Format(c, "per evaluation {0:F6} s, per Allreduce {1:E2} s", result.SecondsPerEvaluation, result.SecondsPerAllreduce));
            }
            return ExitCodes.Success;
        });
        return command;
    }

    private static int FitCatalog(CliContext context, IRankReducer ranks, string path, string modelName, bool json, int mcmcSteps, int seed)
    {
        if (!WorldModels.TryGet(modelName, out var family))
            throw new ArgumentException($"unknown world model '{modelName}'; choose one of {string.Join(", ", WorldModels.Names)}");
        var hypothesis = Hypothesis.Create(family, new NuisanceModel(ObservableKind.Size));
        if (mcmcSteps < 0) throw new ArgumentException("--mcmc-steps must be 0 or more.");
        var fit = DistributedMaximumLikelihood.Fit(ranks, path, new CatalogLoadOptions(), hypothesis, mcmcSteps: mcmcSteps, seed: seed);
        if (fit is null) return ExitCodes.Success;
        var o = RootOutput.Writer(ranks, context.Out);
        if (json)
        {
            o.WriteLine(JsonSerializer.Serialize(new
            {
                model = fit.Model,
                ranks = fit.Ranks,
                parameters = fit.ParameterNames.Select((n, j) => new { name = n, value = fit.Theta[j] }).ToArray(),
                log_likelihood = fit.LogLikelihood,
                converged = fit.Converged,
                evaluations = fit.Evaluations,
                rows_read = fit.RowsRead,
                accepted = fit.Accepted,
                rejected = fit.Rejected,
                mcmc = fit.Mcmc is { } m ? new
                {
                    median = m.Median, p16 = m.Lo, p84 = m.Hi, acceptance = m.AcceptanceFraction, converged = m.Converged, evaluations = m.Evaluations,
                } : null,
            }));
        }
        else
        {
            var c = CultureInfo.InvariantCulture;
            o.WriteLine($"ranks: {fit.Ranks}");
            o.WriteLine($"model: {fit.Model}; rows: {fit.RowsRead} read, {fit.Accepted} accepted, {fit.Rejected} rejected");
            for (int j = 0; j < fit.Theta.Length; j++) o.WriteLine(string.Format(c, "  {0} = {1:G10}", fit.ParameterNames[j], fit.Theta[j]));
            o.WriteLine(string.Format(c, "ln L = {0:R} ({1}, {2} evaluations)", fit.LogLikelihood, fit.Converged ? "converged" : "not converged", fit.Evaluations));
            if (fit.Mcmc is { } m)
                for (int j = 0; j < fit.Theta.Length; j++)
                    o.WriteLine(string.Format(c, "  posterior {0}: median {1:G8} [{2:G8}, {3:G8}] (acceptance {4:F2})", fit.ParameterNames[j], m.Median[j], m.Lo[j], m.Hi[j], m.AcceptanceFraction));
        }
        return fit.Converged ? ExitCodes.Success : ExitCodes.AnalysisFailed;
    }
}
