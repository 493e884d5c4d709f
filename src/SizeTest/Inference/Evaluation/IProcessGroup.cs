namespace SizeTest.Inference.Evaluation;

/// <summary>
/// The processes one fit runs on, as the evaluation backend needs them: who this process is and an element-wise
/// sum over all processes. A single process is the case <see cref="Size"/> = 1 (the sum is a copy); under
/// <c>mpirun</c> the ranks (<c>Distributed/IRankReducer</c> extends this interface). Every process must make the
/// same sequence of calls.
/// </summary>
public interface IProcessGroup
{
    /// <summary>This process's rank, 0 … <see cref="Size"/>−1.</summary>
    int Rank { get; }

    /// <summary>Number of processes.</summary>
    int Size { get; }

    /// <summary>True on rank 0, the only process that writes output.</summary>
    bool IsRoot { get; }

    /// <summary>One line for logs and notes, e.g. "MPI (Open MPI v4.1.4), 2 ranks" or "single process".</summary>
    string Description { get; }

    /// <summary>Element-wise sum of <paramref name="local"/> over all processes into <paramref name="total"/> on every process.</summary>
    void SumAll(ReadOnlySpan<double> local, Span<double> total);
}

/// <summary>One process: <see cref="IProcessGroup.SumAll"/> is a copy.</summary>
public sealed class SingleProcessGroup : IProcessGroup
{
    /// <summary>The instance.</summary>
    public static SingleProcessGroup Instance { get; } = new();

    private SingleProcessGroup() { }

    /// <inheritdoc/>
    public int Rank => 0;

    /// <inheritdoc/>
    public int Size => 1;

    /// <inheritdoc/>
    public bool IsRoot => true;

    /// <inheritdoc/>
    public string Description => "single process";

    /// <inheritdoc/>
    public void SumAll(ReadOnlySpan<double> local, Span<double> total) => local.CopyTo(total);
}
