using System.Text.Json;
using SizeTest.Tests.Catalogues;
using Xunit;

namespace SizeTest.Tests.Cli;

public sealed class InspectCommandTests
{
    [Fact]
    public void TableOutputShowsFormatMappingAndCounts()
    {
        var (exit, output, err) = CliRunner.Run("inspect", ReferenceFiles.PathOf("fixture_tables.fits"), "--hdu", "RADIO");
        Assert.Equal(0, exit);
        Assert.Equal("", err);
        Assert.Contains("HDU 2 BINTABLE 'RADIO'", output);
        Assert.Contains("theta     ← FWHM [mas, from the file] (because common name for theta)", output);
        Assert.Contains("size definition: fwhm", output);
        Assert.Contains("rows: 2 read, 2 accepted, 0 rejected", output);
    }

    [Fact]
    public void JsonHasTheContractKeys()
    {
        var (exit, output, _) = CliRunner.Run("inspect", ReferenceFiles.PathOf("fixture_binary2.vot"), "--format", "json", "--col", "theta=theta:mas");
        Assert.Equal(0, exit);
        var root = JsonDocument.Parse(output).RootElement;
        Assert.Equal(6, root.GetProperty("rows_read").GetInt64());
        Assert.Equal(4, root.GetProperty("accepted").GetInt32());
        Assert.Equal(2, root.GetProperty("rejected").GetInt32());
        Assert.Equal(2, root.GetProperty("reject_reasons").GetProperty("missing value").GetInt32());
        Assert.Equal("votable", root.GetProperty("format").GetString());
        var theta = root.GetProperty("mapping").EnumerateArray().Single(m => m.GetProperty("role").GetString() == "theta");
        Assert.Equal("mas", theta.GetProperty("unit").GetString());
        Assert.Equal("given with --col", theta.GetProperty("reason").GetString());
        var z = root.GetProperty("statistics").EnumerateArray().Single(s => s.GetProperty("role").GetString() == "z");
        Assert.Equal(0.1, z.GetProperty("min").GetDouble());    // fixture values (make_fits_fixtures.py): accepted z = 0.1, 0.5, 2.25, 3.0
        Assert.Equal(1.375, z.GetProperty("median").GetDouble()); // (0.5 + 2.25) / 2
        Assert.Equal(3.0, z.GetProperty("max").GetDouble());
        Assert.Contains(root.GetProperty("columns").EnumerateArray(), c => c.GetProperty("ucd").GetString() == "phys.angSize;src");
    }

    [Fact]
    public void RejectLogIsWrittenAndNotOverwrittenWithoutForce()
    {
        using var t = new TempFiles();
        var cat = t.Write("c.csv", "z,theta\n0.5,1\n-1,2\n0.7,\n");
        var log = t.PathOf("rejects.csv");
        var (exit, _, _) = CliRunner.Run("inspect", cat, "--reject-log", log);
        Assert.Equal(0, exit);
        Assert.Equal("row,column,value,reason,detail\n3,z,-1,z <= 0,z must be > 0\n4,theta,,missing value,theta has no value\n", File.ReadAllText(log));
        var again = CliRunner.Run("inspect", cat, "--reject-log", log);
        Assert.Equal(2, again.Exit);
        Assert.Contains("--force", again.Err);
        Assert.Equal(0, CliRunner.Run("inspect", cat, "--reject-log", log, "--force").Exit);
    }

    [Fact]
    public void BadFileIsExitTwoWithOneLine()
    {
        using var t = new TempFiles();
        var bad = t.Write("broken.fits", File.ReadAllBytes(ReferenceFiles.PathOf("fixture_tables.fits"))[..4000]);
        var (exit, output, err) = CliRunner.Run("inspect", bad);
        Assert.Equal(2, exit);
        Assert.Equal("", output);
        Assert.Single(err.Trim().Split('\n'));
        Assert.Contains("broken.fits", err);
        Assert.Contains("truncated", err);

        var missing = CliRunner.Run("inspect", t.PathOf("nope.csv"));
        Assert.Equal(2, missing.Exit);
        Assert.Single(missing.Err.Trim().Split('\n'));

        var badCol = CliRunner.Run("inspect", ReferenceFiles.PathOf("fixture_tables.fits"), "--col", "theta=nosuch");
        Assert.Equal(2, badCol.Exit);
        Assert.Contains("no column 'nosuch'", badCol.Err);
    }

    [Fact]
    public void CsvFormatGivesPerRoleStatistics()
    {
        var (exit, output, _) = CliRunner.Run("inspect", ReferenceFiles.PathOf("van_der_Wel_2014_ApJ_788_28_Table5_VLuminosity.txt"), "--format", "csv");
        Assert.Equal(0, exit);
        var lines = output.Trim().Split('\n');
        Assert.Equal("role,column,unit,count,null_count,min,median,max", lines[0]);
        Assert.Equal("z,z,,21,0,0.25,1.25,2.25", lines[1]); // van der Wel et al. 2014 Table 5: 21 bins from z = 0.25 to 2.25, median bin 1.25
    }
}
