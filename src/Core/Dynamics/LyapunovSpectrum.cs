namespace Patchproof.Core.Dynamics;

/// <summary>Lyapunov exponents, largest first, with the Kaplan-Yorke dimension.</summary>
/// <param name="Exponents">lambda_1 &gt;= lambda_2 &gt;= ... per iteration (maps) or per time unit (flows).</param>
/// <param name="KaplanYorkeDimension">D_KY from the exponents.</param>
/// <param name="Steps">Iterations (maps) or re-orthonormalizations (flows) averaged over.</param>
/// <param name="Duration">Iterations (maps) or time units (flows) averaged over.</param>
public sealed record LyapunovSpectrum(double[] Exponents, double KaplanYorkeDimension, long Steps, double Duration)
{
    /// <summary>Null when the run completed; otherwise a sentence saying why it stopped early (the exponents then cover the completed part).</summary>
    public string? Problem { get; init; }

    /// <summary>The sum of the exponents (the mean of ln |det J| per unit).</summary>
    public double Sum() => Exponents.Sum();

    /// <summary>The Kaplan-Yorke dimension of exponents sorted largest first.</summary>
    /// <remarks>D_KY = j + (lambda_1 + ... + lambda_j) / |lambda_{j+1}|, j the largest index whose
    /// partial sum is non-negative; 0 when lambda_1 &lt; 0 and n when every partial sum is
    /// non-negative. References: 1. J. L. Kaplan, J. A. Yorke, Chaotic behavior of multidimensional
    /// difference equations, Lecture Notes in Math. 730 (1979) 204-227.</remarks>
    /// <param name="exponents">Exponents, largest first.</param>
    public static double KaplanYorke(ReadOnlySpan<double> exponents)
    {
        var partial = 0.0;
        for (var j = 0; j < exponents.Length; j++)
        {
            if (partial + exponents[j] < 0)
            {
                return j + partial / Math.Abs(exponents[j]);
            }

            partial += exponents[j];
        }

        return exponents.Length;
    }
}

/// <summary>The Lyapunov spectrum of a map by the QR method on products of its Jacobian.</summary>
/// <remarks>
/// <para>Method: Q_0 = I; at each iteration J(x_n) Q_n = Q_{n+1} R_{n+1} by modified Gram-Schmidt,
/// and lambda_i = (1/N) sum_n ln |R_n(i, i)|. Each step's sum of ln |R_ii| equals ln |det J(x_n)|
/// to rounding, so the exponents' sum is exact for a map of constant Jacobian determinant (Hénon:
/// ln b).</para>
/// <para>References: 1. G. Benettin, L. Galgani, A. Giorgilli, J.-M. Strelcyn, Lyapunov
/// characteristic exponents for smooth dynamical systems, Meccanica 15 (1980) 9-30.
/// 2. J.-P. Eckmann, D. Ruelle, Ergodic theory of chaos and strange attractors, Rev. Mod. Phys. 57
/// (1985) 617-656, section IV.</para>
/// </remarks>
public static class MapLyapunovSpectrum
{
    /// <summary>Iterates <paramref name="map"/> from <paramref name="initialState"/> and returns its spectrum.</summary>
    /// <param name="map">The map.</param>
    /// <param name="initialState">x_0 (length n).</param>
    /// <param name="iterations">Iterations averaged over (at least 1).</param>
    /// <param name="transient">Iterations run first and discarded (0 or more).</param>
    /// <exception cref="ArgumentOutOfRangeException">When the counts or the state length are wrong.</exception>
    public static LyapunovSpectrum Compute(IDiscreteMap map, ReadOnlySpan<double> initialState, long iterations, long transient = 1000)
    {
        ArgumentNullException.ThrowIfNull(map);
        var n = map.StateCount;
        Preconditions.CheckArgumentRange(nameof(initialState), initialState.Length == n, "must have one value per state variable");
        Preconditions.CheckArgumentRange(nameof(iterations), iterations >= 1, "must be at least 1");
        Preconditions.CheckArgumentRange(nameof(transient), transient >= 0, "must not be negative");
        var state = initialState.ToArray();
        var next = new double[n];
        for (long i = 0; i < transient; i++)
        {
            map.Apply(state, next);
            (state, next) = (next, state);
        }

        var basis = new double[n * n];
        for (var i = 0; i < n; i++)
        {
            basis[i * n + i] = 1;
        }

        var jacobian = new double[n * n];
        var product = new double[n * n];
        var logNorms = new double[n];
        var sums = new double[n];
        for (long step = 0; step < iterations; step++)
        {
            map.EvaluateJacobian(state, jacobian);
            Orthonormalization.Multiply(jacobian, basis, product, n);
            Orthonormalization.ModifiedGramSchmidt(product, n, n, logNorms);
            for (var i = 0; i < n; i++)
            {
                sums[i] += logNorms[i];
            }

            (basis, product) = (product, basis);
            map.Apply(state, next);
            (state, next) = (next, state);
        }

        var exponents = sums.Select(sum => sum / iterations).OrderByDescending(value => value).ToArray();
        return new LyapunovSpectrum(exponents, LyapunovSpectrum.KaplanYorke(exponents), iterations, iterations);
    }
}
