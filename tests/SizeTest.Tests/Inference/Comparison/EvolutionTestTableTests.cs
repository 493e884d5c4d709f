using System.Text.RegularExpressions;
using SizeTest.Inference;
using SizeTest.Inference.Comparison;
using Xunit;

namespace SizeTest.Tests.Inference.Comparison;

/// <summary>
/// Conclusions come from one table of tests: each (model, parameter) gets exactly one "needs / does not need"
/// statement, decided by the likelihood-ratio test at the 95% level alone, and no other sentence contradicts it.
/// </summary>
public sealed partial class EvolutionTestTableTests
{
    private static ModelFitSummary Model(string name, double a, double aLo, double aHi, double b, double bLo, double bHi) => new()
    {
        Name = name,
        Parameters = [new ParameterEstimate("size_evolution", a, aLo, aHi, false), new ParameterEstimate("sb_evolution", b, bLo, bHi, false)],
        LogLikelihood = -100, K = 4, N = 1000, Aic = 208, Aicc = 208, Bic = 227.6, Converged = true,
    };

    /// <summary>
    /// The issue's contradictory case: tired light's 68% interval for a (−0.098 … −0.030) does not contain 0, yet the
    /// LRT gives p = 0.057. The table must say "does not need" (LRT) and nothing may say "excludes".
    /// </summary>
    private static FitResult DemoLike() => new()
    {
        Source = "hand-made", RowsRead = 1000, Accepted = 1000, Rejected = 0, Seed = 1,
        Settings = new FitSettings(ObservableKind.Joint, new SelectionLimits(), false, 5, 0, 0, 1, 0, 0, SamplerKind.None, 0, 0, 0, null, [new ExpectedRange("size_evolution", -1.5, -0.7)], 1),
        Models = ModelComparison.Rank([
            Model("lcdm", -1.018, -1.052, -0.985, 1.041, 1.018, 1.064),
            Model("tired-light", -0.064, -0.098, -0.030, -1.959, -1.982, -1.936),
            Model("static-linear", 0.490, 0.456, 0.524, -1.959, -1.982, -1.936),
        ]),
        LikelihoodRatioTests = [
            LikelihoodRatioTest.Compute("lcdm", "size_evolution", 0, -100, -540, 1),
            LikelihoodRatioTest.Compute("lcdm", "sb_evolution", 0, -100, -760, 1),
            LikelihoodRatioTest.Compute("tired-light", "size_evolution", 0, -100, -101.81, 1), // Λ = 3.62 → p = 0.057
            LikelihoodRatioTest.Compute("tired-light", "sb_evolution", 0, -100, -2400, 1),
            LikelihoodRatioTest.Compute("static-linear", "size_evolution", 0, -100, -190, 1),
        ],
    };

    [Fact]
    public void CompactRadioSourcesAreNotJudgedByTheGalaxyExpectations()
    {
        // The shipped rows (evolution-expectations.txt) describe galaxy effective radii and early-type luminosity evolution; a sample of
        // compact radio sources is judged only against the study's own ranges. Without the flag, tired light's a = −0.064 with the
        // study's range [−1.5, −0.7] is outside it and b = −1.959 has the wrong sign against the shipped sb row (expected positive).
        var galaxies = EvolutionTestTable.From(DemoLike());
        Assert.Contains(galaxies, r => r.Model == "tired-light" && r.Parameter == "sb_evolution" && r.Plausibility == Plausibility.WrongSign);
        var radio = DemoLike() with { Settings = DemoLike().Settings with { CompactRadioSources = true, Expected = [] } };
        Assert.All(EvolutionTestTable.From(radio), r => Assert.Equal(Plausibility.NotJudged, r.Plausibility));
        // The study's own range still applies to radio sources.
        var own = DemoLike() with { Settings = DemoLike().Settings with { CompactRadioSources = true } };
        var rows = EvolutionTestTable.From(own);
        Assert.All(rows.Where(r => r.Parameter == "sb_evolution"), r => Assert.Equal(Plausibility.NotJudged, r.Plausibility));
        Assert.Contains(rows, r => r.Model == "tired-light" && r.Parameter == "size_evolution" && r.Plausibility != Plausibility.NotJudged);
    }

    [GeneratedRegex(@"^(?<model>.+?) (?<verb>needs|does not need) (?<what>size evolution|surface-brightness evolution)[: ]")]
    private static partial Regex Claim();

    /// <summary>Every claim about needing evolution in <paramref name="sentences"/>, keyed by (model, what).</summary>
    private static Dictionary<(string, string), HashSet<string>> Claims(IEnumerable<string> sentences)
    {
        var d = new Dictionary<(string, string), HashSet<string>>();
        foreach (var s in sentences)
        {
            var m = Claim().Match(s);
            if (!m.Success) continue;
            var key = (m.Groups["model"].Value, m.Groups["what"].Value);
            if (!d.TryGetValue(key, out var set)) d[key] = set = [];
            set.Add(m.Groups["verb"].Value);
        }
        return d;
    }

    [Fact]
    public void EveryStatementFollowsItsLikelihoodRatioTestAndNoneDisagree()
    {
        var r = DemoLike();
        var rows = EvolutionTestTable.From(r);
        Assert.Equal(6, rows.Count);
        var tl = rows.Single(x => x.Model == "tired-light" && x.Parameter == "size_evolution");
        Assert.InRange(tl.PValue!.Value, 0.05, 0.06); // χ²(1) tail at Λ = 3.62: 0.0571 (scipy.stats.chi2.sf(3.62, 1))
        Assert.Equal(EvolutionNeed.NotNeeded, tl.Need);
        Assert.Equal(EvolutionNeed.NotTested, rows.Single(x => x.Model == "static-linear" && x.Parameter == "sb_evolution").Need);

        var statements = rows.Select(EvolutionTestTable.Statement).ToList();
        var everything = statements.Concat(DecisionSummary.Implausible(rows)).Concat(DecisionSummary.CanTheDataDecide(r))
            .Concat(r.Models.SelectMany(_ => Array.Empty<string>())).ToList();
        var claims = Claims(everything);
        // One claim per tested row, and each matches the row's test outcome.
        foreach (var row in rows.Where(x => x.Need != EvolutionNeed.NotTested))
        {
            var set = claims[(row.ModelLabel, row.What)];
            Assert.Single(set);
            Assert.Equal(row.Need == EvolutionNeed.Needed ? "needs" : "does not need", set.Single());
        }
        // No sentence uses the ambiguous "excludes no evolution" phrasing, and the interval is never called an exclusion.
        Assert.All(everything, s => Assert.DoesNotContain("exclud", s));
        Assert.All(statements, s => Assert.Contains("95% level", s.Contains("no likelihood-ratio test", StringComparison.Ordinal) ? "95% level" : s));
    }

    [Fact]
    public void AnEstimateAtABoundIsStatedWithItsOneSidedIntervalNeverWithPlusMinus()
    {
        // Issue 14: "a parameter pinned at a bound is reported as at bound and never shown as an interval" of ± form.
        // Numbers from a fit of a committed-style mock with --bound size_evolution=-0.9:1 (Einstein–de Sitter wants a < −0.9).
        var row = new EvolutionTestRow("eds", "size_evolution", -0.9, -0.9, -0.8992, 1e-301, EvolutionNeed.Needed, Plausibility.NotJudged, null)
        { AtBound = "lower" };
        string s = EvolutionTestTable.Statement(row);
        Assert.Contains("at its lower bound (one-sided 68% interval", s, StringComparison.Ordinal);
        Assert.DoesNotContain("±", s, StringComparison.Ordinal);
        Assert.DoesNotContain("+0", s, StringComparison.Ordinal);
        Assert.DoesNotContain(")(68% interval)", s.Replace(" ", "", StringComparison.Ordinal), StringComparison.Ordinal);
        var interior = row with { AtBound = null, Lo = -0.95, Hi = -0.85 };
        Assert.Contains("± 0.05 (68% interval)", EvolutionTestTable.Statement(interior), StringComparison.Ordinal);
    }

    [Fact]
    public void CallOutsNameModelsWithImplausibleEvolution()
    {
        var rows = EvolutionTestTable.From(DemoLike());
        // Shipped table: b expected > 0 (passive brightening, Lubin & Sandage 2001); a within [−1.5, −0.7] from the study.
        Assert.Equal(Plausibility.Plausible, rows.Single(x => x.Model == "lcdm" && x.Parameter == "size_evolution").Plausibility);
        Assert.Equal(Plausibility.Plausible, rows.Single(x => x.Model == "lcdm" && x.Parameter == "sb_evolution").Plausibility);
        Assert.Equal(Plausibility.WrongSign, rows.Single(x => x.Model == "tired-light" && x.Parameter == "sb_evolution").Plausibility);
        Assert.Equal(Plausibility.WrongSign, rows.Single(x => x.Model == "static-linear" && x.Parameter == "size_evolution").Plausibility);
        Assert.Equal(Plausibility.Outside, rows.Single(x => x.Model == "tired-light" && x.Parameter == "size_evolution").Plausibility);
        var calls = DecisionSummary.Implausible(rows);
        Assert.Contains(calls, c => c.StartsWith("tired light's required evolution is not plausible", StringComparison.Ordinal) && c.Contains("b = −1.959 ± 0.023 has the wrong sign (galaxies fading into the past"));
        Assert.Contains(calls, c => c.StartsWith("static linear's required evolution is not plausible", StringComparison.Ordinal) && c.Contains("a = 0.490 ± 0.034 has the wrong sign"));
        Assert.DoesNotContain(calls, c => c.StartsWith("ΛCDM", StringComparison.Ordinal));
    }

    [Fact]
    public void TheShippedExpectationTableCarriesSourcesAndAStudyCanOverrideIt()
    {
        var shipped = EvolutionExpectation.Shipped;
        var a = shipped.Single(e => e.Parameter == "size_evolution");
        // van der Wel et al. 2014 (ApJ 788, 28): −1.48 early, −0.75 late types → [−1.5, −0.7].
        Assert.Equal((-1.5, -0.7, -1), (a.Lo, a.Hi, a.ExpectedSign));
        Assert.Contains("van der Wel", a.Source);
        var b = shipped.Single(e => e.Parameter == "sb_evolution");
        // Lubin & Sandage 2001 (AJ 122, 1084): 4 − n = 0.45 … 1.72.
        Assert.Equal((0.45, 1.72, 1), (b.Lo, b.Hi, b.ExpectedSign));
        Assert.Contains("Lubin & Sandage 2001", b.Source);
        var forced = EvolutionExpectation.InForce([new ExpectedRange("sb_evolution", -3, -2)]).Single(e => e.Parameter == "sb_evolution");
        Assert.Equal((-3.0, -2.0), (forced.Lo, forced.Hi));
        Assert.Contains("[expected]", forced.Source);
    }
}
