using FsCheck;
using FsCheck.Fluent;
using FsCheck.Xunit;
using Patchproof.Core.Models;
using Patchproof.Core.Models.Expressions;

namespace Patchproof.Core.Tests.Models.Expressions;

public sealed class ExpressionDifferentiatorTests
{
    private static readonly StateExpression X = new("x", 0);
    private static readonly StateExpression Y = new("y", 1);
    private static readonly ParameterExpression P = new("p", 0);
    private static readonly ParameterExpression Q = new("q", 1);

    /// <summary>A point (x, y; p, q) and an expression over it.</summary>
    public sealed record Case(Expression Expression, double[] State, double[] Parameters)
    {
        public override string ToString() => $"{Expression} at x={State[0]:R}, y={State[1]:R}, p={Parameters[0]:R}, q={Parameters[1]:R}";
    }

    private static Expression Parse(string text)
    {
        var model = ModelParser.Parse($"state x, y\np = 1\nq = 1\nx' = {text}\ny' = p + q").Value;
        return model.Equations[0].RightHandSide;
    }

    /// <summary>Central difference of the expression along one variable, step relative to the variable's size.</summary>
    private static double CentralDifference(Expression expression, Expression variable, double[] state, double[] parameters)
    {
        var (vector, index) = variable is StateExpression s ? (state, s.Index) : (parameters, ((ParameterExpression)variable).Index);
        var original = vector[index];
        var h = 1e-5 * Math.Max(1, Math.Abs(original));
        vector[index] = original + h;
        var plus = ExpressionEvaluator.Evaluate(expression, 0, state, parameters);
        vector[index] = original - h;
        var minus = ExpressionEvaluator.Evaluate(expression, 0, state, parameters);
        vector[index] = original;
        return (plus - minus) / (2 * h);
    }

    private static Gen<Expression> ExpressionOfDepth(int depth)
    {
        var leaf = Gen.OneOf(
            Gen.Elements<Expression>(X, Y, P, Q, new TimeExpression(), new ConstantExpression("k", 1.25)),
            Gen.Choose(-20, 20).Select(n => (Expression)new NumberExpression(n / 10.0)));
        if (depth == 0)
        {
            return leaf;
        }

        var sub = ExpressionOfDepth(depth - 1);
        Expression Bin(BinaryOperator op, Expression a, Expression b) => new BinaryExpression(op, a, b);
        Expression Square(Expression a) => Bin(BinaryOperator.Power, a, new NumberExpression(2));
        Expression OnePlusSquare(Expression a) => Bin(BinaryOperator.Add, new NumberExpression(1), Square(a));

        // Smooth operations only, with their arguments kept inside their domains, so a central
        // difference is a fair referee (kinks of abs, min, max and pwl are tested at fixed points).
        var unary = Gen.OneOf(
            sub.Select(a => (Expression)new NegateExpression(a)),
            sub.Select(a => (Expression)new CallExpression(MathFunction.Sin, a)),
            sub.Select(a => (Expression)new CallExpression(MathFunction.Cos, a)),
            sub.Select(a => (Expression)new CallExpression(MathFunction.Tanh, a)),
            sub.Select(a => (Expression)new CallExpression(MathFunction.Exp, new CallExpression(MathFunction.Tanh, a))),
            sub.Select(a => (Expression)new CallExpression(MathFunction.Sqrt, OnePlusSquare(a))),
            sub.Select(a => (Expression)new CallExpression(MathFunction.Log, OnePlusSquare(a))),
            sub.Select(Square),
            sub.Select(a => Bin(BinaryOperator.Power, a, new NumberExpression(3))),
            sub.Select(a => Bin(BinaryOperator.Power, OnePlusSquare(a), new NumberExpression(-1.5))));
        var binary = Gen.OneOf(
            Gen.Zip(sub, sub).Select(pair => Bin(BinaryOperator.Add, pair.Item1, pair.Item2)),
            Gen.Zip(sub, sub).Select(pair => Bin(BinaryOperator.Subtract, pair.Item1, pair.Item2)),
            Gen.Zip(sub, sub).Select(pair => Bin(BinaryOperator.Multiply, pair.Item1, pair.Item2)),
            Gen.Zip(sub, sub).Select(pair => Bin(BinaryOperator.Divide, pair.Item1, OnePlusSquare(pair.Item2))),
            Gen.Zip(sub, sub).Select(pair => Bin(BinaryOperator.Power, OnePlusSquare(pair.Item1), new CallExpression(MathFunction.Tanh, pair.Item2))));
        return Gen.Frequency((1, leaf), (3, unary), (4, binary));
    }

    private static Arbitrary<Case> Cases()
    {
        var coordinate = Gen.Choose(-1500, 1500).Select(n => n / 1000.0);
        var gen =
            from depth in Gen.Choose(1, 4)
            from expression in ExpressionOfDepth(depth)
            from values in Gen.ArrayOf(coordinate, 4)
            select new Case(expression, [values[0], values[1]], [values[2], values[3]]);
        return Arb.From(gen);
    }

    [Property(MaxTest = 300)]
    public Property Differentiate_RandomSmoothExpression_MatchesCentralDifferences() =>
        Prop.ForAll(Cases(), testCase =>
        {
            var value = ExpressionEvaluator.Evaluate(testCase.Expression, 0, testCase.State, testCase.Parameters);
            foreach (var variable in new Expression[] { X, Y, P, Q })
            {
                var symbolic = ExpressionEvaluator.Evaluate(ExpressionDifferentiator.Differentiate(testCase.Expression, variable), 0, testCase.State, testCase.Parameters);
                var numeric = CentralDifference(testCase.Expression, variable, testCase.State, testCase.Parameters);
                var tolerance = 1e-5 * (1 + Math.Abs(symbolic) + Math.Abs(value));
                if (!(Math.Abs(symbolic - numeric) <= tolerance))
                {
                    throw new Xunit.Sdk.XunitException($"d/d{variable} of {testCase}: symbolic {symbolic:R}, central difference {numeric:R}");
                }
            }

            return true;
        });

    [Theory]
    [InlineData("x^2*y", "x", "2*x*y")]
    [InlineData("p*(y - x)", "x", "-p")]
    [InlineData("p*(y - x)", "p", "y - x")]
    [InlineData("x*(p - y) - y", "y", "-x - 1")]
    [InlineData("x/y", "y", "-x/y^2")]
    [InlineData("exp(p*x)", "p", "exp(p*x)*x")]
    [InlineData("log(x)", "x", "1/x")]
    [InlineData("sqrt(x)", "x", "1/(2*sqrt(x))")]
    [InlineData("sin(x)", "x", "cos(x)")]
    [InlineData("cos(x)", "x", "-sin(x)")]
    [InlineData("tanh(x)", "x", "1 - tanh(x)^2")]
    [InlineData("abs(x)", "x", "sign(x)")]
    [InlineData("sign(x)", "x", "0")]
    [InlineData("x^y", "y", "x^y*log(x)")]
    [InlineData("p^2*x", "p", "2*p*x")]
    [InlineData("t*x + k", "x", "t")]
    public void Differentiate_SimpleRule_GivesTheHandDerivedSimplifiedForm(string expression, string variable, string expected)
    {
        Expression v = variable switch { "x" => X, "y" => Y, "p" => P, _ => Q };
        var text = expression.Replace("k", "1.5", StringComparison.Ordinal);

        var derivative = ExpressionDifferentiator.Differentiate(Parse(text), v);

        Assert.Equal(expected, derivative.ToString());
    }

    [Theory]
    [InlineData(-2.0, 1.0)]
    [InlineData(0.5, 0.0)]
    public void Differentiate_MinAndMax_TakeTheDerivativeOfTheChosenArgument(double x, double expectedMin)
    {
        var min = ExpressionDifferentiator.Differentiate(Parse("min(x, 0.1)"), X);
        var max = ExpressionDifferentiator.Differentiate(Parse("max(x, 0.1)"), X);

        Assert.Equal(expectedMin, ExpressionEvaluator.Evaluate(min, 0, [x, 0], [1, 1]));
        Assert.Equal(1 - expectedMin, ExpressionEvaluator.Evaluate(max, 0, [x, 0], [1, 1]));
    }

    [Theory]
    [InlineData(-3.0, 0.5)]
    [InlineData(-0.3, -1.0)]
    [InlineData(0.9, -1.0)]
    [InlineData(4.0, 0.5)]
    public void Differentiate_PiecewiseLinear_IsTheSlopeOfTheSegment(double x, double slope)
    {
        var model = ModelParser.Parse("state x\nm0 = -1\npwl g breaks(-1, 1) slopes(0.5, m0, 0.5)\nx' = g(x)").Value;
        var rhs = model.Equations[0].RightHandSide;

        var byState = ExpressionDifferentiator.Differentiate(rhs, new StateExpression("x", 0));
        var bySlope = ExpressionDifferentiator.Differentiate(rhs, new ParameterExpression("m0", 0));

        Assert.Equal(slope, ExpressionEvaluator.Evaluate(byState, 0, [x], [-1.0]));
        // dg/dm0 is the length of [0, x] inside [-1, 1].
        Assert.Equal(Math.Clamp(x, -1, 1), ExpressionEvaluator.Evaluate(bySlope, 0, [x], [-1.0]), 15);
    }

    [Fact]
    public void Differentiate_NotAStateOrParameter_IsACallersMistake()
    {
        Assert.Throws<ArgumentException>(() => ExpressionDifferentiator.Differentiate(X, new TimeExpression()));
    }
}
