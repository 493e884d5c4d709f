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
