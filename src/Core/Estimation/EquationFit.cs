using MathNet.Numerics.LinearAlgebra;

namespace Patchproof.Core.Estimation;

/// <summary>The equation-error fit of one equation dV_j/dt = sum_k theta_jk phi_jk(V) + b_j.</summary>
/// <remarks>Coefficients come in the order of the equation's terms, then the constant (when included). Units: the
/// derivative's unit (state unit per time unit) divided by the term's unit.</remarks>
/// <param name="Equation">The equation's index j (the state it differentiates).</param>
/// <param name="Terms">The basis terms, the constant last when included.</param>
/// <param name="Fit">The weighted linear least-squares fit (coefficients, least-squares standard errors, condition number, rank).</param>
/// <param name="BatchMeansCovariance">The batch-means sandwich covariance, honest under correlated residuals (see <see cref="Estimation.BatchMeansCovariance"/>).</param>
/// <param name="RSquared">1 - RSS / total sum of squares of the derivative about its mean.</param>
/// <param name="SampleCount">Samples used (edges and masked windows left out).</param>
public sealed record EquationFit(int Equation, IReadOnlyList<RegressionTerm> Terms, LinearLeastSquaresResult Fit, Matrix<double> BatchMeansCovariance, double RSquared, int SampleCount)
{
    /// <summary>The estimates theta_jk (and b_j last when included).</summary>
    public Vector<double> Coefficients => Fit.Coefficients;

    /// <summary>Standard errors from the batch-means covariance: the figure to report.</summary>
    public Vector<double> StandardErrors => Vector<double>.Build.Dense(BatchMeansCovariance.RowCount, k => Math.Sqrt(BatchMeansCovariance[k, k]));

    /// <summary>The RMS of the derivative residuals, in the derivative's unit.</summary>
    public double ResidualRms => Math.Sqrt(Fit.WeightedResidualSumOfSquares / SampleCount);
}

/// <summary>The outcome of an equation-error regression over every equation.</summary>
/// <param name="HalfWidth">The Savitzky-Golay half-width used for smoothing and differentiation.</param>
/// <param name="PolynomialOrder">The Savitzky-Golay order used.</param>
/// <param name="Equations">One fit per equation.</param>
public sealed record EquationErrorResult(int HalfWidth, int PolynomialOrder, IReadOnlyList<EquationFit> Equations);
