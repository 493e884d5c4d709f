namespace SizeTest.Catalogues;

/// <summary>Catalogue file formats.</summary>
public enum CatalogueFormat
{
    /// <summary>Delimited text: CSV, TSV, other single-character delimiters, or runs of whitespace.</summary>
    Text,
    /// <summary>FITS binary table (BINTABLE extension).</summary>
    Fits,
    /// <summary>IVOA VOTable (TABLEDATA, BINARY or BINARY2 serialisation).</summary>
    VoTable,

    /// <summary>Apache Parquet (read one row group at a time; see <see cref="Parquet.ParquetCatalogueReader"/>).</summary>
    Parquet,
}
