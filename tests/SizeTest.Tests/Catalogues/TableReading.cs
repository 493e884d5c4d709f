using System.Text.Json;
using SizeTest.Catalogues;

namespace SizeTest.Tests.Catalogues;

/// <summary>Helpers: read a whole table through the streaming interface, and the astropy reference values.</summary>
internal static class TableReading
{
    /// <summary>Reads every column (text columns as text, others as numbers) into object?[] per column (null = null cell).</summary>
    public static (List<long> Positions, Dictionary<string, List<object?>> Values) ReadAll(ICatalogueReader reader, int chunkRows = 3, ISet<string>? asText = null)
    {
        var requests = reader.Columns.Select((c, i) => new ColumnRequest(i, c.Kind == ColumnKind.Text || (asText?.Contains(c.Name) ?? false))).ToList();
        var chunk = new RowChunk(requests, chunkRows);
        var positions = new List<long>();
        var values = reader.Columns.ToDictionary(c => c.Name, _ => new List<object?>());
        while (reader.ReadChunk(chunk))
        {
            for (int r = 0; r < chunk.Count; r++)
            {
                positions.Add(chunk.Positions[r]);
                for (int k = 0; k < requests.Count; k++)
                {
                    var b = chunk.Columns[k];
                    object? v = b.States[r] switch
                    {
                        CellState.Null => null,
                        CellState.Invalid => "INVALID:" + b.InvalidText(r),
                        _ => requests[k].AsText ? b.Texts![r] : b.Numbers![r],
                    };
                    values[reader.Columns[requests[k].ColumnIndex].Name].Add(v);
                }
            }
        }
        return (positions, values);
    }

    public static JsonElement Reference() =>
        JsonDocument.Parse(File.ReadAllText(ReferenceFiles.PathOf("fixture_tables.json"))).RootElement;

    /// <summary>The astropy values of one column of one HDU (numbers as double, booleans as 0/1, strings, null).</summary>
    public static List<object?> Expected(string hdu, string column, int? element = null)
    {
        var list = new List<object?>();
        foreach (var v in Reference().GetProperty("hdus").GetProperty(hdu).GetProperty("columns").GetProperty(column).GetProperty("values").EnumerateArray())
        {
            var e = element is int i ? v[i] : v;
            list.Add(e.ValueKind switch
            {
                JsonValueKind.Null => null,
                JsonValueKind.String => e.GetString(),
                JsonValueKind.True => 1.0,
                JsonValueKind.False => 0.0,
                _ => e.GetDouble(),
            });
        }
        return list;
    }
}
