using System.Collections;
using System.Runtime.CompilerServices;

namespace SizeTest.Catalogues;

/// <summary>
/// The source positions of a sample's objects (1-based file line or table row), stored as runs
/// of consecutive numbers so that a large, mostly clean catalogue costs almost nothing
/// (16 bytes per run instead of 8 bytes per object). Reads like a <c>long[]</c>: <c>rows[i]</c>,
/// <see cref="Length"/>; a <c>long[]</c> converts to it implicitly.
/// </summary>
[CollectionBuilder(typeof(RowNumbers), nameof(Create))]
public sealed class RowNumbers : IReadOnlyList<long>
{
    private readonly long[] _runStart;   // first row number of each run
    private readonly int[] _runOffset;   // index of the first object of each run; one extra entry = Length

    private RowNumbers(long[] runStart, int[] runOffset)
    {
        _runStart = runStart;
        _runOffset = runOffset;
    }

    /// <summary>Number of objects.</summary>
    public int Length => _runOffset[^1];

    /// <inheritdoc />
    public int Count => Length;

    /// <summary>Number of runs of consecutive numbers (a measure of the memory used).</summary>
    public int RunCount => _runStart.Length;

    /// <summary>The source position of object <paramref name="index"/>.</summary>
    public long this[int index]
    {
        get
        {
            if ((uint)index >= (uint)Length) throw new ArgumentOutOfRangeException(nameof(index));
            int lo = 0, hi = _runStart.Length - 1;
            while (lo < hi)
            {
                int mid = (lo + hi + 1) >> 1;
                if (_runOffset[mid] <= index) lo = mid; else hi = mid - 1;
            }
            return _runStart[lo] + (index - _runOffset[lo]);
        }
    }

    /// <summary>Builds from explicit numbers (any order).</summary>
    public static RowNumbers FromArray(long[] rows)
    {
        ArgumentNullException.ThrowIfNull(rows);
        var b = new Builder();
        foreach (var r in rows) b.Add(r);
        return b.Build();
    }

    /// <summary>Numbers <paramref name="first"/>, first+1, …, first+count−1.</summary>
    public static RowNumbers Range(long first, int count)
    {
        if (count < 0) throw new ArgumentOutOfRangeException(nameof(count));
        return count == 0 ? new RowNumbers([], [0]) : new RowNumbers([first], [0, count]);
    }

    /// <summary>Builds from a span of numbers (lets a collection expression <c>[1, 2, 3]</c> make a <see cref="RowNumbers"/>).</summary>
    public static RowNumbers Create(ReadOnlySpan<long> rows)
    {
        var b = new Builder();
        foreach (var r in rows) b.Add(r);
        return b.Build();
    }

    /// <summary>Converts an array of row numbers.</summary>
    public static implicit operator RowNumbers(long[] rows) => FromArray(rows);

    /// <summary>All numbers as an array.</summary>
    public long[] ToArray()
    {
        var a = new long[Length];
        for (int r = 0; r < _runStart.Length; r++)
            for (int i = _runOffset[r]; i < _runOffset[r + 1]; i++)
                a[i] = _runStart[r] + (i - _runOffset[r]);
        return a;
    }

    /// <inheritdoc />
    public IEnumerator<long> GetEnumerator()
    {
        for (int r = 0; r < _runStart.Length; r++)
            for (int i = _runOffset[r]; i < _runOffset[r + 1]; i++)
                yield return _runStart[r] + (i - _runOffset[r]);
    }

    IEnumerator IEnumerable.GetEnumerator() => GetEnumerator();

    /// <summary>Collects row numbers one at a time, merging consecutive ones into runs.</summary>
    public sealed class Builder
    {
        private readonly List<long> _starts = new();
        private readonly List<int> _offsets = new();
        private long _next = long.MinValue;
        private int _count;

        /// <summary>Number of rows added.</summary>
        public int Count => _count;

        /// <summary>Appends one row number.</summary>
        public void Add(long row)
        {
            if (_starts.Count == 0 || row != _next)
            {
                _starts.Add(row);
                _offsets.Add(_count);
            }
            _next = row + 1;
            _count++;
        }

        /// <summary>The collected numbers.</summary>
        public RowNumbers Build()
        {
            var offsets = new int[_offsets.Count + 1];
            _offsets.CopyTo(offsets);
            offsets[^1] = _count;
            return new RowNumbers(_starts.ToArray(), offsets);
        }
    }
}
