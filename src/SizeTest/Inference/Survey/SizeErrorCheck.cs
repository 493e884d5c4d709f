using SizeTest.Photometry;

namespace SizeTest.Inference.Survey;

/// <summary>Checks of the quoted size errors against the chosen error model.</summary>
public static class SizeErrorCheck
{
    /// <summary>A warning when any quoted σ_θ/θ exceeds 0.2 and the errors are treated as log-normal, or null.</summary>
    public static string? LargeErrorWarning(Observables o, SizeErrorKind kind)
    {
        if (kind != SizeErrorKind.LogNormal || o.LnThetaErr is not { } e) return null;
        int count = 0;
        double max = 0;
        foreach (var x in e) { if (x > 0.2) count++; max = Math.Max(max, x); }
        return count == 0 ? null : FormattableString.Invariant(
            $"{count} objects have sigma_theta/theta > 0.2 (largest {max:G3}); the log-normal error model (sigma_ln theta = sigma_theta/theta) is first order there — if the errors are quoted in theta, use {{size_errors}} gaussian");
    }
}
