using SizeTest.Inference.Sampling;
using Xunit;

namespace SizeTest.Tests.Inference.Sampling;

public sealed class RankNormalizedDiagnosticsTests
{
    [Fact]
    public void ClassicRhatMatchesHandComputation()
    {
        // Chains {1,2,3} and {2,3,4}: means 2 and 3, grand mean 2.5; B = n/(m−1) Σ(mean−grand)² = 3·0.5 = 1.5;
        // W = mean of unbiased variances = 1; var⁺ = (n−1)/n W + B/n = 2/3 + 1/2 = 7/6; R̂ = √(7/6)
        // (Gelman & Rubin 1992; Vehtari et al. 2021 eqs. 3–4; hand computed).
        double rhat = RankNormalizedDiagnostics.ClassicRhat([[1.0, 2.0, 3.0], [2.0, 3.0, 4.0]]);
        Assert.Equal(Math.Sqrt(7.0 / 6.0), rhat, 14);
    }

    [Fact]
    public void WellMixedChainsHaveRhatNearOne()
    {
        // Independent draws from one distribution: R̂ − 1 is O(1/n) (Vehtari et al. 2021 §4); with 8 chains of
        // 2000 it lies far below the 1.01 threshold of that paper.
        var iid = SyntheticChains.Ar1(8, 2000, 0.0, seed: 21);
        Assert.InRange(RankNormalizedDiagnostics.SplitRhat(iid), 0.99, 1.005);
        // Autocorrelated but stationary and identical in distribution (τ = 3): still ≈ 1.
        var ar = SyntheticChains.Ar1(4, 5000, 0.5, seed: 22);
        Assert.InRange(RankNormalizedDiagnostics.SplitRhat(ar), 0.99, 1.01);
    }

    [Fact]
    public void ShiftedMeansGiveLargeRhat()
    {
        // Four chains, one shifted by 1σ: between-chain variance of the means ≈ 0.25 against W ≈ 1 gives
        // R̂ ≈ √1.25 ≈ 1.1 (Vehtari et al. 2021 §4.1, the case R̂ is designed to detect); > 1.05 required.
        var chains = SyntheticChains.Ar1(4, 2000, 0.0, seed: 31);
        for (int i = 0; i < chains[3].Length; i++) chains[3][i] += 1.0;
        Assert.True(RankNormalizedDiagnostics.SplitRhat(chains) > 1.05);
        // A 3σ shift: far beyond any threshold.
        for (int i = 0; i < chains[3].Length; i++) chains[3][i] += 2.0;
        Assert.True(RankNormalizedDiagnostics.SplitRhat(chains) > 1.3);
    }

    [Fact]
    public void DifferentScalesAreCaughtByTheFoldedRhat()
    {
        // Same mean, one chain three times wider: the bulk R̂ barely moves, the folded |θ − median| version
        // does (Vehtari et al. 2021 §4.2). With E|θ| = 0.8σ the folded means differ by 1.6 at unit scale.
        var chains = SyntheticChains.Ar1(4, 2000, 0.0, seed: 41);
        for (int i = 0; i < chains[0].Length; i++) chains[0][i] *= 3.0;
        var split = RankNormalizedDiagnostics.Split(chains)!;
        double bulk = RankNormalizedDiagnostics.ClassicRhat(RankNormalizedDiagnostics.RankNormalize(split));
        double combined = RankNormalizedDiagnostics.SplitRhat(chains);
        Assert.True(combined > 1.05, $"combined {combined}");
        Assert.True(combined > bulk);
    }

    [Fact]
    public void TrendWithinChainsIsCaughtBySplitting()
    {
        // Every chain drifts from −1 to +1: all chains agree with each other, so only the split into
        // halves (Vehtari et al. 2021 §4.1) exposes the non-stationarity. Half means differ by ≈ 1 → R̂ > 1.05.
        var chains = SyntheticChains.Ar1(4, 2000, 0.0, seed: 51);
        foreach (var c in chains) for (int i = 0; i < c.Length; i++) c[i] += -1.0 + 2.0 * i / c.Length;
        Assert.True(RankNormalizedDiagnostics.SplitRhat(chains) > 1.05);
    }

    [Fact]
    public void EssOfIndependentDrawsIsTheirNumber()
    {
        // Independent draws: ESS = M·N (definition). Estimation noise of the Geyer sum is a few per cent;
        // ±15% bound (common practice).
        var iid = SyntheticChains.Ar1(4, 2500, 0.0, seed: 61);
        Assert.InRange(RankNormalizedDiagnostics.BulkEss(iid), 0.85 * 10000, 1.15 * 10000);
        Assert.InRange(RankNormalizedDiagnostics.TailEss(iid), 0.8 * 10000, 1.2 * 10000);
    }

    [Fact]
    public void EssOfAr1ChainsIsNumberOverTau()
    {
        // AR(1), ρ = 0.9: τ = (1+ρ)/(1−ρ) = 19 (closed form), so ESS = M·N/19 = 8·10000/19 ≈ 4211. Rank
        // normalisation is monotone and the marginal is Gaussian, so the bulk ESS targets the same value.
        // Relative SE of τ̂ with a ~5τ window: √(2(2·95+1)/80000) ≈ 7% → ±25% is a 3.5σ bound.
        var ar = SyntheticChains.Ar1(8, 10000, 0.9, seed: 71);
        double expected = 80000.0 / 19.0;
        Assert.InRange(RankNormalizedDiagnostics.BulkEss(ar), 0.75 * expected, 1.25 * expected);
        Assert.InRange(RankNormalizedDiagnostics.Ess(ar), 0.75 * expected, 1.25 * expected);
        // The tail indicators decorrelate at least as fast as the chain but cannot beat independent draws.
        double tail = RankNormalizedDiagnostics.TailEss(ar);
        Assert.InRange(tail, 0.5 * expected, 80000);
    }

    [Fact]
    public void RankNormalizationGivesSymmetricScoresAndAveragesTies()
    {
        var z = RankNormalizedDiagnostics.RankNormalize([[3.0, 1.0, 2.0], [2.0, 5.0, 4.0]]);
        // Ranks among 6 draws: 1→1, 2,2→2.5, 3→4, 4→5, 5→6; z = Φ⁻¹((r − 3/8)/(S + 1/4)) (Vehtari et al. 2021 eq. 14).
        double Score(double r) => MathNet.Numerics.Distributions.Normal.InvCDF(0, 1, (r - 0.375) / 6.25);
        Assert.Equal(Score(4), z[0][0], 12);
        Assert.Equal(Score(1), z[0][1], 12);
        Assert.Equal(Score(2.5), z[0][2], 12);
        Assert.Equal(Score(2.5), z[1][0], 12);
        Assert.Equal(Score(6), z[1][1], 12);
        Assert.Equal(-Score(1), Score(6), 12);    // symmetric: (r − 3/8)/(S + 1/4) maps r and S+1−r to p and 1−p
    }

    [Fact]
    public void TooShortChainsGiveNaNAndANegativeVerdict()
    {
        Assert.True(double.IsNaN(RankNormalizedDiagnostics.SplitRhat([[1.0, 2.0, 3.0], [1.0, 2.0, 3.0]])));
        var d = ChainDiagnostics.Compute([SyntheticChains.Ar1(4, 5, 0.0, seed: 1)], ["x"]);
        Assert.False(d.Verdict.Converged);
        Assert.Contains("at least 8 are needed", d.Verdict.Summary);
    }

    [Fact]
    public void VerdictNamesEveryFailedThreshold()
    {
        // Strongly correlated short chains (τ = 199, 2000 steps ≈ 10 τ) with one walker group shifted.
        var chains = SyntheticChains.Ar1(8, 2000, 0.99, seed: 81);
        for (int w = 0; w < 2; w++) for (int i = 0; i < 2000; i++) chains[w][i] += 3.0;
        var d = ChainDiagnostics.Compute([chains], ["size_evolution"], acceptanceFraction: 0.02);
        Assert.False(d.Verdict.Converged);
        var failed = d.Verdict.Checks.Where(c => !c.Passed).Select(c => c.Name).ToHashSet();
        Assert.Contains("length_in_tau", failed);
        Assert.Contains("rhat", failed);
        Assert.Contains("ess", failed);
        Assert.Contains("acceptance", failed);
        Assert.Contains(d.Verdict.Reasons, r => r.Contains("at least 50 τ is required"));
        Assert.Contains(d.Verdict.Reasons, r => r.Contains("at most 1.01 is required"));
        Assert.Contains(d.Verdict.Reasons, r => r.Contains("at least 400 is required"));
        Assert.All(d.Verdict.Reasons.Take(3), r => Assert.StartsWith("size_evolution: ", r));
    }

    [Fact]
    public void VerdictPassesForLongIndependentChains()
    {
        var chains = SyntheticChains.Ar1(8, 2000, 0.3, seed: 91);
        var d = ChainDiagnostics.Compute([chains], ["x"], acceptanceFraction: 0.4);
        Assert.True(d.Verdict.Converged, d.Verdict.Summary);
        Assert.Equal("converged", d.Verdict.Summary);
    }
}
