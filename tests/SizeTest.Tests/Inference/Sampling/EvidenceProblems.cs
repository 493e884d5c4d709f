using MathNet.Numerics.Distributions;
using MathNet.Numerics.LinearAlgebra;
using SizeTest.Inference;

namespace SizeTest.Tests.Inference.Sampling;

/// <summary>
/// A likelihood with its priors and its exact evidence, for calibrating nested sampling. Shared with
/// the benchmark harness <c>--nested-calibration</c> (linked into tests/SizeTest.Benchmarks).
/// </summary>
/// <param name="Name">Short name (the row of <c>Reference/Inference/evidence_closed_forms.txt</c>).</param>
/// <param name="LogLikelihood">ln L(θ).</param>
/// <param name="Priors">Uniform priors (the box).</param>
/// <param name="ExactLogEvidence">ln Z = ln ∫ L π dθ from the closed form stated in <see cref="EvidenceProblems"/>.</param>
internal sealed record EvidenceProblem(string Name, ILogDensity LogLikelihood, UniformPrior[] Priors, double ExactLogEvidence);

/// <summary>
/// Likelihoods whose evidence under a uniform box prior is known in closed form. Every likelihood here is a
/// normalised probability density p(θ) (∫ p dθ = 1 over ℝ^d), so under the box prior π = 1/V on
/// B = ∏[a_k, b_k], V = ∏(b_k − a_k):
///   Z = ∫_B p(θ) (1/V) dθ = P(θ ∈ B)/V,   ln Z = ln P(θ ∈ B) − Σ_k ln(b_k − a_k).
/// P(θ ∈ B) is a product of Φ differences for independent Gaussians, a sum of such products for a mixture,
/// and 1 to within the truncation mass for the correlated and twisted densities, whose boxes leave ≥ 7σ of
/// margin (the committed scipy script <c>Reference/Inference/evidence_closed_forms.py</c> integrates
/// P(θ ∈ B) numerically and confirms |ln P| &lt; 1e-9 there; its table is checked against these values).
/// </summary>
internal static class EvidenceProblems
{
    /// <summary>All problems of the calibration, in table order.</summary>
    public static IReadOnlyList<EvidenceProblem> All() => [Gauss3, Correlated4, Mixture2, Twisted4];

    /// <summary>
    /// Independent Gaussians, N(0.3, 0.5²)·N(−1, 0.2²)·N(4.2, 0.8²) in [−5,5]×[−4,2]×[−5,5]. The third box edge cuts
    /// the likelihood at +1σ: P = Π_k [Φ((b_k−m_k)/s_k) − Φ((a_k−m_k)/s_k)] (closed form above). H ≈ 5 nats.
    /// </summary>
    public static EvidenceProblem Gauss3 { get; } = Independent("gauss-3d", [0.3, -1.0, 4.2], [0.5, 0.2, 0.8], [(-5, 5), (-4, 2), (-5, 5)]);

    /// <summary>
    /// A 4-D Gaussian with AR(1) correlation ρ^|i−j|, ρ = 0.95 (nearest-neighbour correlation 0.95), σ = (0.1, 0.05, 0.2, 0.1),
    /// mean (0.2, −0.1, 0.5, 0), in [−1,1]×[−1,1]×[−2,3]×[−1,1] (≥ 8σ margins: P = 1 − O(1e-15)). H ≈ 17 nats.
    /// </summary>
    public static EvidenceProblem Correlated4 { get; } = CorrelatedGaussian("correlated-4d", [0.2, -0.1, 0.5, 0.0], [0.1, 0.05, 0.2, 0.1], 0.95,
        [(-1, 1), (-1, 1), (-2, 3), (-1, 1)]);

    /// <summary>
    /// Two separated modes in 2-D: 0.7 N((−2, −2), diag(0.3², 0.3²)) + 0.3 N((3, 2.5), diag(0.15², 0.5²)) in [−5,5]²;
    /// P = Σ_m w_m Π_k ΔΦ_mk (closed form above, each mode ≥ 5σ inside). H ≈ 4.6 nats.
    /// </summary>
    public static EvidenceProblem Mixture2 { get; } = Mixture("mixture-2d", [0.7, 0.3],
        [[-2.0, -2.0], [3.0, 2.5]], [[0.3, 0.3], [0.15, 0.5]], [(-5, 5), (-5, 5)]);

    /// <summary>
    /// A curved ("banana") degeneracy plus a correlated pair, 4-D: θ₀ ~ N(0, 1), θ₁ | θ₀ ~ N(θ₀² − 1, 0.1²) (Haario,
    /// Saksman &amp; Tamminen 1999's twisted Gaussian with b = 1), (θ₂, θ₃) ~ N((0, 0), [[0.04, 0.038], [0.038, 0.04]])
    /// (σ = 0.2, ρ = 0.95). The map (θ₀, θ₁ − θ₀² + 1) has unit Jacobian, so p is normalised; box
    /// [−7,7]×[−3,50]×[−2,2]×[−2,2] (θ₀ beyond ±7σ, hence θ₁ beyond 48: P = 1 − O(1e-11)). H ≈ 11 nats.
    /// </summary>
    public static EvidenceProblem Twisted4 { get; } = Twisted("twisted-4d");

    private static EvidenceProblem Independent(string name, double[] m, double[] s, (double Lo, double Hi)[] box)
    {
        double lnP = 0;
        for (int k = 0; k < m.Length; k++) lnP += Math.Log(Normal.CDF(m[k], s[k], box[k].Hi) - Normal.CDF(m[k], s[k], box[k].Lo));
        var like = new Density(m.Length, x =>
        {
            double v = 0;
            for (int k = 0; k < m.Length; k++) v += Normal.PDFLn(m[k], s[k], x[k]);
            return v;
        });
        return new(name, like, Priors(box), lnP - LogVolume(box));
    }

    private static EvidenceProblem CorrelatedGaussian(string name, double[] mean, double[] sd, double rho, (double Lo, double Hi)[] box)
    {
        int d = mean.Length;
        var cov = new double[d, d];
        for (int i = 0; i < d; i++)
            for (int j = 0; j < d; j++) cov[i, j] = sd[i] * sd[j] * Math.Pow(rho, Math.Abs(i - j));
        var g = new Mvn(mean, cov);
        return new(name, new Density(d, g.LogDensity), Priors(box), -LogVolume(box));
    }

    private static EvidenceProblem Mixture(string name, double[] w, double[][] m, double[][] s, (double Lo, double Hi)[] box)
    {
        int d = box.Length;
        double p = 0;
        for (int c = 0; c < w.Length; c++)
        {
            double pc = w[c];
            for (int k = 0; k < d; k++) pc *= Normal.CDF(m[c][k], s[c][k], box[k].Hi) - Normal.CDF(m[c][k], s[c][k], box[k].Lo);
            p += pc;
        }
        var like = new Density(d, x =>
        {
            double best = double.NegativeInfinity;
            Span<double> terms = stackalloc double[w.Length];
            for (int c = 0; c < w.Length; c++)
            {
                double v = Math.Log(w[c]);
                for (int k = 0; k < d; k++) v += Normal.PDFLn(m[c][k], s[c][k], x[k]);
                terms[c] = v;
                best = Math.Max(best, v);
            }
            double sum = 0;
            foreach (double t in terms) sum += Math.Exp(t - best);
            return best + Math.Log(sum);
        });
        return new(name, like, Priors(box), Math.Log(p) - LogVolume(box));
    }

    private static EvidenceProblem Twisted(string name)
    {
        (double, double)[] box = [(-7, 7), (-3, 50), (-2, 2), (-2, 2)];
        var pair = new Mvn([0.0, 0.0], new[,] { { 0.04, 0.038 }, { 0.038, 0.04 } });
        var like = new Density(4, x =>
            Normal.PDFLn(0, 1, x[0]) + Normal.PDFLn(x[0] * x[0] - 1, 0.1, x[1]) + pair.LogDensity(x[2..]));
        return new(name, like, Priors(box), -LogVolume(box));
    }

    private static UniformPrior[] Priors((double Lo, double Hi)[] box) => [.. box.Select(b => new UniformPrior(b.Lo, b.Hi))];

    private static double LogVolume((double Lo, double Hi)[] box) => box.Sum(b => Math.Log(b.Hi - b.Lo));

    /// <summary>Normalised multivariate normal log density ln N(x; μ, Σ).</summary>
    private sealed class Mvn(double[] mean, double[,] covariance)
    {
        private readonly double[,] _precision = Matrix<double>.Build.DenseOfArray(covariance).Inverse().ToArray();
        private readonly double _logNorm = -0.5 * (mean.Length * Math.Log(2 * Math.PI) + Math.Log(Matrix<double>.Build.DenseOfArray(covariance).Determinant()));

        public double LogDensity(ReadOnlySpan<double> x)
        {
            int d = mean.Length;
            double q = 0;
            for (int i = 0; i < d; i++)
                for (int j = 0; j < d; j++) q += (x[i] - mean[i]) * _precision[i, j] * (x[j] - mean[j]);
            return _logNorm - 0.5 * q;
        }
    }

    private delegate double SpanFunction(ReadOnlySpan<double> x);

    private sealed class Density(int dimension, SpanFunction f) : ILogDensity
    {
        public int Dimension => dimension;
        public double LogDensity(ReadOnlySpan<double> theta) => f(theta);
    }
}
