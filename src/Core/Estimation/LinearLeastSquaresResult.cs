using MathNet.Numerics.LinearAlgebra;

namespace Patchproof.Core.Estimation;

/// <summary>How a linear least-squares solve went.</summary>
public enum LinearLeastSquaresStatus
{
    /// <summary>The design matrix had full column rank; every coefficient is determined.</summary>
    FullRank,

    /// <summary>Some columns are (numerically) linear combinations of others; the minimum-norm solution was returned and the covariance is a pseudo-inverse.</summary>
    RankDeficient,
}

/// <summary>Coefficients of a (weighted) linear least-squares fit with their uncertainty and the numerical health of the solve.</summary>
/// <remarks>
/// <para>For the model y = X beta + e with weights w_i (inverse variances up to a common factor), the fit minimises
/// sum_i w_i (y_i - x_i beta)^2. <see cref="ResidualVariance"/> is s^2 = weighted RSS / (n - rank);
/// <see cref="Covariance"/> is s^2 (X' W X)^-1, computed from the triangular factor of the QR decomposition, never from
/// the normal equations.</para>
/// <para>Units: coefficients carry the response's unit divided by the column's unit; standard errors the same.</para>
/// </remarks>
/// <param name="Coefficients">The estimates beta (one per column).</param>
/// <param name="StandardErrors">sqrt(diag(Covariance)).</param>
/// <param name="Covariance">s^2 (X' W X)^-1, columns-by-columns.</param>
/// <param name="Residuals">Unweighted residuals y_i - x_i beta, one per row.</param>
/// <param name="WeightedResidualSumOfSquares">sum_i w_i r_i^2 (the plain RSS when no weights are given).</param>
/// <param name="DegreesOfFreedom">n - rank.</param>
/// <param name="ResidualVariance">s^2 = weighted RSS / degrees of freedom; NaN when there are none.</param>
/// <param name="Rank">The numerical rank of the column-equilibrated, weighted design matrix.</param>
/// <param name="ConditionNumber">The 2-norm condition number of the column-equilibrated, weighted design matrix (largest over smallest singular value).</param>
/// <param name="Status">Full rank, or rank deficient.</param>
public sealed record LinearLeastSquaresResult(
    Vector<double> Coefficients,
    Vector<double> StandardErrors,
    Matrix<double> Covariance,
    Vector<double> Residuals,
    double WeightedResidualSumOfSquares,
    int DegreesOfFreedom,
    double ResidualVariance,
    int Rank,
    double ConditionNumber,
    LinearLeastSquaresStatus Status)
{
    /// <summary>The residual standard deviation s = sqrt(<see cref="ResidualVariance"/>), in the response's unit.</summary>
    public double ResidualStandardDeviation => Math.Sqrt(ResidualVariance);

    /// <summary>The correlation matrix of the coefficients, Cov_ij / (se_i se_j).</summary>
    public Matrix<double> Correlation => ParameterUncertainty.CorrelationOf(Covariance);
}
