namespace Patchproof.Core.Models.Library;

/// <summary>The Rössler system, written by hand: x' = -y - z, y' = x + a y, z' = b + z (x - c).</summary>
/// <remarks>
/// <para>Parameters (a, b, c), values 0.2, 0.2, 5.7 as listed with the system in Sprott's "Common
/// Chaotic Systems" (Rössler's paper itself used other values; the 5.7 set is the one in common
/// use).</para>
/// <para>References: 1. O. E. Rössler, "An equation for continuous chaos", Phys. Lett. A 57:397-398 (1976).
/// 2. J. C. Sprott, "Common Chaotic Systems", Univ. of Wisconsin web page (1998, rev. 2004).</para>
/// </remarks>
public sealed class RosslerSystem : IOdeSystem
{
    /// <inheritdoc />
    public int StateCount => 3;

    /// <inheritdoc />
    public int ParameterCount => 3;

    /// <inheritdoc />
    public IReadOnlyList<string> StateNames { get; } = ["x", "y", "z"];

    /// <inheritdoc />
    public IReadOnlyList<string> ParameterNames { get; } = ["a", "b", "c"];

    /// <inheritdoc />
    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        double x = state[0], y = state[1], z = state[2];
        double a = parameters[0], b = parameters[1], c = parameters[2];
        derivative[2] = b + (z * (x - c));
        derivative[0] = -y - z;
        derivative[1] = x + (a * y);
    }

    /// <inheritdoc />
    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double x = state[0], z = state[2];
        double a = parameters[0], c = parameters[2];
        jacobian[8] = x - c;
        jacobian[0] = 0;
        jacobian[1] = -1;
        jacobian[2] = -1;
        jacobian[3] = 1;
        jacobian[4] = a;
        jacobian[5] = 0;
        jacobian[6] = z;
        jacobian[7] = 0;
    }

    /// <inheritdoc />
    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double y = state[1], z = state[2];
        jacobian[8] = -z;
        jacobian[0] = 0;
        jacobian[1] = 0;
        jacobian[2] = 0;
        jacobian[3] = y;
        jacobian[4] = 0;
        jacobian[5] = 0;
        jacobian[6] = 0;
        jacobian[7] = 1;
    }
}
