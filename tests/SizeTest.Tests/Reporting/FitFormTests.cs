using SizeTest.Inference;
using SizeTest.Reporting;
using SizeTest.Reporting.Data;
using SizeTest.Reporting.Figures;
using Xunit;

namespace SizeTest.Tests.Reporting;

/// <summary>Grouped (--group) and binned fits: the report's words describe them, not a single R0 (1+z)^a curve.</summary>
public sealed class FitFormTests
{
    private static ModelReport Grouped(string name, double lnL) => new(new ModelFitSummary
    {
        Name = name, K = 6, N = 400, LogLikelihood = lnL, Aic = 12 - 2 * lnL, Aicc = 12 - 2 * lnL, Bic = 6 * Math.Log(400) - 2 * lnL, Converged = true,
        ExitReason = new ExitReason(ExitCause.Converged, "gradient below tolerance"),
        Parameters =
        [
            new("r0_kpc@early", 3.1, 3.0, 3.2, false, "kpc"), new("size_evolution@early", -1.3, -1.36, -1.24, false, ""),
            new("r0_kpc@late", 5.0, 4.9, 5.1, false, "kpc"), new("size_evolution@late", -0.7, -0.75, -0.65, false, ""),
        ],
    });

    [Fact]
    public void GroupedFitsSayEachPopulationHasItsOwnR0AndA()
    {
        // Populations have no one curve, so the adapter draws none (Theta null): Figure 1 must say why, not describe lines.
        var data = SyntheticReport.Create(power: false) with { Models = [Grouped("lcdm", -900), Grouped("tired-light", -905)], EvolutionTests = [] };
        Assert.Equal(["early", "late"], FitForm.Groups(data));
        Assert.Equal(0, FitForm.Bins(data));
        var caption = AngularSizeFigure.Build(data)!.Caption;
        Assert.Contains("No model line is drawn: each population of the group column (early, late) has its own R0, a and scatter", caption);
        Assert.DoesNotContain("its line is the best fit", caption);
    }

    [Fact]
    public void BinnedFitsCountTheirBinsAndStateWhyNothingIsTestedAgainstZero()
    {
        var fit = Grouped("lcdm", -900).Fit with
        {
            Parameters = [new("r0_kpc_bin1", 5, 4.9, 5.1, false, "kpc"), new("r0_kpc_bin2", 4, 3.9, 4.1, false, "kpc"), new("r0_kpc_bin3", 3, 2.9, 3.1, false, "kpc")],
        };
        var data = SyntheticReport.Create(power: false) with { Models = [new ModelReport(fit)], EvolutionTests = [] };
        Assert.Equal(3, FitForm.Bins(data));
        Assert.Contains("one R0 per redshift bin (3 bins)", AngularSizeFigure.Build(data)!.Caption);
        var empty = ReportContent.From(data).Table("evolution-tests").EmptyText;
        Assert.StartsWith("With binned evolution (3 redshift bins) no model has an evolution exponent", empty);
        Assert.DoesNotContain("no evolution test was run", empty);
    }
}
