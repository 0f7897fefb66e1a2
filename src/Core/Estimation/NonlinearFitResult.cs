using MathNet.Numerics.LinearAlgebra;

namespace Patchproof.Core.Estimation;

/// <summary>The outcome of a nonlinear least-squares fit: estimates with their uncertainty, and how the iteration ended.</summary>
/// <remarks>
/// <para><see cref="Covariance"/> = s^2 (J'J)^-1 at the solution with s^2 = <see cref="ResidualVariance"/> =
/// S / (n - p); (J'J)^-1 comes from the QR factor of the column-equilibrated Jacobian. Standard errors are the square
/// roots of its diagonal. These are the asymptotic (linearized) errors that NIST certifies.</para>
/// </remarks>
/// <param name="Parameters">The estimates.</param>
/// <param name="StandardErrors">sqrt(diag(Covariance)).</param>
/// <param name="Covariance">s^2 (J'J)^-1.</param>
/// <param name="Correlation">The correlation matrix of the estimates.</param>
/// <param name="SumOfSquares">S = sum r_i^2 at the estimates.</param>
/// <param name="ResidualVariance">s^2 = S / (n - p); NaN when n = p.</param>
/// <param name="DegreesOfFreedom">n - p.</param>
/// <param name="Iterations">Trial steps taken.</param>
/// <param name="ExitReason">Why the iteration stopped.</param>
/// <param name="Outcome">The loop's full counters.</param>
public sealed record NonlinearFitResult(
    Vector<double> Parameters,
    Vector<double> StandardErrors,
    Matrix<double> Covariance,
    Matrix<double> Correlation,
    double SumOfSquares,
    double ResidualVariance,
    int DegreesOfFreedom,
    int Iterations,
    LevenbergMarquardtExitReason ExitReason,
    LevenbergMarquardtOutcome Outcome)
{
    /// <summary>True when the iteration stopped on one of its convergence criteria.</summary>
    public bool IsConverged => ExitReason.IsConverged();

    /// <summary>The residual standard deviation s = sqrt(<see cref="ResidualVariance"/>).</summary>
    public double ResidualStandardDeviation => Math.Sqrt(ResidualVariance);
}
