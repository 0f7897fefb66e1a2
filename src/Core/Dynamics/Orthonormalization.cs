namespace Patchproof.Core.Dynamics;

/// <summary>Small dense helpers for the QR re-orthonormalization of tangent vectors.</summary>
/// <remarks>Implementation note: the tangent basis has 2 to a few columns and is re-orthonormalized
/// many thousands of times; modified Gram-Schmidt in place on a span allocates nothing, where a
/// library QR would allocate its factors on each call.</remarks>
internal static class Orthonormalization
{
    /// <summary>C = A B for n by n row-major matrices.</summary>
    public static void Multiply(ReadOnlySpan<double> a, ReadOnlySpan<double> b, Span<double> c, int n)
    {
        for (var i = 0; i < n; i++)
        {
            for (var j = 0; j < n; j++)
            {
                var sum = 0.0;
                for (var k = 0; k < n; k++)
                {
                    sum += a[i * n + k] * b[k * n + j];
                }

                c[i * n + j] = sum;
            }
        }
    }

    /// <summary>Orthonormalizes the k columns of an n by k row-major matrix in place; writes ln R_ii (the log of each column's norm after projection) into <paramref name="logNorms"/>.</summary>
    public static void ModifiedGramSchmidt(Span<double> columns, int n, int k, Span<double> logNorms)
    {
        for (var j = 0; j < k; j++)
        {
            for (var p = 0; p < j; p++)
            {
                var dot = 0.0;
                for (var i = 0; i < n; i++)
                {
                    dot += columns[i * k + j] * columns[i * k + p];
                }

                for (var i = 0; i < n; i++)
                {
                    columns[i * k + j] -= dot * columns[i * k + p];
                }
            }

            var norm2 = 0.0;
            for (var i = 0; i < n; i++)
            {
                norm2 += columns[i * k + j] * columns[i * k + j];
            }

            var norm = Math.Sqrt(norm2);
            logNorms[j] = Math.Log(norm);
            var inverse = 1 / norm;
            for (var i = 0; i < n; i++)
            {
                columns[i * k + j] *= inverse;
            }
        }
    }
}
