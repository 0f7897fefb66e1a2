namespace Patchproof.Core.Models.Library;

/// <summary>The damped harmonic oscillator, written by hand: x' = v, v' = -2 zeta omega0 v - omega0^2 x.</summary>
/// <remarks>
/// <para>Parameters (zeta, omega0) = (0.1, 2 pi): damping ratio and undamped angular frequency (one
/// cycle per time unit). From x(0) = 1, v(0) = 0 the closed form gives x(1) = 0.53153512372717173
/// (derived; the project's check values).</para>
/// <para>References: 1. The standard second-order system x'' + 2 zeta omega0 x' + omega0^2 x = 0 of any
/// mechanics or control text (common practice).</para>
/// </remarks>
public sealed class DampedOscillatorSystem : IOdeSystem
{
    /// <inheritdoc />
    public int StateCount => 2;

    /// <inheritdoc />
    public int ParameterCount => 2;

    /// <inheritdoc />
    public IReadOnlyList<string> StateNames { get; } = ["x", "v"];

    /// <inheritdoc />
    public IReadOnlyList<string> ParameterNames { get; } = ["zeta", "omega0"];

    /// <inheritdoc />
    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        double x = state[0], v = state[1];
        double zeta = parameters[0], omega0 = parameters[1];
        derivative[1] = (-2 * zeta * omega0 * v) - (omega0 * omega0 * x);
        derivative[0] = v;
    }

    /// <inheritdoc />
    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double zeta = parameters[0], omega0 = parameters[1];
        jacobian[3] = -2 * zeta * omega0;
        jacobian[0] = 0;
        jacobian[1] = 1;
        jacobian[2] = -(omega0 * omega0);
    }

    /// <inheritdoc />
    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double x = state[0], v = state[1];
        double zeta = parameters[0], omega0 = parameters[1];
        jacobian[3] = (-2 * zeta * v) - (2 * omega0 * x);
        jacobian[0] = 0;
        jacobian[1] = 0;
        jacobian[2] = -2 * omega0 * v;
    }
}
