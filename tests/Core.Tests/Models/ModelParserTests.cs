using Patchproof.Core.Models;
using Patchproof.Core.Models.Expressions;

namespace Patchproof.Core.Tests.Models;

public sealed class ModelParserTests
{
    private static EquationModel ParseOk(string text)
    {
        var result = ModelParser.Parse(text, "m.model");
        Assert.True(result.Success, string.Join("\n", result.Errors));
        return result.Value;
    }

    private static double EvaluateConstantExpression(string expression, double x = 0)
    {
        var model = ParseOk($"state x = {x.ToString("R", System.Globalization.CultureInfo.InvariantCulture)}\nx' = {expression}");
        return ExpressionEvaluator.Evaluate(model.Equations[0].RightHandSide, 0, [x], []);
    }

    private static SourceDiagnostic SingleError(string text)
    {
        var result = ModelParser.Parse(text, "m.model");
        Assert.False(result.Success);
        return Assert.Single(result.Errors);
    }

    [Fact]
    public void Parse_Lorenz_ReadsStatesParametersAndEquations()
    {
        // Arrange
        const string text = """
            # Lorenz
            state x = 1, y = 2, z = 3   # initial values
            sigma = 10
            rho = 28
            beta = 8/3
            x' = sigma*(y - x)
            dy/dt = x*(rho - z) - y
            z' = x*y - beta*z
            """;

        // Act
        var model = ParseOk(text);

        // Assert
        Assert.Equal(["x", "y", "z"], model.StateNames);
        Assert.Equal(["sigma", "rho", "beta"], model.ParameterNames);
        Assert.Equal([10.0, 28.0, 8.0 / 3.0], model.NominalParameters());
        Assert.Equal([1.0, 2.0, 3.0], model.DefaultInitialState());
        Assert.Equal("sigma*(y - x)", model.Equations[0].RightHandSide.ToString());
        Assert.Equal("x*(rho - z) - y", model.Equations[1].RightHandSide.ToString());
        Assert.Equal(7, model.Equations[1].Line);
    }

    [Fact]
    public void Parse_EquationsBeforeDeclarations_AreAccepted()
    {
        var model = ParseOk("x' = -k*x\nstate x\nk = 2");

        Assert.Equal("-k*x", model.Equations[0].RightHandSide.ToString());
        Assert.Equal(0.0, model.States[0].InitialValue);
    }

    [Fact]
    public void Parse_ConstantsAndParamKeyword_AreKeptApart()
    {
        var model = ParseOk("state x\nconst g = 9.81\nconst h = 2*g\nparam k = h + 1\nx' = -k*x + g");

        Assert.Equal(["k"], model.ParameterNames);
        Assert.Equal(2 * 9.81 + 1, model.Parameters[0].NominalValue);
        Assert.Equal([new ModelConstant("g", 9.81, 2), new ModelConstant("h", 2 * 9.81, 3)], model.Constants);
        Assert.IsType<ConstantExpression>(((BinaryExpression)model.Equations[0].RightHandSide).Right);
    }

    [Theory]
    [InlineData("1 + 2*3", 7)]
    [InlineData("(1 + 2)*3", 9)]
    [InlineData("2^3^2", 512)] // right-associative: 2^(3^2)
    [InlineData("-2^2", -4)] // unary minus binds looser than ^
    [InlineData("(-2)^2", 4)]
    [InlineData("2^-1", 0.5)]
    [InlineData("-x^2", -9)]
    [InlineData("--x", 3)]
    [InlineData("2*-x", -6)]
    [InlineData("8/4/2", 1)] // left-associative
    [InlineData("8 - 4 - 2", 2)]
    [InlineData("+x", 3)]
    [InlineData("1.5e1 + .5 + 2E-1", 15.7)]
    [InlineData("abs(-x) + sign(-x)", 2)]
    [InlineData("min(x, 2) + max(x, 2)", 5)]
    [InlineData("exp(0) + log(1) + sqrt(16)", 5)]
    [InlineData("sin(0) + cos(0) + tanh(0)", 1)]
    [InlineData("2*pi", 2 * Math.PI)]
    public void Parse_Expression_FollowsPrecedence(string expression, double expected)
    {
        var value = EvaluateConstantExpression(expression, x: 3);

        Assert.Equal(expected, value, 12);
    }

    [Fact]
    public void Parse_UnaryMinusOverPower_BuildsNegationOfPower()
    {
        var model = ParseOk("state x\nx' = -x^2");

        var negate = Assert.IsType<NegateExpression>(model.Equations[0].RightHandSide);
        Assert.Equal(BinaryOperator.Power, Assert.IsType<BinaryExpression>(negate.Operand).Operator);
    }

    [Fact]
    public void Parse_TimeAndInput_AreRead()
    {
        var model = ParseOk("state x\ninput u, w\nx' = u - w*t");

        Assert.Equal(["u", "w"], model.InputNames);
        var rhs = (BinaryExpression)model.Equations[0].RightHandSide;
        Assert.Equal(new InputExpression("u", 0), rhs.Left);
        Assert.Equal(new BinaryExpression(BinaryOperator.Multiply, new InputExpression("w", 1), new TimeExpression()), rhs.Right);
    }

    [Fact]
    public void Parse_PiecewiseLinear_ExpressesChuasDiode()
    {
        // Chua's diode g(x) = m1*x + (m0 - m1)*(|x + 1| - |x - 1|)/2 as breakpoints and slopes.
        var model = ParseOk("state x\nconst m0 = -8/7\nconst m1 = -5/7\npwl g breaks(-1, 1) slopes(m1, m0, m1)\nx' = g(x)");
        var function = Assert.Single(model.PiecewiseFunctions);

        Assert.Equal([-1.0, 1.0], function.Breakpoints);
        Assert.True(function.IsFixed);
        foreach (var x in new[] { -3.0, -1.0, -0.4, 0.0, 0.25, 1.0, 2.5 })
        {
            var expected = (-5.0 / 7 * x) + (0.5 * (-8.0 / 7 + 5.0 / 7) * (Math.Abs(x + 1) - Math.Abs(x - 1)));
            var value = ExpressionEvaluator.Evaluate(model.Equations[0].RightHandSide, 0, [x], []);
            Assert.Equal(expected, value, 14);
        }
    }

    [Fact]
    public void Parse_PiecewiseSlopesWithParameters_AreAllowed()
    {
        var model = ParseOk("state x\nm0 = -1\npwl g breaks(0) slopes(1, m0)\nx' = g(x)");

        Assert.False(model.PiecewiseFunctions[0].IsFixed);
        Assert.Equal(-2.0, ExpressionEvaluator.Evaluate(model.Equations[0].RightHandSide, 0, [2.0], [-1.0]));
        Assert.Equal(-2.0, ExpressionEvaluator.Evaluate(model.Equations[0].RightHandSide, 0, [-2.0], [-1.0]));
    }

    [Fact]
    public void Parse_UnusedParameter_IsAWarning()
    {
        var result = ModelParser.Parse("state x\nk = 1\nunused = 2\nx' = -k*x", "m.model");

        Assert.True(result.Success);
        var warning = Assert.Single(result.Warnings);
        Assert.Equal((3, 1), (warning.Line, warning.Column));
        Assert.Contains("'unused' is never used", warning.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("state x\nx' = (x + 1", 2, 12, "expected ')' to close the '(' at column 6, found the end of the line")]
    [InlineData("state x\nx' = x +", 2, 9, "expected an expression after '+', found the end of the line")]
    [InlineData("state x\nx' = x * * x", 2, 10, "expected an expression after '*', found '*'")]
    [InlineData("state x\nx' = 2 x", 2, 8, "expected an operator or the end of the line, found 'x'")]
    [InlineData("state x\nx' = x)", 2, 7, "found ')' without a matching '('")]
    [InlineData("state x\nx' = x $ 1", 2, 8, "unexpected character '$'")]
    [InlineData("state x\nx' = 1\nx  x' = 1", 3, 4, "expected '=' (a parameter), ' (an equation such as x' = ...) or a keyword")]
    [InlineData("state x\nx' x", 2, 4, "expected '=' after the derivative of x, found 'x'")]
    [InlineData("state x\ndx/dz = 1", 2, 4, "expected 'dt' in dx/dt, found 'dz'")]
    [InlineData("state x\nx' = 1\n3 = x", 3, 1, "expected a declaration")]
    [InlineData("state x, \nx' = 1", 1, 10, "expected a name, found the end of the line")]
    [InlineData("state x\nx' = x'", 2, 7, "a derivative (') may only stand on the left of '='")]
    [InlineData("state x\npwl g slopes(1, 2)\nx' = g(x)", 2, 7, "expected 'breaks(...)'")]
    public void Parse_SyntaxError_PointsAtLineAndColumnAndSaysWhatWasExpected(string text, int line, int column, string message)
    {
        var error = SingleError(text);

        Assert.Equal(("m.model", line, column), (error.File, error.Line, error.Column));
        Assert.Contains(message, error.Message, StringComparison.Ordinal);
        Assert.Equal(DiagnosticSeverity.Error, error.Severity);
    }

    [Theory]
    [InlineData("state x\nx' = -rho*x", 2, 7, "unknown name 'rho'")]
    [InlineData("state x, y\nx' = y", 1, 10, "the state 'y' has no equation")]
    [InlineData("state x\nx' = 1\nw' = 2", 3, 1, "an equation for 'w', which is not a state")]
    [InlineData("state x\nk = 1\nx' = k\nk' = 1", 4, 1, "an equation for 'k', which is a parameter, not a state")]
    [InlineData("state x\nparam k\nx' = k", 2, 7, "the parameter 'k' has no nominal value")]
    [InlineData("state x\nk = 1\nk = 2\nx' = k", 3, 1, "'k' is already defined on line 2 as a parameter")]
    [InlineData("state x\nconst x = 2\nx' = 1", 2, 7, "'x' is already defined on line 1 as a state")]
    [InlineData("state x\nx' = 1\nx' = 2", 3, 1, "a second equation for 'x' (the first is on line 2)")]
    [InlineData("state x\nx' = min(x)", 2, 6, "min takes 2 arguments, found 1")]
    [InlineData("state x\nx' = sin(x, x)", 2, 6, "sin takes 1 argument, found 2")]
    [InlineData("state x\npwl g breaks(0) slopes(1, 2)\nx' = g(x, x)", 3, 6, "g takes 1 argument, found 2")]
    [InlineData("state x\nk = 1\nx' = k(x)", 3, 6, "'k' is a parameter, not a function")]
    [InlineData("state x\nx' = foo(x)", 2, 6, "unknown function 'foo'")]
    [InlineData("state x\nx' = sin", 2, 6, "'sin' is a function: write sin(...)")]
    [InlineData("state x\nk = x\nx' = k", 2, 5, "a value here must be a number or use only constants, and 'x' is a state")]
    [InlineData("state x\nconst a = b\nconst b = 1\nx' = a", 2, 11, "the constant 'b' is used before its definition on line 3")]
    [InlineData("state x, t\nx' = 1", 1, 10, "'t' is the time variable")]
    [InlineData("state x\nsin = 2\nx' = 1", 2, 1, "'sin' is a reserved word")]
    [InlineData("state x\nk = 1/0\nx' = k", 2, 5, "the value of 'k' is not a finite number")]
    [InlineData("state x\npwl g breaks(1, 0) slopes(1, 2, 3)\nx' = g(x)", 2, 17, "breakpoints must be strictly increasing")]
    [InlineData("state x\npwl g breaks(0) slopes(1, 2, 3)\nx' = g(x)", 2, 17, "1 breakpoint(s) need 2 slopes, found 3")]
    [InlineData("state x\npwl g breaks(0) slopes(x, 2)\nx' = g(x)", 2, 24, "a slope may use numbers, constants and parameters, and 'x' is a state")]
    public void Parse_SemanticError_NamesTheProblemAtItsPlace(string text, int line, int column, string message)
    {
        var error = SingleError(text);

        Assert.Equal((line, column), (error.Line, error.Column));
        Assert.Contains(message, error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Parse_SeveralErrors_AreAllReportedInLineOrder()
    {
        var result = ModelParser.Parse("state x, y\nx' = rho*x\ny' = (y\nq = ", "m.model");

        Assert.False(result.Success);
        Assert.Equal([2, 3, 4], result.Errors.Select(error => error.Line));
        Assert.Equal("m.model:2:6: unknown name 'rho': declare it as a parameter (rho = value), a constant (const rho = value), a state or an input", result.Errors[0].ToString());
    }

    [Fact]
    public void Parse_NoState_IsAnError()
    {
        var error = SingleError("# nothing here\nk = 1");

        Assert.Contains("declares no state", error.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData("sigma*(y - x)")]
    [InlineData("x*(rho - z) - y")]
    [InlineData("-x^2 + (-x)^2 - 2^-x")]
    [InlineData("a - (b - c) - (a + b)")]
    [InlineData("a/(b*c) / (a/b)")]
    [InlineData("x^y^2 + (x^y)^2")]
    [InlineData("-(a + b)*c - -a")]
    [InlineData("min(a, b)*max(x - 1, -y) + abs(sign(x))")]
    public void ToString_PrintedExpression_ParsesBackToTheSameValue(string expression)
    {
        // Arrange
        var header = "state x = 0.7, y = -1.3\na = 1.5\nb = -0.25\nc = 3\nrho = 2\nsigma = 0.5\nz = 0.1\n";
        var model = ParseOk(header + $"x' = {expression}\ny' = 0");
        var printed = model.Equations[0].RightHandSide.ToString();
        var reparsed = ParseOk(header + $"x' = {printed}\ny' = 0");
        double[] state = [0.7, -1.3];
        var parameters = model.NominalParameters();

        // Act
        var original = ExpressionEvaluator.Evaluate(model.Equations[0].RightHandSide, 0, state, parameters);
        var roundTrip = ExpressionEvaluator.Evaluate(reparsed.Equations[0].RightHandSide, 0, state, parameters);

        // Assert
        Assert.Equal(original, roundTrip);
        Assert.Equal(printed, reparsed.Equations[0].RightHandSide.ToString());
    }
}
