using Xunit;
using System.Text.Json;
using SizeTest.Catalogues;
using SizeTest.Tests.Catalogues;
using SizeTest.Tests.Simulation;
using SizeTest.Foundation.Angles;

namespace SizeTest.Tests.Cli;

/// <summary><c>sizetest simulate</c> through the real CLI and files.</summary>
public sealed class SimulateCommandTests
{
    [Fact]
    public void CsvLoadsBackWithNoMappingAndTheTruthRecordsEverySetting()
    {
        using var tmp = new TempFiles();
        string path = tmp.PathOf("mock.csv");
        var (code, stdout, err) = CliRunner.Run("simulate", "--model", "lcdm", "--omega-m", "0.25", "--n", "1500", "--seed", "5",
            "--sb-limit", "24", "--size-evolution", "-0.8", "--photoz-err", "0.02", "--out", path);
        Assert.True(code == 0, err);
        Assert.Contains("1500 synthetic galaxies", stdout);
        var load = CatalogueLoader.Load(path);
        Assert.Equal(1500, load.Accepted);
        Assert.Equal(0, load.Rejected);
        foreach (var role in new[] { ColumnRole.Id, ColumnRole.Z, ColumnRole.ZErr, ColumnRole.Theta, ColumnRole.ThetaErr, ColumnRole.Mu, ColumnRole.MuErr, ColumnRole.Mag })
            Assert.True(load.Mapping.Roles.ContainsKey(role), $"role {role} not detected");
        Assert.All(load.Rows.Mu!, mu => Assert.True(mu < 24));

        using var truth = JsonDocument.Parse(File.ReadAllText(path + ".truth.json"));
        var root = truth.RootElement;
        Assert.True(root.GetProperty("synthetic").GetBoolean());
        Assert.Equal(5, root.GetProperty("seed").GetInt64());
        Assert.Equal(0.25, root.GetProperty("world_model").GetProperty("parameters").GetProperty("omega_m").GetDouble());
        Assert.Equal(-0.8, root.GetProperty("population").GetProperty("size_evolution").GetDouble());
        Assert.Equal(24, root.GetProperty("design").GetProperty("selection").GetProperty("sb_limit").GetDouble());
        Assert.Equal(0.02, root.GetProperty("design").GetProperty("errors").GetProperty("photoz_err").GetDouble());
        Assert.Equal(1500, root.GetProperty("outcome").GetProperty("passed").GetInt32());
        Assert.Contains("--seed 5", root.GetProperty("command").GetString());
    }

    [Fact]
    public void RepeatedRunsWriteIdenticalFilesAndRefuseToOverwriteWithoutForce()
    {
        using var tmp = new TempFiles();
        string a = tmp.PathOf("a.csv"), b = tmp.PathOf("b.csv");
        string[] args = ["simulate", "--n", "800", "--seed", "9", "--z-dist", "survey:0.8"];
        Assert.Equal(0, CliRunner.Run([.. args, "--out", a]).Exit);
        Assert.Equal(0, CliRunner.Run([.. args, "--out", b]).Exit);
        Assert.Equal(File.ReadAllBytes(a), File.ReadAllBytes(b));
        var before = File.ReadAllBytes(a);
        var (code, _, err) = CliRunner.Run("simulate", "--n", "10", "--seed", "1", "--out", a);
        Assert.Equal(2, code);
        Assert.Contains("--force", err);
        Assert.Equal(before, File.ReadAllBytes(a));
        Assert.Equal(0, CliRunner.Run("simulate", "--n", "10", "--seed", "1", "--out", a, "--force").Exit);
        Assert.NotEqual(before, File.ReadAllBytes(a));
    }

    [Fact]
    public void RadioFitsCarriesMilliarcsecondsThatLoadBackAsTheSameAngles()
    {
        using var tmp = new TempFiles();
        string fits = tmp.PathOf("radio.fits"), csv = tmp.PathOf("radio.csv");
        string[] args = ["simulate", "--kind", "radio", "--n", "300", "--seed", "4", "--z-dist", "uniform:0.5:3"];
        Assert.Equal(0, CliRunner.Run([.. args, "--out", fits]).Exit);
        Assert.Equal(0, CliRunner.Run([.. args, "--out", csv]).Exit);
        var f = CatalogueLoader.Load(fits);
        var c = CatalogueLoader.Load(csv);
        Assert.Equal("mas", f.Mapping.Roles[ColumnRole.Theta].Unit);
        Assert.Equal(300, f.Accepted);
        for (int i = 0; i < 300; i++)
            Assert.Equal(c.Rows.ThetaRad![i], f.Rows.ThetaRad![i], c.Rows.ThetaRad[i] * 1e-14); // mas×1000 vs arcsec: equal to rounding
        // Compact sources of ℓ_m = 11.03 pc at 0.5 < z < 3 in flat ΛCDM span about 1.2–2 mas (θ = ℓ/D_A; D_A ≈ 1259–1748 Mpc, docs/science.md §2.2).
        double medianMas = f.Rows.ThetaRad!.Order().ElementAt(150) / AngleUnits.RadiansPerMilliarcsec;
        Assert.InRange(medianMas, 0.9, 2.2);
    }

    [Fact]
    public void VoTableOutputLoadsBack()
    {
        using var tmp = new TempFiles();
        string vot = tmp.PathOf("m.vot");
        Assert.Equal(0, CliRunner.Run("simulate", "--n", "200", "--seed", "3", "--out", vot).Exit);
        Assert.Equal(200, CatalogueLoader.Load(vot).Accepted);
    }

    [Theory]
    [InlineData("--out", "x.txt")]
    [InlineData("--z-dist", "gauss:1")]
    [InlineData("--mu0", "20", "--kind", "radio")]
    [InlineData("--sb-limit", "24", "--kind", "radio")]
    public void BadOptionsExitTwoWithOneLine(params string[] extra)
    {
        using var tmp = new TempFiles();
        var args = new List<string> { "simulate", "--n", "10", "--seed", "1" };
        if (!extra.Contains("--out")) { args.Add("--out"); args.Add(tmp.PathOf("m.csv")); }
        args.AddRange(extra.Select(e => e == "x.txt" ? tmp.PathOf("x.txt") : e));
        var (code, _, err) = CliRunner.Run([.. args]);
        Assert.Equal(2, code);
        Assert.Single(err.Trim().Split('\n'));
    }

    [Fact]
    public void MissingSeedIsRefused()
    {
        using var tmp = new TempFiles();
        var (code, _, err) = CliRunner.Run("simulate", "--n", "10", "--out", tmp.PathOf("m.csv"));
        Assert.Equal(2, code);
        Assert.Contains("--seed", err);
    }

    [Fact]
    public void HistogramFilesAreReadAndBadLinesNamed()
    {
        using var tmp = new TempFiles();
        string good = tmp.Write("nz.txt", "# z_lo z_hi weight\nz_lo z_hi weight\n0.2 0.6 1\n0.6 1.0 3\n");
        string bad = tmp.Write("bad.txt", "0.2 0.6 1\n0.7 1.0 3\n");
        string out1 = tmp.PathOf("h.csv");
        Assert.Equal(0, CliRunner.Run("simulate", "--n", "400", "--seed", "2", "--z-dist", "hist:" + good, "--out", out1).Exit);
        var z = CatalogueLoader.Load(out1).Rows.Z;
        Assert.All(z, v => Assert.InRange(v, 0.2, 1.0));
        var (code, _, err) = CliRunner.Run("simulate", "--n", "40", "--seed", "2", "--z-dist", "hist:" + bad, "--out", tmp.PathOf("h2.csv"));
        Assert.Equal(2, code);
        Assert.Contains("line 2", err);
    }
}
