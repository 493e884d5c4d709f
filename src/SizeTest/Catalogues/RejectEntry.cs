namespace SizeTest.Catalogues;

/// <summary>One rejected row.</summary>
/// <param name="Row">1-based line (text) or row (FITS, VOTable) in the source.</param>
/// <param name="Column">The column at fault (empty when the whole line is malformed).</param>
/// <param name="Value">The offending cell as text (empty for a missing value).</param>
/// <param name="Reason">Why.</param>
/// <param name="Detail">A short explanation (e.g. <c>z must be &gt; 0</c>, <c>7 fields, header has 6</c>).</param>
public sealed record RejectEntry(long Row, string Column, string Value, RejectReason Reason, string Detail);
