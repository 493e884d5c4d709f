using Parquet;
using Parquet.Schema;
using SizeTest.Foundation.Files;
using SizeTest.Foundation.Angles;

namespace SizeTest.Catalogues.Parquet;

/// <summary>Compression of a written Parquet file.</summary>
public enum ParquetCompression
{
    /// <summary>No compression: fastest to read (the default; see docs/scaling.md for the figures).</summary>
    None,
    /// <summary>Snappy.</summary>
    Snappy,
    /// <summary>Zstandard at its fastest level (the default level is very slow to write in Parquet.Net 6.1).</summary>
    Zstd,
}

/// <summary>
/// Writes catalogue columns (doubles with optional nulls, strings) to a Parquet file, atomically
/// (<see cref="AtomicFile"/>), in row groups of a chosen size so that ranks can later split the file.
/// </summary>
public static class ParquetTableWriter
{
    /// <summary>Default rows per row group (2^20: about 40 MB for five double columns).</summary>
    public const int DefaultRowGroupRows = 1 << 20;

    /// <summary>
    /// Writes <paramref name="columns"/> (all of one length, distinct names) to <paramref name="path"/>.
    /// Numeric columns with a null mask become nullable DOUBLE, others required DOUBLE; text columns nullable strings.
    /// </summary>
    public static void Write(string path, IReadOnlyList<ParquetColumnValues> columns, int rowGroupRows = DefaultRowGroupRows,
        ParquetCompression compression = ParquetCompression.None)
    {
        ArgumentNullException.ThrowIfNull(path);
        ArgumentNullException.ThrowIfNull(columns);
        if (columns.Count == 0) throw new ArgumentException("At least one column is needed.", nameof(columns));
        if (rowGroupRows < 1) throw new ArgumentOutOfRangeException(nameof(rowGroupRows));
        int n = columns[0].Count;
        var seen = new HashSet<string>(StringComparer.Ordinal);
        foreach (var c in columns)
        {
            if (c.Count != n) throw new ArgumentException($"column '{c.Name}' has {c.Count} rows, expected {n}", nameof(columns));
            if (!seen.Add(c.Name)) throw new ArgumentException($"column '{c.Name}' appears twice", nameof(columns));
        }
        var fields = columns.Select(c => c.Texts is not null
            ? (DataField)new DataField<string>(c.Name, true)
            : c.IsNull is not null ? new DataField<double?>(c.Name) : new DataField<double>(c.Name)).ToArray();
        var schema = new ParquetSchema(fields);
        var options = new ParquetOptions
        {
            CompressionMethod = compression switch
            {
                ParquetCompression.Snappy => CompressionMethod.Snappy,
                ParquetCompression.Zstd => CompressionMethod.Zstd,
                _ => CompressionMethod.None,
            },
            CompressionLevel = System.IO.Compression.CompressionLevel.Fastest,
        };
        AtomicFile.Write(path, stream => WriteAsync(stream, schema, fields, columns, n, rowGroupRows, options).GetAwaiter().GetResult());
    }

    private static async Task WriteAsync(Stream stream, ParquetSchema schema, DataField[] fields, IReadOnlyList<ParquetColumnValues> columns,
        int n, int rowGroupRows, ParquetOptions options)
    {
        await using var writer = await ParquetWriter.CreateAsync(schema, stream, options);
        for (int start = 0; start < n || (n == 0 && start == 0); start += rowGroupRows)
        {
            int count = Math.Min(rowGroupRows, n - start);
            using var rg = writer.CreateRowGroup();
            for (int c = 0; c < columns.Count; c++)
            {
                var col = columns[c];
                if (col.Texts is { } texts)
                {
                    await rg.WriteAsync(fields[c], new ArraySegment<string>(texts!, start, count));
                }
                else if (col.IsNull is { } mask)
                {
                    var values = new double?[count];
                    for (int i = 0; i < count; i++) values[i] = mask[start + i] ? null : col.Numbers![start + i];
                    await rg.WriteAsync<double>(fields[c], values.AsMemory());
                }
                else
                {
                    await rg.WriteAsync<double>(fields[c], col.Numbers.AsMemory(start, count));
                }
            }
            if (n == 0) break;
        }
    }

    /// <summary>
    /// Writes a <see cref="CatalogueRows"/> with the columns of the catalogue roles: <c>id, z, z_err, theta, theta_err,
    /// mu, mu_err, mag, mag_err, band</c> (those present; angles in arcsec at the edge) plus its extra columns.
    /// </summary>
    public static void WriteSample(string path, CatalogueRows sample, int rowGroupRows = DefaultRowGroupRows, ParquetCompression compression = ParquetCompression.None)
    {
        ArgumentNullException.ThrowIfNull(sample);
        var cols = new List<ParquetColumnValues>();
        if (sample.Id is { } id) cols.Add(ParquetColumnValues.Text("id", id));
        cols.Add(ParquetColumnValues.Number("z", sample.Z));
        void Add(string name, double[]? values, double scale = 1)
        {
            if (values is null) return;
            cols.Add(ParquetColumnValues.Number(name, scale == 1 ? values : values.Select(v => v * scale).ToArray()));
        }
        Add("z_err", sample.ZErr);
        Add("theta", sample.ThetaRad, AngleUnits.ArcsecPerRadian);
        Add("theta_err", sample.ThetaErrRad, AngleUnits.ArcsecPerRadian);
        Add("mu", sample.Mu);
        Add("mu_err", sample.MuErr);
        Add("mag", sample.Mag);
        Add("mag_err", sample.MagErr);
        if (sample.Band is { } band) cols.Add(ParquetColumnValues.Text("band", band));
        foreach (var (name, values) in sample.ExtraColumns) Add(name, values);
        Write(path, cols, rowGroupRows, compression);
    }
}
