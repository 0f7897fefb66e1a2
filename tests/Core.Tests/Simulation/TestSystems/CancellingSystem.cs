using Patchproof.Core.Models;

namespace Patchproof.Core.Tests.Simulation.TestSystems;

/// <summary>Wraps a system and cancels a token once the field has been evaluated a given number of times: a cancel
/// that arrives in the middle of a long computation at a known point, without timing.</summary>
internal sealed class CancellingSystem(IOdeSystem inner, CancellationTokenSource source, long evaluationsBeforeCancel) : IOdeSystem
{
    private long evaluations;

    /// <summary>Field evaluations so far (state Jacobians not counted).</summary>
    public long Evaluations => Interlocked.Read(ref evaluations);

    public int StateCount => inner.StateCount;

    public int ParameterCount => inner.ParameterCount;

    public IReadOnlyList<string> StateNames => inner.StateNames;

    public IReadOnlyList<string> ParameterNames => inner.ParameterNames;

    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        if (Interlocked.Increment(ref evaluations) == evaluationsBeforeCancel)
        {
            source.Cancel();
        }

        inner.Evaluate(time, state, parameters, derivative);
    }

    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian) =>
        inner.EvaluateStateJacobian(time, state, parameters, jacobian);

    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian) =>
        inner.EvaluateParameterJacobian(time, state, parameters, jacobian);
}
