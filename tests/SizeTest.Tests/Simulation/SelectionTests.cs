using Xunit;
using SizeTest.Foundation.Errors;
using SizeTest.Cosmology;
using SizeTest.Simulation;

namespace SizeTest.Tests.Simulation;

/// <summary>Selection is applied to observed values, removes exactly the objects beyond the cut, and is counted.</summary>
public sealed class SelectionTests
{
    private static readonly IWorldModel Lcdm = WorldModels.Get("lcdm").Create(new Dictionary<string, double>());

    private static MockCatalogue Draw(int n, MockSelection? cut, long seed = 21) =>
        MockSurveyGenerator.Generate(new MockSurveySpec(Lcdm, new SurveyDesign(n, RedshiftDistribution.Uniform(0.1, 3), Selection: cut), seed));

    [Fact]
    public void SbLimitRemovesExactlyTheObjectsBeyondIt()
    {
        const double limit = 23.5;
        var cut = Draw(3000, new MockSelection(SbLimit: limit));
        Assert.Equal(3000, cut.Count);
        Assert.All(cut.Mu!, mu => Assert.True(mu < limit));
        // The draws do not depend on the selection (same streams per chunk), so the unselected catalogue of the
        // same seed, cut by hand at the limit, must be the selected catalogue object for object, bit for bit.
        var all = Draw((int)cut.Drawn, null);
        var kept = Enumerable.Range(0, all.Count).Where(i => all.Mu![i] < limit).ToArray();
        Assert.Equal(cut.Count, kept.Length);
        for (int k = 0; k < kept.Length; k++)
        {
            Assert.Equal(all.Mu![kept[k]], cut.Mu![k]);
            Assert.Equal(all.ThetaArcsec[kept[k]], cut.ThetaArcsec[k]);
            Assert.Equal(all.Z[kept[k]], cut.Z[k]);
        }
        Assert.Equal(all.Count - kept.Length, cut.FailedSbLimit);
        Assert.Equal(cut.Drawn, cut.Count + cut.FailedSbLimit);
        Assert.True(cut.Drawn > 3000 && cut.PassFraction < 1);
    }

    [Fact]
    public void MagnitudeAndSizeLimitsApplyToObservedValues()
    {
        var cut = Draw(2000, new MockSelection(MagLimit: 23, MinThetaArcsec: 0.3));
        Assert.All(cut.Mag!, m => Assert.True(m < 23));
        Assert.All(cut.ThetaArcsec, t => Assert.True(t > 0.3));
        // Definition: m = μ − 2.5 log10(2π θ²) (half the light inside π R_e²).
        for (int i = 0; i < 50; i++)
            Assert.Equal(cut.Mu![i] - 2.5 * Math.Log10(2 * Math.PI * cut.ThetaArcsec[i] * cut.ThetaArcsec[i]), cut.Mag![i], 12);
        Assert.Equal(cut.Drawn, cut.Count + cut.FailedSbLimit + cut.FailedMagLimit + cut.FailedMinSize);
        Assert.True(cut.FailedMagLimit > 0 && cut.FailedMinSize > 0);
    }

    [Fact]
    public void ASelectionThatAlmostNothingPassesIsReportedNotLooped()
    {
        var spec = new MockSurveySpec(Lcdm, new SurveyDesign(100, RedshiftDistribution.Uniform(0.1, 3), Selection: new MockSelection(SbLimit: 5), MaxDrawsPerObject: 50), 1);
        var ex = Assert.Throws<AnalysisException>(() => MockSurveyGenerator.Generate(spec));
        Assert.Contains("pass fraction", ex.Message);
    }

    [Fact]
    public void RadioSourcesRefuseSurfaceBrightnessCuts()
    {
        var spec = new MockSurveySpec(Lcdm, new SurveyDesign(10, RedshiftDistribution.Uniform(0.5, 3), MockObjectKind.CompactRadio, Selection: new MockSelection(SbLimit: 24)), 1);
        Assert.Throws<InputException>(() => MockSurveyGenerator.Generate(spec));
    }
}
