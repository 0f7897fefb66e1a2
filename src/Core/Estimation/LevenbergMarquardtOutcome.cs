namespace Patchproof.Core.Estimation;

/// <summary>Where the Levenberg-Marquardt loop ended and why.</summary>
/// <param name="Parameters">The last accepted point.</param>
/// <param name="SumOfSquares">S = sum r_i^2 there.</param>
/// <param name="Iterations">Trial steps taken (accepted or rejected).</param>
/// <param name="AcceptedSteps">Trial steps that lowered the cost and were kept.</param>
/// <param name="CostEvaluations">Calls of the cost function, including the initial one.</param>
/// <param name="Linearizations">Jacobian evaluations.</param>
/// <param name="FinalDamping">The damping factor lambda when the loop stopped.</param>
/// <param name="ExitReason">Which criterion stopped it.</param>
public sealed record LevenbergMarquardtOutcome(
    double[] Parameters,
    double SumOfSquares,
    int Iterations,
    int AcceptedSteps,
    int CostEvaluations,
    int Linearizations,
    double FinalDamping,
    LevenbergMarquardtExitReason ExitReason);
