namespace SizeTest.Inference.Likelihood;

/// <summary>
/// The per-object log density of one observable summed over a row slice [start, end): the value alone (fast,
/// vectorised where the model allows) or the value with the model-quantity partials accumulated into a
/// <see cref="ModelAdjoint"/> (the gradient then follows by <see cref="ParameterLayout.Chain"/>). Every constant is kept.
/// </summary>
internal interface IObservableKernel
{
    double Sum(LikelihoodEvaluation e, in ModelPoint p, int start, int end);

    double SumWithAdjoint(LikelihoodEvaluation e, in ModelPoint p, int start, int end, ModelAdjoint adjoint);
}
