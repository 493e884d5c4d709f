using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using Xunit;

namespace SizeTest.Tests.Catalogues;

public sealed class CsvLoadTests
{
    [Fact]
    public void RoleNamedCsvNeedsNoMappingAndConvertsArcsecToRadians()
    {
        using var t = new TempFiles();
        var p = t.Write("a.csv", "# synthetic test table\nid,z,theta,theta_err,mu,mu_err\nA,0.5,1.5,0.1,21.0,0.05\n\"B, quoted\",1.25,0.75,0.05,22.5,0.1\n");
        var load = CatalogueLoader.Load(p);
        Assert.Equal(2, load.RowsRead);
        Assert.Equal(2, load.Accepted);
        Assert.Equal(0, load.Rejected);
        var s = load.Rows;
        Assert.Equal(new[] { "A", "B, quoted" }, s.Id);
        Assert.Equal(new[] { 0.5, 1.25 }, s.Z);
        // 1 arcsec = π/648000 rad exactly (definition: 180° = π rad, 1° = 3600″).
        Rel.Equal(1.5 * Math.PI / 648000.0, s.ThetaRad![0]);
        Rel.Equal(0.05 * Math.PI / 648000.0, s.ThetaErrRad![1]);
        Assert.Equal(new[] { 21.0, 22.5 }, s.Mu);
        Assert.Equal(new long[] { 3, 4 }, s.SourceRows.ToArray()); // file lines: comment 1, header 2, data 3 and 4
        Assert.Contains(load.DetectionReport, l => l.StartsWith("theta") && l.Contains("named by role"));
        Assert.Contains(load.DetectionReport, l => l.Contains("[arcsec, default"));
    }

    [Fact]
    public void BadRowsGoToTheRejectLogWithLineColumnAndReason()
    {
        using var t = new TempFiles();
        var p = t.Write("b.csv", string.Join("\n",
            "z,theta,theta_err,mu",
            "0.5,1.0,0.1,21",      // line 2 ok
            ",1.0,0.1,21",         // line 3 missing z
            "-0.1,1.0,0.1,21",     // line 4 z <= 0
            "0.5,0,0.1,21",        // line 5 non-positive size
            "0.5,1.0,-0.1,21",     // line 6 negative error
            "0.5,1.0,0.1,99",      // line 7 out of range (sentinel)
            "0.5,abc,0.1,21",      // line 8 unparsable
            "0.5,1.0,0.1",         // line 9 wrong field count
            "# a comment",         // line 10
            "   ",                 // line 11: blank, not a row
            "0.7,2.0,0.2,22") + "\n");
        var load = CatalogueLoader.Load(p);
        Assert.Equal(9, load.RowsRead);
        Assert.Equal(2, load.Accepted);
        Assert.Equal(7, load.Rejected);
        Assert.Equal(load.RowsRead, load.Accepted + load.Rejected);
        var e = load.RejectLog.Entries;
        Assert.Equal((3L, "z", RejectReason.MissingValue), (e[0].Row, e[0].Column, e[0].Reason));
        Assert.Equal((4L, RejectReason.NonPositiveRedshift), (e[1].Row, e[1].Reason));
        Assert.Equal((5L, "theta", RejectReason.NonPositiveSize), (e[2].Row, e[2].Column, e[2].Reason));
        Assert.Equal((6L, RejectReason.NegativeError), (e[3].Row, e[3].Reason));
        Assert.Equal((7L, RejectReason.OutOfRange), (e[4].Row, e[4].Reason));
        Assert.Equal((8L, "abc", RejectReason.Unparsable), (e[5].Row, e[5].Value, e[5].Reason));
        Assert.Equal((9L, RejectReason.Unparsable), (e[6].Row, e[6].Reason));
        Assert.Equal(new long[] { 2, 12 }, load.Rows.SourceRows.ToArray());
        var csv = load.RejectLog.ToCsv();
        Assert.StartsWith("row,column,value,reason,detail\n3,z,,missing value,", csv);
    }

    [Fact]
    public void APhotometricRedshiftAtOrBelowZeroIsRejectedWithTheReasonItCannotBeIntegrated()
    {
        // A photo-z catalogue's z can reach 0 or below (z_err > 0). Distances and K-corrections are taken at the catalogue z
        // (ObservablesBuilder), where z ≤ 0 has no distance, so the row is rejected, and the detail says why for a photo-z.
        using var t = new TempFiles();
        var p = t.Write("pz.csv", "z,z_err,theta,theta_err\n0.5,0.05,1.0,0.1\n-0.02,0.05,1.0,0.1\n0,0.05,1.0,0.1\n");
        var load = CatalogueLoader.Load(p);
        Assert.Equal((3L, 1L, 2L), (load.RowsRead, load.Accepted, load.Rejected));
        Assert.All(load.RejectLog.Entries, e => Assert.Equal(RejectReason.NonPositiveRedshift, e.Reason));
        Assert.All(load.RejectLog.Entries, e => Assert.Contains("a photometric redshift too", e.Detail, StringComparison.Ordinal));
        var spec = CatalogueLoader.Load(t.Write("sz.csv", "z,theta\n0.5,1.0\n0,1.0\n"));
        Assert.Equal("z must be > 0", spec.RejectLog.Entries.Single().Detail);
    }

    [Fact]
    public void RejectLogIsWrittenAtomicallyAndNotOverwrittenWithoutForce()
    {
        using var t = new TempFiles();
        var p = t.Write("c.csv", "z,theta\n0,1\n");
        var load = CatalogueLoader.Load(p);
        var log = t.PathOf("rejects.csv");
        load.RejectLog.WriteCsv(log);
        Assert.Contains("z <= 0", File.ReadAllText(log));
        Assert.Throws<InputException>(() => load.RejectLog.WriteCsv(log));
        load.RejectLog.WriteCsv(log, force: true);
    }

    [Fact]
    public void ExplicitMappingWithUnitsRelativeErrorsAndKeptColumns()
    {
        using var t = new TempFiles();
        var p = t.Write("d.tsv", "name\tzspec\tR_maj\te_R\tKcorr\n# comment\nG1\t1.0\t250\t0.1\t0.3\n");
        var mapping = ColumnMapping.FromOptions(["theta=R_maj:mas", "theta_err=e_R:frac", "id=name"], "petrosian", ["Kcorr"]);
        var load = CatalogueLoader.Load(p, new CatalogueLoadOptions { Mapping = mapping });
        var s = load.Rows;
        Assert.Equal(1, s.Count);
        Assert.Equal(1.0, s.Z[0]); // detected from the common name 'zspec'
        Rel.Equal(250 * Math.PI / 648000e3, s.ThetaRad![0]); // 1 mas = π/648000 × 10⁻³ rad
        Rel.Equal(0.1 * 250 * Math.PI / 648000e3, s.ThetaErrRad![0]); // relative error × θ
        Assert.Equal(0.3, s.ExtraColumns["Kcorr"][0]);
        Assert.Equal(SizeKind.Petrosian, s.SizeDefinition.Kind);
        Assert.Contains(load.DetectionReport, l => l.StartsWith("z") && l.Contains("zspec") && l.Contains("common name"));
        Assert.Contains(load.DetectionReport, l => l.StartsWith("theta ") && l.Contains("given with {col}"));
    }

    [Fact]
    public void MissingRedshiftColumnIsOneInputExceptionNamingTheFile()
    {
        using var t = new TempFiles();
        var p = t.Write("e.csv", "a,b\n1,2\n");
        var ex = Assert.Throws<InputException>(() => CatalogueLoader.Load(p));
        Assert.Contains("e.csv", ex.Message);
        Assert.Contains("{col} z=", ex.SettingProblems.Single().Template); // the CLI writes {col} as --col
    }

    [Fact]
    public void UnknownMappedColumnIsAnInputException()
    {
        using var t = new TempFiles();
        var p = t.Write("f.csv", "z,theta\n1,2\n");
        var ex = Assert.Throws<InputException>(() => CatalogueLoader.Load(p, new CatalogueLoadOptions { Mapping = ColumnMapping.FromOptions(["theta=Rx"]) }));
        Assert.Contains("'Rx'", ex.Message);
    }

    [Fact]
    public void HeaderUnitsInParenthesesAreUsedWhenTheyAreUnits()
    {
        using var t = new TempFiles();
        // "theta (mas)" was a column of that whole name with no unit: mapped by hand it was read in arcsec, 1000× too large.
        var p = t.Write("p.csv", "z,Re (mas),e_Re(mas),mu (mag/arcsec2),mag(r),r_e(kpc)\n1,500,20,22.5,21.0,4.0\n");
        var load = CatalogueLoader.Load(p);
        Assert.Equal(["z", "Re", "e_Re", "mu", "mag(r)", "r_e"], load.Columns.Select(c => c.Name));   // '(r)' is a band, not a unit
        Assert.Equal([null, "mas", "mas", "mag/arcsec2", null, "kpc"], load.Columns.Select(c => c.Unit));
        Rel.Equal(0.5 * Math.PI / 648000.0, load.Rows.ThetaRad![0]);     // 500 mas = 0.5″; 1″ = π/648000 rad (definition)
        Rel.Equal(0.02 * Math.PI / 648000.0, load.Rows.ThetaErrRad![0]);
        Assert.Contains(load.DetectionReport, l => l.Contains("[mas, from the file]"));
        // A --col naming the header as written, unit included, finds the column (and takes the unit from the file).
        var byHeader = CatalogueLoader.Load(p, new CatalogueLoadOptions { Mapping = ColumnMapping.FromOptions(["theta=Re (mas)", "theta_err=e_Re (mas)"]) });
        Rel.Equal(0.5 * Math.PI / 648000.0, byHeader.Rows.ThetaRad![0]);
        // r_e in kpc is a physical size: passed over for theta, naming its unit.
        var onlyKpc = CatalogueLoader.Load(t.Write("k.csv", "z,r_e(kpc)\n1,4.0\n"));
        Assert.Null(onlyKpc.Rows.ThetaRad);
        Assert.Contains(onlyKpc.DetectionReport, l => l.Contains("unit 'kpc', which is not an angle"));
    }

    [Fact]
    public void AUnitsLineAndADashedRuleUnderTheHeaderAreReadAsSuch()
    {
        using var t = new TempFiles();
        // The layout of a VizieR tab-separated download: names, units, a rule of dashes, then the data. Before, the units
        // line and the rule were two rejected rows, every column was text, and Re in mas was read as arcsec.
        var p = t.Write("vizier.tsv", "#\n#   VizieR Astronomical Server\n#Column\tRe\t(F6.1)\tEffective radius\n"
            + "ID\tz\tRe\te_Re\n\t\tmas\tmas\n--------\t------\t------\t-----\nG1\t0.5000\t412.0\t30.0\nG2\t1.2000\t210.0\t20.0\n");
        var load = CatalogueLoader.Load(p);
        Assert.Equal(2, load.RowsRead);
        Assert.Equal(2, load.Accepted);
        Assert.Equal([ColumnKind.Text, ColumnKind.Real, ColumnKind.Real, ColumnKind.Real], load.Columns.Select(c => c.Kind));
        Assert.Equal([null, null, "mas", "mas"], load.Columns.Select(c => c.Unit));
        Rel.Equal(0.412 * Math.PI / 648000.0, load.Rows.ThetaRad![0]);     // 412 mas = 0.412″; 1″ = π/648000 rad (definition)
        Assert.Equal(new long[] { 7, 8 }, load.Rows.SourceRows.ToArray());  // file lines
        Assert.Contains(load.LayoutNotes, n => n.Contains("units: line 5", StringComparison.Ordinal));
        Assert.Contains(load.LayoutNotes, n => n.Contains("line 6", StringComparison.Ordinal) && n.Contains("dashes", StringComparison.Ordinal));

        // A rule alone under a whitespace header; and a units line of known units without a rule.
        var ws = CatalogueLoader.Load(t.Write("ws.dat", "name  z    Re\n----  ---  --\nG1    0.5  0.4\n"));
        Assert.Equal((1L, 1L), (ws.RowsRead, ws.Accepted));
        var csv = CatalogueLoader.Load(t.Write("u.csv", "id,z,theta,theta_err\n,,arcmin,arcmin\nG1,0.5,0.01,0.001\n"));
        Assert.Equal((1L, 1L), (csv.RowsRead, csv.Accepted));
        Rel.Equal(0.01 * Math.PI / 10800.0, csv.Rows.ThetaRad![0]);          // 1′ = π/10800 rad (definition)

        // A second line holding a number is data, not units.
        var data = CatalogueLoader.Load(t.Write("d.csv", "id,z,theta\nG1,0.5,0.4\n"));
        Assert.Equal(1L, data.Accepted);
        Assert.Null(data.Columns[2].Unit);
    }

    [Fact]
    public void HeaderUnitsInBracketsAreUsed()
    {
        using var t = new TempFiles();
        var p = t.Write("g.csv", "z,theta [arcmin]\n1,0.5\n");
        var load = CatalogueLoader.Load(p);
        Rel.Equal(0.5 * Math.PI / 10800.0, load.Rows.ThetaRad![0]); // 1′ = π/10800 rad exactly
        Assert.Contains(load.DetectionReport, l => l.Contains("[arcmin, from the file]"));
    }

    [Theory]
    // Writers that end every line with the delimiter (a print loop writing "value," per column): the empty field after the
    // last column holds nothing, so the rows are read, not rejected for "8 fields, the header has 7".
    [InlineData("z,theta,theta_err\n0.5,1.0,0.1,\n1.5,0.5,0.05,\n0.7,2.0,0.2\n")]   // data lines end with ','
    [InlineData("z,theta,theta_err,\n0.5,1.0,0.1\n1.5,0.5,0.05\n0.7,2.0,0.2\n")]     // the header line ends with ','
    [InlineData("z;theta;theta_err;\n0.5;1.0;0.1;\n1.5;0.5;0.05;\n0.7;2.0;0.2;\n")]  // both, with ';'
    public void AnEmptyFieldAfterTheLastColumnIsNoColumn(string text)
    {
        using var t = new TempFiles();
        var load = CatalogueLoader.Load(t.Write("t.csv", text));
        Assert.Equal(3, load.RowsRead);
        Assert.Equal(3, load.Accepted);
        Assert.Equal(["z", "theta", "theta_err"], load.Columns.Select(c => c.Name));
        Assert.Equal(new[] { 0.5, 1.5, 0.7 }, load.Rows.Z);
        Rel.Equal(0.1 * Math.PI / 648000.0, load.Rows.ThetaErrRad![0]);    // 1″ = π/648000 rad (definition)
    }

    [Fact]
    public void AnExtraFieldThatHoldsAValueIsStillRejected()
    {
        using var t = new TempFiles();
        var load = CatalogueLoader.Load(t.Write("x.csv", "z,theta\n0.5,1.0,7\n0.6,1.0, \n0.7,1.0,,\n"));
        Assert.Equal(3, load.RowsRead);
        Assert.Equal([2L, 4L], load.RejectLog.Entries.Select(e => e.Row));   // '7' is a value; two trailing fields are not one delimiter
        Assert.All(load.RejectLog.Entries, e => Assert.Equal(RejectReason.Unparsable, e.Reason));
    }

    [Fact]
    public void WhitespaceTableWithHeaderLineQuotedNamesAndNulls()
    {
        using var t = new TempFiles();
        var p = t.Write("w.dat", "# synthetic\n  name     z      Re[arcsec]\n\"NGC 1\"  0.01   12.5\n  G2      NaN    1.0\n  G3      0.2    0.5   extra\n\tG4\t0.3\t0.25\n");
        var load = CatalogueLoader.Load(p, new CatalogueLoadOptions { Mapping = ColumnMapping.FromOptions(["id=name", "theta=Re"]) });
        Assert.Contains("delimiter: runs of spaces/tabs (detected)", load.LayoutNotes);
        Assert.Equal(4, load.RowsRead);
        Assert.Equal(new[] { "NGC 1", "G4" }, load.Rows.Id);
        Assert.Equal(new long[] { 3, 6 }, load.Rows.SourceRows.ToArray());
        Assert.Equal(new[] { (4L, RejectReason.NonFinite), (5L, RejectReason.Unparsable) }, load.RejectLog.Entries.Select(e => (e.Row, e.Reason))); // NaN is non-finite, not null (issue 14 point 10)
        Rel.Equal(12.5 * Math.PI / 648000, load.Rows.ThetaRad![0]); // unit from the header "Re[arcsec]"
    }

    [Fact]
    public void AFileWithoutHeaderButWithTextIdsIsNotMistakenForAHeader()
    {
        using var t = new TempFiles();
        var p = t.Write("nh.csv", "G1,0.5,1.2\nG2,0.6,1.1\n");
        var load = CatalogueLoader.Load(p, new CatalogueLoadOptions { Mapping = ColumnMapping.FromOptions(["id=col1", "z=col2", "theta=col3"]) });
        Assert.Equal(2, load.Accepted);
        Assert.Contains(load.LayoutNotes, n => n.StartsWith("header: none"));
        var given = CatalogueLoader.Load(p, new CatalogueLoadOptions
        {
            Reader = new ReaderOptions { HasHeader = true },
            Mapping = ColumnMapping.FromOptions(["z=0.5"]),
        });
        Assert.Equal(1, given.RowsRead);
    }

    [Fact]
    public void VanDerWel2014Table5ReadsAsAWhitespaceCatalogueWithHeaderFromComment()
    {
        // Real table: van der Wel et al. 2014, ApJ 788, 28, Table 5 (V-band luminosity bins); 21 data rows (lines 8–28; line 29 is empty).
        var p = ReferenceFiles.PathOf("van_der_Wel_2014_ApJ_788_28_Table5_VLuminosity.txt");
        var mapping = ColumnMapping.FromOptions([], keep: ["log10Size_L*"]);
        var load = CatalogueLoader.Load(p, new CatalogueLoadOptions { Mapping = mapping });
        Assert.Equal(CatalogueFormat.Text, load.Format);
        Assert.Equal(21, load.RowsRead); // counted from the file
        Assert.Equal(21, load.Accepted);
        Assert.Equal(new[] { "z", "log10L*", "log10Size_L*", "log10Size_L*_high", "log10Size_L*_low" }, load.Columns.Select(c => c.Name));
        Assert.Equal(0.25, load.Rows.Z[0]);
        Assert.Equal(2.25, load.Rows.Z[^1]);
        Assert.Equal(0.37, load.Rows.ExtraColumns["log10Size_L*"][0]); // first data row of the table
        Assert.Equal(0.45, load.Rows.ExtraColumns["log10Size_L*"][^1]); // last data row
        Assert.Equal(8L, load.Rows.SourceRows[0]);
        Assert.Contains(load.LayoutNotes, n => n.Contains("comment line 7"));
    }
}
