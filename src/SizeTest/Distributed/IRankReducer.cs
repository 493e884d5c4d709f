using SizeTest.Inference.Evaluation;

namespace SizeTest.Distributed;

/// <summary>
/// The processes one computation runs on and the two collective operations a sum-over-objects
/// likelihood needs: broadcast of a parameter vector and the sum of partial results over all ranks.
/// A single process is the case <see cref="IProcessGroup.Size"/> = 1 (every operation is then a copy or no-op).
/// Every rank must make the same sequence of collective calls.
/// </summary>
public interface IRankReducer : IProcessGroup, IDisposable
{
    /// <summary>Copies <paramref name="values"/> from rank <paramref name="root"/> to every rank (in place).</summary>
    void Broadcast(Span<double> values, int root = 0);

    /// <summary>Waits until every rank has arrived.</summary>
    void Barrier();

    /// <summary>Ends all ranks with <paramref name="exitCode"/> after an unrecoverable error on one of them (so the others do not wait forever).</summary>
    void Abort(int exitCode);
}
