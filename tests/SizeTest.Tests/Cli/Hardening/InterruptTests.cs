using System.Diagnostics;
using Xunit;

namespace SizeTest.Tests.Cli.Hardening;

/// <summary>Issue 14 point 7: an interrupted run (SIGINT, SIGTERM) leaves nothing staged and the previous output intact.</summary>
public sealed class InterruptTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-interrupt-").FullName;

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    [Theory]
    [InlineData(2, 130)]    // SIGINT → 128 + 2
    [InlineData(15, 143)]   // SIGTERM → 128 + 15
    public async Task SignalInTheMiddleOfALongMcmcRemovesTheStagingFolderAndKeepsThePreviousOutput(int signal, int expectedExit)
    {
        var cat = Path.Combine(_dir, "c.csv");
        File.WriteAllText(cat, HardeningData.CatalogueText(200));
        var outDir = Path.Combine(_dir, "out");
        var first = CliRunner.Run(["fit", cat, .. HardeningData.ColArgs, .. HardeningData.Quick, "--out", outDir]);
        Assert.True(first.Exit == 0, first.Err);
        var before = HardeningData.Snapshot(outDir);

        using var p = Process.Start(CliProcess.Info(_dir, ["fit", cat, .. HardeningData.ColArgs, .. HardeningData.Quick,
            "--sampler", "mcmc", "--walkers", "16", "--steps", "200000", "--out", outDir, "--force"]))!;
        var stderr = p.StandardError.ReadToEndAsync();
        var stdout = p.StandardOutput.ReadToEndAsync();
        // Wait until the sampler is writing its chain into the staging folder.
        var sw = Stopwatch.StartNew();
        string? chain = null;
        while (chain is null && sw.Elapsed.TotalSeconds < 90 && !p.HasExited)
        {
            await Task.Delay(100);
            chain = Directory.EnumerateDirectories(_dir, ".out.tmp-*", new EnumerationOptions { AttributesToSkip = 0 })
                .SelectMany(d => Directory.EnumerateFiles(d, "*chains_*", new EnumerationOptions { AttributesToSkip = 0 })).FirstOrDefault(f => new FileInfo(f).Length > 0);
        }
        Assert.False(p.HasExited, "the MCMC run ended before it could be interrupted: " + (p.HasExited ? await stderr : ""));
        Assert.NotNull(chain);
        CliProcess.Signal(p.Id, signal);
        Assert.True(p.WaitForExit(30_000), "sizetest did not stop after the signal");
        Assert.Equal(expectedExit, p.ExitCode);
        Assert.Contains("interrupted", await stderr);
        Assert.Empty(HardeningData.StagingLeft(_dir));
        HardeningData.AssertSame(before, HardeningData.Snapshot(outDir));
        _ = await stdout;
    }
}
