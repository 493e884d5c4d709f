using SizeTest.Inference;
using SizeTest.Reporting.Data;
using SizeTest.Reporting.Tables;
using Xunit;

namespace SizeTest.Tests.Reporting;

/// <summary>Compact radio sources: ℓ_m (the fit's r0_kpc) is printed in pc; the CSV keeps kpc as results.json does.</summary>
public sealed class RadioLinearSizeTests
{
    [Fact]
    public void TheParameterTableShowsEllMInParsecs()
    {
        // 0.012 kpc = 12 pc (1 kpc = 1000 pc); ℓ_m ≈ 11 pc is the scale of Cao et al. 2017.
        var fit = new ModelFitSummary
        {
            Name = "lcdm", K = 2, N = 300, LogLikelihood = -10, Aic = 24, Aicc = 24, Bic = 31, Converged = true,
            ExitReason = new ExitReason(ExitCause.Converged, "gradient below tolerance"),
            Parameters = [new("r0_kpc", 0.0120, 0.0114, 0.0126, false, "kpc"), new("scatter_dex", 0.1, 0.09, 0.11, false, "dex")],
        };
        var data = SyntheticReport.Create(power: false) with { Models = [new ModelReport(fit)], EvolutionTests = [] };
        var radio = data with { Data = data.Data with { CompactRadioSources = true } };
        var t = ReportTables.Parameters(radio);
        var row = t.Rows.Single(r => r[1] == "ℓ_m (r0_kpc)");
        Assert.Equal("12.0 ± 0.6", row[2]);
        Assert.Equal("pc", row[6]);
        Assert.Equal("0.012", t.MachineRows!.Single(r => r[1] == "r0_kpc")[2]);
        Assert.Equal("kpc", t.MachineRows!.Single(r => r[1] == "r0_kpc")[8]);
        Assert.Contains(ReportTables.Parameters(data).Rows, r => r[1] == "r0_kpc" && r[6] == "kpc"); // galaxies: unchanged
    }

    [Fact]
    public void TheReportAndTheCliShareOneConversion()
    {
        // The report's parameter table and the CLI's ℓ_m line read the same ParameterDisplay: 1 kpc = 1000 pc, for the plain
        // size scale, a bin's and a population's; other parameters and galaxy samples are left as stored.
        var bin = new ParameterEstimate("r0_kpc_bin2@early", 0.0100, 0.0090, 0.0110, false, "kpc")
        {
            Regions = [new IntervalPiece(0.0090, 0.0095), new IntervalPiece(0.0105, 0.0110)],
        };
        var shown = ParameterDisplay.Shown(bin, compactRadioSources: true);
        var cli = ParameterDisplay.For(bin.Name, bin.Unit, compactRadioSources: true);
        Assert.Equal("ℓ_m (r0_kpc_bin2@early)", shown.Name);
        Assert.Equal("ℓ_m,bin2[early]", cli.Symbol);
        Assert.Equal(bin.Value * cli.Scale, shown.Value);
        Assert.Equal(10.0, shown.Value, 12); // 0.0100 kpc = 10 pc, to rounding (relative 1e-12)
        Assert.Equal([9.0, 9.5, 10.5, 11.0], shown.Regions.SelectMany(r => new[] { r.Lo, r.Hi }).Select(x => Math.Round(x, 9)));
        Assert.Equal(cli.Unit, shown.Unit);
        var scatter = new ParameterEstimate("scatter_dex", 0.1, 0.09, 0.11, false, "dex");
        Assert.Same(scatter, ParameterDisplay.Shown(scatter, compactRadioSources: true));
        Assert.Same(bin, ParameterDisplay.Shown(bin, compactRadioSources: false));
    }
}
