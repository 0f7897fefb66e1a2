namespace Patchproof.Core.Estimation;

/// <summary>Why the Levenberg-Marquardt loop stopped.</summary>
public enum LevenbergMarquardtExitReason
{
    /// <summary>Converged: the scaled gradient fell below the gradient tolerance (includes an exact zero residual).</summary>
    ConvergedOnGradient,

    /// <summary>Converged: the scaled step fell below the relative step tolerance.</summary>
    ConvergedOnStep,

    /// <summary>Converged: actual and predicted cost reductions fell below the relative cost tolerance.</summary>
    ConvergedOnCost,

    /// <summary>Not converged: the iteration cap was reached; the last accepted point is returned.</summary>
    MaxIterations,

    /// <summary>Not converged: no damping made the step system solvable, or the Jacobian was not finite.</summary>
    Singular,

    /// <summary>Not started: the residuals were not finite at the initial point.</summary>
    NonFiniteInitialCost,

    /// <summary>Converged: a nearly undamped step changed the cost by less than <see cref="LevenbergMarquardtOptions.VarianceScaledCostTolerance"/> residual variances, so it moved every estimate by a small fraction of its standard error.</summary>
    ConvergedWithinUncertainty,
}

/// <summary>Extensions on <see cref="LevenbergMarquardtExitReason"/>.</summary>
public static class LevenbergMarquardtExitReasonExtensions
{
    /// <summary>True for the convergence criteria.</summary>
    /// <param name="reason">The exit reason.</param>
    /// <returns>Whether the loop converged.</returns>
    public static bool IsConverged(this LevenbergMarquardtExitReason reason) =>
        reason is LevenbergMarquardtExitReason.ConvergedOnGradient or LevenbergMarquardtExitReason.ConvergedOnStep or LevenbergMarquardtExitReason.ConvergedOnCost
            or LevenbergMarquardtExitReason.ConvergedWithinUncertainty;
}
