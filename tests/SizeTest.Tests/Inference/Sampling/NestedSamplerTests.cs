using MathNet.Numerics;
using SizeTest.Foundation.Errors;
using SizeTest.Inference;
using SizeTest.Inference.Sampling;
using Xunit;

namespace SizeTest.Tests.Inference.Sampling;

/// <summary>
/// ln L(μ) = Σ_k Σ_i ln N(y_ki | μ_k, σ_k²) for seeded synthetic data y_ki; per parameter
/// L = L_max exp(−(μ − ȳ)²/(2 σ_μ²)), σ_μ = σ/√n (common practice).
/// </summary>
internal sealed class GaussianDataLikelihood : ILogDensity
{
    private readonly double[][] _data;
    private readonly double[] _sigma;

    public GaussianDataLikelihood(double[] trueMeans, double[] sigma, int n, int seed)
    {
        var rng = new Random(seed);
        _sigma = sigma;
        _data = trueMeans.Select((m, k) => Enumerable.Range(0, n).Select(_ => m + sigma[k] * SyntheticChains.Normal(rng)).ToArray()).ToArray();
    }

    public int Dimension => _data.Length;
    public double Mean(int k) => _data[k].Average();
    public double SigmaMu(int k) => _sigma[k] / Math.Sqrt(_data[k].Length);

    public double LogDensity(ReadOnlySpan<double> theta)
    {
        double s = 0;
        for (int k = 0; k < _data.Length; k++)
            foreach (var y in _data[k])
            {
                double r = (y - theta[k]) / _sigma[k];
                s += -0.5 * r * r - Math.Log(_sigma[k]) - 0.5 * Math.Log(2 * Math.PI);
            }
        return s;
    }

    public double LogLikelihoodMax()
    {
        var best = Enumerable.Range(0, Dimension).Select(Mean).ToArray();
        return LogDensity(best);
    }

    /// <summary>
    /// Exact ln Z under independent uniform priors U[a_k, b_k]:
    /// Z_k = (1/(b−a)) ∫_a^b L dμ = L_max,k σ_μ √(2π)/(b−a) · ½[erf((b−ȳ)/(√2σ_μ)) − erf((a−ȳ)/(√2σ_μ))]
    /// (Sivia &amp; Skilling 2006 ch. 4; docs/science.md §1.7), and ln Z = ln L_max + Σ_k ln(Z_k/L_max,k).
    /// </summary>
    public double AnalyticLogEvidence(IReadOnlyList<UniformPrior> priors)
    {
        double lnZ = LogLikelihoodMax();
        for (int k = 0; k < Dimension; k++)
        {
            double a = priors[k].Lower, b = priors[k].Upper, m = Mean(k), s = SigmaMu(k);
            double erfTerm = 0.5 * (SpecialFunctions.Erf((b - m) / (Math.Sqrt(2) * s)) - SpecialFunctions.Erf((a - m) / (Math.Sqrt(2) * s)));
            lnZ += Math.Log(s * Math.Sqrt(2 * Math.PI) / (b - a)) + Math.Log(erfTerm);
        }
        return lnZ;
    }
}

public sealed class NestedSamplerTests
{
    [Fact]
    public void OneDimensionalEvidenceMatchesErfFormula()
    {
        var like = new GaussianDataLikelihood([0.7], [1.0], n: 4, seed: 1);          // σ_μ = 0.5
        UniformPrior[] priors = [new(-5, 5)];
        var result = new NestedSampler(like, priors, new NestedSamplerOptions { LivePoints = 400, Seed = 3 }).Run();
        double exact = like.AnalyticLogEvidence(priors);
        // Within the reported error: |Δ ln Z| < 3σ with σ = √(H/N) (Skilling 2006 §9); a 3σ miss has probability 0.3%.
        Assert.True(Math.Abs(result.LogEvidence - exact) < 3 * result.LogEvidenceError,
            $"lnZ {result.LogEvidence} ± {result.LogEvidenceError}, exact {exact}");
        // H for a Gaussian inside a wide uniform prior: ln((b−a)/(σ_μ √(2πe))) = ln(10/2.066) ≈ 1.58 nats (closed form);
        // the estimate scatters by O(σ_lnZ), so ±0.3.
        Assert.InRange(result.Information, 1.58 - 0.3, 1.58 + 0.3);
        Assert.True(result.Converged, result.ExitReason.Text);
        Assert.Equal(ExitCause.Converged, result.ExitReason.Cause);
        Assert.Equal(1.0, result.WeightedDraws.Sum(w => Math.Exp(w.LogWeight)), 9);
        // Posterior mean ≈ ȳ: standard error σ_μ/√ESS (Kish ESS of the weights), bound 5 SE.
        double se = like.SigmaMu(0) / Math.Sqrt(result.EffectiveSampleSize);
        Assert.InRange(result.PosteriorMean()[0] - like.Mean(0), -5 * se, 5 * se);
        // 16th/84th percentiles ≈ ȳ ∓ σ_μ (Gaussian posterior); the percentile SE is ≈ 1.1σ_μ/√ESS (asymptotic
        // quantile variance p(1−p)/(n f²) at p = 0.16, Gaussian f; common practice), bound 5 SE.
        Assert.InRange(result.Percentile(0, 84) - result.Percentile(0, 16), 2 * like.SigmaMu(0) - 12 * se, 2 * like.SigmaMu(0) + 12 * se);
    }

    [Fact]
    public void EvidenceIsRightWhenThePriorEdgeCutsTheLikelihood()
    {
        // ȳ near the upper edge: the erf term is far from 1 (about 0.8), so this checks the finite-prior formula.
        var like = new GaussianDataLikelihood([4.6], [1.0], n: 4, seed: 2);
        UniformPrior[] priors = [new(-5, 5)];
        double exact = like.AnalyticLogEvidence(priors);
        var result = new NestedSampler(like, priors, new NestedSamplerOptions { LivePoints = 400, Seed = 4 }).Run();
        Assert.True(Math.Abs(result.LogEvidence - exact) < 3 * result.LogEvidenceError,
            $"lnZ {result.LogEvidence} ± {result.LogEvidenceError}, exact {exact}");
    }

    [Fact]
    [Trait("Category", "Slow")]
    public void FiveDimensionalEvidenceMatchesErfFormula()
    {
        var like = new GaussianDataLikelihood([0.3, -1.0, 2.0, 0.0, 1.5], [1.0, 2.0, 0.5, 1.0, 3.0], n: 9, seed: 5);
        UniformPrior[] priors = [new(-4, 4), new(-6, 3), new(-1, 5), new(-2, 2), new(-10, 10)];
        double exact = like.AnalyticLogEvidence(priors);
        var result = new NestedSampler(like, priors, new NestedSamplerOptions { LivePoints = 400, Seed = 6 }).Run();
        Assert.True(Math.Abs(result.LogEvidence - exact) < 3 * result.LogEvidenceError,
            $"lnZ {result.LogEvidence} ± {result.LogEvidenceError}, exact {exact}");
        Assert.True(result.LogEvidenceError is > 0.05 and < 0.3);
    }

    [Fact]
    public void CorrelatedLikelihoodUnderGaussianPriors()
    {
        // L = L_max exp(−½ (μ−m)ᵀ Σ⁻¹ (μ−m)) with Σ = [[0.25, 0.2],[0.2, 0.25]] (correlation 0.8) and independent
        // priors N(0, 2²) truncated to [−20, 20] (truncation removes < 1e-20 of the mass). Then
        // Z = L_max (2π)^{d/2} |Σ|^{1/2} N(m | 0, Σ + P) with P = diag(4, 4) (Gaussian convolution; closed form).
        var m = new[] { 1.0, 0.5 };
        var sigma = new[,] { { 0.25, 0.2 }, { 0.2, 0.25 } };
        double lnLmax = -7.3;
        var gauss = new GaussianDensity(m, sigma);
        var like = new DelegateDensity(2, x => lnLmax + gauss.LogDensity(x) - gauss.LogDensity(m));
        var priors = new GaussianPrior[] { new(0, 2, -20, 20), new(0, 2, -20, 20) };
        var sum = new GaussianDensity([0.0, 0.0], new[,] { { 4.25, 0.2 }, { 0.2, 4.25 } });
        double detSigma = 0.25 * 0.25 - 0.2 * 0.2;
        double exact = lnLmax + Math.Log(2 * Math.PI) + 0.5 * Math.Log(detSigma) + sum.LogDensity(m);
        var result = new NestedSampler(like, priors, new NestedSamplerOptions { LivePoints = 300, Seed = 8 }).Run();
        Assert.True(Math.Abs(result.LogEvidence - exact) < 3 * result.LogEvidenceError,
            $"lnZ {result.LogEvidence} ± {result.LogEvidenceError}, exact {exact}");
    }

    [Fact]
    [Trait("Category", "Slow")]
    public void ReportedErrorCoversTheTruthAcrossSeeds()
    {
        // 20 seeded runs with N = 100: if σ = √(H/N) is honest, |Δ ln Z| < 2σ holds with probability ≈ 0.95 each;
        // P(fewer than 16 of 20) = 0.3% under that probability (binomial), so ≥ 16 is the bound.
        var like = new GaussianDataLikelihood([0.2], [1.0], n: 1, seed: 9);
        UniformPrior[] priors = [new(-10, 10)];
        double exact = like.AnalyticLogEvidence(priors);
        int within = 0;
        for (int seed = 1; seed <= 20; seed++)
        {
            var r = new NestedSampler(like, priors, new NestedSamplerOptions { LivePoints = 100, Seed = seed }).Run();
            if (Math.Abs(r.LogEvidence - exact) < 2 * r.LogEvidenceError) within++;
        }
        Assert.True(within >= 16, $"{within} of 20 within 2σ");
    }

    [Fact]
    public void SameSeedGivesSameResultAndProgressIsReported()
    {
        var like = new GaussianDataLikelihood([0.0, 1.0], [1.0, 1.0], n: 2, seed: 10);
        UniformPrior[] priors = [new(-5, 5), new(-5, 5)];
        var options = new NestedSamplerOptions { LivePoints = 50, Seed = 11 };
        var progress = new ListProgress<NestedProgress>();
        var a = new NestedSampler(like, priors, options).Run(progress);
        var b = new NestedSampler(like, priors, options).Run();
        Assert.Equal(a.LogEvidence, b.LogEvidence);
        Assert.Equal(a.Iterations, b.Iterations);
        Assert.NotEmpty(progress.Reports);
        Assert.Equal(a.Iterations, progress.Reports[^1].Iteration);
        Assert.Equal(a.Iterations + 50, a.WeightedDraws.Count);
        var c = new NestedSampler(like, priors, options with { Seed = 12 }).Run();
        Assert.NotEqual(a.LogEvidence, c.LogEvidence);
        Assert.Equal(1000, a.Resample(1000, seed: 1).Length);
    }

    [Fact]
    public void HandlesZeroLikelihoodRegions()
    {
        // L = exp(−(x−1)²/(2·0.5²)) for x > 0 and 0 (ln L = −∞) for x ≤ 0, prior U[−5, 5]: half the prior has no
        // likelihood. Z = (1/10) σ√(2π) [Φ((5−1)/σ) − Φ((0−1)/σ)] (elementary integral, closed form).
        const double s = 0.5;
        var like = new DelegateDensity(1, x => x[0] > 0 ? -(x[0] - 1) * (x[0] - 1) / (2 * s * s) : double.NegativeInfinity);
        double exact = Math.Log(0.1 * s * Math.Sqrt(2 * Math.PI) *
            (MathNet.Numerics.Distributions.Normal.CDF(0, 1, 4 / s) - MathNet.Numerics.Distributions.Normal.CDF(0, 1, -1 / s)));
        var result = new NestedSampler(like, [new UniformPrior(-5, 5)], new NestedSamplerOptions { LivePoints = 400, Seed = 13 }).Run();
        Assert.True(Math.Abs(result.LogEvidence - exact) < 3 * result.LogEvidenceError,
            $"lnZ {result.LogEvidence} ± {result.LogEvidenceError}, exact {exact}");
        Assert.All(result.WeightedDraws.Where(w => w.Theta[0] <= 0), w => Assert.Equal(double.NegativeInfinity, w.LogWeight));
    }

    [Fact]
    public void IterationLimitGivesNotConverged()
    {
        var like = new GaussianDataLikelihood([0.0], [0.1], n: 10, seed: 12);
        var r = new NestedSampler(like, [new UniformPrior(-5, 5)], new NestedSamplerOptions { LivePoints = 20, MaxIterations = 30 }).Run();
        Assert.False(r.Converged);
        Assert.Contains("iteration limit", r.ExitReason.Text);
        Assert.Equal(ExitCause.SamplerNotConverged, r.ExitReason.Cause);
    }

    [Fact]
    public void RefusesBadSetUps()
    {
        var like = new GaussianDataLikelihood([0.0, 0.0], [1.0, 1.0], n: 2, seed: 1);
        Assert.Throws<ArgumentException>(() => new NestedSampler(like, [new UniformPrior(-1, 1)]));
        Assert.Throws<ArgumentException>(() => new NestedSampler(like, [new UniformPrior(-1, 1), new UniformPrior(-1, 1)], new NestedSamplerOptions { LivePoints = 3 }));
        var nan = new DelegateDensity(1, x => x[0] > 0.5 ? double.NaN : 0.0);
        var ex = Assert.Throws<AnalysisException>(() =>
            new NestedSampler(nan, [new UniformPrior(0, 1)], new NestedSamplerOptions { LivePoints = 50, ParameterNames = ["omega_m"] }).Run());
        Assert.Contains("omega_m = ", ex.Message);
        var nowhere = new ConstantDensity(1, double.NegativeInfinity);
        Assert.Contains("no point with a non-zero likelihood", Assert.Throws<AnalysisException>(() =>
            new NestedSampler(nowhere, [new UniformPrior(0, 1)], new NestedSamplerOptions { LivePoints = 20 }).Run()).Message);
    }

    [Fact]
    public void ConstantLikelihoodGivesItsValueExactly()
    {
        // Z = ∫ L π dθ = L for constant L and a normalised prior (definition), with H = 0 and so σ = 0.
        var flat = new ConstantDensity(2, -1.5);
        var r = new NestedSampler(flat, [new UniformPrior(0, 1), new UniformPrior(-3, 3)], new NestedSamplerOptions { LivePoints = 20 }).Run();
        Assert.Equal(-1.5, r.LogEvidence, 12);
        Assert.Equal(0.0, r.LogEvidenceError, 6);
        Assert.True(r.Converged);
        Assert.Contains("plateau", r.ExitReason.Text);
        Assert.Equal(ExitCause.Converged, r.ExitReason.Cause);
    }
}
