using SizeTest.Foundation.Errors;

namespace SizeTest.Photometry;

/// <summary>
/// The only file reading of the photometry stage: user tables (templates, filter curves,
/// zero points, extinction coefficients) read as text for <see cref="PhotometryOptionParser"/>.
/// </summary>
public static class PhotometryFiles
{
    /// <summary>Reads a text file; a missing or unreadable file becomes an <see cref="InputException"/> naming it.</summary>
    public static string ReadText(string path)
    {
        try
        {
            return File.ReadAllText(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            throw new InputException($"cannot read the file ({e.Message.TrimEnd('.')}); check the path.", path, inner: e);
        }
    }

    /// <summary>Reads a two-column spectrum file (λ in Å times <paramref name="angstromPerUnit"/>, flux).</summary>
    /// <exception cref="InputException">Unreadable file or bad rows (names file and line).</exception>
    public static SpectralTable ReadSpectrum(string path, SpectralDensity density, double angstromPerUnit = 1.0)
    {
        var t = TwoColumnText.ParseNumeric(ReadText(path), path);
        try { return SpectralTable.FromColumns(Scale(t.First, angstromPerUnit), t.Second, density, path); }
        catch (ArgumentException e) { throw new InputException(e.Message, path, inner: e); }
    }

    /// <summary>Reads a two-column photon-counting filter curve (λ in Å times <paramref name="angstromPerUnit"/>, response).</summary>
    /// <exception cref="InputException">Unreadable file or bad rows (names file and line).</exception>
    public static FilterResponse ReadFilter(string path, string? name = null, double angstromPerUnit = 1.0)
    {
        var t = TwoColumnText.ParseNumeric(ReadText(path), path);
        try { return FilterResponse.FromColumns(Scale(t.First, angstromPerUnit), t.Second, name ?? Path.GetFileNameWithoutExtension(path)); }
        catch (ArgumentException e) { throw new InputException(e.Message, path, inner: e); }
    }

    /// <summary>Reads a band table ("band value" rows); its first comment line becomes part of <see cref="BandTable.Source"/>.</summary>
    public static BandTable ReadBandTable(string path, string quantity) =>
        TwoColumnText.ParseBandTable(ReadText(path), path, quantity);

    private static double[] Scale(double[] a, double f) => f == 1.0 ? a : a.Select(x => x * f).ToArray();
}
