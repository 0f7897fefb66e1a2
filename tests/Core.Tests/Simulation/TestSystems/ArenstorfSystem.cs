using Patchproof.Core.Models;

namespace Patchproof.Core.Tests.Simulation.TestSystems;

/// <summary>The restricted three-body problem of Arenstorf's orbit (Hairer, Nørsett &amp; Wanner, Solving ODE I, Sec. II.0), state (y1, y2, y1', y2'); parameter μ.</summary>
internal sealed class ArenstorfSystem : IOdeSystem
{
    public const double Mu = 0.012277471;
    public const double InitialY2Velocity = -2.00158510637908252240537862224;
    public const double Period = 17.0652165601579625588917206249;

    public int StateCount => 4;

    public int ParameterCount => 1;

    public IReadOnlyList<string> StateNames { get; } = ["y1", "y2", "v1", "v2"];

    public IReadOnlyList<string> ParameterNames { get; } = ["mu"];

    public static double JacobiConstant(ReadOnlySpan<double> s)
    {
        var r1 = Math.Sqrt(((s[0] + Mu) * (s[0] + Mu)) + (s[1] * s[1]));
        var r2 = Math.Sqrt(((s[0] - 1 + Mu) * (s[0] - 1 + Mu)) + (s[1] * s[1]));
        return (s[0] * s[0]) + (s[1] * s[1]) + (2 * (1 - Mu) / r1) + (2 * Mu / r2) - ((s[2] * s[2]) + (s[3] * s[3]));
    }

    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        var mu = parameters[0];
        var muPrime = 1 - mu;
        double y1 = state[0], y2 = state[1];
        var d1 = Math.Pow(((y1 + mu) * (y1 + mu)) + (y2 * y2), 1.5);
        var d2 = Math.Pow(((y1 - muPrime) * (y1 - muPrime)) + (y2 * y2), 1.5);
        derivative[0] = state[2];
        derivative[1] = state[3];
        derivative[2] = y1 + (2 * state[3]) - (muPrime * (y1 + mu) / d1) - (mu * (y1 - muPrime) / d2);
        derivative[3] = y2 - (2 * state[2]) - (muPrime * y2 / d1) - (mu * y2 / d2);
    }

    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian) =>
        throw new NotSupportedException("not needed by the tests");

    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian) =>
        throw new NotSupportedException("not needed by the tests");
}
