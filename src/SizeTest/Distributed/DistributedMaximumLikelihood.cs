using MathNet.Numerics.Optimization;
using SizeTest.Catalogs;
using SizeTest.Catalogs.Parquet;
using SizeTest.Inference;
using SizeTest.Inference.Sampling;
using SizeTest.Photometry;
using LinearVector = MathNet.Numerics.LinearAlgebra.Vector<double>;

namespace SizeTest.Distributed;

/// <summary>A maximum-likelihood fit run across ranks (meaningful on rank 0).</summary>
/// <param name="Model">Hypothesis label.</param>
/// <param name="ParameterNames">Free parameters, in order.</param>
/// <param name="Theta">Best-fit values.</param>
/// <param name="LogLikelihood">ln L at <paramref name="Theta"/> (sum over all ranks' objects, all constants kept).</param>
/// <param name="Converged">Whether Nelder–Mead met its tolerance and the Hessian is negative definite.</param>
/// <param name="Covariance">Covariance from the numerical Hessian of the distributed log-posterior, or null.</param>
/// <param name="Evaluations">Collective evaluations used.</param>
/// <param name="RowsRead">Rows read by all ranks together.</param>
/// <param name="Accepted">Rows accepted by all ranks together.</param>
/// <param name="Rejected">Rows rejected by all ranks together (RowsRead = Accepted + Rejected).</param>
/// <param name="Ranks">Description of the rank layer.</param>
/// <param name="Mcmc">The ensemble-sampler run started at the maximum, if one was asked for.</param>
public sealed record DistributedFitResult(string Model, string[] ParameterNames, double[] Theta, double LogLikelihood, bool Converged,
    double[,]? Covariance, long Evaluations, long RowsRead, long Accepted, long Rejected, string Ranks, DistributedMcmcSummary? Mcmc = null);

/// <summary>Posterior summary of an ensemble-sampler run through the ranks.</summary>
/// <param name="Median">Posterior median per parameter.</param>
/// <param name="Lo">16th percentile per parameter.</param>
/// <param name="Hi">84th percentile per parameter.</param>
/// <param name="AcceptanceFraction">Mean acceptance fraction.</param>
/// <param name="Converged">The sampler's convergence verdict.</param>
/// <param name="Evaluations">Log-density evaluations (each one collective).</param>
public sealed record DistributedMcmcSummary(double[] Median, double[] Lo, double[] Hi, double AcceptanceFraction, bool Converged, long Evaluations);

/// <summary>
/// Maximum likelihood of one <see cref="Hypothesis"/> with the catalogue split across ranks. Each rank loads its
/// share (a Parquet file by row groups, so no rank holds the whole catalogue; other formats are loaded whole and
/// the accepted rows split by range), binds the inference stage's <see cref="HypothesisLikelihood"/> to its own
/// objects, and evaluates that partial sum; rank 0 runs a bounded Nelder–Mead (MathNet.Numerics, in the
/// <see cref="BoundedTransform"/> coordinates the single-process fitter uses) and the numerical Hessian through
/// <see cref="DistributedLogDensity"/>, adding the log prior once; optionally the ensemble sampler then explores the
/// posterior through the same collective evaluations.
/// </summary>
/// <remarks>
/// With the cosmology fixed (the default hypothesis) every object uses its exact D_A, so the result does not depend
/// on the number of ranks beyond rounding. With free cosmological parameters each rank's <see cref="RedshiftGrid"/>
/// spans only its own redshifts; agreement is then at the grid's interpolation accuracy (≲ 1e-5 in D_A) until the
/// grid bounds are shared between ranks.
/// </remarks>
public static class DistributedMaximumLikelihood
{
    /// <summary>Runs the fit; every rank must call it. Returns the result on rank 0 and null elsewhere.</summary>
    /// <param name="ranks">The rank layer.</param>
    /// <param name="catalogPath">Catalogue file (Parquet is split by row groups).</param>
    /// <param name="options">Catalogue loading options (mapping, limits).</param>
    /// <param name="hypothesis">World model family with its free parameters.</param>
    /// <param name="tolerance">Nelder–Mead relative tolerance.</param>
    /// <param name="maxIterations">Nelder–Mead iteration cap.</param>
    /// <param name="mcmcSteps">If &gt; 0, then run the project's Goodman–Weare ensemble sampler (<see cref="EnsembleSampler"/>, serial
    /// evaluations, each collective) for this many steps from a small ball around the maximum.</param>
    /// <param name="seed">Seed of the sampler and of its starting ball.</param>
    public static DistributedFitResult? Fit(IRankReducer ranks, string catalogPath, CatalogLoadOptions options, Hypothesis hypothesis,
        double tolerance = 1e-10, int maxIterations = 20000, int mcmcSteps = 0, int seed = 1)
    {
        ArgumentNullException.ThrowIfNull(ranks);
        ArgumentNullException.ThrowIfNull(catalogPath);
        ArgumentNullException.ThrowIfNull(options);
        ArgumentNullException.ThrowIfNull(hypothesis);

        var (sample, counts) = LoadShare(ranks, catalogPath, options);
        HypothesisLikelihood? local = null;
        if (sample.Count > 0)
            local = hypothesis.Bind(ObservablesBuilder.Build(sample, PhotometryOptions.Default).Observables);

        var free = hypothesis.FreeParameters;
        int d = free.Count;
        if (d == 0) throw new ArgumentException("every parameter is fixed: nothing to fit across ranks");
        var min = free.Select(p => p.Min).ToArray();
        var max = free.Select(p => p.Max).ToArray();
        var priors = free.Select(p => p.Prior).ToArray();
        var likelihood = new DistributedLogDensity(ranks, d, theta => local?.LogDensity(theta) ?? 0.0);
        if (!ranks.IsRoot)
        {
            likelihood.Serve();
            return null;
        }
        try
        {
            var posterior = new PriorPlus(likelihood, priors);
            var tr = new BoundedTransform(min, max);
            var x = new double[d];
            var objective = ObjectiveFunction.Value(u =>
            {
                tr.ToBounded(u.ToArray(), x);
                double v = -posterior.LogDensity(x);
                return double.IsFinite(v) ? v : 1e300;
            });
            var start = local?.SuggestStart() ?? hypothesis.StartVector();
            var u0 = new double[d];
            tr.ToUnbounded(start, u0);
            var nm = new NelderMeadSimplex(tolerance, maxIterations);
            var r = nm.FindMinimum(objective, LinearVector.Build.DenseOfArray(u0), LinearVector.Build.Dense(d, 0.5));
            // one restart from the best point (a fresh simplex), as the single-process fitter does
            var r2 = nm.FindMinimum(objective, r.MinimizingPoint, LinearVector.Build.Dense(d, 0.1));
            var best = r2.FunctionInfoAtMinimum.Value <= r.FunctionInfoAtMinimum.Value ? r2 : r;
            var theta = new double[d];
            tr.ToBounded(best.MinimizingPoint.ToArray(), theta);
            var active = Enumerable.Range(0, d).Select(j => Math.Min(theta[j] - min[j], max[j] - theta[j]) > 1e-6 * (max[j] - min[j])).ToArray();
            var (hessian, _) = FiniteDifferenceHessian.Compute(posterior, theta, min, max, active);
            var cov = FiniteDifferenceHessian.Covariance(hessian, active);
            double ll = likelihood.LogDensity(theta);
            long evaluations = likelihood.Evaluations;
            DistributedMcmcSummary? mcmc = null;
            if (mcmcSteps > 0)
            {
                var scale = new double[d];
                for (int j = 0; j < d; j++)
                    scale[j] = 1e-2 * (cov is not null && cov[j, j] > 0 ? Math.Sqrt(cov[j, j]) : 1e-3 * Math.Max(1, Math.Abs(theta[j])));
                var sampler = new EnsembleSampler(posterior, new EnsembleSamplerOptions
                {
                    Walkers = Math.Max(16, 4 * d), Steps = mcmcSteps, Seed = seed, MaxDegreeOfParallelism = 1,
                    ParameterNames = free.Select(p => p.Name).ToArray(),
                });
                var run = sampler.Run(EnsembleSampler.GaussianBall(posterior, theta, scale, sampler.Options.Walkers, seed));
                mcmc = new DistributedMcmcSummary(
                    Enumerable.Range(0, d).Select(j => run.Percentile(j, 50)).ToArray(),
                    Enumerable.Range(0, d).Select(j => run.Percentile(j, 16)).ToArray(),
                    Enumerable.Range(0, d).Select(j => run.Percentile(j, 84)).ToArray(),
                    run.AcceptanceFraction, run.Converged, run.Evaluations);
            }
            likelihood.Stop();
            bool converged = best.ReasonForExit == ExitCondition.Converged && cov is not null && double.IsFinite(ll);
            return new DistributedFitResult(hypothesis.Label, free.Select(p => p.Name).ToArray(), theta, ll, converged, cov, evaluations,
                (long)counts[0], (long)counts[1], (long)counts[2], ranks.Description, mcmc);
        }
        catch (Exception) when (ranks.Size > 1)
        {
            ranks.Abort(1); // the other ranks wait in a collective call
            throw;
        }
    }

    // This rank's accepted rows and the all-rank totals (rows read, accepted, rejected).
    private static (Sample Sample, double[] Counts) LoadShare(IRankReducer ranks, string path, CatalogLoadOptions options)
    {
        var counts = new double[3];
        if (CatalogReaders.DetectFormat(path) == CatalogFormat.Parquet && options.Reader.Format is null or CatalogFormat.Parquet)
        {
            int first, end;
            using (var table = ParquetTableReader.Open(path))
                (first, end) = RowPartition.RowGroups(table.RowGroupRowCounts, ranks.Rank, ranks.Size);
            using var reader = ParquetCatalogReader.Open(path, first, end);
            var load = CatalogLoader.Load(reader, options);
            ranks.SumAll([load.RowsRead, load.Accepted, load.Rejected], counts);
            return (load.Sample, counts);
        }
        var whole = CatalogLoader.Load(path, options);
        counts[0] = whole.RowsRead; counts[1] = whole.Accepted; counts[2] = whole.Rejected;
        var (s, e) = RowPartition.RowRange(whole.Accepted, ranks.Rank, ranks.Size);
        return (Slice(whole.Sample, (int)s, (int)e), counts);
    }

    private static Sample Slice(Sample x, int start, int end)
    {
        T[]? Part<T>(T[]? a) => a?[start..end];
        var extra = x.ExtraColumns.ToDictionary(kv => kv.Key, kv => kv.Value[start..end]);
        return new Sample(x.SourceName, RowNumbers.FromArray(Enumerable.Range(start, end - start).Select(i => x.SourceRows[i]).ToArray()),
            x.Z[start..end], Part(x.Id), Part(x.ZErr), Part(x.ThetaRad), Part(x.ThetaErrRad), Part(x.Mu), Part(x.MuErr), Part(x.Mag), Part(x.MagErr),
            Part(x.Band), x.SizeDefinition, extra);
    }

    private sealed class PriorPlus(ILogDensity likelihood, ParameterPrior[] priors) : ILogDensity
    {
        public int Dimension => likelihood.Dimension;

        public double LogDensity(ReadOnlySpan<double> theta)
        {
            double lp = 0;
            for (int j = 0; j < priors.Length; j++) lp += priors[j].LogDensity(theta[j]);
            // Evaluate collectively even outside the support so that every rank sees the same sequence of calls.
            double ll = likelihood.LogDensity(theta);
            return double.IsNegativeInfinity(lp) ? lp : lp + ll;
        }
    }
}
