namespace SizeTest.Inference;

/// <summary>The names results.json uses for how a parameter's 68% interval was obtained (<c>interval_method</c>).</summary>
public static class IntervalMethods
{
    /// <summary>±1σ from the inverse negative Hessian at the maximum (clipped to the bounds).</summary>
    public const string Hessian = "hessian";
    /// <summary>Where the profile likelihood drops by ½ from its maximum (Wilks 1938); the outermost crossings when the
    /// profile has several maxima.</summary>
    public const string Profile = "profile";
    /// <summary>16th–84th percentiles of the posterior draws.</summary>
    public const string Posterior = "posterior";
    /// <summary>16th–84th percentiles of bootstrap refits.</summary>
    public const string Bootstrap = "bootstrap";
    /// <summary>The parameter was held fixed (lo = hi = value).</summary>
    public const string Fixed = "fixed";

    /// <summary>The words tables and reports use for a method ("Hessian", "profile likelihood", …); the name itself when unknown.</summary>
    public static string Words(string method) => method switch
    {
        Hessian => "Hessian",
        Profile => "profile likelihood",
        Posterior => "posterior",
        Bootstrap => "bootstrap",
        _ => method,
    };
}
