using Patchproof.Core.Models;

namespace Patchproof.Core.Tests.Simulation.TestSystems;

/// <summary>Van der Pol: x' = v, v' = μ(1 - x²)v - x; parameter μ.</summary>
internal sealed class VanDerPolSystem : IOdeSystem
{
    public int StateCount => 2;

    public int ParameterCount => 1;

    public IReadOnlyList<string> StateNames { get; } = ["x", "v"];

    public IReadOnlyList<string> ParameterNames { get; } = ["mu"];

    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        derivative[0] = state[1];
        derivative[1] = (parameters[0] * (1 - (state[0] * state[0])) * state[1]) - state[0];
    }

    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        jacobian[0] = 0;
        jacobian[1] = 1;
        jacobian[2] = (-2 * parameters[0] * state[0] * state[1]) - 1;
        jacobian[3] = parameters[0] * (1 - (state[0] * state[0]));
    }

    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        jacobian[0] = 0;
        jacobian[1] = (1 - (state[0] * state[0])) * state[1];
    }
}
