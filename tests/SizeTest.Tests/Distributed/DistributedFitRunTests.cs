using SizeTest.Catalogues;
using SizeTest.Cosmology;
using SizeTest.Distributed;
using SizeTest.Inference;
using SizeTest.Inference.Evaluation;
using SizeTest.Photometry;
using SizeTest.Simulation;
using Xunit;

namespace SizeTest.Tests.Distributed;

/// <summary>The library side of `mpirun sizetest fit`, in one process: shares, shared grid bounds, Poisson weights, the study on 1, 2 and 4 (thread) ranks.</summary>
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
        var obs = ObservablesBuilder.Build(CatalogueLoader.Load(path).Rows, PhotometryOptions.Default).Observables;
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

    [Theory]
    [InlineData(ObservableKind.Size)]
    [InlineData(ObservableKind.Joint)]
    [InlineData(ObservableKind.SurfaceBrightness)]
    public void SurveyTermsWithTheSharedGridAddUpToTheWholeLikelihood(ObservableKind observable)
    {
        // Photo-z marginalisation (prior = the whole sample's range), the size–luminosity relation and a minimum size, free Ωm
        // (surface brightness: photo-z and an SB limit): per-object sums whose grid and prior come from the shared span, so any split
        // adds up to the whole.
        var mock = MockSurveyGenerator.Generate(new MockSurveySpec(new LambdaCdmModel(70, 0.3),
            new SurveyDesign(2000, UniformZ(0.2, 2), MockObjectKind.Galaxy, new MeasurementErrors(0.05, PhotoZError: 0.04), new MockSelection(MinThetaArcsec: 0.3)),
            5, null, null, new SurveyPopulation(new SchechterLuminosityFunction(), SizeLuminositySlope: 0.3)), parallel: false);
        var obs = mock.ToObservables();
        bool sb = observable == ObservableKind.SurfaceBrightness;
        var sv = new SizeTest.Inference.Survey.SurveyModel(sb ? SizeTest.Inference.Survey.SizeRelationKind.None : SizeTest.Inference.Survey.SizeRelationKind.Luminosity,
            MarginaliseRedshift: true);
        var h = Hypothesis.Create(WorldModels.LambdaCdm, new NuisanceModel(observable, sb ? new SelectionLimits(SbLimit: 24) : new SelectionLimits(MinThetaArcsec: 0.3), Survey: sv),
            sb ? null : new ParameterOverrides(Free: new HashSet<string> { "omega_m" }));
        var span = new RedshiftGridSpan(obs.Z.Min(), obs.Z.Max(), obs.Count);
        var theta = h.Bind(obs).SuggestStart();
        double expected = new HypothesisLikelihood(h, obs, span).LogDensity(theta);
        Assert.True(double.IsFinite(expected));
        foreach (int parts in new[] { 2, 5 })
        {
            double sum = 0;
            for (int r = 0; r < parts; r++)
            {
                var (s, e) = RowPartition.RowRange(obs.Count, r, parts);
                sum += new HypothesisLikelihood(h, ObservablesSubset.Take(obs, Enumerable.Range((int)s, (int)(e - s)).ToArray()), span).LogDensity(theta);
            }
            // Same grid nodes, quadrature nodes and prior: only the order of additions differs (1e-12 relative allowed).
            Assert.True(Math.Abs(sum - expected) <= 1e-12 * Math.Abs(expected), $"{parts} parts: {sum:R} vs {expected:R}");
        }
    }

    [Fact]
    public void ALuminosityWindowsObjectCountAndWeightSumAreTheSameOnOneTwoAndFourRanks()
    {
        // Each world model's luminosity window keeps its own objects, so each model's n of BIC/AICc (RowSumLikelihood.InformationWeight)
        // is a sum over every rank's kept objects; 3000 rows = 3 chunks of 1024 (the last partial), so 4 ranks include one without rows.
        var mock = MockSurveyGenerator.Generate(new MockSurveySpec(new LambdaCdmModel(70, 0.3),
            new SurveyDesign(3000, UniformZ(0.2, 1.5), MockObjectKind.Galaxy, new MeasurementErrors(0.05)),
            5, null, null, new SurveyPopulation(new SchechterLuminosityFunction(), SizeLuminositySlope: 0.3)), parallel: false);
        var obs = mock.ToObservables();
        var sv = new SizeTest.Inference.Survey.SurveyModel(SizeTest.Inference.Survey.SizeRelationKind.Luminosity, AbsMagMin: -22, AbsMagMax: -20);
        var hs = new[] { WorldModels.LambdaCdm, WorldModels.StaticLinear }
            .Select(f => Hypothesis.Create(f, new NuisanceModel(ObservableKind.Size, Survey: sv))).ToArray();
        (double, int)[] Counts(IProcessGroup group)
        {
            var (s, e) = RowPartition.RowRange(obs.Count, group.Rank, group.Size);
            var local = ObservablesSubset.Take(obs, Enumerable.Range((int)s, (int)(e - s)).ToArray());
            var backend = new EvaluationBackend(group, local);
            return hs.Select(h => { var l = backend.Bind(h); return (l.InformationWeight, l.ModelObjects); }).ToArray();
        }
        var one = Counts(SingleProcessGroup.Instance);
        // The window keeps part of the sample, and the two models' D_L keep different parts (cf. LuminosityWindowCliTests: 236 vs 206 of 800).
        Assert.All(one, c => Assert.InRange(c.Item2, 1, obs.Count - 1));
        Assert.All(one, c => Assert.Equal(c.Item2, c.Item1));
        Assert.NotEqual(one[0].Item2, one[1].Item2);
        foreach (int size in new[] { 2, 4 })
            foreach (var r in ThreadRanks.Run(size, Counts)) Assert.Equal(one, r);
    }

    private static RedshiftDistribution UniformZ(double lo, double hi)
    {
        Assert.True(RedshiftDistribution.TryParse(FormattableString.Invariant($"uniform:{lo}:{hi}"), out var d, out var err), err);
        return d!;
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
            var shares = Enumerable.Range(0, 3).Select(r => CatalogueShare.Load(path, new CatalogueLoadOptions(), r, 3)).ToArray();
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
        var single = CatalogueShare.Load(parquet, new CatalogueLoadOptions(), 0, 1).Combine(SingleProcessReducer.Instance);
        Assert.Equal((2000L, 1999L, 1L), (single.RowsRead, single.Accepted, single.Rejected));
        Assert.Equal(CatalogueLoader.Load(parquet).RejectLog.ToCsv(), single.RejectCsv);
    }

    [Fact]
    public void OneFitStudyGivesIdenticalResultsOnOneTwoAndFourRanksIncludingCvProfilesAndBootstrap()
    {
        // 3 chunks of 1024 rows (the last partial): 2 ranks hold 2 + 1 chunks, 4 ranks 1 + 1 + 1 + none (a rank without rows).
        var path = DistributedFitCatalogues.Csv(_dir, 2600);
        var hs = new[]
        {
            Hypothesis.Create(WorldModels.LambdaCdm, new NuisanceModel(ObservableKind.Size), new ParameterOverrides(Free: new HashSet<string> { "omega_m" })),
            Hypothesis.Create(WorldModels.StaticLinear, new NuisanceModel(ObservableKind.Size)),
        };
        FitResult Study(IProcessGroup group)
        {
            var share = CatalogueShare.Load(path, new CatalogueLoadOptions(), group.Rank, group.Size);
            var local = ObservablesBuilder.Build(share.Local, PhotometryOptions.Default).Observables;
            var backend = new EvaluationBackend(group, local, share.Local.SourceRows, share.ChunkKeys);
            return FitRun.Run(new FitRequest
            {
                Hypotheses = hs, Observables = local, Backend = backend, Source = "mock", Starts = 2,
                CrossValidationFolds = 3, ProfileParameter = "size_evolution", Bootstrap = 2, Sampler = SamplerKind.Mcmc, Walkers = 8, Steps = 200,
            });
        }
        string Numbers(FitResult r) => ResultsJson.Serialize(r with { Notes = [] });
        string one = Numbers(Study(SingleProcessGroup.Instance));
        Assert.Contains("\"cross_validation\"", one);
        foreach (int size in new[] { 2, 4 })
        {
            var results = ThreadRanks.Run(size, Study);
            // Bit-identical: every rank adds the same chunk sums in the same order (EvaluationBackend remarks).
            foreach (var r in results) Assert.Equal(one, Numbers(r));
        }
        var parsed = ResultsJson.Deserialize(one);
        Assert.Equal(2, parsed.CrossValidation.Count);
        Assert.Equal(2, parsed.Profiles.Count);
        Assert.Equal(2, parsed.Bootstrap.Count);
    }

    [Fact]
    public void ChunkSumsEqualTheWholeSampleLikelihoodToRounding()
    {
        var path = DistributedFitCatalogues.Csv(_dir, 3000);
        var obs = ObservablesBuilder.Build(CatalogueLoader.Load(path).Rows, PhotometryOptions.Default).Observables;
        var h = Hypothesis.Create(WorldModels.LambdaCdm, new NuisanceModel(ObservableKind.Size), new ParameterOverrides(Free: new HashSet<string> { "omega_m" }));
        var theta = h.StartVector();
        double whole = h.Bind(obs).LogDensity(theta);
        double chunked = EvaluationBackend.InProcess(obs).Bind(h).LogDensity(theta);
        // Same terms, summed in 3 chunks instead of one pass (rounding, ~1e-15 relative; 1e-12 allowed).
        Assert.True(Math.Abs(chunked - whole) <= 1e-12 * Math.Abs(whole), $"{chunked:R} vs {whole:R}");
        // A re-weighted sample equals the sample with the rows repeated.
        var weights = Enumerable.Range(0, obs.Count).Select(i => i % 3).ToArray();
        var rows = Enumerable.Range(0, obs.Count).SelectMany(i => Enumerable.Repeat(i, weights[i])).ToArray();
        var span = new RedshiftGridSpan(obs.Z.Min(), obs.Z.Max(), obs.Count); // the backend's grid spans the whole sample
        double repeated = new HypothesisLikelihood(h, ObservablesSubset.Take(obs, rows), span).LogDensity(theta);
        double weighted = EvaluationBackend.InProcess(obs).Bind(h, weights).LogDensity(theta);
        Assert.True(Math.Abs(weighted - repeated) <= 1e-12 * Math.Abs(repeated), $"{weighted:R} vs {repeated:R}");
    }
}

/// <summary>Ranks simulated by threads in one process (for fast rank-invariance tests): <see cref="SumAll"/> adds the
/// ranks' vectors in rank order behind a barrier, as an Allreduce does.</summary>
internal sealed class ThreadRanks : IProcessGroup
{
    private readonly Shared _shared;

    private ThreadRanks(Shared shared, int rank) { _shared = shared; Rank = rank; }

    public int Rank { get; }
    public int Size => _shared.Size;
    public bool IsRoot => Rank == 0;
    public string Description => $"{Size} thread ranks";

    public void SumAll(ReadOnlySpan<double> local, Span<double> total)
    {
        _shared.Slots[Rank] = local.ToArray();
        _shared.Barrier.SignalAndWait();
        total.Clear();
        for (int r = 0; r < Size; r++)
            for (int i = 0; i < total.Length; i++) total[i] += _shared.Slots[r][i];
        _shared.Barrier.SignalAndWait();
    }

    public static T[] Run<T>(int size, Func<IProcessGroup, T> body)
    {
        var shared = new Shared(size);
        var results = new T[size];
        var threads = Enumerable.Range(0, size).Select(r => new Thread(() => results[r] = body(new ThreadRanks(shared, r)), 16 << 20)).ToArray();
        foreach (var t in threads) t.Start();
        foreach (var t in threads) Assert.True(t.Join(TimeSpan.FromMinutes(3)), "a thread rank did not finish");
        return results;
    }

    private sealed class Shared(int size)
    {
        public int Size { get; } = size;
        public double[][] Slots { get; } = new double[size][];
        public Barrier Barrier { get; } = new(size);
    }
}
