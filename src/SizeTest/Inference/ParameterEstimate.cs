namespace SizeTest.Inference;

/// <summary>
/// One parameter of a fitted model as reported: best value and its 68% interval, with how the interval was
/// obtained (<see cref="IntervalMethod"/>) and whether the maximum sits on a bound of the parameter's range.
/// </summary>
/// <param name="Name">Machine name (e.g. <c>omega_m</c>, <c>size_evolution</c>, <c>scatter_dex</c>).</param>
/// <param name="Value">Best estimate (maximum likelihood, or posterior median when sampled).</param>
/// <param name="Lo">Lower end of the 68% interval (equals <see cref="Value"/> when fixed).</param>
/// <param name="Hi">Upper end of the 68% interval.</param>
/// <param name="Fixed">True when the parameter was held fixed.</param>
/// <param name="Unit">Unit, or empty.</param>
/// <param name="IntervalMethod">How <paramref name="Lo"/>–<paramref name="Hi"/> was obtained: one of the
/// <see cref="IntervalMethods"/> names (<c>hessian</c>, <c>profile</c>, <c>posterior</c>, <c>bootstrap</c>; <c>fixed</c>
/// for a parameter held fixed).</param>
/// <param name="AtBound"><c>lower</c> or <c>upper</c> when the maximum lies on that bound (the interval is then one-sided:
/// from the bound to the profile's Δ ln L = ½ crossing on the other side), otherwise null.</param>
public sealed record ParameterEstimate(string Name, double Value, double Lo, double Hi, bool Fixed, string Unit = "",
    string IntervalMethod = IntervalMethods.Hessian, string? AtBound = null)
{
    /// <summary>
    /// When the 68% profile-likelihood set {Δ ln L ≤ ½} is not one interval (the profile dips below the level between
    /// maxima), its pieces, ascending; <see cref="Lo"/>–<see cref="Hi"/> is then their hull. Empty otherwise.
    /// </summary>
    public IReadOnlyList<IntervalPiece> Regions { get; init; } = [];

    /// <summary>Whether <paramref name="x"/> lies in the reported 68% set: in one of the <see cref="Regions"/> when there are
    /// several, otherwise in [<see cref="Lo"/>, <see cref="Hi"/>].</summary>
    public bool Contains(double x) => Regions.Count > 1 ? Regions.Any(r => r.Lo <= x && x <= r.Hi) : Lo <= x && x <= Hi;
}

/// <summary>One piece [Lo, Hi] of a disjoint 68% set.</summary>
/// <param name="Lo">Lower end.</param>
/// <param name="Hi">Upper end.</param>
public sealed record IntervalPiece(double Lo, double Hi);
