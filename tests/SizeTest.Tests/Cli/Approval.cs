using Xunit;

namespace SizeTest.Tests.Cli;

/// <summary>
/// Approval files: a text the program produces is compared with an approved copy under
/// <c>tests/SizeTest.Tests/Cli/Approved/</c> (in the source tree, not the build output). A difference
/// fails with a line diff. With <c>SIZETEST_APPROVE=1</c> the approved copies are rewritten instead:
/// <c>SIZETEST_APPROVE=1 dotnet test tests/SizeTest.Tests --filter "FullyQualifiedName~Approval"</c>
/// (DEVELOPERS.md, "Approval files").
/// </summary>
internal static class Approval
{
    /// <summary>The environment variable that switches to rewriting.</summary>
    public const string EnvironmentVariable = "SIZETEST_APPROVE";

    private const string Regenerate = "SIZETEST_APPROVE=1 dotnet test tests/SizeTest.Tests --filter \"FullyQualifiedName~Approval\"";

    /// <summary>True when the approved files are being rewritten.</summary>
    public static bool Approving => Environment.GetEnvironmentVariable(EnvironmentVariable) == "1";

    /// <summary>The folder of approved files in the source tree.</summary>
    public static string Folder
    {
        get
        {
            var dir = new DirectoryInfo(AppContext.BaseDirectory);
            while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "SizeTest.sln"))) dir = dir.Parent;
            Assert.NotNull(dir);
            return Path.Combine(dir!.FullName, "tests", "SizeTest.Tests", "Cli", "Approved");
        }
    }

    /// <summary>Compares <paramref name="actual"/> with the approved file <paramref name="name"/> (or rewrites it).</summary>
    public static void Verify(string name, string actual)
    {
        actual = actual.Replace("\r\n", "\n");
        var path = Path.Combine(Folder, name);
        if (Approving)
        {
            Directory.CreateDirectory(Folder);
            File.WriteAllText(path, actual);
            return;
        }
        Assert.True(File.Exists(path), $"No approved file {name}. Create it with: {Regenerate}, review it and commit it.");
        var approved = File.ReadAllText(path).Replace("\r\n", "\n");
        if (approved != actual)
            Assert.Fail($"{name} differs from its approved copy (- approved, + now):\n{Diff(approved, actual)}\n" +
                        $"If the change is intended, regenerate with: {Regenerate}, review `git diff {Path.GetRelativePath(Path.Combine(Folder, "..", "..", "..", ".."), path)}` and commit.");
    }

    /// <summary>Approved files whose name matches <paramref name="pattern"/>.</summary>
    public static IEnumerable<string> Existing(string pattern) =>
        Directory.Exists(Folder) ? Directory.EnumerateFiles(Folder, pattern).Select(Path.GetFileName).OfType<string>() : [];

    /// <summary>Removes an approved file that no longer has a producer (only while approving).</summary>
    public static void Remove(string name)
    {
        if (Approving) File.Delete(Path.Combine(Folder, name));
    }

    /// <summary>A line diff by longest common subsequence (the texts are short).</summary>
    internal static string Diff(string expected, string actual)
    {
        var a = expected.Split('\n');
        var b = actual.Split('\n');
        var lcs = new int[a.Length + 1, b.Length + 1];
        for (int i = a.Length - 1; i >= 0; i--)
            for (int j = b.Length - 1; j >= 0; j--)
                lcs[i, j] = a[i] == b[j] ? lcs[i + 1, j + 1] + 1 : Math.Max(lcs[i + 1, j], lcs[i, j + 1]);
        var lines = new List<string>();
        int x = 0, y = 0;
        while (x < a.Length || y < b.Length)
        {
            if (x < a.Length && y < b.Length && a[x] == b[y]) { x++; y++; }
            else if (y < b.Length && (x == a.Length || lcs[x, y + 1] >= lcs[x + 1, y])) lines.Add($"+ {b[y++]}");
            else lines.Add($"- {a[x++]}");
        }
        return string.Join("\n", lines);
    }
}
