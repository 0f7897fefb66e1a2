namespace Patchproof.Core.Models.Library;

/// <summary>Sprott's simplest dissipative chaotic flow, a jerk system, written by hand: x' = y, y' = z, z' = -A z + y^2 - x.</summary>
/// <remarks>
/// <para>The jerk equation x''' = -A x'' + (x')^2 - x with A = 2.017; Sprott gives the chaotic range
/// 2.0168 &lt; A &lt; 2.0577. Its Lyapunov exponents sum to -A.</para>
/// <para>References: 1. J. C. Sprott, "Simplest dissipative chaotic flow", Phys. Lett. A 228:271-274
/// (1997), doi:10.1016/S0375-9601(97)00088-1 (the equation and A = 2.017; the chaotic range is from memory).</para>
/// </remarks>
public sealed class SprottJerkSystem : IOdeSystem
{
    /// <inheritdoc />
    public int StateCount => 3;

    /// <inheritdoc />
    public int ParameterCount => 1;

    /// <inheritdoc />
    public IReadOnlyList<string> StateNames { get; } = ["x", "y", "z"];

    /// <inheritdoc />
    public IReadOnlyList<string> ParameterNames { get; } = ["A"];

    /// <inheritdoc />
    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        double x = state[0], y = state[1], z = state[2];
        var a = parameters[0];
        derivative[2] = (-a * z) + (y * y) - x;
        derivative[0] = y;
        derivative[1] = z;
    }

    /// <inheritdoc />
    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        var y = state[1];
        var a = parameters[0];
        jacobian[8] = -a;
        jacobian[0] = 0;
        jacobian[1] = 1;
        jacobian[2] = 0;
        jacobian[3] = 0;
        jacobian[4] = 0;
        jacobian[5] = 1;
        jacobian[6] = -1;
        jacobian[7] = 2 * y;
    }

    /// <inheritdoc />
    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        jacobian[2] = -state[2];
        jacobian[0] = 0;
        jacobian[1] = 0;
    }
}
