namespace SizeTest.Inference.Sampling;

/// <summary>
/// ln p(θ | data) = ln L(θ) + Σ_i ln π_i(θ_i) (unnormalised posterior, normalised priors), −∞
/// outside any prior's bounds without calling the likelihood. Thread-safe when the likelihood is.
/// Use it to hand a posterior to <see cref="EnsembleSampler"/>.
/// </summary>
public sealed class LogPosterior : ILogDensity
{
    private readonly ILogDensity _logLikelihood;
    private readonly ParameterPrior[] _priors;

    /// <summary>Combines <paramref name="logLikelihood"/> with one prior per parameter.</summary>
    /// <exception cref="ArgumentException">When the number of priors differs from the dimension.</exception>
    public LogPosterior(ILogDensity logLikelihood, IReadOnlyList<ParameterPrior> priors)
    {
        ArgumentNullException.ThrowIfNull(logLikelihood);
        ArgumentNullException.ThrowIfNull(priors);
        if (priors.Count != logLikelihood.Dimension)
            throw new ArgumentException($"One prior per parameter is needed: {logLikelihood.Dimension} parameters, {priors.Count} priors.", nameof(priors));
        _logLikelihood = logLikelihood;
        _priors = [.. priors];
    }

    /// <inheritdoc/>
    public int Dimension => _priors.Length;

    /// <summary>Σ_i ln π_i(θ_i).</summary>
    public double LogPrior(ReadOnlySpan<double> theta)
    {
        double s = 0;
        for (int i = 0; i < _priors.Length; i++) s += _priors[i].LogDensity(theta[i]);
        return s;
    }

    /// <inheritdoc/>
    public double LogDensity(ReadOnlySpan<double> theta)
    {
        double lp = LogPrior(theta);
        return double.IsNegativeInfinity(lp) ? lp : _logLikelihood.LogDensity(theta) + lp;
    }
}
