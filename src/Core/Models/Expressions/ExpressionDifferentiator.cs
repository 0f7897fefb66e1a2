namespace Patchproof.Core.Models.Expressions;

/// <summary>Symbolic differentiation of an expression with respect to one state or one parameter.</summary>
/// <remarks>
/// <para>The usual rules: sum, product, quotient d(a/b) = da/b - a*db/b^2, power with a constant
/// exponent d(a^c) = c*a^(c-1)*da and otherwise d(a^b) = a^b*(db*log(a) + b*da/a), and the chain
/// rule through abs (sign), exp, log (1/a), sqrt (1/(2 sqrt a)), sin, cos, tanh (1 - tanh^2),
/// min and max (the derivative of the argument that is chosen). sign, time, inputs and named
/// constants have derivative 0. Piecewise-linear functions differentiate through their segment
/// form: the derivative is the slope of the segment the argument is in (exactly at a breakpoint,
/// where the derivative does not exist, the slope on the right).</para>
/// <para>The result is simplified with <see cref="ExpressionSimplifier"/>.</para>
/// </remarks>
public static class ExpressionDifferentiator
{
    private static readonly NumberExpression Zero = new(0.0);
    private static readonly NumberExpression One = new(1.0);

    /// <summary>d expression / d variable, simplified.</summary>
    /// <param name="expression">The expression.</param>
    /// <param name="variable">A <see cref="StateExpression"/> or <see cref="ParameterExpression"/>.</param>
    /// <exception cref="ArgumentException"><paramref name="variable"/> is neither a state nor a parameter.</exception>
    public static Expression Differentiate(Expression expression, Expression variable)
    {
        if (variable is not (StateExpression or ParameterExpression))
        {
            throw new ArgumentException("Differentiate with respect to a state or a parameter.", nameof(variable));
        }

        return ExpressionSimplifier.Simplify(Derive(ExpressionSimplifier.Simplify(expression), variable));
    }

    private static Expression Add(Expression a, Expression b) => new BinaryExpression(BinaryOperator.Add, a, b);

    private static Expression Sub(Expression a, Expression b) => new BinaryExpression(BinaryOperator.Subtract, a, b);

    private static Expression Mul(Expression a, Expression b) => new BinaryExpression(BinaryOperator.Multiply, a, b);

    private static Expression Div(Expression a, Expression b) => new BinaryExpression(BinaryOperator.Divide, a, b);

    private static Expression Pow(Expression a, Expression b) => new BinaryExpression(BinaryOperator.Power, a, b);

    private static bool IsZero(Expression expression) => expression is NumberExpression { Value: 0.0 };

    private static Expression Derive(Expression expression, Expression variable)
    {
        switch (expression)
        {
            case StateExpression or ParameterExpression:
                return expression.Equals(variable) ? One : Zero;
            case NumberExpression or ConstantExpression or TimeExpression or InputExpression or WindowExpression:
                return Zero;
            case NegateExpression negate:
                return new NegateExpression(Derive(negate.Operand, variable));
            case BinaryExpression binary:
                return DeriveBinary(binary, variable);
            case CallExpression call:
                return DeriveCall(call, variable);
            case PiecewiseLinearExpression piecewise:
                return Derive(piecewise.Function.Expand(piecewise.Argument), variable);
            case SegmentExpression segment:
                return Mul(new WindowExpression(segment.Lower, segment.Upper, segment.Argument), Derive(segment.Argument, variable));
            case ChooseExpression choose:
                return new ChooseExpression(choose.Left, choose.Right, Derive(choose.WhenLessOrEqual, variable), Derive(choose.Otherwise, variable));
            default:
                throw new InvalidOperationException("Unknown expression node " + expression.GetType().Name);
        }
    }

    private static Expression DeriveBinary(BinaryExpression binary, Expression variable)
    {
        var (a, b) = (binary.Left, binary.Right);
        var da = ExpressionSimplifier.Simplify(Derive(a, variable));
        var db = ExpressionSimplifier.Simplify(Derive(b, variable));
        switch (binary.Operator)
        {
            case BinaryOperator.Add:
                return Add(da, db);
            case BinaryOperator.Subtract:
                return Sub(da, db);
            case BinaryOperator.Multiply:
                return Add(Mul(da, b), Mul(a, db));
            case BinaryOperator.Divide:
                return Sub(Div(da, b), Div(Mul(a, db), Pow(b, new NumberExpression(2.0))));
            default:
                if (IsZero(db))
                {
                    var lowered = ExpressionSimplifier.Simplify(Sub(b, One));
                    return Mul(Mul(b, Pow(a, lowered)), da);
                }

                return Mul(binary, Add(Mul(db, new CallExpression(MathFunction.Log, a)), Div(Mul(b, da), a)));
        }
    }

    private static Expression DeriveCall(CallExpression call, Expression variable)
    {
        var a = call.Argument;
        var da = ExpressionSimplifier.Simplify(Derive(a, variable));
        switch (call.Function)
        {
            case MathFunction.Abs:
                return Mul(new CallExpression(MathFunction.Sign, a), da);
            case MathFunction.Sign:
                return Zero;
            case MathFunction.Min:
                return new ChooseExpression(a, call.SecondArgument!, da, Derive(call.SecondArgument!, variable));
            case MathFunction.Max:
                return new ChooseExpression(a, call.SecondArgument!, Derive(call.SecondArgument!, variable), da);
            case MathFunction.Exp:
                return Mul(call, da);
            case MathFunction.Log:
                return Div(da, a);
            case MathFunction.Sqrt:
                return Div(da, Mul(new NumberExpression(2.0), call));
            case MathFunction.Sin:
                return Mul(new CallExpression(MathFunction.Cos, a), da);
            case MathFunction.Cos:
                return Mul(new NegateExpression(new CallExpression(MathFunction.Sin, a)), da);
            default:
                return Mul(Sub(One, Pow(call, new NumberExpression(2.0))), da);
        }
    }
}
