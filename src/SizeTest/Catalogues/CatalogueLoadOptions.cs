namespace SizeTest.Catalogues;

/// <summary>Everything <see cref="CatalogueLoader.Load(string, CatalogueLoadOptions?)"/> needs besides the path.</summary>
public sealed record CatalogueLoadOptions
{
    /// <summary>How to open the file (format, table/HDU, delimiter, header, null tokens).</summary>
    public ReaderOptions Reader { get; init; } = new();

    /// <summary>The column mapping (default: detect everything).</summary>
    public ColumnMapping Mapping { get; init; } = ColumnMapping.Detect;

    /// <summary>Redshifts above this are rejected as out of range (default 30: beyond any galaxy or radio source).</summary>
    public double MaxRedshift { get; init; } = 30.0;

    /// <summary>Magnitudes and surface brightnesses with |value| above this are rejected as out of range (default 50, which catches 99/−99/−9999 sentinels).</summary>
    public double MaxAbsMagnitude { get; init; } = 50.0;

    /// <summary>Rows per chunk read from the file (default 8192).</summary>
    public int ChunkRows { get; init; } = 8192;

    /// <summary>Called now and then with the number of rows read so far (for progress lines); may be null.</summary>
    public Action<long>? Progress { get; init; }

    /// <summary>Rows between two <see cref="Progress"/> calls (default 1 000 000); the final count is reported once.</summary>
    public long ProgressInterval { get; init; } = 1_000_000;
}
