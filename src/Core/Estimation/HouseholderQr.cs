namespace Patchproof.Core.Estimation;

/// <summary>A Householder QR factorization of a tall matrix held column-major in a plain array, without threads or temporary matrices.</summary>
/// <remarks>
/// <para>A = Q R with Q = H_0 H_1 ... H_(p-1), H_k = I - tau_k v_k v_k' and v_k(k) = 1 (the LAPACK dgeqr2 layout):
/// R sits on and above the diagonal, the reflectors below it. Tall least-squares problems (thousands of rows, a
/// handful of columns) are cheapest this way; the library's general QR spends more on thread scheduling than on
/// arithmetic at this shape on a busy two-core machine.</para>
/// <para>References: 1. G. H. Golub, C. F. Van Loan, Matrix Computations, 4th ed., 2013, algorithm 5.2.1.</para>
/// </remarks>
internal sealed class HouseholderQr
{
    private readonly double[] factors;
    private readonly double[] tau;

    /// <summary>Factors the rows-by-columns matrix <paramref name="columnMajor"/> (copied).</summary>
    public HouseholderQr(ReadOnlySpan<double> columnMajor, int rows, int columns)
    {
        Rows = rows;
        Columns = columns;
        factors = columnMajor.ToArray();
        tau = new double[columns];
        for (var k = 0; k < columns; k++)
        {
            var column = factors.AsSpan(k * rows, rows);
            var alpha = column[k];
            var norm = 0.0;
            for (var i = k; i < rows; i++)
            {
                norm += column[i] * column[i];
            }

            norm = Math.Sqrt(norm);
            if (norm == 0)
            {
                tau[k] = 0;
                continue;
            }

            var beta = alpha >= 0 ? -norm : norm;
            var scale = 1.0 / (alpha - beta);
            for (var i = k + 1; i < rows; i++)
            {
                column[i] *= scale;
            }

            tau[k] = (beta - alpha) / beta;
            column[k] = beta;
            for (var j = k + 1; j < columns; j++)
            {
                Reflect(k, factors.AsSpan(j * rows, rows));
            }
        }
    }

    /// <summary>The number of rows n.</summary>
    public int Rows { get; }

    /// <summary>The number of columns p.</summary>
    public int Columns { get; }

    /// <summary>R(i, j) for i &lt;= j.</summary>
    public double UpperAt(int row, int column) => row <= column ? factors[column * Rows + row] : 0.0;

    /// <summary>Overwrites <paramref name="vector"/> (length n) with Q' vector; its first p entries are then the projection's coordinates.</summary>
    public void ApplyTranspose(Span<double> vector)
    {
        for (var k = 0; k < Columns; k++)
        {
            Reflect(k, vector);
        }
    }

    /// <summary>Overwrites <paramref name="vector"/> (length n) with Q vector.</summary>
    public void Apply(Span<double> vector)
    {
        for (var k = Columns - 1; k >= 0; k--)
        {
            Reflect(k, vector);
        }
    }

    private void Reflect(int k, Span<double> target)
    {
        if (tau[k] == 0)
        {
            return;
        }

        var reflector = factors.AsSpan(k * Rows, Rows);
        var sum = target[k];
        for (var i = k + 1; i < Rows; i++)
        {
            sum += reflector[i] * target[i];
        }

        sum *= tau[k];
        target[k] -= sum;
        for (var i = k + 1; i < Rows; i++)
        {
            target[i] -= reflector[i] * sum;
        }
    }
}
