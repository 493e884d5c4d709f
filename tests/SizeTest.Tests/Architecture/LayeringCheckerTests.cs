using Xunit;
using SizeTest.Foundation.Errors;

namespace SizeTest.Tests.Architecture;

/// <summary>
/// Tests of the layering test: it is fed the deliberate violations in
/// <c>Fixtures/LayeringFixtures.cs</c> (types in a Cosmology namespace that name the Catalogues stage
/// by a relative name and through a <c>using</c> alias) and must report both, and must not report
/// the fixture that only uses a stage to its left.
/// </summary>
public sealed class LayeringCheckerTests
{
    private const string FixtureNamespace = "SizeTest.Cosmology.LayeringFixtures";

    private static List<string> FixtureViolations() =>
        LayeringTests.Violations(TypeReferenceScanner.Scan(typeof(LayeringCheckerTests).Assembly.Location, ns => ns == FixtureNamespace));

    [Fact]
    public void ARelativeNameReferenceToAStageOnTheRightFails()
    {
        var violations = FixtureViolations();
        Assert.Contains($"{FixtureNamespace}.RelativeNameUse (Cosmology) uses SizeTest.Catalogues.SizeKind (Catalogues)", violations);
    }

    [Fact]
    public void AnAliasedReferenceInsideAMethodBodyFails()
    {
        var violations = FixtureViolations();
        Assert.Contains($"{FixtureNamespace}.AliasUse (Cosmology) uses SizeTest.Catalogues.SizeKind (Catalogues)", violations);
    }

    [Fact]
    public void AReferenceToAStageOnTheLeftPasses()
    {
        var violations = FixtureViolations();
        Assert.DoesNotContain(violations, v => v.Contains(".LeftwardUse ", StringComparison.Ordinal));
        var uses = TypeReferenceScanner.Scan(typeof(LayeringCheckerTests).Assembly.Location, ns => ns == FixtureNamespace);
        Assert.Contains(uses, u => u.FromType == "LeftwardUse" && u.ToNamespace == "SizeTest.Foundation.Errors" && u.ToType == "InputException");
    }

    [Fact]
    public void TheRelativeNameIsInvisibleToATextScanForQualifiedNames()
    {
        // Why the layering test reads the compiled assembly: the fixture's relative line has no "SizeTest.Catalogues".
        var root = new DirectoryInfo(AppContext.BaseDirectory);
        while (root is not null && !File.Exists(Path.Combine(root.FullName, "SizeTest.sln"))) root = root.Parent;
        Assert.NotNull(root);
        var line = File.ReadLines(Path.Combine(root!.FullName, "tests", "SizeTest.Tests", "Architecture", "Fixtures", "LayeringFixtures.cs"))
            .Single(l => l.Contains("internal static Catalogues.SizeKind Kind", StringComparison.Ordinal));
        Assert.DoesNotContain("SizeTest.Catalogues", line, StringComparison.Ordinal);
    }
}
