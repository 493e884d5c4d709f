namespace SizeTest.Inference.Sampling;

/// <summary>
/// Keeps every step of a run in memory (one contiguous array) and hands back views with
/// burn-in discarded and thinning applied. Every ensemble run keeps one of these.
/// </summary>
public sealed class MemoryChainStore : IChainStore
{
    private double[] _positions = [];
    private double[] _logProbabilities = [];
    private int[] _acceptedCounts = [];
    private string[] _names = [];

    /// <summary>Number of walkers.</summary>
    public int Walkers { get; private set; }

    /// <summary>Number of parameters.</summary>
    public int Dimension { get; private set; }

    /// <summary>Steps stored so far.</summary>
    public int Steps { get; private set; }

    /// <summary>Parameter names.</summary>
    public IReadOnlyList<string> ParameterNames => _names;

    /// <summary>Whether <see cref="Complete"/> was called.</summary>
    public bool IsComplete { get; private set; }

    /// <summary>The most steps this store may grow to (null: unbounded). With it the store never holds more than
    /// CapacityLimit × walkers × (dimension + 1) doubles; appending beyond it throws.</summary>
    public int? CapacityLimit { get; init; }

    /// <summary>Grows the store to hold <paramref name="steps"/> steps in one block (within <see cref="CapacityLimit"/>).</summary>
    public void Reserve(int steps)
    {
        int stride = Walkers * Dimension;
        steps = Math.Min(steps, CapacityLimit ?? int.MaxValue);
        if (stride == 0 || steps * (long)stride <= _positions.Length) return;
        Array.Resize(ref _positions, checked(steps * stride));
        Array.Resize(ref _logProbabilities, checked(steps * Walkers));
    }

    /// <inheritdoc/>
    public void Begin(int walkers, int dimension, IReadOnlyList<string> parameterNames, int expectedSteps)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(walkers, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(dimension, 1);
        if (parameterNames.Count != dimension)
            throw new ArgumentException($"Expected {dimension} parameter names, got {parameterNames.Count}.", nameof(parameterNames));
        Walkers = walkers;
        Dimension = dimension;
        Steps = 0;
        IsComplete = false;
        _names = [.. parameterNames];
        int capacity = Math.Min(Math.Max(expectedSteps, 16), Math.Max(CapacityLimit ?? int.MaxValue, 1));
        _positions = new double[checked(capacity * walkers * dimension)];
        _logProbabilities = new double[capacity * walkers];
        _acceptedCounts = new int[walkers];
    }

    /// <inheritdoc/>
    public void Append(int step, ReadOnlySpan<double> positions, ReadOnlySpan<double> logProbabilities, ReadOnlySpan<bool> accepted)
    {
        if (positions.Length != Walkers * Dimension || logProbabilities.Length != Walkers || accepted.Length != Walkers)
            throw new ArgumentException("The step does not match the walker count and dimension given to Begin.");
        if (step != Steps)
            throw new ArgumentException($"Steps must be appended in order: expected step {Steps}, got {step}.", nameof(step));
        int stride = Walkers * Dimension;
        if ((Steps + 1) * stride > _positions.Length)
        {
            if (CapacityLimit is { } limit && Steps + 1 > limit)
                throw new InvalidOperationException($"the chain store is full: it holds at most {limit} steps");
            int capacity = Math.Min(Math.Max(2 * (Steps + 1), 16), CapacityLimit ?? int.MaxValue);
            Array.Resize(ref _positions, capacity * stride);
            Array.Resize(ref _logProbabilities, capacity * Walkers);
        }
        positions.CopyTo(_positions.AsSpan(Steps * stride, stride));
        logProbabilities.CopyTo(_logProbabilities.AsSpan(Steps * Walkers, Walkers));
        for (int w = 0; w < Walkers; w++)
            if (accepted[w]) _acceptedCounts[w]++;
        Steps++;
    }

    /// <inheritdoc/>
    public void Complete() => IsComplete = true;

    /// <summary>Position of <paramref name="walker"/> at <paramref name="step"/>, parameter <paramref name="parameter"/>.</summary>
    public double this[int step, int walker, int parameter]
    {
        get
        {
            CheckIndex(step, walker, parameter);
            return _positions[(step * Walkers + walker) * Dimension + parameter];
        }
    }

    /// <summary>Log density of <paramref name="walker"/> at <paramref name="step"/>.</summary>
    public double LogProbability(int step, int walker)
    {
        CheckIndex(step, walker, 0);
        return _logProbabilities[step * Walkers + walker];
    }

    /// <summary>Accepted proposals per walker over all stored steps.</summary>
    public IReadOnlyList<int> AcceptedCounts => _acceptedCounts;

    /// <summary>Number of steps kept after discarding <paramref name="discard"/> and thinning by <paramref name="thin"/>.</summary>
    public int KeptSteps(int discard = 0, int thin = 1)
    {
        CheckView(discard, thin);
        return Steps <= discard ? 0 : (Steps - discard + thin - 1) / thin;
    }

    /// <summary>The chain as [step][walker][parameter], burn-in discarded and thinned.</summary>
    public double[][][] GetChain(int discard = 0, int thin = 1)
    {
        int kept = KeptSteps(discard, thin);
        var chain = new double[kept][][];
        for (int s = 0; s < kept; s++)
        {
            int step = discard + s * thin;
            chain[s] = new double[Walkers][];
            for (int w = 0; w < Walkers; w++)
                chain[s][w] = _positions.AsSpan((step * Walkers + w) * Dimension, Dimension).ToArray();
        }
        return chain;
    }

    /// <summary>All kept samples as [sample][parameter], step-major (all walkers of a step, then the next step).</summary>
    public double[][] GetFlatChain(int discard = 0, int thin = 1)
    {
        int kept = KeptSteps(discard, thin);
        var flat = new double[kept * Walkers][];
        for (int s = 0; s < kept; s++)
        {
            int step = discard + s * thin;
            for (int w = 0; w < Walkers; w++)
                flat[s * Walkers + w] = _positions.AsSpan((step * Walkers + w) * Dimension, Dimension).ToArray();
        }
        return flat;
    }

    /// <summary>Log densities of the kept samples, in the order of <see cref="GetFlatChain"/>.</summary>
    public double[] GetFlatLogProbabilities(int discard = 0, int thin = 1)
    {
        int kept = KeptSteps(discard, thin);
        var lp = new double[kept * Walkers];
        for (int s = 0; s < kept; s++)
            _logProbabilities.AsSpan((discard + s * thin) * Walkers, Walkers).CopyTo(lp.AsSpan(s * Walkers, Walkers));
        return lp;
    }

    /// <summary>One parameter's trace per walker, [walker][step] (the layout the diagnostics take).</summary>
    public double[][] GetWalkerSeries(int parameter, int discard = 0, int thin = 1)
    {
        if ((uint)parameter >= (uint)Dimension) throw new ArgumentOutOfRangeException(nameof(parameter));
        int kept = KeptSteps(discard, thin);
        var series = new double[Walkers][];
        for (int w = 0; w < Walkers; w++)
        {
            var x = new double[kept];
            for (int s = 0; s < kept; s++)
                x[s] = _positions[((discard + s * thin) * Walkers + w) * Dimension + parameter];
            series[w] = x;
        }
        return series;
    }

    private void CheckView(int discard, int thin)
    {
        ArgumentOutOfRangeException.ThrowIfNegative(discard);
        ArgumentOutOfRangeException.ThrowIfLessThan(thin, 1);
    }

    private void CheckIndex(int step, int walker, int parameter)
    {
        if ((uint)step >= (uint)Steps) throw new ArgumentOutOfRangeException(nameof(step));
        if ((uint)walker >= (uint)Walkers) throw new ArgumentOutOfRangeException(nameof(walker));
        if ((uint)parameter >= (uint)Dimension) throw new ArgumentOutOfRangeException(nameof(parameter));
    }
}
