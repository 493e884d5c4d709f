using Xunit;

namespace SizeTest.Tests.Cli;

/// <summary>
/// The message and exit code of each bad fit, power or simulate setting, and of each bad setting found by an inner stage
/// (catalogue mapping, photometry options, output folder, selection, mock survey), are approved
/// (<c>Approved/bad-input-*.txt</c>): request validation and the wording of inner-stage messages (settings, rendered as
/// flags by the CLI) can move between layers without changing what the user sees. The fit and power cases fail before
/// any file is read, so the catalogue path need not exist; the catalogue cases read a small CSV written here.
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

    /// <summary>simulate: every case names --seed, --out and --n 20 before its own settings (OUT.csv becomes a temporary file).</summary>
    private static readonly string[][] SimulateCases =
    [
        ["--r0-kpc", "-1"],
        ["--scatter-dex", "-1"],
        ["--scatter-mag", "-1"],
        ["--size-err-frac", "-1"],
        ["--size-err-floor", "-1"],
        ["--mu-err", "-1"],
        ["--photoz-err", "1"],
        ["--size-err-frac-zmax", "-1"],
        ["--size-errors", "gaussian", "--size-err-floor", "0.1"],
        ["--min-size", "0"],
        ["--population", "early:x:3:-1"],
        ["--population", "early:0.4"],
        ["--population", "early:0:3:-1"],
        ["--population", "early:0.4:-3:-1"],
        ["--population", "early:0.4:3:-1:0:-1"],
        ["--population", "early:0.4:3:-1", "--population", "early:0.6:3:-1"],
        ["--z-dist", "bogus:1:2"],
        ["--z-dist", "uniform:a:3"],
        ["--z-dist", "uniform:3:1"],
        ["--kind", "radio", "--sb-limit", "25"],
        ["--kind", "radio", "--population", "early:0.4:3:-1"],
        ["--kind", "radio", "--scatter-dex", "-1"],
        ["--sb-limit", "5"],
        ["--max-memory", "lots"],
        ["--max-memory", "1K"],
    ];

    /// <summary>fit and inspect of a small CSV (CAT: id, z, theta, theta_err, mu, mu_err; NOZ: the same without z; LONG: a
    /// 200-byte header line); FILE is an existing file, FULL a folder holding a file sizetest did not write.</summary>
    private static readonly string[][] CatalogueCases =
    [
        ["fit", "CAT", "--out", ""],
        ["fit", "CAT", "--out", "FILE"],
        ["fit", "CAT", "--out", "FILE/sub"],
        ["fit", "CAT", "--out", "FULL"],
        ["fit", "CAT", "--out", "OUT", "--hdu", "2"],
        ["fit", "CAT", "--out", "OUT", "--col", "theta=theta:furlong"],
        ["fit", "NOZ", "--out", "OUT"],
        ["fit", "LONG", "--out", "OUT", "--max-line-bytes", "64"],
        ["fit", "CAT", "--out", "OUT", "--observable", "size", "--sb-limit", "24"],
        ["fit", "CAT", "--out", "OUT", "--observable", "sb", "--min-size", "0.1"],
        ["fit", "CAT", "--out", "OUT", "--observable", "joint", "--sb-limit", "24", "--mag-limit", "24", "--min-size", "0.1"],
        ["fit", "CAT", "--out", "OUT", "--min-size", "-1"],
        ["fit", "CAT", "--out", "OUT", "--size-sb-relation"],
        ["fit", "CAT", "--out", "OUT", "--observable", "sb", "--sb-limit", "10"],
        ["fit", "CAT", "--out", "OUT", "--observable", "sb", "--sb-limit", "22.5"],
        ["fit", "CAT", "--out", "OUT", "--observable", "sb", "--free", "size_evolution"],
        ["fit", "CAT", "--out", "OUT", "--models", "tired-light", "--observable", "size", "--free", "dimming_exponent"],
        ["fit", "CAT", "--out", "OUT", "--size-mass"],
        ["fit", "CAT", "--out", "OUT", "--size-luminosity"],
        ["fit", "CAT", "--out", "OUT", "--sampler", "mcmc", "--walkers", "1000", "--steps", "auto", "--max-steps", "1000000", "--max-memory", "64M"],
        ["fit", "CAT", "--out", "OUT", "--band", " "],
        ["fit", "CAT", "--out", "OUT", "--kcorr", "bogus"],
        ["fit", "CAT", "--out", "OUT", "--kcorr", "powerlaw:x"],
        ["fit", "CAT", "--out", "OUT", "--kcorr", "template:FILE"],
        ["fit", "CAT", "--out", "OUT", "--extinction", "bogus"],
        ["fit", "CAT", "--out", "OUT", "--extinction", "ebv:EBV"],
        ["fit", "CAT", "--out", "OUT", "--zero-points", " "],
        ["fit", "CAT", "--out", "OUT", "--sersic-n", "abc"],
        ["fit", "CAT", "--out", "OUT", "--sersic-n", "100"],
        ["fit", "CAT", "--out", "OUT", "--sb", "bogus"],
        ["fit", "CAT", "--out", "OUT", "--sb", "column:mean,to:bogus"],
        ["fit", "CAT", "--out", "OUT", "--band-match", "mode:x"],
        ["fit", "CAT", "--out", "OUT", "--band-match", "band:r=mu@6200"],
        ["inspect", "CAT", "--hdu", "2"],
        ["inspect", "CAT", "--kcorr", "template:x,bogus:1"],
    ];

    private static string Record(string verb, string[][] cases, Func<string[], string[]> args)
    {
        var text = new System.Text.StringBuilder();
        var dir = Path.Combine(Path.GetTempPath(), "sizetest-bad-input-" + Guid.NewGuid().ToString("N"));
        try
        {
            Directory.CreateDirectory(dir);
            WriteCatalogues(dir);
            foreach (var c in cases)
            {
                var full = args(c).Select(a => Substitute(a, dir)).ToArray();
                var (exit, _, err) = CliRunner.Run(full);
                text.Append(verb).Append(verb.Length > 0 ? " " : "").AppendJoin(' ', c.Select(a => a.Length == 0 || a.Contains(' ') ? $"'{a}'" : a)).Append('\n');
                text.Append("exit ").Append(exit).Append('\n');
                text.Append(err.Replace(dir, "TMP", StringComparison.Ordinal).Replace("\r\n", "\n").TrimEnd('\n')).Append("\n\n");
                Assert.False(Directory.Exists(Path.Combine(dir, "out")), $"{verb} {string.Join(' ', c)} left an output folder");
                Assert.False(File.Exists(Path.Combine(dir, "out.csv")), $"{verb} {string.Join(' ', c)} left a catalogue");
            }
        }
        finally
        {
            if (Directory.Exists(dir)) Directory.Delete(dir, true);
        }
        return text.ToString();
    }

    private static string Substitute(string token, string dir) => token switch
    {
        "OUT" => Path.Combine(dir, "out"),
        "OUT.csv" => Path.Combine(dir, "out.csv"),
        "CAT" or "NOZ" or "LONG" or "FILE" or "FULL" => Path.Combine(dir, token),
        "FILE/sub" => Path.Combine(dir, "FILE", "sub"),
        "template:FILE" => "template:" + Path.Combine(dir, "FILE"),
        _ => token,
    };

    /// <summary>A 30-object catalogue with sizes and surface brightnesses (z = 0.1 … 3, θ falling, μ rising; the values
    /// only need to be valid), the same without z, one with a long header, an existing file and a foreign folder.</summary>
    private static void WriteCatalogues(string dir)
    {
        var rows = Enumerable.Range(0, 30).Select(i => FormattableString.Invariant(
            $"{i + 1},{0.1 + 0.1 * i:0.00},{2.0 / (1 + 0.1 * i):0.0000},{0.1 / (1 + 0.1 * i):0.00000},{21 + 0.1 * i:0.00},0.1")).ToArray();
        File.WriteAllLines(Path.Combine(dir, "CAT"), ["id,z,theta,theta_err,mu,mu_err", .. rows]);
        File.WriteAllLines(Path.Combine(dir, "NOZ"), ["id,zz,theta,theta_err,mu,mu_err", .. rows]);
        File.WriteAllLines(Path.Combine(dir, "LONG"), ["id,z,theta,theta_err,mu,mu_err," + string.Join(',', Enumerable.Range(0, 30).Select(k => $"extra_column_{k}")), .. rows]);
        File.WriteAllText(Path.Combine(dir, "FILE"), "not a folder\n");
        Directory.CreateDirectory(Path.Combine(dir, "FULL"));
        File.WriteAllText(Path.Combine(dir, "FULL", "notes.txt"), "someone else's file\n");
    }

    [Fact]
    public void FitBadSettingsMatchTheirApprovedMessages() =>
        Approval.Verify("bad-input-fit.txt", Record("fit", FitCases, c => ["fit", "no-such-catalogue.csv", "--out", "no-such-output", .. c]));

    [Fact]
    public void PowerBadSettingsMatchTheirApprovedMessages() =>
        Approval.Verify("bad-input-power.txt", Record("power", PowerCases, c => ["power", .. c]));

    [Fact]
    public void SimulateBadSettingsMatchTheirApprovedMessages() =>
        Approval.Verify("bad-input-simulate.txt", Record("simulate", SimulateCases, c => ["simulate", "--seed", "1", "--out", "OUT.csv", "--n", "20", .. c]));

    [Fact]
    public void InnerStageBadSettingsMatchTheirApprovedMessages() =>
        Approval.Verify("bad-input-stages.txt", Record("", CatalogueCases, c => c));
}
