using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues.Fits;

/// <summary>Walks the HDUs of a FITS file (FITS Standard 4.0 §3.3–3.5, §4.4).</summary>
internal static class FitsFile
{
    /// <summary>
    /// Lists every HDU. Throws <see cref="InputException"/> if the file does not start with
    /// <c>SIMPLE  =</c> T, if a header is truncated, or if an HDU's data run past the end of the file.
    /// Bytes after the last HDU that do not start an XTENSION header are ignored (§3.5 special records).
    /// </summary>
    public static List<FitsHdu> Scan(Stream stream, string path)
    {
        long length = stream.Length;
        var hdus = new List<FitsHdu>();
        long pos = 0;
        var probe = new byte[10];
        while (pos < length)
        {
            int index = hdus.Count;
            stream.Position = pos;
            int got = stream.ReadAtLeast(probe, probe.Length, throwOnEndOfStream: false);
            if (index == 0)
            {
                if (got < 10 || !probe.AsSpan().StartsWith("SIMPLE  = "u8))
                    throw new InputException("not a FITS file: it does not start with the SIMPLE card", path);
            }
            else if (got < 10 || !probe.AsSpan().StartsWith("XTENSION= "u8))
            {
                break; // special records or trailing padding after the last HDU
            }
            var header = FitsHeader.Read(stream, pos, path, index);
            if (index == 0 && header["SIMPLE"]?.Value != "T")
                throw new InputException("not a standard FITS file: SIMPLE is not T", path);
            string type = index == 0 ? "PRIMARY" : (header.GetString("XTENSION") ?? "").Trim();
            long bitpix = header.GetInteger("BITPIX", null, path, index);
            if (bitpix is not (8 or 16 or 32 or 64 or -32 or -64))
                throw new InputException($"header {index} has BITPIX = {bitpix}, which FITS does not allow", path);
            long naxis = header.GetInteger("NAXIS", null, path, index);
            if (naxis is < 0 or > 999) throw new InputException($"header {index} has NAXIS = {naxis}", path);
            long pcount = header.GetInteger("PCOUNT", 0, path, index);
            long gcount = header.GetInteger("GCOUNT", 1, path, index);
            if (pcount < 0 || gcount < 0) throw new InputException($"header {index} has a negative PCOUNT or GCOUNT", path);
            bool groups = index == 0 && header["GROUPS"]?.Value == "T";
            long dataBytes;
            try
            {
                checked
                {
                    long product = naxis == 0 ? 0 : 1;
                    for (int k = 1; k <= naxis; k++)
                    {
                        long nk = header.GetInteger($"NAXIS{k}", null, path, index);
                        if (nk < 0) throw new InputException($"header {index} has NAXIS{k} = {nk}", path);
                        if (groups && k == 1) continue; // random groups: NAXIS1 = 0 is not a dimension (§6)
                        product *= nk;
                    }
                    dataBytes = naxis == 0 ? 0 : Math.Abs(bitpix) / 8 * gcount * (pcount + product);
                }
            }
            catch (OverflowException)
            {
                throw new InputException($"header {index} describes more data than a file can hold", path);
            }
            long dataOffset = pos + header.ByteLength;
            if (dataOffset + dataBytes > length)
                throw new InputException(
                    $"the FITS file is truncated: {(index == 0 ? "the primary HDU" : $"HDU {index}")} needs {dataBytes} data bytes from byte {dataOffset}, but the file ends at byte {length}", path);
            hdus.Add(new FitsHdu(index, type, header.GetString("EXTNAME")?.Trim(), header, pos, dataOffset, dataBytes));
            long padded = (dataBytes + FitsHeader.BlockBytes - 1) / FitsHeader.BlockBytes * FitsHeader.BlockBytes;
            pos = dataOffset + padded;
        }
        return hdus;
    }
}
