using System.Collections.Concurrent;
using System.Runtime.ExceptionServices;

namespace SizeTest.Catalogues;

/// <summary>
/// Reads chunks on a background task while the caller validates the previous one (double
/// buffering over a small ring of <see cref="RowChunk"/>s), so decoding and validation use two
/// cores. Chunks come out in file order; an exception of the reader is rethrown to the caller.
/// Only the background task touches the reader until <see cref="Dispose"/> has returned.
/// </summary>
internal sealed class ChunkPipeline : IDisposable
{
    private readonly BlockingCollection<RowChunk> _free = new();
    private readonly BlockingCollection<RowChunk> _filled = new();
    private readonly CancellationTokenSource _cancel = new();
    private readonly Task _producer;
    private ExceptionDispatchInfo? _failure;

    public ChunkPipeline(ICatalogueReader reader, IReadOnlyList<ColumnRequest> requests, int chunkRows, int depth = 3)
    {
        for (int i = 0; i < depth; i++) _free.Add(new RowChunk(requests, chunkRows));
        _producer = Task.Factory.StartNew(() =>
        {
            try
            {
                while (true)
                {
                    var chunk = _free.Take(_cancel.Token);
                    if (!reader.ReadChunk(chunk)) break;
                    _filled.Add(chunk);
                }
            }
            catch (OperationCanceledException) when (_cancel.IsCancellationRequested)
            {
            }
            catch (Exception ex)
            {
                _failure = ExceptionDispatchInfo.Capture(ex);
            }
            finally
            {
                _filled.CompleteAdding();
            }
        }, CancellationToken.None, TaskCreationOptions.LongRunning, TaskScheduler.Default);
    }

    /// <summary>The filled chunks in order; give each back with <see cref="Return"/> when done with it.</summary>
    public IEnumerable<RowChunk> Chunks()
    {
        foreach (var chunk in _filled.GetConsumingEnumerable())
            yield return chunk;
        _producer.Wait();
        _failure?.Throw();
    }

    /// <summary>Hands a processed chunk back for reuse.</summary>
    public void Return(RowChunk chunk) => _free.Add(chunk);

    public void Dispose()
    {
        _cancel.Cancel();
        try { _producer.Wait(); } catch (AggregateException) { }
        _cancel.Dispose();
        _free.Dispose();
        _filled.Dispose();
    }
}
