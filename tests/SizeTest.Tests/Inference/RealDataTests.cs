using System.Globalization;
using SizeTest.Inference;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Inference;

public sealed class RealDataTests(Xunit.Abstractions.ITestOutputHelper output)
{
    private static readonly string TablePath = Path.Combine(AppContext.BaseDirectory, "Reference", "Inference", "van_der_Wel_2014_ApJ_788_28_Table5_VLuminosity.txt");

    /// <summary>Rows of van der Wel et al. 2014, ApJ 788, 28, Table 5 (V luminosity): z, log10 L_V, log10 R_e median, 84th, 16th (kpc).</summary>
    private static List<(double Z, double LogL, double LogR, double Hi, double Lo)> ReadTable()
    {
        var rows = new List<(double, double, double, double, double)>();
        foreach (var raw in File.ReadLines(TablePath))
        {
            var line = raw.Trim();
            if (line.Length == 0 || line.StartsWith('#')) continue; // '#' lines are the header and two commented-out bins
            var f = line.Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries).Select(s => double.Parse(s, CultureInfo.InvariantCulture)).ToArray();
            rows.Add((f[0], f[1], f[2], f[3], f[4]));
        }
        return rows;
    }

    [Fact]
    public void VanDerWelBinsGiveThePublishedSizeEvolutionAtFixedLuminosity()
    {
        var rows = ReadTable();
        Assert.Equal(21, rows.Count); // 21 bins (docs/science.md §4)
        // The paper's sizes are physical kpc for flat ΛCDM H0 = 70, Ωm = 0.3 (docs/science.md §4); convert back to angles
        // with the same cosmology, so the fit in angle space sees the real binned θ(z).
        var lcdm = TestWorldModels.FlatLcdm.Create(new Dictionary<string, double> { ["h0"] = 70, ["omega_m"] = 0.3 });
        // Check the test-local D_A against astropy 5.2.1 (docs/science.md §2.2: D_A(1) = 1651.9144 Mpc).
        Assert.Equal(1651.9144, lcdm.AngularDiameterDistance(1.0), 3);
        var slopes = new List<double>();
        foreach (var group in rows.GroupBy(r => r.LogL).Where(g => g.Count() >= 4))
        {
            var bins = group.OrderBy(r => r.Z).ToArray();
            var z = bins.Select(b => b.Z).ToArray();
            var lnTheta = bins.Select(b => Math.Log(Math.Pow(10, b.LogR) * 1e-3 / lcdm.AngularDiameterDistance(b.Z))).ToArray();
            var obs = new Observables(z, lnTheta, new double[z.Length]);
            var h = Hypothesis.Create(TestWorldModels.FlatLcdm, new NuisanceModel(ObservableKind.Size));
            var lik = h.Bind(obs);
            var fit = MaximumLikelihood.Fit(lik);
            Assert.True(fit.Converged, fit.ExitReason);
            double a = FitSummaries.From(lik, fit).Parameters.Single(p => p.Name == "size_evolution").Value;
            Assert.InRange(a, -1.6, -0.5); // each luminosity bin: between the late- and early-type slopes, with bin noise
            slopes.Add(a);
            output.WriteLine($"log L_V = {group.Key}: size_evolution = {a:0.000}");
        }
        Assert.Equal(4, slopes.Count); // log L = 9.75, 10.25, 10.75, 11.25 have ≥ 4 redshift bins
        // van der Wel et al. 2014 (abstract): R_eff ∝ (1+z)^−0.75 (late) … (1+z)^−1.48 (early); mixed types at fixed L lie between.
        output.WriteLine($"mean slope {slopes.Average():0.000}");
        Assert.InRange(slopes.Average(), -1.5, -0.75);
    }
}
