using SizeTest.Distributed;
using Xunit;

namespace SizeTest.Tests.Distributed;

public sealed class SufficientStatisticsTests
{
    private static (KernelColumns Cols, double[] Distances) Synthetic(int n, ulong seed, double[]? quantisedErrors = null)
    {
        var z = new double[n]; var y = new double[n]; var e = new double[n];
        SyntheticKernelRows.Fill(seed, 0, z, y, e);
        if (quantisedErrors is not null)
            for (int i = 0; i < n; i++) e[i] = quantisedErrors[i % quantisedErrors.Length];
        var grid = new LogRedshiftGrid(0.05, 3.0, 512);
        return (KernelColumns.Build(z, y, e, grid), grid.Nodes.Select(SyntheticKernelRows.EdsAngularDiameterDistanceMpc).ToArray());
    }

    private static double[] Model(KernelColumns c, double[] d, double lnR0, double a)
    {
        var m = new double[c.Grid.Count];
        AngularSizeModelGrid.FillFromDistances(c.Grid, d, lnR0, a, m);
        return m;
    }

    [Fact]
    public void ExactWhenEachVarianceClassHoldsOneVariance()
    {
        // Three distinct errors, each in its own log-spaced class: the compression is exact (see the remarks of
        // SufficientStatistics: parallel-axis decomposition), so it equals the per-object kernel up to rounding.
        double[] errs = [0.05, 0.1, 0.2];
        var (cols, d) = Synthetic(200_000, 3, errs);
        var stats = new SufficientStatistics(cols.Grid, varianceClasses: 3, varianceMin: 0.002, varianceMax: 0.08);
        stats.Add(cols, 0, cols.Count);
        Assert.Equal(0, stats.MaxRelativeVarianceSpread);
        foreach (var p in DistributedSelfCheck.CheckVectors)
        {
            var m = Model(cols, d, p[0], p[1]);
            double direct = GaussianGridKernel.LogLikelihoodScalar(cols, 0, cols.Count, m, p[2]);
            double compressed = stats.LogLikelihood(m, p[2]);
            Assert.True(Math.Abs(direct - compressed) <= 1e-10 * Math.Abs(direct), $"{compressed:R} vs {direct:R}");
        }
    }

    [Fact]
    public void StreamingRowGroupsGivesTheSameStatisticsAsOnePass()
    {
        var (cols, d) = Synthetic(50_000, 5);
        var once = new SufficientStatistics(cols.Grid, 16, 1e-3, 0.05);
        once.Add(cols, 0, cols.Count);
        var streamed = new SufficientStatistics(cols.Grid, 16, 1e-3, 0.05);
        for (int s = 0; s < cols.Count; s += 4096) streamed.Add(cols, s, Math.Min(cols.Count, s + 4096));
        Assert.Equal(once.ObjectCount, streamed.ObjectCount);
        var m = Model(cols, d, Math.Log(5), -1);
        Assert.Equal(once.LogLikelihood(m, 0.2), streamed.LogLikelihood(m, 0.2)); // same operations in the same order
    }

    [Fact]
    public void BinnedVariancesApproximateTheLikelihoodWithAnErrorThatShrinksWithMoreClasses()
    {
        // Continuous errors σ_i ∈ [0.05, 0.15] (σ_i² spread ×9): classes uniform in ln σ² make each class's
        // relative spread ≈ ln 9 / K. The error in ln L must fall as K grows; bounds are the values measured here
        // (docs/scaling.md: 59, 4.5 and 0.85 for K = 4, 16, 64) with a factor ~2–3 margin, 2×10^5 objects, σ_int = 0.2.
        var (cols, d) = Synthetic(200_000, 9);
        var m = Model(cols, d, Math.Log(5), -1);
        double direct = GaussianGridKernel.LogLikelihoodScalar(cols, 0, cols.Count, m, 0.2);
        double previous = double.PositiveInfinity;
        foreach (var (k, bound) in new[] { (4, 120.0), (16, 12.0), (64, 2.5) })
        {
            var stats = new SufficientStatistics(cols.Grid, k, 0.05 * 0.05, 0.15 * 0.15 * 1.0000001);
            stats.Add(cols, 0, cols.Count);
            double diff = Math.Abs(stats.LogLikelihood(m, 0.2) - direct);
            Assert.True(diff < bound, $"K={k}: |Δ ln L| = {diff}");
            Assert.True(diff < previous);
            previous = diff;
        }
    }
}
