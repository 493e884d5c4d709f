using SizeTest.Foundation.Randomness;
namespace SizeTest.Inference.Sampling;

/// <summary>The outcome of a nested-sampling run (Skilling 2004; 2006, Bayesian Analysis 1, 833).</summary>
public sealed record EvidenceResult
{
    /// <summary>ln Z, natural log of the evidence ∫ L π dθ.</summary>
    public required double LogEvidence { get; init; }

    /// <summary>1σ uncertainty of ln Z, √(H/N) (Skilling 2006 §9).</summary>
    public required double LogEvidenceError { get; init; }

    /// <summary>Information H = ∫ P ln(P/π) dθ in nats (Kullback–Leibler divergence prior → posterior).</summary>
    public required double Information { get; init; }

    /// <summary>Dead points followed by the final live points, each with its normalised posterior weight.</summary>
    public required IReadOnlyList<WeightedDraw> WeightedDraws { get; init; }

    /// <summary>Iterations (dead points).</summary>
    public required int Iterations { get; init; }

    /// <summary>Live points N.</summary>
    public required int LivePoints { get; init; }

    /// <summary>Likelihood evaluations in total.</summary>
    public required long Evaluations { get; init; }

    /// <summary>Largest ln L found.</summary>
    public required double MaxLogLikelihood { get; init; }

    /// <summary>Seed the run used.</summary>
    public required int Seed { get; init; }

    /// <summary>True when the run stopped on the tolerance (false: iteration limit).</summary>
    public required bool Converged { get; init; }

    /// <summary>Why the run stopped: <see cref="ExitCause.Converged"/> (tolerance met, or one likelihood plateau left) or
    /// <see cref="ExitCause.SamplerNotConverged"/> (iteration limit), with the sentence.</summary>
    public required ExitReason ExitReason { get; init; }

    /// <summary>Wall time.</summary>
    public required TimeSpan Elapsed { get; init; }

    /// <summary>Kish effective sample size of the weighted samples, 1/Σ p_i².</summary>
    public double EffectiveSampleSize
    {
        get
        {
            double s = 0;
            foreach (var w in WeightedDraws) s += Math.Exp(2 * w.LogWeight);
            return s > 0 ? 1.0 / s : 0.0;
        }
    }

    /// <summary>Weighted posterior mean of every parameter.</summary>
    public double[] PosteriorMean()
    {
        int d = WeightedDraws.Count > 0 ? WeightedDraws[0].Theta.Length : 0;
        var mean = new double[d];
        foreach (var w in WeightedDraws)
        {
            double p = Math.Exp(w.LogWeight);
            for (int i = 0; i < d; i++) mean[i] += p * w.Theta[i];
        }
        return mean;
    }

    /// <summary>Weighted percentile (0–100) of parameter <paramref name="parameter"/> (e.g. 16, 50, 84).</summary>
    public double Percentile(int parameter, double percent)
    {
        if (!(percent >= 0 && percent <= 100)) throw new ArgumentOutOfRangeException(nameof(percent));
        var pairs = WeightedDraws.Select(w => (x: w.Theta[parameter], p: Math.Exp(w.LogWeight))).OrderBy(t => t.x).ToArray();
        if (pairs.Length == 0) return double.NaN;
        double target = percent / 100.0, cum = 0;
        foreach (var (x, p) in pairs)
        {
            cum += p;
            if (cum >= target) return x;
        }
        return pairs[^1].x;
    }

    /// <summary>
    /// Draws <paramref name="count"/> equally weighted samples (systematic resampling, seeded)
    /// for plotting or for feeding code that expects an unweighted chain.
    /// </summary>
    public double[][] Resample(int count, int seed)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(count, 1);
        var rng = SeededRandom.Create(seed);
        var result = new double[count][];
        double u = rng.NextDouble() / count, cum = 0;
        int k = 0;
        foreach (var w in WeightedDraws)
        {
            cum += Math.Exp(w.LogWeight);
            while (k < count && u <= cum)
            {
                result[k++] = (double[])w.Theta.Clone();
                u += 1.0 / count;
            }
        }
        while (k < count) result[k++] = (double[])WeightedDraws[^1].Theta.Clone();
        return result;
    }
}
