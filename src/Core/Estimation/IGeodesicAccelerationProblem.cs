namespace Patchproof.Core.Estimation;

/// <summary>A least-squares problem that can also give the geodesic acceleration of a Levenberg-Marquardt step.</summary>
/// <remarks>
/// <para>For the velocity v (the damped Gauss-Newton step) the acceleration a solves (J'J + diag(damping)) a = -J' r_vv,
/// with r_vv the second directional derivative of the residuals along v, here by the finite difference
/// r_vv = (2/h) ((r(p + h v) - r(p)) / h - J v) with h = 0.1. The loop then tries p + v + a/2.</para>
/// <para>Reference: M. K. Transtrum, J. P. Sethna, Improvements to the Levenberg-Marquardt algorithm for nonlinear
/// least-squares minimization, arXiv:1201.5885 (2012), section 4.</para>
/// </remarks>
public interface IGeodesicAccelerationProblem : ILevenbergMarquardtProblem
{
    /// <summary>Computes the acceleration along <paramref name="velocity"/> at the last linearization.</summary>
    /// <param name="parameters">The point of the last linearization.</param>
    /// <param name="velocity">The damped step found there.</param>
    /// <param name="damping">The damping that step was solved with.</param>
    /// <param name="acceleration">Receives a (length <see cref="ILevenbergMarquardtProblem.ParameterCount"/>).</param>
    /// <returns>False when the residuals along the step are not finite or the system is singular.</returns>
    bool TryAcceleration(ReadOnlySpan<double> parameters, ReadOnlySpan<double> velocity, ReadOnlySpan<double> damping, Span<double> acceleration);
}
