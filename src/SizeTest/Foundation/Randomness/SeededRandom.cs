namespace SizeTest.Foundation.Randomness;

/// <summary>
/// The one place where the seeded <see cref="Random"/> streams of the analysis are made (optimiser starts, samplers,
/// cross-validation folds, bootstrap resamples of reported statistics). Given a seed, .NET's seeded
/// <see cref="Random"/> keeps its legacy subtractive generator (Knuth 1981, TAOCP vol. 2, §3.6), so a seed gives the same
/// stream on every .NET version and machine; no unseeded or shared generator is used anywhere in the library.
/// Mock catalogues draw from their own counter-based source, <c>Simulation.SimulationRandom</c>, whose streams split by index.
/// <c>tests/SizeTest.Tests/Architecture/VocabularyTests.cs</c> fails on <c>new Random(</c> anywhere else in src/.
/// </summary>
public static class SeededRandom
{
    /// <summary>A generator whose whole stream is fixed by <paramref name="seed"/>.</summary>
    public static Random Create(int seed) => new(seed);
}
