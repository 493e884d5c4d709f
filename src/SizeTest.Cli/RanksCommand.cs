using System.CommandLine;
using System.Globalization;
using System.Text.Json;
using SizeTest.Catalogues;
using SizeTest.Cosmology;
using SizeTest.Distributed;
using SizeTest.Inference;

namespace SizeTest.Cli;

/// <summary>
/// <c>sizetest ranks</c> (hidden diagnostic verb): shows how SizeTest sees its processes (single process or
/// MPI ranks) and runs the distributed likelihood on a SYNTHETIC catalogue split across the ranks, so
/// <c>mpirun -np N sizetest ranks</c> checks an MPI installation (fits of real catalogues across ranks:
/// <c>mpirun -np N sizetest fit</c>). Only rank 0 prints.
/// </summary>
internal static class RanksCommand
{
    public static Command Create(CliContext context)
    {
        var rows = new Option<long>("--rows") { Description = "Rows of the synthetic catalogue (all ranks together).", DefaultValueFactory = _ => 100_000 };
        var seed = new Option<ulong>("--seed") { Description = "Seed of the synthetic catalogue.", DefaultValueFactory = _ => 1 };
        var threads = new Option<int>("--threads") { Description = "Threads per rank for the likelihood kernel (0 = all cores).", DefaultValueFactory = _ => 0 };
        var format = CliOptions.Format();
        var command = new Command("ranks", "Show the MPI/single-process set-up and check the distributed likelihood on synthetic rows.")
        {
            Hidden = true,
        };
        command.Options.Add(rows);
        command.Options.Add(seed);
        command.Options.Add(threads);
        command.Options.Add(format);
        command.SetAction(parse =>
        {
            long n = parse.GetValue(rows);
            if (n < 1) throw new ArgumentException("--rows must be at least 1.");
            var ranks = RankContext.Start();
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
}
