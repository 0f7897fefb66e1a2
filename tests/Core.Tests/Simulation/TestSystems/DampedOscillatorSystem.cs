using Patchproof.Core.Models;

namespace Patchproof.Core.Tests.Simulation.TestSystems;

/// <summary>Damped harmonic oscillator x'' + 2ζω0 x' + ω0² x = 0 as x' = v, v' = -2ζω0 v - ω0² x; parameters ζ, ω0.</summary>
internal sealed class DampedOscillatorSystem : IOdeSystem
{
    public int StateCount => 2;

    public int ParameterCount => 2;

    public IReadOnlyList<string> StateNames { get; } = ["x", "v"];

    public IReadOnlyList<string> ParameterNames { get; } = ["zeta", "omega0"];

    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        double zeta = parameters[0], omega = parameters[1];
        derivative[0] = state[1];
        derivative[1] = (-2 * zeta * omega * state[1]) - (omega * omega * state[0]);
    }

    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double zeta = parameters[0], omega = parameters[1];
        jacobian[0] = 0;
        jacobian[1] = 1;
        jacobian[2] = -omega * omega;
        jacobian[3] = -2 * zeta * omega;
    }

    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double zeta = parameters[0], omega = parameters[1];
        jacobian[0] = 0;
        jacobian[1] = 0;
        jacobian[2] = -2 * omega * state[1];
        jacobian[3] = (-2 * zeta * state[1]) - (2 * omega * state[0]);
    }
}
