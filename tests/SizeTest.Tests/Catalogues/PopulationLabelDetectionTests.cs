using System.Globalization;
using System.Text;
using SizeTest.Catalogues;
using SizeTest.Foundation.Errors;
using SizeTest.Studies;
using Xunit;

namespace SizeTest.Tests.Catalogues;

/// <summary>
/// Columns that look like population labels (PopulationLabelColumns): suggested with their labels and counts over the
/// accepted rows when the group column was not given; never an id-like column, a column mapped to another role, or one
/// with a single label, more than eight labels or a thinly filled label. The fixtures are written here row by row, so
/// every count is a closed form of the row index (row i of n has label i mod k: n/k rows each when k divides n).
/// </summary>
public sealed class PopulationLabelDetectionTests
{
    // n rows with z = 0.1 + i/n, theta = 1 and the extra columns' cells of row i.
    private static string Csv(int n, string header, Func<int, string> cells)
    {
        var sb = new StringBuilder($"z,theta,{header}\n");
        for (int i = 0; i < n; i++)
            sb.Append(CultureInfo.InvariantCulture, $"{0.1 + (double)i / n:R},1,{cells(i)}\n");
        return sb.ToString();
    }

    private static CatalogueLoad Load(string text, params string[] cols)
    {
        using var t = new TempFiles();
        return CatalogueLoader.Load(t.Write("c.csv", text), new CatalogueLoadOptions { Mapping = ColumnMapping.FromOptions(cols) });
    }

    private static readonly string[] Morph = ["E", "S0", "Sp"];

    [Fact]
    public void ATextTypeColumnIsSuggestedWithItsLabelsAndCounts()
    {
        var load = Load(Csv(90, "morph", i => Morph[i % 3]));
        var p = Assert.Single(load.PopulationLabels);
        Assert.Equal("morph", p.Column);
        Assert.Equal("named like a population label", p.Reason);
        Assert.Equal(new[] { ("E", 30L), ("S0", 30L), ("Sp", 30L) }, p.Labels); // 90 rows, i mod 3: 30 each
        Assert.Equal(0, p.Unlabelled);
        Assert.Equal("possible populations: column 'morph' (named like a population label) holds 3 labels among the accepted rows: "
                     + "'E' 30, 'S0' 30, 'Sp' 30; they could be fitted as separate populations (each with its own nuisance parameters, "
                     + "the world model shared) with {group} morph", p.Note);
        Assert.Equal(["group"], new SettingProblem(p.Note).Settings);
        Assert.Contains(p.Note, load.DetectionReport);
        // A study spells the setting as its key.
        Assert.EndsWith("with survey.group morph", StudySettingKeys.Text(p.Note));
    }

    [Theory]
    [InlineData("galaxy_type")]
    [InlineData("morph_type")]
    [InlineData("MorphType")]
    [InlineData("class")]
    [InlineData("pop")]
    [InlineData("population")] // also detected as the group role (a common name), counted from the sample
    [InlineData("group")]      // named by role
    [InlineData("sample")]
    [InlineData("is_quiescent")]
    [InlineData("SFflag")]
    public void ClassAndTypeNamesAreRecognised(string name)
    {
        var load = Load(Csv(60, name, i => (i % 2).ToString(CultureInfo.InvariantCulture)));
        var p = Assert.Single(load.PopulationLabels);
        Assert.Equal(name, p.Column);
        Assert.Equal(new[] { ("0", 30L), ("1", 30L) }, p.Labels); // 60 rows, i mod 2
    }

    [Fact]
    public void AnSfFlagOfWholeNumbersIsSuggestedAndEmptyCellsAreCountedApart()
    {
        // Rows 0–59: i mod 2; rows 60–64 empty (not rejected: the flag is not a mapped role).
        var load = Load(Csv(65, "sf_flag", i => i < 60 ? (i % 2).ToString(CultureInfo.InvariantCulture) : ""));
        Assert.Equal(65, load.Accepted);
        var p = Assert.Single(load.PopulationLabels);
        Assert.Equal(new[] { ("0", 30L), ("1", 30L) }, p.Labels);
        Assert.Equal(5, p.Unlabelled);
        Assert.Contains("(5 accepted rows have no label; a group fit would reject them)", p.Note);
    }

    [Fact]
    public void OnlyAcceptedRowsAreCounted()
    {
        // Rows with i mod 4 = 3 have z = -1 and are rejected: of 80 rows, 60 accepted, labels i mod 2 among them: 0 at
        // i mod 4 ∈ {0, 2} (40 rows), 1 at i mod 4 = 1 (20 rows).
        var sb = new StringBuilder("z,theta,type\n");
        for (int i = 0; i < 80; i++) sb.Append(CultureInfo.InvariantCulture, $"{(i % 4 == 3 ? -1 : 0.5)},1,{i % 2}\n");
        var load = Load(sb.ToString());
        Assert.Equal(60, load.Accepted);
        Assert.Equal(new[] { ("0", 40L), ("1", 20L) }, Assert.Single(load.PopulationLabels).Labels);
    }

    [Theory]
    [InlineData("type_id", 3)]  // id-like
    [InlineData("objid", 3)]
    [InlineData("flags", 3)]    // no class or type word (a quality bitmask)
    [InlineData("morph", 1)]    // one label is one population
    [InlineData("morph", 9)]    // more than eight
    public void NoSuggestionForIdsOtherNamesOneLabelOrTooMany(string name, int labels)
    {
        var load = Load(Csv(9 * 30, name, i => "L" + (i % labels).ToString(CultureInfo.InvariantCulture)));
        Assert.Empty(load.PopulationLabels);
    }

    [Fact]
    public void EightLabelsAreTheMost()
    {
        var load = Load(Csv(8 * 20, "type", i => (i % 8).ToString(CultureInfo.InvariantCulture)));
        Assert.Equal(8, Assert.Single(load.PopulationLabels).Labels.Count); // 160 rows, 20 per label: the floor exactly
    }

    [Fact]
    public void AThinlyFilledLabelIsNotSuggested()
    {
        // 19 rows of 'S0' (one below the floor of 20), 40 of 'E'.
        var load = Load(Csv(59, "morph", i => i < 19 ? "S0" : "E"));
        Assert.Empty(load.PopulationLabels);
    }

    [Fact]
    public void ARealColumnWithFractionsIsNotALabel()
    {
        var load = Load(Csv(60, "sample", i => i % 2 == 0 ? "0.5" : "1.5"));
        Assert.Empty(load.PopulationLabels);
    }

    [Fact]
    public void AColumnMappedToAnotherRoleOrKeptIsNotSuggested()
    {
        // 'class' would be a candidate, but it is the band; 'type' is kept as a numeric column.
        var text = Csv(60, "class,type", i => $"{(i % 2 == 0 ? "g" : "r")},{i % 2}");
        Assert.Contains(Load(text).PopulationLabels, p => p.Column == "class"); // both candidates when unmapped
        var load = Load(text, "band=class");
        Assert.Equal("class", load.Mapping.Roles[ColumnRole.Band].ColumnName);
        Assert.DoesNotContain(load.PopulationLabels, p => p.Column == "class");
        using var t = new TempFiles();
        var kept = CatalogueLoader.Load(t.Write("k.csv", text), new CatalogueLoadOptions { Mapping = ColumnMapping.FromOptions([], keep: ["type"]) });
        Assert.DoesNotContain(kept.PopulationLabels, p => p.Column == "type");
    }

    [Fact]
    public void NothingIsSuggestedWhenTheGroupColumnIsGiven()
    {
        var text = Csv(60, "morph,sf_flag", i => $"{Morph[i % 3]},{i % 2}");
        Assert.Equal(2, Load(text).PopulationLabels.Count);
        Assert.Empty(Load(text, "group=morph").PopulationLabels);
    }

    [Fact]
    public void AVoTableColumnIsSuggestedByItsUcd()
    {
        // 't' (int, UCD src.morph.type) and 'kind' (char, UCD src.class;meta.main) are labels by UCD; 'src' (meta.id) is not,
        // though its name would not say so anyway, and 'cls' with UCD src.class.starGalaxy is a continuous value (>8 values).
        var rows = new StringBuilder();
        for (int i = 0; i < 60; i++)
            rows.Append(CultureInfo.InvariantCulture,
                $"<TR><TD>{0.2 + i / 100.0:R}</TD><TD>0.8</TD><TD>{i % 3 - 1}</TD><TD>{(i < 25 ? "SF" : "Q")}</TD><TD>{i % 2}</TD><TD>{i / 60.0:R}</TD></TR>\n");
        using var t = new TempFiles();
        var p = t.WriteVoTable("ucd.vot", """
              <FIELD name="z" datatype="double" ucd="src.redshift"/>
              <FIELD name="r" datatype="double" unit="arcsec" ucd="phys.angSize;src"/>
              <FIELD name="t" datatype="int" ucd="src.morph.type"/>
              <FIELD name="kind" datatype="char" arraysize="*" ucd="src.class;meta.main"/>
              <FIELD name="src" datatype="int" ucd="meta.id;src.class"/>
              <FIELD name="cls" datatype="float" ucd="src.class.starGalaxy"/>
            """, rows.ToString());
        var load = CatalogueLoader.Load(p);
        Assert.Equal(60, load.Accepted);
        // 'kind' is also the detected group column (UCD src.class, counted from the sample); 't' is read beside the roles.
        Assert.Equal(["kind", "t"], load.PopulationLabels.Select(l => l.Column).Order(StringComparer.Ordinal));
        var morph = load.PopulationLabels.Single(l => l.Column == "t");
        Assert.Equal("UCD src.morph.type", morph.Reason);
        Assert.Equal(new[] { ("-1", 20L), ("0", 20L), ("1", 20L) }, morph.Labels); // 60 rows, i mod 3 − 1
        var kind = load.PopulationLabels.Single(l => l.Column == "kind");
        Assert.Equal("UCD src.class;meta.main", kind.Reason);
        Assert.Equal(new[] { ("Q", 35L), ("SF", 25L) }, kind.Labels); // rows 0–24 SF, 25–59 Q
    }
}
