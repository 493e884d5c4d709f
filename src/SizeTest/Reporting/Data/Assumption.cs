namespace SizeTest.Reporting.Data;

/// <summary>One assumption a conclusion rests on, stated in words beside the conclusions.</summary>
/// <param name="Topic">What it is about: "cosmology priors", "evolution form", "selection model", "K-corrections", …</param>
/// <param name="Statement">The assumption in one or two sentences.</param>
public sealed record Assumption(string Topic, string Statement);
