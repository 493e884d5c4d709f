using SizeTest.Photometry;

namespace SizeTest.Inference.Evaluation;

/// <summary>
/// Where a fit's log-likelihood sums are evaluated: this process's rows of the sample, split into fixed chunks of
/// rows, on one process (threads over chunks) or on every rank of an MPI job (each rank its own rows). Every
/// target of a fit study — the model, a nested model, a bootstrap replicate, a cross-validation fold, a profile
/// point — is bound here (<see cref="Bind"/>) and seen by optimisers and samplers as one <see cref="ILogDensity"/>.
/// </summary>
/// <remarks>
/// <para>Chunks are fixed by the sample, never by the number of processes: chunk k holds the rows with the k-th
/// distinct chunk key (by default rows [1024 k, 1024 (k+1)) of the whole sample in order; a Parquet share keys them by
/// row group). Each process sums its chunks' rows; one element-wise sum over the processes (one Allreduce) gives every
/// process every chunk's partial sum in its own slot (the other processes add exact zeros), and each process adds the
/// chunks in their global order. ln L is therefore bit-identical on every rank and for any number of ranks or threads
/// whose shares are whole chunks, and optimisers, samplers and refits take the same path everywhere.</para>
/// <para>All processes run the same study (SPMD): every evaluation is collective, so all make the same calls in the
/// same order; targets run concurrently (<see cref="ForEach"/>) only in a single process.</para>
/// </remarks>
public sealed class EvaluationBackend
{
    /// <summary>Rows per chunk of the default chunk layout.</summary>
    public const int ChunkRows = 1024;

    /// <summary>Largest number of rows in the data-driven start sample (the first chunk).</summary>
    private readonly int[] _chunkStart;
    private readonly IProcessGroup _group;

    /// <summary>
    /// Lays out this process's rows. Every process of <paramref name="group"/> must call it (two collective sums).
    /// </summary>
    /// <param name="group">The processes.</param>
    /// <param name="local">This process's objects (possibly none), in the sample's order; processes hold consecutive parts
    /// of the sample in rank order.</param>
    /// <param name="rowIds">A rank-independent identity per local object (e.g. the catalogue's file row), which seeds the
    /// bootstrap weights; null: the object's index in the whole sample.</param>
    /// <param name="chunkKeys">Per local object, a non-decreasing key that is the same whatever the number of processes
    /// (objects with one key form one chunk); null: index in the whole sample / <see cref="ChunkRows"/>.</param>
    public EvaluationBackend(IProcessGroup group, Observables local, IReadOnlyList<long>? rowIds = null, IReadOnlyList<long>? chunkKeys = null)
    {
        ArgumentNullException.ThrowIfNull(group);
        ArgumentNullException.ThrowIfNull(local);
        _group = group;
        Local = local;
        int n = local.Count, size = group.Size, rank = group.Rank;
        if (rowIds is not null && rowIds.Count != n) throw new ArgumentException($"{rowIds.Count} row identities for {n} objects", nameof(rowIds));
        if (chunkKeys is not null && chunkKeys.Count != n) throw new ArgumentException($"{chunkKeys.Count} chunk keys for {n} objects", nameof(chunkKeys));

        // Round 1: counts and redshift bounds of every process, each in its own slots.
        var mine = new double[3 * size];
        var all = new double[3 * size];
        mine[3 * rank] = n;
        if (n > 0)
        {
            mine[3 * rank + 1] = local.Z.Min();
            mine[3 * rank + 2] = local.Z.Max();
        }
        group.SumAll(mine, all);
        long before = 0, total = 0;
        double lo = double.PositiveInfinity, hi = double.NegativeInfinity;
        for (int r = 0; r < size; r++)
        {
            long c = (long)all[3 * r];
            if (r < rank) before += c;
            total += c;
            if (c == 0) continue;
            lo = Math.Min(lo, all[3 * r + 1]);
            hi = Math.Max(hi, all[3 * r + 2]);
        }
        if (total == 0) throw new SizeTest.Foundation.Errors.InputException("the sample has no accepted objects to fit");
        if (total > int.MaxValue) throw new SizeTest.Foundation.Errors.InputException($"the sample has {total} objects; at most {int.MaxValue} can be fitted");
        FirstIndex = before;
        TotalObjects = (int)total;
        GridSpan = new RedshiftGridSpan(lo, hi, TotalObjects);
        var ids = new long[n];
        for (int i = 0; i < n; i++) ids[i] = rowIds?[i] ?? before + i;
        RowIds = ids;

        // Local chunks: a new chunk wherever the key changes.
        var starts = new List<int>();
        long previous = long.MinValue;
        for (int i = 0; i < n; i++)
        {
            long key = chunkKeys?[i] ?? (before + i) / ChunkRows;
            if (i > 0 && key < previous) throw new ArgumentException("chunk keys must not decrease", nameof(chunkKeys));
            if (i == 0 || key != previous) starts.Add(i);
            previous = key;
        }
        starts.Add(n);
        _chunkStart = starts.ToArray();

        // Round 2: chunk counts, so every process knows where its chunks sit in the global order.
        var counts = new double[size];
        var allCounts = new double[size];
        counts[rank] = LocalChunks;
        group.SumAll(counts, allCounts);
        int offset = 0, chunks = 0;
        for (int r = 0; r < size; r++)
        {
            if (r < rank) offset += (int)allCounts[r];
            chunks += (int)allCounts[r];
        }
        ChunkOffset = offset;
        TotalChunks = chunks;

        // Round 3: the sum of the weights (each chunk's in its slot, added in global chunk order: the same for any number
        // of processes). Without a weight column every object weighs 1.
        var weights = local.Survey.Weight;
        var slots = new double[TotalChunks];
        for (int c = 0; c < LocalChunks; c++)
        {
            var (s, e) = ChunkRange(c);
            double sum = 0;
            for (int i = s; i < e; i++) sum += weights?[i] ?? 1.0;
            slots[ChunkOffset + c] = sum;
        }
        TotalWeight = SumChunks(slots);
    }

    /// <summary>A backend for one process over the whole sample.</summary>
    public static EvaluationBackend InProcess(Observables observables, IReadOnlyList<long>? rowIds = null, IReadOnlyList<long>? chunkKeys = null) =>
        new(SingleProcessGroup.Instance, observables, rowIds, chunkKeys);

    /// <summary>This process's objects.</summary>
    public Observables Local { get; }

    /// <summary>Rank-independent identities of the local objects (bootstrap seeds).</summary>
    public IReadOnlyList<long> RowIds { get; }

    /// <summary>Index of the first local object in the whole sample.</summary>
    public long FirstIndex { get; }

    /// <summary>Objects in the whole sample (all processes).</summary>
    public int TotalObjects { get; }

    /// <summary>Σ w_i over the whole sample (the weight column; <see cref="TotalObjects"/> without one): the n of BIC and AICc
    /// for a weighted fit (<see cref="Comparison.InformationCriteria"/>).</summary>
    public double TotalWeight { get; }

    /// <summary>The whole sample's redshift range and size, which every D_A grid spans.</summary>
    public RedshiftGridSpan GridSpan { get; }

    /// <summary>Chunks held by this process.</summary>
    public int LocalChunks => _chunkStart.Length - 1;

    /// <summary>Position of this process's first chunk in the global chunk order.</summary>
    public int ChunkOffset { get; }

    /// <summary>Chunks over all processes.</summary>
    public int TotalChunks { get; }

    /// <summary>The processes.</summary>
    public IProcessGroup Group => _group;

    /// <summary>True on the process that writes output and reports progress.</summary>
    public bool IsRoot => _group.IsRoot;

    /// <summary>Whether independent targets (and the walkers of a sampler) may be evaluated concurrently: only in a single
    /// process, where no evaluation is collective.</summary>
    public bool Concurrent => _group.Size == 1;

    /// <summary>One line for notes.</summary>
    public string Description => _group.Size == 1
        ? $"one process ({Environment.ProcessorCount} threads over chunks of rows)"
        : _group.Description;

    /// <summary>Local row range [start, end) of local chunk <paramref name="c"/>.</summary>
    internal (int Start, int End) ChunkRange(int c) => (_chunkStart[c], _chunkStart[c + 1]);

    /// <summary>
    /// Binds <paramref name="hypothesis"/> to the whole sample, or to a re-weighted sample where local object i counts
    /// <paramref name="multiplicity"/>[i] times (0: left out), as one collective log density.
    /// </summary>
    public RowSumLikelihood Bind(Hypothesis hypothesis, int[]? multiplicity = null) => new(this, hypothesis, multiplicity);

    /// <summary>Runs <paramref name="body"/> for 0 … count−1: concurrently in a single process, in order under MPI.</summary>
    public void ForEach(int count, Action<int> body, CancellationToken cancel = default)
    {
        ArgumentNullException.ThrowIfNull(body);
        if (Concurrent)
        {
            try
            {
                Parallel.For(0, count, new ParallelOptions { CancellationToken = cancel }, body);
            }
            catch (AggregateException ex) when (ex.InnerExceptions.Count >= 1)
            {
                System.Runtime.ExceptionServices.ExceptionDispatchInfo.Capture(ex.InnerExceptions[0]).Throw();
            }
            return;
        }
        for (int i = 0; i < count; i++)
        {
            cancel.ThrowIfCancellationRequested();
            body(i);
        }
    }

    /// <summary>
    /// A data-driven starting vector (<see cref="HypothesisLikelihood.SuggestStart"/>) from the first chunk of the whole
    /// sample (at most <see cref="ChunkRows"/> objects; the whole sample when it is that small), the same on every process.
    /// </summary>
    public double[] SuggestStart(Hypothesis hypothesis)
    {
        ArgumentNullException.ThrowIfNull(hypothesis);
        int d = hypothesis.K;
        var mine = new double[d + 1];
        if (ChunkOffset == 0 && LocalChunks > 0)
        {
            var (s, e) = ChunkRange(0);
            var rows = Enumerable.Range(s, e - s).ToArray();
            var first = rows.Length == Local.Count ? Local : ObservablesSubset.Take(Local, rows);
            var start = new HypothesisLikelihood(hypothesis, first, GridSpan) { AllowParallel = false }.SuggestStart();
            start.CopyTo(mine, 0);
            mine[d] = 1;
        }
        if (_group.Size == 1) return mine[..d];
        var all = new double[d + 1];
        _group.SumAll(mine, all);
        return all[..d];
    }

    /// <summary>Adds one chunk-slotted vector over the processes (each process fills only its own chunks' slots, so the
    /// other processes add exact zeros); a single process gets the vector itself.</summary>
    internal double[] SumAll(double[] slots)
    {
        if (_group.Size == 1) return slots;
        var total = new double[slots.Length];
        _group.SumAll(slots, total);
        return total;
    }

    /// <summary>Adds one chunk-slotted vector over the processes and returns the chunks' sum in global order.</summary>
    internal double SumChunks(double[] slots)
    {
        double[] total = slots;
        if (_group.Size > 1)
        {
            total = new double[slots.Length];
            _group.SumAll(slots, total);
        }
        double sum = 0;
        for (int c = 0; c < total.Length; c++) sum += total[c];
        return sum;
    }
}
