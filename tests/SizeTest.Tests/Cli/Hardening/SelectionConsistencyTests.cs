using System.Globalization;
using System.Text;
using System.Text.Json;
using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Inference;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Cli.Hardening;

/// <summary>Issue 14 point 2: objects that break a stated cut are rejected before the fit, or the fit is refused.</summary>
public sealed class SelectionConsistencyTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-selection-").FullName;

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    // n objects from EdS; the first `faint` of them get μ = 26 (fainter than a 27 limit; the mock's μ stays below 26).
    private string Catalogue(int n, int faint)
    {
        var lines = HardeningData.CatalogueText(n).Split('\n', StringSplitOptions.RemoveEmptyEntries);
        var sb = new StringBuilder();
        sb.Append(lines[0]).Append('\n').Append(lines[1]).Append('\n');
        for (int i = 2; i < lines.Length; i++)
        {
            var f = lines[i].Split(',');
            if (i - 2 < faint) f[4] = "28";
            sb.Append(string.Join(',', f)).Append('\n');
        }
        var p = Path.Combine(_dir, $"c{n}_{faint}.csv");
        File.WriteAllText(p, sb.ToString());
        return p;
    }

    private static readonly string[] SbFit = [.. HardeningData.ColArgs, "--models", "eds", "--starts", "1", "--cv-folds", "0", "--observable", "sb"];

    [Fact]
    public void AFewObjectsOutsideTheSbLimitGoToTheRejectLogWithAWarning()
    {
        var cat = Catalogue(200, 6);
        var outDir = Path.Combine(_dir, "out");
        var (exit, _, err) = CliRunner.Run(["fit", cat, .. SbFit, "--sb-limit", "27", "--out", outDir]);
        Assert.True(exit == 0, err);
        Assert.Contains("warning: 6 of 200 objects lie outside the stated selection (6 sb_limit)", err);
        var rejects = File.ReadAllLines(Path.Combine(outDir, "rejects.csv"));
        Assert.Equal(6, rejects.Count(l => l.Contains("outside selection: sb_limit")));
        using var doc = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "results.json")));
        var r = doc.RootElement;
        Assert.Equal(200, r.GetProperty("rows_read").GetInt64());
        Assert.Equal(194, r.GetProperty("accepted").GetInt64());
        Assert.Equal(6, r.GetProperty("rejected").GetInt64());
    }

    [Fact]
    public void MoreThanTheAllowedFractionOutsideRefusesTheFit()
    {
        // The reproduction had 1422 of 4000 objects fainter than --sb-limit 24.5 (35.6%); same fraction here.
        var cat = Catalogue(200, 71);
        var outDir = Path.Combine(_dir, "out");
        var (exit, _, err) = CliRunner.Run(["fit", cat, .. SbFit, "--sb-limit", "27", "--out", outDir]);
        Assert.Equal(2, exit);
        Assert.Contains("71 of 200 objects (35.5%) lie outside the stated selection", err);
        Assert.False(Directory.Exists(outDir));
        // The fraction is configurable.
        var (ok, _, err2) = CliRunner.Run(["fit", cat, .. SbFit, "--sb-limit", "27", "--max-outside-selection", "0.4", "--out", outDir]);
        Assert.True(ok == 0, err2);
    }

    [Fact]
    public void MinSizeAboveEveryObjectIsAClearExit2AndNoLikelihoodIsEvaluated()
    {
        var cat = Catalogue(50, 0);
        var (exit, _, err) = CliRunner.Run(["fit", cat, .. HardeningData.ColArgs, .. HardeningData.Quick, "--min-size", "1e308", "--out", Path.Combine(_dir, "o")]);
        Assert.Equal(2, exit);
        Assert.DoesNotContain("internal error", err);   // "every one of the 50 objects lies outside …" or the empty-sample refusal
        Assert.Single(err.Trim().Split('\n'));
    }

    [Fact]
    public void MagnitudeCutUsesTheLikelihoodsDefinition()
    {
        // Closed form: μ = 22, θ = 1″ → m = 22 − 5 log10(1) − 2.5 log10(2π) = 22 − 1.995450 = 20.004550
        // (python3: 22 - 2.5*math.log10(2*math.pi) = 20.004550329104713); the cut is strict (m < limit).
        var load = FakeLoad();
        var obs = Observables.FromRows(load.Rows);
        var joint = new NuisanceModel(ObservableKind.Joint, new SelectionLimits(MagLimit: 20.0));
        var e = Assert.Throws<InputException>(() => SelectionConsistency.Apply(load, obs, joint));
        Assert.Contains("2 mag_limit", e.Message);
        var inside = SelectionConsistency.Apply(load, obs, joint with { Selection = new SelectionLimits(MagLimit: 20.00456) });
        Assert.Equal(0, inside.Outside);
        var none = Assert.Throws<InputException>(() => SelectionConsistency.Apply(load, obs, joint with { Selection = new SelectionLimits(MagLimit: 20.00455) }, maxOutsideFraction: 1));
        Assert.Contains("every one of the 2 objects", none.Message);   // both out → none left, even when any fraction is allowed
    }

    private static CatalogueLoad FakeLoad()
    {
        // Load a two-row CSV whose values match `sample` exactly (θ = 1″, μ = 22, z = 0.5).
        var dir = Directory.CreateTempSubdirectory("sizetest-sel-").FullName;
        var p = Path.Combine(dir, "t.csv");
        File.WriteAllText(p, "z,theta,mu\n0.5,1,22\n0.5,1,22\n");
        var load = CatalogueLoader.Load(p, new CatalogueLoadOptions { Mapping = ColumnMapping.FromOptions(["z=z", "theta=theta:arcsec", "mu=mu"]) });
        Directory.Delete(dir, true);
        Assert.Equal(2, load.Rows.Count);
        return load;
    }
}
