using System.Diagnostics;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;

namespace SizeTest.Distributed;

/// <summary>What <see cref="DistributedSelfCheck.Run"/> found (meaningful on rank 0).</summary>
/// <param name="Ranks">Description of the rank layer.</param>
/// <param name="RankCount">Number of ranks.</param>
/// <param name="Rows">Rows in the synthetic catalogue (all ranks together).</param>
/// <param name="LocalRows">Rows held by rank 0.</param>
/// <param name="LogLikelihoods">ln L at the fixed check vectors <see cref="DistributedSelfCheck.CheckVectors"/>.</param>
/// <param name="BestFit">Maximum-likelihood (ln R0, a, σ_int) from the Nelder–Mead optimiser run through the ranks.</param>
/// <param name="MaxLogLikelihood">ln L at <paramref name="BestFit"/>.</param>
/// <param name="Evaluations">Collective likelihood evaluations used by the optimiser.</param>
/// <param name="SecondsPerEvaluation">Median wall time of one collective evaluation.</param>
/// <param name="SecondsPerAllreduce">Median wall time of one 1-double Allreduce (0 for a single process).</param>
public sealed record SelfCheckResult(string Ranks, int RankCount, long Rows, long LocalRows, double[] LogLikelihoods,
    double[] BestFit, double MaxLogLikelihood, long Evaluations, double SecondsPerEvaluation, double SecondsPerAllreduce);

/// <summary>
/// Runs the distributed likelihood end to end on SYNTHETIC rows (<see cref="SyntheticKernelRows"/>): each rank
/// builds its own row range, rank 0 drives ln L evaluations and a maximum-likelihood fit through
/// <see cref="DistributedLogDensity"/>. Results must not depend on the number of ranks (tested with 1, 2, 4).
/// </summary>
public static class DistributedSelfCheck
{
    /// <summary>Parameter vectors (ln R0 [kpc], a, σ_int) at which ln L is reported.</summary>
    public static IReadOnlyList<double[]> CheckVectors { get; } =
        [[Math.Log(5.0), -1.0, 0.2], [Math.Log(4.0), -0.5, 0.3], [Math.Log(6.5), -1.4, 0.12]];

    /// <summary>Runs the check; every rank must call it. Returns the result on rank 0 and null elsewhere.</summary>
    public static SelfCheckResult? Run(IRankReducer ranks, long rows, ulong seed, int gridNodes = 2048, int threads = 0)
    {
        ArgumentNullException.ThrowIfNull(ranks);
        if (rows < 1 || rows > int.MaxValue * (long)ranks.Size) throw new ArgumentOutOfRangeException(nameof(rows));
        var (start, end) = RowPartition.RowRange(rows, ranks.Rank, ranks.Size);
        int n = checked((int)(end - start));
        var z = new double[n];
        var y = new double[n];
        var e = new double[n];
        SyntheticKernelRows.Fill(seed, start, z, y, e);
        // The grid must be the same on every rank: fixed by the synthetic design's redshift range, not the local rows.
        var grid = new LogRedshiftGrid(0.05, 3.0, gridNodes);
        var columns = KernelColumns.Build(z, y, e, grid);
        var distances = new double[grid.Count];
        for (int k = 0; k < distances.Length; k++) distances[k] = SyntheticKernelRows.EdsAngularDiameterDistanceMpc(grid.Nodes[k]);
        var model = new double[grid.Count];

        double Local(double[] p)
        {
            if (!(p[2] > 0)) return double.NegativeInfinity;
            AngularSizeModelGrid.FillFromDistances(grid, distances, p[0], p[1], model);
            return GaussianGridKernel.LogLikelihoodParallel(columns, 0, n, model, p[2], threads);
        }

        var density = new DistributedLogDensity(ranks, 3, Local);
        if (!ranks.IsRoot)
        {
            density.Serve();
            TimeAllreduce(ranks);
            return null;
        }
        try
        {
            var values = new double[CheckVectors.Count];
            var flat = CheckVectors.SelectMany(v => v).ToArray();
            density.LogDensities(flat, values);

            var times = new List<double>();
            var sw = new Stopwatch();
            for (int r = 0; r < 7; r++) { sw.Restart(); density.LogDensity(CheckVectors[0]); times.Add(sw.Elapsed.TotalSeconds); }
            times.Sort();

            long before = density.Evaluations;
            var objective = ObjectiveFunction.Value(v =>
            {
                double l = density.LogDensity([v[0], v[1], v[2]]);
                return double.IsFinite(l) ? -l : double.MaxValue;
            });
            var start0 = Vector<double>.Build.DenseOfArray([Math.Log(4.0), -0.5, 0.3]);
            var fit = new NelderMeadSimplex(1e-10, 20000).FindMinimum(objective, start0);
            double[] best = fit.MinimizingPoint.ToArray();
            long used = density.Evaluations - before;
            density.Stop();
            double allreduce = TimeAllreduce(ranks);
            return new SelfCheckResult(ranks.Description, ranks.Size, rows, n, values, best, -fit.FunctionInfoAtMinimum.Value,
                used, times[times.Count / 2], allreduce);
        }
        catch (Exception) when (ranks.Size > 1)
        {
            ranks.Abort(1); // the other ranks are waiting in a collective call
            throw;
        }
    }

    // Median time of a 1-double Allreduce (all ranks take part), 0 for a single process.
    private static double TimeAllreduce(IRankReducer ranks)
    {
        if (ranks.Size == 1) return 0;
        ranks.Barrier();
        Span<double> a = stackalloc double[1], b = stackalloc double[1];
        var times = new double[201];
        var sw = new Stopwatch();
        for (int r = 0; r < times.Length; r++)
        {
            sw.Restart();
            for (int i = 0; i < 10; i++) ranks.SumAll(a, b);
            times[r] = sw.Elapsed.TotalSeconds / 10;
        }
        Array.Sort(times);
        return times[times.Length / 2];
    }
}
