using System.Text.Json;
using SizeTest.Catalogs;
using SizeTest.Catalogs.Parquet;
using SizeTest.Distributed;
using SizeTest.Inference;
using SizeTest.Photometry;
using SizeTest.Tests.Cli;
using Xunit;

namespace SizeTest.Tests.Distributed;

/// <summary>A maximum-likelihood fit of a Parquet catalogue split across ranks, against the single-process fitter.</summary>
public sealed class DistributedFitTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-dfit-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    // SYNTHETIC: 12 000 rows, row groups of 1000, row 6 with z < 0 (rejected).
    private string WriteCatalogue()
    {
        const int n = 12_000;
        var z = new double[n]; var y = new double[n]; var e = new double[n];
        SyntheticKernelRows.Fill(31, 0, z, y, e);
        var th = y.Select(v => Math.Exp(v) * SizeTest.Common.Units.ArcsecPerRadian).ToArray();
        var te = th.Select((t, i) => t * e[i]).ToArray();
        z[5] = -1;
        var path = Path.Combine(_dir, "fit.parquet");
        ParquetTableWriter.Write(path, [ParquetColumnValues.Number("z", z), ParquetColumnValues.Number("theta", th), ParquetColumnValues.Number("theta_err", te)], 1000);
        return path;
    }

    [Fact]
    public void SingleProcessDistributedFitMatchesTheInferenceFitter()
    {
        var path = WriteCatalogue();
        var hypothesis = Hypothesis.Create(SizeTest.Cosmology.WorldModels.EinsteinDeSitter, new NuisanceModel(ObservableKind.Size));
        var fit = DistributedMaximumLikelihood.Fit(SingleProcessReducer.Instance, path, new CatalogLoadOptions(), hypothesis)!;
        Assert.True(fit.Converged);
        Assert.Equal((12_000L, 11_999L, 1L), (fit.RowsRead, fit.Accepted, fit.Rejected));

        var load = CatalogLoader.Load(path);
        var reference = MaximumLikelihood.Fit(hypothesis.Bind(ObservablesBuilder.Build(load.Sample, PhotometryOptions.Default).Observables));
        Assert.True(reference.Converged);
        // Both maximise the same function: the maxima agree to the optimisers' tolerance (1e-10 relative in −ln L).
        Assert.True(Math.Abs(fit.LogLikelihood - reference.LogLikelihood) <= 1e-7 * Math.Abs(reference.LogLikelihood),
            $"{fit.LogLikelihood:R} vs {reference.LogLikelihood:R}");
        for (int j = 0; j < fit.Theta.Length; j++)
            Assert.True(Math.Abs(fit.Theta[j] - reference.Theta[j]) <= 1e-4 * Math.Max(1, Math.Abs(reference.Theta[j])), fit.ParameterNames[j]);
    }

    [MpiFact]
    public void TwoAndFourRanksFitTheSameAsOneProcess()
    {
        var path = WriteCatalogue();
        var (exit, stdout, stderr) = CliRunner.Run("ranks", "--catalog", path, "--model", "eds", "--format", "json");
        Assert.True(exit == 0, stderr);
        var single = JsonDocument.Parse(stdout).RootElement;
        foreach (var np in new[] { 2, 4 })
        {
            (exit, stdout, stderr) = MpiRunner.Run(np, "ranks", "--catalog", path, "--model", "eds", "--format", "json");
            Assert.True(exit == 0, $"{np} ranks, exit {exit}: {stderr}");
            var lines = stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
            Assert.Single(lines); // only rank 0 writes
            var multi = JsonDocument.Parse(lines[0]).RootElement;
            Assert.Equal(11_999, multi.GetProperty("accepted").GetInt64());
            Assert.Equal(1, multi.GetProperty("rejected").GetInt64());
            double a = single.GetProperty("log_likelihood").GetDouble(), b = multi.GetProperty("log_likelihood").GetDouble();
            // Fixed cosmology: exact D_A per object, so ranks change only the order of additions; the optimum found
            // differs only within Nelder–Mead's tolerance (1e-10 relative in −ln L).
            Assert.True(Math.Abs(a - b) <= 1e-9 * Math.Abs(a), $"{np} ranks: ln L {b:R} vs {a:R}");
            var pa = single.GetProperty("parameters").EnumerateArray().Select(p => p.GetProperty("value").GetDouble()).ToArray();
            var pb = multi.GetProperty("parameters").EnumerateArray().Select(p => p.GetProperty("value").GetDouble()).ToArray();
            for (int j = 0; j < pa.Length; j++)
                Assert.True(Math.Abs(pa[j] - pb[j]) <= 1e-5 * Math.Max(1, Math.Abs(pa[j])), $"{np} ranks: parameter {j} {pb[j]:R} vs {pa[j]:R}");
        }
    }

    [MpiFact]
    public void EnsembleSamplerThroughTwoRanksGivesTheSamePosterior()
    {
        // Goodman–Weare sampler of the Inference stage on rank 0, every evaluation collective. Its random numbers
        // are drawn from its own seeded Random, so the 2-rank chain follows the single-process chain; the start
        // ball is centred at each run's own maximum (equal to ~1e-7), so medians agree to ~1e-6 (measured 3e-7).
        var path = WriteCatalogue();
        string[] args = ["ranks", "--catalog", path, "--model", "eds", "--format", "json", "--mcmc-steps", "200", "--seed", "5"];
        var (exit, stdout, stderr) = CliRunner.Run(args);
        Assert.True(exit == 0, stderr);
        var single = JsonDocument.Parse(stdout).RootElement.GetProperty("mcmc");
        (exit, stdout, stderr) = MpiRunner.Run(2, args);
        Assert.True(exit == 0, $"exit {exit}: {stderr}");
        var two = JsonDocument.Parse(stdout.Trim()).RootElement.GetProperty("mcmc");
        var a = single.GetProperty("median").EnumerateArray().Select(x => x.GetDouble()).ToArray();
        var b = two.GetProperty("median").EnumerateArray().Select(x => x.GetDouble()).ToArray();
        for (int j = 0; j < a.Length; j++)
            Assert.True(Math.Abs(a[j] - b[j]) <= 1e-4 * Math.Abs(a[j]), $"median {j}: {b[j]:R} vs {a[j]:R}");
        Assert.True(two.GetProperty("acceptance").GetDouble() is > 0.2 and < 0.9);
    }
}
