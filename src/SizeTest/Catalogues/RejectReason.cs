namespace SizeTest.Catalogues;

/// <summary>Why a catalogue row was rejected.</summary>
public enum RejectReason
{
    /// <summary>A mapped role has no value in this row (empty cell, null token, TNULL, null flag, NaN).</summary>
    MissingValue,
    /// <summary>The cell (or the whole line) cannot be read as the role's type.</summary>
    Unparsable,
    /// <summary>Redshift not greater than zero.</summary>
    NonPositiveRedshift,
    /// <summary>Angular size not greater than zero.</summary>
    NonPositiveSize,
    /// <summary>An error (1σ) below zero.</summary>
    NegativeError,
    /// <summary>A value outside the physically possible or plausible range (θ ≥ π rad, |mag| &gt; 50 such as 99 sentinels, z &gt; the maximum).</summary>
    OutOfRange,
    /// <summary>Surface brightness not brighter than the stated survey limit (μ ≥ sb_limit): outside the selection the fit models.</summary>
    OutsideSbLimit,
    /// <summary>Total magnitude not brighter than the stated limit (m ≥ mag_limit).</summary>
    OutsideMagLimit,
    /// <summary>Angular size not above the stated resolution limit (θ ≤ min_size).</summary>
    OutsideMinSize,
    /// <summary>A redshift taken as exact (z_err = 0) outside the stated photometric-redshift prior: no density under the prior.</summary>
    OutsideRedshiftPrior,
    /// <summary>A numeric cell holds an infinity or NaN written out (<c>inf</c>, <c>Infinity</c>, <c>-inf</c>, <c>nan</c>, <c>NaN</c>), whatever the reader.</summary>
    NonFinite,
}

/// <summary>Text forms of <see cref="RejectReason"/> used in the reject log and reports.</summary>
public static class RejectReasons
{
    /// <summary>The reason code written to the reject log: <c>missing value</c>, <c>unparsable</c>, <c>z &lt;= 0</c>, <c>non-positive size</c>, <c>negative error</c>, <c>out of range</c>, <c>outside selection: sb_limit</c> (also <c>mag_limit</c>, <c>min_size</c>, <c>z_prior</c>), <c>non-finite value</c>.</summary>
    public static string Code(this RejectReason reason) => reason switch
    {
        RejectReason.MissingValue => "missing value",
        RejectReason.Unparsable => "unparsable",
        RejectReason.NonPositiveRedshift => "z <= 0",
        RejectReason.NonPositiveSize => "non-positive size",
        RejectReason.NegativeError => "negative error",
        RejectReason.OutOfRange => "out of range",
        RejectReason.OutsideSbLimit => "outside selection: sb_limit",
        RejectReason.OutsideMagLimit => "outside selection: mag_limit",
        RejectReason.OutsideMinSize => "outside selection: min_size",
        RejectReason.OutsideRedshiftPrior => "outside selection: z_prior",
        RejectReason.NonFinite => "non-finite value",
        _ => reason.ToString(),
    };
}
