namespace SizeTest.Reporting.Data;

/// <summary>How the catalogue became the sample.</summary>
/// <param name="RowsRead">Data rows read from the catalogue.</param>
/// <param name="Accepted">Rows accepted into the sample.</param>
/// <param name="Rejected">Rows rejected (each has a reason in the reject log).</param>
/// <param name="RejectReasons">Count per reject reason, most frequent first.</param>
public sealed record DataSummary(long RowsRead, long Accepted, long Rejected, IReadOnlyList<RejectReasonCount> RejectReasons)
{
    /// <summary>Size definition in words (e.g. "effective (half-light) radius").</summary>
    public string SizeDefinition { get; init; } = "";

    /// <summary>
    /// The objects are compact radio sources (results.json <c>settings.compact_radio_sources</c>): sizes are the angular sizes of
    /// the compact structure and the model's size is a linear size ℓ = ℓ_m (1+z)^n, reported in pc (ℓ_m is the fit's
    /// <c>r0_kpc</c>; Gurvits, Kellermann &amp; Frey 1999).
    /// </summary>
    public bool CompactRadioSources { get; init; }

    /// <summary>Photometric band(s), or empty.</summary>
    public string Band { get; init; } = "";

    /// <summary>True when rows_read = accepted + rejected, the bookkeeping rule of every load.</summary>
    [System.Text.Json.Serialization.JsonIgnore]
    public bool Balanced => RowsRead == Accepted + Rejected;
}

/// <summary>How many rows were rejected for one reason.</summary>
/// <param name="Reason">Reason in words (e.g. "redshift missing or not positive").</param>
/// <param name="Count">Number of rows.</param>
public sealed record RejectReasonCount(string Reason, long Count);
