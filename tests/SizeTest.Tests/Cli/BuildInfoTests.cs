using System.Diagnostics;
using SizeTest.Cli;
using Xunit;

namespace SizeTest.Tests.Cli;

/// <summary>The commit is embedded at build time, so it is right when SizeTest runs outside its repository.</summary>
public sealed class BuildInfoTests
{
    private static string? Git(string dir, string args)
    {
        try
        {
            using var p = Process.Start(new ProcessStartInfo("git", args) { RedirectStandardOutput = true, RedirectStandardError = true, WorkingDirectory = dir })!;
            var s = p.StandardOutput.ReadToEnd().Trim();
            p.WaitForExit();
            return p.ExitCode == 0 ? s : null;
        }
        catch (System.ComponentModel.Win32Exception) { return null; }
    }

    [Fact]
    public void CommitIsEmbeddedAndTheSameFromAnotherDirectory()
    {
        // In-process: the embedded commit is a full 40-hex id and, in a checkout, one that git knows.
        Assert.Matches("^[0-9a-f]{40}$", BuildInfo.Commit);
        var repo = Path.GetDirectoryName(typeof(BuildInfo).Assembly.Location)!;
        if (Git(repo, $"cat-file -t {BuildInfo.Commit}") is { } kind) Assert.Equal("commit", kind);

        // Out of process, from a folder outside any repository: `sizetest --version` prints version+commit.
        var dll = typeof(BuildInfo).Assembly.Location;
        var tmp = Directory.CreateTempSubdirectory("sizetest-elsewhere-");
        try
        {
            Assert.Null(Git(tmp.FullName, "rev-parse HEAD")); // precondition: not inside a repository
            using var p = Process.Start(new ProcessStartInfo("dotnet", [dll, "--version"]) { RedirectStandardOutput = true, RedirectStandardError = true, WorkingDirectory = tmp.FullName })!;
            var stdout = p.StandardOutput.ReadToEnd();
            p.WaitForExit();
            Assert.Contains(BuildInfo.Commit, stdout);
        }
        finally { tmp.Delete(true); }
    }
}
