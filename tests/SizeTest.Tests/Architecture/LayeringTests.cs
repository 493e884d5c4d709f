using System.Text.RegularExpressions;
using Xunit;

namespace SizeTest.Tests.Architecture;

/// <summary>
/// Enforces the data-flow arrows of design.md on the library's source: a stage may use only
/// stages to its left, and physics stages do no file or console I/O. A source scan (using
/// directives and qualified names) is enough because every stage is a namespace = folder.
/// </summary>
public sealed partial class LayeringTests
{
    // The order of design.md's data flow; Distributed sits beside Inference and may use it.
    private static readonly string[] Stages =
        ["Common", "Cosmology", "Catalogs", "Photometry", "Inference", "Distributed", "Simulation", "Reporting", "Studies"];

    // Files in physics stages that are allowed to touch the file system, with the reason.
    private static readonly Dictionary<string, string> IoAllowed = new()
    {
        ["Photometry/PhotometryFiles.cs"] = "the one loader of user-supplied spectra, filters and band tables",
        ["Inference/Sampling/CsvChainStore.cs"] = "the file-backed chain store (storage behind an interface)",
    };

    private static string SourceRoot()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "SizeTest.sln"))) dir = dir.Parent;
        Assert.NotNull(dir);
        return Path.Combine(dir!.FullName, "src", "SizeTest");
    }

    [GeneratedRegex(@"\bSizeTest\.(Common|Cosmology|Catalogs|Photometry|Inference|Distributed|Simulation|Reporting)\b")]
    private static partial Regex StageReference();

    [GeneratedRegex(@"\b(File|Directory|FileStream|StreamWriter|StreamReader|Console)\.|new\s+(FileStream|StreamWriter|StreamReader)\b|\bAtomicFile\.")]
    private static partial Regex IoUse();

    [Fact]
    public void StagesUseOnlyStagesToTheirLeft()
    {
        var root = SourceRoot();
        var violations = new List<string>();
        foreach (var file in Directory.EnumerateFiles(root, "*.cs", SearchOption.AllDirectories))
        {
            var rel = Path.GetRelativePath(root, file).Replace('\\', '/');
            if (rel.StartsWith("obj/") || rel.StartsWith("bin/")) continue;
            int own = Array.IndexOf(Stages, rel.Split('/')[0]);
            if (own < 0) continue;
            foreach (var (line, n) in File.ReadLines(file).Select((l, i) => (l, i + 1)))
            {
                if (line.TrimStart().StartsWith("///") || line.TrimStart().StartsWith("//")) continue;
                foreach (Match m in StageReference().Matches(line))
                {
                    int used = Array.IndexOf(Stages, m.Groups[1].Value);
                    if (used > own) violations.Add($"{rel}:{n} uses SizeTest.{m.Groups[1].Value}");
                }
            }
        }
        Assert.True(violations.Count == 0, "Stage arrows broken:\n" + string.Join("\n", violations));
    }

    [Theory]
    [InlineData("Cosmology")]
    [InlineData("Photometry")]
    [InlineData("Inference")]
    public void PhysicsStagesDoNoIo(string stage)
    {
        var root = SourceRoot();
        var violations = new List<string>();
        foreach (var file in Directory.EnumerateFiles(Path.Combine(root, stage), "*.cs", SearchOption.AllDirectories))
        {
            var rel = Path.GetRelativePath(root, file).Replace('\\', '/');
            if (IoAllowed.ContainsKey(rel)) continue;
            foreach (var (line, n) in File.ReadLines(file).Select((l, i) => (l, i + 1)))
            {
                var code = line.TrimStart();
                if (code.StartsWith("//")) continue;
                if (IoUse().IsMatch(code)) violations.Add($"{rel}:{n}: {code}");
            }
        }
        Assert.True(violations.Count == 0, "I/O in a physics stage:\n" + string.Join("\n", violations));
    }
}
