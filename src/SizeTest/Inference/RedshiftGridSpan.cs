namespace SizeTest.Inference;

/// <summary>
/// Redshift-grid bounds shared by several partial likelihoods of one sample (for example the ranks of a distributed
/// fit): every part builds the same uniform-in-ln z grid over [<paramref name="MinZ"/>, <paramref name="MaxZ"/>] with
/// the node count the whole sample would get, so the parts' sums equal the whole-sample likelihood for any split.
/// </summary>
/// <param name="MinZ">Smallest redshift of the whole sample (&gt; 0).</param>
/// <param name="MaxZ">Largest redshift of the whole sample (≥ <paramref name="MinZ"/>).</param>
/// <param name="ObjectCount">Objects in the whole sample (chooses the automatic node count).</param>
public sealed record RedshiftGridSpan(double MinZ, double MaxZ, int ObjectCount);
