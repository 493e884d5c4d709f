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
    /// Fills <paramref name="z"/> and <paramref name="logWeight"/> for an object whose normal N(z; z_obs, σ²) the prior [lo, hi] cuts but
    /// does not exclude (z_obs inside or near the prior): m-point Gauss–Legendre in the normal's cumulative probability,
    /// ∫_lo^hi f(z) N(z; z_obs, σ²) dz / ∫_lo^hi N dz = ∫_{Φ(α)}^{Φ(β)} f(z_obs + σ Φ⁻¹(u)) du / (Φ(β) − Φ(α)), α = (lo − z_obs)/σ,
    /// β = (hi − z_obs)/σ (the inverse-CDF substitution u = Φ((z − z_obs)/σ); common practice). Nodes z_k = z_obs + σ Φ⁻¹(u_k),
    /// u_k = (Φ(α) + Φ(β))/2 + (Φ(β) − Φ(α))/2 x_k, weights w_k/2 (they sum to 1). The Gaussian is carried by the measure du, so a few
    /// nodes suffice even where the cut removes most of it (3 nodes: a = −0.9665 against −0.9766 with 7 on the cost harness's mock;
    /// the window rule of <see cref="Fill"/> gave −0.913). Where both ends lie above z_obs the reflected form z_obs − σ Φ⁻¹(v),
    /// v ∈ [Φ(−β), Φ(−α)], keeps the tail probabilities exact. Returns false (nothing written) when the kept probability underflows
    /// (Φ(β) − Φ(α) &lt; 10⁻³⁰⁰): the caller then uses <see cref="Fill"/>.
    /// </summary>
    public static bool FillQuantile(double zObs, double sigma, double lo, double hi, GaussLegendre rule, Span<double> z, Span<double> logWeight)
    {
        if (!(sigma > 0) || !(hi > lo)) throw new ArgumentException($"truncated redshift nodes need σ > 0 and lo < hi (σ = {sigma}, [{lo}, {hi}])");
        double a = (lo - zObs) / sigma, b = (hi - zObs) / sigma;
        bool reflect = a > 0;
        double pa = reflect ? NormalMath.Phi(-b) : NormalMath.Phi(a), pb = reflect ? NormalMath.Phi(-a) : NormalMath.Phi(b);
        if (!(pb - pa > 1e-300)) return false;
        double mid = 0.5 * (pa + pb), half = 0.5 * (pb - pa);
        for (int k = 0; k < rule.Nodes.Length; k++)
        {
            double t = -Math.Sqrt(2) * MathNet.Numerics.SpecialFunctions.ErfcInv(2 * (mid + half * rule.Nodes[k]));
            z[k] = Math.Clamp(reflect ? zObs - sigma * t : zObs + sigma * t, lo, hi);
            logWeight[k] = Math.Log(0.5 * rule.Weights[k]);
        }
        return true;
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
