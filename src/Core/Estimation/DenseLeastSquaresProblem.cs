using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.LinearAlgebra.Factorization;

namespace Patchproof.Core.Estimation;

/// <summary>Adapts a <see cref="NonlinearLeastSquaresProblem"/> with a dense Jacobian to the Levenberg-Marquardt loop, solving each damped step by QR.</summary>
/// <remarks>
/// <para>At each linearization J = Q R (thin Householder QR) is computed once. A damped step then solves the small
/// least-squares problem [R; diag(sqrt(damping))] delta = [-Q'r; 0] by a second QR, which equals
/// (J'J + diag(damping)) delta = -J'r without forming J'J (the approach of MINPACK's lmpar, with QR in place of its
/// Givens sweep). The geodesic acceleration of a step reuses the same factors (see <see cref="IGeodesicAccelerationProblem"/>).</para>
/// <para>Finite differences: forward steps h_j = sqrt(eps) |p_j|, central steps h_j = eps^(1/3) |p_j| (|p_j| replaced by 1 when p_j = 0), so
/// the step follows the unknown's size; see <see cref="FiniteDifferenceScheme"/>.</para>
/// </remarks>
public sealed class DenseLeastSquaresProblem : IGeodesicAccelerationProblem
{
    private readonly NonlinearLeastSquaresProblem problem;
    private readonly FiniteDifferenceScheme scheme;
    private readonly double[] residuals;
    private readonly double[] shifted;
    private readonly double[] shiftedBack;
    private readonly double[] secondDerivative;
    private readonly double[] jacobian;
    private readonly double[] point;
    private Matrix<double>? upper;
    private Matrix<double>? orthogonal;
    private Vector<double>? projectedResidual;

    /// <summary>Wraps <paramref name="problem"/>.</summary>
    /// <param name="problem">The problem; at least as many observations as unknowns.</param>
    /// <param name="scheme">Finite-difference scheme used when the problem has no Jacobian.</param>
    /// <exception cref="ArgumentOutOfRangeException">When the counts are out of range.</exception>
    public DenseLeastSquaresProblem(NonlinearLeastSquaresProblem problem, FiniteDifferenceScheme scheme = FiniteDifferenceScheme.Central)
    {
        ArgumentNullException.ThrowIfNull(problem);
        Preconditions.CheckArgumentRange(nameof(problem), problem.ParameterCount >= 1 && problem.ObservationCount >= problem.ParameterCount, "needs at least one unknown and at least as many observations as unknowns");
        this.problem = problem;
        this.scheme = scheme;
        residuals = new double[problem.ObservationCount];
        shifted = new double[problem.ObservationCount];
        shiftedBack = new double[problem.ObservationCount];
        secondDerivative = new double[problem.ObservationCount];
        jacobian = new double[problem.ObservationCount * problem.ParameterCount];
        point = new double[problem.ParameterCount];
    }

    /// <inheritdoc/>
    public int ParameterCount => problem.ParameterCount;

    /// <summary>The residuals at the last linearization (length n).</summary>
    public ReadOnlySpan<double> LastResiduals => residuals;

    /// <summary>The Jacobian at the last linearization, row-major n by p.</summary>
    public ReadOnlySpan<double> LastJacobian => jacobian;

    /// <inheritdoc/>
    public bool TryEvaluateCost(ReadOnlySpan<double> parameters, out double sumOfSquares)
    {
        problem.Residuals(parameters, shifted);
        sumOfSquares = SumOfSquares(shifted);
        return double.IsFinite(sumOfSquares);
    }

    /// <inheritdoc/>
    public bool TryLinearize(ReadOnlySpan<double> parameters, Span<double> gradient, Span<double> curvatureDiagonal)
    {
        var rows = problem.ObservationCount;
        var columns = problem.ParameterCount;
        problem.Residuals(parameters, residuals);
        if (problem.Jacobian is { } analytic)
        {
            analytic(parameters, jacobian);
        }
        else
        {
            ApproximateJacobian(parameters);
        }

        gradient.Clear();
        curvatureDiagonal.Clear();
        for (var i = 0; i < rows; i++)
        {
            for (var j = 0; j < columns; j++)
            {
                var entry = jacobian[i * columns + j];
                gradient[j] += entry * residuals[i];
                curvatureDiagonal[j] += entry * entry;
            }
        }

        for (var j = 0; j < columns; j++)
        {
            if (!double.IsFinite(gradient[j]) || !double.IsFinite(curvatureDiagonal[j]))
            {
                upper = null;
                return false;
            }
        }

        var matrix = JacobianMatrix();
        var qr = matrix.QR(QRMethod.Thin);
        upper = qr.R;
        orthogonal = qr.Q;
        projectedResidual = qr.Q.TransposeThisAndMultiply(Vector<double>.Build.Dense(residuals));
        return true;
    }

    /// <inheritdoc/>
    public bool TrySolveDampedStep(ReadOnlySpan<double> damping, Span<double> step) =>
        projectedResidual is not null && TrySolveDamped(damping, projectedResidual, step);

    /// <inheritdoc/>
    public bool TryAcceleration(ReadOnlySpan<double> parameters, ReadOnlySpan<double> velocity, ReadOnlySpan<double> damping, Span<double> acceleration)
    {
        if (upper is null || orthogonal is null)
        {
            return false;
        }

        const double h = 0.1;
        var rows = problem.ObservationCount;
        var columns = problem.ParameterCount;
        for (var j = 0; j < columns; j++)
        {
            point[j] = parameters[j] + (h * velocity[j]);
        }

        problem.Residuals(point, shifted);
        for (var i = 0; i < rows; i++)
        {
            var directional = 0.0;
            for (var j = 0; j < columns; j++)
            {
                directional += jacobian[i * columns + j] * velocity[j];
            }

            secondDerivative[i] = 2 / h * (((shifted[i] - residuals[i]) / h) - directional);
            if (!double.IsFinite(secondDerivative[i]))
            {
                return false;
            }
        }

        var projected = orthogonal.TransposeThisAndMultiply(Vector<double>.Build.Dense(secondDerivative));
        return TrySolveDamped(damping, projected, acceleration);
    }

    /// <summary>Solves (J'J + diag(damping)) x = -J' b from the kept R and Q'b.</summary>
    private bool TrySolveDamped(ReadOnlySpan<double> damping, Vector<double> projected, Span<double> solutionOut)
    {
        if (upper is null)
        {
            return false;
        }

        var columns = problem.ParameterCount;
        var stacked = Matrix<double>.Build.Dense(2 * columns, columns);
        var right = Vector<double>.Build.Dense(2 * columns);
        stacked.SetSubMatrix(0, 0, upper);
        for (var j = 0; j < columns; j++)
        {
            stacked[columns + j, j] = Math.Sqrt(damping[j]);
            right[j] = -projected[j];
        }

        var factor = stacked.QR(QRMethod.Thin);
        var r = factor.R;
        for (var j = 0; j < columns; j++)
        {
            if (r[j, j] == 0)
            {
                return false;
            }
        }

        var solution = factor.Solve(right);
        for (var j = 0; j < columns; j++)
        {
            if (!double.IsFinite(solution[j]))
            {
                return false;
            }

            solutionOut[j] = solution[j];
        }

        return true;
    }

    /// <summary>The Jacobian at the last linearization as a matrix (a copy).</summary>
    public Matrix<double> JacobianMatrix() =>
        Matrix<double>.Build.Dense(problem.ObservationCount, problem.ParameterCount, (i, j) => jacobian[i * problem.ParameterCount + j]);

    private void ApproximateJacobian(ReadOnlySpan<double> parameters)
    {
        var rows = problem.ObservationCount;
        var columns = problem.ParameterCount;
        parameters.CopyTo(point);
        var relative = scheme == FiniteDifferenceScheme.Central ? Math.Cbrt(2.220446049250313e-16) : Math.Sqrt(2.220446049250313e-16);
        for (var j = 0; j < columns; j++)
        {
            var original = point[j];
            var size = original != 0 ? Math.Abs(original) : 1.0;
            var increment = relative * size;
            point[j] = original + increment;
            var forwardIncrement = point[j] - original;
            problem.Residuals(point, shifted);
            if (scheme == FiniteDifferenceScheme.Central)
            {
                point[j] = original - increment;
                var backwardIncrement = original - point[j];
                problem.Residuals(point, shiftedBack);
                for (var i = 0; i < rows; i++)
                {
                    jacobian[i * columns + j] = (shifted[i] - shiftedBack[i]) / (forwardIncrement + backwardIncrement);
                }
            }
            else
            {
                for (var i = 0; i < rows; i++)
                {
                    jacobian[i * columns + j] = (shifted[i] - residuals[i]) / forwardIncrement;
                }
            }

            point[j] = original;
        }
    }

    private static double SumOfSquares(ReadOnlySpan<double> values)
    {
        var sum = 0.0;
        foreach (var value in values)
        {
            sum += value * value;
        }

        return sum;
    }
}
