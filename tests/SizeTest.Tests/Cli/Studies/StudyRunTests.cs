using SizeTest.Tests.Studies;
using System.Globalization;
using System.Text.Json;
using SizeTest.Studies;
using Xunit;

namespace SizeTest.Tests.Cli.Studies;

public sealed class StudyRunTests
{
    [Fact]
    public void RunWritesTheWholeFolderAndReportRedrawsIt()
    {
        using var fx = new StudyFixture();
        var (exit, stdout, stderr) = CliRunner.Run("run", fx.StudyPath, "--out", fx.Out());
        Assert.True(exit == 0, stderr);
        foreach (var f in new[] { "results.json", "results.csv", "rejects.csv", "report.html", "manifest.json", "report-data.json", "tables" })
            Assert.True(File.Exists(Path.Combine(fx.Out(), f)) || Directory.Exists(Path.Combine(fx.Out(), f)), f);
        Assert.False(File.Exists(Path.Combine(fx.Out(), "report.pdf")));           // formats = ["html", "svg"]
        Assert.NotEmpty(Directory.GetFiles(Path.Combine(fx.Out(), "figures"), "*.svg"));
        Assert.Empty(Directory.GetFiles(Path.Combine(fx.Out(), "figures"), "*.png"));
        Assert.Contains("lcdm", stdout);

        using var results = JsonDocument.Parse(File.ReadAllText(Path.Combine(fx.Out(), "results.json")));
        var r = results.RootElement;
        Assert.Equal(300, r.GetProperty("rows_read").GetInt64());
        Assert.Equal(2, r.GetProperty("models").GetArrayLength());

        // The mock is drawn from flat ΛCDM (MockSurveyGenerator defaults), so ΛCDM should not lose badly by BIC.
        var data = SizeTest.Reporting.Data.ReportDataJson.Load(Path.Combine(fx.Out(), "report-data.json"));
        Assert.All(data.Models, m => Assert.NotNull(m.Theta));                   // best-fit curves came through
        Assert.Contains(data.Assumptions, a => a.Topic == "selection model");
        Assert.NotNull(data.ThetaBins);
        // The curve is the fitted model evaluated: θ(1) = R0·2^a / D_A(1) (small angle, kpc → Mpc, rad → arcsec).
        var lcdm = data.Models.Single(m => m.Fit.Name == "lcdm");
        double r0 = lcdm.Fit.Parameters.Single(p => p.Name == "r0_kpc").Value, a = lcdm.Fit.Parameters.Single(p => p.Name == "size_evolution").Value;
        double dA = SizeTest.Cosmology.WorldModels.Get("lcdm").Create(new Dictionary<string, double>()).AngularDiameterDistance(1.0);
        double expected = r0 * Math.Pow(2, a) / 1000.0 / dA * SizeTest.Foundation.Angles.AngleUnits.ArcsecPerRadian;
        Assert.Equal(expected, lcdm.Theta!.At(1.0, logLog: true), expected * 2e-3);   // log-log interpolation between 100 samples

        using var manifest = JsonDocument.Parse(File.ReadAllText(Path.Combine(fx.Out(), "manifest.json")));
        var inputs = manifest.RootElement.GetProperty("inputs").EnumerateArray().Select(i => i.GetProperty("path").GetString()!).ToArray();
        Assert.Contains(inputs, p => p.EndsWith("mock.csv", StringComparison.Ordinal));
        Assert.Contains(inputs, p => p.EndsWith("study.toml", StringComparison.Ordinal));
        Assert.Equal(File.ReadAllText(fx.StudyPath), manifest.RootElement.GetProperty("study_file").GetProperty("text").GetString());
        Assert.Equal(11, manifest.RootElement.GetProperty("seed").GetInt64());

        // `report DIR` re-renders a run folder in place and keeps results.json.
        var before = File.ReadAllText(Path.Combine(fx.Out(), "results.json"));
        var (rexit, _, rerr) = CliRunner.Run("report", fx.Out());
        Assert.True(rexit == 0, rerr);
        Assert.Equal(before, File.ReadAllText(Path.Combine(fx.Out(), "results.json")));
        Assert.True(File.Exists(Path.Combine(fx.Out(), "report.html")));
    }

    [Fact]
    public void ExistingOutputNeedsForce()
    {
        using var fx = new StudyFixture();
        Directory.CreateDirectory(fx.Out());
        File.WriteAllText(Path.Combine(fx.Out(), "keep.txt"), "old");
        var (exit, _, stderr) = CliRunner.Run("run", fx.StudyPath, "--out", fx.Out());
        Assert.Equal(2, exit);
        Assert.Contains("--force", stderr);
        Assert.Equal("old", File.ReadAllText(Path.Combine(fx.Out(), "keep.txt")));

        // --force replaces only a folder sizetest wrote (issue 14): keep.txt is the user's, so it is refused.
        var (rexit, _, rerr) = CliRunner.Run("run", fx.StudyPath, "--out", fx.Out(), "--force");
        Assert.Equal(2, rexit);
        Assert.Contains("not written by sizetest", rerr);
        Assert.Equal("old", File.ReadAllText(Path.Combine(fx.Out(), "keep.txt")));
        File.Delete(Path.Combine(fx.Out(), "keep.txt"));
        var (e1, _, err1) = CliRunner.Run("run", fx.StudyPath, "--out", fx.Out());
        Assert.True(e1 == 0, err1);
        var (fexit, _, ferr) = CliRunner.Run("run", fx.StudyPath, "--out", fx.Out(), "--force");
        Assert.True(fexit == 0, ferr);
        Assert.True(File.Exists(Path.Combine(fx.Out(), "results.json")));
    }

    [Fact]
    public void InterruptedRunLeavesTheOldReportIntact()
    {
        using var fx = new StudyFixture();
        Directory.CreateDirectory(fx.Out());
        File.WriteAllText(Path.Combine(fx.Out(), "report.html"), "old report");
        File.WriteAllText(Path.Combine(fx.Out(), SizeTest.Foundation.Files.OutputFolder.MarkerFileName), "report.html\n");   // an earlier sizetest output
        var study = StudyFileParser.Load(fx.StudyPath);
        Assert.Throws<IOException>(() => StudyRunner.Run(study, new StudyRunOptions
        {
            OutputDirectory = fx.Out(),
            Force = true,
            BeforeCommit = staging =>
            {
                Assert.True(File.Exists(Path.Combine(staging, "results.json")));   // everything was written, then the run dies
                throw new IOException("simulated failure before the swap");
            },
        }));
        Assert.Equal("old report", File.ReadAllText(Path.Combine(fx.Out(), "report.html")));
        Assert.Equal(2, Directory.GetFileSystemEntries(fx.Out()).Length);   // report.html and the marker
        Assert.DoesNotContain(Directory.GetDirectories(fx.Dir), d => Path.GetFileName(d).StartsWith(".out.tmp", StringComparison.Ordinal));
    }

    [Fact]
    public void SameInputsAndSeedGiveIdenticalOutputs()
    {
        using var fx = new StudyFixture(extra: "");
        var (e1, _, err1) = CliRunner.Run("run", fx.StudyPath, "--out", fx.Out("a"));
        var (e2, _, err2) = CliRunner.Run("run", fx.StudyPath, "--out", fx.Out("b"));
        Assert.True(e1 == 0, err1);
        Assert.True(e2 == 0, err2);
        foreach (var f in new[] { "results.json", "results.csv", "rejects.csv" }
                     .Concat(Directory.GetFiles(Path.Combine(fx.Out("a"), "tables")).Select(p => "tables/" + Path.GetFileName(p))))
            Assert.Equal(File.ReadAllBytes(Path.Combine(fx.Out("a"), f)), File.ReadAllBytes(Path.Combine(fx.Out("b"), f)));
        Assert.Equal(WithoutVolatile(Path.Combine(fx.Out("a"), "manifest.json")), WithoutVolatile(Path.Combine(fx.Out("b"), "manifest.json")));
    }

    // The manifest keeps timestamps and timings in its last field, "volatile"; everything before it must match byte for byte.
    private static string WithoutVolatile(string path)
    {
        var text = File.ReadAllText(path);
        int i = text.IndexOf("\"volatile\"", StringComparison.Ordinal);
        Assert.True(i > 0);
        return text[..i];
    }

    [Fact]
    public void BadStudyFileIsExitTwoWithLineAndColumn()
    {
        using var fx = new StudyFixture(extra: "\n[typo]\nx = 1\n");
        var (exit, _, stderr) = CliRunner.Run("run", fx.StudyPath, "--out", fx.Out());
        Assert.Equal(2, exit);
        Assert.Contains("typo", stderr);
        Assert.Contains("study.toml", stderr);
        Assert.False(Directory.Exists(fx.Out()));
    }

    [Fact]
    public void McmcStudyRunsToConvergenceAndPlotsTheChainItReports()
    {
        using var fx = new StudyFixture(n: 200);
        File.WriteAllText(fx.StudyPath, File.ReadAllText(fx.StudyPath).Replace("starts = 1", "starts = 1\nsampler = \"mcmc\"\nsampler_steps = \"auto\""));
        var (exit, _, stderr) = CliRunner.Run("run", fx.StudyPath, "--out", fx.Out());
        Assert.True(exit == 0, stderr);
        var data = SizeTest.Reporting.Data.ReportDataJson.Load(Path.Combine(fx.Out(), "report-data.json"));
        Assert.NotNull(data.Posterior);
        Assert.Equal(3, data.Posterior!.Parameters.Count);               // r0_kpc, size_evolution, scatter_dex of the size model
        var results = SizeTest.Inference.ResultsJson.Deserialize(File.ReadAllText(Path.Combine(fx.Out(), "results.json")));
        var best = results.Models[0];
        // Every model sampled once, to convergence (the rules of ConvergenceCriteria: ≥ 50 τ, R̂ ≤ 1.01, ESS ≥ 400).
        Assert.Equal(results.Models.Select(m => m.Name).Order(), results.Chains.Select(c => c.Model).Order());
        var chain = results.Chains.Single(c => c.Model == best.Name);
        Assert.True(chain.Auto && chain.Converged, best.ExitReason.Text);
        Assert.True(chain.LengthInTau >= 50 && chain.MaxRhat <= 1.01 && chain.MinEss >= 400, best.ExitReason.Text);
        Assert.Equal(chain.Steps / 4, chain.BurnIn); // the stated burn-in rule: the first quarter

        // The plotted draws are draws of the chain written to chains_MODEL.csv after its burn-in, the chain whose
        // median results.json reports (same run, not a second one).
        var lines = File.ReadAllLines(Path.Combine(fx.Out(), $"chains_{best.Name}.csv"));
        var header = lines[0].Split(',');
        var kept = lines.Skip(1).Select(l => l.Split(',')).Where(f => int.Parse(f[0], CultureInfo.InvariantCulture) >= chain.BurnIn)
            .Select(f => f.Skip(3).Select(x => double.Parse(x, CultureInfo.InvariantCulture)).ToArray()).ToArray();
        Assert.Equal((long)chain.Walkers * (chain.Steps - chain.BurnIn), kept.Length);
        var keyed = kept.Select(r => string.Join(',', r.Select(x => x.ToString("R", CultureInfo.InvariantCulture)))).ToHashSet();
        Assert.True(data.Posterior.Samples.Count > 100);
        Assert.All(data.Posterior.Samples, r => Assert.Contains(string.Join(',', r.Select(x => x.ToString("R", CultureInfo.InvariantCulture))), keyed));
        Assert.Equal(kept[0], data.Posterior.Samples[0]);
        for (int j = 0; j < data.Posterior.Parameters.Count; j++)
        {
            string name = data.Posterior.Parameters[j];
            Assert.Equal(name, header[3 + j]);
            var col = kept.Select(r => r[j]).Order().ToArray();
            // Median by linear interpolation between order statistics (the rule EnsembleRun.Percentile states).
            double h = (col.Length - 1) * 0.5;
            double median = col[(int)h] + (h - (int)h) * (col[Math.Min((int)h + 1, col.Length - 1)] - col[(int)h]);
            Assert.Equal(median, best.Parameters.Single(p => p.Name == name).Value, 12);
        }
    }

    [Fact]
    public void StudyFileSamplerSettingsAreHonoured()
    {
        using var fx = new StudyFixture(n: 200);
        File.WriteAllText(fx.StudyPath, File.ReadAllText(fx.StudyPath).Replace("starts = 1", "starts = 1\nsampler = \"mcmc\"\nsampler_steps = 240\nsampler_walkers = 12"));
        var (exit, _, stderr) = CliRunner.Run("run", fx.StudyPath, "--out", fx.Out());
        Assert.True(exit is 0 or 1, stderr); // 240 steps may well not meet the convergence rules: exit 1 then, outputs written
        var results = SizeTest.Inference.ResultsJson.Deserialize(File.ReadAllText(Path.Combine(fx.Out(), "results.json")));
        Assert.Equal(2, results.Chains.Count);
        foreach (var c in results.Chains)
        {
            Assert.Equal((240, 12, false), (c.Steps, c.Walkers, c.Auto));
            int rows = File.ReadAllLines(Path.Combine(fx.Out(), $"chains_{c.Model}.csv")).Length - 1;
            Assert.Equal(240 * 12, rows);
        }
    }

    [Fact]
    public void PowerResultBecomesThePowerCurve()
    {
        using var fx = new StudyFixture(extra: "\n[power]\nresults = \"power.json\"\n");
        // Made-up power numbers (not a claim about any survey): the adapter must carry them through unchanged.
        var power = new SizeTest.Simulation.PowerResult
        {
            TrueModel = "lcdm", TrueModelParameters = new Dictionary<string, double>(), TrueNuisance = new Dictionary<string, double>(),
            Candidates = ["lcdm", "tired-light"], TrueCandidate = "lcdm", Observable = SizeTest.Inference.ObservableKind.Size, Kind = "galaxy", ZDist = "uniform:0.1:2.5",
            Seed = 1, Mocks = 10, TargetPower = 0.6, Conclusion = "test", Outcomes = [],
            Points =
            [
                new(100, 10, 0.6, 0.3, 0.1, [0, 0, 0, 0, 0], 2, [], 0, "weak"),
                new(400, 10, 0.9, 0.7, 0.5, [0, 0, 0, 0, 0], 8, [], 0, "strong"),
            ],
        };
        File.WriteAllText(Path.Combine(fx.Dir, "power.json"), SizeTest.Simulation.PowerResultFiles.Json(power));
        var (exit, _, stderr) = CliRunner.Run("run", fx.StudyPath, "--out", fx.Out());
        Assert.True(exit == 0, stderr);
        var data = SizeTest.Reporting.Data.ReportDataJson.Load(Path.Combine(fx.Out(), "report-data.json"));
        Assert.NotNull(data.Power);
        Assert.Equal([100.0, 400.0], data.Power!.Lines[0].X);
        Assert.Equal([0.6, 0.9], data.Power.Lines[0].Power);
        Assert.Equal([0.3, 0.7], data.Power.Lines[1].Power);
        // The target is power.json's (0.6, not a default) and the study's 300 objects read at N = 100: 0.1 < 0.6, no decision.
        Assert.Equal(0.6, data.Power.Target);
        Assert.Equal(10, data.Power.DecisionDeltaBic);
        Assert.Contains("With 100 objects (the largest mock catalogue not above this sample's 300), on mocks drawn from ΛCDM, the sample cannot decide", data.Power.Statement);
        Assert.Contains(SizeTest.Reporting.Html.Html.Text(data.Power.Statement), File.ReadAllText(Path.Combine(fx.Out(), "report.html")));
        using var manifest = JsonDocument.Parse(File.ReadAllText(Path.Combine(fx.Out(), "manifest.json")));
        Assert.Contains(manifest.RootElement.GetProperty("inputs").EnumerateArray(), i => i.GetProperty("path").GetString()!.EndsWith("power.json", StringComparison.Ordinal));
    }

    [Fact]
    public void BootstrapAndCrossValidationReachTheReport()
    {
        using var fx = new StudyFixture(extra: "");
        File.WriteAllText(fx.StudyPath, File.ReadAllText(fx.StudyPath).Replace("starts = 1", "starts = 1\nbootstrap = 8\ncv_folds = 3", StringComparison.Ordinal));
        var (exit, _, stderr) = CliRunner.Run("run", fx.StudyPath, "--out", fx.Out());
        Assert.True(exit == 0, stderr);
        var data = SizeTest.Reporting.Data.ReportDataJson.Load(Path.Combine(fx.Out(), "report-data.json"));
        Assert.Equal(2, data.Bootstrap.Count);            // lcdm and tired-light, 8 resamples each
        Assert.Equal(8, data.Bootstrap[0].Resamples);
        Assert.Equal(2, data.CrossValidation.Count);
        var html = File.ReadAllText(Path.Combine(fx.Out(), "report.html"));
        Assert.Contains("id=\"table-bootstrap\"", html);
        Assert.Contains("id=\"table-cross-validation\"", html);
        Assert.Contains("Cross-validation (3 folds)", html);
        Assert.True(File.Exists(Path.Combine(fx.Out(), "tables", "bootstrap.csv")));
    }

    [Fact]
    [Trait("Category", "Slow")]
    public void DemoRunsTheShippedStudy()
    {
        var outDir = Path.Combine(Path.GetTempPath(), "sizetest-demo-" + Guid.NewGuid().ToString("N"));
        try
        {
            var (exit, stdout, stderr) = CliRunner.Run("demo", "--out", outDir);
            Assert.True(exit == 0, stderr);
            Assert.True(File.Exists(Path.Combine(outDir, "report.html")));
            Assert.True(File.Exists(Path.Combine(outDir, "report.pdf")));
            // The demo catalogue is drawn from flat ΛCDM (demo-catalogs/qdf-optical/README.md): ΛCDM should rank first.
            Assert.Matches(@"\n\s+1\s+ΛCDM\s", stdout);
            Assert.Contains("verdict: ΛCDM", stdout);
        }
        finally
        {
            if (Directory.Exists(outDir)) Directory.Delete(outDir, recursive: true);
        }
    }
}
