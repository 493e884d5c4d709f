using SizeTest.Tests.Distributed;
using System.Text.Json;
using SizeTest.Distributed;
using Xunit;

namespace SizeTest.Tests.Cli.Distributed;

/// <summary>
/// Rank-count invariance of the distributed likelihood (issue 8): 1, 2 and 4 Open MPI ranks (oversubscribed on
/// this 2-core machine) and the in-process single-process run agree to 1e-10 relative in ln L and to the
/// optimiser tolerance in parameters. The catalogue is SYNTHETIC (<see cref="SyntheticKernelRows"/>).
/// </summary>
public sealed class MpiRankInvarianceTests
{
    private const string Rows = "60000";

    private static JsonElement Parse(string json) => JsonDocument.Parse(json).RootElement;

    private static double[] Doubles(JsonElement e, string name) => e.GetProperty(name).EnumerateArray().Select(x => x.GetDouble()).ToArray();

    private static JsonElement InProcess()
    {
        var (exit, stdout, stderr) = CliRunner.Run("ranks", "--rows", Rows, "--seed", "42", "--format", "json");
        Assert.True(exit == 0, stderr);
        return Parse(stdout);
    }

    private static void AssertAgree(JsonElement reference, JsonElement other, int ranks)
    {
        Assert.Equal(ranks, other.GetProperty("rank_count").GetInt32());
        var a = Doubles(reference, "log_likelihood_checks");
        var b = Doubles(other, "log_likelihood_checks");
        for (int i = 0; i < a.Length; i++)
            Assert.True(Math.Abs(a[i] - b[i]) <= 1e-10 * Math.Abs(a[i]), $"{ranks} ranks: ln L {b[i]:R} vs single process {a[i]:R}");
        // Optimiser tolerance: Nelder–Mead stops at a function change of 1e-10; with curvature ~ n/σ² ≈ 1e6 per
        // parameter that leaves ~1e-8 in the parameters, so 1e-5 absolute is a safe bound (closed-form estimate).
        var pa = Doubles(reference, "best_fit");
        var pb = Doubles(other, "best_fit");
        for (int i = 0; i < pa.Length; i++) Assert.True(Math.Abs(pa[i] - pb[i]) <= 1e-5, $"{ranks} ranks: parameter {i} {pb[i]:R} vs {pa[i]:R}");
        double la = reference.GetProperty("max_log_likelihood").GetDouble(), lb = other.GetProperty("max_log_likelihood").GetDouble();
        Assert.True(Math.Abs(la - lb) <= 1e-9 * Math.Abs(la), $"{ranks} ranks: max ln L {lb:R} vs {la:R}");
    }

    [MpiFact]
    public void TwoRanksAgreeWithASingleProcess()
    {
        var reference = InProcess();
        var (exit, stdout, stderr) = MpiRunner.Run(2, "ranks", "--rows", Rows, "--seed", "42", "--format", "json", "--threads", "1");
        Assert.True(exit == 0, $"exit {exit}: {stderr}");
        var lines = stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Single(lines); // only rank 0 writes
        var two = Parse(lines[0]);
        Assert.Contains("Open MPI", two.GetProperty("ranks").GetString());
        Assert.Equal(30000, two.GetProperty("rows_rank0").GetInt64());
        AssertAgree(reference, two, 2);
        Assert.True(two.GetProperty("seconds_per_allreduce").GetDouble() > 0);
    }

    [MpiFact]
    public void OneAndFourRanksAgreeWithASingleProcess()
    {
        var reference = InProcess();
        foreach (var ranks in new[] { 1, 4 })
        {
            var (exit, stdout, stderr) = MpiRunner.Run(ranks, "ranks", "--rows", Rows, "--seed", "42", "--format", "json", "--threads", "1");
            Assert.True(exit == 0, $"{ranks} ranks, exit {exit}: {stderr}");
            AssertAgree(reference, Parse(stdout.Trim()), ranks);
        }
    }

    [Fact]
    public void WithoutAnMpiLibraryALauncherForSeveralProcessesIsReported()
    {
        // Single-process fallback: no launcher variables → one process even when no MPI library exists;
        // launcher variables for 2 processes but no loadable library → exit 2 with a clear message.
        var none = new Dictionary<string, string> { ["SIZETEST_MPI_LIBRARY"] = "/nonexistent/libmpi-none.so" };
        var (exit, stdout, _) = MpiRunner.RunPlain(none, "ranks", "--rows", "1000");
        Assert.Equal(0, exit);
        Assert.Contains("ranks: single process", stdout);

        var launcher = new Dictionary<string, string>(none) { ["PMI_SIZE"] = "2", ["PMI_RANK"] = "0" };
        (exit, _, var stderr) = MpiRunner.RunPlain(launcher, "ranks", "--rows", "1000");
        Assert.Equal(2, exit);
        Assert.Contains("no MPI library could be loaded", stderr);
    }

    [MpiFact]
    public void WrongLauncherIsDetected()
    {
        // A Hydra-style launcher variable for 2 processes, but Open MPI starts as a singleton (world size 1):
        // the situation of "mpiexec of one MPI, library of another" giving N single-rank jobs.
        var env = new Dictionary<string, string> { ["PMI_SIZE"] = "2", ["PMI_RANK"] = "0" };
        var (exit, _, stderr) = MpiRunner.RunPlain(env, "ranks", "--rows", "1000");
        Assert.Equal(2, exit);
        Assert.Contains("reports a world of 1", stderr);
    }
}
