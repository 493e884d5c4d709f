namespace SizeTest.Catalogues;

/// <summary>
/// Collects one accepted column. With a row-count bound it allocates once and, only if rows
/// were rejected, trims at the end; without one it grows by doubling. The array handed out
/// has exactly <see cref="Count"/> entries.
/// </summary>
internal sealed class ColumnBuilder<T>
{
    private T[] _items;
    private int _count;

    public ColumnBuilder(long? capacityHint)
    {
        long cap = capacityHint is long h && h >= 0 ? Math.Min(h, Array.MaxLength) : 1024;
        _items = new T[cap];
    }

    public int Count => _count;

    public void Add(T value)
    {
        if (_count == _items.Length)
        {
            long next = Math.Min(Math.Max(1024L, (long)_items.Length * 2), Array.MaxLength);
            if (next <= _count) throw new InvalidOperationException("too many rows for one sample");
            Array.Resize(ref _items, (int)next);
        }
        _items[_count++] = value;
    }

    /// <summary>The values, exactly <see cref="Count"/> long (the builder must not be used afterwards).</summary>
    public T[] Build()
    {
        if (_items.Length != _count) Array.Resize(ref _items, _count);
        var r = _items;
        _items = [];
        return r;
    }
}
