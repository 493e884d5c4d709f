using System.Globalization;
using System.Text.Json;
using SizeTest.Cosmology;
using Xunit;

namespace SizeTest.Tests.Cli;

public sealed class PredictCommandTests
{
    private static readonly string[] Columns =
        ["z", "comoving_mpc", "transverse_comoving_mpc", "angular_diameter_mpc", "luminosity_mpc", "lookback_gyr", "theta_arcsec", "dimming_mag"];

    private static string[][] Csv(string text) => text.Trim().Split('\n').Select(l => l.TrimEnd('\r').Split(',')).ToArray();

    private static double Num(string s) => double.Parse(s, CultureInfo.InvariantCulture);

    [Fact]
    public void CsvHasTheContractColumnsAndModelValues()
    {
        var (exit, output, err) = CliRunner.Run("predict", "--model", "lcdm", "--z", "0.5,1,3", "--format", "csv");
        Assert.Equal(0, exit);
        Assert.Equal("", err);
        var rows = Csv(output);
        Assert.Equal(Columns, rows[0]);
        Assert.Equal(4, rows.Length);
        // Flat ΛCDM H0 = 70, Ωm = 0.3 at z = 1 (astropy 5.2.1, docs/science.md §2.2): D_C 3303.8288, D_A 1651.9144, D_L 6607.6576, t_L 7.71534.
        var z1 = rows[2];
        Assert.Equal(1.0, Num(z1[0]));
        Assert.Equal(3303.8288, Num(z1[1]), 3);
        Assert.Equal(3303.8288, Num(z1[2]), 3);
        Assert.Equal(1651.9144, Num(z1[3]), 3);
        Assert.Equal(6607.6576, Num(z1[4]), 3);
        Assert.Equal(7.71534, Num(z1[5]), 4);
        // θ(1 kpc) = 0.001 Mpc / D_A · 206264.806″ (common practice); dimming 10 log10 2 = 3.0103 mag (§2.7).
        Assert.Equal(0.001 / 1651.9144 * 206264.806, Num(z1[6]), 6);
        Assert.Equal(3.0103, Num(z1[7]), 4);
    }

    [Fact]
    public void SizeKpcScalesTheta()
    {
        var (exit, output, _) = CliRunner.Run("predict", "--z", "1", "--size-kpc", "10", "--format", "csv");
        Assert.Equal(0, exit);
        // θ(10 kpc, z = 1) = 1.24864″ for flat ΛCDM 0.3 (astropy 5.2.1, docs/science.md §2.6).
        Assert.Equal(1.24864, Num(Csv(output)[1][6]), 5);
    }

    [Fact]
    public void RangesAreInclusiveAndExact()
    {
        var (exit, output, _) = CliRunner.Run("predict", "--z", "0.1:3:0.1", "--format", "csv");
        Assert.Equal(0, exit);
        var z = Csv(output).Skip(1).Select(r => r[0]).ToArray();
        Assert.Equal(30, z.Length);
        Assert.Equal("0.1", z[0]);
        Assert.Equal("0.3", z[2]); // decimal stepping: not 0.30000000000000004
        Assert.Equal("3", z[^1]);
    }

    [Fact]
    public void StaticModelLeavesTransverseComovingEmptyAndUsesItsDimming()
    {
        var (exit, output, _) = CliRunner.Run("predict", "--model", "static-linear", "--z", "1", "--format", "csv");
        Assert.Equal(0, exit);
        var row = Csv(output)[1];
        Assert.Equal("", row[2]);
        // d = cz/H0 = 4282.7494 Mpc, D_L = d√2 = 6056.7223 (docs/science.md §2.4); dimming 2.5 log10 2 = 0.7526 mag (§2.7).
        Assert.Equal(4282.7494, Num(row[1]), 4);
        Assert.Equal(4282.7494, Num(row[3]), 4);
        Assert.Equal(6056.7223, Num(row[4]), 4);
        Assert.Equal(0.7526, Num(row[7]), 4);
    }

    [Fact]
    public void FluxConventionAndDimmingExponentFlagsReachTheStaticModel()
    {
        var (exit, output, _) = CliRunner.Run("predict", "--model", "tired-light", "--z", "1", "--flux-convention", "time-dilation", "--format", "csv");
        Assert.Equal(0, exit);
        var row = Csv(output)[1];
        // D_L = d(1+z) = 2·2968.5757 (docs/science.md §1.5/§2.4); n = 2 → 5 log10 2 = 1.5051 mag.
        Assert.Equal(2 * 2968.5757, Num(row[4]), 3);
        Assert.Equal(1.5051, Num(row[7]), 4);
        var (exit2, output2, _) = CliRunner.Run("predict", "--model", "tired-light", "--z", "1", "--dimming-exponent", "4", "--format", "csv");
        Assert.Equal(0, exit2);
        Assert.Equal(3.0103, Num(Csv(output2)[1][7]), 4);
    }

    [Fact]
    public void JsonHasModelParametersAndRowsWithNullForUndefined()
    {
        var (exit, output, _) = CliRunner.Run("predict", "--model", "static-linear", "--z", "0.5,2", "--format", "json", "--h0", "67.5");
        Assert.Equal(0, exit);
        using var doc = JsonDocument.Parse(output);
        var root = doc.RootElement;
        Assert.Equal("static-linear", root.GetProperty("model").GetString());
        Assert.Equal(67.5, root.GetProperty("parameters").GetProperty("h0").GetDouble());
        var rows = root.GetProperty("rows");
        Assert.Equal(2, rows.GetArrayLength());
        Assert.Equal(Columns, rows[0].EnumerateObject().Select(p => p.Name).ToArray());
        Assert.Equal(JsonValueKind.Null, rows[0].GetProperty("transverse_comoving_mpc").ValueKind);
        // d = cz/H0 at z = 2, H0 = 67.5 (definition).
        Assert.Equal(299792.458 * 2 / 67.5, rows[1].GetProperty("comoving_mpc").GetDouble(), 9);
    }

    [Fact]
    public void JsonReportsTheAgeOfExpandingModelsOnly()
    {
        using var flrw = JsonDocument.Parse(CliRunner.Run("predict", "--z", "1", "--format", "json").Out);
        // Flat ΛCDM 0.3, H0 = 70: age 13.46698 Gyr (astropy 5.2.1, docs/science.md §2.2).
        Assert.Equal(13.46698, flrw.RootElement.GetProperty("age_gyr").GetDouble(), 4);
        using var stat = JsonDocument.Parse(CliRunner.Run("predict", "--model", "tired-light", "--z", "1", "--format", "json").Out);
        Assert.Equal(JsonValueKind.Null, stat.RootElement.GetProperty("age_gyr").ValueKind);
    }

    [Fact]
    public void TableFormatIsTheDefaultAndReadable()
    {
        var (exit, output, _) = CliRunner.Run("predict", "--z", "1,2");
        Assert.Equal(0, exit);
        var lines = output.Trim().Split('\n');
        Assert.StartsWith("World model lcdm", lines[0]);
        Assert.Contains("angular_diameter_mpc", lines[1]);
        Assert.Equal(4, lines.Length);
    }

    [Fact]
    public void AllModelFlagsAreAcceptedWhereTheyApply()
    {
        Assert.Equal(0, CliRunner.Run("predict", "--model", "lcdm", "--h0", "68", "--omega-m", "0.31", "--omega-lambda", "0.7", "--t-cmb", "2.7255", "--n-eff", "3.046", "--z", "1").Exit);
        Assert.Equal(0, CliRunner.Run("predict", "--model", "wcdm", "--w0", "-0.9", "--z", "1").Exit);
        Assert.Equal(0, CliRunner.Run("predict", "--model", "w0wacdm", "--w0", "-0.9", "--wa", "0.2", "--z", "1").Exit);
        Assert.Equal(0, CliRunner.Run("predict", "--model", "eds", "--z", "1").Exit);
        Assert.Equal(0, CliRunner.Run("predict", "--model", "milne", "--z", "1").Exit);
        Assert.Equal(0, CliRunner.Run("predict", "--model", "static-linear", "--dimming-exponent", "1", "--luminosity-exponent", "0.5", "--z", "1").Exit);
    }

    [Fact]
    public void ParametersFromTheCommandLineMatchTheLibrary()
    {
        var (_, output, _) = CliRunner.Run("predict", "--model", "lcdm", "--omega-m", "0.3", "--omega-lambda", "0.8", "--z", "2", "--format", "csv");
        var expected = new LambdaCdmModel(70, 0.3, 0.8).AngularDiameterDistance(2);
        Assert.Equal(expected, Num(Csv(output)[1][3]), 9);
    }

    [Theory]
    [InlineData("predict", "--model", "nope")]
    [InlineData("predict", "--h0", "abc")]
    [InlineData("predict", "--z", "0.1,,2")]
    [InlineData("predict", "--z", "1:0.5:0.1")]
    [InlineData("predict", "--z", "0:1:0")]
    [InlineData("predict", "--z", "x")]
    [InlineData("predict", "--z", "-1")]
    [InlineData("predict", "--model", "static-linear", "--z", "0,1")]
    [InlineData("predict", "--model", "eds", "--omega-m", "0.3")]
    [InlineData("predict", "--model", "lcdm", "--dimming-exponent", "2")]
    [InlineData("predict", "--model", "lcdm", "--omega-lambda", "2")]
    [InlineData("predict", "--omega-m", "-0.1")]
    [InlineData("predict", "--size-kpc", "0")]
    [InlineData("predict", "--flux-convention", "sometimes", "--model", "tired-light")]
    [InlineData("predict", "--no-such-flag")]
    [InlineData("predict", "--model", "lcdm", "--flux-convention", "time-dilation")]
    [InlineData("predict", "--model", "static-linear", "--flux-convention", "time-dilation", "--luminosity-exponent", "1")]
    public void BadFlagsAndValuesExitTwoWithOneLineMessage(params string[] args)
    {
        var (exit, output, err) = CliRunner.Run(args);
        Assert.Equal(2, exit);
        Assert.Equal("", output);
        Assert.Single(err.Trim().Split('\n'));
        Assert.StartsWith("sizetest: ", err);
        Assert.DoesNotContain("Exception", err);
    }

    [Fact]
    public void ZeroRedshiftForFlrwGivesZerosAndAnEmptyTheta()
    {
        var (exit, output, _) = CliRunner.Run("predict", "--z", "0", "--format", "csv");
        Assert.Equal(0, exit);
        Assert.Equal(["0", "0", "0", "0", "0", "0", "", "0"], Csv(output)[1]);
    }

    [Fact]
    public void UnknownFormatExitsTwo()
    {
        // The shared --format option's message spans lines (System.CommandLine's AcceptOnlyFromAmong); only the exit code is checked here.
        Assert.Equal(2, CliRunner.Run("predict", "--format", "xml").Exit);
    }

    [Fact]
    public void HelpListsEveryModelFlag()
    {
        var (exit, output, _) = CliRunner.Run("predict", "--help");
        Assert.Equal(0, exit);
        foreach (var flag in new[] { "--model", "--h0", "--omega-m", "--omega-lambda", "--w0", "--wa", "--t-cmb", "--n-eff", "--dimming-exponent", "--z", "--size-kpc", "--format" })
            Assert.Contains(flag, output);
    }
}
