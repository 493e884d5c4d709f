namespace SizeTest.Catalogues;

/// <summary>What a reader found in one cell.</summary>
public enum CellState : byte
{
    /// <summary>A value is present.</summary>
    Value = 0,
    /// <summary>The cell is null: empty text, a null token, FITS TNULLn, VOTable null flag, or IEEE NaN.</summary>
    Null = 1,
    /// <summary>The cell holds something that cannot be read as the requested type; the raw text is kept.</summary>
    Invalid = 2,
}
