namespace SizeTest.Catalogues.Fits;

/// <summary>One header-data unit found in a FITS file.</summary>
/// <param name="Index">0 = primary, 1 = first extension, …</param>
/// <param name="Type"><c>PRIMARY</c> or the XTENSION value (<c>BINTABLE</c>, <c>IMAGE</c>, <c>TABLE</c>, …).</param>
/// <param name="ExtName">EXTNAME, or null.</param>
/// <param name="Header">The parsed header.</param>
/// <param name="HeaderOffset">Byte offset of the header.</param>
/// <param name="DataOffset">Byte offset of the data.</param>
/// <param name="DataBytes">Bytes of data, without padding (§4.4.1.1: |BITPIX|/8 × GCOUNT × (PCOUNT + NAXIS1 × … × NAXISm)).</param>
internal sealed record FitsHdu(int Index, string Type, string? ExtName, FitsHeader Header, long HeaderOffset, long DataOffset, long DataBytes)
{
    /// <summary>Text for reports: <c>HDU 1 BINTABLE 'GALAXIES'</c>.</summary>
    public string Describe() => $"HDU {Index} {Type}{(ExtName is null ? "" : $" '{ExtName}'")}";
}
