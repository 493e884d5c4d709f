using CatalogueSizeKind = SizeTest.Catalogues.SizeKind;

// Deliberate layering violations for LayeringCheckerTests, compiled into the test assembly only.
// The namespace sits inside the Cosmology stage so that the relative name "Catalogues.SizeKind"
// resolves to SizeTest.Catalogues.SizeKind, a stage to the right of Cosmology.
namespace SizeTest.Cosmology.LayeringFixtures;

/// <summary>Names a right-hand stage by a namespace-relative name only (no "SizeTest." in the text).</summary>
internal static class RelativeNameUse
{
    /// <summary>A field of a Catalogues type, spelled relative to the enclosing namespace.</summary>
    internal static Catalogues.SizeKind Kind = Catalogues.SizeKind.Petrosian;
}

/// <summary>Names a right-hand stage through a <c>using</c> alias, inside a method body only.</summary>
internal static class AliasUse
{
    /// <summary>Uses the alias in a local only.</summary>
    internal static int Count()
    {
        var kinds = Enum.GetValues<CatalogueSizeKind>();
        return kinds.Length;
    }
}

/// <summary>Uses only a stage to the left of Cosmology (Foundation): allowed.</summary>
internal static class LeftwardUse
{
    /// <summary>Builds a Foundation exception.</summary>
    internal static Exception Make() => new SizeTest.Foundation.Errors.InputException("fixture");
}
