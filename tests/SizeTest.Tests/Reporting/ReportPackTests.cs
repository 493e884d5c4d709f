using SizeTest.Foundation.Errors;
using SizeTest.Reporting;
using SizeTest.Reporting.Pack;
using Xunit;

namespace SizeTest.Tests.Reporting;

public sealed class ReportPackTests
{
    private static ReportContent Make(int seed = 7) => ReportContent.From(SyntheticReport.Create(seed: seed));

    private static readonly ReportPackOptions Fast = new() { PngDpi = 60, PdfReport = false };

    [Fact]
    public void WritesEveryFigureInThreeFormatsTablesAndManifest()
    {
        var root = Directory.CreateTempSubdirectory("sizetest-pack-");
        try
        {
            var target = Path.Combine(root.FullName, "out");
            var content = Make();
            var files = new ReportPackWriter(Fast).Write(target, false, content);
            foreach (var f in content.Figures)
                foreach (var ext in new[] { "png", "svg", "pdf" })
                    Assert.True(File.Exists(Path.Combine(target, "figures", $"{f.Id}.{ext}")), $"{f.Id}.{ext} missing");
            foreach (var t in new[] { "parameters", "comparison", "rejects" })
            {
                Assert.True(File.Exists(Path.Combine(target, "tables", t + ".csv")));
                Assert.Contains("\\begin{tabular}", File.ReadAllText(Path.Combine(target, "tables", t + ".tex")));
            }
            Assert.Contains("manifest.json", files);
            Assert.Contains("report.html", files);
            Assert.Contains("report-data.json", files);
            Assert.Empty(Directory.GetDirectories(root.FullName, ".out.tmp-*"));
        }
        finally { root.Delete(true); }
    }

    [Fact]
    public void SameInputsAndSeedGiveByteIdenticalTablesFiguresAndManifestApartFromTheVolatileField()
    {
        var root = Directory.CreateTempSubdirectory("sizetest-det-");
        try
        {
            var a = Path.Combine(root.FullName, "a");
            var b = Path.Combine(root.FullName, "b");
            var c1 = Make();
            var c2 = Make();
            // Different timestamps in the two runs: only the volatile field may differ.
            c1 = c1 with { Data = c1.Data with { Manifest = c1.Data.Manifest! with { Volatile = new RunTimings(DateTimeOffset.UnixEpoch, DateTimeOffset.UnixEpoch.AddSeconds(3), [new StageTiming("fit", 2.5)]) } } };
            c2 = c2 with { Data = c2.Data with { Manifest = c2.Data.Manifest! with { Volatile = new RunTimings(DateTimeOffset.UtcNow, DateTimeOffset.UtcNow, [new StageTiming("fit", 9.1)]) } } };
            var w = new ReportPackWriter(Fast);
            w.Write(a, false, c1);
            w.Write(b, false, c2);
            foreach (var rel in Directory.GetFiles(Path.Combine(a, "tables")).Select(Path.GetFileName)
                         .Concat(Directory.GetFiles(Path.Combine(a, "figures")).Select(f => "../figures/" + Path.GetFileName(f))))
                Assert.Equal(File.ReadAllBytes(Path.Combine(a, "tables", rel!)), File.ReadAllBytes(Path.Combine(b, "tables", rel!)));
            string Strip(string json) => json[..json.IndexOf("\"volatile\"", StringComparison.Ordinal)];
            var ma = File.ReadAllText(Path.Combine(a, "manifest.json"));
            var mb = File.ReadAllText(Path.Combine(b, "manifest.json"));
            Assert.NotEqual(ma, mb);
            Assert.Equal(Strip(ma), Strip(mb));
            Assert.EndsWith("}\n}\n", ma); // volatile is the last field
        }
        finally { root.Delete(true); }
    }

    [Fact]
    public void ExistingReportIsKeptWithoutForceAndReplacedWithForce()
    {
        var root = Directory.CreateTempSubdirectory("sizetest-force-");
        try
        {
            var target = Path.Combine(root.FullName, "out");
            var w = new ReportPackWriter(Fast with { Png = false, Pdf = false, Html = false });
            w.Write(target, false, Make(7));
            var before = File.ReadAllText(Path.Combine(target, "manifest.json"));
            var ex = Assert.Throws<InputException>(() => w.Write(target, false, Make(8)));
            Assert.Contains("force", ex.SettingProblems.Single().Settings); // the CLI writes it as --force
            Assert.Equal(before, File.ReadAllText(Path.Combine(target, "manifest.json")));
            w.Write(target, true, Make(8));
            Assert.Contains("\"seed\": 8", File.ReadAllText(Path.Combine(target, "manifest.json")));
        }
        finally { root.Delete(true); }
    }

    [Fact]
    public void AFailureMidwayLeavesTheOldReportIntact()
    {
        var root = Directory.CreateTempSubdirectory("sizetest-fail-");
        try
        {
            var target = Path.Combine(root.FullName, "out");
            var w = new ReportPackWriter(Fast with { Png = false, Pdf = false, Html = false });
            w.Write(target, false, Make(7));
            var before = Directory.GetFiles(target, "*", SearchOption.AllDirectories).Order().ToList();
            var manifest = File.ReadAllText(Path.Combine(target, "manifest.json"));
            Assert.Throws<AnalysisException>(() => w.Write(target, true, Make(9), folder =>
            {
                File.WriteAllText(folder.PathOf("results.json"), "{}");
                throw new AnalysisException("simulated failure after the figures were written");
            }));
            Assert.Equal(before, Directory.GetFiles(target, "*", SearchOption.AllDirectories).Order().ToList());
            Assert.Equal(manifest, File.ReadAllText(Path.Combine(target, "manifest.json")));
            Assert.Empty(Directory.GetDirectories(root.FullName, ".out.tmp-*"));
        }
        finally { root.Delete(true); }
    }

    [Fact]
    public void ManifestDescribesInputsRelativeToTheWorkingDirectoryWithSha256()
    {
        var root = Directory.CreateTempSubdirectory("sizetest-inputs-");
        try
        {
            Directory.CreateDirectory(Path.Combine(root.FullName, "data"));
            File.WriteAllText(Path.Combine(root.FullName, "data", "cat.csv"), "abc");
            var inputs = RunManifest.DescribeInputs(["data/cat.csv"], root.FullName);
            var i = Assert.Single(inputs);
            Assert.Equal("data/cat.csv", i.Path);
            // SHA-256("abc") from FIPS 180-2, appendix B.1.
            Assert.Equal("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad", i.Sha256);
        }
        finally { root.Delete(true); }
    }
}
