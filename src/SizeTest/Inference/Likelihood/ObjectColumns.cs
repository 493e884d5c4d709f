using SizeTest.Foundation.Errors;
using SizeTest.Photometry;

namespace SizeTest.Inference.Likelihood;

/// <summary>
/// The per-object inputs of the likelihood that do not depend on parameters, one array per quantity (structure of
/// arrays): y = ln θ (radians) and its variance, μ and its variance, the additive SB corrections K + A, x = ln(1+z),
/// ℓ = log10(1+z) (with SB only), ln z and, for isophotal sizes, each object's isophote. Built once per bound sample.
/// </summary>
internal sealed class ObjectColumns
{
    // One set of columns per observables instance and (size, sb) use: every hypothesis bound to the same rows shares them
    // (a 10⁶-object fit of two models computed ln(1+z), ln z and the variances twice, ~60 ms and 24 MB).
    private static readonly System.Runtime.CompilerServices.ConditionalWeakTable<Observables, ObjectColumns?[]> Shared = new();

    /// <summary>The columns of <paramref name="observables"/> for these uses, built once and shared (the observables'
    /// arrays are not changed after they are built).</summary>
    public static ObjectColumns For(Observables observables, bool size, bool sb)
    {
        var slots = Shared.GetValue(observables, _ => new ObjectColumns?[4]);
        int k = (size ? 1 : 0) + (sb ? 2 : 0);
        lock (slots)
            return slots[k] ??= new ObjectColumns(observables, size, sb);
    }

    public ObjectColumns(Observables observables, bool size, bool sb)
    {
        Count = observables.Count;
        int n = Count;
        if (size)
        {
            LnTheta = observables.LnTheta ?? throw SettingProblem.Exception([new("fitting angular sizes needs a 'theta' column; map it with {col} theta=NAME")]);
            VarLnTheta = Square(observables.LnThetaErr, n);
            UniformVarLnTheta = Uniform(VarLnTheta);
        }
        if (sb)
        {
            Mu = observables.Mu ?? throw SettingProblem.Exception([new("fitting surface brightness needs a 'mu' column; map it with {col} mu=NAME")]);
            VarMu = Square(observables.MuErr, n);
            Correction = new double[n];
            for (int i = 0; i < n; i++)
                Correction[i] = (observables.KCorrection?[i] ?? 0) + (observables.Extinction?[i] ?? 0);
            NegCorrection = Array.ConvertAll(Correction, c => -c);
            UniformVarMu = Uniform(VarMu);
        }
        Ln1pZ = new double[n];
        Log10OnePlusZ = sb ? new double[n] : []; // the SB model's x only
        LnZ = new double[n];
        for (int i = 0; i < n; i++)
        {
            double z = observables.Z[i];
            if (!(z > 0) || !double.IsFinite(z)) throw new InputException($"object {i + 1} has redshift {z}; fits need z > 0");
            Ln1pZ[i] = Math.Log(1 + z);
            if (sb) Log10OnePlusZ[i] = Ln1pZ[i] / ModelPoint.Ln10;
            LnZ[i] = Math.Log(z);
        }
    }

    public int Count { get; }
    public double[] LnTheta { get; } = [];
    public double[] VarLnTheta { get; } = [];
    public bool UniformVarLnTheta { get; }
    public double[] Mu { get; } = [];
    public double[] VarMu { get; } = [];
    public bool UniformVarMu { get; }
    public double[] Correction { get; } = [];
    public double[] NegCorrection { get; } = [];
    public double[] Ln1pZ { get; }
    public double[] Log10OnePlusZ { get; }
    public double[] LnZ { get; }

    // Equal variances up to rounding (10⁻¹² relative): errors given as a fixed fraction, err = f·θ, give ln θ errors
    // err/θ that differ from f in the last bit; the uniform paths use the first row's value for all.
    private static bool Uniform(double[] v) => Array.TrueForAll(v, s => Math.Abs(s - v[0]) <= 1e-12 * Math.Abs(v[0]));

    private static double[] Square(double[]? e, int n)
    {
        var s = new double[n];
        if (e is not null)
            for (int i = 0; i < n; i++) s[i] = e[i] * e[i];
        return s;
    }
}
