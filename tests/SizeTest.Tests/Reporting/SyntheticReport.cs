using SizeTest.Inference;
using SizeTest.Reporting.Data;
using SizeTest.Reporting.Pack;

namespace SizeTest.Tests.Reporting;

/// <summary>
/// Synthetic report data for the reporting tests (marked synthetic; no fit was run): objects
/// drawn around a flat ΛCDM angular size with size evolution, and made-up but internally
/// consistent fit summaries (AIC = 2k − 2 ln L, BIC = k ln n − 2 ln L).
/// </summary>
internal static class SyntheticReport
{
    private const double CKmS = 299792.458; // speed of light, km/s (SI definition)
    private const double H0 = 70, OmegaM = 0.3, SizeKpc = 5.0;

    /// <summary>Flat ΛCDM comoving distance (Mpc) by the trapezoid rule on 2000 steps; accurate to ~1e-6 here, enough for plotting fixtures.</summary>
    public static double ComovingMpc(double z)
    {
        int n = 2000; double h = z / n, s = 0;
        for (int i = 0; i <= n; i++)
        {
            double zz = i * h, e = 1 / Math.Sqrt(OmegaM * Math.Pow(1 + zz, 3) + 1 - OmegaM);
            s += (i == 0 || i == n) ? e / 2 : e;
        }
        return CKmS / H0 * s * h;
    }

    private static double ArcsecOf(double sizeKpc, double distanceMpc) => sizeKpc / (distanceMpc * 1000) * 206264.80624709636;

    public static double ThetaLcdm(double z, double a) => ArcsecOf(SizeKpc * Math.Pow(1 + z, a), ComovingMpc(z) / (1 + z));
    public static double ThetaStatic(double z, double a) => ArcsecOf(SizeKpc * Math.Pow(1 + z, a), CKmS * z / H0);
    public static double ThetaTired(double z, double a) => ArcsecOf(SizeKpc * Math.Pow(1 + z, a), CKmS / H0 * Math.Log(1 + z));

    public static ReportData Create(int n = 300, int seed = 7, bool posterior = true, bool power = true)
    {
        var rng = new Random(seed);
        var z = new double[n]; var th = new double[n]; var the = new double[n]; var mu = new double[n]; var mue = new double[n]; var ze = new double[n];
        for (int i = 0; i < n; i++)
        {
            z[i] = Math.Exp(Math.Log(0.05) + rng.NextDouble() * (Math.Log(3.0) - Math.Log(0.05)));
            ze[i] = 0.01 * (1 + z[i]);
            double lnScatter = 0.25 * Gauss(rng);
            th[i] = ThetaLcdm(z[i], -1.0) * Math.Exp(lnScatter);
            the[i] = 0.08 * th[i];
            mu[i] = 19.5 + 2.5 * (4 - 1.2) * Math.Log10(1 + z[i]) + 0.4 * Gauss(rng);
            mue[i] = 0.1;
        }
        var grid = Enumerable.Range(0, 80).Select(k => Math.Exp(Math.Log(0.04) + k * (Math.Log(3.3) - Math.Log(0.04)) / 79)).ToArray();
        Curve C(Func<double, double> f) => new(grid, grid.Select(f).ToArray());
        var models = new List<ModelReport>
        {
            Model("lcdm", 3, -180.2, n, [P("omega_m", 0.31, 0.27, 0.35), P("size_evolution", -0.98, -1.08, -0.88), P("scatter_dex", 0.11, 0.10, 0.12, unit: "dex"), P("h0", 70, 70, 70, true, "km/s/Mpc")])
                with { Theta = C(zz => ThetaLcdm(zz, -0.98)), ThetaNoEvolution = C(zz => ThetaLcdm(zz, 0)),
                       Mu = C(zz => 19.5 + 2.5 * (4 - 1.2) * Math.Log10(1 + zz)), MuNoEvolution = C(zz => 19.5 + 10 * Math.Log10(1 + zz)),
                       RequiredEvolution = [new("size_evolution", "size evolution a, R ∝ (1+z)^a", -0.98, -1.08, -0.88), new("sb_evolution", "luminosity evolution b, L ∝ (1+z)^b", 1.2, 1.0, 1.4)] },
            Model("static-linear", 2, -188.9, n, [P("size_evolution", 0.35, 0.21, 0.49), P("scatter_dex", 0.13, 0.12, 0.14, unit: "dex")])
                with { Theta = C(zz => ThetaStatic(zz, 0.35)), ThetaNoEvolution = C(zz => ThetaStatic(zz, 0)),
                       Mu = C(zz => 19.5 + 2.5 * (1 + 0.6) * Math.Log10(1 + zz)), MuNoEvolution = C(zz => 19.5 + 2.5 * Math.Log10(1 + zz)),
                       RequiredEvolution = [new("size_evolution", "size evolution a, R ∝ (1+z)^a", 0.35, 0.21, 0.49), new("sb_evolution", "luminosity evolution b, L ∝ (1+z)^b", -1.6, -1.9, -1.3)] },
            Model("tired-light", 2, -184.0, n, [P("size_evolution", 0.05, -0.08, 0.18), P("scatter_dex", 0.12, 0.11, 0.13, unit: "dex")])
                with { Theta = C(zz => ThetaTired(zz, 0.05)), ThetaNoEvolution = C(zz => ThetaTired(zz, 0)),
                       RequiredEvolution = [new("size_evolution", "size evolution a, R ∝ (1+z)^a", 0.05, -0.08, 0.18)] },
        };
        models = WithComparison(models);
        // Binned evolution (made up): five bins on R0 (1+z)^a, the ΛCDM ones with a bend at high z the power law cannot follow,
        // and the static model with two populations.
        models[0] = models[0] with { BinnedEvolution = [Binned("", 5.0, -0.98, 0.12)], BinnedSurfaceBrightness = [BinnedSb(19.5, 1.2)] };
        models[1] = models[1] with { BinnedEvolution = [Binned("early", 3.2, 0.35, 0), Binned("late", 6.1, 0.2, 0)] };
        var edges = BinnedStatistics.EqualCountEdges(z, 8);
        var data = new ReportData
        {
            Job = new JobSummary("Synthetic test study", "studies/synthetic.toml", "synthetic catalogue (test fixture)", "0.1.0", "0123456789abcdef0123456789abcdef01234567", seed, Synthetic: true)
            { Method = "maximum likelihood; 68% intervals from the Hessian" },
            Data = new DataSummary(n + 17, n, 17, [new("redshift missing or not positive", 9), new("angular size not positive", 5), new("surface brightness not a number", 3)])
            { SizeDefinition = "effective (half-light) radius", Band = "r" },
            Objects = new ObjectPoints(z) { ZErr = ze, ThetaArcsec = th, ThetaErrArcsec = the, Mu = mu, MuErr = mue },
            Models = models,
            ThetaBins = BinnedStatistics.Compute(z, th, edges, BinnedStatistics.Statistic.Median, 200, seed),
            MuBins = BinnedStatistics.Compute(z, mu, edges, BinnedStatistics.Statistic.Mean, 200, seed + 1),
            Assumptions =
            [
                new("cosmology priors", "Flat ΛCDM with H0 fixed at 70 km/s/Mpc and a uniform prior 0.05 < Ωm < 1."),
                new("evolution form", "Sizes evolve as R ∝ (1+z)^a and luminosities as L ∝ (1+z)^b, the same power law in every model."),
                new("selection model", "No surface-brightness or magnitude limit was modelled (synthetic sample without selection)."),
                new("K-corrections", "None applied (synthetic bolometric surface brightness)."),
            ],
            Posterior = posterior ? Posterior(rng) : null,
            Power = power ? new PowerCurve("catalogue size", "objects",
            [
                new PowerLine("truth lcdm: ΔBIC > 6 against static-linear", [50, 100, 200, 400, 800], [0.22, 0.41, 0.68, 0.89, 0.98], [0.16, 0.34, 0.61, 0.85, 0.96], [0.28, 0.48, 0.74, 0.92, 0.99]),
                new PowerLine("truth static-linear: ΔBIC > 6 against lcdm", [50, 100, 200, 400, 800], [0.15, 0.30, 0.55, 0.80, 0.95], [0.10, 0.24, 0.48, 0.75, 0.92], [0.21, 0.37, 0.62, 0.85, 0.97]),
            ]) : null,
            Manifest = new RunManifest
            {
                SizeTestVersion = "0.1.0", GitCommit = "0123456789abcdef0123456789abcdef01234567", Seed = seed,
                StudyFilePath = "studies/synthetic.toml", StudyFileText = "# synthetic study (test fixture)\nseed = 7\n",
                Inputs = [new ManifestInput("demo-catalogs/synthetic.csv", new string('a', 64))],
            },
        };
        return data;
    }

    private static BinnedSizeEvolution Binned(string group, double r0, double a, double bend)
    {
        double[] e = [0.05, 0.3, 0.6, 1.0, 1.6, 3.0];
        var bins = new List<BinnedSize>();
        for (int k = 0; k < 5; k++)
        {
            double zEff = Math.Sqrt((1 + e[k]) * (1 + e[k + 1])) - 1;
            double r = r0 * Math.Pow(1 + zEff, a) * Math.Exp(bend * k * k / 8.0);
            bins.Add(new BinnedSize(e[k], e[k + 1], zEff, r, r * 0.94, r * 1.06, 60));
        }
        return new BinnedSizeEvolution(group, bins) { PowerLaw = new PowerLawSize(r0, a, a - 0.05, a + 0.05) };
    }

    /// <summary>Five μ0 bins (dimming removed) on μ0 − 2.5 b log10(1+z), the ΛCDM model's SB truth above, with its power law.</summary>
    private static BinnedSurfaceBrightnessEvolution BinnedSb(double mu0, double b)
    {
        double[] e = [0.05, 0.3, 0.6, 1.0, 1.6, 3.0];
        var bins = new List<BinnedSurfaceBrightness>();
        for (int k = 0; k < 5; k++)
        {
            double zEff = Math.Sqrt((1 + e[k]) * (1 + e[k + 1])) - 1;
            double m = mu0 - 2.5 * b * Math.Log10(1 + zEff);
            bins.Add(new BinnedSurfaceBrightness(e[k], e[k + 1], zEff, m, m - 0.04, m + 0.04, 60));
        }
        return new BinnedSurfaceBrightnessEvolution("", bins) { PowerLaw = new PowerLawSurfaceBrightness(mu0, b, b - 0.05, b + 0.05) };
    }

    private static CornerDraws Posterior(Random rng)
    {
        var rows = new List<double[]>();
        for (int i = 0; i < 4000; i++)
        {
            double g1 = Gauss(rng), g2 = Gauss(rng), g3 = Gauss(rng);
            rows.Add([0.31 + 0.04 * g1, -0.98 + 0.1 * (0.7 * g1 + 0.71 * g2), 0.11 + 0.01 * g3]);
        }
        return new CornerDraws("lcdm", ["Ωm", "size evolution a", "scatter"], [Figures.AxisSpecDimensionless, Figures.AxisSpecDimensionless, "dex"], rows);
    }

    private static class Figures { public const string AxisSpecDimensionless = SizeTest.Reporting.Figures.AxisSpec.Dimensionless; }

    private static ParameterEstimate P(string name, double v, double lo, double hi, bool fixedP = false, string unit = "") => new(name, v, lo, hi, fixedP, unit);

    private static ModelReport Model(string name, int k, double lnL, int n, IReadOnlyList<ParameterEstimate> ps)
    {
        double aic = 2 * k - 2 * lnL, bic = k * Math.Log(n) - 2 * lnL, aicc = aic + 2.0 * k * (k + 1) / (n - k - 1);
        return new ModelReport(new ModelFitSummary { Name = name, Parameters = ps, LogLikelihood = lnL, K = k, N = n, Aic = aic, Aicc = aicc, Bic = bic, Converged = true, ExitReason = new ExitReason(ExitCause.Converged, "gradient below tolerance") });
    }

    private static List<ModelReport> WithComparison(List<ModelReport> models)
    {
        double minA = models.Min(m => m.Fit.Aic), minB = models.Min(m => m.Fit.Bic);
        var w = models.Select(m => Math.Exp(-(m.Fit.Aic - minA) / 2)).ToArray();
        double sw = w.Sum();
        return models.Select((m, i) => m with { Fit = m.Fit with { DeltaAic = m.Fit.Aic - minA, DeltaBic = m.Fit.Bic - minB, AkaikeWeight = w[i] / sw } }).ToList();
    }

    private static double Gauss(Random r) => Math.Sqrt(-2 * Math.Log(1 - r.NextDouble())) * Math.Cos(2 * Math.PI * r.NextDouble());
}
