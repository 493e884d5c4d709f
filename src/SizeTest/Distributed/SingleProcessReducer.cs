namespace SizeTest.Distributed;

/// <summary>The one-rank reducer: broadcast is a no-op and the sum over ranks is a copy.</summary>
public sealed class SingleProcessReducer : IRankReducer
{
    /// <summary>Shared instance.</summary>
    public static SingleProcessReducer Instance { get; } = new();

    /// <inheritdoc />
    public int Rank => 0;

    /// <inheritdoc />
    public int Size => 1;

    /// <inheritdoc />
    public bool IsRoot => true;

    /// <inheritdoc />
    public string Description => "single process";

    /// <inheritdoc />
    public void Broadcast(Span<double> values, int root = 0)
    {
        if (root != 0) throw new ArgumentOutOfRangeException(nameof(root), root, "A single process has only rank 0.");
    }

    /// <inheritdoc />
    public void SumAll(ReadOnlySpan<double> local, Span<double> total)
    {
        if (total.Length != local.Length) throw new ArgumentException("total must have the length of local.", nameof(total));
        local.CopyTo(total);
    }

    /// <inheritdoc />
    public void Barrier() { }

    /// <inheritdoc />
    public void Abort(int exitCode) => Environment.Exit(exitCode);

    /// <inheritdoc />
    public void Dispose() { }
}
