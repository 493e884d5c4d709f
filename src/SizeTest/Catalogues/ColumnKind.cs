namespace SizeTest.Catalogues;

/// <summary>The logical type of a catalogue column, as a reader reports it.</summary>
public enum ColumnKind
{
    /// <summary>True/false (FITS L, VOTable boolean).</summary>
    Boolean,
    /// <summary>Whole numbers (FITS B, I, J, K; VOTable unsignedByte, short, int, long).</summary>
    Integer,
    /// <summary>Floating-point numbers (FITS E, D; VOTable float, double; numeric CSV text).</summary>
    Real,
    /// <summary>Text (FITS A, VOTable char/unicodeChar arrays, non-numeric CSV cells).</summary>
    Text,
    /// <summary>A column the readers cannot decode into values (complex, bit arrays, variable arrays); listed but not mappable.</summary>
    Unsupported,
}
