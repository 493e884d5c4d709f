
using SizeTest.Foundation.Angles;

namespace SizeTest.Catalogues;

/// <summary>
/// A small in-memory table for the writers (<see cref="Fits.FitsTableWriter"/>,
/// <see cref="VoTable.VoTableWriter"/>, <see cref="Text.CsvTableWriter"/>): mock catalogues,
/// demo catalogues, test fixtures. All columns have the same length.
/// </summary>
public sealed class CatalogueTable
{
    private readonly List<TableColumn> _columns = new();

    /// <summary>Creates an empty table.</summary>
    /// <param name="name">Table name (FITS EXTNAME, VOTable TABLE name), or null.</param>
    public CatalogueTable(string? name = null) => Name = name;

    /// <summary>Table name, or null.</summary>
    public string? Name { get; }

    /// <summary>The columns in order.</summary>
    public IReadOnlyList<TableColumn> Columns => _columns;

    /// <summary>Rows (0 when there are no columns).</summary>
    public int RowCount => _columns.Count == 0 ? 0 : _columns[0].Length;

    /// <summary>Adds a column; throws <see cref="ArgumentException"/> when its length differs or its name repeats.</summary>
    public CatalogueTable Add(TableColumn column)
    {
        ArgumentNullException.ThrowIfNull(column);
        if (_columns.Count > 0 && column.Length != RowCount)
            throw new ArgumentException($"column '{column.Name}' has {column.Length} values, the table has {RowCount} rows");
        if (_columns.Any(c => c.Name == column.Name)) throw new ArgumentException($"column '{column.Name}' is already in the table");
        _columns.Add(column);
        return this;
    }

    /// <summary>Adds a real column (NaN = null).</summary>
    public CatalogueTable AddReal(string name, double[] values, string? unit = null, string? ucd = null, string? description = null) =>
        Add(new TableColumn(name, ColumnKind.Real, unit, ucd, description, Reals: values));

    /// <summary>Adds an integer column.</summary>
    public CatalogueTable AddInteger(string name, long[] values, string? unit = null, string? ucd = null, string? description = null) =>
        Add(new TableColumn(name, ColumnKind.Integer, unit, ucd, description, Integers: values));

    /// <summary>Adds a text column (null = null).</summary>
    public CatalogueTable AddText(string name, string?[] values, string? ucd = null, string? description = null) =>
        Add(new TableColumn(name, ColumnKind.Text, null, ucd, description, Texts: values));

    /// <summary>
    /// The sample as a table whose columns are named by role (so it loads back with no mapping):
    /// <c>id, z, z_err, theta, theta_err</c> (arcsec), <c>mu, mu_err</c> (mag/arcsec2), <c>mag, mag_err</c>,
    /// <c>band</c>, then the extra columns, each with its IVOA UCD.
    /// </summary>
    public static CatalogueTable FromRows(CatalogueRows sample, string? name = null)
    {
        ArgumentNullException.ThrowIfNull(sample);
        var t = new CatalogueTable(name);
        static double[] Arcsec(double[] rad) => rad.Select(v => v * AngleUnits.ArcsecPerRadian).ToArray();
        if (sample.Id is { } id) t.AddText("id", id, "meta.id;meta.main");
        t.AddReal("z", sample.Z, null, "src.redshift");
        if (sample.ZErr is { } ze) t.AddReal("z_err", ze, null, "stat.error;src.redshift");
        if (sample.ThetaRad is { } th) t.AddReal("theta", Arcsec(th), "arcsec", "phys.angSize;src", $"angular size ({SizeDefinitions.Format(sample.SizeDefinition)})");
        if (sample.ThetaErrRad is { } the) t.AddReal("theta_err", Arcsec(the), "arcsec", "stat.error;phys.angSize;src");
        if (sample.Mu is { } mu) t.AddReal("mu", mu, "mag.arcsec-2", "phot.mag.sb");
        if (sample.MuErr is { } mue) t.AddReal("mu_err", mue, "mag.arcsec-2", "stat.error;phot.mag.sb");
        if (sample.Mag is { } mag) t.AddReal("mag", mag, "mag", "phot.mag");
        if (sample.MagErr is { } mage) t.AddReal("mag_err", mage, "mag", "stat.error;phot.mag");
        if (sample.Band is { } band) t.AddText("band", band, "instr.bandpass");
        foreach (var (n, v) in sample.ExtraColumns) t.AddReal(n, v);
        return t;
    }
}
