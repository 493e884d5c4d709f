namespace SizeTest.Distributed;

/// <summary>
/// SYNTHETIC rows for checking the distributed likelihood: each row is a pure function of (seed, global
/// row index), so any split of the rows between ranks or threads produces the same catalogue.
/// Redshift uniform in [0.05, 3], ln θ from an Einstein–de Sitter angular size with R0 = 5 kpc,
/// size evolution a = −1 and intrinsic scatter 0.2 in ln θ, measurement errors uniform in [0.05, 0.15].
/// </summary>
public static class SyntheticKernelRows
{
    /// <summary>True parameters (ln R0 [kpc], a, σ_int) the rows are drawn from.</summary>
    public static IReadOnlyList<double> Truth { get; } = [Math.Log(5.0), -1.0, 0.2];

    /// <summary>Hubble distance c/H0 in Mpc for H0 = 70 km/s/Mpc (c = 299792.458 km/s, exact SI).</summary>
    public const double HubbleDistanceMpc = 299792.458 / 70.0;

    /// <summary>
    /// Einstein–de Sitter angular-diameter distance in Mpc: D_A = 2 D_H [1 − (1+z)^−½]/(1+z)
    /// (closed form, docs/science.md §1.4; Hogg 1999 with Ωm = 1).
    /// </summary>
    public static double EdsAngularDiameterDistanceMpc(double z) => 2 * HubbleDistanceMpc * (1 - 1 / Math.Sqrt(1 + z)) / (1 + z);

    /// <summary>Fills rows firstRow … firstRow+z.Length−1 (z, ln θ with θ in rad, 1σ error of ln θ).</summary>
    public static void Fill(ulong seed, long firstRow, Span<double> z, Span<double> lnTheta, Span<double> lnThetaErr)
    {
        if (lnTheta.Length != z.Length || lnThetaErr.Length != z.Length) throw new ArgumentException("Buffers must have the same length.");
        double lnR0 = Truth[0], a = Truth[1], sInt = Truth[2];
        for (int i = 0; i < z.Length; i++)
        {
            ulong key = seed * 0x9E3779B97F4A7C15UL ^ (ulong)(firstRow + i);
            double u1 = Uniform(ref key), u2 = Uniform(ref key), u3 = Uniform(ref key), u4 = Uniform(ref key);
            double zi = 0.05 + 2.95 * u1;
            double err = 0.05 + 0.10 * u2;
            // Box–Muller (Box & Muller 1958): one standard normal from two uniforms on (0,1].
            double g = Math.Sqrt(-2 * Math.Log(u3)) * Math.Cos(2 * Math.PI * u4);
            double sd = Math.Sqrt(err * err + sInt * sInt);
            z[i] = zi;
            lnThetaErr[i] = err;
            lnTheta[i] = lnR0 + a * Math.Log(1 + zi) - Math.Log(EdsAngularDiameterDistanceMpc(zi) * 1000) + sd * g;
        }
    }

    // SplitMix64 (Steele, Lea & Flood 2014) step: well-mixed 64-bit output from a counter; uniform on (0, 1].
    private static double Uniform(ref ulong state)
    {
        ulong x = state += 0x9E3779B97F4A7C15UL;
        x = (x ^ (x >> 30)) * 0xBF58476D1CE4E5B9UL;
        x = (x ^ (x >> 27)) * 0x94D049BB133111EBUL;
        x ^= x >> 31;
        return ((x >> 11) + 1) * (1.0 / 9007199254740992.0);
    }
}
