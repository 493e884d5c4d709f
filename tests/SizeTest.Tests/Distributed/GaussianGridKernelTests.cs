using CsCheck;
using SizeTest.Distributed;
using Xunit;

namespace SizeTest.Tests.Distributed;

public sealed class GaussianGridKernelTests
{
    private sealed record Case(double[] Z, double[] Y, double[] Err, double ZMin, double ZMax, int Nodes, double[] Model, double SigmaInt, int Start, int End);

    private static readonly Gen<Case> Cases =
        from n in Gen.Int[0, 3000]
        from nodes in Gen.Int[2, 400]
        from zMin in Gen.Double[0.001, 0.5]
        from span in Gen.Double[1.01, 50]
        from z in Gen.Double[0.0005, 60].Array[n]
        from y in Gen.Double[-20, 5].Array[n]
        from err in Gen.Double[0, 2].Array[n]
        from model in Gen.Double[-20, 5].Array[nodes]
        from sigma in Gen.Double[1e-3, 3]
        from a in Gen.Int[0, n]
        from b in Gen.Int[a, n]
        select new Case(z, y, err, zMin, zMin * span, nodes, model, sigma, a, b);

    private static double RelErr(double a, double b) => Math.Abs(a - b) / Math.Max(1e-300, Math.Max(Math.Abs(a), Math.Abs(b)));

    [Fact]
    public void VectorisedAndParallelKernelsEqualScalarReference()
    {
        // Issue 8 requirement: vectorised kernel == scalar reference to 1e-12 relative on random inputs.
        // (Redshifts outside the grid are clamped to its ends in both paths.)
        Cases.Sample(c =>
        {
            var grid = new LogRedshiftGrid(c.ZMin, c.ZMax, c.Nodes);
            var cols = KernelColumns.Build(c.Z, c.Y, c.Err, grid);
            double scalar = GaussianGridKernel.LogLikelihoodScalar(cols, c.Start, c.End, c.Model, c.SigmaInt);
            double vector = GaussianGridKernel.LogLikelihood(cols, c.Start, c.End, c.Model, c.SigmaInt);
            double parallel = GaussianGridKernel.LogLikelihoodParallel(cols, c.Start, c.End, c.Model, c.SigmaInt);
            Assert.True(RelErr(scalar, vector) <= 1e-12, $"vector {vector:R} vs scalar {scalar:R}");
            Assert.True(RelErr(scalar, parallel) <= 1e-12, $"parallel {parallel:R} vs scalar {scalar:R}");
        }, iter: 300, seed: "0N0XIzNsQ0O2");
    }

    [Fact]
    public void LargeSliceAcrossManyChunksEqualsScalarAndIsIndependentOfThreadCount()
    {
        const int n = 5 * GaussianGridKernel.ChunkRows + 1234;
        var rng = new Random(11);
        var z = new double[n]; var y = new double[n]; var e = new double[n];
        for (int i = 0; i < n; i++) { z[i] = 0.05 + 3 * rng.NextDouble(); y[i] = -11 + rng.NextDouble(); e[i] = 0.05 + 0.1 * rng.NextDouble(); }
        var grid = new LogRedshiftGrid(0.05, 3.05, 1024);
        var cols = KernelColumns.Build(z, y, e, grid);
        var model = new double[grid.Count];
        for (int k = 0; k < model.Length; k++) model[k] = -10.5 - Math.Log(grid.Nodes[k]);
        double scalar = GaussianGridKernel.LogLikelihoodScalar(cols, 0, n, model, 0.2);
        double one = GaussianGridKernel.LogLikelihoodParallel(cols, 0, n, model, 0.2, maxThreads: 1);
        double two = GaussianGridKernel.LogLikelihoodParallel(cols, 0, n, model, 0.2, maxThreads: 2);
        double many = GaussianGridKernel.LogLikelihoodParallel(cols, 0, n, model, 0.2, maxThreads: 7);
        Assert.True(RelErr(scalar, one) <= 1e-12);
        // Fixed chunk boundaries and in-order combination: bitwise the same for any thread count (by construction).
        Assert.Equal(one, two);
        Assert.Equal(one, many);
    }

    [Fact]
    public void SlicesAddUpToTheWhole()
    {
        // ln L is a sum over objects, so ln L[0,n) = ln L[0,m) + ln L[m,n) (exact in real arithmetic; 1e-12 for rounding).
        Gen.Int[1, 4000].Select(Gen.Int[0, 1000], Gen.Double[0.01, 1]).Sample((n, cut, sigma) =>
        {
            int m = Math.Min(cut, n);
            var rng = new Random(n);
            var z = new double[n]; var y = new double[n]; var e = new double[n];
            for (int i = 0; i < n; i++) { z[i] = 0.1 + 2 * rng.NextDouble(); y[i] = rng.NextDouble(); e[i] = 0.1 * rng.NextDouble(); }
            var grid = new LogRedshiftGrid(0.1, 2.1, 64);
            var cols = KernelColumns.Build(z, y, e, grid);
            var model = Enumerable.Range(0, 64).Select(k => 0.5 + 0.01 * k).ToArray();
            double whole = GaussianGridKernel.LogLikelihoodParallel(cols, 0, n, model, sigma);
            double parts = GaussianGridKernel.LogLikelihoodParallel(cols, 0, m, model, sigma) + GaussianGridKernel.LogLikelihoodParallel(cols, m, n, model, sigma);
            Assert.True(RelErr(whole, parts) <= 1e-12);
        }, iter: 100, seed: "0Gv0cKbFQD71");
    }

    [Fact]
    public void SingleObjectMatchesTheGaussianDensityInClosedForm()
    {
        // One object at a grid node: ln L = −½[(y−m)²/(σ²+σ_int²) + ln(2π(σ²+σ_int²))] (Gaussian log density, closed form).
        var grid = new LogRedshiftGrid(0.5, 2.0, 3);
        var cols = KernelColumns.Build([grid.Nodes[1]], [0.7], [0.3], grid);
        double[] model = [9.0, 0.2, -4.0];
        double v = 0.3 * 0.3 + 0.4 * 0.4;
        double expected = -0.5 * ((0.7 - 0.2) * (0.7 - 0.2) / v + Math.Log(2 * Math.PI * v));
        Assert.Equal(expected, GaussianGridKernel.LogLikelihood(cols, 0, 1, model, 0.4), 14);
        Assert.Equal(expected, GaussianGridKernel.LogLikelihoodScalar(cols, 0, 1, model, 0.4), 14);
    }

    [Fact]
    public void RejectsSlicesOutsideTheColumnsAndWrongGridLength()
    {
        var grid = new LogRedshiftGrid(0.5, 2.0, 3);
        var cols = KernelColumns.Build([1.0], [0.7], [0.3], grid);
        Assert.Throws<ArgumentOutOfRangeException>(() => GaussianGridKernel.LogLikelihood(cols, 0, 2, new double[3], 0.1));
        Assert.Throws<ArgumentException>(() => GaussianGridKernel.LogLikelihood(cols, 0, 1, new double[4], 0.1));
    }
}
