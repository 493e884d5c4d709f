using System.Text.RegularExpressions;
using Xunit;

namespace SizeTest.Tests.Architecture;

/// <summary>
/// Enforces the data flow of DEVELOPERS.md ("The layering rule"): a stage may use only stages to
/// its left, and physics stages do no file or console I/O. Stage references are read from the
/// compiled library (<see cref="TypeReferenceScanner"/>), so every spelling of a name counts —
/// fully qualified, namespace-relative (<c>Catalogues.SizeKind</c> inside <c>SizeTest.Inference</c>)
/// or through a <c>using</c> alias. <see cref="LayeringCheckerTests"/> shows that it catches them.
/// </summary>
public sealed partial class LayeringTests
{
    /// <summary>The order of the data flow; Distributed sits right of Inference and may use it.</summary>
    internal static readonly string[] Stages =
        ["Foundation", "Cosmology", "Catalogues", "Photometry", "Inference", "Distributed", "Simulation", "Reporting", "Studies"];

    // Files in physics stages that are allowed to touch the file system, with the reason.
    private static readonly Dictionary<string, string> IoAllowed = new()
    {
        ["Photometry/PhotometryFiles.cs"] = "the one loader of user-supplied spectra, filters and band tables",
        ["Inference/Sampling/CsvChainStore.cs"] = "the file-backed chain store (storage behind an interface)",
    };

    /// <summary>The stage of a namespace (<c>SizeTest.Catalogues.Text</c> → Catalogues), or null outside the stages.</summary>
    internal static string? StageOf(string ns)
    {
        var parts = ns.Split('.');
        return parts.Length >= 2 && parts[0] == "SizeTest" && Stages.Contains(parts[1]) ? parts[1] : null;
    }

    /// <summary>Every use of a stage to the right of the user's own stage, as "from → to" lines.</summary>
    internal static List<string> Violations(IEnumerable<TypeUse> uses) =>
        uses.Select(u => (u, from: StageOf(u.FromNamespace), to: StageOf(u.ToNamespace)))
            .Where(x => x.from is not null && x.to is not null && Array.IndexOf(Stages, x.to) > Array.IndexOf(Stages, x.from))
            .Select(x => $"{x.u.FromNamespace}.{x.u.FromType} ({x.from}) uses {x.u.ToNamespace}.{x.u.ToType} ({x.to})")
            .Distinct().Order(StringComparer.Ordinal).ToList();

    internal static string SourceRoot()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "SizeTest.sln"))) dir = dir.Parent;
        Assert.NotNull(dir);
        return Path.Combine(dir!.FullName, "src", "SizeTest");
    }

    [GeneratedRegex(@"\b(File|Directory|FileStream|StreamWriter|StreamReader|Console)\.|new\s+(FileStream|StreamWriter|StreamReader)\b|\bAtomicFile\.")]
    private static partial Regex IoUse();

    [Fact]
    public void StagesUseOnlyStagesToTheirLeft()
    {
        var library = typeof(SizeTest.Foundation.Errors.InputException).Assembly.Location;
        var uses = TypeReferenceScanner.Scan(library, ns => StageOf(ns) is not null);
        // The scan sees the library's own cross-stage uses (a sanity check that it reads anything):
        // Inference binds Photometry's Observables, so at least that use must be found.
        Assert.Contains(uses, u => StageOf(u.FromNamespace) == "Inference" && StageOf(u.ToNamespace) == "Photometry");
        var violations = Violations(uses);
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
