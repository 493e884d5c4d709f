namespace SizeTest.Distributed;

/// <summary>
/// The reducer over MPI_COMM_WORLD of the system MPI library. Created by <see cref="RankContext.Start()"/>;
/// disposing it calls MPI_Finalize (if this reducer initialised MPI).
/// </summary>
public sealed class MpiReducer : IRankReducer
{
    private readonly MpiLibrary _mpi;
    private readonly bool _ownsInit;
    private bool _disposed;

    internal MpiReducer(MpiLibrary mpi, bool ownsInit)
    {
        _mpi = mpi;
        _ownsInit = ownsInit;
        Rank = mpi.Rank;
        Size = mpi.Size;
        LibraryVersion = mpi.LibraryVersion();
    }

    /// <inheritdoc />
    public int Rank { get; }

    /// <inheritdoc />
    public int Size { get; }

    /// <inheritdoc />
    public bool IsRoot => Rank == 0;

    /// <summary>First line of MPI_Get_library_version.</summary>
    public string LibraryVersion { get; }

    /// <summary>"Open MPI" or "MPICH".</summary>
    public string Flavour => _mpi.Flavour;

    /// <inheritdoc />
    public string Description => $"MPI ({LibraryVersion}), {Size} rank{(Size == 1 ? "" : "s")}";

    /// <inheritdoc />
    public void Broadcast(Span<double> values, int root = 0)
    {
        ObjectDisposedException.ThrowIf(_disposed, this);
        if ((uint)root >= (uint)Size) throw new ArgumentOutOfRangeException(nameof(root));
        if (values.Length > 0) _mpi.Broadcast(values, root);
    }

    /// <inheritdoc />
    public void SumAll(ReadOnlySpan<double> local, Span<double> total)
    {
        ObjectDisposedException.ThrowIf(_disposed, this);
        if (total.Length != local.Length) throw new ArgumentException("total must have the length of local.", nameof(total));
        if (local.Length > 0) _mpi.AllreduceSum(local, total);
    }

    /// <inheritdoc />
    public void Barrier()
    {
        ObjectDisposedException.ThrowIf(_disposed, this);
        _mpi.Barrier();
    }

    /// <inheritdoc />
    public void Abort(int exitCode) => _mpi.Abort(exitCode);

    /// <summary>Calls MPI_Finalize once (only if this reducer initialised MPI).</summary>
    public void Dispose()
    {
        if (_disposed) return;
        _disposed = true;
        if (_ownsInit && !_mpi.IsFinalized) _mpi.FinalizeMpi();
    }
}
