using System.Text.Json;
using SizeTest.Catalogues;
using SizeTest.Tests.Catalogues;
using Xunit;

namespace SizeTest.Tests.Cli.Simulation;

/// <summary>The committed demo catalogues are reproduced by the commands in their truth files and READMEs.</summary>
public sealed class DemoCatalogueTests
{
    private static string DemoFolder()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "SizeTest.sln"))) dir = dir.Parent;
        Assert.NotNull(dir);
        return Path.Combine(dir!.FullName, "demo-catalogs");
    }

    [Theory]
    [InlineData("qdf-optical/qdf_optical_galaxies.csv", 4000)]
    [InlineData("qlba-radio/qlba_compact_sources.fits", 300)]
    [InlineData("qdf-optical-static/qdf_static_comparison.vot", 1000)]
    public void DemoCatalogueIsReproducedByItsRecordedCommand(string relative, int rows)
    {
        string demo = DemoFolder();
        string committed = Path.Combine(demo, relative);
        Assert.True(new FileInfo(committed).Length <= 2 * 1024 * 1024, "demo catalogues must stay ≤ 2 MB");
        using var truth = JsonDocument.Parse(File.ReadAllText(committed + ".truth.json"));
        Assert.True(truth.RootElement.GetProperty("synthetic").GetBoolean());
        string command = truth.RootElement.GetProperty("command").GetString()!;
        Assert.Contains(command, File.ReadAllText(Path.Combine(Path.GetDirectoryName(committed)!, "README.md"))); // README states the exact command
        var args = command.Split(' ', StringSplitOptions.RemoveEmptyEntries).Skip(1).ToList(); // drop "sizetest"
        using var tmp = new TempFiles();
        string redrawn = tmp.PathOf(Path.GetFileName(relative));
        int o = args.IndexOf("--out");
        args[o + 1] = redrawn;
        var (code, _, err) = CliRunner.Run([.. args]);
        Assert.True(code == 0, err);
        // Same code gives the same bytes (SimulateCommandTests); across revisions of the distance code the last bits of
        // D_A may move, so the committed file is compared value by value to 1e-9 relative (regenerate.sh refreshes it).
        var a = CatalogueLoader.Load(committed).Rows;
        var b = CatalogueLoader.Load(redrawn).Rows;
        Assert.Equal(rows, a.Count);
        Assert.Equal(a.Id, b.Id);
        Close(a.Z, b.Z);
        Close(a.ThetaRad!, b.ThetaRad!);
        Close(a.ThetaErrRad!, b.ThetaErrRad!);
        if (a.Mu is not null) Close(a.Mu, b.Mu!);
    }

    private static void Close(double[] x, double[] y)
    {
        Assert.Equal(x.Length, y.Length);
        for (int i = 0; i < x.Length; i++) Assert.True(Math.Abs(x[i] - y[i]) <= 1e-9 * Math.Abs(x[i]), $"row {i + 1}: {x[i]} vs {y[i]}");
    }
}
