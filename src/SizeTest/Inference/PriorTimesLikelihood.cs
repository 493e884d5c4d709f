namespace SizeTest.Inference;

/// <summary>
/// The log-posterior up to a constant: ln p(θ | data) = Σ_j ln π_j(θ_j) + ln L(θ), with independent priors π_j on the
/// free parameters (Bayes' theorem; the evidence is the omitted constant). The prior is evaluated first: where it is
/// zero the likelihood is not evaluated at all, which also keeps every process of a distributed likelihood out of
/// the collective call for the same θ.
/// </summary>
/// <param name="likelihood">ln L over the free parameters, with its gradient.</param>
/// <param name="priors">One prior per free parameter, in θ order.</param>
public sealed class PriorTimesLikelihood(ILogDensityWithGradient likelihood, IReadOnlyList<ParameterPrior> priors) : ILogDensityWithGradient
{
    private readonly ParameterPrior[] _priors = priors.ToArray();

    /// <inheritdoc />
    public int Dimension => likelihood.Dimension;

    /// <inheritdoc />
    public double LogDensity(ReadOnlySpan<double> theta)
    {
        double lp = LogPrior(theta);
        return double.IsNegativeInfinity(lp) ? lp : lp + likelihood.LogDensity(theta);
    }

    /// <inheritdoc />
    public double LogDensityAndGradient(ReadOnlySpan<double> theta, Span<double> gradient)
    {
        gradient.Clear();
        double lp = LogPrior(theta);
        if (double.IsNegativeInfinity(lp)) return lp;
        double ll = likelihood.LogDensityAndGradient(theta, gradient);
        if (double.IsNegativeInfinity(ll)) return ll;
        for (int j = 0; j < _priors.Length; j++) gradient[j] += _priors[j].LogDensityDerivative(theta[j]);
        return lp + ll;
    }

    private double LogPrior(ReadOnlySpan<double> theta)
    {
        double lp = 0;
        for (int j = 0; j < _priors.Length; j++)
        {
            lp += _priors[j].LogDensity(theta[j]);
            if (double.IsNegativeInfinity(lp)) return lp;
        }
        return lp;
    }
}
