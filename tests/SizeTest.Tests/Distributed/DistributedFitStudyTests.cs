using SizeTest.Catalogs;
using SizeTest.Cosmology;
using SizeTest.Distributed;
using SizeTest.Inference;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Distributed;

/// <summary>The library side of `mpirun sizetest fit`, in one process: shares, shared grid bounds, Poisson weights, the study.</summary>
public sealed class DistributedFitStudyTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-dstudy-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    [Fact]
    public void PoissonWeightsHaveMeanAndVarianceOneAndDoNotDependOnTheSplit()
    {
        // Poisson(1): mean 1, variance 1, P(0) = e^−1 (closed form). 2×10^5 draws: standard errors 0.0022 (mean),
        // ≈ 0.0032 (variance), 0.0011 (P(0)); the bounds are about 5σ.
        const int n = 200_000;
        double s = 0, s2 = 0, zeros = 0;
        for (int i = 0; i < n; i++)
        {
            int w = PoissonBootstrapWeights.Weight(7, 3, i);
            s += w; s2 += (double)w * w;
            if (w == 0) zeros++;
        }
        double mean = s / n, variance = s2 / n - mean * mean;
        Assert.InRange(mean, 0.99, 1.01);
        Assert.InRange(variance, 0.984, 1.016);
        Assert.InRange(zeros / n, Math.Exp(-1) - 0.0055, Math.Exp(-1) + 0.0055);
        // The weight of a row is a function of (seed, replicate, row) only, so a split of the rows changes nothing.
        long[] rows = [10, 11, 12, 13, 14, 15];
        var whole = PoissonBootstrapWeights.Rows(7, 2, rows).Select(i => rows[i]);
        var parts = PoissonBootstrapWeights.Rows(7, 2, rows[..2]).Select(i => rows[i])
            .Concat(PoissonBootstrapWeights.Rows(7, 2, rows[2..]).Select(i => rows[2 + i]));
        Assert.Equal(whole, parts);
        Assert.NotEqual(PoissonBootstrapWeights.Rows(7, 2, rows), PoissonBootstrapWeights.Rows(7, 4, rows));
    }

    [Fact]
    public void PartsWithTheSharedGridAddUpToTheWholeFreeCosmologyLikelihood()
    {
        var path = DistributedFitCatalogues.Csv(_dir, 3000);
        var obs = ObservablesBuilder.Build(CatalogLoader.Load(path).Sample, PhotometryOptions.Default).Observables;
        var h = Hypothesis.Create(WorldModels.LambdaCdm, new NuisanceModel(ObservableKind.Size), new ParameterOverrides(Free: new HashSet<string> { "omega_m" }));
        var whole = h.Bind(obs);
        var span = new RedshiftGridSpan(obs.Z.Min(), obs.Z.Max(), obs.Count);
        var theta = h.StartVector();
        double expected = whole.LogDensity(theta);
        foreach (int parts in new[] { 2, 3, 7 })
        {
            double sum = 0;
            for (int r = 0; r < parts; r++)
            {
                var (s, e) = RowPartition.RowRange(obs.Count, r, parts);
                var rows = Enumerable.Range((int)s, (int)(e - s)).ToArray();
                sum += new HypothesisLikelihood(h, ObservablesSubset.Take(obs, rows), span).LogDensity(theta);
            }
            // Same nodes and stencil weights as the whole-sample grid: only the order of additions differs
            // (rounding, ~1e-15 relative; 1e-12 allowed).
            Assert.True(Math.Abs(sum - expected) <= 1e-12 * Math.Abs(expected), $"{parts} parts: {sum:R} vs {expected:R}");
        }
    }

    [Fact]
    public void SharedBoundsGridEqualsTheWholeSampleGrid()
    {
        double[] z = Enumerable.Range(1, 500).Select(i => 0.01 * i * (1 + 0.3 * Math.Sin(i))).ToArray();
        var whole = new RedshiftGrid(z, 48);
        Assert.False(whole.IsExact);
        var part = new RedshiftGrid(z.AsSpan(100, 50), 48, z.Min(), z.Max());
        Assert.Equal(whole.Nodes, part.Nodes);
        for (int i = 0; i < 50; i++)
        {
            Assert.Equal(whole.Index[100 + i], part.Index[i]);
            Assert.Equal(whole.Weights.AsSpan(4 * (100 + i), 4).ToArray(), part.Weights.AsSpan(4 * i, 4).ToArray());
        }
        Assert.Throws<ArgumentOutOfRangeException>(() => new RedshiftGrid([0.5, 9.0], 48, 0.1, 2.0));
    }

    [Fact]
    public void SharesCoverEveryRowOnceAndCountRejectsOnce()
    {
        var csv = DistributedFitCatalogues.Csv(_dir, 2000);
        var parquet = DistributedFitCatalogues.Parquet(_dir, 2000, 300);
        foreach (var path in new[] { csv, parquet })
        {
            var shares = Enumerable.Range(0, 3).Select(r => CatalogShare.Load(path, new CatalogLoadOptions(), r, 3)).ToArray();
            Assert.Equal(2000, shares.Sum(s => s.RowsRead));
            Assert.Equal(1999, shares.Sum(s => s.Accepted));
            Assert.Equal(1, shares.Sum(s => s.Rejected));
            Assert.Equal(1999, shares.Sum(s => s.Local.Count));
            var rows = shares.SelectMany(s => s.Local.SourceRows).ToArray();
            Assert.Equal(rows.Distinct().Count(), rows.Length);
            var rejected = shares.Single(s => s.Rejected == 1).Rejects.Entries.Single();
            Assert.Equal("z", rejected.Column);
            Assert.DoesNotContain(rejected.Row, rows); // the rejected file row is in no share
        }
        var single = CatalogShare.Load(parquet, new CatalogLoadOptions(), 0, 1).Combine(SingleProcessReducer.Instance);
        Assert.Equal((2000L, 1999L, 1L), (single.RowsRead, single.Accepted, single.Rejected));
        Assert.Equal(CatalogLoader.Load(parquet).RejectLog.ToCsv(), single.RejectCsv);
    }

    [Fact]
    public void SingleRankStudyEqualsTheSingleProcessStudy()
    {
        var path = DistributedFitCatalogues.Csv(_dir, 3000);
        var load = CatalogLoader.Load(path);
        var obs = ObservablesBuilder.Build(load.Sample, PhotometryOptions.Default).Observables;
        var hs = new[] { WorldModels.LambdaCdm, WorldModels.EinsteinDeSitter }.Select(f => Hypothesis.Create(f, new NuisanceModel(ObservableKind.Size))).ToArray();
        var request = new FitRequest { Hypotheses = hs, Observables = obs, Source = path, RowsRead = load.RowsRead, Rejected = load.Rejected, Starts = 2 };
        var reference = FitStudy.Run(request);
        var share = CatalogShare.Load(path, new CatalogLoadOptions(), 0, 1);
        var distributed = DistributedFitStudy.Run(SingleProcessReducer.Instance, request, share.Local.SourceRows, obs)!;
        Assert.Equal(reference.Models.Select(m => m.Name), distributed.Models.Select(m => m.Name));
        for (int i = 0; i < reference.Models.Count; i++)
        {
            var a = reference.Models[i];
            var b = distributed.Models[i];
            // The same optimiser on the same function from the same start (1e-12: rounding only).
            Assert.True(Math.Abs(a.LogLikelihood - b.LogLikelihood) <= 1e-12 * Math.Abs(a.LogLikelihood), a.Name);
            Assert.Equal(a.Parameters.Select(p => p.Value), b.Parameters.Select(p => p.Value), (x, y) => x.Equals(y) || Math.Abs(x - y) <= 1e-9 * Math.Max(1, Math.Abs(x)));
            Assert.Equal(a.N, b.N);
        }
        Assert.Equal(reference.LikelihoodRatioTests.Count, distributed.LikelihoodRatioTests.Count);
        Assert.Equal(reference.RequiredEvolution.Select(r => r.Model), distributed.RequiredEvolution.Select(r => r.Model));
        Assert.Equal((reference.RowsRead, reference.Accepted, reference.Rejected), (distributed.RowsRead, distributed.Accepted, distributed.Rejected));
    }
}
