namespace Patchproof.Core.Models.Expressions;

/// <summary>Rewrites an expression into a smaller equal one: folds numbers and drops neutral elements.</summary>
/// <remarks>
/// <para>Rules, applied bottom-up: operations on numbers are folded; 0 + a = a, a - 0 = a, 0 - a = -a,
/// a - a = 0, 0 * a = 0, 1 * a = a, -1 * a = -a, a / 1 = a, 0 / a = 0, a ^ 1 = a, a ^ 0 = 1,
/// --a = a; signs move outward through products and quotients; numbers move to the left of products
/// and merge.</para>
/// <para>0 * a = 0 assumes a is finite, as symbolic differentiation conventionally does; a model whose
/// state is non-finite is reported by the solver before its Jacobian matters.</para>
/// </remarks>
public static class ExpressionSimplifier
{
    private static readonly NumberExpression Zero = new(0.0);
    private static readonly NumberExpression One = new(1.0);

    /// <summary>The simplified expression.</summary>
    /// <param name="expression">The expression to simplify.</param>
    public static Expression Simplify(Expression expression) => expression switch
    {
        NegateExpression negate => Negate(Simplify(negate.Operand)),
        BinaryExpression binary => Binary(binary.Operator, Simplify(binary.Left), Simplify(binary.Right)),
        CallExpression call => Call(call.Function, Simplify(call.Argument), call.SecondArgument is null ? null : Simplify(call.SecondArgument)),
        PiecewiseLinearExpression piecewise => piecewise with { Argument = Simplify(piecewise.Argument) },
        SegmentExpression segment => Simplify(segment.Argument) is NumberExpression number
            ? new NumberExpression(ModelMath.Segment(segment.Lower, segment.Upper, number.Value))
            : segment with { Argument = Simplify(segment.Argument) },
        WindowExpression window => Simplify(window.Argument) is NumberExpression number
            ? new NumberExpression(ModelMath.Window(window.Lower, window.Upper, number.Value))
            : window with { Argument = Simplify(window.Argument) },
        ChooseExpression choose => Choose(Simplify(choose.Left), Simplify(choose.Right), Simplify(choose.WhenLessOrEqual), Simplify(choose.Otherwise)),
        _ => expression,
    };

    private static bool IsNumber(Expression expression, double value) => expression is NumberExpression number && number.Value == value;

    private static Expression Negate(Expression operand) => operand switch
    {
        NumberExpression number => new NumberExpression(-number.Value),
        NegateExpression inner => inner.Operand,
        BinaryExpression { Operator: BinaryOperator.Multiply, Left: NumberExpression factor } product => product with { Left = new NumberExpression(-factor.Value) },
        _ => new NegateExpression(operand),
    };

    private static Expression Choose(Expression left, Expression right, Expression whenLessOrEqual, Expression otherwise)
    {
        if (whenLessOrEqual.Equals(otherwise))
        {
            return whenLessOrEqual;
        }

        if (left is NumberExpression a && right is NumberExpression b)
        {
            return a.Value <= b.Value ? whenLessOrEqual : otherwise;
        }

        return new ChooseExpression(left, right, whenLessOrEqual, otherwise);
    }

    private static Expression Call(MathFunction function, Expression argument, Expression? second)
    {
        if (argument is NumberExpression a && (second is null || second is NumberExpression))
        {
            return new NumberExpression(ModelMath.Apply(function, a.Value, (second as NumberExpression)?.Value ?? 0.0));
        }

        return new CallExpression(function, argument, second);
    }

    private static Expression Binary(BinaryOperator op, Expression left, Expression right)
    {
        if (left is NumberExpression a && right is NumberExpression b)
        {
            return new NumberExpression(op switch
            {
                BinaryOperator.Add => a.Value + b.Value,
                BinaryOperator.Subtract => a.Value - b.Value,
                BinaryOperator.Multiply => a.Value * b.Value,
                BinaryOperator.Divide => a.Value / b.Value,
                _ => Math.Pow(a.Value, b.Value),
            });
        }

        return op switch
        {
            BinaryOperator.Add => Add(left, right),
            BinaryOperator.Subtract => Subtract(left, right),
            BinaryOperator.Multiply => Multiply(left, right),
            BinaryOperator.Divide => Divide(left, right),
            _ => Power(left, right),
        };
    }

    private static Expression Add(Expression left, Expression right)
    {
        if (IsNumber(left, 0))
        {
            return right;
        }

        if (IsNumber(right, 0))
        {
            return left;
        }

        if (right is NegateExpression negatedRight)
        {
            return Subtract(left, negatedRight.Operand);
        }

        if (right is NumberExpression { Value: < 0 } negativeNumber)
        {
            return Subtract(left, new NumberExpression(-negativeNumber.Value));
        }

        if (left is NegateExpression negatedLeft)
        {
            return Subtract(right, negatedLeft.Operand);
        }

        return new BinaryExpression(BinaryOperator.Add, left, right);
    }

    private static Expression Subtract(Expression left, Expression right)
    {
        if (IsNumber(right, 0))
        {
            return left;
        }

        if (IsNumber(left, 0))
        {
            return Negate(right);
        }

        if (left.Equals(right))
        {
            return Zero;
        }

        if (right is NegateExpression negatedRight)
        {
            return Add(left, negatedRight.Operand);
        }

        if (right is NumberExpression { Value: < 0 } negativeNumber)
        {
            return Add(left, new NumberExpression(-negativeNumber.Value));
        }

        return new BinaryExpression(BinaryOperator.Subtract, left, right);
    }

    private static Expression Multiply(Expression left, Expression right)
    {
        if (IsNumber(left, 0) || IsNumber(right, 0))
        {
            return Zero;
        }

        if (IsNumber(left, 1))
        {
            return right;
        }

        if (IsNumber(right, 1))
        {
            return left;
        }

        if (IsNumber(left, -1))
        {
            return Negate(right);
        }

        if (IsNumber(right, -1))
        {
            return Negate(left);
        }

        if (left is NegateExpression negatedLeft)
        {
            return Negate(Multiply(negatedLeft.Operand, right));
        }

        if (right is NegateExpression negatedRight)
        {
            return Negate(Multiply(left, negatedRight.Operand));
        }

        if (right is NumberExpression)
        {
            return Multiply(right, left);
        }

        if (left is NumberExpression outer && right is BinaryExpression { Operator: BinaryOperator.Multiply, Left: NumberExpression inner } product)
        {
            return Multiply(new NumberExpression(outer.Value * inner.Value), product.Right);
        }

        return new BinaryExpression(BinaryOperator.Multiply, left, right);
    }

    private static Expression Divide(Expression left, Expression right)
    {
        if (IsNumber(left, 0))
        {
            return Zero;
        }

        if (IsNumber(right, 1))
        {
            return left;
        }

        if (IsNumber(right, -1))
        {
            return Negate(left);
        }

        if (left is NegateExpression negatedLeft)
        {
            return Negate(Divide(negatedLeft.Operand, right));
        }

        if (right is NegateExpression negatedRight)
        {
            return Negate(Divide(left, negatedRight.Operand));
        }

        return new BinaryExpression(BinaryOperator.Divide, left, right);
    }

    private static Expression Power(Expression left, Expression right)
    {
        if (IsNumber(right, 1))
        {
            return left;
        }

        if (IsNumber(right, 0))
        {
            return One;
        }

        return new BinaryExpression(BinaryOperator.Power, left, right);
    }
}
