using MathNet.Numerics.LinearAlgebra;

namespace Patchproof.Core.Diagnosis;

/// <summary>The linear-Gaussian algebra behind the diagnosis: w = A u + e, e ~ N(0, Σ_w), u ~ N(0, D).</summary>
internal sealed class LinearGaussianModel
{
    private const double ObservabilityThreshold = 1e-9;

    private readonly Matrix<double> design;
    private readonly Matrix<double> rowCovariance;
    private readonly Vector<double> measured;
    private readonly Matrix<double> whitened;

    private LinearGaussianModel(Matrix<double> design, Matrix<double> rowCovariance, Vector<double> measured, Matrix<double> whitened)
    {
        this.design = design;
        this.rowCovariance = rowCovariance;
        this.measured = measured;
        this.whitened = whitened;
    }

    public int RowCount => design.RowCount;

    public static LinearGaussianModel Create(DiagnosisProblem problem)
    {
        var rows = problem.Rows.Count;
        var design = Matrix<double>.Build.Dense(rows, problem.Columns.Count, (i, j) => problem.Columns[j].Entries[i]);
        var covariance = Matrix<double>.Build.Dense(rows, rows, problem.CovarianceAt);
        var measured = Vector<double>.Build.Dense(rows, i => problem.Rows[i].Value);
        Matrix<double> lower;
        try
        {
            lower = covariance.Cholesky().Factor;
        }
        catch (ArgumentException)
        {
            throw new ArgumentOutOfRangeException(nameof(problem), "the rows' covariance must be symmetric positive definite");
        }

        var whitened = lower.Solve(design);
        return new LinearGaussianModel(design, covariance, measured, whitened);
    }

    /// <summary>True when some measured row depends on column j.</summary>
    public bool IsObservable(int j) => whitened.Column(j).L2Norm() > ObservabilityThreshold;

    /// <summary>Cosine between two columns after whitening by the rows' covariance.</summary>
    public double WhitenedCosine(int i, int k)
    {
        var a = whitened.Column(i);
        var b = whitened.Column(k);
        return a.DotProduct(b) / (a.L2Norm() * b.L2Norm());
    }

    /// <summary>The deviation of column k that has the same effect as a unit deviation of column i (least squares in the whitened metric).</summary>
    public double ImpliedRatio(int i, int k)
    {
        var a = whitened.Column(i);
        var b = whitened.Column(k);
        return a.DotProduct(b) / b.DotProduct(b);
    }

    /// <summary>Least squares of column j on the columns in <paramref name="basis"/> in the whitened metric: the coefficients and
    /// the squared cosine between the column and its fit (1 when the basis reproduces it exactly). Rank-deficient bases get the
    /// minimum-norm coefficients.</summary>
    public (double[] Coefficients, double CosineSquared) SpanFit(int j, IReadOnlyList<int> basis)
    {
        var target = whitened.Column(j);
        var norm = target.DotProduct(target);
        if (basis.Count == 0 || norm <= 0)
        {
            return (new double[basis.Count], 0);
        }

        var matrix = Matrix<double>.Build.Dense(whitened.RowCount, basis.Count, (i, k) => whitened[i, basis[k]]);
        var svd = matrix.Svd(true);
        var singular = svd.S;
        var limit = singular.Count > 0 ? singular[0] * 1e-10 : 0;
        var projected = svd.U.TransposeThisAndMultiply(target);
        var coefficients = Vector<double>.Build.Dense(basis.Count);
        for (var k = 0; k < singular.Count; k++)
        {
            if (singular[k] > limit)
            {
                coefficients += svd.VT.Row(k) * (projected[k] / singular[k]);
            }
        }

        var fitted = matrix * coefficients;
        return (coefficients.ToArray(), Math.Min(1, fitted.DotProduct(fitted) / norm));
    }

    /// <summary>Evidence, χ² and posterior marginals for the prior variances <paramref name="priorVariances"/>.</summary>
    public (double LogEvidence, double ChiSquare, double[] Means, double[] Sds) Evaluate(double[] priorVariances)
    {
        var scaled = design.Clone();
        for (var j = 0; j < scaled.ColumnCount; j++)
        {
            scaled.SetColumn(j, design.Column(j) * priorVariances[j]);
        }

        var marginal = scaled.TransposeAndMultiply(design) + rowCovariance;
        var factor = marginal.Cholesky();
        var alpha = factor.Solve(measured);
        var chiSquare = measured.DotProduct(alpha);
        var logEvidence = -0.5 * chiSquare - 0.5 * (RowCount * Math.Log(2 * Math.PI) + factor.DeterminantLn);
        var projected = design.TransposeThisAndMultiply(alpha);
        var solvedDesign = factor.Solve(design);
        var means = new double[design.ColumnCount];
        var sds = new double[design.ColumnCount];
        for (var j = 0; j < design.ColumnCount; j++)
        {
            means[j] = priorVariances[j] * projected[j];
            var variance = priorVariances[j] - priorVariances[j] * priorVariances[j] * design.Column(j).DotProduct(solvedDesign.Column(j));
            sds[j] = Math.Sqrt(Math.Max(variance, 0));
        }

        return (logEvidence, chiSquare, means, sds);
    }
}
