namespace SizeTest.Inference.Sampling;

/// <summary>
/// Where an ensemble sampler puts its steps. The sampler calls <see cref="Begin"/> once,
/// <see cref="Append"/> after every step (all walkers), and <see cref="Complete"/> at the end
/// of a successful run. A store that is not completed (exception, cancellation) must leave no
/// partial output behind it that looks finished.
/// </summary>
public interface IChainStore
{
    /// <summary>Starts a run.</summary>
    /// <param name="walkers">Number of walkers.</param>
    /// <param name="dimension">Number of parameters.</param>
    /// <param name="parameterNames">One name per parameter.</param>
    /// <param name="expectedSteps">Steps the run will append (a capacity hint).</param>
    void Begin(int walkers, int dimension, IReadOnlyList<string> parameterNames, int expectedSteps);

    /// <summary>Records step <paramref name="step"/> (0-based).</summary>
    /// <param name="step">Step index.</param>
    /// <param name="positions">Walker-major positions, walker w parameter p at <c>w·dimension + p</c>.</param>
    /// <param name="logProbabilities">Log density of each walker.</param>
    /// <param name="accepted">Whether each walker's proposal was accepted in this step.</param>
    void Append(int step, ReadOnlySpan<double> positions, ReadOnlySpan<double> logProbabilities, ReadOnlySpan<bool> accepted);

    /// <summary>Finishes the run (flushes, makes the output visible).</summary>
    void Complete();
}
