namespace SizeTest.Distributed;

/// <summary>
/// The processes one computation runs on and the two collective operations a sum-over-objects
/// likelihood needs: broadcast of a parameter vector and the sum of partial results over all ranks.
/// A single process is the case <see cref="Size"/> = 1 (every operation is then a copy or no-op).
/// Every rank must make the same sequence of collective calls.
/// </summary>
public interface IRankReducer : IDisposable
{
    /// <summary>This process's rank, 0 … <see cref="Size"/>−1.</summary>
    int Rank { get; }

    /// <summary>Number of ranks.</summary>
    int Size { get; }

    /// <summary>True on rank 0, the only rank that writes output.</summary>
    bool IsRoot { get; }

    /// <summary>One line for logs and the run manifest, e.g. "MPI (Open MPI v4.1.4), 2 ranks" or "single process".</summary>
    string Description { get; }

    /// <summary>Copies <paramref name="values"/> from rank <paramref name="root"/> to every rank (in place).</summary>
    void Broadcast(Span<double> values, int root = 0);

    /// <summary>Element-wise sum of <paramref name="local"/> over all ranks into <paramref name="total"/> on every rank.</summary>
    void SumAll(ReadOnlySpan<double> local, Span<double> total);

    /// <summary>Waits until every rank has arrived.</summary>
    void Barrier();

    /// <summary>Ends all ranks with <paramref name="exitCode"/> after an unrecoverable error on one of them (so the others do not wait forever).</summary>
    void Abort(int exitCode);
}
