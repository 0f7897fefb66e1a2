namespace Patchproof.Core.Estimation;

/// <summary>What the Levenberg-Marquardt loop needs from a least-squares problem: its cost, its gradient and curvature
/// diagonal at a point, and the damped Gauss-Newton step there. The loop owns damping, acceptance and stopping; the
/// problem owns its Jacobian and how the damped normal equations are solved.</summary>
/// <remarks>
/// <para>With residuals r(p) and Jacobian J = dr/dp, the cost is S(p) = sum r_i^2 (no factor 1/2). At the point of the
/// last successful <see cref="TryLinearize"/>, the problem supplies g = J' r and diag(J' J), and
/// <see cref="TrySolveDampedStep"/> solves (J' J + diag(damping)) delta = -g. A dense problem does this by QR
/// (<see cref="DenseLeastSquaresProblem"/>); a block-structured one (multiple shooting) eliminates its local blocks and
/// solves the condensed Schur complement, with the same damping applied to every unknown.</para>
/// <para>Implementations are stateful (they keep the last linearization) and are used by one loop at a time.</para>
/// </remarks>
public interface ILevenbergMarquardtProblem
{
    /// <summary>The number of unknowns p, at least 1.</summary>
    int ParameterCount { get; }

    /// <summary>Evaluates S(p) = sum r_i^2 at <paramref name="parameters"/>; false when the residuals are not finite there.</summary>
    /// <param name="parameters">The trial point (length <see cref="ParameterCount"/>).</param>
    /// <param name="sumOfSquares">Receives S(p).</param>
    /// <returns>True when S(p) is finite.</returns>
    bool TryEvaluateCost(ReadOnlySpan<double> parameters, out double sumOfSquares);

    /// <summary>Linearizes at <paramref name="parameters"/> (the current accepted point): computes and keeps J, writes J'r and diag(J'J).</summary>
    /// <param name="parameters">The point (length <see cref="ParameterCount"/>).</param>
    /// <param name="gradient">Receives g = J' r (length <see cref="ParameterCount"/>).</param>
    /// <param name="curvatureDiagonal">Receives diag(J' J) (length <see cref="ParameterCount"/>).</param>
    /// <returns>False when the Jacobian is not finite.</returns>
    bool TryLinearize(ReadOnlySpan<double> parameters, Span<double> gradient, Span<double> curvatureDiagonal);

    /// <summary>Solves (J'J + diag(<paramref name="damping"/>)) step = -J'r at the last linearization.</summary>
    /// <param name="damping">Non-negative damping per unknown, lambda * scale_j (length <see cref="ParameterCount"/>).</param>
    /// <param name="step">Receives the step (length <see cref="ParameterCount"/>).</param>
    /// <returns>False when the damped system is singular or the step not finite.</returns>
    bool TrySolveDampedStep(ReadOnlySpan<double> damping, Span<double> step);
}
