namespace SizeTest.Inference;

/// <summary>
/// Per-row weights of the Poisson bootstrap: each replicate gives row i a count w_i ~ Poisson(1) instead of drawing n
/// rows with replacement (the two agree as n → ∞; Hanley &amp; MacGibbon 2006, Chamandy et al. 2012 — from memory).
/// The count is a pure function of (seed, replicate, global row), so each rank draws its own rows' weights without
/// communication and the replicate does not depend on how rows are split between ranks.
/// </summary>
public static class PoissonBootstrapWeights
{
    private const double InvE = 0.36787944117144233; // e^−1 = P(w = 0)

    /// <summary>The Poisson(1) count of row <paramref name="row"/> in replicate <paramref name="replicate"/>.</summary>
    public static int Weight(int seed, int replicate, long row)
    {
        ulong x = Mix(Mix(Mix(0x5EED_0000_0000_0001UL ^ (uint)seed) ^ (uint)replicate) ^ (ulong)row);
        double u = (x >> 11) * (1.0 / (1UL << 53));
        // Inversion of the Poisson(1) CDF: F(k) = e^−1 Σ_{j≤k} 1/j!.
        int k = 0;
        double p = InvE, f = p;
        while (u >= f && k < 40)
        {
            k++;
            p /= k;
            f += p;
        }
        return k;
    }

    /// <summary>Rows of a replicate for a share with global rows <paramref name="rows"/>: local index i repeated w_i times.</summary>
    public static int[] Rows(int seed, int replicate, IReadOnlyList<long> rows)
    {
        ArgumentNullException.ThrowIfNull(rows);
        var list = new List<int>(rows.Count);
        for (int i = 0; i < rows.Count; i++)
            for (int w = Weight(seed, replicate, rows[i]); w > 0; w--) list.Add(i);
        return list.ToArray();
    }

    // SplitMix64 finaliser (Steele, Lea & Flood 2014).
    private static ulong Mix(ulong z)
    {
        z += 0x9E3779B97F4A7C15UL;
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBUL;
        return z ^ (z >> 31);
    }
}
