namespace Patchproof.Core.Dynamics;

/// <summary>A map x_{n+1} = F(x_n) with its Jacobian, evaluated without allocating.</summary>
public interface IDiscreteMap
{
    /// <summary>The number of state variables n (at least 1).</summary>
    int StateCount { get; }

    /// <summary>Writes F(state) into <paramref name="next"/>.</summary>
    /// <param name="state">x_n (length n).</param>
    /// <param name="next">Receives x_{n+1} (length n).</param>
    void Apply(ReadOnlySpan<double> state, Span<double> next);

    /// <summary>Writes dF/dx at <paramref name="state"/>, n by n row-major, into <paramref name="jacobian"/>.</summary>
    /// <param name="state">x_n (length n).</param>
    /// <param name="jacobian">Receives dF_i/dx_j at <c>i * n + j</c>.</param>
    void EvaluateJacobian(ReadOnlySpan<double> state, Span<double> jacobian);
}

/// <summary>The Hénon map x' = 1 - a x^2 + y, y' = b x.</summary>
/// <remarks>The Jacobian is [[-2 a x, 1], [b, 0]] with determinant -b, so the exponents sum to
/// ln |b| exactly. The classic chaotic case is a = 1.4, b = 0.3.
/// References: 1. M. Hénon, A two-dimensional mapping with a strange attractor, Commun. Math.
/// Phys. 50 (1976) 69-77.</remarks>
/// <param name="A">The parameter a.</param>
/// <param name="B">The parameter b.</param>
public sealed record HenonMap(double A = 1.4, double B = 0.3) : IDiscreteMap
{
    /// <inheritdoc/>
    public int StateCount => 2;

    /// <inheritdoc/>
    public void Apply(ReadOnlySpan<double> state, Span<double> next)
    {
        var x = state[0];
        next[0] = 1 - A * x * x + state[1];
        next[1] = B * x;
    }

    /// <inheritdoc/>
    public void EvaluateJacobian(ReadOnlySpan<double> state, Span<double> jacobian)
    {
        jacobian[0] = -2 * A * state[0];
        jacobian[1] = 1;
        jacobian[2] = B;
        jacobian[3] = 0;
    }
}
