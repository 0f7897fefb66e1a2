namespace Patchproof.Core.Models.Library;

/// <summary>The Lotka-Volterra predator-prey system, written by hand: x' = alpha x - beta x y, y' = delta x y - gamma y.</summary>
/// <remarks>
/// <para>Parameters (alpha, beta, gamma, delta) = (2/3, 4/3, 1, 1), a textbook example set (seen in a
/// public course exercise; no primary source). The orbits are closed: V = delta x - gamma ln x + beta y
/// - alpha ln y is conserved (derived).</para>
/// <para>References: 1. A. J. Lotka, Elements of Physical Biology, Williams and Wilkins (1925).
/// 2. V. Volterra, "Fluctuations in the abundance of a species considered mathematically", Nature
/// 118:558-560 (1926) (pages from memory).</para>
/// </remarks>
public sealed class LotkaVolterraSystem : IOdeSystem
{
    /// <inheritdoc />
    public int StateCount => 2;

    /// <inheritdoc />
    public int ParameterCount => 4;

    /// <inheritdoc />
    public IReadOnlyList<string> StateNames { get; } = ["x", "y"];

    /// <inheritdoc />
    public IReadOnlyList<string> ParameterNames { get; } = ["alpha", "beta", "gamma", "delta"];

    /// <inheritdoc />
    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        double x = state[0], y = state[1];
        double alpha = parameters[0], beta = parameters[1], gamma = parameters[2], delta = parameters[3];
        derivative[1] = (delta * x * y) - (gamma * y);
        derivative[0] = (alpha * x) - (beta * x * y);
    }

    /// <inheritdoc />
    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double x = state[0], y = state[1];
        double alpha = parameters[0], beta = parameters[1], gamma = parameters[2], delta = parameters[3];
        jacobian[3] = (delta * x) - gamma;
        jacobian[0] = alpha - (beta * y);
        jacobian[1] = -(beta * x);
        jacobian[2] = delta * y;
    }

    /// <inheritdoc />
    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double x = state[0], y = state[1];
        jacobian[7] = x * y;
        jacobian[0] = x;
        jacobian[1] = -(x * y);
        jacobian[2] = 0;
        jacobian[3] = 0;
        jacobian[4] = 0;
        jacobian[5] = 0;
        jacobian[6] = -y;
    }
}
