namespace SizeTest.Inference.Survey;

/// <summary>
/// Redshift nodes of a photometric-redshift object none of whose Gauss–Hermite nodes lies inside the redshift prior
/// [z_lo, z_hi] (a z_obs outside a stated <c>--z-prior</c>, or a z_err so small or large that the few nodes step over the range).
/// The object's redshift posterior is then the truncated normal N(z; z_obs, σ²) on [z_lo, z_hi], and its integral
/// ∫ p(θ | z) N(z; z_obs, σ²) dz / ∫ N(z; z_obs, σ²) dz over the prior is taken by m-point Gauss–Legendre on the part of the
/// prior where the Gaussian is within <see cref="WindowEFolds"/> e-folds of its largest value there:
/// |z − z_obs| ≤ √(d² + 2·20 σ²), d the distance from z_obs to the prior (0 inside), so nodes z_k = (a+b)/2 + (b−a)/2 x_k with
/// ln weights ln(w_k (b−a)/2) − (z_k − z_obs)²/(2σ²), normalised to sum 1 (a constant of the parameters).
/// The neglected Gaussian mass beyond the window is below e^{−20} ≈ 2·10⁻⁹ of what is kept.
/// </summary>
public static class TruncatedRedshiftNodes
{
    /// <summary>How far the window reaches, in e-folds of the Gaussian below its value at the nearest allowed redshift.</summary>
    public const double WindowEFolds = 20;

    /// <summary>
    /// Fills <paramref name="z"/> and <paramref name="logWeight"/> (length m of <paramref name="rule"/>) for an object at
    /// <paramref name="zObs"/> with error <paramref name="sigma"/> &gt; 0 and the prior [<paramref name="lo"/>, <paramref name="hi"/>], lo &lt; hi.
    /// </summary>
    public static void Fill(double zObs, double sigma, double lo, double hi, GaussLegendre rule, Span<double> z, Span<double> logWeight)
    {
        Window(zObs, sigma, lo, hi, out double mid, out double h);
        double max = double.NegativeInfinity;
        for (int k = 0; k < rule.Nodes.Length; k++)
        {
            z[k] = mid + h * rule.Nodes[k];
            double u = (z[k] - zObs) / sigma;
            logWeight[k] = Math.Log(rule.Weights[k] * h) - 0.5 * u * u;
            max = Math.Max(max, logWeight[k]);
        }
        double sum = 0;
        for (int k = 0; k < rule.Nodes.Length; k++) sum += Math.Exp(logWeight[k] - max);
        double norm = max + Math.Log(sum);
        for (int k = 0; k < rule.Nodes.Length; k++) logWeight[k] -= norm;
    }

    /// <summary>
    /// The window [a, b] of <see cref="Fill"/> as its centre <paramref name="mid"/> = (a + b)/2 and half-width <paramref name="half"/> = (b − a)/2:
    /// node k of a rule on [−1, 1] lies at mid + half·x_k.
    /// </summary>
    public static void Window(double zObs, double sigma, double lo, double hi, out double mid, out double half)
    {
        if (!(sigma > 0) || !(hi > lo)) throw new ArgumentException($"truncated redshift nodes need σ > 0 and lo < hi (σ = {sigma}, [{lo}, {hi}])");
        double d = zObs < lo ? lo - zObs : zObs > hi ? zObs - hi : 0;
        double reach = Math.Sqrt(d * d + 2 * WindowEFolds * sigma * sigma);
        double a = Math.Max(lo, zObs - reach), b = Math.Min(hi, zObs + reach);
        mid = 0.5 * (a + b);
        half = 0.5 * (b - a);
    }
}
