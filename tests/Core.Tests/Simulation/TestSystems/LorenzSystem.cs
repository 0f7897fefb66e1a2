using Patchproof.Core.Models;

namespace Patchproof.Core.Tests.Simulation.TestSystems;

/// <summary>Lorenz (1963): x' = σ(y - x), y' = x(ρ - z) - y, z' = xy - βz; parameters σ, ρ, β.</summary>
internal sealed class LorenzSystem : IOdeSystem
{
    public static readonly double[] ClassicParameters = [10.0, 28.0, 8.0 / 3.0];

    public int StateCount => 3;

    public int ParameterCount => 3;

    public IReadOnlyList<string> StateNames { get; } = ["x", "y", "z"];

    public IReadOnlyList<string> ParameterNames { get; } = ["sigma", "rho", "beta"];

    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        double x = state[0], y = state[1], z = state[2];
        derivative[0] = parameters[0] * (y - x);
        derivative[1] = (x * (parameters[1] - z)) - y;
        derivative[2] = (x * y) - (parameters[2] * z);
    }

    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double x = state[0], y = state[1], z = state[2];
        jacobian[0] = -parameters[0];
        jacobian[1] = parameters[0];
        jacobian[2] = 0;
        jacobian[3] = parameters[1] - z;
        jacobian[4] = -1;
        jacobian[5] = -x;
        jacobian[6] = y;
        jacobian[7] = x;
        jacobian[8] = -parameters[2];
    }

    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        double x = state[0], y = state[1], z = state[2];
        jacobian.Clear();
        jacobian[0] = y - x;
        jacobian[4] = x;
        jacobian[8] = -z;
    }
}
