using MathNet.Numerics.LinearAlgebra;

namespace Patchproof.Core.Estimation;

/// <summary>A covariance for least-squares estimates that stays honest when residuals are correlated in time: the sandwich over contiguous batches.</summary>
/// <remarks>
/// <para>For beta = (X'WX)^-1 X'W y, Cov(beta) = B^-1 M B^-1 with B = X'WX and M = sum_b s_b s_b', where
/// s_b = sum over batch b of w_i x_i r_i (the score of batch b) and the batches are contiguous runs of rows. As long
/// as a batch is longer than the residuals' correlation time, scores of different batches are nearly independent and
/// M estimates the score covariance without any model of the correlation (a Bartlett-free, batch-means form of the
/// heteroscedasticity-and-autocorrelation-consistent estimator). A small-sample factor K / (K - 1) with K batches is
/// applied. With one row per batch this is the plain White sandwich.</para>
/// <para>Use at least about 20 batches for a usable estimate, each spanning one problem time unit or more
/// (ESTIMATION.md section 4).</para>
/// <para>References:
/// 1. H. White, A heteroskedasticity-consistent covariance matrix estimator, Econometrica 48 (1980) 817-838.
/// 2. W. K. Newey, K. D. West, A simple, positive semi-definite, heteroskedasticity and autocorrelation consistent covariance matrix, Econometrica 55 (1987) 703-708.
/// 3. G. S. Fishman, Discrete-Event Simulation, Springer 2001, section 6.6 (batch means).</para>
/// </remarks>
public static class BatchMeansCovariance
{
    /// <summary>The batch-means sandwich covariance of a linear least-squares fit.</summary>
    /// <param name="design">The design matrix X (n by p), the same one that was fitted.</param>
    /// <param name="residuals">The unweighted residuals y - X beta (length n).</param>
    /// <param name="weights">The fit's weights, or null for equal weights.</param>
    /// <param name="batchLength">Rows per contiguous batch, at least 1; the last batch takes the remainder.</param>
    /// <returns>The p by p covariance.</returns>
    /// <exception cref="ArgumentOutOfRangeException">When shapes disagree, or there are fewer than two batches.</exception>
    public static Matrix<double> Compute(Matrix<double> design, Vector<double> residuals, Vector<double>? weights, int batchLength)
    {
        ArgumentNullException.ThrowIfNull(design);
        ArgumentNullException.ThrowIfNull(residuals);
        var rows = design.RowCount;
        var columns = design.ColumnCount;
        Preconditions.CheckArgumentRange(nameof(residuals), residuals.Count == rows, "must have one entry per design row");
        Preconditions.CheckArgumentRange(nameof(weights), weights is null || weights.Count == rows, "must have one entry per design row");
        Preconditions.CheckArgumentRange(nameof(batchLength), batchLength >= 1 && rows / batchLength >= 2, "must leave at least two batches");
        var batchCount = rows / batchLength;

        var meat = Matrix<double>.Build.Dense(columns, columns);
        var score = new double[columns];
        for (var batch = 0; batch < batchCount; batch++)
        {
            Array.Clear(score);
            var end = batch == batchCount - 1 ? rows : (batch + 1) * batchLength;
            for (var i = batch * batchLength; i < end; i++)
            {
                var factor = (weights?[i] ?? 1.0) * residuals[i];
                for (var j = 0; j < columns; j++)
                {
                    score[j] += factor * design[i, j];
                }
            }

            for (var j = 0; j < columns; j++)
            {
                for (var k = 0; k < columns; k++)
                {
                    meat[j, k] += score[j] * score[k];
                }
            }
        }

        var weightedDesign = design.Clone();
        if (weights is not null)
        {
            for (var i = 0; i < rows; i++)
            {
                weightedDesign.SetRow(i, weightedDesign.Row(i) * Math.Sqrt(weights[i]));
            }
        }

        var unscaled = LinearLeastSquares.InverseNormalMatrix(weightedDesign);
        return unscaled * meat * unscaled * (batchCount / (batchCount - 1.0));
    }
}
