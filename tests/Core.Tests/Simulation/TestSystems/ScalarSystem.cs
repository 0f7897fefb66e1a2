using Patchproof.Core.Models;

namespace Patchproof.Core.Tests.Simulation.TestSystems;

/// <summary>A one-dimensional system y' = f(t, y) without parameters, for closed-form problems.</summary>
internal sealed class ScalarSystem(Func<double, double, double> function, Func<double, double, double>? derivativeByY = null) : IOdeSystem
{
    public int StateCount => 1;

    public int ParameterCount => 0;

    public IReadOnlyList<string> StateNames { get; } = ["y"];

    public IReadOnlyList<string> ParameterNames { get; } = [];

    /// <summary>The latest time at which f was evaluated, in either direction of integration.</summary>
    public double LargestTimeEvaluated { get; private set; } = double.NegativeInfinity;

    /// <summary>The earliest time at which f was evaluated.</summary>
    public double SmallestTimeEvaluated { get; private set; } = double.PositiveInfinity;

    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        LargestTimeEvaluated = Math.Max(LargestTimeEvaluated, time);
        SmallestTimeEvaluated = Math.Min(SmallestTimeEvaluated, time);
        derivative[0] = function(time, state[0]);
    }

    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian) =>
        jacobian[0] = derivativeByY is null ? throw new NotSupportedException("no Jacobian given") : derivativeByY(time, state[0]);

    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
    }
}
