using System.Buffers.Binary;
using System.Globalization;
using System.Text;
using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues.Fits;

/// <summary>
/// Reads one BINTABLE extension of a FITS file, written from the FITS Standard 4.0 (IAU FITS
/// Working Group 2018), §7.3: big-endian fields of TFORM types L, B, I, J, K, A, E, D (with repeat
/// counts: vectors of up to 64 elements are offered as columns <c>NAME[1]</c>…), TSCALn/TZEROn
/// scaling (value = TZERO + TSCAL × stored), TNULLn and IEEE NaN as null, TTYPEn/TUNITn (and the
/// non-standard TUCDn). Other types (X, C, M, P, Q) are listed as unsupported. Rows stream from
/// the file in blocks; the whole table is checked to be present before the first row is read.
/// </summary>
internal sealed class FitsTableReader : ICatalogueReader
{
    private const int MaxVectorElements = 64;

    private readonly FileStream _stream;
    private readonly string _path;
    private readonly FitsHdu _hdu;
    private readonly List<(FitsField Field, int Element)> _views = new();
    private readonly List<CatalogueColumn> _columns = new();
    private readonly long _rowBytes;
    private readonly long _rows;
    private long _nextRow;
    private byte[] _buffer = [];

    private FitsTableReader(FileStream stream, string path, FitsHdu hdu, List<FitsField> fields, IReadOnlyList<string> notes)
    {
        _stream = stream;
        _path = path;
        _hdu = hdu;
        Notes = notes;
        _rowBytes = hdu.Header.GetInteger("NAXIS1", null, path, hdu.Index);
        _rows = hdu.Header.GetInteger("NAXIS2", null, path, hdu.Index);
        foreach (var f in fields)
        {
            bool numeric = f.Code is 'B' or 'I' or 'J' or 'K' or 'E' or 'D';
            if (f.Code == 'A' && f.Repeat > 0)
            {
                Add(f, 0, f.Name, ColumnKind.Text);
            }
            else if ((numeric || f.Code == 'L') && f.Repeat == 1)
            {
                Add(f, 0, f.Name, KindOf(f));
            }
            else if ((numeric || f.Code == 'L') && f.Repeat is > 1 and <= MaxVectorElements)
            {
                for (int e = 0; e < f.Repeat; e++) Add(f, e, $"{f.Name}[{e + 1}]", KindOf(f));
            }
            else
            {
                _views.Add((f, -1));
                _columns.Add(new CatalogueColumn(f.Name, ColumnKind.Unsupported, f.Unit, f.Ucd, f.Description, f.Form));
            }
        }
    }

    private static ColumnKind KindOf(FitsField f) => f.Code switch
    {
        'L' => ColumnKind.Boolean,
        'E' or 'D' => ColumnKind.Real,
        _ => f.IsScaled ? ColumnKind.Real : ColumnKind.Integer,
    };

    private void Add(FitsField f, int element, string name, ColumnKind kind)
    {
        _views.Add((f, element));
        _columns.Add(new CatalogueColumn(name, kind, f.Unit, f.Ucd, f.Description, f.Form));
    }

    /// <summary>Opens the table chosen by <paramref name="hduSelector"/> (index or EXTNAME; null = first BINTABLE).</summary>
    public static ICatalogueReader Open(string path, string? hduSelector)
    {
        var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1, FileOptions.SequentialScan);
        try
        {
            var hdus = FitsFile.Scan(stream, path);
            var chosen = Choose(hdus, hduSelector, path);
            var notes = new List<string> { "HDUs: " + string.Join("; ", hdus.Select(h => h.Describe() + (h.Type == "BINTABLE" ? $" ({h.Header.GetInteger("NAXIS2", 0, path, h.Index)} rows)" : ""))) };
            var fields = ParseFields(chosen, path, notes);
            return new FitsTableReader(stream, path, chosen, fields, notes);
        }
        catch
        {
            stream.Dispose();
            throw;
        }
    }

    private static FitsHdu Choose(List<FitsHdu> hdus, string? selector, string path)
    {
        var tables = hdus.Where(h => h.Type == "BINTABLE").ToList();
        if (selector is null)
            return tables.FirstOrDefault() ?? throw new InputException(
                $"the FITS file has no binary table (HDUs: {string.Join("; ", hdus.Select(h => h.Describe()))})", path);
        FitsHdu? hit = null;
        if (int.TryParse(selector, NumberStyles.None, CultureInfo.InvariantCulture, out int idx))
            hit = hdus.FirstOrDefault(h => h.Index == idx);
        hit ??= hdus.FirstOrDefault(h => string.Equals(h.ExtName, selector.Trim(), StringComparison.OrdinalIgnoreCase));
        if (hit is null)
            throw new InputException($"there is no HDU '{selector}' (HDUs: {string.Join("; ", hdus.Select(h => h.Describe()))})", path);
        if (hit.Type != "BINTABLE")
            throw SettingProblem.Input($"{hit.Describe()} is not a binary table; choose a BINTABLE with {{hdu}}", path);
        return hit;
    }

    private static List<FitsField> ParseFields(FitsHdu hdu, string path, List<string> notes)
    {
        var h = hdu.Header;
        int i = hdu.Index;
        if (h.GetInteger("BITPIX", null, path, i) != 8 || h.GetInteger("NAXIS", null, path, i) != 2)
            throw new InputException($"HDU {i} is a BINTABLE but does not have BITPIX = 8 and NAXIS = 2", path);
        long rowBytes = h.GetInteger("NAXIS1", null, path, i);
        long tfields = h.GetInteger("TFIELDS", null, path, i);
        if (tfields is < 0 or > 999) throw new InputException($"HDU {i} has TFIELDS = {tfields}; FITS allows 0 to 999", path);
        var fields = new List<FitsField>();
        var names = new UniqueColumnNames();
        long offset = 0;
        for (int n = 1; n <= tfields; n++)
        {
            var form = h.GetString($"TFORM{n}") ?? throw new InputException($"HDU {i} lacks TFORM{n}", path);
            var (repeat, code, width) = FitsField.ParseForm(form, n, path, i);
            var ttype = h[$"TTYPE{n}"];
            var name = string.IsNullOrWhiteSpace(ttype?.Value) ? $"col{n}" : ttype.Value.Trim();
            var unique = names.Take(name, n);
            long? tnull = null;
            if (h[$"TNULL{n}"] is { Value: { } tn } && long.TryParse(tn, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out var tnv)) tnull = tnv;
            if (offset + width > int.MaxValue) throw new InputException($"HDU {i} rows are too wide", path);
            fields.Add(new FitsField
            {
                Number = n,
                Name = unique,
                Code = code,
                Repeat = repeat,
                Width = (int)width,
                Offset = (int)offset,
                Scale = h.GetReal($"TSCAL{n}", 1.0, path, i),
                Zero = h.GetReal($"TZERO{n}", 0.0, path, i),
                Null = tnull,
                Unit = string.IsNullOrWhiteSpace(h.GetString($"TUNIT{n}")) ? null : h.GetString($"TUNIT{n}")!.Trim(),
                Ucd = string.IsNullOrWhiteSpace(h.GetString($"TUCD{n}")) ? null : h.GetString($"TUCD{n}")!.Trim(),
                Description = string.IsNullOrWhiteSpace(h.GetString($"TCOMM{n}")) ? (string.IsNullOrWhiteSpace(ttype?.Comment) ? null : ttype.Comment) : h.GetString($"TCOMM{n}"),
                Form = form.Trim(),
            });
            offset += width;
        }
        if (names.Warning() is { } renamed) notes.Add(renamed);
        if (offset != rowBytes)
            throw new InputException($"HDU {i}: the TFORMn widths add up to {offset} bytes per row but NAXIS1 = {rowBytes}", path);
        long rows = h.GetInteger("NAXIS2", null, path, i);
        if (rows < 0) throw new InputException($"HDU {i} has NAXIS2 = {rows}", path);
        if (rowBytes == 0 && rows > 0)
            throw new InputException($"HDU {i} claims {rows} rows of 0 bytes (NAXIS1 = 0); there is nothing to read", path);
        return fields;
    }

    public CatalogueFormat Format => CatalogueFormat.Fits;
    public string SourceName => _path;
    public string? TableName => _hdu.Describe();
    public IReadOnlyList<string> Notes { get; }
    public IReadOnlyList<CatalogueColumn> Columns => _columns;
    public long? RowCountHint => _rows;

    public bool ReadChunk(RowChunk chunk)
    {
        chunk.Reset();
        if (_nextRow >= _rows) return false;
        int rows = (int)Math.Min(chunk.Capacity, _rows - _nextRow);
        // Keep each read under ~8 MB.
        rows = (int)Math.Max(1, Math.Min(rows, (8L << 20) / _rowBytes));
        long bytes = rows * _rowBytes;
        if (_buffer.Length < bytes) _buffer = new byte[bytes];
        _stream.Position = _hdu.DataOffset + _nextRow * _rowBytes;
        int got = _stream.ReadAtLeast(_buffer.AsSpan(0, (int)bytes), (int)bytes, throwOnEndOfStream: false);
        if (got < bytes)
            throw new InputException($"the FITS file is truncated in the table data (row {_nextRow + got / _rowBytes + 1})", _path, _nextRow + got / _rowBytes + 1);
        for (int r = 0; r < rows; r++) chunk.BeginRow(_nextRow + r + 1);
        for (int k = 0; k < chunk.Requests.Count; k++)
        {
            var req = chunk.Requests[k];
            var (field, element) = _views[req.ColumnIndex];
            Decode(field, element, req.AsText, chunk.Columns[k], rows);
        }
        _nextRow += rows;
        return true;
    }

    private void Decode(FitsField f, int element, bool asText, ColumnBuffer buf, int rows)
    {
        var data = _buffer.AsSpan();
        long stride = _rowBytes;
        int off = f.Offset + Math.Max(0, element) * f.ElementBytes;
        if (element < 0)
        {
            for (int r = 0; r < rows; r++) buf.SetInvalid(r, $"({f.Form} not supported)");
            return;
        }
        double scale = f.Scale, zero = f.Zero;
        bool plain = scale == 1.0 && zero == 0.0;
        switch (f.Code)
        {
            case 'D' when !asText && plain:
                for (int r = 0; r < rows; r++)
                {
                    double v = BinaryPrimitives.ReadDoubleBigEndian(data.Slice((int)(r * stride) + off, 8));
                    if (double.IsNaN(v)) buf.SetNull(r); else buf.SetNumber(r, v);
                }
                return;
            case 'E' when !asText && plain:
                for (int r = 0; r < rows; r++)
                {
                    float v = BinaryPrimitives.ReadSingleBigEndian(data.Slice((int)(r * stride) + off, 4));
                    if (float.IsNaN(v)) buf.SetNull(r); else buf.SetNumber(r, v);
                }
                return;
        }
        for (int r = 0; r < rows; r++)
        {
            var cell = data.Slice((int)(r * stride) + off);
            switch (f.Code)
            {
                case 'A':
                {
                    var bytes = cell[..f.Width];
                    int nul = bytes.IndexOf((byte)0);
                    if (nul >= 0) bytes = bytes[..nul];
                    var s = Encoding.Latin1.GetString(bytes).Trim();
                    if (s.Length == 0) buf.SetNull(r);
                    else if (asText) buf.SetText(r, s);
                    else if (NumberText.TryParse(s, out var v)) buf.SetNumber(r, v);
                    else buf.SetInvalid(r, s);
                    break;
                }
                case 'L':
                {
                    byte b = cell[0];
                    if (b == 0) buf.SetNull(r);
                    else if (b == (byte)'T') { if (asText) buf.SetText(r, "T"); else buf.SetNumber(r, 1); }
                    else if (b == (byte)'F') { if (asText) buf.SetText(r, "F"); else buf.SetNumber(r, 0); }
                    else buf.SetInvalid(r, $"0x{b:X2}");
                    break;
                }
                case 'E' or 'D':
                {
                    double v = BigEndianCell.Real(cell, f.Code == 'E' ? 4 : 8);
                    if (double.IsNaN(v)) { buf.SetNull(r); break; }
                    v = zero + scale * v;
                    if (asText) buf.SetText(r, v.ToString("R", CultureInfo.InvariantCulture)); else buf.SetNumber(r, v);
                    break;
                }
                default:
                {
                    long raw = BigEndianCell.Integer(cell, f.Code switch { 'B' => 1, 'I' => 2, 'J' => 4, _ => 8 });
                    if (f.Null is long tnull && raw == tnull) { buf.SetNull(r); break; }
                    if (asText)
                        buf.SetText(r, f.IsScaled
                            ? (zero + scale * raw).ToString("R", CultureInfo.InvariantCulture)
                            : ((Int128)raw + (Int128)zero).ToString(CultureInfo.InvariantCulture));
                    else buf.SetNumber(r, plain ? raw : zero + scale * raw);
                    break;
                }
            }
        }
    }

    public void Dispose() => _stream.Dispose();
}
