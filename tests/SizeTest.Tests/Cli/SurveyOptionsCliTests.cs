using System.Text.Json;
using SizeTest.Tests.Catalogues;
using Xunit;

namespace SizeTest.Tests.Cli;

/// <summary>The survey options of <c>simulate</c> and <c>fit</c> end to end, their parsing errors, and <c>inspect</c> on the new roles.</summary>
public sealed class SurveyOptionsCliTests : IDisposable
{
    private readonly TempFiles _t = new();

    public void Dispose() => _t.Dispose();

    private static JsonElement Model(string resultsJson, string name)
    {
        using var doc = JsonDocument.Parse(resultsJson);
        return doc.RootElement.GetProperty("models").EnumerateArray().Single(m => m.GetProperty("name").GetString() == name).Clone();
    }

    private static double Param(JsonElement model, string name) =>
        model.GetProperty("parameters").GetProperty(name).GetProperty("value").GetDouble();

    private string Simulate(params string[] extra)
    {
        string path = _t.PathOf($"mock{Guid.NewGuid():N}.csv");
        var (code, _, err) = CliRunner.Run(["simulate", "--n", "800", "--seed", "4", "--out", path, .. extra]);
        Assert.True(code == 0, err);
        return path;
    }

    private (int Code, string Out, string Err, string Dir) Fit(string catalog, params string[] extra)
    {
        string dir = _t.PathOf($"fit{Guid.NewGuid():N}");
        var (code, o, e) = CliRunner.Run(["fit", catalog, "--models", "lcdm", "--cv-folds", "0", "--starts", "1", "--out", dir, .. extra]);
        return (code, o, e, dir);
    }

    [Fact]
    public void MagnitudeLimitedSimulationFitsWithTheSizeLuminosityRelation()
    {
        var mock = Simulate("--luminosity-function", "schechter:-21:-1.2:-24:-16", "--size-lum-slope", "0.3", "--mag-limit", "24", "--z-dist", "uniform:0.1:2");
        var (code, _, err, dir) = Fit(mock, "--size-luminosity", "--pivot-abs-mag", "-21");
        Assert.True(code == 0, err);
        var json = File.ReadAllText(Path.Combine(dir, "results.json"));
        var m = Model(json, "lcdm");
        // β = 0.3 injected; 800 objects give σ_β ≈ 0.01 (measured in SizeLuminosityRecoveryTests at n = 2000: ±0.01), so ±0.1 is loose.
        Assert.InRange(Param(m, "size_luminosity_slope"), 0.2, 0.4);
        Assert.Contains("per model", json.Replace("each world model", "per model"), StringComparison.Ordinal);
    }

    [Fact]
    public void GroupsBinnedEvolutionAndPhotometricRedshiftsRunFromTheCommandLine()
    {
        var mock = Simulate("--population", "early:0.5:3:-1.5", "--population", "late:0.5:6:-0.75", "--photoz-err", "0.03");
        var (code, stdout, err, dir) = Fit(mock, "--group", "group", "--evolution", "binned:3");
        Assert.True(code == 0, err);
        // The table's evolution column names the bins (never a blank).
        Assert.Contains("binned: 3 bins of r0_kpc (see the figure)", stdout, StringComparison.Ordinal);
        var json = File.ReadAllText(Path.Combine(dir, "results.json"));
        var m = Model(json, "lcdm");
        foreach (var g in new[] { "early", "late" })
            for (int k = 1; k <= 3; k++) Assert.True(Param(m, $"r0_kpc_bin{k}@{g}") > 0);
        Assert.Contains("linearised marginal", json, StringComparison.Ordinal); // the photo-z marginal is stated
        var (code2, out2, err2, dir2) = Fit(mock, "--group", "group", "--ignore-z-err", "--fix", "size_evolution@early=-1.5");
        Assert.True(code2 == 0, err2);
        // Per population the table's a column gives each group's exponent.
        Assert.Contains("a[early] -1.5 (fixed); a[late] ", out2.Replace('−', '-'), StringComparison.Ordinal);
        var m2 = Model(File.ReadAllText(Path.Combine(dir2, "results.json")), "lcdm");
        Assert.Equal(-1.5, Param(m2, "size_evolution@early"));
    }

    [Fact]
    public void AStatedRedshiftPriorThatExcludesMostOrAllOfTheDataIsWarnedOrRefused()
    {
        // z uniform on 0.3–2, σ_z = 0.03(1+z) ≤ 0.09: with a prior of 1.7:3 every object below z ≈ 1.4 lies more than 3 σ_z below
        // LO (3 σ_z < 0.27 there), over half the sample; with 2.5:3 every object does (z_obs ≤ 2 + noise, 2.5 − 3·0.09 = 2.23).
        var mock = Simulate("--photoz-err", "0.03", "--z-dist", "uniform:0.3:2");
        var (code, _, err, dir) = Fit(mock, "--z-prior", "1.7:3");
        Assert.True(code == 0, err);
        Assert.True(err.Contains("warning: ", StringComparison.Ordinal), err);
        Assert.Matches(@"\d+ of the \d+ objects with z_err > 0 have z_obs more than 3 z_err outside the stated --z-prior \[1.7, 3\]", err);
        Assert.Contains("outside the stated --z-prior [1.7, 3]", File.ReadAllText(Path.Combine(dir, "results.json")), StringComparison.Ordinal);
        var (code2, _, err2, _) = Fit(mock, "--z-prior", "2.5:3");
        Assert.Equal(2, code2);
        Assert.Matches(@"(\d+) of the \1 objects with z_err > 0 have z_obs more than 3 z_err outside the stated --z-prior \[2.5, 3\]: the prior excludes all of them", err2);
    }

    [Fact]
    public void ThePhotometricRedshiftMarginalIsLinearisedByDefaultAndQuadratureOnRequest()
    {
        var mock = Simulate("--photoz-err", "0.03", "--z-dist", "uniform:0.3:2");
        var (code, _, err, dir) = Fit(mock, "--z-prior", "0.3:2");
        Assert.True(code == 0, err);
        var json = File.ReadAllText(Path.Combine(dir, "results.json"));
        Assert.Contains("linearised marginal (--z-marginal linear", json, StringComparison.Ordinal); // the note names the flag
        Assert.DoesNotContain("-point Gauss", json, StringComparison.Ordinal);
        var (code2, _, err2, dir2) = Fit(mock, "--z-prior", "0.3:2", "--z-marginal", "quadrature");
        Assert.True(code2 == 0, err2);
        var json2 = File.ReadAllText(Path.Combine(dir2, "results.json"));
        Assert.Contains("-point Gauss", json2, StringComparison.Ordinal);
        // 800 objects, σ_z = 0.03(1+z): the linearised a lies within a fifth of the quadrature's 68% half-width (the 2000-object
        // comparison, measured 0.107, is PhotometricRedshiftTests.LinearisedAndQuadratureMarginalsAgreeOnAPhotometricMock).
        var (lin, quad) = (Model(json, "lcdm"), Model(json2, "lcdm"));
        var pq = quad.GetProperty("parameters").GetProperty("size_evolution");
        double half = 0.5 * (pq.GetProperty("hi").GetDouble() - pq.GetProperty("lo").GetDouble());
        double apart = Math.Abs(Param(lin, "size_evolution") - Param(quad, "size_evolution")) / half;
        Assert.True(apart <= 0.2, $"linearised and quadrature a {apart:F3} half-widths apart");
        // sb and joint: the linearised marginal by default too, the quadrature on request; b agrees within a fifth of the quadrature's
        // half-width (800 objects; the 4000-object comparison is SurveyJointRecoveryTests.LinearisedAndQuadratureMarginalsAgree).
        var (code3, _, err3, dir3) = Fit(mock, "--observable", "joint", "--z-prior", "0.3:2");
        Assert.True(code3 == 0, err3);
        var json3 = File.ReadAllText(Path.Combine(dir3, "results.json"));
        Assert.Contains("linearised marginal (--z-marginal linear", json3, StringComparison.Ordinal);
        Assert.DoesNotContain("-point Gauss", json3, StringComparison.Ordinal);
        var (code4, _, err4, dir4) = Fit(mock, "--observable", "joint", "--z-prior", "0.3:2", "--z-marginal", "quadrature");
        Assert.True(code4 == 0, err4);
        var json4 = File.ReadAllText(Path.Combine(dir4, "results.json"));
        Assert.Contains("-point Gauss", json4, StringComparison.Ordinal);
        var (lj, qj) = (Model(json3, "lcdm"), Model(json4, "lcdm"));
        var pb = qj.GetProperty("parameters").GetProperty("sb_evolution");
        double halfB = 0.5 * (pb.GetProperty("hi").GetDouble() - pb.GetProperty("lo").GetDouble());
        Assert.True(Math.Abs(Param(lj, "sb_evolution") - Param(qj, "sb_evolution")) <= 0.2 * halfB,
            $"b linear {Param(lj, "sb_evolution")} vs quadrature {Param(qj, "sb_evolution")} ± {halfB}");
    }

    [Fact]
    public void TheQuadratureTakesMoreNodesForSurfaceBrightnessAndTheNodeCountOnRequest()
    {
        // Defaults (SurveyRequest.DefaultRedshiftNodes): 7 Gauss–Hermite nodes for size fits, 20 for sb and joint fits, where 7 biased b
        // by −0.45 half-widths over 20 mocks (docs/survey-catalogues.md); --z-nodes sets the count; without the quadrature it is ignored (note).
        var mock = Simulate("--photoz-err", "0.03", "--z-dist", "uniform:0.3:2");
        static int Nodes(string dir) => System.Text.Json.JsonDocument.Parse(File.ReadAllText(Path.Combine(dir, "results.json")))
            .RootElement.GetProperty("settings").GetProperty("survey").GetProperty("redshift_nodes").GetInt32();
        var size = Fit(mock, "--z-marginal", "quadrature");
        Assert.True(size.Code == 0, size.Err);
        Assert.Equal(7, Nodes(size.Dir));
        var joint = Fit(mock, "--observable", "joint", "--z-marginal", "quadrature");
        Assert.True(joint.Code == 0, joint.Err);
        Assert.Equal(20, Nodes(joint.Dir));
        Assert.Contains("20-point Gauss", File.ReadAllText(Path.Combine(joint.Dir, "results.json")), StringComparison.Ordinal);
        var asked = Fit(mock, "--z-marginal", "quadrature", "--z-nodes", "12");
        Assert.True(asked.Code == 0, asked.Err);
        Assert.Equal(12, Nodes(asked.Dir));
        var linear = Fit(mock, "--z-nodes", "12");
        Assert.True(linear.Code == 0, linear.Err);
        Assert.Contains("--z-nodes is ignored: the linearised photo-z marginal takes no nodes", File.ReadAllText(Path.Combine(linear.Dir, "results.json")), StringComparison.Ordinal);
    }

    [Fact]
    public void APopulationWithNoMoreObjectsThanItsParametersIsRefused()
    {
        // One object relabelled 'solo': R0, a and scatter of its own (3 parameters) cannot be fitted to 1 object; before, the whole
        // fit failed (exit 1) and printed "a[solo] = −2 +8 −4" (review, 4 Dec 2026). Now exit 2 naming the group and the counts.
        var mock = Simulate("--population", "early:0.5:4:-1.4", "--population", "late:0.5:6:-0.8");
        var lines = File.ReadAllLines(mock);
        int gi = Array.IndexOf(lines[0].Split(','), "group");
        var cells = lines[1].Split(',');
        cells[gi] = "solo";
        lines[1] = string.Join(",", cells);
        File.WriteAllLines(mock, lines);
        var (code, _, err, _) = Fit(mock, "--group", "group");
        Assert.Equal(2, code);
        Assert.Contains("population 'solo' of the --group column has 1 object but 3 parameters of its own", err, StringComparison.Ordinal);
    }

    [Fact]
    public void AGroupColumnWithMoreLabelsThanPopulationsIsRefusedBeforeAnyModelIsBuilt()
    {
        // The magnitude column as a group column: every object its own label (800 labels > MaxGroups = 50). Before, the fit built
        // models with k = 3·800 parameters and reached the small-population refusal only after minutes (3000 objects: 3 min 10 s).
        var mock = Simulate("--luminosity-function", "schechter:-21:-1.2:-24:-16");
        var (code, _, err, dir) = Fit(mock, "--group", "mag");
        Assert.Equal(2, code);
        int n = File.ReadAllLines(mock).Length - 1;
        Assert.Contains($"the --group column has {n} distinct labels among {n} objects ({n} of them held by a single object); at most 50 populations", err, StringComparison.Ordinal);
        Assert.False(Directory.Exists(dir));
    }

    [Fact]
    public void GaussianSizeErrorsAndTheLargeErrorWarning()
    {
        var mock = Simulate("--size-errors", "gaussian", "--size-err-frac", "0.05", "--size-err-frac-zmax", "0.5");
        var (code, _, err, _) = Fit(mock);
        Assert.True(code == 0, err);
        Assert.Contains("sigma_theta/theta > 0.2", err, StringComparison.Ordinal);
        var (code2, _, err2, _) = Fit(mock, "--size-errors", "gaussian");
        Assert.True(code2 == 0, err2);
        Assert.DoesNotContain("sigma_theta/theta > 0.2", err2, StringComparison.Ordinal);
    }

    [Fact]
    public void RadioFluxDensitiesFitTheLinearSizeRelation()
    {
        var mock = Simulate("--kind", "radio", "--lum-exponent", "0.1", "--z-dist", "uniform:0.4:2.8");
        var (code, _, err, dir) = Fit(mock, "--size-luminosity", "--frequency-ghz", "2.29", "--spectral-index", "0");
        Assert.True(code == 0, err);
        var m = Model(File.ReadAllText(Path.Combine(dir, "results.json")), "lcdm");
        // ℓ_m = 11.03 pc injected (Cao et al. 2017); 800 sources with 0.1 dex scatter: σ(ℓ_m) ≈ 0.3 pc, so ±1.5 pc is loose.
        Assert.InRange(1000 * Param(m, "r0_kpc"), 9.5, 12.5);
    }

    [Theory]
    [InlineData("--evolution", "binned:1", "--evolution must be power or binned:K")]
    [InlineData("--evolution", "steps", "--evolution must be power or binned:K")]
    [InlineData("--abs-mag-range", "-20:-23", "LO must be below HI")]
    [InlineData("--abs-mag-range", "bright", "must be LO:HI")]
    [InlineData("--z-prior", "1:x", "must be LO:HI")]
    [InlineData("--z-marginal", "cubic", "quadrature")]
    [InlineData("--ref-cosmology", "70", "must be H0:OMEGA_M")]
    [InlineData("--z-nodes", "1", "--z-nodes 1 is outside 2–40")]
    [InlineData("--z-nodes", "41", "--z-nodes 41 is outside 2–40")]
    public void BadSurveyOptionsExitWithTwo(string option, string value, string message)
    {
        var mock = Simulate();
        var extra = option == "--ref-cosmology" ? new[] { option, value, "--size-luminosity" } : [option, value];
        var (code, _, err, _) = Fit(mock, extra);
        Assert.Equal(2, code);
        Assert.Contains(message, err, StringComparison.Ordinal);
    }

    [Fact]
    public void ConflictingOrMissingSurveyInputsExitWithTwo()
    {
        var mock = Simulate();
        Assert.Equal(2, Fit(mock, "--size-luminosity", "--size-mass").Code);
        Assert.Contains("log_mass", Fit(mock, "--size-mass").Err, StringComparison.Ordinal);
        Assert.Contains("group", Fit(mock, "--group", "nosuch").Err, StringComparison.Ordinal);
        // The redshift column named as the group column: one role per column, said as such (was "no redshift column found … the columns are 'z', …").
        Assert.Contains("column 'z' is mapped to group, so it cannot also be the redshift", Fit(mock, "--group", "z").Err, StringComparison.Ordinal);
        Assert.Contains("--observable size or joint", Fit(mock, "--size-luminosity", "--observable", "sb").Err, StringComparison.Ordinal);
        Assert.Contains("--size-luminosity", Fit(mock, "--frequency-ghz", "5").Err, StringComparison.Ordinal);
    }

    [Fact]
    public void TheRedshiftPriorShapeIsStatedAndCanBeFlat()
    {
        var mock = Simulate("--photoz-err", "0.03");
        var (code, o, err, dir) = Fit(mock);
        Assert.True(code == 0, err);
        Assert.Contains("deconvolved from the quoted z errors", o, StringComparison.Ordinal);
        Assert.Contains("steps, converged", o, StringComparison.Ordinal);
        Assert.DoesNotContain("did not converge", err, StringComparison.Ordinal);
        // results.json records the prior used and how its EM iteration ended.
        var survey = System.Text.Json.JsonDocument.Parse(File.ReadAllText(Path.Combine(dir, "results.json"))).RootElement.GetProperty("settings").GetProperty("survey");
        var pop = survey.GetProperty("redshift_population");
        Assert.True(pop.GetProperty("converged").GetBoolean());
        Assert.InRange(pop.GetProperty("final_change").GetDouble(), 0, SizeTest.Inference.Survey.PopulationRedshiftPrior.Tolerance);
        Assert.InRange(pop.GetProperty("em_steps").GetInt32(), 1, SizeTest.Inference.Survey.PopulationRedshiftPrior.MaxIterations - 1);
        Assert.Equal(1.0, pop.GetProperty("weights").EnumerateArray().Sum(w => w.GetDouble()), 12); // weights on the simplex, to rounding
        Assert.Equal(pop.GetProperty("weights").GetArrayLength(), pop.GetProperty("centres").GetArrayLength());
        (code, o, err, dir) = Fit(mock, "--z-prior-shape", "flat");
        Assert.True(code == 0, err);
        Assert.Contains("flat in z", o, StringComparison.Ordinal);
        Assert.DoesNotContain("deconvolved", o, StringComparison.Ordinal);
        Assert.Equal(System.Text.Json.JsonValueKind.Null, System.Text.Json.JsonDocument.Parse(File.ReadAllText(Path.Combine(dir, "results.json"))).RootElement
            .GetProperty("settings").GetProperty("survey").GetProperty("redshift_population").ValueKind);
        Assert.Equal(2, Fit(mock, "--z-prior-shape", "bumpy").Code);
        // The study file's key reads the same two words.
        var study = SizeTest.Studies.StudyFileParser.Parse("[catalogue]\npath = \"x.csv\"\n[models]\nnames = [\"lcdm\"]\n[survey]\nz_prior_shape = \"flat\"\n", "s.toml", _t.Dir);
        Assert.Equal(SizeTest.Inference.Survey.RedshiftPriorShape.Flat, study.Survey!.RedshiftPriorShape);
    }

    [Fact]
    public void AnExactRedshiftOutsideTheStatedPriorGoesToTheRejectLogByRow()
    {
        // Row 6 of the file (the 5th object): z = 3.5 with z_err = 0 has no density under a flat prior on [0.05, 3] (the
        // integrand N(z; 3.5, 0) π(z) is zero everywhere); row 7: z = 3.5 with its z_err > 0 is integrated under its truncated
        // normal on the prior and stays. read = accepted + rejected: 300 = 299 + 1.
        string mock = _t.PathOf("prior-mock.csv");
        Assert.Equal(0, CliRunner.Run(["simulate", "--n", "300", "--seed", "4", "--photoz-err", "0.03", "--out", mock]).Exit);
        var lines = File.ReadAllLines(mock);
        var head = lines[0].Split(',');
        int iz = Array.IndexOf(head, "z"), ie = Array.IndexOf(head, "z_err");
        string[] Edit(string line, bool exact) { var f = line.Split(','); f[iz] = "3.5"; if (exact) f[ie] = "0"; return f; }
        lines[5] = string.Join(',', Edit(lines[5], exact: true));
        lines[6] = string.Join(',', Edit(lines[6], exact: false));
        string path = _t.PathOf("prior.csv");
        File.WriteAllLines(path, lines);
        var (code, o, err, dir) = Fit(path, "--z-prior", "0.05:3", "--z-marginal", "quadrature");
        Assert.True(code == 0, err);
        Assert.Contains("300 rows read, 299 accepted, 1 rejected", o, StringComparison.Ordinal);
        Assert.Contains("1 z_prior", err, StringComparison.Ordinal);
        var rejects = File.ReadAllLines(Path.Combine(dir, "rejects.csv"));
        Assert.Equal(2, rejects.Length);
        Assert.StartsWith("6,z,3.5,outside selection: z_prior,", rejects[1], StringComparison.Ordinal);
        Assert.Contains("the prior cuts the redshift error distribution of", o, StringComparison.Ordinal);
    }

    [Fact]
    public void MinimumSizeTruncationRunsWithTheSurveyTermsAndTheNotesSayHow()
    {
        var mock = Simulate("--luminosity-function", "schechter:-21:-1.2:-24:-16", "--size-lum-slope", "0.3", "--photoz-err", "0.03", "--min-size", "0.4");
        var (code, _, err, dir) = Fit(mock, "--size-luminosity", "--min-size", "0.4");
        Assert.True(code == 0, err);
        var json = File.ReadAllText(Path.Combine(dir, "results.json"));
        using var doc = JsonDocument.Parse(json);
        var notes = doc.RootElement.GetProperty("notes").EnumerateArray().Select(n => n.GetString()!).ToList();
        Assert.Contains(notes, n => n.Contains("minimum size: each object's density is divided by P(θ_obs > 0.4″ | z)", StringComparison.Ordinal)
                                    && n.Contains("with the linearised photo-z variance", StringComparison.Ordinal));
        // β = 0.3 injected; ±0.1 is loose for 800 objects (see MagnitudeLimitedSimulationFitsWithTheSizeLuminosityRelation).
        Assert.InRange(Param(Model(json, "lcdm"), "size_luminosity_slope"), 0.2, 0.4);
    }

    [Theory]
    [InlineData("sb")]
    [InlineData("joint")]
    public void GroupsBinnedEvolutionAndPhotometricRedshiftsRunForSurfaceBrightnessAndJointFits(string observable)
    {
        // Each group gets its own μ0, b and SB scatter (joint: also R0, a and the size scatter); binned evolution frees μ0 (and R0)
        // per redshift bin; a z_err column is marginalised over by default (the linearised marginal).
        var mock = Simulate("--population", "early:0.5:3:-1.5", "--population", "late:0.5:6:-0.75", "--photoz-err", "0.03");
        var (code, _, err, dir) = Fit(mock, "--group", "group", "--observable", observable);
        Assert.True(code == 0, err);
        var json = File.ReadAllText(Path.Combine(dir, "results.json"));
        var m = Model(json, "lcdm");
        foreach (var g in new[] { "early", "late" })
        {
            Assert.InRange(Param(m, $"sb_evolution@{g}"), 0.5, 1.5); // b = 1 injected (simulate's default)
            if (observable == "joint") Assert.True(Param(m, $"r0_kpc@{g}") > 0);
        }
        Assert.Contains("photometric redshifts: linearised marginal", json, StringComparison.Ordinal);
        var (code2, _, err2, dir2) = Fit(mock, "--evolution", "binned:3", "--observable", observable, "--ignore-z-err");
        Assert.True(code2 == 0, err2);
        var m2 = Model(File.ReadAllText(Path.Combine(dir2, "results.json")), "lcdm");
        for (int k = 1; k <= 3; k++) Assert.True(Param(m2, $"mu0_bin{k}") > 15);
    }

    [Theory]
    [InlineData("sb", "--size-errors", "gaussian", "--size-errors gaussian is built for --observable size only")]
    [InlineData("joint", "--size-errors", "gaussian", "--size-errors gaussian is built for --observable size only")]
    [InlineData("sb", "--size-luminosity", null, "need a size model: fit them with --observable size or joint")]
    public void SurveyTermsWithoutAModelForThemAreRefusedNotIgnored(string observable, string flag, string? value, string message)
    {
        var mock = Simulate("--luminosity-function", "schechter:-21:-1.2:-24:-16", "--size-lum-slope", "0.3");
        var (code, _, err, dir) = Fit(mock, [flag, .. value is null ? Array.Empty<string>() : [value], "--observable", observable]);
        Assert.True(code == 2, $"exit {code}: {err}");
        Assert.Contains(message, err, StringComparison.Ordinal);
        Assert.False(Directory.Exists(dir));
    }

    [Fact]
    public void SimulateRejectsInconsistentSurveyOptions()
    {
        string p = _t.PathOf("bad.csv");
        Assert.Equal(2, CliRunner.Run(["simulate", "--n", "10", "--seed", "1", "--out", p, "--size-lum-slope", "0.3"]).Exit);
        Assert.Equal(2, CliRunner.Run(["simulate", "--n", "10", "--seed", "1", "--out", p, "--luminosity-function", "gauss:1:2"]).Exit);
        Assert.Equal(2, CliRunner.Run(["simulate", "--n", "10", "--seed", "1", "--out", p, "--population", "early:x:3:-1"]).Exit);
        Assert.Equal(2, CliRunner.Run(["simulate", "--n", "10", "--seed", "1", "--out", p, "--kind", "radio", "--population", "a:1:3:-1"]).Exit);
    }

    [Fact]
    public void InspectShowsTheSurveyRoles()
    {
        var csv = _t.Write("survey.csv", "z,theta,abs_mag,log_mass,flux_density,sersic_n,group,weight\n" +
                                          "0.5,1.2,-21.5,10.8,0.12,2.5,early,1\n0.7,0.9,-20.1,10.2,0.05,1.1,late,2\n0.9,0.8,-22.0,11.1,0.30,4.0,early,1\n");
        var (code, o, err) = CliRunner.Run(["inspect", csv]);
        Assert.True(code == 0, err);
        foreach (var role in new[] { "abs_mag", "log_mass", "flux_density", "sersic_n", "group", "weight" })
            Assert.Contains(role, o, StringComparison.Ordinal);
        var (code2, o2, err2) = CliRunner.Run(["inspect", csv, "--col", "flux_density=flux_density:mJy", "--format", "json"]);
        Assert.True(code2 == 0, err2);
        Assert.Contains("mJy", o2, StringComparison.Ordinal);
    }
}
