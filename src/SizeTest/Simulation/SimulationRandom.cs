using System.Numerics;

namespace SizeTest.Simulation;

/// <summary>
/// The simulation's own seeded random source: xoshiro256** 1.0 (Blackman &amp; Vigna 2018,
/// "Scrambled linear pseudorandom number generators", ACM TOMS 47, 36 (2021)), seeded through
/// SplitMix64 (Steele, Lea &amp; Flood 2014), as its authors recommend. It does not depend on
/// <see cref="System.Random"/>'s implementation, so a seed gives the same stream on every .NET
/// version. Normal deviates use the Marsaglia–Bray polar method (Marsaglia &amp; Bray 1964,
/// SIAM Review 6, 260), keeping the second deviate of each pair.
/// </summary>
/// <remarks>
/// A mutable struct: pass it by <c>ref</c>. Independent streams for parallel chunks come from
/// <see cref="ForStream"/>, which hashes (seed, stream index) with SplitMix64, so the numbers a chunk
/// draws depend only on the seed and the chunk index, never on thread scheduling.
/// Bit-for-bit reproducibility holds on one platform; Math.Log and Math.Sqrt
/// are IEEE-exact or correctly rounded on x64 and arm64 .NET, so in practice streams agree across them too.
/// </remarks>
public struct SimulationRandom
{
    private ulong _s0, _s1, _s2, _s3;
    private double _spare;
    private bool _hasSpare;

    /// <summary>Creates a generator whose state is four SplitMix64 outputs starting from <paramref name="seed"/>.</summary>
    public SimulationRandom(ulong seed)
    {
        ulong x = seed;
        _s0 = SplitMix64(ref x);
        _s1 = SplitMix64(ref x);
        _s2 = SplitMix64(ref x);
        _s3 = SplitMix64(ref x);
        _spare = 0;
        _hasSpare = false;
    }

    /// <summary>
    /// The generator of stream <paramref name="stream"/> (e.g. a chunk or mock index) under
    /// <paramref name="seed"/>: seeded with SplitMix64 of seed ⊕ SplitMix64(stream + golden-ratio constant).
    /// </summary>
    public static SimulationRandom ForStream(long seed, long stream) => new(DeriveSeed(seed, stream));

    /// <summary>A derived 64-bit seed for stream <paramref name="stream"/> under <paramref name="seed"/> (deterministic).</summary>
    public static ulong DeriveSeed(long seed, long stream)
    {
        ulong s = unchecked((ulong)stream + 0x9E3779B97F4A7C15UL);
        ulong h = SplitMix64(ref s);
        ulong t = unchecked((ulong)seed) ^ h;
        return SplitMix64(ref t);
    }

    /// <summary>SplitMix64 step (Steele, Lea &amp; Flood 2014): advances <paramref name="x"/> and returns the mixed output.</summary>
    public static ulong SplitMix64(ref ulong x)
    {
        x = unchecked(x + 0x9E3779B97F4A7C15UL);
        ulong z = x;
        z = unchecked((z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL);
        z = unchecked((z ^ (z >> 27)) * 0x94D049BB133111EBUL);
        return z ^ (z >> 31);
    }

    /// <summary>The next 64 random bits (xoshiro256**).</summary>
    public ulong NextUInt64()
    {
        ulong result = unchecked(BitOperations.RotateLeft(_s1 * 5, 7) * 9);
        ulong t = _s1 << 17;
        _s2 ^= _s0;
        _s3 ^= _s1;
        _s1 ^= _s2;
        _s0 ^= _s3;
        _s2 ^= t;
        _s3 = BitOperations.RotateLeft(_s3, 45);
        return result;
    }

    /// <summary>A uniform deviate in the open interval (0, 1): (k + ½)·2⁻⁵³ for the top 53 bits k, never 0 or 1.</summary>
    public double NextOpenDouble() => ((NextUInt64() >> 11) + 0.5) * (1.0 / 9007199254740992.0);

    /// <summary>A uniform deviate in [0, 1): k·2⁻⁵³ for the top 53 bits k.</summary>
    public double NextDouble() => (NextUInt64() >> 11) * (1.0 / 9007199254740992.0);

    /// <summary>
    /// A standard normal deviate by the Marsaglia–Bray polar method: draw (u, v) uniform in the square
    /// [−1, 1)² until 0 &lt; s = u² + v² &lt; 1, then u·f and v·f with f = √(−2 ln s / s) are independent
    /// N(0, 1); the second is kept for the next call.
    /// </summary>
    public double NextGaussian()
    {
        if (_hasSpare)
        {
            _hasSpare = false;
            return _spare;
        }
        double u, v, s;
        do
        {
            u = 2.0 * NextDouble() - 1.0;
            v = 2.0 * NextDouble() - 1.0;
            s = u * u + v * v;
        } while (s >= 1.0 || s == 0.0);
        double f = Math.Sqrt(-2.0 * Math.Log(s) / s);
        _spare = v * f;
        _hasSpare = true;
        return u * f;
    }
}
