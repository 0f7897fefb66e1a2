namespace Patchproof.Core.Models.Expressions;

/// <summary>Evaluates an expression tree by walking it: slow, for checks, nominal values and explanations, never for the solver.</summary>
/// <remarks>Compiled models (<see cref="CompiledModel"/>) compute the same values with the same floating-point operations in the same order.</remarks>
public static class ExpressionEvaluator
{
    /// <summary>The value of <paramref name="expression"/> at the given time, state, parameters and inputs.</summary>
    /// <param name="expression">The expression.</param>
    /// <param name="time">t.</param>
    /// <param name="state">The state vector.</param>
    /// <param name="parameters">The parameter vector.</param>
    /// <param name="inputs">The bound input signals, or null when the expression reads none.</param>
    /// <exception cref="InvalidOperationException">The expression reads an input and <paramref name="inputs"/> does not supply it.</exception>
    public static double Evaluate(Expression expression, double time, ReadOnlySpan<double> state, ReadOnlySpan<double> parameters, IReadOnlyList<SampledSignal>? inputs = null)
    {
        switch (expression)
        {
            case NumberExpression number:
                return number.Value;
            case StateExpression s:
                return state[s.Index];
            case ParameterExpression p:
                return parameters[p.Index];
            case ConstantExpression c:
                return c.Value;
            case TimeExpression:
                return time;
            case InputExpression input:
                return inputs is not null && input.Index < inputs.Count
                    ? inputs[input.Index].ValueAt(time)
                    : throw new InvalidOperationException($"Input '{input.Name}' is not bound to a signal.");
            case NegateExpression negate:
                return -Evaluate(negate.Operand, time, state, parameters, inputs);
            case BinaryExpression binary:
                var a = Evaluate(binary.Left, time, state, parameters, inputs);
                var b = Evaluate(binary.Right, time, state, parameters, inputs);
                return binary.Operator switch
                {
                    BinaryOperator.Add => a + b,
                    BinaryOperator.Subtract => a - b,
                    BinaryOperator.Multiply => a * b,
                    BinaryOperator.Divide => a / b,
                    _ => ModelMath.Power(a, b),
                };
            case CallExpression call:
                return ModelMath.Apply(
                    call.Function,
                    Evaluate(call.Argument, time, state, parameters, inputs),
                    call.SecondArgument is null ? 0.0 : Evaluate(call.SecondArgument, time, state, parameters, inputs));
            case PiecewiseLinearExpression piecewise:
                return Evaluate(piecewise.Function.Expand(piecewise.Argument), time, state, parameters, inputs);
            case SegmentExpression segment:
                return ModelMath.Segment(segment.Lower, segment.Upper, Evaluate(segment.Argument, time, state, parameters, inputs));
            case WindowExpression window:
                return ModelMath.Window(window.Lower, window.Upper, Evaluate(window.Argument, time, state, parameters, inputs));
            case ChooseExpression choose:
                return ModelMath.Choose(
                    Evaluate(choose.Left, time, state, parameters, inputs),
                    Evaluate(choose.Right, time, state, parameters, inputs),
                    Evaluate(choose.WhenLessOrEqual, time, state, parameters, inputs),
                    Evaluate(choose.Otherwise, time, state, parameters, inputs));
            default:
                throw new InvalidOperationException("Unknown expression node " + expression.GetType().Name);
        }
    }
}
