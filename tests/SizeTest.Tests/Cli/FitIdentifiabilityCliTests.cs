using System.Globalization;
using System.Text;
using System.Text.Json;
using SizeTest.Tests.Inference;
using Xunit;
using SizeTest.Foundation.Angles;

namespace SizeTest.Tests.Cli;

/// <summary>`fit` refuses impossible work with exit 2 and writes the interval fields (issue 11 items 5 and 7, issue 14).</summary>
public sealed class FitIdentifiabilityCliTests : IDisposable
{
    private readonly string _dir = Path.Combine(Path.GetTempPath(), "sizetest-ident-" + Guid.NewGuid().ToString("N"));

    public FitIdentifiabilityCliTests() => Directory.CreateDirectory(_dir);

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    private static readonly string[] ColArgs = ["--col", "z=z", "--col", "theta=theta_arcsec:arcsec", "--col", "theta_err=theta_err_arcsec:arcsec"];

    private string Catalogue(int n, int seed = 3)
    {
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(new Dictionary<string, double>()), n, new MockCatalogue.Truth(), seed);
        var sb = new StringBuilder("# synthetic mock catalogue for tests\nid,z,theta_arcsec,theta_err_arcsec\n");
        for (int i = 0; i < obs.Count; i++)
        {
            double th = Math.Exp(obs.LnTheta![i]) * AngleUnits.ArcsecPerRadian;
            sb.Append(CultureInfo.InvariantCulture, $"g{i},{obs.Z[i]:R},{th:R},{0.05 * th:R}\n");
        }
        var path = Path.Combine(_dir, $"mock{n}.csv");
        File.WriteAllText(path, sb.ToString());
        return path;
    }

    [Fact]
    public void MoreFreeParametersThanObjectsExitsTwoNamingTheCounts()
    {
        // Size fit: r0_kpc, size_evolution, scatter_dex free (k = 3) on 2 objects.
        var (exit, _, err) = CliRunner.Run(["fit", Catalogue(2), .. ColArgs, "--models", "eds", "--observable", "size", "--out", Path.Combine(_dir, "o1")]);
        Assert.Equal(2, exit);
        Assert.Contains("k = 3", err, StringComparison.Ordinal);
        Assert.Contains("n = 2", err, StringComparison.Ordinal);
        Assert.False(Directory.Exists(Path.Combine(_dir, "o1")), "nothing may be written for a refused fit");
    }

    [Fact]
    public void MoreFoldsThanRowsExitsTwo()
    {
        var (exit, _, err) = CliRunner.Run(["fit", Catalogue(200), .. ColArgs, "--models", "eds", "--observable", "size", "--cv-folds", "201", "--out", Path.Combine(_dir, "o2")]);
        Assert.Equal(2, exit);
        Assert.Contains("--cv-folds 201", err, StringComparison.Ordinal);
        Assert.Contains("200", err, StringComparison.Ordinal);
    }

    [Fact]
    public void ResultsJsonStatesHowEveryIntervalWasObtained()
    {
        var outDir = Path.Combine(_dir, "o3");
        var (exit, stdout, err) = CliRunner.Run(["fit", Catalogue(300), .. ColArgs, "--models", "eds,static-linear", "--observable", "size", "--cv-folds", "3", "--out", outDir]);
        Assert.True(exit == 0, err + stdout);
        using var doc = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "results.json")));
        foreach (var m in doc.RootElement.GetProperty("models").EnumerateArray())
        {
            Assert.Equal(JsonValueKind.Array, m.GetProperty("modes").ValueKind);
            Assert.True(m.GetProperty("rank").GetInt32() >= 1);
            Assert.Equal(JsonValueKind.False, m.GetProperty("tied").ValueKind);
            foreach (var p in m.GetProperty("parameters").EnumerateObject())
            {
                string method = p.Value.GetProperty("interval_method").GetString()!;
                Assert.Contains(method, new[] { "hessian", "profile", "posterior", "bootstrap", "fixed" });
                Assert.Equal(p.Value.GetProperty("fixed").GetBoolean(), method == "fixed");
                Assert.True(p.Value.TryGetProperty("at_bound", out _));
                Assert.Equal(JsonValueKind.Array, p.Value.GetProperty("regions").ValueKind);
            }
        }
        var diff = Assert.Single(doc.RootElement.GetProperty("cross_validation_differences").EnumerateArray().ToArray());
        Assert.True(diff.GetProperty("difference").GetDouble() <= 0);
        Assert.Contains("paired cross-validated Δ ln p", stdout, StringComparison.Ordinal);
    }
}
