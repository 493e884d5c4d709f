using SizeTest.Cosmology;

namespace SizeTest.Photometry;

/// <summary>
/// Luminosities (or masses) consistent with each world model: every one is computed from the measured quantity
/// with THAT model's luminosity distance D_L, so no model is judged with another model's luminosities.
/// </summary>
/// <remarks>
/// <para>All kinds reduce to ln(L/L_pivot) = C_i + 2 ln D_L(z_i) with D_L in Mpc and C_i independent of the model:</para>
/// <list type="bullet">
/// <item>apparent magnitude m (AB) with K-correction K and extinction A: M = m − 5 log10(D_L/10 pc) − K − A
/// (Hogg et al. 2002, eq. 1 and 13), so C = 0.4 ln10 (M_pivot − m + K + A + 25);</item>
/// <item>absolute magnitude M_ref from a reference cosmology: M = M_ref − 5 log10(D_L/D_L,ref), i.e. the catalogue's
/// K-correction and extinction are kept and only the distance is replaced; C = 0.4 ln10 (M_pivot − M_ref) − 2 ln D_L,ref;</item>
/// <item>stellar mass log M_ref from a reference cosmology: M ∝ L ∝ D_L² at fixed mass-to-light ratio (the stated
/// assumption: the catalogue's M/L does not depend on the cosmology), C = ln10 (log M_ref − log M_pivot) − 2 ln D_L,ref;</item>
/// <item>radio flux density S_ν (Jy) with spectral index α (S ∝ ν^α): L_ν = 4π D_L² S_ν (1+z)^−(1+α) (the K-correction
/// of a power-law spectrum; e.g. Condon &amp; Matthews 2018 eq. 17 [from memory]), in W/Hz with 1 Jy = 10⁻²⁶ W m⁻² Hz⁻¹.</item>
/// </list>
/// <para>For static models D_L is the model's own flux convention D_L = d (1+z)^q (<see cref="StaticEuclideanModel.LuminosityExponent"/>,
/// q = 1/2 for energy loss only); for FLRW models D_L = (1+z)² D_A (Etherington). In both, ln D_L = ln D_A + e ln(1+z) with a
/// constant e (<see cref="DistanceExponent"/>), which is how the likelihood evaluates D_L on its D_A grid.</para>
/// </remarks>
public static class ModelLuminosity
{
    private const double Ln10 = 2.302585092994046;
    private static readonly double LnFourPiMpc2JyInW = Math.Log(4 * Math.PI) + 2 * Math.Log(PhysicalConstants.MegaparsecM) + Math.Log(1e-26);

    /// <summary>e in D_L = D_A (1+z)^e: 2 for every FLRW model, q for a static model (D_A = d, D_L = d (1+z)^q).</summary>
    public static double DistanceExponent(IWorldModel model)
    {
        ArgumentNullException.ThrowIfNull(model);
        if (model.IsExpanding) return 2.0;
        if (model is StaticEuclideanModel s) return s.LuminosityExponent;
        return Math.Log(model.LuminosityDistance(1.0) / model.AngularDiameterDistance(1.0)) / Math.Log(2.0);
    }

    /// <summary>The model-independent part C_i of ln(L_i/L_pivot) = C_i + 2 ln D_L(z_i)[Mpc] (see remarks).</summary>
    public static double[] BaseTerms(LuminosityData data, ReadOnlySpan<double> z, LuminosityPivot? pivot = null)
    {
        ArgumentNullException.ThrowIfNull(data);
        pivot ??= LuminosityPivot.Default;
        int n = data.Values.Length;
        if (z.Length != n) throw new ArgumentException($"expected {n} redshifts, got {z.Length}");
        var c = new double[n];
        for (int i = 0; i < n; i++)
        {
            double v = data.Values[i];
            c[i] = data.Kind switch
            {
                LuminosityKind.ApparentMagnitude => 0.4 * Ln10 * (pivot.AbsMag - v + (data.Correction?[i] ?? 0) + 25.0),
                LuminosityKind.AbsoluteMagnitude => 0.4 * Ln10 * (pivot.AbsMag - v) - 2 * RefLn(data, i),
                LuminosityKind.StellarMass => Ln10 * (v - pivot.LogMass) - 2 * RefLn(data, i),
                LuminosityKind.FluxDensity => LnFourPiMpc2JyInW + Math.Log(v) - (1 + data.SpectralIndex) * Math.Log(1 + z[i]) - Ln10 * pivot.LogRadioLuminosity,
                _ => throw new ArgumentOutOfRangeException(nameof(data)),
            };
        }
        return c;
    }

    private static double RefLn(LuminosityData d, int i) =>
        d.LnReferenceDistance?[i] ?? throw new ArgumentException($"{d.Kind} values need the reference cosmology's luminosity distances");

    /// <summary>ln(L_i/L_pivot) under <paramref name="model"/> for every object (exact D_L per object).</summary>
    public static double[] LnLuminosityRatio(IWorldModel model, LuminosityData data, ReadOnlySpan<double> z, LuminosityPivot? pivot = null)
    {
        ArgumentNullException.ThrowIfNull(model);
        var c = BaseTerms(data, z, pivot);
        var lnDl = LnLuminosityDistances(model, z);
        for (int i = 0; i < c.Length; i++) c[i] += 2 * lnDl[i];
        return c;
    }

    /// <summary>ln D_L(z_i) in Mpc for every object, from the batched D_A and <see cref="DistanceExponent"/>.</summary>
    public static double[] LnLuminosityDistances(IWorldModel model, ReadOnlySpan<double> z)
    {
        ArgumentNullException.ThrowIfNull(model);
        // In the given order: a world model's batch distances are per redshift (no sort of every z; same values).
        int n = z.Length;
        var r = new double[n];
        model.AngularDiameterDistances(z, r);
        double e = DistanceExponent(model);
        for (int k = 0; k < n; k++) r[k] = Math.Log(r[k]) + e * Math.Log(1 + z[k]);
        return r;
    }

    /// <summary>Absolute magnitude under <paramref name="model"/>: M = m − 5 log10(D_L/10 pc) − K − A.</summary>
    public static double AbsoluteMagnitude(IWorldModel model, double apparentMag, double z, double kPlusA = 0) =>
        apparentMag - 5 * Math.Log10(model.LuminosityDistance(z)) - 25.0 - kPlusA;

    /// <summary>An absolute magnitude from a reference cosmology converted to <paramref name="model"/>: M − 5 log10(D_L/D_L,ref).</summary>
    public static double ConvertAbsoluteMagnitude(double absMagRef, double z, IWorldModel reference, IWorldModel model) =>
        absMagRef - 5 * Math.Log10(model.LuminosityDistance(z) / reference.LuminosityDistance(z));

    /// <summary>A log10 mass from a reference cosmology converted to <paramref name="model"/>: log M + 2 log10(D_L/D_L,ref).</summary>
    public static double ConvertLogMass(double logMassRef, double z, IWorldModel reference, IWorldModel model) =>
        logMassRef + 2 * Math.Log10(model.LuminosityDistance(z) / reference.LuminosityDistance(z));

    /// <summary>log10 of the radio luminosity L_ν in W/Hz: L_ν = 4π D_L² S_ν (1+z)^−(1+α).</summary>
    public static double LogRadioLuminosity(IWorldModel model, double fluxDensityJy, double z, double spectralIndex = 0) =>
        (LnFourPiMpc2JyInW + 2 * Math.Log(model.LuminosityDistance(z)) + Math.Log(fluxDensityJy) - (1 + spectralIndex) * Math.Log(1 + z)) / Ln10;
}
