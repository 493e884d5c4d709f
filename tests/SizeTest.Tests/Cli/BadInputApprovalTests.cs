using Xunit;

namespace SizeTest.Tests.Cli;

/// <summary>
/// The message and exit code of each bad fit or power setting are approved
/// (<c>Approved/bad-input-fit.txt</c>, <c>Approved/bad-input-power.txt</c>): request validation can move between
/// layers (CLI to library) without changing what the user sees. Every case fails before any file is read, so
/// the catalogue path need not exist; the expected exit code is 2 (bad input) throughout.
/// </summary>
public sealed class BadInputApprovalTests
{
    private static readonly string[][] FitCases =
    [
        ["--bootstrap", "-1"],
        ["--cv-folds", "1"],
        ["--starts", "0"],
        ["--walkers", "3"],
        ["--steps", "5"],
        ["--steps", "many"],
        ["--live-points", "5"],
        ["--max-steps", "5"],
        ["--sampler", "gibbs"],
        ["--observable", "colour"],
        ["--models", ","],
        ["--models", "lcdm,steady-state"],
        ["--fix", "omega_m"],
        ["--fix", "omega_m=abc"],
        ["--prior", "omega_m=0.3"],
        ["--prior", "omega_m=0.3,-1"],
        ["--bound", "omega_m=1:0.1"],
        ["--expect", "size_evolution=x:1"],
        ["--free", "bogus"],
        ["--mag-limit", "24"],
        ["--grid-nodes", "3"],
        ["--max-memory", "lots"],
    ];

    private static readonly string[][] PowerCases =
    [
        [],
        ["--seed", "1"],
        ["--seed", "1", "--out", "OUT", "--n", "5"],
        ["--seed", "1", "--out", "OUT", "--n", ","],
        ["--seed", "1", "--out", "OUT", "--models", "lcdm,steady-state"],
        ["--seed", "1", "--out", "OUT", "--fix", "bogus=1"],
        ["--seed", "1", "--out", "OUT", "--mocks", "0"],
        ["--seed", "1", "--out", "OUT", "--target-power", "1.5"],
        ["--seed", "1", "--out", "OUT", "--starts", "0"],
        ["--seed", "1", "--out", "OUT", "--threads", "0"],
        ["--seed", "1", "--out", "OUT", "--kind", "radio", "--observable", "sb"],
    ];

    private static string Record(string verb, string[][] cases, Func<string[], string[]> args)
    {
        var text = new System.Text.StringBuilder();
        var dir = Path.Combine(Path.GetTempPath(), "sizetest-bad-input-" + Guid.NewGuid().ToString("N"));
        try
        {
            foreach (var c in cases)
            {
                var full = args(c.Select(a => a == "OUT" ? Path.Combine(dir, "out") : a).ToArray());
                var (exit, _, err) = CliRunner.Run(full);
                text.Append(verb).Append(' ').AppendJoin(' ', c).Append('\n');
                text.Append("exit ").Append(exit).Append('\n');
                text.Append(err.Replace(dir, "TMP", StringComparison.Ordinal).Replace("\r\n", "\n").TrimEnd('\n')).Append("\n\n");
                Assert.False(Directory.Exists(Path.Combine(dir, "out")), $"{verb} {string.Join(' ', c)} left an output folder");
            }
        }
        finally
        {
            if (Directory.Exists(dir)) Directory.Delete(dir, true);
        }
        return text.ToString();
    }

    [Fact]
    public void FitBadSettingsMatchTheirApprovedMessages() =>
        Approval.Verify("bad-input-fit.txt", Record("fit", FitCases, c => ["fit", "no-such-catalogue.csv", "--out", "no-such-output", .. c]));

    [Fact]
    public void PowerBadSettingsMatchTheirApprovedMessages() =>
        Approval.Verify("bad-input-power.txt", Record("power", PowerCases, c => ["power", .. c]));
}
