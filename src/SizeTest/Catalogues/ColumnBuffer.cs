namespace SizeTest.Catalogues;

/// <summary>
/// The values of one requested column for the rows of a <see cref="RowChunk"/>: numbers or
/// text, a state per cell, and the raw text of cells that could not be decoded (for the reject log).
/// </summary>
public sealed class ColumnBuffer
{
    private readonly Dictionary<int, string> _invalidText = new();

    internal ColumnBuffer(ColumnRequest request, int capacity)
    {
        Request = request;
        States = new CellState[capacity];
        if (request.AsText) Texts = new string?[capacity];
        else Numbers = new double[capacity];
    }

    /// <summary>What was requested.</summary>
    public ColumnRequest Request { get; }

    /// <summary>Numeric values (when not <see cref="ColumnRequest.AsText"/>); meaningful where the state is <see cref="CellState.Value"/>.</summary>
    public double[]? Numbers { get; }

    /// <summary>Text values (when <see cref="ColumnRequest.AsText"/>).</summary>
    public string?[]? Texts { get; }

    /// <summary>State per row of the chunk.</summary>
    public CellState[] States { get; }

    /// <summary>Stores a number in row <paramref name="row"/>.</summary>
    public void SetNumber(int row, double value)
    {
        Numbers![row] = value;
        States[row] = CellState.Value;
    }

    /// <summary>Stores a text value in row <paramref name="row"/>.</summary>
    public void SetText(int row, string value)
    {
        Texts![row] = value;
        States[row] = CellState.Value;
    }

    /// <summary>Marks row <paramref name="row"/> as null.</summary>
    public void SetNull(int row) => States[row] = CellState.Null;

    /// <summary>Marks row <paramref name="row"/> as undecodable, keeping the raw text.</summary>
    public void SetInvalid(int row, string rawText)
    {
        States[row] = CellState.Invalid;
        _invalidText[row] = rawText;
    }

    /// <summary>The raw text of an invalid cell (empty if none was kept).</summary>
    public string InvalidText(int row) => _invalidText.TryGetValue(row, out var s) ? s : "";

    internal void Clear()
    {
        if (_invalidText.Count != 0) _invalidText.Clear();
    }
}
