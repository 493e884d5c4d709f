namespace SizeTest.Tests.Catalogues;

/// <summary>A temporary folder per test, deleted afterwards.</summary>
internal sealed class TempFiles : IDisposable
{
    public TempFiles() => Dir = Directory.CreateTempSubdirectory("sizetest-cat-").FullName;

    public string Dir { get; }

    public string Write(string name, string text)
    {
        var p = Path.Combine(Dir, name);
        File.WriteAllText(p, text);
        return p;
    }

    public string Write(string name, byte[] bytes)
    {
        var p = Path.Combine(Dir, name);
        File.WriteAllBytes(p, bytes);
        return p;
    }

    public string PathOf(string name) => Path.Combine(Dir, name);

    /// <summary>A VOTable 1.4 of one TABLE with the FIELD elements <paramref name="fields"/> and TABLEDATA rows <paramref name="rows"/>.</summary>
    public string WriteVoTable(string name, string fields, string rows) => Write(name, $"""
        <?xml version="1.0"?>
        <VOTABLE version="1.4" xmlns="http://www.ivoa.net/xml/VOTable/v1.3">
         <RESOURCE><TABLE>
        {fields}
          <DATA><TABLEDATA>
        {rows}
          </TABLEDATA></DATA>
         </TABLE></RESOURCE>
        </VOTABLE>
        """);

    public void Dispose()
    {
        try { Directory.Delete(Dir, true); } catch (IOException) { }
    }
}

internal static class ReferenceFiles
{
    public static string PathOf(string name) => Path.Combine(AppContext.BaseDirectory, "Reference", "Catalogues", name);
}

internal static class Rel
{
    /// <summary>Equal to within a relative tolerance (default 4 ulp-scale, 1e-15).</summary>
    public static void Equal(double expected, double actual, double rel = 1e-15)
    {
        double tol = rel * Math.Max(Math.Abs(expected), double.Epsilon);
        Xunit.Assert.True(Math.Abs(expected - actual) <= tol, $"expected {expected:R}, got {actual:R} (relative tolerance {rel})");
    }
}
