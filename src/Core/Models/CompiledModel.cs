using System.Globalization;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using Patchproof.Core.Models.Expressions;

namespace Patchproof.Core.Models;

/// <summary>An <see cref="EquationModel"/> compiled once to IL: an allocation-free, thread-safe <see cref="IOdeSystem"/> with symbolic Jacobians.</summary>
/// <remarks>
/// <para>The right-hand side f(t, x; p), the state Jacobian df/dx (n by n) and the parameter Jacobian
/// df/dp (n by m) are each one straight-line method generated from the symbolic expressions in
/// <see cref="RightHandSides"/>, <see cref="StateJacobianEntries"/> and
/// <see cref="ParameterJacobianEntries"/>; repeated subexpressions are computed once per call.</para>
/// <para>Span lengths are checked on every call (state and parameters at least n and m long,
/// destinations at least n and n*n or n*m), then the kernels read and write through references.
/// Nothing is cached between calls, so one instance serves many threads.</para>
/// <para>Arithmetic follows IEEE 754: a division by zero or the logarithm of a negative number gives an
/// infinity or NaN in the output, which the solver reports as a non-finite state;
/// <see cref="ExplainNonFinite"/> then names the equation and the operation.</para>
/// </remarks>
public sealed class CompiledModel : IOdeSystem
{
    private readonly CompiledKernels kernels;
    private readonly SampledSignal[] inputs;
    private readonly ModelKernel rightHandSide;
    private readonly ModelKernel stateJacobian;
    private readonly ModelKernel parameterJacobian;
    private readonly int stateCount;
    private readonly int parameterCount;

    internal CompiledModel(EquationModel model, CompiledKernels kernels, SampledSignal[] inputs)
    {
        Model = model;
        this.kernels = kernels;
        this.inputs = inputs;
        stateCount = model.States.Count;
        parameterCount = model.Parameters.Count;
        StateNames = model.StateNames;
        ParameterNames = model.ParameterNames;
        rightHandSide = ModelCompiler.Bind(kernels.RightHandSide, inputs);
        stateJacobian = ModelCompiler.Bind(kernels.StateJacobian, inputs);
        parameterJacobian = ModelCompiler.Bind(kernels.ParameterJacobian, inputs);
    }

    /// <summary>The model this was compiled from.</summary>
    public EquationModel Model { get; }

    /// <inheritdoc />
    public int StateCount => stateCount;

    /// <inheritdoc />
    public int ParameterCount => parameterCount;

    /// <inheritdoc />
    public IReadOnlyList<string> StateNames { get; }

    /// <inheritdoc />
    public IReadOnlyList<string> ParameterNames { get; }

    /// <summary>The compiled right-hand sides f_i (piecewise-linear calls expanded, simplified), in state order.</summary>
    public IReadOnlyList<Expression> RightHandSides => kernels.RightHandSides;

    /// <summary>The symbolic entries df_i/dx_j at <c>i * n + j</c>.</summary>
    public IReadOnlyList<Expression> StateJacobianEntries => kernels.StateJacobianEntries;

    /// <summary>The symbolic entries df_i/dp_k at <c>i * m + k</c>.</summary>
    public IReadOnlyList<Expression> ParameterJacobianEntries => kernels.ParameterJacobianEntries;

    /// <summary>The same compiled code with the inputs bound to other signals (no recompilation).</summary>
    /// <param name="signals">One signal per input, in <see cref="EquationModel.InputNames"/> order.</param>
    /// <exception cref="ArgumentOutOfRangeException">The number of signals differs from the number of inputs.</exception>
    public CompiledModel WithInputs(IReadOnlyList<SampledSignal> signals)
    {
        Preconditions.CheckArgumentRange(nameof(signals), signals.Count == Model.InputNames.Count, $"the model has {Model.InputNames.Count} input(s), {signals.Count} signal(s) were given");
        return new CompiledModel(Model, kernels, [.. signals]);
    }

    /// <inheritdoc />
    public void Evaluate(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> derivative)
    {
        if (state.Length < stateCount || parameters.Length < parameterCount || derivative.Length < stateCount)
        {
            ThrowLengths(state.Length, parameters.Length, derivative.Length, stateCount);
        }

        rightHandSide(
            time,
            ref MemoryMarshal.GetReference(state),
            ref MemoryMarshal.GetReference(parameters),
            ref MemoryMarshal.GetReference(derivative));
    }

    /// <inheritdoc />
    public void EvaluateStateJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        if (state.Length < stateCount || parameters.Length < parameterCount || jacobian.Length < stateCount * stateCount)
        {
            ThrowLengths(state.Length, parameters.Length, jacobian.Length, stateCount * stateCount);
        }

        stateJacobian(
            time,
            ref MemoryMarshal.GetReference(state),
            ref MemoryMarshal.GetReference(parameters),
            ref MemoryMarshal.GetReference(jacobian));
    }

    /// <inheritdoc />
    public void EvaluateParameterJacobian(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, Span<double> jacobian)
    {
        if (state.Length < stateCount || parameters.Length < parameterCount || jacobian.Length < stateCount * parameterCount)
        {
            ThrowLengths(state.Length, parameters.Length, jacobian.Length, stateCount * parameterCount);
        }

        if (parameterCount == 0)
        {
            return;
        }

        parameterJacobian(
            time,
            ref MemoryMarshal.GetReference(state),
            ref MemoryMarshal.GetReference(parameters),
            ref MemoryMarshal.GetReference(jacobian));
    }

    /// <summary>Says which equation gives a non-finite value at this point and at which operation, or null when all are finite.</summary>
    /// <param name="time">t.</param>
    /// <param name="state">The state (length n).</param>
    /// <param name="parameters">The parameters (length m).</param>
    /// <returns>For example "the equation for z (line 7) gives NaN at t = 1.5: log of a negative number in log(x)".</returns>
    public string? ExplainNonFinite(double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters)
    {
        for (var i = 0; i < stateCount; i++)
        {
            var equation = Model.Equations[i];
            var value = ExpressionEvaluator.Evaluate(kernels.RightHandSides[i], time, state, parameters, inputs);
            if (double.IsFinite(value))
            {
                continue;
            }

            var culprit = FindCulprit(kernels.RightHandSides[i], time, state, parameters);
            var where = equation.Line > 0 ? $" (line {equation.Line})" : string.Empty;
            var what = double.IsNaN(value) ? "NaN" : value > 0 ? "+infinity" : "-infinity";
            var cause = culprit is null ? string.Empty : ": " + Describe(culprit, time, state, parameters);
            return $"the equation for {equation.StateName}{where} gives {what} at t = {time.ToString("R", CultureInfo.InvariantCulture)}{cause}";
        }

        return null;
    }

    private Expression? FindCulprit(Expression expression, double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters)
    {
        foreach (var child in expression.Children)
        {
            if (!double.IsFinite(ExpressionEvaluator.Evaluate(child, time, state, parameters, inputs)))
            {
                return FindCulprit(child, time, state, parameters);
            }
        }

        return double.IsFinite(ExpressionEvaluator.Evaluate(expression, time, state, parameters, inputs)) ? null : expression;
    }

    private string Describe(Expression culprit, double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters)
    {
        switch (culprit)
        {
            case BinaryExpression { Operator: BinaryOperator.Divide } division
                when ExpressionEvaluator.Evaluate(division.Right, time, state, parameters, inputs) == 0:
                return $"division by zero in {culprit}";
            case CallExpression { Function: MathFunction.Log } log:
                return ExpressionEvaluator.Evaluate(log.Argument, time, state, parameters, inputs) == 0
                    ? $"log of zero in {culprit}"
                    : $"log of a negative number in {culprit}";
            case CallExpression { Function: MathFunction.Sqrt }:
                return $"square root of a negative number in {culprit}";
            case BinaryExpression { Operator: BinaryOperator.Power }:
                return $"power out of range in {culprit}";
            case StateExpression:
                return $"the state {culprit} is not finite";
            case ParameterExpression:
                return $"the parameter {culprit} is not finite";
            default:
                return $"overflow in {culprit}";
        }
    }

    [MethodImpl(MethodImplOptions.NoInlining)]
    private static void ThrowLengths(int stateLength, int parameterLength, int destinationLength, int destinationNeeded) =>
        throw new ArgumentOutOfRangeException(
            nameof(stateLength),
            $"spans too short: state {stateLength}, parameters {parameterLength}, destination {destinationLength} (needed {destinationNeeded})");
}
