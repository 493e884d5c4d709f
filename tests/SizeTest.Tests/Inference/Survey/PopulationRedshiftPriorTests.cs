using SizeTest.Cosmology;
using MathNet.Numerics.Distributions;
using SizeTest.Foundation.Randomness;
using SizeTest.Inference.Survey;
using SizeTest.Simulation;
using Xunit;
using static SizeTest.Tests.Inference.Survey.SurveyFitting;

namespace SizeTest.Tests.Inference.Survey;

/// <summary>
/// The population redshift prior of the photo-z marginalisation: the deconvolution itself against a closed form, and the bias of a
/// flat prior over the observed range that it removes (injection–recovery, the CLI's default path through <see cref="SurveyRequest.Build"/>).
/// </summary>
public sealed class PopulationRedshiftPriorTests(Xunit.Abstractions.ITestOutputHelper output)
{
    [Fact]
    public void TheDeconvolvedPriorHasThePopulationsVarianceNotTheObservedOne()
    {
        // True z ~ N(1.5, 0.3²), observed with σ = 0.2: the observed z have variance 0.3² + 0.2² = 0.13 (variances of independent
        // sums add, closed form); the deconvolved prior should have the population's 0.09. Its variance is Σ p_k (c_k − m)² + s²
        // (mixture of N(c_k, s²)). 5000 objects: the sample variance of the truth alone has a relative standard error
        // √(2/5000) = 2%, the deconvolution more; ±15% of 0.09 still excludes 0.13 (from memory: the NPMLE of a mixing distribution
        // is consistent but converges slowly).
        var (z, e) = Sample(5, 5000, 0.2);
        var prior = PopulationRedshiftPrior.Estimate(z, e, z.Min(), z.Max());
        double mean = 0, var = 0;
        for (int k = 0; k < prior.Centres.Count; k++) mean += prior.Weights[k] * prior.Centres[k];
        for (int k = 0; k < prior.Centres.Count; k++) var += prior.Weights[k] * Math.Pow(prior.Centres[k] - mean, 2);
        var += prior.Width * prior.Width;
        output.WriteLine($"K = {prior.Centres.Count}, s = {prior.Width:G4}, {prior.Iterations} EM steps: mean {mean:F4}, variance {var:F4} (population 0.09, observed 0.13)");
        Assert.InRange(mean, 1.48, 1.52);
        Assert.InRange(var, 0.09 * 0.85, 0.09 * 1.15);
        Assert.Equal(1.0, prior.Weights.Sum(), 12);
    }

    [Fact]
    public void TheAcceleratedIterationConvergesToTheMaximumLikelihoodWeights()
    {
        // ℓ(p) = Σ_i ln Σ_k p_k L_ik is concave in p; at its maximum on the simplex the Lagrange (KKT) conditions hold (closed form:
        // ∂ℓ/∂p_k = N g_k with g_k = (1/N) Σ_i L_ik / Σ_j p_j L_ij, and Σ_k p_k g_k = 1 fixes the multiplier): g_k = 1 where p_k > 0,
        // g_k ≤ 1 where p_k = 0. The 10⁻⁷ step criterion leaves g_k within about 10⁻³ of 1: over 30 mocks of 400–5000 objects
        // (σ_z = 0.02–0.1 (1+z)) max |g_k − 1| on p_k > 10⁻⁴ was 7·10⁻⁴, and ln L was within 10⁻³ of plain EM run to 10⁻¹¹ (a numpy
        // re-implementation, measured for this change). Plain EM needed 3 900–42 000 steps on six of them, more than the old cap of 500.
        var (z, e) = Sample(5, 5000, 0.2);
        var prior = PopulationRedshiftPrior.Estimate(z, e, z.Min(), z.Max());
        Assert.True(prior.Converged);
        Assert.InRange(prior.FinalChange, 0, PopulationRedshiftPrior.Tolerance);
        Assert.InRange(prior.Iterations, 1, PopulationRedshiftPrior.MaxIterations - 1);
        Assert.Null(prior.ConvergenceWarning());
        Assert.Contains("steps, converged", prior.Describe(), StringComparison.Ordinal);
        var g = KktGradient(prior, z, e);
        double worst = 0, worstZero = 0;
        for (int k = 0; k < g.Length; k++)
            if (prior.Weights[k] > 1e-4) worst = Math.Max(worst, Math.Abs(g[k] - 1));
            else worstZero = Math.Max(worstZero, g[k] - 1);
        output.WriteLine($"{prior.Iterations} steps, last change {prior.FinalChange:G3}: max |g_k − 1| on p_k > 1e-4 {worst:G3}, max g_k − 1 elsewhere {worstZero:G3}");
        Assert.InRange(worst, 0, 2e-3);
        Assert.True(worstZero <= 2e-3, $"a vanishing weight with g_k − 1 = {worstZero:G3} > 0 could still raise ln L");
    }

    [Fact]
    public void TheAcceleratedIterationReachesPlainEmsMaximumOnACommittedSample()
    {
        // Reference: Reference/Inference/population_em_reference.py (numpy 1.24.2), plain EM on the same 400 objects run until no
        // weight moves by more than 1e-12 (43 659 steps; the old cap was 500): 15 components, ln L = −421.3691697474. The accelerated
        // iteration stops at a step change of 1e-7; measured 620 steps, ln L 3.3e-7 below the reference, weights within 2.6e-4.
        var rows = File.ReadAllLines(Path.Combine(AppContext.BaseDirectory, "Reference", "Inference", "photoz_truncated_prior_mock.csv")).Skip(1)
            .Select(l => l.Split(',')).ToArray();
        var z = rows.Select(r => double.Parse(r[1], System.Globalization.CultureInfo.InvariantCulture)).ToArray();
        var e = rows.Select(r => double.Parse(r[2], System.Globalization.CultureInfo.InvariantCulture)).ToArray();
        var reference = File.ReadAllLines(Path.Combine(AppContext.BaseDirectory, "Reference", "Inference", "population_em_reference.txt"));
        double refLnL = double.Parse(reference.Single(l => l.StartsWith("lnL ", StringComparison.Ordinal))[4..], System.Globalization.CultureInfo.InvariantCulture);
        var refWeights = reference.Single(l => l.StartsWith("weights ", StringComparison.Ordinal))[8..].Split(' ')
            .Select(w => double.Parse(w, System.Globalization.CultureInfo.InvariantCulture)).ToArray();
        var prior = PopulationRedshiftPrior.Estimate(z, e, z.Min(), z.Max());
        Assert.True(prior.Converged);
        Assert.Equal(refWeights.Length, prior.Weights.Count);
        double lnL = 0;
        for (int i = 0; i < z.Length; i++)
        {
            double v = prior.Width * prior.Width + e[i] * e[i], den = 0;
            for (int k = 0; k < prior.Centres.Count; k++)
                den += prior.Weights[k] * Math.Exp(-0.5 * Math.Pow(z[i] - prior.Centres[k], 2) / v) / Math.Sqrt(2 * Math.PI * v);
            lnL += Math.Log(den);
        }
        double maxDiff = prior.Weights.Zip(refWeights, (a, b) => Math.Abs(a - b)).Max();
        output.WriteLine($"{prior.Iterations} steps: ln L {lnL:F10} (reference {refLnL:F10}), max |Δp_k| {maxDiff:G3}");
        Assert.InRange(lnL, refLnL - 1e-5, refLnL + 1e-9); // cannot exceed the maximum (beyond rounding)
        Assert.InRange(maxDiff, 0, 2e-3); // the weights trade off along a flat ridge: close, not equal
    }

    [Fact]
    public void AnIterationStoppedByItsCapIsNotConvergedAndTheFitSaysSo()
    {
        // Five EM steps from flat weights are far from the fixed point (the fifth still moved a weight by 2.2·10⁻³, measured; the default cap
        // needed 824 steps here), so the cap stops it.
        var obs = Draw(Lcdm, 400, 41, "uniform:0.5:3", errors: new MeasurementErrors(0.05, MuErrorMag: 0, PhotoZError: 0.05)).ToObservables();
        var notes = new List<string>();
        var model = new SurveyRequest { PopulationPriorMaxSteps = 5 }.Build(obs, SizeTest.Inference.ObservableKind.Size, notes);
        var prior = model.RedshiftPopulation!;
        Assert.False(prior.Converged);
        Assert.Equal(5, prior.Iterations);
        output.WriteLine($"cap 5: last change {prior.FinalChange:G3}");
        Assert.True(prior.FinalChange > PopulationRedshiftPrior.Tolerance, $"last change {prior.FinalChange:G3}");
        var warning = Assert.Single(notes, n => n.StartsWith("warning: the population redshift prior did not converge", StringComparison.Ordinal));
        Assert.Contains("cap of 5 steps", warning, StringComparison.Ordinal);
        Assert.Contains("{z_prior_shape} flat", warning, StringComparison.Ordinal);
        Assert.Contains("steps, NOT converged", prior.Describe(), StringComparison.Ordinal);
        var record = SurveySettings.From(model)!.RedshiftPopulation!;
        Assert.False(record.Converged);
        Assert.Equal(5, record.EmSteps);
        Assert.Equal(prior.FinalChange, record.FinalChange);
        Assert.Equal(prior.Weights, record.Weights);

        // The same sample with the default cap converges, and no warning is written.
        notes.Clear();
        var converged = new SurveyRequest().Build(obs, SizeTest.Inference.ObservableKind.Size, notes).RedshiftPopulation!;
        output.WriteLine($"default cap: {converged.Iterations} steps, last change {converged.FinalChange:G3}");
        Assert.True(converged.Converged);
        Assert.DoesNotContain(notes, n => n.Contains("did not converge", StringComparison.Ordinal));
        Assert.True(SurveySettings.From(new SurveyRequest().Build(obs, SizeTest.Inference.ObservableKind.Size, notes))!.RedshiftPopulation!.Converged);
    }

    // True z ~ N(1.5, 0.3²) observed with error σ.
    private static (double[] Z, double[] E) Sample(int seed, int n, double sigma)
    {
        var rng = SeededRandom.Create(seed);
        var z = new double[n];
        var e = new double[n];
        for (int i = 0; i < n; i++)
        {
            z[i] = 1.5 + 0.3 * Normal.Sample(rng, 0, 1) + sigma * Normal.Sample(rng, 0, 1);
            e[i] = sigma;
        }
        return (z, e);
    }

    // g_k = (1/N) Σ_i L_ik / Σ_j p_j L_ij with L_ik = N(z_i; c_k, s² + σ_i²), recomputed here from the prior's centres, width and weights.
    private static double[] KktGradient(PopulationRedshiftPrior prior, double[] z, double[] e)
    {
        int k = prior.Centres.Count;
        var g = new double[k];
        var l = new double[k];
        for (int i = 0; i < z.Length; i++)
        {
            double v = prior.Width * prior.Width + e[i] * e[i], den = 0;
            for (int j = 0; j < k; j++)
            {
                l[j] = Math.Exp(-0.5 * Math.Pow(z[i] - prior.Centres[j], 2) / v) / Math.Sqrt(2 * Math.PI * v);
                den += prior.Weights[j] * l[j];
            }
            for (int j = 0; j < k; j++) g[j] += l[j] / den / z.Length;
        }
        return g;
    }

    [Fact]
    public void APriorRangeAwayFromEveryObjectLeavesTheWeightsFlatNotUndefined()
    {
        // Every N(z_i; c_k, s² + σ²) underflows to 0 (z ≈ 1, σ = 0.01, range [5, 6]): EM has no information, so the weights must
        // stay at their flat start 1/K (closed form) instead of 0/0.
        var prior = PopulationRedshiftPrior.Estimate([1.0, 1.1, 0.9], [0.01, 0.01, 0.01], 5, 6);
        Assert.All(prior.Weights, w => Assert.Equal(1.0 / prior.Weights.Count, w, 12));
        Assert.True(prior.Converged); // nothing to iterate: the weights cannot move
        Assert.True(double.IsFinite(prior.LogDensity(5.5)));
    }

    private static (double Population, double Flat) FitBoth(long seed, int n)
    {
        // z_true uniform on [0.5, 3], σ_z = 0.05 (1+z), 5% log-normal size errors, no stated prior: the range is the observed one.
        var obs = Draw(Lcdm, n, seed, "uniform:0.5:3", errors: new MeasurementErrors(0.05, MuErrorMag: 0, PhotoZError: 0.05)).ToObservables();
        double A(RedshiftPriorShape shape)
        {
            var model = new SurveyRequest(RedshiftPriorShape: shape).Build(obs, SizeTest.Inference.ObservableKind.Size, new List<string>());
            Assert.True(model.MarginaliseRedshift);
            Assert.Equal(shape == RedshiftPriorShape.Population, model.RedshiftPopulation is not null);
            return Est(Fit(WorldModels.LambdaCdm, obs, model).Summary, "size_evolution").Value;
        }
        return (A(RedshiftPriorShape.Population), A(RedshiftPriorShape.Flat));
    }

    [Fact]
    public void APriorFlatOverTheObservedRangeBiasesTheEvolutionAndThePopulationPriorRemovesIt()
    {
        // Measured with the CLI over 30 mocks of 1500 objects (this design): flat a = −0.954 (40 mocks), population a = −0.989,
        // per-mock σ_a = 0.043. Here 24 mocks: the standard error of the mean is 0.043/√24 = 0.009, so |mean + 1| < 0.025 is ±2.8 SE
        // for the population prior, and a flat-prior mean above −0.975 shows its bias (+0.046 measured; 0.025 is 2.3 SE below that).
        int m = 24;
        double pop = 0, flat = 0;
        for (int k = 0; k < m; k++)
        {
            var (p, f) = FitBoth(500 + k, 1500);
            pop += p / m;
            flat += f / m;
        }
        output.WriteLine($"mean a over {m} mocks: population prior {pop:F4}, flat prior over the observed range {flat:F4} (truth −1)");
        Assert.InRange(pop, -1.025, -0.975);
        Assert.True(flat > -0.975, $"the flat prior's mean a = {flat:F4} should be biased high");
    }

    [Fact]
    public void DefaultPriorIntervalsCoverTheTruthAtTheirNominalRate()
    {
        // The CLI's default path (population prior, range the observed one) over 100 mocks of 400 objects of the design above:
        // coverage of the 68.3% Hessian interval of a; the binomial standard error is √(0.683·0.317/100) = 0.047, so 61–75% is the
        // ±1.5σ band issue 12 asks for (common practice). Measured with the CLI at 1500 objects: 63% (30 mocks; flat prior 45%).
        int hits = 0, m = 100;
        for (int k = 0; k < m; k++)
        {
            var obs = Draw(Lcdm, 400, 2000 + k, "uniform:0.5:3", errors: new MeasurementErrors(0.05, MuErrorMag: 0, PhotoZError: 0.05)).ToObservables();
            var model = new SurveyRequest().Build(obs, SizeTest.Inference.ObservableKind.Size, new List<string>());
            if (Within(Est(Fit(WorldModels.LambdaCdm, obs, model).Summary, "size_evolution"), -1.0)) hits++;
        }
        output.WriteLine($"coverage over {m} mocks with the population prior: {hits}%");
        Assert.InRange(hits / (double)m, 0.61, 0.75);
    }
}
