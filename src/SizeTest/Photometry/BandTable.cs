namespace SizeTest.Photometry;

/// <summary>
/// One number per band name, from a user table: AB zero-point offsets or extinction
/// coefficients. Band names match exactly (ordinal). Keeps its source (file name plus any
/// citation the user wrote in the table's comment lines) so the run manifest can record it.
/// </summary>
public sealed class BandTable
{
    private readonly Dictionary<string, double> _values;

    /// <summary>Creates the table.</summary>
    /// <param name="values">Value per band name; names non-empty, values finite.</param>
    /// <param name="source">Where it came from (file and citation), for the manifest.</param>
    /// <param name="quantity">What the values are (e.g. "AB offset (mag)", "A_band/E(B−V)").</param>
    /// <exception cref="ArgumentException">Empty table, empty name or non-finite value.</exception>
    public BandTable(IReadOnlyDictionary<string, double> values, string source, string quantity)
    {
        ArgumentNullException.ThrowIfNull(values);
        if (values.Count == 0) throw new ArgumentException($"{source}: the {quantity} table has no bands.");
        _values = new Dictionary<string, double>(StringComparer.Ordinal);
        foreach (var (k, v) in values)
        {
            if (string.IsNullOrWhiteSpace(k)) throw new ArgumentException($"{source}: empty band name.");
            if (!double.IsFinite(v)) throw new ArgumentException($"{source}: band '{k}' has a non-finite {quantity} ({v}).");
            _values[k] = v;
        }
        Source = source;
        Quantity = quantity;
    }

    /// <summary>Where the table came from, for the manifest and descriptions.</summary>
    public string Source { get; }

    /// <summary>What the values are.</summary>
    public string Quantity { get; }

    /// <summary>Band names in the table.</summary>
    public IReadOnlyCollection<string> Bands => _values.Keys;

    /// <summary>The value for <paramref name="band"/>, if listed.</summary>
    public bool TryGet(string band, out double value) => _values.TryGetValue(band, out value);
}
