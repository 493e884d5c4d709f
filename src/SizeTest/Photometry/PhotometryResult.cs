namespace SizeTest.Photometry;

/// <summary>The observables built from a sample and the corrections that were applied.</summary>
/// <param name="Observables">What the likelihood consumes.</param>
/// <param name="Corrections">One human-readable line per correction or assumption, for <c>inspect</c>, the report's assumptions and the run manifest.</param>
public sealed record PhotometryResult(Observables Observables, IReadOnlyList<string> Corrections);
