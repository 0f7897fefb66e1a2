namespace Patchproof.Core.Diagnosis;

/// <summary>What the diagnosis explains: measured rows, the columns that can move them, and the rows' covariance.</summary>
/// <remarks>
/// The model is linear and Gaussian: w = A u + e, with w the row values, A the column entries,
/// u ~ N(0, D) the deviations (D from each column's prior) and e ~ N(0, <see cref="Covariance"/>).
/// The covariance is in the rows' own units (log units squared, volts squared) and must be symmetric
/// positive definite; it is copied on construction.
/// </remarks>
public sealed record DiagnosisProblem
{
    private readonly double[,] covariance;

    /// <summary>Creates a problem and checks its shapes.</summary>
    /// <param name="rows">The measured rows (at least one).</param>
    /// <param name="columns">The columns; each has one entry per row.</param>
    /// <param name="covariance">The rows' covariance, rows by rows, symmetric positive definite.</param>
    /// <exception cref="ArgumentOutOfRangeException">A shape does not match or a value is not finite.</exception>
    public DiagnosisProblem(IReadOnlyList<DiagnosisRow> rows, IReadOnlyList<DiagnosisColumn> columns, double[,] covariance)
    {
        Preconditions.CheckArgumentRange(nameof(rows), rows.Count > 0, "needs at least one row");
        Preconditions.CheckArgumentRange(nameof(covariance), covariance.GetLength(0) == rows.Count && covariance.GetLength(1) == rows.Count, "must be rows by rows");
        foreach (var column in columns)
        {
            Preconditions.CheckArgumentRange(nameof(columns), column.Entries.Count == rows.Count, $"column {column.Id} must have one entry per row");
            Preconditions.CheckArgumentRange(nameof(columns), column.Entries.All(double.IsFinite) && column.HealthySd >= 0 && column.FaultSd >= 0, $"column {column.Id} has a non-finite entry or a negative prior");
        }

        Preconditions.CheckArgumentRange(nameof(rows), rows.All(row => double.IsFinite(row.Value)), "every row value must be finite");
        Preconditions.CheckArgumentRange(nameof(columns), columns.Select(column => column.Id).Distinct(StringComparer.Ordinal).Count() == columns.Count, "column ids must be unique");
        Rows = rows.ToArray();
        Columns = columns.ToArray();
        this.covariance = (double[,])covariance.Clone();
    }

    /// <summary>The measured rows.</summary>
    public IReadOnlyList<DiagnosisRow> Rows { get; }

    /// <summary>The columns that can move the rows.</summary>
    public IReadOnlyList<DiagnosisColumn> Columns { get; }

    /// <summary>A copy of the rows' covariance.</summary>
    public double[,] Covariance => (double[,])covariance.Clone();

    internal double CovarianceAt(int i, int j) => covariance[i, j];
}
