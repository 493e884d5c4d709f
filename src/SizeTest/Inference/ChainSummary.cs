namespace SizeTest.Inference;

/// <summary>
/// What one model's ensemble MCMC run did (results.json <c>chains</c>): its length, the burn-in discarded and the
/// convergence numbers. The kept draws are steps <see cref="BurnIn"/> … <see cref="Steps"/>−1 of every walker.
/// </summary>
/// <param name="Model">Model name.</param>
/// <param name="Walkers">Walkers.</param>
/// <param name="Steps">Steps per walker run.</param>
/// <param name="BurnIn">Leading steps discarded (the first quarter of the run: <c>floor(steps / 4)</c>).</param>
/// <param name="Auto">True when run to convergence (<c>--steps auto</c>), false for a fixed length.</param>
/// <param name="MaxSteps">The cap of a run to convergence (equal to <paramref name="Steps"/> for a fixed length).</param>
/// <param name="Converged">Whether every convergence rule held at the end.</param>
/// <param name="MaxTau">Largest integrated autocorrelation time over the parameters, steps.</param>
/// <param name="LengthInTau">Kept steps / <paramref name="MaxTau"/> (the rule asks for ≥ 50).</param>
/// <param name="MaxRhat">Largest rank-normalised split-R̂ (the rule asks for ≤ 1.01).</param>
/// <param name="MinEss">Smallest effective sample size (bulk, tail, N/τ; the rule asks for ≥ 400).</param>
/// <param name="AcceptanceFraction">Mean acceptance fraction.</param>
public sealed record ChainSummary(string Model, int Walkers, int Steps, int BurnIn, bool Auto, int MaxSteps, bool Converged,
    double MaxTau, double LengthInTau, double MaxRhat, double MinEss, double AcceptanceFraction);
