namespace SizeTest.Photometry;

/// <summary>How the per-object Galactic extinction A_band (mag, added to the model surface brightness) is obtained.</summary>
public abstract record ExtinctionOption
{
    private protected ExtinctionOption() { }

    /// <summary>No extinction correction.</summary>
    public sealed record None : ExtinctionOption;

    /// <summary>A_band per object from a catalogue column (mag).</summary>
    /// <param name="ColumnName">Name in <see cref="Catalogues.CatalogueRows.ExtraColumns"/>.</param>
    public sealed record Column(string ColumnName) : ExtinctionOption;

    /// <summary>
    /// A_band = R_band · E(B−V): colour excess per object from a column, coefficient R_band =
    /// A_band/E(B−V) per band from a user table whose <see cref="BandTable.Source"/> is recorded
    /// (e.g. Schlafly &amp; Finkbeiner 2011, ApJ 737, 103, Table 6 — the user's choice).
    /// </summary>
    /// <param name="ColourExcessColumn">Column holding E(B−V) in mag.</param>
    /// <param name="Coefficients">R_band per band.</param>
    public sealed record ColourExcess(string ColourExcessColumn, BandTable Coefficients) : ExtinctionOption;
}
