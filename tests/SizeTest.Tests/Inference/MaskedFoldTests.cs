using SizeTest.Inference;
using SizeTest.Inference.Evaluation;
using SizeTest.Photometry;
using Xunit;

namespace SizeTest.Tests.Inference;

/// <summary>
/// Cross-validation folds as row masks over the one bound row set (<see cref="RowSumLikelihood.Reweighted"/>) against
/// the copy of the fold's rows that <see cref="EvaluationBackend.Bind"/> builds for the same 0/1 weights. The masked Gram
/// matrix adds the included rows' values in the same order as the copy's (SizeSliceGram), and the grid and per-object
/// arrays are the same numbers, so value and gradient must agree bit for bit (exact equality; the reference is the copy,
/// the path used before masks). Where a kernel cannot mask (a selection cut), the copy is used and agreement is again exact.
/// </summary>
public sealed class MaskedFoldTests
{
    private static Observables Sample(int n) =>
        MockCatalogue.Draw(TestWorldModels.FlatLcdm.Create(new Dictionary<string, double>()), n, new MockCatalogue.Truth(), seed: 17, zMin: 0.05, zMax: 4);

    public static TheoryData<string, bool> Cases() => new()
    {
        { "lcdm-free-omega-m", false },  // redshift grid, Gram path
        { "lcdm-fixed", false },         // exact per-object D_A, Gram path
        { "lcdm-free-omega-m", true },   // minimum-size cut: no Gram path, the copy is bound
    };

    [Theory]
    [MemberData(nameof(Cases))]
    public void MaskedFoldEqualsBoundCopyBitForBit(string model, bool cut)
    {
        // 70 000 objects: 69 backend chunks of 1024 rows (the last partial) and, with 5 folds, training sets above the
        // 65 536-row threshold where evaluations split over threads.
        var obs = Sample(70_000);
        var nm = cut ? new NuisanceModel(ObservableKind.Size, Selection: new SelectionLimits(MinThetaArcsec: 0.05)) : new NuisanceModel(ObservableKind.Size);
        var free = model == "lcdm-free-omega-m" ? new ParameterOverrides(Free: new HashSet<string> { "omega_m" }) : null;
        var h = Hypothesis.Create(TestWorldModels.FlatLcdm, nm, free);
        var backend = EvaluationBackend.InProcess(obs);
        var whole = backend.Bind(h);
        var foldOf = CrossValidation.AssignFolds(obs.Count, 5, seed: 9);
        double[] theta = free is null ? [4.1, -0.9, 0.21] : [0.27, 4.1, -0.9, 0.21];
        foreach (int f in new[] { 0, 3 })
        {
            foreach (var weights in new[] { Array.ConvertAll(foldOf, k => k != f ? 1 : 0), Array.ConvertAll(foldOf, k => k == f ? 1 : 0) })
            {
                var masked = whole.Reweighted(weights);
                var copy = backend.Bind(h, weights);
                Assert.Equal(!cut, masked.SharesRows); // the mask is used wherever the kernel allows it
                var g1 = new double[theta.Length];
                var g2 = new double[theta.Length];
                Assert.Equal(BitConverter.DoubleToInt64Bits(copy.LogDensity(theta)), BitConverter.DoubleToInt64Bits(masked.LogDensity(theta)));
                double l1 = masked.LogDensityAndGradient(theta, g1), l2 = copy.LogDensityAndGradient(theta, g2);
                Assert.Equal(BitConverter.DoubleToInt64Bits(l2), BitConverter.DoubleToInt64Bits(l1));
                for (int j = 0; j < theta.Length; j++) Assert.Equal(BitConverter.DoubleToInt64Bits(g2[j]), BitConverter.DoubleToInt64Bits(g1[j]));
                // Refits with a parameter held (likelihood-ratio tests, profiles) keep the mask.
                var m0 = masked.WithFixed("size_evolution", 0);
                var c0 = copy.WithFixed("size_evolution", 0);
                double[] held = free is null ? [4.1, 0.21] : [0.27, 4.1, 0.21];
                Assert.Equal(BitConverter.DoubleToInt64Bits(c0.LogDensity(held)), BitConverter.DoubleToInt64Bits(m0.LogDensity(held)));
            }
        }
    }

    [Fact]
    public void CrossValidationOnMasksEqualsCrossValidationOnCopies()
    {
        // The whole k-fold run: folds as masks (the bound likelihood handed in) against folds bound as copies (the
        // reference; a held-out density and each training fit's optimum must be identical when every sum is).
        var obs = Sample(12_000);
        var h = Hypothesis.Create(TestWorldModels.FlatLcdm, new NuisanceModel(ObservableKind.Size), new ParameterOverrides(Free: new HashSet<string> { "omega_m" }));
        var backend = EvaluationBackend.InProcess(obs);
        var foldOf = CrossValidation.AssignFolds(obs.Count, 4, seed: 5);
        var masks = CrossValidation.Run(backend, h, foldOf, 4, whole: backend.Bind(h));
        // Bound with weights of one, the whole-sample likelihood cannot mask: its folds are bound as copies.
        var copies = CrossValidation.Run(backend, h, foldOf, 4, whole: backend.Bind(h, Enumerable.Repeat(1, obs.Count).ToArray()));
        Assert.Equal(copies.FoldLogDensities, masks.FoldLogDensities);
        Assert.Equal(copies.LogPredictiveDensity, masks.LogPredictiveDensity);
    }
}
