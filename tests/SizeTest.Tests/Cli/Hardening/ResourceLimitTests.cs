using System.Text;
using SizeTest.Foundation.Errors;
using SizeTest.Foundation.Files;
using Xunit;

namespace SizeTest.Tests.Cli.Hardening;

/// <summary>Issue 14 points 5, 6, 10 and 11: memory is estimated before allocation, text lines are capped, inputs give exit 2.</summary>
public sealed class ResourceLimitTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-limits-").FullName;

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    private string Cat()
    {
        var p = Path.Combine(_dir, "c.csv");
        File.WriteAllText(p, HardeningData.CatalogueText(40));
        return p;
    }

    [Fact]
    public void ATwentyMegabyteLineIsRefusedQuicklyWithBoundedMemory()
    {
        // Reproduction: a text catalogue with a 20 MB line took 3.45 GB. Peak RSS of the CLI process must stay small.
        var p = Path.Combine(_dir, "long.csv");
        using (var f = File.Create(p))
        {
            f.Write("z,theta\n0.5,1\n"u8);
            var chunk = Encoding.ASCII.GetBytes(new string('7', 1 << 20));
            for (int i = 0; i < 20; i++) f.Write(chunk);
            f.Write("\n"u8);
        }
        var (exit, _, err, peak) = CliProcess.Run(_dir, ["inspect", p]);
        Assert.Equal(2, exit);
        Assert.Contains("long.csv", err);
        Assert.Contains("line 3 is longer than the 1048576 byte limit", err);
        Assert.True(peak < 400L << 20, $"peak RSS {peak >> 20} MB; the ceiling is 400 MB (the runtime alone is ~80 MB)");
    }

    [Fact]
    public void DevZeroAsACatalogueIsRefusedQuickly()
    {
        if (!File.Exists("/dev/zero")) return;
        var (exit, _, err, peak) = CliProcess.Run(_dir, ["inspect", "/dev/zero", "--catalog-format", "csv"], timeoutSeconds: 60);
        Assert.Equal(2, exit);
        Assert.Contains("/dev/zero", err);
        Assert.DoesNotContain("internal error", err);
        Assert.True(peak < 400L << 20, $"peak RSS {peak >> 20} MB; the ceiling is 400 MB");
    }

    [Fact]
    public void TheLineCapIsConfigurable()
    {
        var cat = Cat();
        var (exit, _, err) = CliRunner.Run(["inspect", cat, "--max-line-bytes", "20"]);
        Assert.Equal(2, exit);
        Assert.Contains("byte limit", err);
        Assert.Equal(0, CliRunner.Run(["inspect", cat]).Exit);
    }

    [Theory]
    [InlineData("--walkers", "1000000000", "the MCMC chains")]
    [InlineData("--bootstrap", "2000000000", "the bootstrap (2000000000 resamples)")]
    [InlineData("--starts", "2000000000", "the optimiser starts (2000000000 starts)")]
    [InlineData("--steps", "100000000", "the MCMC chains")]
    public void WorkBeyondTheMachineIsRefusedBeforeAllocation(string option, string value, string what)
    {
        var (exit, _, err) = CliRunner.Run(["fit", Cat(), .. HardeningData.ColArgs, "--models", "eds", "--cv-folds", "0", "--sampler", "mcmc", option, value, "--out", Path.Combine(_dir, "o")]);
        Assert.Equal(2, exit);
        Assert.Contains(what, err);
        Assert.Contains("would need about", err);
        Assert.False(Directory.Exists(Path.Combine(_dir, "o")));
    }

    [Fact]
    public void MaxMemoryLimitsAFitAndTheEstimateIsShown()
    {
        // 32 walkers × 1000 steps × (3 + 1) × 8 bytes × 2 copies = 2 048 000 bytes ≈ 1.95 MB (the estimate's formula in FitCommand).
        var (exit, _, err) = CliRunner.Run(["fit", Cat(), .. HardeningData.ColArgs, .. HardeningData.Quick, "--sampler", "mcmc", "--steps", "1000", "--max-memory", "1M", "--out", Path.Combine(_dir, "o")]);
        Assert.Equal(2, exit);
        Assert.Contains("would need about 1.95 MB, more than --max-memory 1 MB", err);
        Assert.Equal(2, CliRunner.Run(["fit", Cat(), .. HardeningData.ColArgs, "--max-memory", "lots", "--out", Path.Combine(_dir, "o")]).Exit);
    }

    [Fact]
    public void SimulateRefusesAnImpossibleCatalogueAndWritesParquet()
    {
        var big = CliRunner.Run(["simulate", "--n", "2147483647", "--seed", "1", "--out", Path.Combine(_dir, "x.csv")]);
        Assert.Equal(2, big.Exit);
        Assert.Contains("a catalogue of 2147483647 objects (--n) would need about", big.Err);

        var pq = Path.Combine(_dir, "m.parquet");
        var w = CliRunner.Run(["simulate", "--n", "150", "--seed", "4", "--out", pq]);
        Assert.True(w.Exit == 0, w.Err);
        Assert.Equal("PAR1", Encoding.ASCII.GetString(File.ReadAllBytes(pq).AsSpan(0, 4)));
        var load = SizeTest.Catalogues.CatalogueLoader.Load(pq, new SizeTest.Catalogues.CatalogueLoadOptions());
        Assert.Equal(150, load.Accepted);
        Assert.Equal(150, load.RowsRead);
    }

    [Theory]
    [InlineData("fit", "--walkers", "1e9")]
    [InlineData("power", "--n", "2e9")]
    public void ParseErrorsNeverNameDotNetTypes(string verb, string option, string value)
    {
        string[] args = verb == "fit" ? ["fit", Cat(), option, value, "--out", Path.Combine(_dir, "o")] : ["power", option, value, "--seed", "1", "--out", Path.Combine(_dir, "o")];
        var (exit, _, err) = CliRunner.Run(args);
        Assert.Equal(2, exit);
        Assert.DoesNotContain("System.", err);
        Assert.DoesNotContain("internal error", err);
    }

    [Fact]
    public void ResourceBudgetParsesSizes()
    {
        // Binary units (common practice): 1K = 1024 bytes.
        Assert.Equal(4L << 30, ResourceBudget.ParseSize("4G"));
        Assert.Equal(512L << 20, ResourceBudget.ParseSize("512MB"));
        Assert.Equal(1_000_000_000L, ResourceBudget.ParseSize("1e9"));
        Assert.Throws<InputException>(() => ResourceBudget.ParseSize("-1"));
        Assert.True(ResourceBudget.AvailableBytes() > 0);
    }
}
