using System.Collections.Concurrent;

namespace SizeTest.Inference.Likelihood;

/// <summary>
/// The <see cref="SizeSliceGram"/>s of one bound row set, one per row slice [start, end), built at first use and shared
/// by the likelihoods that hold parameters fixed on the same rows and grid (profile refits). Thread-safe.
/// </summary>
/// <remarks>The key packs (start, end) into one long. Its hash mixes both halves: the default long hash XORs them, and
/// for consecutive chunks start ⊕ end takes only ~log₂(chunks) distinct values, so 1000 chunks shared a handful of
/// buckets (a lookup cost ~175 ns instead of ~10 ns in the 10⁶-object fit; measured, docs/benchmarks.md).</remarks>
internal sealed class SliceGramCache
{
    private readonly ConcurrentDictionary<long, SizeSliceGram> _grams = new(SliceKeyComparer.Instance);

    /// <summary>The Gram of rows [start, end), built by <paramref name="build"/> (from <paramref name="state"/>) when absent.</summary>
    public SizeSliceGram GetOrAdd<TState>(int start, int end, Func<int, int, TState, SizeSliceGram> build, TState state)
    {
        long key = ((long)start << 32) | (uint)end;
        if (_grams.TryGetValue(key, out var gram)) return gram;
        return _grams.GetOrAdd(key, static (k, s) => s.Build((int)(k >> 32), (int)(uint)k, s.State), (Build: build, State: state));
    }

    /// <summary>Number of slices built so far.</summary>
    public int Count => _grams.Count;

    private sealed class SliceKeyComparer : IEqualityComparer<long>
    {
        public static readonly SliceKeyComparer Instance = new();
        public bool Equals(long x, long y) => x == y;
        // Fibonacci hashing (Knuth, TAOCP vol. 3, §6.4): multiply by 2⁶⁴/φ and keep the high bits.
        public int GetHashCode(long key) => (int)(((ulong)key * 0x9E3779B97F4A7C15UL) >> 32);
    }
}
