using SizeTest.Inference;

namespace SizeTest.Distributed;

/// <summary>
/// A log density that is a sum over objects spread across ranks. Rank 0 drives: every call to
/// <see cref="LogDensity"/> (or <see cref="LogDensities"/>) broadcasts the parameter vector(s), each rank
/// evaluates its local partial sum, and one Allreduce adds them. The other ranks sit in <see cref="Serve"/>
/// until rank 0 calls <see cref="Stop"/>. Optimisers, bootstrap and samplers on rank 0 see an ordinary
/// <see cref="ILogDensity"/>; with a single process it is a plain call.
/// </summary>
/// <remarks>
/// Message per evaluation: one broadcast of [command, count, θ₁…] (2 + dimension doubles; a batch of k
/// vectors adds one broadcast of the remaining (k−1)·dimension), then one Allreduce of k doubles.
/// Calls on rank 0 are serialised by a lock, so the type stays safe to call from several threads.
/// </remarks>
public sealed class DistributedLogDensity : ILogDensity
{
    private const double CommandStop = 0, CommandEvaluate = 1;
    private readonly IRankReducer _ranks;
    private readonly Func<double[], double> _localPartial;
    private readonly object _gate = new();
    private bool _stopped;

    /// <summary>
    /// Wraps <paramref name="localPartial"/>, which returns this rank's partial sum of the log density for a
    /// parameter vector of length <paramref name="dimension"/> (its rows only; the terms that do not depend on
    /// objects, such as a log prior, must be added by exactly one rank, conventionally rank 0).
    /// </summary>
    public DistributedLogDensity(IRankReducer ranks, int dimension, Func<double[], double> localPartial)
    {
        ArgumentNullException.ThrowIfNull(ranks);
        ArgumentNullException.ThrowIfNull(localPartial);
        if (dimension < 1) throw new ArgumentOutOfRangeException(nameof(dimension));
        _ranks = ranks;
        Dimension = dimension;
        _localPartial = localPartial;
    }

    /// <inheritdoc />
    public int Dimension { get; }

    /// <summary>Number of collective evaluations so far (each vector of a batch counts once).</summary>
    public long Evaluations { get; private set; }

    /// <summary>The total over all ranks for <paramref name="theta"/>; call on rank 0 only.</summary>
    public double LogDensity(ReadOnlySpan<double> theta)
    {
        Span<double> one = stackalloc double[1];
        LogDensities(theta, one);
        return one[0];
    }

    /// <summary>
    /// Totals for k = results.Length parameter vectors stored one after another in <paramref name="thetas"/>
    /// (k·Dimension values), with one broadcast and one Allreduce for the whole batch; call on rank 0 only.
    /// </summary>
    public void LogDensities(ReadOnlySpan<double> thetas, Span<double> results)
    {
        if (!_ranks.IsRoot) throw new InvalidOperationException("Only rank 0 drives evaluations; other ranks call Serve().");
        int k = results.Length;
        if (thetas.Length != k * Dimension) throw new ArgumentException($"Expected {k}×{Dimension} parameter values.", nameof(thetas));
        if (k == 0) return;
        lock (_gate)
        {
            if (_stopped) throw new InvalidOperationException("The distributed log density was stopped.");
            var header = new double[2 + Dimension];
            header[0] = CommandEvaluate;
            header[1] = k;
            thetas[..Dimension].CopyTo(header.AsSpan(2));
            _ranks.Broadcast(header);
            var all = thetas.ToArray();
            if (k > 1)
            {
                var rest = all.AsSpan(Dimension);
                _ranks.Broadcast(rest);
            }
            EvaluateAndReduce(all, k, results);
        }
    }

    /// <summary>
    /// Worker loop for ranks other than 0: evaluates every broadcast batch until rank 0 calls <see cref="Stop"/>.
    /// If a local evaluation throws, all ranks are aborted (exit code 1) so that no rank waits forever.
    /// </summary>
    public void Serve()
    {
        if (_ranks.IsRoot) throw new InvalidOperationException("Rank 0 drives evaluations and does not serve.");
        var header = new double[2 + Dimension];
        while (true)
        {
            _ranks.Broadcast(header);
            if (header[0] == CommandStop) return;
            int k = (int)header[1];
            var all = new double[k * Dimension];
            header.AsSpan(2).CopyTo(all);
            if (k > 1) _ranks.Broadcast(all.AsSpan(Dimension));
            var results = new double[k];
            EvaluateAndReduce(all, k, results);
        }
    }

    /// <summary>Rank 0: releases the ranks in <see cref="Serve"/>. Idempotent; further evaluations throw.</summary>
    public void Stop()
    {
        if (!_ranks.IsRoot) return;
        lock (_gate)
        {
            if (_stopped) return;
            _stopped = true;
            var header = new double[2 + Dimension];
            header[0] = CommandStop;
            _ranks.Broadcast(header);
        }
    }

    private void EvaluateAndReduce(double[] all, int k, Span<double> results)
    {
        var local = new double[k];
        try
        {
            var theta = new double[Dimension];
            for (int j = 0; j < k; j++)
            {
                Array.Copy(all, j * Dimension, theta, 0, Dimension);
                local[j] = _localPartial(theta);
            }
        }
        catch (Exception) when (_ranks.Size > 1)
        {
            _ranks.Abort(1);
            throw;
        }
        _ranks.SumAll(local, results);
        Evaluations += k;
    }
}
