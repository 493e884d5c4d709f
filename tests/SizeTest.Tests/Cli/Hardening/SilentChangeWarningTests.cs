using System.Globalization;
using System.Text.Json;
using SizeTest.Catalogues;
using Xunit;

namespace SizeTest.Tests.Cli.Hardening;

/// <summary>
/// Issue 14 points 8 and 9, re-checked: a wrong angular unit (<c>--col theta=theta:deg</c> on arcsec values) and
/// repeated column names were accepted without a word; inspect counted a rejected row's null z among the accepted rows.
/// Each now warns on stderr and in results.json's notes, and the counts are of accepted rows.
/// </summary>
public sealed class SilentChangeWarningTests : IDisposable
{
    private readonly string _dir = Directory.CreateTempSubdirectory("sizetest-silent-").FullName;

    public void Dispose()
    {
        try { Directory.Delete(_dir, true); } catch (IOException) { }
    }

    private string Catalogue(string name, string text)
    {
        var p = Path.Combine(_dir, name);
        File.WriteAllText(p, text);
        return p;
    }

    private static string[] Notes(string outDir) =>
        JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "results.json"))).RootElement.GetProperty("notes").EnumerateArray().Select(e => e.GetString()!).ToArray();

    [Fact]
    public void ArcsecValuesReadAsDegreesWarnOnStderrAndInTheNotesAndTheErrorFollowsTheUnit()
    {
        // HardeningData's mock: θ of 4 kpc EdS galaxies at z ≈ 0.1–2, i.e. ~0.3–1.5″; read as degrees, 3600× larger.
        var cat = Catalogue("c.csv", HardeningData.CatalogueText(120));
        var plain = CatalogueLoader.Load(cat, new CatalogueLoadOptions());
        double medianArcsec = Median(plain.Rows.ThetaRad!) * SizeTest.Foundation.Angles.AngleUnits.ArcsecPerRadian;
        Assert.InRange(medianArcsec, 0.05, 5);
        Assert.Empty(plain.Mapping.Warnings);

        var outDir = Path.Combine(_dir, "out");
        var (exit, _, err) = CliRunner.Run(["fit", cat, "--col", "theta=theta_arcsec:deg", .. HardeningData.Quick, "--out", outDir]);
        Assert.Equal(0, exit); // a warning, not a refusal: the user may know better
        string expected = $"the median angular size of theta column 'theta_arcsec' is {(medianArcsec * 3600).ToString("G4", CultureInfo.InvariantCulture)} arcsec when read in deg (given), above 600 arcsec (10 arcmin)";
        Assert.Contains("sizetest: warning: " + expected, err);
        Assert.Contains(Notes(outDir), n => n.StartsWith("catalogue: warning: " + expected, StringComparison.Ordinal));

        // The error column (mapped without a unit of its own) ends up in the value's unit: σθ/θ is 0.05 as written in the file.
        var deg = CatalogueLoader.Load(cat, new CatalogueLoadOptions { Mapping = new ColumnMapping { Assignments =
            [new ColumnAssignment(ColumnRole.Theta, "theta_arcsec", "deg"), new ColumnAssignment(ColumnRole.ThetaErr, "theta_err_arcsec")] } });
        Assert.Equal("deg", deg.Mapping.Roles[ColumnRole.ThetaErr].Unit);
        for (int i = 0; i < deg.Rows.Count; i++)
            Assert.Equal(0.05, deg.Rows.ThetaErrRad![i] / deg.Rows.ThetaRad![i], 12); // CatalogueText writes err = 0.05 θ; relative 1e-12
    }

    [Fact]
    public void SizesBelowTenMicroArcsecondsWarn()
    {
        var cat = Catalogue("tiny.csv", "z,theta\n0.5,1e-7\n1.0,2e-7\n1.5,3e-7\n");
        var load = CatalogueLoader.Load(cat, new CatalogueLoadOptions());
        var w = Assert.Single(load.Mapping.Warnings);
        Assert.Equal("the median angular size of theta column 'theta' is 2E-07 arcsec when read in arcsec (default; the column has no unit), below 1E-05 arcsec (10 µas), smaller than any measured size; the file's median value is 2E-07; check the unit ({col} theta=theta:UNIT)", w); // the CLI writes {col} as --col
    }

    [Fact]
    public void RepeatedColumnNamesWarnInTextAndVoTable()
    {
        var csv = Catalogue("dup.csv", "id,z,theta,theta\na,0.5,0.3,0.4\nb,1.0,0.2,0.5\n");
        const string expected = "1 column repeats the name of an earlier column (column 4 'theta' is read as 'theta_2'); map such a column by its new name";
        var load = CatalogueLoader.Load(csv, new CatalogueLoadOptions());
        Assert.Equal(["id", "z", "theta", "theta_2"], load.Columns.Select(c => c.Name));
        Assert.Equal(expected, Assert.Single(load.Mapping.Warnings));
        Assert.DoesNotContain(load.LayoutNotes, n => n.Contains("repeats"));
        var (exit, outText, err) = CliRunner.Run(["inspect", csv]);
        Assert.Equal(0, exit);
        Assert.Contains("  warning: " + expected, outText);

        var outDir = Path.Combine(_dir, "dupout");
        var fit = CliRunner.Run(["fit", Catalogue("dup40.csv", DuplicateTheta(HardeningData.CatalogueText(40))), "--col", "z=z", "--col", "theta=theta_arcsec", .. HardeningData.Quick, "--out", outDir]);
        Assert.True(fit.Exit == 0, fit.Err);
        Assert.Contains("sizetest: warning: 1 column repeats the name of an earlier column (column 7 'theta_arcsec' is read as 'theta_arcsec_2')", fit.Err);
        Assert.Contains(Notes(outDir), n => n.Contains("column 7 'theta_arcsec' is read as 'theta_arcsec_2'", StringComparison.Ordinal));

        var vot = Catalogue("dup.vot", "<?xml version=\"1.0\"?>\n<VOTABLE version=\"1.4\"><RESOURCE><TABLE><FIELD name=\"z\" datatype=\"double\"/><FIELD name=\"theta\" datatype=\"double\"/>"
            + "<FIELD name=\"theta\" datatype=\"double\"/><FIELD name=\"theta\" datatype=\"double\"/><DATA><TABLEDATA><TR><TD>0.5</TD><TD>0.3</TD><TD>0.4</TD><TD>0.6</TD></TR></TABLEDATA></DATA></TABLE></RESOURCE></VOTABLE>\n");
        var v = CatalogueLoader.Load(vot, new CatalogueLoadOptions());
        Assert.Equal("2 columns repeat the names of an earlier column (column 3 'theta' is read as 'theta_2', and so on); map such a column by its new name", Assert.Single(v.Mapping.Warnings));
    }

    [Fact]
    public void InspectCountsNullsAmongTheAcceptedRowsOnly()
    {
        // Row 3 has no z (rejected), row 4 a negative size (rejected, z = 1.0): accepted z are 0.5 and 2.0.
        var cat = Catalogue("nz.csv", "id,z,theta\na,0.5,0.3\nb,,0.2\nc,1.0,-1\nd,2.0,0.4\n");
        var load = CatalogueLoader.Load(cat, new CatalogueLoadOptions());
        var z = load.Statistics().Single(s => s.Role == ColumnRole.Z);
        Assert.Equal((2, 0L, 0.5, 1.25, 2.0), (z.Count, z.NullCount, z.Min, z.Median, z.Max)); // median of {0.5, 2} by hand
        var (exit, outText, _) = CliRunner.Run(["inspect", cat]);
        Assert.Equal(0, exit);
        Assert.Matches(@"\n  z +z +2 +0 +0\.5 +1\.25 +2\n", outText.Replace("\r", ""));
        Assert.Contains("1 missing value (first: row 3, column 'z'", outText);
    }

    private static string DuplicateTheta(string csv)
    {
        // Appends a copy of the theta_arcsec column under the same name (column 7).
        var lines = csv.Split('\n');
        for (int i = 0; i < lines.Length; i++)
        {
            if (lines[i].Length == 0 || lines[i].StartsWith('#')) continue;
            var f = lines[i].Split(',');
            lines[i] += "," + f[2];
        }
        return string.Join('\n', lines);
    }

    private static double Median(double[] v)
    {
        var s = v.OrderBy(x => x).ToArray();
        return s.Length % 2 == 1 ? s[s.Length / 2] : 0.5 * (s[s.Length / 2 - 1] + s[s.Length / 2]);
    }
}
