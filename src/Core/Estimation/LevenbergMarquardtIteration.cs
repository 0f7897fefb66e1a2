namespace Patchproof.Core.Estimation;

/// <summary>Where a Levenberg-Marquardt run stands, reported before each iteration.</summary>
/// <param name="Iteration">Iterations done so far (0 before the first).</param>
/// <param name="MaxIterations">The iteration cap.</param>
/// <param name="Cost">The cost S at the last accepted point.</param>
public sealed record LevenbergMarquardtIteration(int Iteration, int MaxIterations, double Cost);
