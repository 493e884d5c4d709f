using SizeTest.Foundation.Errors;
using SizeTest.Inference;
using SizeTest.Inference.Sampling;
using Xunit;

namespace SizeTest.Tests.Inference.Sampling;

public sealed class LaplaceEvidenceTests
{
    [Fact]
    public void ExactForGaussianLikelihoodUnderWideUniformPriorWithCallerCovariance()
    {
        // ȳ is ≥ 10 σ_μ from every prior edge, so the erf terms of the exact evidence equal 1 to < 1e-20 and
        // ln Z = ln L_max + (d/2) ln 2π + ½ ln|Σ| − Σ ln(b−a) (Sivia & Skilling 2006 ch. 4; closed form), which is
        // the Laplace formula with the likelihood's covariance Σ = diag(σ_μ²).
        var like = new GaussianDataLikelihood([0.5, -1.0], [1.0, 2.0], n: 16, seed: 1);
        UniformPrior[] priors = [new(-10, 10), new(-20, 20)];
        var mode = new[] { like.Mean(0), like.Mean(1) };
        var cov = new[,] { { like.SigmaMu(0) * like.SigmaMu(0), 0 }, { 0, like.SigmaMu(1) * like.SigmaMu(1) } };
        var result = LaplaceEvidence.Compute(like, priors, mode, cov);
        Assert.Equal(like.AnalyticLogEvidence(priors), result.LogEvidence, 10);
        Assert.Empty(result.Warnings);
    }

    [Fact]
    public void ExactForCorrelatedGaussianWithNumericalHessian()
    {
        // A quadratic log-likelihood: central differences are exact up to rounding, so the Laplace value equals
        // the closed form ln L_max + (d/2) ln 2π + ½ ln|Σ| − Σ ln(b−a) (prior edges > 10σ away) to ~1e-7.
        var sigma = new[,] { { 0.04, 0.018, 0.0 }, { 0.018, 0.09, -0.01 }, { 0.0, -0.01, 0.25 } };
        var mean = new[] { 0.3, 1.2, -0.7 };
        var gauss = new GaussianDensity(mean, sigma);
        double lnLmax = -123.4;
        var like = new DelegateDensity(3, x => lnLmax + gauss.LogDensity(x) - gauss.LogDensity(mean));
        UniformPrior[] priors = [new(-5, 5), new(-5, 5), new(-10, 10)];
        double logDet = Math.Log(MathNet.Numerics.LinearAlgebra.Matrix<double>.Build.DenseOfArray(sigma).Determinant());
        double exact = lnLmax + 1.5 * Math.Log(2 * Math.PI) + 0.5 * logDet - Math.Log(10) - Math.Log(10) - Math.Log(20);
        var result = LaplaceEvidence.Compute(like, priors, mean);
        Assert.Equal(exact, result.LogEvidence, 6);
        for (int i = 0; i < 3; i++)
            for (int j = 0; j < 3; j++)
                Assert.Equal(sigma[i, j], result.Covariance[i, j], 6);
    }

    [Fact]
    public void IncludesGaussianPriorCurvature()
    {
        // L = L_max exp(−(μ−ȳ)²/2s²), prior N(m, p²) (truncation at ±50 negligible): the posterior is Gaussian, so
        // Laplace is exact: Z = L_max s √(2π) N(ȳ | m, s² + p²) (Gaussian convolution; closed form). The mode is
        // the precision-weighted mean (ȳ/s² + m/p²)/(1/s² + 1/p²).
        double s = 0.5, p = 1.0, ybar = 2.0, m = 0.0, lnLmax = -3.0;
        var like = new DelegateDensity(1, x => lnLmax - (x[0] - ybar) * (x[0] - ybar) / (2 * s * s));
        var priors = new[] { new GaussianPrior(m, p, -50, 50) };
        double mode = (ybar / (s * s) + m / (p * p)) / (1 / (s * s) + 1 / (p * p));
        double exact = lnLmax + Math.Log(s * Math.Sqrt(2 * Math.PI)) + MathNet.Numerics.Distributions.Normal.PDFLn(m, Math.Sqrt(s * s + p * p), ybar);
        var result = LaplaceEvidence.Compute(like, priors, [mode]);
        Assert.Equal(exact, result.LogEvidence, 6);
    }

    [Fact]
    public void WarnsWhenTheModeIsNearAPriorBound()
    {
        var like = new DelegateDensity(1, x => -(x[0] - 0.9) * (x[0] - 0.9) / (2 * 0.1 * 0.1));
        var result = LaplaceEvidence.Compute(like, [new UniformPrior(0, 1)], [0.9]);
        Assert.Single(result.Warnings);
        Assert.Contains("overestimates", result.Warnings[0]);
    }

    [Fact]
    public void RefusesAPointThatIsNotAMaximum()
    {
        var bowl = new DelegateDensity(2, x => x[0] * x[0] + x[1] * x[1]);
        UniformPrior[] priors = [new(-5, 5), new(-5, 5)];
        Assert.False(LaplaceEvidence.TryCompute(bowl, priors, [0.0, 0.0], out _, out var failure));
        Assert.Contains("not positive definite", failure);
        Assert.Throws<AnalysisException>(() => LaplaceEvidence.Compute(bowl, priors, [0.0, 0.0]));
        Assert.Throws<AnalysisException>(() => LaplaceEvidence.Compute(-1.0, 0.0, new[,] { { 1.0, 2.0 }, { 2.0, 1.0 } }));
    }

    [Fact]
    public void HessianOfSmoothFunctionMatchesAnalyticDerivatives()
    {
        // f = sin(x) cos(y) + x³/3 at (0.4, 1.1); ∂²f/∂x² = −sin x cos y + 2x, ∂²f/∂y² = −sin x cos y,
        // ∂²f/∂x∂y = −cos x sin y (calculus). Central differences err by O(h²) ~ 1e-5 relative at the chosen steps.
        var f = new DelegateDensity(2, v => Math.Sin(v[0]) * Math.Cos(v[1]) + v[0] * v[0] * v[0] / 3);
        double x = 0.4, y = 1.1;
        Assert.True(LogDensityHessian.TryCompute(f, [x, y], out var h, out _));
        Assert.Equal(-Math.Sin(x) * Math.Cos(y) + 2 * x, h[0, 0], 4);
        Assert.Equal(-Math.Sin(x) * Math.Cos(y), h[1, 1], 4);
        Assert.Equal(-Math.Cos(x) * Math.Sin(y), h[0, 1], 4);
        Assert.Equal(h[0, 1], h[1, 0]);
    }

    [Fact]
    public void HessianShrinksStepsAtASupportEdge()
    {
        // ln density −x²/2 on x > 0 only, evaluated at x = 1e-4: the default step 1e-3 crosses the edge and must shrink.
        var f = new DelegateDensity(1, v => v[0] > 0 ? -0.5 * v[0] * v[0] : double.NegativeInfinity);
        Assert.True(LogDensityHessian.TryCompute(f, [1e-4], out var h, out var failure), failure);
        Assert.Equal(-1.0, h[0, 0], 6);
        var nowhere = new DelegateDensity(1, _ => double.NegativeInfinity);
        Assert.False(LogDensityHessian.TryCompute(nowhere, [0.0], out _, out failure));
        Assert.Contains("not finite", failure);
    }
}
