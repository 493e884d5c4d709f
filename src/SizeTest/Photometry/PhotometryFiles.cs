using SizeTest.Common;

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
}
