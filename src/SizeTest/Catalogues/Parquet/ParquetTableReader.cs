using Parquet;
using Parquet.Schema;
using SizeTest.Foundation.Errors;

namespace SizeTest.Catalogues.Parquet;

/// <summary>
/// Reads a Parquet file one row group at a time, decoding only the requested columns. Exposes each row
/// group's row count and first-row offset (from the file footer) so that ranks can split a file by row
/// groups (<see cref="Distributed.RowPartition.RowGroups"/>) and every row is read by exactly one of them.
/// Knows nothing of roles, units or cosmology.
/// </summary>
public sealed class ParquetTableReader : IDisposable
{
    private readonly FileStream _stream;
    private readonly ParquetReader _reader;
    private readonly Dictionary<string, DataField> _fields;
    private readonly long[] _counts;
    private readonly long[] _firstRows;

    private ParquetTableReader(string path, FileStream stream, ParquetReader reader)
    {
        SourceName = path;
        _stream = stream;
        _reader = reader;
        var columns = new List<ParquetColumnInfo>();
        _fields = new Dictionary<string, DataField>(StringComparer.Ordinal);
        foreach (var field in reader.Schema.Fields)
        {
            if (field is DataField df && !df.IsArray && df.MaxRepetitionLevel == 0)
            {
                var kind = KindOf(df.ClrType);
                columns.Add(new ParquetColumnInfo(df.Name, kind, df.IsNullable, TypeName(df.ClrType)));
                if (kind != ParquetValueKind.Unsupported) _fields[df.Name] = df;
            }
            else
            {
                columns.Add(new ParquetColumnInfo(field.Name, ParquetValueKind.Unsupported, field.IsNullable, field.SchemaType.ToString()));
            }
        }
        Columns = columns;
        _counts = new long[reader.RowGroupCount];
        _firstRows = new long[reader.RowGroupCount];
        long offset = 0;
        for (int g = 0; g < reader.RowGroupCount; g++)
        {
            _firstRows[g] = offset;
            _counts[g] = reader.RowGroups[g].RowCount;
            offset += _counts[g];
        }
        RowCount = offset;
    }

    /// <summary>Opens <paramref name="path"/>; throws <see cref="InputException"/> if it is missing or not a readable Parquet file.</summary>
    public static ParquetTableReader Open(string path)
    {
        ArgumentNullException.ThrowIfNull(path);
        if (!File.Exists(path)) throw new InputException("file not found", path);
        FileStream? stream = null;
        try
        {
            stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16);
            if (stream.Length < 12 || !HasMagic(stream))
                throw new InputException("is not a Parquet file (no 'PAR1' marker at its start and end); check the file or its format option", path);
            ParquetFooterCheck.Check(stream, path);
            stream.Position = 0;
            var reader = ParquetReader.CreateAsync(stream, leaveStreamOpen: true).GetAwaiter().GetResult();
            return new ParquetTableReader(path, stream, reader);
        }
        catch (InputException)
        {
            stream?.Dispose();
            throw;
        }
        catch (Exception ex) when (IsDamage(ex))
        {
            stream?.Dispose();
            throw new InputException($"cannot read the Parquet footer or schema ({ex.Message}); the file may be truncated or damaged", path, inner: ex);
        }
    }

    /// <summary>
    /// Exceptions the Parquet library throws on a damaged or truncated file (found by the fuzz suite,
    /// tests/…/Hardening/FuzzedInputTests): its own <c>ParquetException</c> and Thrift errors, and the
    /// null-reference, overflow, index and argument errors it raises when a damaged length or offset leads it astray.
    /// These are input problems (exit 2), never internal errors.
    /// </summary>
    private static bool IsDamage(Exception ex) =>
        ex is IOException or InvalidDataException or NotSupportedException or InvalidOperationException or ArgumentException
            or IndexOutOfRangeException or NullReferenceException or OverflowException or FormatException
            or global::Parquet.ParquetException or global::Parquet.Meta.Proto.ThriftProtocolException;

    private static bool HasMagic(FileStream stream)
    {
        Span<byte> head = stackalloc byte[4], tail = stackalloc byte[4];
        stream.Position = 0;
        stream.ReadExactly(head);
        stream.Position = stream.Length - 4;
        stream.ReadExactly(tail);
        return head.SequenceEqual("PAR1"u8) && tail.SequenceEqual("PAR1"u8);
    }

    private static string TypeName(Type t) =>
        t == typeof(double) ? "double" : t == typeof(float) ? "float" : t == typeof(int) ? "int32" : t == typeof(long) ? "int64"
        : t == typeof(short) ? "int16" : t == typeof(sbyte) ? "int8" : t == typeof(byte) ? "uint8" : t == typeof(ushort) ? "uint16"
        : t == typeof(uint) ? "uint32" : t == typeof(ulong) ? "uint64" : t == typeof(bool) ? "boolean"
        : t == typeof(string) || t == typeof(ReadOnlyMemory<char>) ? "string" : t.Name;

    private static ParquetValueKind KindOf(Type t) =>
        t == typeof(double) || t == typeof(float) ? ParquetValueKind.Real
        : t == typeof(int) || t == typeof(long) || t == typeof(short) || t == typeof(sbyte) || t == typeof(byte) || t == typeof(ushort) || t == typeof(uint) || t == typeof(ulong) ? ParquetValueKind.Integer
        : t == typeof(bool) ? ParquetValueKind.Boolean
        : t == typeof(string) || t == typeof(ReadOnlyMemory<char>) ? ParquetValueKind.Text
        : ParquetValueKind.Unsupported;

    /// <summary>The file being read.</summary>
    public string SourceName { get; }

    /// <summary>The top-level columns in file order (unsupported ones included, marked as such).</summary>
    public IReadOnlyList<ParquetColumnInfo> Columns { get; }

    /// <summary>Number of row groups.</summary>
    public int RowGroupCount => _counts.Length;

    /// <summary>Rows in each row group.</summary>
    public IReadOnlyList<long> RowGroupRowCounts => _counts;

    /// <summary>0-based index of each row group's first row in the file.</summary>
    public IReadOnlyList<long> RowGroupFirstRows => _firstRows;

    /// <summary>Total rows in the file.</summary>
    public long RowCount { get; }

    /// <summary>
    /// Reads row group <paramref name="group"/>, decoding <paramref name="columns"/> (all supported columns when null).
    /// Throws <see cref="InputException"/> naming the file, the row group's first row and the column on damaged data.
    /// </summary>
    public ParquetRowGroupData ReadRowGroup(int group, IReadOnlyCollection<string>? columns = null)
    {
        if ((uint)group >= (uint)_counts.Length) throw new ArgumentOutOfRangeException(nameof(group), group, $"The file has {_counts.Length} row groups.");
        var names = columns ?? _fields.Keys.ToArray();
        var result = new Dictionary<string, ParquetColumnValues>(StringComparer.Ordinal);
        int n = checked((int)_counts[group]);
        using var rg = _reader.OpenRowGroupReader(group);
        foreach (var name in names)
        {
            if (!_fields.TryGetValue(name, out var field))
            {
                var info = Columns.FirstOrDefault(c => c.Name == name);
                throw new InputException(info is null ? "no such column in the file" : $"the column's type ({info.NativeType}) cannot be read; use a numeric or text column",
                    SourceName, column: name);
            }
            try
            {
                result[name] = ReadColumn(rg, field, n);
            }
            catch (Exception ex) when (IsDamage(ex))
            {
                throw new InputException($"cannot decode row group {group} (rows {_firstRows[group] + 1}–{_firstRows[group] + n}): {ex.Message.TrimEnd('.')}; the file may be damaged",
                    SourceName, _firstRows[group] + 1, name, ex, lineLabel: "row");
            }
        }
        return new ParquetRowGroupData(group, _firstRows[group], n, result);
    }

    private static ParquetColumnValues ReadColumn(ParquetRowGroupReader rg, DataField field, int n)
    {
        var t = field.ClrType;
        var kind = KindOf(t);
        if (kind == ParquetValueKind.Text)
        {
            var texts = new string?[n];
            rg.ReadAsync(field, texts.AsMemory()!).GetAwaiter().GetResult();
            return ParquetColumnValues.Text(field.Name, texts);
        }
        return t switch
        {
            _ when t == typeof(double) => Numbers<double>(rg, field, n, v => v),
            _ when t == typeof(float) => Numbers<float>(rg, field, n, v => v),
            _ when t == typeof(int) => Numbers<int>(rg, field, n, v => v),
            _ when t == typeof(long) => Numbers<long>(rg, field, n, v => v),
            _ when t == typeof(short) => Numbers<short>(rg, field, n, v => v),
            _ when t == typeof(sbyte) => Numbers<sbyte>(rg, field, n, v => v),
            _ when t == typeof(byte) => Numbers<byte>(rg, field, n, v => v),
            _ when t == typeof(ushort) => Numbers<ushort>(rg, field, n, v => v),
            _ when t == typeof(uint) => Numbers<uint>(rg, field, n, v => v),
            _ when t == typeof(ulong) => Numbers<ulong>(rg, field, n, v => v),
            _ when t == typeof(bool) => Numbers<bool>(rg, field, n, v => v ? 1 : 0),
            _ => throw new NotSupportedException($"type {t.Name}"),
        };
    }

    private static ParquetColumnValues Numbers<T>(ParquetRowGroupReader rg, DataField field, int n, Func<T, double> convert) where T : struct
    {
        var values = new double[n];
        bool[]? mask = null;
        if (field.IsNullable)
        {
            var raw = new T?[n];
            rg.ReadAsync<T>(field, raw.AsMemory()).GetAwaiter().GetResult();
            for (int i = 0; i < n; i++)
            {
                if (raw[i] is { } v) values[i] = convert(v);
                else { (mask ??= new bool[n])[i] = true; values[i] = double.NaN; }
            }
        }
        else
        {
            var raw = new T[n];
            rg.ReadAsync<T>(field, raw.AsMemory()).GetAwaiter().GetResult();
            if (typeof(T) == typeof(double)) ((double[])(object)raw).CopyTo(values, 0);
            else for (int i = 0; i < n; i++) values[i] = convert(raw[i]);
        }
        return ParquetColumnValues.Read(field.Name, values, mask, KindOf(typeof(T)));
    }

    /// <summary>Closes the file.</summary>
    public void Dispose()
    {
        _reader.DisposeAsync().AsTask().GetAwaiter().GetResult();
        _stream.Dispose();
    }
}
