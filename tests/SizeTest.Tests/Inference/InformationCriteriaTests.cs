using SizeTest.Inference;
using Xunit;
using SizeTest.Inference.Comparison;

namespace SizeTest.Tests.Inference;

public sealed class InformationCriteriaTests
{
    [Fact]
    public void CriteriaMatchHandComputedValues()
    {
        // ln L = −100, k = 3, n = 50.
        // AIC = 2·3 + 200 = 206 (Akaike 1974).
        Assert.Equal(206.0, InformationCriteria.Aic(-100, 3), 12);
        // AICc = 206 + 2·3·4/(50 − 3 − 1) = 206 + 24/46 = 206.52173913043478 (Hurvich & Tsai 1989).
        Assert.Equal(206.52173913043478, InformationCriteria.Aicc(-100, 3, 50), 12);
        // BIC = 3 ln 50 + 200 = 211.73605993... (Schwarz 1978); ln 50 = 3.912023005428146.
        Assert.Equal(3 * 3.912023005428146 + 200, InformationCriteria.Bic(-100, 3, 50), 10);
        // AICc undefined for n ≤ k + 1.
        Assert.True(double.IsPositiveInfinity(InformationCriteria.Aicc(-1, 3, 4)));
    }

    [Fact]
    public void LikelihoodRatioTestMatchesChiSquaredTable()
    {
        // Λ = 3.841458820694124 is the 95% point of χ²(1) (standard tables), so p = 0.05 and 1.96σ (Wilks 1938).
        var t = LikelihoodRatioTest.Compute("m", "size_evolution", 0, 10 + 3.841458820694124 / 2, 10, 1);
        Assert.Equal(3.841458820694124, t.Statistic, 10);
        Assert.Equal(0.05, t.PValue, 9);
        Assert.Equal(1.959963984540054, t.Sigma, 6);
        // χ²(2) upper 5% point 5.991464547107979 (tables) gives p = 0.05 for 2 dof.
        var t2 = LikelihoodRatioTest.Compute("m", "x", 0, 5.991464547107979 / 2, 0, 2);
        Assert.Equal(0.05, t2.PValue, 9);
        // Far tail stays positive: Λ = 400, 1 dof → p = erfc(√200) ≈ 5.5e-89 (closed form for 1 dof: P(χ²₁ ≥ Λ) = erfc(√(Λ/2))).
        var t3 = LikelihoodRatioTest.Compute("m", "size_evolution", 0, 200, 0, 1);
        double pExact = MathNet.Numerics.SpecialFunctions.Erfc(Math.Sqrt(200));
        Assert.True(Math.Abs(t3.PValue - pExact) < 1e-6 * pExact);
        Assert.True(t3.PValue > 0);
        Assert.StartsWith("m needs size evolution at p = 5.5e-89", t3.Statement);
        Assert.Equal(20.0, t3.Sigma, 1);
    }

    [Fact]
    public void AkaikeWeightsAndDeltasFollowDefinition()
    {
        // Two models, AIC 100 and 104: weights 1/(1+e^−2) and e^−2/(1+e^−2) (Burnham & Anderson 2002 §2.9).
        ModelFitSummary M(string name, double ll, int k) => new()
        {
            Name = name, Parameters = [], LogLikelihood = ll, K = k, N = 100,
            Aic = InformationCriteria.Aic(ll, k), Aicc = InformationCriteria.Aicc(ll, k, 100), Bic = InformationCriteria.Bic(ll, k, 100), Converged = true,
        };
        var ranked = ModelComparison.Rank([M("b", -50, 2), M("a", -47, 3)]);
        Assert.Equal("a", ranked[0].Name); // BIC a = 3 ln100 + 94 = 107.8 < b = 2 ln100 + 100 = 109.2
        Assert.Equal(1 / (1 + Math.Exp(-2)), ranked[0].AkaikeWeight, 12);
        Assert.Equal(4.0, ranked[1].DeltaAic, 12);
        var bf = ModelComparison.BayesFactors(ranked);
        Assert.Single(bf);
        Assert.True(bf[0].BicApproximate);
        // ln B ≈ ΔBIC/2 = (109.2103 − 107.8155)/2 = (100 − 94 − ln 100)/2.
        Assert.Equal((6 - Math.Log(100)) / 2, bf[0].LnB, 10);
        Assert.Equal("not worth more than a bare mention", bf[0].Strength); // 2 ln B = 1.39 < 2 (Kass & Raftery 1995)
    }
}

public sealed class PValueWordingTests
{
    [Theory]
    // Formatting rules (ours): four decimals from 1e-4 up, scientific below, and no "p = 0" when the tail underflows.
    [InlineData(0.05, "p = 0.0500")]
    [InlineData(3.5e-7, "p = 3.5e-7")]
    [InlineData(0.0, "p < 1e-300")]
    public void PValuesAreNeverPrintedAsZero(double p, string expected) =>
        Xunit.Assert.Equal(expected, SizeTest.Inference.Comparison.LikelihoodRatioTest.FormatPValue(p));
}
