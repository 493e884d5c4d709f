using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Photometry;

/// <summary>Seeded property checks over random inputs (System.Random with a fixed seed).</summary>
public sealed class PhotometryPropertyTests
{
    [Theory]
    [InlineData(20261201)] [InlineData(7)]
    public void RandomPowerLawsAndFiltersMatchClosedForm(int seed)
    {
        // Hogg et al. 2002 closed form K = −2.5(1+α) log10(1+z) for the same band, any filter shape; tolerance 1e-6 mag.
        var rng = new Random(seed);
        for (int trial = 0; trial < 25; trial++)
        {
            double alpha = -3 + 5 * rng.NextDouble();
            double z = 3 * rng.NextDouble();
            double centre = 3500 + 6000 * rng.NextDouble();
            var band = KCorrectionTests.GaussianFilter(centre, centre * (0.02 + 0.1 * rng.NextDouble()), "random");
            var density = rng.Next(2) == 0 ? SpectralDensity.PerFrequency : SpectralDensity.PerWavelength;
            double k = new TemplateKCorrection(KCorrectionTests.PowerLawTable(alpha, density), band, band).Evaluate(z);
            Assert.True(Math.Abs(k - PowerLawKCorrection.SameBand(alpha, z)) < 1e-6, $"alpha {alpha}, z {z}, centre {centre}: {k}");
        }
    }

    [Theory]
    [InlineData(11)] [InlineData(12)]
    public void IsophotalRadiusShrinksMonotonicallyWithDimming(int seed)
    {
        // d ln r_iso / d μ_e,obs = −n/(1.0857 b_n · bracket) < 0 (derivative of the closed form): more dimming, smaller r_iso.
        var rng = new Random(seed);
        for (int trial = 0; trial < 200; trial++)
        {
            double n = 0.5 + 7.5 * rng.NextDouble();
            double muE = 18 + 8 * rng.NextDouble(), iso = 24 + 3 * rng.NextDouble(), d = 0.01 + rng.NextDouble();
            bool a = IsophotalSize.TryLnRadiusRatio(n, muE, iso, out double l1);
            bool b = IsophotalSize.TryLnRadiusRatio(n, muE + d, iso, out double l2);
            if (b) Assert.True(a && l2 < l1);
            if (!a) Assert.False(b);   // once the isophote is lost it stays lost
        }
    }
}
