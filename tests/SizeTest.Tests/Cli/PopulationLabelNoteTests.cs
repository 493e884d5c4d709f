using System.Globalization;
using System.Text;
using System.Text.Json;
using SizeTest.Foundation.Angles;
using SizeTest.Tests.Catalogues;
using SizeTest.Tests.Inference;
using Xunit;

namespace SizeTest.Tests.Cli;

/// <summary>
/// inspect and fit name a column that looks like a population label, with its labels and counts, and say it could be
/// fitted as separate populations with --group; not when --group is given, and not for an id-like column. The catalogue is
/// a mock (EdS, the MockCatalogue defaults) with a morphology column 'morph' of label i mod 3 on row i (E, S0, Sp) and an
/// id-like 'type_id' of the same labels, so the counts are n/3 each.
/// </summary>
public sealed class PopulationLabelNoteTests
{
    private const string MorphNote = "possible populations: column 'morph' (named like a population label) holds 3 labels among the accepted rows: "
        + "'E' 40, 'S0' 40, 'Sp' 40; they could be fitted as separate populations (each with its own nuisance parameters, the world model shared) with --group morph";

    private static string Catalogue(TempFiles t, int n = 120)
    {
        var obs = MockCatalogue.Draw(TestWorldModels.Eds.Create(new Dictionary<string, double>()), n, new MockCatalogue.Truth(), 5);
        string[] morph = ["E", "S0", "Sp"];
        var sb = new StringBuilder("id,z,theta,theta_err,morph,type_id\n");
        for (int i = 0; i < obs.Count; i++)
        {
            double th = Math.Exp(obs.LnTheta![i]) * AngleUnits.ArcsecPerRadian;
            sb.Append(CultureInfo.InvariantCulture, $"g{i},{obs.Z[i]:R},{th:R},{0.05 * th:R},{morph[i % 3]},{i % 3}\n");
        }
        return t.Write("morph.csv", sb.ToString());
    }

    [Fact]
    public void InspectNamesTheColumnItsLabelsAndTheGroupOption()
    {
        using var t = new TempFiles();
        var (exit, output, err) = CliRunner.Run("inspect", Catalogue(t));
        Assert.True(exit == 0, err);
        Assert.Contains("  " + MorphNote + "\n", output.ReplaceLineEndings("\n"));
        Assert.DoesNotContain("column 'type_id'", output);
        Assert.DoesNotContain("{group}", output);
    }

    [Fact]
    public void InspectJsonOfAVoTableWithAClassUcdCarriesTheNote()
    {
        // 'pop' (UCD src.class, detected as the group column) holds labels 'blue' (rows 0–29) and 'red' (30–59).
        var rows = new StringBuilder();
        for (int i = 0; i < 60; i++)
            rows.Append(CultureInfo.InvariantCulture, $"<TR><TD>{0.3 + i / 100.0:R}</TD><TD>0.6</TD><TD>{(i < 30 ? "blue" : "red")}</TD></TR>\n");
        using var t = new TempFiles();
        var p = t.WriteVoTable("class.vot", """
              <FIELD name="z" datatype="double" ucd="src.redshift"/>
              <FIELD name="r" datatype="double" unit="arcsec" ucd="phys.angSize;src"/>
              <FIELD name="colour_class" datatype="char" arraysize="*" ucd="src.class"/>
            """, rows.ToString());
        var (exit, output, err) = CliRunner.Run("inspect", p, "--format", "json");
        Assert.True(exit == 0, err);
        var detection = JsonDocument.Parse(output).RootElement.GetProperty("detection").EnumerateArray().Select(x => x.GetString()!).ToArray();
        Assert.Contains("possible populations: column 'colour_class' (UCD src.class) holds 2 labels among the accepted rows: 'blue' 30, 'red' 30; "
                        + "they could be fitted as separate populations (each with its own nuisance parameters, the world model shared) with --group colour_class", detection);
    }

    [Fact]
    public void FitNotesTheColumnInTheTableAndResultsJsonUnlessGroupIsGiven()
    {
        using var t = new TempFiles();
        var cat = Catalogue(t);
        var outDir = t.PathOf("out");
        var (exit, stdout, err) = CliRunner.Run("fit", cat, "--out", outDir, "--models", "eds", "--cv-folds", "0", "--starts", "1");
        Assert.True(exit == 0, err);
        Assert.Contains("note: catalogue: " + MorphNote, stdout);
        using (var doc = JsonDocument.Parse(File.ReadAllText(Path.Combine(outDir, "results.json"))))
            Assert.Contains("catalogue: " + MorphNote, doc.RootElement.GetProperty("notes").EnumerateArray().Select(x => x.GetString()));

        var grouped = CliRunner.Run("fit", cat, "--out", t.PathOf("grouped"), "--models", "eds", "--cv-folds", "0", "--starts", "1", "--group", "morph");
        Assert.True(grouped.Exit == 0, grouped.Err);
        Assert.DoesNotContain("possible populations", grouped.Out);
        Assert.Contains("3 groups (E, S0, Sp)", grouped.Out);
    }

    [Fact]
    public void NoNoteWithoutALabelColumn()
    {
        using var t = new TempFiles();
        var cat = t.Write("plain.csv", string.Concat(Enumerable.Range(0, 60).Select(i => FormattableString.Invariant($"{0.2 + i / 100.0},{1 + i % 3},{i % 3}\n"))).Insert(0, "z,theta,flags\n"));
        var (exit, output, err) = CliRunner.Run("inspect", cat);
        Assert.True(exit == 0, err);
        Assert.DoesNotContain("possible populations", output);
    }
}
