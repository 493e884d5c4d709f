using SizeTest.Cosmology;
using Xunit;

namespace SizeTest.Tests.Cosmology;

/// <summary>The fast tables over the whole parameter space, and under concurrent first use.</summary>
public sealed class FastDistanceRobustnessTests
{
    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    [InlineData(3)]
    public void RandomParameterSetsAreRefusedOrAccurate(int seed)
    {
        var rng = new Random(seed);
        int accepted = 0;
        for (int k = 0; k < 120; k++)
        {
            var values = new Dictionary<string, double>
            {
                ["h0"] = 50 + 50 * rng.NextDouble(),
                ["omega_m"] = 2 * rng.NextDouble(),
                ["omega_lambda"] = -1 + 3 * rng.NextDouble(),
                ["t_cmb"] = rng.NextDouble() < 0.5 ? 0 : 2.7255,
                ["w0"] = -1.5 + rng.NextDouble(),
                ["wa"] = -1 + 2 * rng.NextDouble(),
            };
            if (!WorldModels.W0WaCdm.TryCreate(values, out var model, out var error))
            {
                Assert.Contains("no big bang", error);
                continue;
            }
            accepted++;
            var m = (FlrwModel)model;
            var z = Enumerable.Range(0, 15).Select(_ => 10 * rng.NextDouble()).ToArray();
            var da = new double[z.Length];
            m.AngularDiameterDistances(z, da);
            for (int i = 0; i < z.Length; i++)
            {
                // Reference: adaptive Gauss–Kronrod (FlrwModel.AngularDiameterDistanceByQuadrature); target 1e-9 (issue 2).
                double rel = TestMath.Relative(da[i], m.AngularDiameterDistanceByQuadrature(z[i]));
                Assert.True(rel <= 1e-9, $"{string.Join(", ", values.Select(p => $"{p.Key}={p.Value}"))} z={z[i]}: {rel:E2}");
            }
        }
        Assert.True(accepted > 30, $"only {accepted} parameter sets accepted");
    }

    [Fact]
    public void ConcurrentFirstUseGivesIdenticalResults()
    {
        var m = new LambdaCdmModel(70, 0.27, 0.8, 2.7255);
        var z = Enumerable.Range(1, 2000).Select(i => i * 0.005).ToArray();
        var results = new double[8][];
        Parallel.For(0, 8, t =>
        {
            var r = new double[z.Length];
            m.AngularDiameterDistances(z, r);
            results[t] = r;
        });
        for (int t = 1; t < 8; t++) Assert.Equal(results[0], results[t]);
    }
}
