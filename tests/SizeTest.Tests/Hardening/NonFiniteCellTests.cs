using SizeTest.Catalogues;
using SizeTest.Tests.Catalogues;
using Xunit;

namespace SizeTest.Tests.Hardening;

/// <summary>
/// Issue 14 point 10: <c>inf</c> was "unparsable" but <c>Infinity</c> "out of range". Every spelling of a
/// non-finite value gets one reason, <c>non-finite value</c>, in every reader that reads numbers from text.
/// </summary>
public sealed class NonFiniteCellTests
{
    private static readonly string[] Spellings = ["inf", "Infinity", "-inf", "nan", "NaN", "-Infinity", "INF", "+inf"];

    [Theory]
    [InlineData(",")]
    [InlineData(" ")]
    public void TextReadersRejectEverySpellingAsNonFinite(string delimiter)
    {
        using var t = new TempFiles();
        var lines = new List<string> { string.Join(delimiter, "z", "theta"), string.Join(delimiter, "0.5", "1.0") };
        lines.AddRange(Spellings.Select(s => string.Join(delimiter, "0.6", s)));
        var p = t.Write(delimiter == "," ? "c.csv" : "c.txt", string.Join("\n", lines) + "\n");
        AssertAllNonFinite(CatalogueLoader.Load(p));
    }

    [Fact]
    public void VoTableTabledataRejectsEverySpellingAsNonFinite()
    {
        using var t = new TempFiles();
        var rows = string.Concat(Spellings.Select(s => $"<TR><TD>0.6</TD><TD>{s}</TD></TR>"));
        var p = t.Write("c.vot", $"""
            <?xml version="1.0"?>
            <VOTABLE version="1.4" xmlns="http://www.ivoa.net/xml/VOTable/v1.3"><RESOURCE><TABLE>
             <FIELD name="z" datatype="double"/><FIELD name="theta" datatype="double" unit="arcsec"/>
             <DATA><TABLEDATA><TR><TD>0.5</TD><TD>1.0</TD></TR>{rows}</TABLEDATA></DATA>
            </TABLE></RESOURCE></VOTABLE>
            """);
        AssertAllNonFinite(CatalogueLoader.Load(p));
    }

    [Fact]
    public void NumberTextReadsTheSpellingsAndNothingElse()
    {
        Assert.True(NumberText.TryParse("-inf", out var v) && double.IsNegativeInfinity(v));
        Assert.True(NumberText.TryParse("nan", out v) && double.IsNaN(v));
        Assert.True(NumberText.TryParse("2.5e3", out v) && v == 2500);
        Assert.False(NumberText.TryParse("infinit", out _));
        Assert.False(NumberText.TryParse("abc", out _));
    }

    private static void AssertAllNonFinite(CatalogueLoad load)
    {
        Assert.Equal(1 + Spellings.Length, load.RowsRead);
        Assert.Equal(1, load.Accepted);
        Assert.Equal(Spellings.Length, load.Rejected);
        Assert.All(load.RejectLog.Entries, e =>
        {
            Assert.Equal(RejectReason.NonFinite, e.Reason);
            Assert.Equal("non-finite value", e.Reason.Code());
            Assert.Equal("theta", e.Column);
        });
    }
}
