using MathNet.Numerics.Distributions;
using MathNet.Numerics.LinearAlgebra;

namespace Patchproof.Core.Estimation;

/// <summary>Two estimates whose correlation is so strong that the data cannot tell them apart.</summary>
/// <param name="First">Index of the first parameter.</param>
/// <param name="Second">Index of the second parameter (greater than <paramref name="First"/>).</param>
/// <param name="Correlation">Their correlation coefficient, in [-1, 1].</param>
public sealed record CorrelatedPair(int First, int Second, double Correlation);

/// <summary>A symmetric confidence interval around an estimate.</summary>
/// <param name="Estimate">The point estimate.</param>
/// <param name="HalfWidth">The half-width: quantile times (inflated) standard error; same unit as the estimate.</param>
public sealed record ConfidenceInterval(double Estimate, double HalfWidth)
{
    /// <summary>Estimate minus half-width.</summary>
    public double Lower => Estimate - HalfWidth;

    /// <summary>Estimate plus half-width.</summary>
    public double Upper => Estimate + HalfWidth;
}

/// <summary>Covariance scaling, correlation matrices, intervals and strong-correlation flags for fitted parameters.</summary>
/// <remarks>
/// <para>Cov = s^2 (J'J)^-1 with s^2 = RSS / (n - p) (see <see cref="ScaleByResidualVariance"/>). Correlation
/// rho_ij = Cov_ij / sqrt(Cov_ii Cov_jj). Intervals are estimate +- t_{1-alpha/2, nu} * se * sqrt(inflation), where
/// the inflation factor accounts for correlated residuals (see <see cref="ResidualAutocorrelation"/> and
/// <see cref="BatchMeansCovariance"/>).</para>
/// <para>The default flag threshold |rho| &gt; 0.95 is common practice, not a published constant.</para>
/// <para>References:
/// 1. D. M. Bates, D. G. Watts, Nonlinear Regression Analysis and Its Applications, Wiley 1988, section 2.3.</para>
/// </remarks>
public static class ParameterUncertainty
{
    /// <summary>The |correlation| above which two estimates are flagged (common practice).</summary>
    public const double DefaultCorrelationThreshold = 0.95;

    /// <summary>Returns s^2 times an unscaled inverse normal matrix (J'J)^-1, with s^2 = RSS / (n - p).</summary>
    /// <param name="unscaledInverse">(J'J)^-1, square and symmetric.</param>
    /// <param name="residualSumOfSquares">The (weighted) residual sum of squares, non-negative.</param>
    /// <param name="degreesOfFreedom">n - p, at least 1.</param>
    /// <returns>The scaled covariance; a new matrix.</returns>
    /// <exception cref="ArgumentOutOfRangeException">When the RSS is negative or not finite, or there are no degrees of freedom.</exception>
    public static Matrix<double> ScaleByResidualVariance(Matrix<double> unscaledInverse, double residualSumOfSquares, int degreesOfFreedom)
    {
        ArgumentNullException.ThrowIfNull(unscaledInverse);
        Preconditions.CheckArgumentRange(nameof(residualSumOfSquares), double.IsFinite(residualSumOfSquares) && residualSumOfSquares >= 0, "must be finite and non-negative");
        Preconditions.CheckArgumentRange(nameof(degreesOfFreedom), degreesOfFreedom >= 1, "must be at least 1");
        return unscaledInverse * (residualSumOfSquares / degreesOfFreedom);
    }

    /// <summary>The correlation matrix of a covariance matrix; rows of a zero-variance parameter come out NaN off the diagonal.</summary>
    /// <param name="covariance">A square covariance matrix.</param>
    /// <returns>A new matrix with ones on the diagonal.</returns>
    public static Matrix<double> CorrelationOf(Matrix<double> covariance)
    {
        ArgumentNullException.ThrowIfNull(covariance);
        Preconditions.CheckArgumentRange(nameof(covariance), covariance.RowCount == covariance.ColumnCount, "must be square");
        var size = covariance.RowCount;
        return Matrix<double>.Build.Dense(size, size, (i, j) => i == j ? 1.0 : covariance[i, j] / Math.Sqrt(covariance[i, i] * covariance[j, j]));
    }

    /// <summary>Every pair of parameters whose |correlation| exceeds <paramref name="threshold"/>, strongest first.</summary>
    /// <param name="correlation">A correlation matrix.</param>
    /// <param name="threshold">The flag level in (0, 1); 0.95 by default (common practice).</param>
    /// <returns>The flagged pairs, ordered by decreasing |correlation|.</returns>
    public static IReadOnlyList<CorrelatedPair> StronglyCorrelatedPairs(Matrix<double> correlation, double threshold = DefaultCorrelationThreshold)
    {
        ArgumentNullException.ThrowIfNull(correlation);
        Preconditions.CheckArgumentRange(nameof(threshold), threshold > 0 && threshold < 1, "must lie in (0, 1)");
        var pairs = new List<CorrelatedPair>();
        for (var i = 0; i < correlation.RowCount; i++)
        {
            for (var j = i + 1; j < correlation.ColumnCount; j++)
            {
                if (Math.Abs(correlation[i, j]) > threshold)
                {
                    pairs.Add(new CorrelatedPair(i, j, correlation[i, j]));
                }
            }
        }

        pairs.Sort((a, b) => Math.Abs(b.Correlation).CompareTo(Math.Abs(a.Correlation)));
        return pairs;
    }

    /// <summary>Two-sided intervals estimate +- t * se * sqrt(inflation), with Student's t on <paramref name="degreesOfFreedom"/>.</summary>
    /// <param name="estimates">The estimates.</param>
    /// <param name="standardErrors">Their standard errors (same length, non-negative).</param>
    /// <param name="degreesOfFreedom">Degrees of freedom of the t quantile, at least 1 (use the effective count when residuals are correlated).</param>
    /// <param name="confidenceLevel">The coverage in (0, 1), for example 0.95.</param>
    /// <param name="varianceInflation">Factor (at least 1 in normal use) by which the variance is widened for correlated residuals.</param>
    /// <returns>One interval per estimate.</returns>
    /// <exception cref="ArgumentOutOfRangeException">When lengths differ or a level, count or factor is out of range.</exception>
    public static IReadOnlyList<ConfidenceInterval> Intervals(IReadOnlyList<double> estimates, IReadOnlyList<double> standardErrors, double degreesOfFreedom, double confidenceLevel = 0.95, double varianceInflation = 1.0)
    {
        ArgumentNullException.ThrowIfNull(estimates);
        ArgumentNullException.ThrowIfNull(standardErrors);
        Preconditions.CheckArgumentRange(nameof(standardErrors), standardErrors.Count == estimates.Count, "must have one entry per estimate");
        Preconditions.CheckArgumentRange(nameof(degreesOfFreedom), degreesOfFreedom >= 1, "must be at least 1");
        Preconditions.CheckArgumentRange(nameof(confidenceLevel), confidenceLevel > 0 && confidenceLevel < 1, "must lie in (0, 1)");
        Preconditions.CheckArgumentRange(nameof(varianceInflation), double.IsFinite(varianceInflation) && varianceInflation > 0, "must be positive and finite");
        var quantile = StudentT.InvCDF(0, 1, degreesOfFreedom, 0.5 + confidenceLevel / 2);
        var widen = Math.Sqrt(varianceInflation);
        var intervals = new ConfidenceInterval[estimates.Count];
        for (var k = 0; k < intervals.Length; k++)
        {
            intervals[k] = new ConfidenceInterval(estimates[k], quantile * standardErrors[k] * widen);
        }

        return intervals;
    }
}
