using System.Globalization;

namespace SizeTest.Inference.Sampling;

/// <summary>
/// A random mixture of ensemble moves: before each half-step one move is chosen with probability proportional to its
/// weight, independently of the walkers' positions, and proposes for the whole half. Each component keeps the target
/// invariant, so the mixture does too (a state-independent mixture of invariant kernels is invariant; Tierney 1994,
/// Ann. Stat. 22, 1701, §2.3). The choice is the first number drawn from <c>rng</c> in the half-step, so a run stays
/// reproducible for a seed (the <see cref="IEnsembleMove"/> contract).
/// </summary>
public sealed class MixtureMove : IEnsembleMove
{
    private readonly IEnsembleMove[] _moves;
    private readonly double[] _cumulative;

    /// <summary>Creates the mixture of <paramref name="moves"/> (move, weight &gt; 0).</summary>
    /// <exception cref="ArgumentException">When no move is given or a weight is not positive and finite.</exception>
    public MixtureMove(params (IEnsembleMove Move, double Weight)[] moves)
    {
        ArgumentNullException.ThrowIfNull(moves);
        if (moves.Length == 0) throw new ArgumentException("A mixture needs at least one move.", nameof(moves));
        _moves = new IEnsembleMove[moves.Length];
        _cumulative = new double[moves.Length];
        double total = moves.Sum(m => m.Weight);
        double run = 0;
        for (int i = 0; i < moves.Length; i++)
        {
            ArgumentNullException.ThrowIfNull(moves[i].Move);
            if (!(moves[i].Weight > 0 && double.IsFinite(moves[i].Weight)))
                throw new ArgumentException($"The weight of move {moves[i].Move.Name} must be positive and finite.", nameof(moves));
            _moves[i] = moves[i].Move;
            run += moves[i].Weight / total;
            _cumulative[i] = run;
        }
        _cumulative[^1] = 1.0;
        Name = string.Join(" + ", moves.Select(m => string.Create(CultureInfo.InvariantCulture, $"{m.Weight / total:0.##} {m.Move.Name}")));
    }

    /// <summary>The default move of posterior sampling: ½ kernel-density, ¼ differential evolution, ¼ stretch. The local
    /// moves spread the ensemble and explore; the kernel-density move decorrelates along degenerate directions.</summary>
    public static MixtureMove Default() => new((new KernelDensityMove(), 0.5), (new DifferentialEvolutionMove(), 0.25), (new StretchMove(), 0.25));

    /// <summary>The components, in order.</summary>
    public IReadOnlyList<IEnsembleMove> Moves => _moves;

    /// <inheritdoc/>
    public string Name { get; }

    /// <inheritdoc/>
    public void Propose(ReadOnlySpan<double> positions, int dimension, ReadOnlySpan<int> active, ReadOnlySpan<int> complement,
                        Random rng, Span<double> proposals, Span<double> logFactors)
    {
        double u = rng.NextDouble();
        int i = 0;
        while (i < _moves.Length - 1 && u >= _cumulative[i]) i++;
        _moves[i].Propose(positions, dimension, active, complement, rng, proposals, logFactors);
    }
}
