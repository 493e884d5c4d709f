using SizeTest.Cosmology;
using SizeTest.Photometry;

namespace SizeTest.Tests.Inference;

/// <summary>
/// Synthetic (mock) catalogues with known truth, drawn from exactly the model the likelihood assumes:
/// z uniform in [zMin, zMax]; ln θ = ln(R0 (1+z)^a · 1e-3 / D_A) + N(0, (ln10 σ_dex)² + e²) with measurement error e;
/// μ = μ0 + 2.5 (n − b) log10(1+z) + N(0, σ_μ² + e_μ²). Optionally with a Kormendy-type link.
/// </summary>
internal static class MockCatalogue
{
    public sealed record Truth(double R0Kpc = 4.0, double SizeEvolution = -1.0, double ScatterDex = 0.2,
        double Mu0 = 21.0, double SbEvolution = 1.0, double ScatterMag = 0.3, double Kormendy = 0.0, double PivotKpc = 5.0);

    public static double Gauss(Random r)
    {
        double u1 = 1.0 - r.NextDouble(), u2 = r.NextDouble();
        return Math.Sqrt(-2 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2);
    }

    /// <summary>Draws n objects (before any cut); returns arrays.</summary>
    public static Observables Draw(IWorldModel model, int n, Truth t, int seed, double zMin = 0.1, double zMax = 3.0,
        double lnThetaErr = 0.05, double muErr = 0.1, Func<double, double, double, bool>? keep = null)
    {
        var rng = new Random(seed);
        var z = new List<double>(); var y = new List<double>(); var mu = new List<double>();
        double ln10 = Math.Log(10);
        int guard = 0;
        while (z.Count < n && guard++ < 1000 * n)
        {
            double zi = zMin + (zMax - zMin) * rng.NextDouble();
            double lnR = Math.Log(t.R0Kpc) + t.SizeEvolution * Math.Log(1 + zi) + ln10 * t.ScatterDex * Gauss(rng);
            double lnTheta = lnR + Math.Log(1e-3) - Math.Log(model.AngularDiameterDistance(zi)) + lnThetaErr * Gauss(rng);
            double muTrue = t.Mu0 + 2.5 * (model.BolometricDimmingExponent - t.SbEvolution) * Math.Log10(1 + zi)
                            + t.Kormendy * (lnR - Math.Log(t.PivotKpc)) / ln10 + t.ScatterMag * Gauss(rng);
            double muObs = muTrue + muErr * Gauss(rng);
            if (keep is not null && !keep(zi, lnTheta, muObs)) continue;
            z.Add(zi); y.Add(lnTheta); mu.Add(muObs);
        }
        return new Observables(z.ToArray(), y.ToArray(), Enumerable.Repeat(lnThetaErr, z.Count).ToArray(),
            mu.ToArray(), Enumerable.Repeat(muErr, z.Count).ToArray());
    }
}
