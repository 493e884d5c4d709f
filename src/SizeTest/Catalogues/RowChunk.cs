namespace SizeTest.Catalogues;

/// <summary>
/// A reusable block of rows that a reader fills: the rows' positions in the file, one
/// <see cref="ColumnBuffer"/> per requested column, and row-level problems (a text line with
/// the wrong number of fields). Reused from chunk to chunk so reading allocates nothing per row.
/// </summary>
public sealed class RowChunk
{
    private readonly Dictionary<int, string> _rowProblems = new();

    /// <summary>Creates a chunk for the given columns.</summary>
    /// <param name="requests">The columns wanted, in the order of <see cref="Columns"/>.</param>
    /// <param name="capacity">Rows per chunk (at least 1).</param>
    public RowChunk(IReadOnlyList<ColumnRequest> requests, int capacity = 8192)
    {
        ArgumentNullException.ThrowIfNull(requests);
        if (capacity < 1) throw new ArgumentOutOfRangeException(nameof(capacity));
        Capacity = capacity;
        Positions = new long[capacity];
        Columns = requests.Select(r => new ColumnBuffer(r, capacity)).ToArray();
        Requests = requests.ToArray();
    }

    /// <summary>Maximum rows per chunk.</summary>
    public int Capacity { get; }

    /// <summary>Rows filled by the last read.</summary>
    public int Count { get; private set; }

    /// <summary>Position of each row: 1-based file line (text) or 1-based table row (FITS, VOTable).</summary>
    public long[] Positions { get; }

    /// <summary>The requested columns, in request order.</summary>
    public ColumnBuffer[] Columns { get; }

    /// <summary>The requests, in order.</summary>
    public IReadOnlyList<ColumnRequest> Requests { get; }

    /// <summary>Empties the chunk before a reader fills it.</summary>
    public void Reset()
    {
        Count = 0;
        _rowProblems.Clear();
        foreach (var c in Columns) c.Clear();
    }

    /// <summary>Starts row number <see cref="Count"/> at <paramref name="position"/> and returns its index.</summary>
    public int BeginRow(long position)
    {
        int i = Count++;
        Positions[i] = position;
        return i;
    }

    /// <summary>Whether the chunk is full.</summary>
    public bool IsFull => Count >= Capacity;

    /// <summary>Records a problem of the whole row (the loader rejects it as unparsable).</summary>
    public void SetRowProblem(int row, string problem) => _rowProblems[row] = problem;

    /// <summary>The row's problem, or null.</summary>
    public string? RowProblem(int row) => _rowProblems.Count != 0 && _rowProblems.TryGetValue(row, out var p) ? p : null;
}
