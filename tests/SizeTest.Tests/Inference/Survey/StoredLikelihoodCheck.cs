using System.Globalization;
using SizeTest.Inference;
using Xunit;

namespace SizeTest.Tests.Inference.Survey;

/// <summary>
/// Compares a likelihood's ln L and gradient, at the suggested start moved by +3% (at least 0.02) in every free parameter, with values
/// stored from the implementation a kernel replaced: 10⁻¹² relative (ln L) and 10⁻¹² (|g| + 1) (gradient), common practice for "same sum
/// in another order". Also checks that two slices split at an odd row add up to the whole, with and without the gradient.
/// </summary>
internal static class StoredLikelihoodCheck
{
    /// <summary>Runs the checks; prints the values (the stored line's format) and, when <paramref name="printVariable"/> is set to 1, only records.</summary>
    public static void AssertMatchesStored(HypothesisLikelihood lik, string kind, IReadOnlyDictionary<string, double[]> stored, string printVariable,
        Xunit.Abstractions.ITestOutputHelper output)
    {
        var t = SizeTest.Tests.Inference.GradientTests.OffMaximum(lik);
        var fp = lik.Hypothesis.FreeParameters;
        var g = new double[t.Length];
        double v = lik.LogDensityAndGradient(t, g);
        double[] got = [v, .. g];
        output.WriteLine($"[\"{kind}\"] = [{string.Join(", ", got.Select(x => x.ToString("R", CultureInfo.InvariantCulture)))}],");

        var e = lik.Prepare(t, true)!;
        int k = 137;
        var g1 = new double[t.Length];
        var g2 = new double[t.Length];
        double v1 = lik.SumSliceWithGradient(e, 0, k, g1), v2 = lik.SumSliceWithGradient(e, k, lik.Count, g2);
        Assert.True(Math.Abs(v1 + v2 - v) <= 1e-12 * Math.Abs(v), $"{kind}: slices {v1 + v2:R}, whole {v:R}");
        Assert.True(Math.Abs(lik.SumSlice(e, 0, k) - v1) <= 1e-12 * Math.Abs(v1), $"{kind}: slice without gradient {lik.SumSlice(e, 0, k):R}, with {v1:R}");
        for (int j = 0; j < g.Length; j++)
            Assert.True(Math.Abs(g1[j] + g2[j] - g[j]) <= 1e-12 * (Math.Abs(g[j]) + 1), $"{kind}: {fp[j].Name}: slices {g1[j] + g2[j]:R}, whole {g[j]:R}");

        if (Environment.GetEnvironmentVariable(printVariable) == "1") return;
        var want = stored[kind];
        Assert.Equal(want.Length, got.Length);
        output.WriteLine(FormattableString.Invariant($"{kind}: ln L relative {Math.Abs(got[0] / want[0] - 1):E1}, gradient max |Δ|/(|g| + 1) {Enumerable.Range(1, got.Length - 1).Max(j => Math.Abs(got[j] - want[j]) / (Math.Abs(want[j]) + 1)):E1}"));
        Assert.True(Math.Abs(got[0] - want[0]) <= 1e-12 * Math.Abs(want[0]), $"{kind}: ln L {got[0]:R}, stored {want[0]:R}");
        for (int j = 1; j < got.Length; j++)
            Assert.True(Math.Abs(got[j] - want[j]) <= 1e-12 * (Math.Abs(want[j]) + 1), $"{kind}: {fp[j - 1].Name}: {got[j]:R}, stored {want[j]:R}");
    }
}
