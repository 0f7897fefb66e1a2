using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.LinearAlgebra.Factorization;

namespace Patchproof.Core.Estimation;

/// <summary>Weighted linear least squares by Householder QR of the column-equilibrated design matrix.</summary>
/// <remarks>
/// <para>Solves min_beta sum_i w_i (y_i - x_i beta)^2. Steps: scale each row by sqrt(w_i); scale each column to unit
/// 2-norm (this changes nothing in exact arithmetic but makes the rank decision and the condition number independent of
/// the columns' units; powers of two, so exactly); factor X = Q R; solve R z = Q' y; refine three times on the augmented
/// system with residuals summed in doubled precision; unscale. The covariance s^2 (R' R)^-1 comes
/// from R^-1, so the condition number enters once, not squared as with the normal equations.</para>
/// <para>Rank: singular values of R (they equal those of the scaled design) below max(n, p) * epsilon * sigma_max count
/// as zero (the LAPACK/NumPy default). A rank-deficient problem gets the minimum-norm solution by truncated SVD and
/// <see cref="LinearLeastSquaresStatus.RankDeficient"/>.</para>
/// <para>References:
/// 1. G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed., 2013, sections 5.2-5.3.
/// 2. A. Björck, Iterative refinement of linear least squares solutions I, BIT 7 (1967) 257-278; and Numerical
/// Methods for Least Squares Problems, SIAM 1996, section 2.9.
/// 3. T. Ogita, S. M. Rump, S. Oishi, Accurate sum and dot product, SIAM J. Sci. Comput. 26 (2005) 1955-1988.
/// 4. NIST ITL Statistical Reference Datasets, linear regression (Longley, Filip...).</para>
/// </remarks>
public static class LinearLeastSquares
{
    /// <summary>Fits y = X beta by (weighted) least squares.</summary>
    /// <param name="design">The design matrix X, n rows by p columns with n at least p; finite entries.</param>
    /// <param name="response">The response y, length n; finite.</param>
    /// <param name="weights">Optional weights w_i (positive, finite), usually 1 / sigma_i^2; null for equal weights.</param>
    /// <returns>The coefficients with standard errors, covariance, residual variance, rank and condition number.</returns>
    /// <exception cref="ArgumentOutOfRangeException">When the shapes disagree, there are fewer rows than columns, or a value is not finite or a weight not positive.</exception>
    public static LinearLeastSquaresResult Fit(Matrix<double> design, Vector<double> response, Vector<double>? weights = null)
    {
        ArgumentNullException.ThrowIfNull(design);
        ArgumentNullException.ThrowIfNull(response);
        var rows = design.RowCount;
        var columns = design.ColumnCount;
        Preconditions.CheckArgumentRange(nameof(design), columns >= 1 && rows >= columns, "needs at least one column and at least as many rows as columns");
        Preconditions.CheckArgumentRange(nameof(response), response.Count == rows, "must have one entry per design row");
        Preconditions.CheckArgumentRange(nameof(weights), weights is null || weights.Count == rows, "must have one entry per design row");
        for (var i = 0; i < rows; i++)
        {
            if (!double.IsFinite(response[i]))
            {
                Preconditions.CheckArgumentRange(nameof(response), false, $"entry {i} is not a finite number");
            }

            if (weights is not null && !(double.IsFinite(weights[i]) && weights[i] > 0))
            {
                Preconditions.CheckArgumentRange(nameof(weights), false, $"entry {i} must be positive and finite");
            }
        }

        // Column-major copy, rows scaled by sqrt(w), columns by a power of two near their norm.
        var entries = design.ToColumnMajorArray();
        var weightedResponse = response.ToArray();
        var rootWeights = new double[rows];
        for (var i = 0; i < rows; i++)
        {
            rootWeights[i] = weights is null ? 1.0 : Math.Sqrt(weights[i]);
            weightedResponse[i] *= rootWeights[i];
        }

        var columnScales = new double[columns];
        for (var j = 0; j < columns; j++)
        {
            var column = entries.AsSpan(j * rows, rows);
            var norm = 0.0;
            for (var i = 0; i < rows; i++)
            {
                column[i] *= rootWeights[i];
                norm += column[i] * column[i];
            }

            norm = Math.Sqrt(norm);
            if (!double.IsFinite(norm))
            {
                Preconditions.CheckArgumentRange(nameof(design), false, $"column {j} holds a value that is not finite");
            }

            // A power of two keeps the scaled matrix exact, so refinement below works on the very problem posed.
            columnScales[j] = norm > 0 ? Math.ScaleB(1.0, Math.ILogB(norm)) : 1.0;
            var inverseScale = 1.0 / columnScales[j];
            for (var i = 0; i < rows; i++)
            {
                column[i] *= inverseScale;
            }
        }

        var qr = new HouseholderQr(entries, rows, columns);
        var upper = Matrix<double>.Build.Dense(columns, columns, qr.UpperAt);
        var singularValues = upper.Svd(computeVectors: false).S;
        var largest = singularValues.Maximum();
        var smallest = singularValues.Minimum();
        var threshold = Math.Max(rows, columns) * 2.220446049250313e-16 * largest;
        var rank = singularValues.Count(value => value > threshold);
        var conditionNumber = smallest > 0 ? largest / smallest : double.PositiveInfinity;

        double[] scaledCoefficients;
        Matrix<double> scaledInverseNormal;
        LinearLeastSquaresStatus status;
        if (rank == columns)
        {
            var upperInverse = InvertUpperTriangular(upper);
            scaledCoefficients = RefineOnAugmentedSystem(entries, rows, columns, weightedResponse, qr, upperInverse);
            scaledInverseNormal = upperInverse.TransposeAndMultiply(upperInverse);
            status = LinearLeastSquaresStatus.FullRank;
        }
        else
        {
            var pseudoInverse = PseudoInverse(Matrix<double>.Build.Dense(rows, columns, entries), threshold);
            scaledCoefficients = (pseudoInverse * Vector<double>.Build.Dense(weightedResponse)).ToArray();
            scaledInverseNormal = pseudoInverse.TransposeAndMultiply(pseudoInverse);
            status = LinearLeastSquaresStatus.RankDeficient;
        }

        var coefficients = Vector<double>.Build.Dense(columns, j => scaledCoefficients[j] / columnScales[j]);
        var residualSums = new double[rows];
        var residualCompensations = new double[rows];
        for (var i = 0; i < rows; i++)
        {
            residualSums[i] = weightedResponse[i];
        }

        for (var j = 0; j < columns; j++)
        {
            var column = entries.AsSpan(j * rows, rows);
            for (var i = 0; i < rows; i++)
            {
                AddProduct(-column[i], scaledCoefficients[j], ref residualSums[i], ref residualCompensations[i]);
            }
        }

        var residuals = Vector<double>.Build.Dense(rows);
        var weightedRss = 0.0;
        for (var i = 0; i < rows; i++)
        {
            var weightedResidual = residualSums[i] + residualCompensations[i];
            weightedRss += weightedResidual * weightedResidual;
            residuals[i] = weightedResidual / rootWeights[i];
        }

        var degreesOfFreedom = rows - rank;
        var residualVariance = degreesOfFreedom > 0 ? weightedRss / degreesOfFreedom : double.NaN;
        var covariance = Matrix<double>.Build.Dense(columns, columns, (i, j) => residualVariance * scaledInverseNormal[i, j] / (columnScales[i] * columnScales[j]));
        var standardErrors = Vector<double>.Build.Dense(columns, j => Math.Sqrt(covariance[j, j]));
        return new LinearLeastSquaresResult(coefficients, standardErrors, covariance, residuals, weightedRss, degreesOfFreedom, residualVariance, rank, conditionNumber, status);
    }

    /// <summary>Inverts an upper-triangular matrix by back substitution, column by column.</summary>
    internal static Matrix<double> InvertUpperTriangular(Matrix<double> upper)
    {
        var size = upper.RowCount;
        var inverse = Matrix<double>.Build.Dense(size, size);
        for (var column = 0; column < size; column++)
        {
            for (var row = column; row >= 0; row--)
            {
                var sum = row == column ? 1.0 : 0.0;
                for (var k = row + 1; k <= column; k++)
                {
                    sum -= upper[row, k] * inverse[k, column];
                }

                inverse[row, column] = sum / upper[row, row];
            }
        }

        return inverse;
    }

    /// <summary>Iterative refinement of the least-squares solution on the augmented system [I A; A' 0][r; x] = [b; 0], with the residuals of both blocks accumulated in doubled precision (Björck 1967).</summary>
    /// <remarks>Each pass: f = b - r - A x and g = -A' r (compensated sums), then the correction from the same QR factor:
    /// h = R^-T g, dx = R^-1 (Q' f - h), dr = f - A dx. This removes the kappa^2 * ||r|| error term that a plain QR
    /// solve leaves on large-residual problems (NIST Wampler4/5) and most of the rounding on ill-conditioned ones
    /// (Filip).</remarks>
    private static double[] RefineOnAugmentedSystem(double[] entries, int rows, int columns, double[] response, HouseholderQr qr, Matrix<double> upperInverse)
    {
        const int Passes = 3;
        var projected = (double[])response.Clone();
        qr.ApplyTranspose(projected);
        var x = (upperInverse * Vector<double>.Build.Dense(columns, j => projected[j])).ToArray();
        var r = new double[rows];
        var f = new double[rows];
        var compensation = new double[rows];
        var g = Vector<double>.Build.Dense(columns);
        var dx = new double[columns];
        Residual(entries, rows, columns, response, null, x, r, compensation);
        for (var pass = 0; pass < Passes; pass++)
        {
            Residual(entries, rows, columns, response, r, x, f, compensation);
            for (var j = 0; j < columns; j++)
            {
                var column = entries.AsSpan(j * rows, rows);
                double sum = 0, error = 0;
                for (var i = 0; i < rows; i++)
                {
                    AddProduct(-column[i], r[i], ref sum, ref error);
                }

                g[j] = sum + error;
            }

            var h = upperInverse.TransposeThisAndMultiply(g);
            f.CopyTo(projected, 0);
            qr.ApplyTranspose(projected);
            var right = Vector<double>.Build.Dense(columns, j => projected[j] - h[j]);
            var correction = upperInverse * right;
            for (var j = 0; j < columns; j++)
            {
                dx[j] = correction[j];
                x[j] += dx[j];
            }

            for (var i = 0; i < rows; i++)
            {
                r[i] += f[i];
            }

            for (var j = 0; j < columns; j++)
            {
                var column = entries.AsSpan(j * rows, rows);
                for (var i = 0; i < rows; i++)
                {
                    r[i] -= column[i] * dx[j];
                }
            }
        }

        return x;
    }

    /// <summary>destination_i = b_i - r_i - sum_j a_ij x_j, accumulated with error-free transformations (Ogita, Rump and Oishi's Dot2); r may be null (zero).</summary>
    private static void Residual(double[] entries, int rows, int columns, double[] response, double[]? residual, double[] x, double[] destination, double[] compensation)
    {
        for (var i = 0; i < rows; i++)
        {
            destination[i] = response[i];
            compensation[i] = 0;
            if (residual is not null)
            {
                AddProduct(-1.0, residual[i], ref destination[i], ref compensation[i]);
            }
        }

        for (var j = 0; j < columns; j++)
        {
            var column = entries.AsSpan(j * rows, rows);
            for (var i = 0; i < rows; i++)
            {
                AddProduct(-column[i], x[j], ref destination[i], ref compensation[i]);
            }
        }

        for (var i = 0; i < rows; i++)
        {
            destination[i] += compensation[i];
        }
    }

    private static void AddProduct(double a, double b, ref double sum, ref double compensation)
    {
        var product = a * b;
        var productError = Math.FusedMultiplyAdd(a, b, -product);
        var total = sum + product;
        var virtualProduct = total - sum;
        var sumError = (sum - (total - virtualProduct)) + (product - virtualProduct);
        sum = total;
        compensation += sumError + productError;
    }

    /// <summary>(X'X)^-1 through the QR factor of the column-equilibrated X; the pseudo-inverse when X is numerically rank deficient.</summary>
    internal static Matrix<double> InverseNormalMatrix(Matrix<double> design)
    {
        var columns = design.ColumnCount;
        var scales = new double[columns];
        var scaled = design.Clone();
        for (var j = 0; j < columns; j++)
        {
            var norm = scaled.Column(j).L2Norm();
            scales[j] = norm > 0 ? norm : 1.0;
            scaled.SetColumn(j, scaled.Column(j) / scales[j]);
        }

        var upper = scaled.QR(QRMethod.Thin).R;
        var singularValues = upper.Svd(computeVectors: false).S;
        var threshold = Math.Max(design.RowCount, columns) * 2.220446049250313e-16 * singularValues.Maximum();
        Matrix<double> inverse;
        if (singularValues.All(value => value > threshold))
        {
            var upperInverse = InvertUpperTriangular(upper);
            inverse = upperInverse.TransposeAndMultiply(upperInverse);
        }
        else
        {
            var pseudoInverse = PseudoInverse(scaled, threshold);
            inverse = pseudoInverse.TransposeAndMultiply(pseudoInverse);
        }

        return Matrix<double>.Build.Dense(columns, columns, (i, j) => inverse[i, j] / (scales[i] * scales[j]));
    }

    private static Matrix<double> PseudoInverse(Matrix<double> matrix, double threshold)
    {
        var svd = matrix.Svd(computeVectors: true);
        var reciprocal = Matrix<double>.Build.Dense(matrix.ColumnCount, matrix.ColumnCount);
        for (var k = 0; k < svd.S.Count; k++)
        {
            reciprocal[k, k] = svd.S[k] > threshold ? 1.0 / svd.S[k] : 0.0;
        }

        var v = svd.VT.Transpose();
        var u = svd.U.SubMatrix(0, matrix.RowCount, 0, matrix.ColumnCount);
        return v * reciprocal * u.Transpose();
    }
}
