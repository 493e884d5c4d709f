using SizeTest.Tests.Distributed;
using System.Text.Json;
using Xunit;

namespace SizeTest.Tests.Cli.Distributed;

/// <summary>`mpirun -np N sizetest fit …` against the single-process `sizetest fit` of the same catalogue.</summary>
public sealed class MpiFitCommandTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-mpifit-").FullName;

    public void Dispose() => Directory.Delete(_dir, recursive: true);

    private static JsonElement Results(string folder) => JsonDocument.Parse(File.ReadAllText(Path.Combine(folder, "results.json"))).RootElement;

    // results.json without its notes (which name the process set-up), as text: the numbers must be bit-identical.
    private static string Numbers(string folder)
    {
        var node = System.Text.Json.Nodes.JsonNode.Parse(File.ReadAllText(Path.Combine(folder, "results.json")))!.AsObject();
        node.Remove("notes");
        return node.ToJsonString();
    }

    [MpiFact]
    public void OneTwoAndFourRanksWriteIdenticalResultsIncludingCvProfilesAndBootstrap()
    {
        // 1500 rows = 2 chunks of 1024 (EvaluationBackend): 2 ranks hold one chunk each, 4 ranks 1 + 1 + none + none.
        // Kept small (one model, 2 folds, no bootstrap: the thread-rank test covers it) so 1, 2 and 4 oversubscribed ranks stay fast.
        var csv = DistributedFitCatalogues.Csv(_dir, 1500);
        string[] Args(string o) => ["fit", csv, "--models", "eds", "--cv-folds", "2", "--profile", "size_evolution", "--starts", "1", "--out", o];
        string single = Path.Combine(_dir, "single");
        var (exit, _, stderr) = CliRunner.Run(Args(single));
        Assert.True(exit == 0, stderr);
        string reference = Numbers(single);
        Assert.Equal(1, Results(single).GetProperty("cross_validation").GetArrayLength());
        Assert.Equal(1, Results(single).GetProperty("profiles").GetArrayLength());
        foreach (int np in new[] { 1, 2, 4 })
        {
            string parent = Path.Combine(_dir, $"np{np}");
            Directory.CreateDirectory(parent);
            string output = Path.Combine(parent, "out");
            (exit, var stdout, stderr) = MpiRunner.Run(np, Args(output));
            Assert.True(exit == 0, $"{np} ranks, exit {exit}: {stderr}");
            // Every number — fits, LRTs, CV scores, profiles — bit-identical.
            Assert.Equal(reference, Numbers(output));
            foreach (var f in new[] { "rejects.csv", "results.csv", "profile_eds_size_evolution.csv" })
                Assert.Equal(File.ReadAllText(Path.Combine(single, f)), File.ReadAllText(Path.Combine(output, f)));
            // Only rank 0 prints and writes: one table on stdout, one output folder, nothing else.
            Assert.Single(stdout.Split('\n'), l => l.StartsWith("rank  model", StringComparison.Ordinal));
            Assert.Equal(["out"], Directory.GetFileSystemEntries(parent).Select(Path.GetFileName));
            if (np > 1) Assert.Contains(Results(output).GetProperty("notes").EnumerateArray(), n => n.GetString()!.Contains($"{np} ranks"));
        }
    }

    [MpiFact]
    public void FourRanksFitAParquetCatalogueAsOneProcessDoes()
    {
        // Row groups of 500 rows: each rank reads only its own groups and the chunks follow the row groups, so the fit is
        // bit-identical to the single-process one. (Free cosmology on 1, 2 and 4 ranks: DistributedFitStudyTests.)
        var parquet = DistributedFitCatalogues.Parquet(_dir, 3000, 500);
        string[] Args(string o) => ["fit", parquet, "--models", "eds", "--cv-folds", "0", "--out", o];
        string single = Path.Combine(_dir, "single"), four = Path.Combine(_dir, "np4");
        var (exit, _, stderr) = CliRunner.Run(Args(single));
        Assert.True(exit == 0, stderr);
        (exit, _, stderr) = MpiRunner.Run(4, Args(four));
        Assert.True(exit == 0, $"exit {exit}: {stderr}");
        Assert.Equal(Numbers(single), Numbers(four));
        Assert.Equal(File.ReadAllText(Path.Combine(single, "rejects.csv")), File.ReadAllText(Path.Combine(four, "rejects.csv")));
    }

    [MpiFact]
    public void TheEnsembleSamplerGivesTheSameChainOnOneAndTwoRanks()
    {
        var csv = DistributedFitCatalogues.Csv(_dir, 2600);
        string[] Args(string o) => ["fit", csv, "--models", "eds", "--cv-folds", "0", "--sampler", "mcmc", "--walkers", "8", "--steps", "60", "--out", o];
        string single = Path.Combine(_dir, "single"), two = Path.Combine(_dir, "np2");
        var (exit, _, stderr) = CliRunner.Run(Args(single));
        Assert.True(exit is 0 or 1, stderr); // 1: a 60-step chain is judged not converged; the numbers are still written
        (exit, _, stderr) = MpiRunner.Run(2, Args(two));
        Assert.True(exit is 0 or 1, stderr);
        Assert.Equal(Numbers(single), Numbers(two));
        Assert.Equal(File.ReadAllText(Path.Combine(single, "chains_eds.csv")), File.ReadAllText(Path.Combine(two, "chains_eds.csv")));
    }

    [MpiFact]
    public void AnExistingOutputFolderStopsAllRanksWithOneMessage()
    {
        var csv = DistributedFitCatalogues.Csv(_dir, 500);
        string output = Path.Combine(_dir, "taken");
        Directory.CreateDirectory(output);
        File.WriteAllText(Path.Combine(output, "keep.txt"), "earlier results");
        var (exit, stdout, stderr) = MpiRunner.Run(2, "fit", csv, "--models", "eds", "--out", output);
        Assert.Equal(2, exit);
        Assert.Equal("", stdout.Trim());
        Assert.Single(stderr.Split('\n'), l => l.StartsWith("sizetest:", StringComparison.Ordinal));
    }

    [MpiFact]
    public void SurveyTermsOnTwoRanksGiveTheSingleProcessNumbers()
    {
        // Photometric-redshift marginalisation (z_err mapped), the size–luminosity relation and the --min-size truncation are sums
        // over objects with a prior range from the whole sample: 2 ranks (one 1024-row chunk each) must match one process exactly.
        string mock = Path.Combine(_dir, "survey.csv");
        var (code, _, err) = CliRunner.Run(["simulate", "--n", "1500", "--seed", "9", "--out", mock, "--luminosity-function", "schechter:-21:-1.2:-24:-16",
            "--size-lum-slope", "0.3", "--photoz-err", "0.03", "--min-size", "0.3"]);
        Assert.True(code == 0, err);
        // The population redshift prior needs the whole sample in one process and is refused under mpirun (checked below): flat here.
        string[] Args(string o) => ["fit", mock, "--models", "eds", "--size-luminosity", "--min-size", "0.3", "--cv-folds", "0", "--starts", "1", "--z-prior-shape", "flat", "--out", o];
        string single = Path.Combine(_dir, "survey-single");
        (code, _, err) = CliRunner.Run(Args(single));
        Assert.True(code == 0, err);
        string two = Path.Combine(_dir, "survey-np2");
        var (exit, _, stderr) = MpiRunner.Run(2, Args(two));
        Assert.True(exit == 0, stderr);
        Assert.Equal(Numbers(single), Numbers(two));
        // The notes state the whole sample's prior range, not rank 0's share.
        var photoz = (JsonElement n) => n.GetString()!.Contains("photometric redshifts", StringComparison.Ordinal);
        Assert.Equal(Results(single).GetProperty("notes").EnumerateArray().Single(photoz).GetString(),
            Results(two).GetProperty("notes").EnumerateArray().Single(photoz).GetString());
    }

    [MpiFact]
    public void AStatedRedshiftPriorIsJudgedOnTheWholeSampleUnderMpirun()
    {
        // 2048 photo-z objects (z 0.3–2, σ_z = 0.03(1+z)) sorted by z downwards: rank 0 holds the upper 1024 rows (one chunk),
        // rank 1 the lower 1024. Under --z-prior 1.45:3 rank 1's share lies wholly more than 3 z_err below 1.45 (an error if it
        // decided alone: 1024 of 1024), rank 0's mostly inside, the whole sample over half outside: one warning, as one process.
        string mock = Path.Combine(_dir, "zprior.csv");
        var (code, _, err) = CliRunner.Run(["simulate", "--n", "2048", "--seed", "5", "--photoz-err", "0.03", "--z-dist", "uniform:0.3:2", "--out", mock]);
        Assert.True(code == 0, err);
        var lines = File.ReadAllLines(mock);
        var header = lines[0].Split(',');
        int zi = Array.IndexOf(header, "z"), ei = Array.IndexOf(header, "z_err");
        var rows = lines.Skip(1).OrderByDescending(l => double.Parse(l.Split(',')[zi], System.Globalization.CultureInfo.InvariantCulture)).ToArray();
        File.WriteAllLines(mock, [lines[0], .. rows]);
        bool Outside(string l)
        {
            var f = l.Split(',');
            double z = double.Parse(f[zi], System.Globalization.CultureInfo.InvariantCulture), s = double.Parse(f[ei], System.Globalization.CultureInfo.InvariantCulture);
            return z < 1.45 - 3 * s || z > 3 + 3 * s;   // the rule of SurveyRequest (18e0399), counted here from the file
        }
        int all = rows.Count(Outside), second = rows.Skip(1024).Count(Outside);
        Assert.Equal(1024, second);                         // rank 1 alone would refuse the fit
        Assert.InRange(all, 1025, 2047);                     // over half of 2048, not all: the whole sample warns
        string warning = $"{all} of the 2048 objects with z_err > 0 have z_obs more than 3 z_err outside the stated --z-prior [1.45, 3]";
        string[] Args(string o) => ["fit", mock, "--models", "eds", "--cv-folds", "0", "--starts", "1", "--z-prior", "1.45:3", "--z-prior-shape", "flat", "--out", o];
        (code, _, err) = CliRunner.Run(Args(Path.Combine(_dir, "zprior-single")));
        Assert.True(code == 0, err);
        Assert.Contains(warning, err, StringComparison.Ordinal);
        var (exit, _, stderr) = MpiRunner.Run(2, Args(Path.Combine(_dir, "zprior-np2")));
        Assert.True(exit == 0, stderr);
        Assert.Contains(warning, stderr, StringComparison.Ordinal);
    }

    [MpiFact]
    public void ALuminosityWindowOnTwoRanksGivesTheSingleProcessNumbersAndCounts()
    {
        // 2500 objects in 1024-row chunks: rank 0 holds rows 1–1024 and 2049–2500, rank 1 rows 1025–2048. Each world model's window
        // (its own D_L) keeps a different number of objects; n, BIC and the window notes must be the whole sample's, as one process.
        string mock = Path.Combine(_dir, "window.csv");
        var (code, _, err) = CliRunner.Run(["simulate", "--model", "static-linear", "--n", "2500", "--seed", "7", "--z-dist", "uniform:0.2:1.5",
            "--luminosity-function", "schechter:-21:-1.2:-24:-18", "--size-lum-slope", "0.3", "--size-evolution", "0", "--out", mock]);
        Assert.True(code == 0, err);
        string[] Args(string o) => ["fit", mock, "--models", "lcdm,static-linear", "--abs-mag-range", "-22:-20", "--cv-folds", "0", "--starts", "1", "--out", o];
        string single = Path.Combine(_dir, "window-single");
        (code, _, err) = CliRunner.Run(Args(single));
        Assert.True(code == 0, err);
        var (exit, _, stderr) = MpiRunner.Run(2, Args(Path.Combine(_dir, "window-np2")));
        Assert.True(exit == 0, stderr);
        Assert.Equal(Numbers(single), Numbers(Path.Combine(_dir, "window-np2")));
        static string[] WindowNotes(JsonElement r) => [.. r.GetProperty("notes").EnumerateArray().Select(n => n.GetString()!).Where(n => n.Contains("luminosity window:", StringComparison.Ordinal))];
        var notes = WindowNotes(Results(single));
        Assert.Equal(2, notes.Length);
        Assert.All(notes, n => Assert.Contains("of 2500 objects", n, StringComparison.Ordinal));
        Assert.Equal(notes, WindowNotes(Results(Path.Combine(_dir, "window-np2"))));
        // The two models keep different objects, so their n differ (the per-model n of the window).
        var n = Results(single).GetProperty("models").EnumerateArray().Select(m => m.GetProperty("n").GetInt32()).ToArray();
        Assert.NotEqual(n[0], n[1]);
        Assert.All(n, k => Assert.Contains($"luminosity window: {k} of 2500", string.Join("\n", notes), StringComparison.Ordinal));
    }

    [MpiFact]
    public void ThePopulationRedshiftPriorIsRefusedUnderMpirunNotSilentlyReplaced()
    {
        string mock = Path.Combine(_dir, "photoz.csv");
        var (code, _, err) = CliRunner.Run(["simulate", "--n", "400", "--seed", "3", "--out", mock, "--photoz-err", "0.03"]);
        Assert.True(code == 0, err);
        var (exit, stdout, stderr) = MpiRunner.Run(2, "fit", mock, "--models", "eds", "--cv-folds", "0", "--out", Path.Combine(_dir, "photoz-np2"));
        Assert.Equal(2, exit);
        Assert.Equal("", stdout.Trim());
        Assert.Contains("under mpirun set --z-prior-shape flat", stderr, StringComparison.Ordinal);
    }

    [MpiFact]
    public void SurveyTermsThatNeedTheWholeSampleAreRefusedUnderMpirun()
    {
        var csv = DistributedFitCatalogues.Csv(_dir, 500);
        string output = Path.Combine(_dir, "groups");
        var (exit, stdout, stderr) = MpiRunner.Run(2, "fit", csv, "--models", "eds", "--evolution", "binned:3", "--out", output);
        Assert.Equal(2, exit);
        Assert.Equal("", stdout.Trim());
        Assert.Contains("--evolution binned do not run under mpirun", stderr, StringComparison.Ordinal);
        Assert.False(Directory.Exists(output));
    }

    [MpiFact]
    public void AMissingColumnStopsAllRanksWithOneMessage()
    {
        // Surface brightness needs a 'mu' column, which the catalogue lacks: checked before the fit on every rank.
        var csv = DistributedFitCatalogues.Csv(_dir, 500);
        string output = Path.Combine(_dir, "sb");
        var (exit, stdout, stderr) = MpiRunner.Run(2, "fit", csv, "--models", "eds", "--observable", "sb", "--out", output);
        Assert.Equal(2, exit);
        Assert.Equal("", stdout.Trim());
        Assert.Single(stderr.Split('\n'), l => l.Contains("'mu' column", StringComparison.Ordinal));
        Assert.False(Directory.Exists(output));
    }

    [MpiFact]
    public void FitUnderAWrongLauncherIsRefused()
    {
        // Launcher variables for 2 processes, but Open MPI starts as a singleton (world size 1): N single-rank jobs.
        var csv = DistributedFitCatalogues.Csv(_dir, 500);
        string output = Path.Combine(_dir, "wrong");
        var env = new Dictionary<string, string> { ["PMI_SIZE"] = "2", ["PMI_RANK"] = "0" };
        var (exit, _, stderr) = MpiRunner.RunPlain(env, "fit", csv, "--models", "eds", "--out", output);
        Assert.Equal(2, exit);
        Assert.Contains("reports a world of 1", stderr);
        Assert.False(Directory.Exists(output));
    }
}
