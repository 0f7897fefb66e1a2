namespace Patchproof.Core.Models.Expressions;

/// <summary>A node of a parsed right-hand side: an immutable tree over numbers, states, parameters, constants, time and inputs.</summary>
/// <remarks>
/// <para>Nodes are records, so two trees are equal when they have the same shape and the same leaves.
/// <see cref="ToString"/> prints the tree in the equation language with as few parentheses as the
/// precedence rules allow; the text parses back to an equal tree.</para>
/// <para>Trees are built by <see cref="ModelParser"/>, by <see cref="ExpressionDifferentiator"/> and by
/// <see cref="ExpressionSimplifier"/>; nothing changes a tree after it is built.</para>
/// </remarks>
public abstract record Expression
{
    /// <summary>The expression in the equation language, for example <c>sigma*(y - x)</c>.</summary>
    public sealed override string ToString() => ExpressionPrinter.Print(this);

    /// <summary>The direct children of this node, left to right.</summary>
    public abstract IEnumerable<Expression> Children { get; }

    /// <summary>True when this node or any node below it satisfies <paramref name="predicate"/>.</summary>
    /// <param name="predicate">The test applied to every node.</param>
    public bool Any(Func<Expression, bool> predicate) => predicate(this) || Children.Any(child => child.Any(predicate));

    /// <summary>True when the tree reads a state variable anywhere.</summary>
    public bool DependsOnState => Any(static node => node is StateExpression);

    /// <summary>True when the tree reads a parameter anywhere (a named constant does not count).</summary>
    public bool DependsOnParameter => Any(static node => node is ParameterExpression);

    /// <summary>True when the tree reads the time variable or a recorded input anywhere.</summary>
    public bool DependsOnTimeOrInput => Any(static node => node is TimeExpression or InputExpression);
}

/// <summary>A literal number.</summary>
/// <param name="Value">The value.</param>
public sealed record NumberExpression(double Value) : Expression
{
    /// <inheritdoc />
    public override IEnumerable<Expression> Children => [];
}

/// <summary>A state variable x_i.</summary>
/// <param name="Name">The state's name.</param>
/// <param name="Index">The state's position in the state vector (0-based).</param>
public sealed record StateExpression(string Name, int Index) : Expression
{
    /// <inheritdoc />
    public override IEnumerable<Expression> Children => [];
}

/// <summary>A fitted parameter p_k.</summary>
/// <param name="Name">The parameter's name.</param>
/// <param name="Index">The parameter's position in the parameter vector (0-based).</param>
public sealed record ParameterExpression(string Name, int Index) : Expression
{
    /// <inheritdoc />
    public override IEnumerable<Expression> Children => [];
}

/// <summary>A named constant: a fixed number with a name, never fitted.</summary>
/// <param name="Name">The constant's name.</param>
/// <param name="Value">Its value.</param>
public sealed record ConstantExpression(string Name, double Value) : Expression
{
    /// <inheritdoc />
    public override IEnumerable<Expression> Children => [];
}

/// <summary>The independent variable t.</summary>
public sealed record TimeExpression : Expression
{
    /// <inheritdoc />
    public override IEnumerable<Expression> Children => [];
}

/// <summary>A recorded input channel u_k(t), bound to a sampled signal when the model is compiled.</summary>
/// <param name="Name">The input's name.</param>
/// <param name="Index">The input's position among the model's inputs (0-based).</param>
public sealed record InputExpression(string Name, int Index) : Expression
{
    /// <inheritdoc />
    public override IEnumerable<Expression> Children => [];
}

/// <summary>Unary minus, -a.</summary>
/// <param name="Operand">The negated expression.</param>
public sealed record NegateExpression(Expression Operand) : Expression
{
    /// <inheritdoc />
    public override IEnumerable<Expression> Children => [Operand];
}

/// <summary>The binary operators of the equation language.</summary>
public enum BinaryOperator
{
    /// <summary>a + b</summary>
    Add,

    /// <summary>a - b</summary>
    Subtract,

    /// <summary>a * b</summary>
    Multiply,

    /// <summary>a / b (IEEE division: a zero divisor gives an infinity or NaN)</summary>
    Divide,

    /// <summary>a ^ b, right-associative</summary>
    Power,
}

/// <summary>A binary operation, a op b.</summary>
/// <param name="Operator">The operation.</param>
/// <param name="Left">The left operand.</param>
/// <param name="Right">The right operand.</param>
public sealed record BinaryExpression(BinaryOperator Operator, Expression Left, Expression Right) : Expression
{
    /// <inheritdoc />
    public override IEnumerable<Expression> Children => [Left, Right];
}

/// <summary>The built-in functions of the equation language.</summary>
public enum MathFunction
{
    /// <summary>abs(a)</summary>
    Abs,

    /// <summary>sign(a): -1, 0 or 1 (NaN stays NaN)</summary>
    Sign,

    /// <summary>min(a, b)</summary>
    Min,

    /// <summary>max(a, b)</summary>
    Max,

    /// <summary>exp(a)</summary>
    Exp,

    /// <summary>log(a), the natural logarithm (NaN for a negative argument)</summary>
    Log,

    /// <summary>sqrt(a) (NaN for a negative argument)</summary>
    Sqrt,

    /// <summary>sin(a), a in radians</summary>
    Sin,

    /// <summary>cos(a), a in radians</summary>
    Cos,

    /// <summary>tanh(a)</summary>
    Tanh,
}

/// <summary>A call of a built-in function with one argument, or two for <c>min</c> and <c>max</c>.</summary>
/// <param name="Function">The function.</param>
/// <param name="Argument">The first (or only) argument.</param>
/// <param name="SecondArgument">The second argument of <c>min</c> and <c>max</c>; null otherwise.</param>
public sealed record CallExpression(MathFunction Function, Expression Argument, Expression? SecondArgument = null) : Expression
{
    /// <inheritdoc />
    public override IEnumerable<Expression> Children => SecondArgument is null ? [Argument] : [Argument, SecondArgument];
}

/// <summary>A call of a piecewise-linear function declared in the model, g(a).</summary>
/// <param name="Function">The declared function.</param>
/// <param name="Argument">Its argument.</param>
public sealed record PiecewiseLinearExpression(PiecewiseLinearFunction Function, Expression Argument) : Expression
{
    /// <inheritdoc />
    public override IEnumerable<Expression> Children => [Argument];
}

/// <summary>One segment's share of a piecewise-linear function: the signed length of [0, a] that falls in [Lower, Upper].</summary>
/// <remarks>
/// The value is clamp(a, Lower, Upper) - clamp(0, Lower, Upper). A piecewise-linear function with
/// f(0) = 0 is the sum over its segments of slope times this share, which is what makes it linear in
/// its slopes. Either bound may be infinite.
/// </remarks>
/// <param name="FunctionName">The name of the piecewise-linear function this segment belongs to, for display.</param>
/// <param name="SegmentIndex">The segment's position, 0 for the leftmost.</param>
/// <param name="Lower">The segment's left breakpoint (may be negative infinity).</param>
/// <param name="Upper">The segment's right breakpoint (may be positive infinity).</param>
/// <param name="Argument">The argument a.</param>
public sealed record SegmentExpression(string FunctionName, int SegmentIndex, double Lower, double Upper, Expression Argument) : Expression
{
    /// <inheritdoc />
    public override IEnumerable<Expression> Children => [Argument];
}

/// <summary>The indicator of a segment: 1 when Lower &lt;= a &lt; Upper, else 0; the derivative of <see cref="SegmentExpression"/>.</summary>
/// <param name="Lower">The segment's left breakpoint.</param>
/// <param name="Upper">The segment's right breakpoint.</param>
/// <param name="Argument">The argument a.</param>
public sealed record WindowExpression(double Lower, double Upper, Expression Argument) : Expression
{
    /// <inheritdoc />
    public override IEnumerable<Expression> Children => [Argument];
}

/// <summary>A choice: <see cref="WhenLessOrEqual"/> when a &lt;= b, else <see cref="Otherwise"/>; the derivative of min and max.</summary>
/// <param name="Left">a.</param>
/// <param name="Right">b.</param>
/// <param name="WhenLessOrEqual">The value when a &lt;= b.</param>
/// <param name="Otherwise">The value when a &gt; b (or either is NaN).</param>
public sealed record ChooseExpression(Expression Left, Expression Right, Expression WhenLessOrEqual, Expression Otherwise) : Expression
{
    /// <inheritdoc />
    public override IEnumerable<Expression> Children => [Left, Right, WhenLessOrEqual, Otherwise];
}
