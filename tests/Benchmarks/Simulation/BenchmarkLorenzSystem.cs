using Patchproof.Core.Models;

namespace Patchproof.Benchmarks.Simulation;

/// <summary>Lorenz (1963) written by hand, so the benchmark measures the solver and not a compiled model.</summary>
internal sealed class BenchmarkLorenzSystem : IOdeSystem
{
    public int StateCount => 3;

    public int ParameterCount => 3;

    public IReadOnlyList<string> StateNames { get; } = ["x", "y", "z"];

    public IReadOnlyList<string> ParameterNames { get; } = ["sigma", "rho", "beta"];

    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        double x = state[0], y = state[1], z = state[2];
        derivative[2] = (x * y) - (parameters[2] * z);
        derivative[1] = (x * (parameters[1] - z)) - y;
        derivative[0] = parameters[0] * (y - x);
    }

    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double x = state[0], y = state[1], z = state[2];
        jacobian[8] = -parameters[2];
        jacobian[0] = -parameters[0];
        jacobian[1] = parameters[0];
        jacobian[2] = 0;
        jacobian[3] = parameters[1] - z;
        jacobian[4] = -1;
        jacobian[5] = -x;
        jacobian[6] = y;
        jacobian[7] = x;
    }

    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double x = state[0], y = state[1], z = state[2];
        jacobian[8] = -z;
        jacobian[0] = y - x;
        jacobian[1] = 0;
        jacobian[2] = 0;
        jacobian[3] = 0;
        jacobian[4] = x;
        jacobian[5] = 0;
        jacobian[6] = 0;
        jacobian[7] = 0;
    }
}
