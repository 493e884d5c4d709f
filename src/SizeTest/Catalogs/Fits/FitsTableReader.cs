using SizeTest.Common;

namespace SizeTest.Catalogs.Fits;

/// <summary>Reads a FITS BINTABLE extension.</summary>
internal static class FitsTableReader
{
    public static ICatalogReader Open(string path, string? hdu) => throw new InputException("FITS reading is not built yet", path);
}
