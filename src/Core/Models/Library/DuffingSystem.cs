namespace Patchproof.Core.Models.Library;

/// <summary>The forced Duffing oscillator, written by hand: x' = v, v' = -delta v - alpha x - beta x^3 + gamma cos(omega t).</summary>
/// <remarks>
/// <para>Parameters (delta, alpha, beta, gamma) = (0.3, -1, 1, 0.5), a double-well oscillator, and the
/// forcing frequency omega = 1.2 as a fixed constant (a function generator sets it; it is not fitted).
/// This set is widely used for the chaotic double-well regime (from memory; the source commonly named
/// is Guckenheimer and Holmes).</para>
/// <para>References: 1. G. Duffing, Erzwungene Schwingungen bei veränderlicher Eigenfrequenz und ihre
/// technische Bedeutung, Vieweg (1918) (from memory). 2. J. Guckenheimer, P. Holmes, Nonlinear
/// Oscillations, Dynamical Systems, and Bifurcations of Vector Fields, Springer (1983), Sec. 2.2
/// (from memory).</para>
/// </remarks>
public sealed class DuffingSystem : IOdeSystem
{
    /// <summary>The forcing frequency omega = 1.2 (radians per unit time).</summary>
    public const double ForcingFrequency = 1.2;

    /// <inheritdoc />
    public int StateCount => 2;

    /// <inheritdoc />
    public int ParameterCount => 4;

    /// <inheritdoc />
    public IReadOnlyList<string> StateNames { get; } = ["x", "v"];

    /// <inheritdoc />
    public IReadOnlyList<string> ParameterNames { get; } = ["delta", "alpha", "beta", "gamma"];

    /// <inheritdoc />
    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        double x = state[0], v = state[1];
        double delta = parameters[0], alpha = parameters[1], beta = parameters[2], gamma = parameters[3];
        derivative[1] = (-delta * v) - (alpha * x) - (beta * (x * x * x)) + (gamma * Math.Cos(ForcingFrequency * time));
        derivative[0] = v;
    }

    /// <inheritdoc />
    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        var x = state[0];
        double delta = parameters[0], alpha = parameters[1], beta = parameters[2];
        jacobian[3] = -delta;
        jacobian[0] = 0;
        jacobian[1] = 1;
        jacobian[2] = -alpha - (3 * beta * x * x);
    }

    /// <inheritdoc />
    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double x = state[0], v = state[1];
        jacobian[7] = Math.Cos(ForcingFrequency * time);
        jacobian[0] = 0;
        jacobian[1] = 0;
        jacobian[2] = 0;
        jacobian[3] = 0;
        jacobian[4] = -v;
        jacobian[5] = -x;
        jacobian[6] = -(x * x * x);
    }
}
