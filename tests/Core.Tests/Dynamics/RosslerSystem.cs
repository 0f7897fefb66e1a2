using Patchproof.Core.Models;

namespace Patchproof.Core.Tests.Dynamics;

/// <summary>Rössler (1976): x' = -y - z, y' = x + a y, z' = b + z (x - c); parameters a, b, c.</summary>
internal sealed class RosslerSystem : IOdeSystem
{
    public int StateCount => 3;

    public int ParameterCount => 3;

    public IReadOnlyList<string> StateNames { get; } = ["x", "y", "z"];

    public IReadOnlyList<string> ParameterNames { get; } = ["a", "b", "c"];

    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        derivative[0] = -state[1] - state[2];
        derivative[1] = state[0] + parameters[0] * state[1];
        derivative[2] = parameters[1] + state[2] * (state[0] - parameters[2]);
    }

    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        jacobian.Clear();
        jacobian[1] = -1;
        jacobian[2] = -1;
        jacobian[3] = 1;
        jacobian[4] = parameters[0];
        jacobian[6] = state[2];
        jacobian[8] = state[0] - parameters[2];
    }

    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        jacobian.Clear();
        jacobian[3] = state[1];
        jacobian[7] = 1;
        jacobian[8] = -state[2];
    }
}
