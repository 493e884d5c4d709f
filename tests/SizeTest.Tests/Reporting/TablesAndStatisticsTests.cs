using SizeTest.Reporting.Data;
using SizeTest.Reporting.Figures;
using SizeTest.Reporting.Rendering;
using SizeTest.Reporting.Tables;
using Xunit;

namespace SizeTest.Tests.Reporting;

public sealed class TablesAndStatisticsTests
{
    [Fact]
    public void CsvQuotesOnlyWhatNeedsQuoting()
    {
        var t = new ReportTable("t", "T", ["a", "b"], [["x,y", "say \"hi\""], ["1.5", "plain"]]);
        Assert.Equal("a,b\n\"x,y\",\"say \"\"hi\"\"\"\n1.5,plain\n", TableFormats.ToCsv(t)); // RFC 4180 §2
    }

    [Fact]
    public void LatexEscapesSpecialCharacters()
    {
        Assert.Equal("delta\\_BIC 50\\% $\\Omega$m", TableFormats.Tex("delta_BIC 50% Ωm"));
        var t = new ReportTable("t", "T", ["name", "v"], [["a", "1"], ["b", "2.5"]]);
        Assert.Contains("\\begin{tabular}{lr}", TableFormats.ToLatex(t));
    }

    [Fact]
    public void BinnedMedianAndBootstrapAreRightAndRepeatable()
    {
        double[] z = [0.1, 0.2, 0.3, 0.6, 0.7, 0.8, 0.9];
        double[] v = [1, 2, 3, 10, 20, 30, 40];
        var bins = BinnedStatistics.Compute(z, v, [0.0, 0.5, 1.0], BinnedStatistics.Statistic.Median, 500, 3);
        Assert.Equal(2.0, bins[0].Value);   // median of 1, 2, 3
        Assert.Equal(25.0, bins[1].Value);  // median of 10, 20, 30, 40 = (20+30)/2
        Assert.Equal(3, bins[0].Count);
        Assert.True(bins[1].Lo <= 25 && bins[1].Hi >= 25);
        Assert.Equal(bins, BinnedStatistics.Compute(z, v, [0.0, 0.5, 1.0], BinnedStatistics.Statistic.Median, 500, 3)); // same seed, same result
    }

    [Fact]
    public void EqualCountEdgesSplitTheSampleEvenly()
    {
        var z = Enumerable.Range(1, 100).Select(i => i / 100.0).ToArray();
        var e = BinnedStatistics.EqualCountEdges(z, 4);
        Assert.Equal([0.01, 0.255, 0.505, 0.755, 1.0], e.Select(x => Math.Round(x, 6)));
    }

    [Fact]
    public void BicWeightsSumToOneAndFollowDeltaBic()
    {
        var data = SyntheticReport.Create(posterior: false, power: false);
        var w = ReportNumbers.BicWeights(data.Models);
        Assert.Equal(1.0, w.Sum(), 12);
        // w_i / w_j = exp(−(ΔBIC_i − ΔBIC_j)/2) by definition.
        Assert.Equal(Math.Exp(-(data.Models[1].Fit.DeltaBic - data.Models[0].Fit.DeltaBic) / 2), w[1] / w[0], 10);
    }

    [Fact]
    public void EmbeddedFontsLoadAsDejaVuSans()
    {
        Assert.Equal("DejaVu Sans", FontRegistry.Regular.FamilyName);
        Assert.True(FontRegistry.Bold.IsBold);
        Assert.Contains("Bitstream", FontRegistry.LicenceText);
    }

    [Theory]
    [InlineData("DejaVu Sans")]
    [InlineData("Helvetica")]
    [InlineData("no such font family")]
    public void PlotsNeverFallBackToSystemFonts(string family)
    {
        // Every request resolves to the embedded faces, so text renders the same on a machine without fonts.
        Assert.Same(FontRegistry.Regular, FigureRenderer.ResolveTypeface(family, false));
        Assert.Same(FontRegistry.Bold, FigureRenderer.ResolveTypeface(family, true));
    }
}

public sealed class ReportDataJsonTests
{
    [Fact]
    public void RoundTripsExactlyAndRedrawsTheSameReport()
    {
        var data = SizeTest.Tests.Reporting.SyntheticReport.Create(120, seed: 5);
        var json = SizeTest.Reporting.Data.ReportDataJson.ToJson(data);
        var back = SizeTest.Reporting.Data.ReportDataJson.FromJson(json, "report-data.json");
        Assert.Equal(json, SizeTest.Reporting.Data.ReportDataJson.ToJson(back));
        Assert.Equal(data.Objects.ThetaArcsec, back.Objects.ThetaArcsec); // doubles survive exactly (round-trip format)
        var a = SizeTest.Reporting.ReportContent.From(data);
        var b = SizeTest.Reporting.ReportContent.From(back);
        Assert.Equal(a.Tables.Select(SizeTest.Reporting.Tables.TableFormats.ToCsv), b.Tables.Select(SizeTest.Reporting.Tables.TableFormats.ToCsv));
        Assert.Equal(SizeTest.Reporting.Rendering.FigureRenderer.RenderSvg(a.Figures[0]), SizeTest.Reporting.Rendering.FigureRenderer.RenderSvg(b.Figures[0]));
    }

    [Fact]
    public void BadFilesAreInputErrorsWithALine()
    {
        var ex = Assert.Throws<SizeTest.Foundation.Errors.InputException>(() => SizeTest.Reporting.Data.ReportDataJson.FromJson("{\n \"format_version\": 1,\n \"report\": {\"nonsense\": 3}\n}", "x/report-data.json"));
        Assert.Equal("x/report-data.json", ex.File);
        Assert.NotNull(ex.Line);
        var v = Assert.Throws<SizeTest.Foundation.Errors.InputException>(() => SizeTest.Reporting.Data.ReportDataJson.FromJson("{\"format_version\": 99, \"report\": null}", "r.json"));
        Assert.Contains("report data", v.Message);
    }
}

public sealed class AdapterHelperTests
{
    [Fact]
    public void CurveSampleIsLogSpacedAndInterpolates()
    {
        var c = SizeTest.Reporting.Data.Curve.Sample(z => 1 / z, 0.1, 10, 3);
        Assert.Equal([0.1, 1.0, 10.0], c.X.Select(x => Math.Round(x, 12)));
        // 1/z is a straight line in log–log, so log-log interpolation is exact: 1/2 = 0.5.
        Assert.Equal(0.5, c.At(2, logLog: true), 12);
        Assert.True(double.IsNaN(c.At(20)));
    }

    [Fact]
    public void SamplePointsConvertRadiansToArcsec()
    {
        var s = new SizeTest.Catalogues.CatalogueRows("t", [2, 3], [0.5, 1.0], thetaRad: [SizeTest.Foundation.Angles.AngleUnits.RadiansPerArcsec * 2, SizeTest.Foundation.Angles.AngleUnits.RadiansPerArcsec]);
        var p = SizeTest.Reporting.Data.ObjectPoints.FromRows(s);
        Assert.Equal(2.0, p.ThetaArcsec![0], 12); // 2″ in radians back to arcsec
        Assert.Equal(1.0, p.ThetaArcsec[1], 12);
        Assert.Null(p.Mu);
    }

    [Fact]
    public void WithBinsFillsBothBinSets()
    {
        var d = SyntheticReport.Create(200, posterior: false, power: false) with { ThetaBins = null, MuBins = null };
        var b = d.WithBins(5, 50, 1);
        Assert.Equal(5, b.ThetaBins!.Count);
        Assert.Equal(200, b.MuBins!.Sum(x => x.Count)); // every object in exactly one bin
    }
}
