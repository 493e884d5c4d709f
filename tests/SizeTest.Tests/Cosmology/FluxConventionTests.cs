using System.Globalization;
using SizeTest.Cosmology;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Cosmology;

/// <summary>
/// The static models' flux conventions (<see cref="FluxConvention"/>) against closed forms and hand values.
/// </summary>
/// <remarks>
/// Derivation of each convention's exponent p in D_L = d (1+z)^p, from the formulas of docs/science.md §1.5 and
/// docs/world-models.md: D_L is defined by F = L/(4π D_L²).
/// <list type="bullet">
/// <item>energy-loss: F = L/[4π d² (1+z)] (each photon's energy divided by 1+z, photons arriving at the emitted rate), so
/// 4π D_L² = 4π d² (1+z), D_L = d (1+z)^{1/2}: p = 1/2;</item>
/// <item>time-dilation: F = L/[4π d² (1+z)²] (the arrival rate also divided by 1+z), so D_L = d (1+z): p = 1.</item>
/// </list>
/// With the static-linear law d = cz/H0 this gives D_L = (cz/H0)(1+z)^p, the closed form checked below.
/// </remarks>
public sealed class FluxConventionTests
{
    private const double C = 299792.458; // km/s, exact (SI definition)

    private static IWorldModel Build(string family, FluxConvention convention) =>
        // The path the CLI (WorldModelOptions, CandidateModelOptions) and study files take: the convention's exponent as
        // the family's luminosity_exponent.
        WorldModels.Get(family).Create(new Dictionary<string, double> { [WorldModelParameters.Names.LuminosityExponent] = convention.LuminosityExponent() });

    [Fact]
    public void EachConventionsExponentIsTheOneItsFluxLawImplies()
    {
        // p = 1/2 and p = 1, derived in the remarks above.
        Assert.Equal(0.5, FluxConvention.EnergyLoss.LuminosityExponent());
        Assert.Equal(1.0, FluxConvention.TimeDilation.LuminosityExponent());
        Assert.Equal(["energy-loss", "time-dilation"], FluxConventions.Names);
        Assert.Equal(FluxConvention.TimeDilation, FluxConventions.Of(1.0));
        Assert.Null(FluxConventions.Of(0.7));
        Assert.Equal("energy-loss", FluxConventions.Label(0.5, free: false));
        Assert.Equal("other", FluxConventions.Label(0.7, free: false));
        Assert.Equal("fitted", FluxConventions.Label(0.5, free: true));
    }

    [Theory]
    [InlineData(FluxConvention.EnergyLoss, 0.5)]
    [InlineData(FluxConvention.TimeDilation, 1.0)]
    public void StaticLinearLuminosityDistanceIsTheClosedForm(FluxConvention convention, double p)
    {
        var model = Build("static-linear", convention);
        foreach (double z in new[] { 0.01, 0.1, 0.5, 1.0, 2.0, 3.0, 10.0 })
        {
            double expected = C * z / 70.0 * Math.Pow(1 + z, p); // closed form derived in the remarks, H0 = 70
            // Relative 1e-14: the model evaluates the same product (rounding only).
            Assert.True(Math.Abs(model.LuminosityDistance(z) / expected - 1) < 1e-14, $"z = {z}: {model.LuminosityDistance(z):R} vs {expected:R}");
            Assert.Equal(C * z / 70.0, model.AngularDiameterDistance(z), 9); // θ = ℓ/d whatever the convention
        }
        // The default bolometric dimming is n = 2p (docs/science.md §1.6: 1 for energy loss only, 2 with time dilation).
        Assert.Equal(2 * p, model.BolometricDimmingExponent);
        Assert.Equal(p, ModelLuminosity.DistanceExponent(model));
    }

    [Fact]
    public void AbsoluteMagnitudesMatchTheHandValues()
    {
        // Reference/Cosmology/flux_conventions.py (/usr/bin/python3, astropy 5.2.1, numpy 1.24.2): D_L = d (1+z)^p and
        // M = m − 5 log10(D_L/10 pc) for the first rows of flux_convention_rows.csv; lcdm from astropy FlatLambdaCDM(70, 0.3, Tcmb0=0).
        var lines = File.ReadAllLines(Path.Combine(AppContext.BaseDirectory, "Reference", "Cosmology", "flux_convention_values.txt"))
            .Where(l => !l.StartsWith('#') && !l.StartsWith("count", StringComparison.Ordinal)).ToArray();
        Assert.Equal(24, lines.Length);
        foreach (var line in lines)
        {
            var f = line.Split(' ');
            double D(int i) => double.Parse(f[i], CultureInfo.InvariantCulture);
            Assert.True(FluxConventions.TryParse(f[1], out var convention));
            var model = f[0] == "lcdm" ? new LambdaCdmModel(70, 0.3) : Build(f[0], convention);
            double z = D(3), m = D(4);
            // Static: the same closed form, relative 1e-12 on D_L (9 printed decimals of ~10^3–10^4 Mpc: 1e-12 relative) and
            // 1e-8 mag on M (9 printed decimals). ΛCDM: our quadrature agrees with astropy to ~1e-8 relative (AstropyReferenceTests),
            // i.e. 2e-8 mag; 1e-6 mag and 1e-7 relative allowed.
            bool flrw = f[0] == "lcdm";
            Assert.True(Math.Abs(model.LuminosityDistance(z) / D(5) - 1) < (flrw ? 1e-7 : 1e-12), line);
            Assert.True(Math.Abs(ModelLuminosity.AbsoluteMagnitude(model, m, z) - D(6)) < (flrw ? 1e-6 : 1e-8), line);
        }
    }
}
