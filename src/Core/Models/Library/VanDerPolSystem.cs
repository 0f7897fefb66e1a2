namespace Patchproof.Core.Models.Library;

/// <summary>The Van der Pol oscillator, written by hand: x' = y, y' = mu (1 - x^2) y - x.</summary>
/// <remarks>
/// <para>One parameter mu, nominal 1, for which the limit cycle has period 6.6632868593231 (computed,
/// see the project's check values).</para>
/// <para>References: 1. B. van der Pol, "On relaxation-oscillations", Phil. Mag. (7) 2:978-992 (1926)
/// (from memory).</para>
/// </remarks>
public sealed class VanDerPolSystem : IOdeSystem
{
    /// <inheritdoc />
    public int StateCount => 2;

    /// <inheritdoc />
    public int ParameterCount => 1;

    /// <inheritdoc />
    public IReadOnlyList<string> StateNames { get; } = ["x", "y"];

    /// <inheritdoc />
    public IReadOnlyList<string> ParameterNames { get; } = ["mu"];

    /// <inheritdoc />
    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        double x = state[0], y = state[1];
        var mu = parameters[0];
        derivative[1] = (mu * (1 - (x * x)) * y) - x;
        derivative[0] = y;
    }

    /// <inheritdoc />
    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double x = state[0], y = state[1];
        var mu = parameters[0];
        jacobian[3] = mu * (1 - (x * x));
        jacobian[0] = 0;
        jacobian[1] = 1;
        jacobian[2] = (-2 * mu * x * y) - 1;
    }

    /// <inheritdoc />
    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double x = state[0], y = state[1];
        jacobian[1] = (1 - (x * x)) * y;
        jacobian[0] = 0;
    }
}
