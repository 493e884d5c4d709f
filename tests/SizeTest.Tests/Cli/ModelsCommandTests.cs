using System.Text.Json;
using SizeTest.Cosmology;
using Xunit;

namespace SizeTest.Tests.Cli;

public sealed class ModelsCommandTests
{
    [Fact]
    public void TableListsEveryModelWithParametersDefaultsUnitsAndDimming()
    {
        var (exit, output, _) = CliRunner.Run("models");
        Assert.Equal(0, exit);
        foreach (var f in WorldModels.All)
        {
            Assert.Contains(f.Name + " (", output);
            Assert.Contains(f.DimmingLaw, output);
        }
        Assert.Contains("--h0", output);
        Assert.Contains("km/s/Mpc", output);
        Assert.Contains("default 70", output);
        Assert.Contains("--omega-lambda  default flat", output);
        Assert.Contains("(1+z)^-4", output);
    }

    [Fact]
    public void JsonDescribesEveryFamily()
    {
        var (exit, output, _) = CliRunner.Run("models", "--format", "json");
        Assert.Equal(0, exit);
        using var doc = JsonDocument.Parse(output);
        var names = doc.RootElement.EnumerateArray().Select(e => e.GetProperty("name").GetString() ?? "").ToArray();
        Assert.Equal(new[] { "lcdm", "wcdm", "w0wacdm", "eds", "milne", "static-linear", "tired-light" }, names);
        var lcdm = doc.RootElement[0];
        Assert.True(lcdm.GetProperty("expanding").GetBoolean());
        var h0 = lcdm.GetProperty("parameters")[0];
        Assert.Equal("h0", h0.GetProperty("name").GetString());
        Assert.Equal("--h0", h0.GetProperty("option").GetString());
        Assert.Equal(70, h0.GetProperty("default").GetDouble());
        Assert.Equal("km/s/Mpc", h0.GetProperty("unit").GetString());
        var ol = lcdm.GetProperty("parameters")[2];
        Assert.Equal(JsonValueKind.Null, ol.GetProperty("default").ValueKind);
        Assert.Equal("flat", ol.GetProperty("default_text").GetString());
        var tired = doc.RootElement[6];
        Assert.False(tired.GetProperty("expanding").GetBoolean());
        Assert.Contains("dimming_exponent", tired.GetProperty("dimming_law").GetString());
    }

    [Fact]
    public void CsvHasOneRowPerModelParameter()
    {
        var (exit, output, _) = CliRunner.Run("models", "--format", "csv");
        Assert.Equal(0, exit);
        var lines = output.Trim().Split('\n');
        Assert.StartsWith("model,kind,dimming_law,parameter,option", lines[0]);
        Assert.Equal(1 + WorldModels.All.Sum(f => f.Parameters.Count), lines.Length);
    }
}
