using SizeTest.Catalogues;
using SizeTest.Tests.Catalogues;
using Xunit;

namespace SizeTest.Tests.Hardening;

/// <summary>Issue 14 point 10: "read 1000000 rows" was printed twice (last chunk's report and the final count).</summary>
public sealed class ProgressOnceTests
{
    [Theory]
    [InlineData(40, new long[] { 10, 20, 30, 40 })]     // a multiple of the interval: the final count is not repeated
    [InlineData(45, new long[] { 10, 20, 30, 40, 45 })] // otherwise the final count follows the last interval report
    public void EveryCountIsReportedOnce(int rows, long[] expected)
    {
        using var t = new TempFiles();
        var p = t.Write("c.csv", "z,theta\n" + string.Concat(Enumerable.Range(0, rows).Select(_ => "0.5,1\n")));
        var seen = new List<long>();
        var load = CatalogueLoader.Load(p, new CatalogueLoadOptions { ChunkRows = 5, ProgressInterval = 10, Progress = seen.Add });
        Assert.Equal(rows, load.RowsRead);
        Assert.Equal(expected, seen);
    }
}
