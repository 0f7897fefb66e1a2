namespace Patchproof.Core.Models.Expressions;

/// <summary>A continuous piecewise-linear function of one argument, declared by its breakpoints and slopes, with g(0) = 0.</summary>
/// <remarks>
/// <para>With breakpoints b_1 &lt; ... &lt; b_n and slopes s_0 ... s_n, the function has slope s_0
/// left of b_1, s_k between b_k and b_(k+1), and s_n right of b_n, and passes through the origin:
/// g(a) = sum_k s_k * (clamp(a, b_k, b_(k+1)) - clamp(0, b_k, b_(k+1))) with b_0 = -inf and
/// b_(n+1) = +inf. It is therefore linear in its slopes, which may be parameters.</para>
/// <para>Chua's diode, g(x) = m1*x + (m0 - m1)*(|x + 1| - |x - 1|)/2, is breakpoints (-1, 1) and
/// slopes (m1, m0, m1).</para>
/// <para>Breakpoints are plain numbers (they fix the shape); slopes are expressions in parameters and
/// constants, never in states.</para>
/// </remarks>
public sealed class PiecewiseLinearFunction
{
    /// <summary>Creates a piecewise-linear function.</summary>
    /// <param name="name">The name used to call it in equations.</param>
    /// <param name="breakpoints">Strictly increasing finite breakpoints (n of them, at least 1).</param>
    /// <param name="slopes">The n + 1 slopes, left to right; they may read parameters and constants, not states.</param>
    /// <exception cref="ArgumentOutOfRangeException">The breakpoints are not finite and strictly increasing, or the slope count is not n + 1.</exception>
    public PiecewiseLinearFunction(string name, IReadOnlyList<double> breakpoints, IReadOnlyList<Expression> slopes)
    {
        Preconditions.CheckArgumentRange(nameof(breakpoints), breakpoints.Count >= 1, "needs at least one breakpoint");
        Preconditions.CheckArgumentRange(nameof(slopes), slopes.Count == breakpoints.Count + 1, "needs one slope more than breakpoints");
        for (var k = 0; k < breakpoints.Count; k++)
        {
            Preconditions.CheckFinite(nameof(breakpoints), breakpoints[k]);
            Preconditions.CheckArgumentRange(nameof(breakpoints), k == 0 || breakpoints[k] > breakpoints[k - 1], "must be strictly increasing");
        }

        Preconditions.CheckArgumentRange(nameof(slopes), !slopes.Any(slope => slope.DependsOnState || slope.DependsOnTimeOrInput), "slopes must not read states, time or inputs");
        Name = name;
        Breakpoints = [.. breakpoints];
        Slopes = [.. slopes];
    }

    /// <summary>The name used to call the function.</summary>
    public string Name { get; }

    /// <summary>The breakpoints b_1 ... b_n, strictly increasing.</summary>
    public IReadOnlyList<double> Breakpoints { get; }

    /// <summary>The slopes s_0 ... s_n, left to right.</summary>
    public IReadOnlyList<Expression> Slopes { get; }

    /// <summary>True when no slope reads a parameter, so g is a fixed function of its argument.</summary>
    public bool IsFixed => !Slopes.Any(slope => slope.DependsOnParameter);

    /// <summary>The lower bound of segment k (negative infinity for the first).</summary>
    /// <param name="segment">0 ... n.</param>
    public double LowerOf(int segment) => segment == 0 ? double.NegativeInfinity : Breakpoints[segment - 1];

    /// <summary>The upper bound of segment k (positive infinity for the last).</summary>
    /// <param name="segment">0 ... n.</param>
    public double UpperOf(int segment) => segment == Breakpoints.Count ? double.PositiveInfinity : Breakpoints[segment];

    /// <summary>g(argument) written as the sum of slope times segment share, for differentiation and term structure.</summary>
    /// <param name="argument">The argument a.</param>
    public Expression Expand(Expression argument)
    {
        Expression? sum = null;
        for (var k = 0; k < Slopes.Count; k++)
        {
            Expression term = new BinaryExpression(BinaryOperator.Multiply, Slopes[k], new SegmentExpression(Name, k, LowerOf(k), UpperOf(k), argument));
            sum = sum is null ? term : new BinaryExpression(BinaryOperator.Add, sum, term);
        }

        return sum!;
    }

    /// <summary>The name.</summary>
    public override string ToString() => Name;
}
