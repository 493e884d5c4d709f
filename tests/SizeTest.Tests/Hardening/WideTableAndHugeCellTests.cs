using System.Text;
using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Tests.Cli;
using Xunit;

namespace SizeTest.Tests.Hardening;

/// <summary>
/// Bounded readers (issue 14, point 5): a header with 200 000 columns, a 20 MB VOTable TD cell, a 20 MB DESCRIPTION and a
/// 20 MB attribute are refused with one line naming file and place, having allocated a few MiB, not hundreds.
/// Before the caps: the 200 000-column CSV reached 126 MB peak RSS (3 s), the 20 MB TD 125 MB, a 300 MB TD 1.2 GB and a
/// 300 MB FIELD name 5.3 GB (243 s), each measured with /usr/bin/time on the CLI.
/// </summary>
public sealed class WideTableAndHugeCellTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-wide-").FullName;

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    private static (InputException Error, long AllocatedBytes) Refusal(string path, ReaderOptions? reader = null)
    {
        long before = GC.GetAllocatedBytesForCurrentThread();
        var e = Assert.Throws<InputException>(() => CatalogueLoader.Load(path, new CatalogueLoadOptions { Reader = reader ?? new ReaderOptions() }));
        return (e, GC.GetAllocatedBytesForCurrentThread() - before);
    }

    private static string Vot(string fields, string rows) =>
        "<?xml version=\"1.0\"?>\n<VOTABLE version=\"1.4\"><RESOURCE><TABLE>" + fields + "<DATA><TABLEDATA>" + rows + "</TABLEDATA></DATA></TABLE></RESOURCE></VOTABLE>\n";

    [Fact]
    public void AHeaderOfTwoHundredThousandColumnsIsRefusedWithBoundedMemory()
    {
        var p = Path.Combine(_dir, "wide.csv");
        var names = string.Join(",", Enumerable.Range(0, 200_000).Select(i => $"c{i}"));
        File.WriteAllText(p, "z,theta," + names + "\n0.5,0.3," + string.Join(",", Enumerable.Repeat("1", 200_000)) + "\n");
        var (e, allocated) = Refusal(p, new ReaderOptions { MaxLineBytes = 4 << 20 });
        Assert.Equal($"{p}, line 1: the line has more than 10000 fields; a catalogue has at most 10000 columns (is this a catalogue? check the delimiter, or drop unused columns)", e.Message);
        // The two 1.9 MB lines as UTF-16 strings (~8 MB) and at most 10 001 fields per split: 32 MiB is the ceiling.
        Assert.True(allocated < 32L << 20, $"allocated {allocated >> 20} MiB");

        var (exit, _, err, _) = CliProcess.Run(_dir, ["inspect", p, "--max-line-bytes", "4000000"]);
        Assert.Equal(2, exit);
        Assert.Equal($"sizetest: {e.Message}", err.Trim());
    }

    [Fact]
    public void TheColumnCapHoldsAtItsValueAndIsConfigurable()
    {
        var p = Path.Combine(_dir, "cap.csv");
        File.WriteAllText(p, "z,theta,a,b\n0.5,0.3,1,2\n");
        Assert.Equal(4, CatalogueLoader.Load(p, new CatalogueLoadOptions { Reader = new ReaderOptions { MaxColumns = 4 } }).Columns.Count);
        var (e, _) = Refusal(p, new ReaderOptions { MaxColumns = 3 });
        Assert.Contains("line 1: the line has more than 3 fields", e.Message);
        var v = Path.Combine(_dir, "cap.vot");
        File.WriteAllText(v, Vot(string.Concat(Enumerable.Range(0, 4).Select(i => $"<FIELD name=\"f{i}\" datatype=\"double\"/>")), ""));
        var (ev, _) = Refusal(v, new ReaderOptions { MaxColumns = 3 });
        Assert.Contains("TABLE 1 has more than 3 FIELDs", ev.Message);
    }

    [Fact]
    public void AHugeTdCellIsRefusedNamingRowAndColumnWithBoundedMemory()
    {
        var p = Path.Combine(_dir, "td.vot");
        File.WriteAllText(p, Vot("<FIELD name=\"z\" datatype=\"double\"/><FIELD name=\"theta\" datatype=\"double\"/>",
            "<TR><TD>0.5</TD><TD>0.3</TD></TR><TR><TD>0.6</TD><TD>" + new string('1', 20_000_000) + "</TD></TR>"));
        var (e, allocated) = Refusal(p);
        Assert.Equal($"{p}, row 2, column 'theta': the TD cell is longer than 1048576 characters; no catalogue value is that long (is the file damaged?)", e.Message);
        // At most 1 Mi characters (2 MiB of UTF-16) are held for the cell; the XML reader's own buffers are small.
        Assert.True(allocated < 16L << 20, $"allocated {allocated >> 20} MiB");

        var (exit, _, err, _) = CliProcess.Run(_dir, ["inspect", p]);
        Assert.Equal(2, exit);
        Assert.Equal($"sizetest: {e.Message}", err.Trim());
    }

    [Fact]
    public void TheCellCapIsConfigurableAndCellsWithinItReadAsBefore()
    {
        var p = Path.Combine(_dir, "cells.vot");
        File.WriteAllText(p, Vot("<FIELD name=\"z\" datatype=\"double\"><DESCRIPTION>redshift</DESCRIPTION><VALUES null=\"-1\"/></FIELD><FIELD name=\"theta\" datatype=\"double\"/>",
            "<TR><TD>0.5</TD><TD><![CDATA[0.25]]></TD></TR><TR><TD>-1</TD><TD> 0.75 </TD></TR><TR><TD/><TD>1</TD></TR>"));
        var load = CatalogueLoader.Load(p, new CatalogueLoadOptions());
        Assert.Equal(3, load.RowsRead);
        Assert.Equal([0.5], load.Rows.Z);          // rows 2 (VALUES null -1, read after the DESCRIPTION) and 3 (empty TD) have no z
        Assert.Equal("redshift", load.Columns[0].Description);
        Assert.Equal(0.25 / SizeTest.Foundation.Angles.AngleUnits.ArcsecPerRadian, load.Rows.ThetaRad![0], 15);
        var (e, _) = Refusal(p, new ReaderOptions { MaxCellChars = 3 });
        Assert.Contains("row 1, column 'theta': the TD cell is longer than 3 characters", e.Message);
    }

    [Fact]
    public void AHugeDescriptionOrAttributeIsRefusedWithBoundedMemory()
    {
        var d = Path.Combine(_dir, "desc.vot");
        File.WriteAllText(d, Vot("<FIELD name=\"z\" datatype=\"double\"><DESCRIPTION>" + new string('a', 20_000_000) + "</DESCRIPTION></FIELD>", ""));
        var (ed, allocD) = Refusal(d);
        Assert.Contains("FIELD 'z' has a DESCRIPTION longer than 65536 characters", ed.Message);
        Assert.True(allocD < 16L << 20, $"allocated {allocD >> 20} MiB");

        var a = Path.Combine(_dir, "attr.vot");
        File.WriteAllText(a, Vot("<FIELD name=\"" + new string('a', 20_000_000) + "\" datatype=\"double\"/>", ""));
        var (ea, allocA) = Refusal(a);
        Assert.StartsWith($"{a}: an XML tag near byte ", ea.Message);
        Assert.Contains("is longer than 1048576 bytes", ea.Message);
        Assert.True(allocA < 16L << 20, $"allocated {allocA >> 20} MiB");
    }
}
