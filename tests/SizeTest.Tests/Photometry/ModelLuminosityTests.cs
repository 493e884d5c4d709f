using SizeTest.Cosmology;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Photometry;

/// <summary>
/// Per-model luminosities against hand values from the formulas (computed by Reference/model_luminosities.py with
/// astropy 5.2.1 FlatLambdaCDM for ΛCDM and the closed forms for the static models; output in model_luminosities.txt):
/// M = m − 5 log10(D_L/10 pc) − K − A; static models use their own flux convention D_L = d (1+z)^q (q = 1/2);
/// M_model = M_ref − 5 log10(D_L,model/D_L,ref); log M_model = log M_ref + 2 log10(D_L,model/D_L,ref);
/// L_ν = 4π D_L² S_ν (1+z)^−(1+α). Tolerance 10⁻⁶ mag/dex: the ΛCDM D_L agrees with astropy to ~10⁻⁸ relative
/// (AstropyReferenceTests), i.e. 2·10⁻⁸ mag.
/// </summary>
public sealed class ModelLuminosityTests
{
    private static readonly IWorldModel Lcdm = new LambdaCdmModel(70, 0.3);
    private static readonly IWorldModel Linear = WorldModels.Get("static-linear").Create(new Dictionary<string, double>());
    private static readonly IWorldModel Tired = WorldModels.Get("tired-light").Create(new Dictionary<string, double>());

    [Theory]
    [InlineData("lcdm", -20.400237656)]
    [InlineData("static-linear", -20.211188304)]
    [InlineData("tired-light", -19.415315609)]
    public void AbsoluteMagnitudeUsesEachModelsOwnLuminosityDistance(string model, double expected)
    {
        var m = model == "lcdm" ? Lcdm : model == "static-linear" ? Linear : Tired;
        Assert.Equal(expected, ModelLuminosity.AbsoluteMagnitude(m, 24.0, 1.0, 0.3), 6);
        // The likelihood's form ln(L/L_pivot) = C + 2 ln D_L gives the same M: M = M_pivot − ln(L/L_pivot)/(0.4 ln10).
        var data = new LuminosityData(LuminosityKind.ApparentMagnitude, [24.0], [0.3]);
        double ratio = ModelLuminosity.LnLuminosityRatio(m, data, [1.0])[0];
        Assert.Equal(expected, -21.0 - ratio / (0.4 * Math.Log(10)), 6);
    }

    [Fact]
    public void StaticModelsUseTheirOwnFluxConvention()
    {
        // D_L / D_A = (1+z)^q with q = 1/2 for energy loss only (Lerner et al. 2014 convention), 2 for FLRW (Etherington).
        Assert.Equal(0.5, ModelLuminosity.DistanceExponent(Linear), 12);
        Assert.Equal(2.0, ModelLuminosity.DistanceExponent(Lcdm), 12);
        Assert.Equal(6056.722286, Linear.LuminosityDistance(1.0), 5);
    }

    [Fact]
    public void ReferenceCosmologyQuantitiesAreConvertedByTheDistanceRatio()
    {
        Assert.Equal(-20.810950648, ModelLuminosity.ConvertAbsoluteMagnitude(-21, 1.0, Lcdm, Linear), 6);
        Assert.Equal(10.606031181, ModelLuminosity.ConvertLogMass(11, 1.0, Lcdm, Tired), 6);
        // Through the likelihood's base terms: a mass from the ΛCDM reference, judged in tired light.
        var data = new LuminosityData(LuminosityKind.StellarMass, [11.0], LnReferenceDistance: [Math.Log(Lcdm.LuminosityDistance(1.0))]);
        double lnRatio = ModelLuminosity.LnLuminosityRatio(Tired, data, [1.0], new LuminosityPivot(LogMass: 10.0))[0];
        Assert.Equal(10.606031181 - 10.0, lnRatio / Math.Log(10), 6);
    }

    [Theory]
    [InlineData("lcdm", 26.416976021)]
    [InlineData("static-linear", 26.341356280)]
    public void RadioLuminosityFromFluxDensity(string model, double expected)
    {
        var m = model == "lcdm" ? Lcdm : Linear;
        Assert.Equal(expected, ModelLuminosity.LogRadioLuminosity(m, 0.1, 1.0), 6);
        var data = new LuminosityData(LuminosityKind.FluxDensity, [0.1]);
        Assert.Equal(expected - 27.0, ModelLuminosity.LnLuminosityRatio(m, data, [1.0])[0] / Math.Log(10), 6);
    }
}
