using SizeTest.Common;

namespace SizeTest.Catalogs.VoTable;

/// <summary>Reads a VOTable.</summary>
internal static class VoTableReader
{
    public static ICatalogReader Open(string path, string? table) => throw new InputException("VOTable reading is not built yet", path);
}
