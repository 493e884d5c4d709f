using System.Text.Json;
using SizeTest.Tests.Cli;
using Xunit;

namespace SizeTest.Tests.Distributed;

/// <summary>`mpirun -np N sizetest fit …` against the single-process `sizetest fit` of the same catalogue.</summary>
public sealed class MpiFitCommandTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-mpifit-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private static JsonElement Results(string folder) => JsonDocument.Parse(File.ReadAllText(Path.Combine(folder, "results.json"))).RootElement;

    // ln L to 1e-10 relative (issue 8); parameters to 1e-5 (Nelder–Mead's relative tolerance 1e-10 in −ln L gives
    // parameters to about its square root, as in DistributedFitTests); counts and model order exactly.
    private static void AssertSameFit(JsonElement a, JsonElement b, string label)
    {
        Assert.Equal(a.EnumerateObject().Select(p => p.Name), b.EnumerateObject().Select(p => p.Name)); // same schema
        foreach (var key in new[] { "rows_read", "accepted", "rejected" })
            Assert.Equal(a.GetProperty(key).GetInt64(), b.GetProperty(key).GetInt64());
        var ma = a.GetProperty("models").EnumerateArray().ToArray();
        var mb = b.GetProperty("models").EnumerateArray().ToArray();
        Assert.Equal(ma.Select(m => m.GetProperty("name").GetString()), mb.Select(m => m.GetProperty("name").GetString()));
        for (int i = 0; i < ma.Length; i++)
        {
            double la = ma[i].GetProperty("log_likelihood").GetDouble(), lb = mb[i].GetProperty("log_likelihood").GetDouble();
            Assert.True(Math.Abs(la - lb) <= 1e-10 * Math.Abs(la), $"{label} {ma[i].GetProperty("name")}: ln L {lb:R} vs {la:R}");
            Assert.True(mb[i].GetProperty("converged").GetBoolean());
            foreach (var p in ma[i].GetProperty("parameters").EnumerateObject())
            {
                var va = p.Value.GetProperty("value");
                var vb = mb[i].GetProperty("parameters").GetProperty(p.Name).GetProperty("value");
                if (va.ValueKind != JsonValueKind.Number) { Assert.Equal(va.ValueKind, vb.ValueKind); continue; }
                double x = va.GetDouble(), y = vb.GetDouble();
                Assert.True(Math.Abs(x - y) <= 1e-5 * Math.Max(1, Math.Abs(x)), $"{label} {ma[i].GetProperty("name")} {p.Name}: {y:R} vs {x:R}");
            }
        }
        Assert.Equal(a.GetProperty("likelihood_ratio_tests").GetArrayLength(), b.GetProperty("likelihood_ratio_tests").GetArrayLength());
    }

    [MpiFact]
    public void TwoAndFourRanksFitACsvCatalogueAsOneProcessDoesAndOnlyRankZeroWrites()
    {
        var csv = DistributedFitCatalogues.Csv(_dir, 8000);
        string single = Path.Combine(_dir, "single");
        var (exit, _, stderr) = CliRunner.Run("fit", csv, "--models", "lcdm,eds", "--out", single, "--cv-folds", "0");
        Assert.True(exit == 0, stderr);
        foreach (int np in new[] { 2, 4 })
        {
            string parent = Path.Combine(_dir, $"np{np}");
            Directory.CreateDirectory(parent);
            string output = Path.Combine(parent, "out");
            (exit, var stdout, stderr) = MpiRunner.Run(np, "fit", csv, "--models", "lcdm,eds", "--out", output);
            Assert.True(exit == 0, $"{np} ranks, exit {exit}: {stderr}");
            AssertSameFit(Results(single), Results(output), $"{np} ranks");
            Assert.Equal(File.ReadAllText(Path.Combine(single, "rejects.csv")), File.ReadAllText(Path.Combine(output, "rejects.csv")));
            // Only rank 0 prints and writes: one table on stdout, one output folder with the three files, nothing else.
            Assert.Single(stdout.Split('\n'), l => l.StartsWith("rank  model", StringComparison.Ordinal));
            Assert.Equal(["out"], Directory.GetFileSystemEntries(parent).Select(Path.GetFileName));
            Assert.Equal([".sizetest-output", "rejects.csv", "results.csv", "results.json"], Directory.GetFiles(output).Select(Path.GetFileName).Order(StringComparer.Ordinal));
            Assert.Contains(Results(output).GetProperty("notes").EnumerateArray(), n => n.GetString()!.Contains($"{np} ranks"));
        }
    }

    [MpiFact]
    public void FourRanksFitAParquetCatalogueWithFreeCosmologyAsOneProcessDoes()
    {
        // Row groups of 500 rows: each rank reads only its own groups; omega_m free uses the D_A grid, whose
        // bounds the ranks share, so ln L is rank-invariant to rounding.
        var parquet = DistributedFitCatalogues.Parquet(_dir, 6000, 500);
        string single = Path.Combine(_dir, "single");
        var (exit, _, stderr) = CliRunner.Run("fit", parquet, "--models", "lcdm", "--free", "omega_m", "--out", single, "--cv-folds", "0");
        Assert.True(exit == 0, stderr);
        string output = Path.Combine(_dir, "np4");
        (exit, _, stderr) = MpiRunner.Run(4, "fit", parquet, "--models", "lcdm", "--free", "omega_m", "--out", output, "--format", "json");
        Assert.True(exit == 0, $"exit {exit}: {stderr}");
        AssertSameFit(Results(single), Results(output), "4 ranks, Parquet");
        Assert.Equal(File.ReadAllText(Path.Combine(single, "rejects.csv")), File.ReadAllText(Path.Combine(output, "rejects.csv")));
    }

    [MpiFact]
    public void PoissonBootstrapAndEnsembleSamplerDoNotDependOnTheRankCount()
    {
        var csv = DistributedFitCatalogues.Csv(_dir, 4000);
        string[] Args(string o) => ["fit", csv, "--models", "eds", "--bootstrap", "3", "--sampler", "mcmc", "--walkers", "8", "--steps", "60", "--out", o];
        string one = Path.Combine(_dir, "np1"), two = Path.Combine(_dir, "np2"), single = Path.Combine(_dir, "single");
        var (exit, _, stderr) = MpiRunner.Run(1, Args(one));
        Assert.True(exit is 0 or 1, stderr); // 1: a 60-step chain may be judged not converged; the numbers are still written
        (exit, _, stderr) = MpiRunner.Run(2, Args(two));
        Assert.True(exit is 0 or 1, stderr);
        var a = Results(one);
        var b = Results(two);
        // Poisson weights depend on (seed, replicate, file row) only; each refit is the same optimisation, so the
        // bootstrap medians agree to the refits' tolerance (1e-9 in −ln L; 1e-5 in the parameters).
        var ia = a.GetProperty("bootstrap")[0].GetProperty("intervals").EnumerateArray().ToArray();
        var ib = b.GetProperty("bootstrap")[0].GetProperty("intervals").EnumerateArray().ToArray();
        Assert.Equal(ia.Length, ib.Length);
        for (int j = 0; j < ia.Length; j++)
        {
            double x = ia[j].GetProperty("median").GetDouble(), y = ib[j].GetProperty("median").GetDouble();
            Assert.True(Math.Abs(x - y) <= 1e-5 * Math.Max(1, Math.Abs(x)), $"bootstrap median {j}: {y:R} vs {x:R}");
        }
        // The sampler draws from its own seeded generator, so the chains through 1 and 2 ranks follow each other and
        // the single-process chain (posterior medians to 1e-4, as in DistributedFitTests).
        (exit, _, stderr) = CliRunner.Run(["fit", csv, "--models", "eds", "--sampler", "mcmc", "--walkers", "8", "--steps", "60", "--cv-folds", "0", "--out", single]);
        Assert.True(exit is 0 or 1, stderr);
        var s = Results(single);
        foreach (var p in s.GetProperty("models")[0].GetProperty("parameters").EnumerateObject())
        {
            double x = p.Value.GetProperty("value").GetDouble();
            double y = b.GetProperty("models")[0].GetProperty("parameters").GetProperty(p.Name).GetProperty("value").GetDouble();
            Assert.True(Math.Abs(x - y) <= 1e-4 * Math.Max(1, Math.Abs(x)), $"posterior median {p.Name}: {y:R} vs {x:R}");
        }
        Assert.True(File.Exists(Path.Combine(two, "chains_eds.csv")));
    }

    [MpiFact]
    public void AnExistingOutputFolderStopsAllRanksWithOneMessage()
    {
        var csv = DistributedFitCatalogues.Csv(_dir, 500);
        string output = Path.Combine(_dir, "taken");
        Directory.CreateDirectory(output);
        File.WriteAllText(Path.Combine(output, "keep.txt"), "earlier results");
        var (exit, stdout, stderr) = MpiRunner.Run(2, "fit", csv, "--models", "eds", "--out", output);
        Assert.Equal(2, exit);
        Assert.Equal("", stdout.Trim());
        Assert.Single(stderr.Split('\n'), l => l.StartsWith("sizetest:", StringComparison.Ordinal));
    }

    [MpiFact]
    public void AMissingColumnStopsAllRanksWithOneMessage()
    {
        // Surface brightness needs a 'mu' column, which the catalogue lacks: checked before the fit on every rank.
        var csv = DistributedFitCatalogues.Csv(_dir, 500);
        string output = Path.Combine(_dir, "sb");
        var (exit, stdout, stderr) = MpiRunner.Run(2, "fit", csv, "--models", "eds", "--observable", "sb", "--out", output);
        Assert.Equal(2, exit);
        Assert.Equal("", stdout.Trim());
        Assert.Single(stderr.Split('\n'), l => l.Contains("'mu' column", StringComparison.Ordinal));
        Assert.False(Directory.Exists(output));
    }

    [MpiFact]
    public void FitUnderAWrongLauncherIsRefused()
    {
        // Launcher variables for 2 processes, but Open MPI starts as a singleton (world size 1): N single-rank jobs.
        var csv = DistributedFitCatalogues.Csv(_dir, 500);
        string output = Path.Combine(_dir, "wrong");
        var env = new Dictionary<string, string> { ["PMI_SIZE"] = "2", ["PMI_RANK"] = "0" };
        var (exit, _, stderr) = MpiRunner.RunPlain(env, "fit", csv, "--models", "eds", "--out", output);
        Assert.Equal(2, exit);
        Assert.Contains("reports a world of 1", stderr);
        Assert.False(Directory.Exists(output));
    }
}
