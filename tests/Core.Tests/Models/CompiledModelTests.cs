using Patchproof.Core.Models;
using Patchproof.Core.Models.Library;

namespace Patchproof.Core.Tests.Models;

public sealed class CompiledModelTests
{
    private static double[] RandomVector(Random random, int length, double scale) =>
        [.. Enumerable.Range(0, length).Select(_ => (random.NextDouble() * 2 - 1) * scale)];

    public static TheoryData<string> BuiltInNames() => [.. ModelCatalog.All.Select(model => model.Name)];

    [Theory]
    [MemberData(nameof(BuiltInNames))]
    public void Evaluate_BuiltInText_EqualsHandWrittenOnRandomStates(string name)
    {
        // Arrange
        var builtIn = ModelCatalog.Find(name)!;
        var compiled = builtIn.Parse().Compile();
        var handWritten = builtIn.HandWritten;
        var random = new Random(1963);
        var n = compiled.StateCount;
        var m = compiled.ParameterCount;
        var nominal = builtIn.NominalParameters();
        Span<double> expected = stackalloc double[n * Math.Max(n, m)];
        Span<double> actual = stackalloc double[n * Math.Max(n, m)];
        var terms = builtIn.Parse().Terms();

        for (var trial = 0; trial < 500; trial++)
        {
            var state = RandomVector(random, n, 30);
            var parameters = trial % 2 == 0 ? nominal : RandomVector(random, m, 5);
            var time = random.NextDouble() * 100;

            // Act and assert: right-hand side, state Jacobian, parameter Jacobian.
            handWritten.Evaluate(time, state, parameters, expected[..n]);
            compiled.Evaluate(time, state, parameters, actual[..n]);
            AssertClose(expected[..n], actual[..n], $"{name} f at trial {trial}", TermMagnitudes(terms, time, state, parameters));

            handWritten.EvaluateStateJacobian(time, state, parameters, expected[..(n * n)]);
            compiled.EvaluateStateJacobian(time, state, parameters, actual[..(n * n)]);
            AssertClose(expected[..(n * n)], actual[..(n * n)], $"{name} df/dx at trial {trial}");

            handWritten.EvaluateParameterJacobian(time, state, parameters, expected[..(n * m)]);
            compiled.EvaluateParameterJacobian(time, state, parameters, actual[..(n * m)]);
            var basisSizes = BasisMagnitudes(terms, time, state, parameters);
            AssertClose(expected[..(n * m)], actual[..(n * m)], $"{name} df/dp at trial {trial}", [.. Enumerable.Range(0, n * m).Select(entry => basisSizes[entry / m])]);
        }
    }

    /// <summary>The sum of |coefficient * basis| per equation: the size rounding errors scale with when terms cancel.</summary>
    private static double[] TermMagnitudes(IReadOnlyList<EquationTerms> terms, double time, double[] state, double[] parameters) =>
        [.. terms.Select(equation => equation.Terms.Sum(term =>
            Math.Abs(term.CoefficientAt(parameters) * Patchproof.Core.Models.Expressions.ExpressionEvaluator.Evaluate(term.Basis.Expression, time, state, parameters))))];

    /// <summary>The sum of |basis| per equation: the size of df_i/dp when a coefficient is a parameter.</summary>
    private static double[] BasisMagnitudes(IReadOnlyList<EquationTerms> terms, double time, double[] state, double[] parameters) =>
        [.. terms.Select(equation => equation.Terms.Sum(term =>
            Math.Abs(Patchproof.Core.Models.Expressions.ExpressionEvaluator.Evaluate(term.Basis.Expression, time, state, parameters))))];

    private static void AssertClose(ReadOnlySpan<double> expected, ReadOnlySpan<double> actual, string what, double[]? scales = null)
    {
        for (var i = 0; i < expected.Length; i++)
        {
            // A few units in the last place of the largest quantity involved.
            var scale = Math.Max(Math.Max(1.0, Math.Abs(expected[i])), scales?[i] ?? 0);
            var tolerance = 4e-16 * scale * 4;
            Assert.True(Math.Abs(expected[i] - actual[i]) <= tolerance, $"{what}, entry {i}: expected {expected[i]:R}, got {actual[i]:R}");
        }
    }
    [Fact]
    public void Evaluate_LorenzFixedPoints_GiveZeroDerivative()
    {
        // Derived from the equations (project check values): the fixed points of Lorenz (10, 28, 8/3)
        // are (+-sqrt(beta (rho - 1)), +-sqrt(beta (rho - 1)), rho - 1) = (+-6 sqrt 2, +-6 sqrt 2, 27).
        var compiled = ModelCatalog.Lorenz.Parse().Compile();
        var parameters = ModelCatalog.Lorenz.NominalParameters();
        var c = 6 * Math.Sqrt(2);
        Span<double> derivative = stackalloc double[3];

        foreach (var sign in new[] { 1.0, -1.0 })
        {
            compiled.Evaluate(0, [sign * c, sign * c, 27], parameters, derivative);
            Assert.All(derivative.ToArray(), value => Assert.True(Math.Abs(value) < 1e-12, $"derivative {value:R}"));
        }

        compiled.Evaluate(0, [0, 0, 0], parameters, derivative);
        Assert.Equal([0.0, 0.0, 0.0], derivative.ToArray());
        Assert.Equal(8.48528137423857, c, 13);
    }

    [Fact]
    public void EvaluateStateJacobian_Lorenz_HasTraceMinus41Over3Everywhere()
    {
        // Derived (project check values): div f = -(sigma + 1 + beta) = -41/3 for (10, 28, 8/3).
        var compiled = ModelCatalog.Lorenz.Parse().Compile();
        var parameters = ModelCatalog.Lorenz.NominalParameters();
        var random = new Random(41);
        Span<double> jacobian = stackalloc double[9];

        for (var trial = 0; trial < 100; trial++)
        {
            compiled.EvaluateStateJacobian(0, RandomVector(random, 3, 40), parameters, jacobian);
            Assert.Equal(-41.0 / 3.0, jacobian[0] + jacobian[4] + jacobian[8], 12);
        }
    }

    [Fact]
    public void Evaluate_ManyCalls_AllocateNothing()
    {
        // Arrange: a functional check of the allocation-free contract, not a timing.
        var compiled = ModelCatalog.Chua.Parse().Compile();
        var lorenz = ModelCatalog.Lorenz.Parse().Compile();
        double[] state = [0.3, -0.2, 0.1];
        var chuaParameters = ModelCatalog.Chua.NominalParameters();
        var lorenzParameters = ModelCatalog.Lorenz.NominalParameters();
        var derivative = new double[3];
        var jacobian = new double[9];
        var parameterJacobian = new double[9];
        lorenz.Evaluate(0, state, lorenzParameters, derivative);
        lorenz.EvaluateStateJacobian(0, state, lorenzParameters, jacobian);
        lorenz.EvaluateParameterJacobian(0, state, lorenzParameters, parameterJacobian);
        compiled.Evaluate(0, state, chuaParameters, derivative);
        compiled.EvaluateStateJacobian(0, state, chuaParameters, jacobian);
        compiled.EvaluateParameterJacobian(0, state, chuaParameters, parameterJacobian);

        // Act
        var before = GC.GetAllocatedBytesForCurrentThread();
        for (var i = 0; i < 100_000; i++)
        {
            lorenz.Evaluate(i, state, lorenzParameters, derivative);
            lorenz.EvaluateStateJacobian(i, state, lorenzParameters, jacobian);
            lorenz.EvaluateParameterJacobian(i, state, lorenzParameters, parameterJacobian);
            compiled.Evaluate(i, state, chuaParameters, derivative);
            compiled.EvaluateStateJacobian(i, state, chuaParameters, jacobian);
            compiled.EvaluateParameterJacobian(i, state, chuaParameters, parameterJacobian);
        }

        var allocated = GC.GetAllocatedBytesForCurrentThread() - before;

        // Assert
        Assert.Equal(0, allocated);
    }

    [Fact]
    public void Evaluate_FromSeveralThreads_GivesTheSameValues()
    {
        var compiled = ModelCatalog.Lorenz.Parse().Compile();
        var parameters = ModelCatalog.Lorenz.NominalParameters();
        var handWritten = new LorenzSystem();

        var mismatches = 0;
        Parallel.For(0, 4, worker =>
        {
            var random = new Random(worker);
            var expected = new double[3];
            var actual = new double[3];
            for (var i = 0; i < 20_000; i++)
            {
                var state = RandomVector(random, 3, 20);
                handWritten.Evaluate(0, state, parameters, expected);
                compiled.Evaluate(0, state, parameters, actual);
                if (!expected.AsSpan().SequenceEqual(actual))
                {
                    Interlocked.Increment(ref mismatches);
                }
            }
        });

        Assert.Equal(0, mismatches);
    }

    [Fact]
    public void Evaluate_ShortSpan_IsACallersMistake()
    {
        var compiled = ModelCatalog.Lorenz.Parse().Compile();

        Assert.Throws<ArgumentOutOfRangeException>(() => compiled.Evaluate(0, new double[2], new double[3], new double[3]));
        Assert.Throws<ArgumentOutOfRangeException>(() => compiled.Evaluate(0, new double[3], new double[2], new double[3]));
        Assert.Throws<ArgumentOutOfRangeException>(() => compiled.EvaluateStateJacobian(0, new double[3], new double[3], new double[8]));
        Assert.Throws<ArgumentOutOfRangeException>(() => compiled.EvaluateParameterJacobian(0, new double[3], new double[3], new double[8]));
    }

    [Fact]
    public void Evaluate_DivisionByZero_GivesInfinityAndAnExplanationNamingTheEquation()
    {
        // Arrange
        var model = ModelParser.Parse("state x = 1, y = 0\nk = 2\nx' = -k*x\ny' = x/y", "div.model").Value;
        var compiled = model.Compile();
        double[] state = [1, 0];
        var derivative = new double[2];

        // Act
        compiled.Evaluate(0.5, state, [2.0], derivative);
        var explanation = compiled.ExplainNonFinite(0.5, state, [2.0]);

        // Assert
        Assert.True(double.IsPositiveInfinity(derivative[1]));
        Assert.Equal("the equation for y (line 4) gives +infinity at t = 0.5: division by zero in x/y", explanation);
        Assert.Null(compiled.ExplainNonFinite(0.5, [1, 1], [2.0]));
    }

    [Fact]
    public void Evaluate_LogOfANegative_GivesNaNAndSaysSo()
    {
        var compiled = ModelParser.Parse("state x\nx' = log(x)").Value.Compile();
        var derivative = new double[1];

        compiled.Evaluate(0, [-1.0], [], derivative);

        Assert.True(double.IsNaN(derivative[0]));
        Assert.Contains("log of a negative number in log(x)", compiled.ExplainNonFinite(0, [-1.0], []), StringComparison.Ordinal);
    }

    [Fact]
    public void Evaluate_RecordedInput_IsInterpolatedLinearly()
    {
        // Arrange: x' = -x + u with u sampled at t = 0, 1, 2.
        var model = ModelParser.Parse("state x\ninput u\nx' = -x + 2*u").Value;
        var signal = new SampledSignal([0.0, 1.0, 2.0], [0.0, 10.0, 4.0]);
        var compiled = model.Compile([signal]);
        var derivative = new double[1];

        // Act and assert
        compiled.Evaluate(0.25, [1.0], [], derivative);
        Assert.Equal(-1 + (2 * 2.5), derivative[0], 14);
        compiled.Evaluate(1.5, [0.0], [], derivative);
        Assert.Equal(2 * 7.0, derivative[0], 14);
        compiled.Evaluate(5.0, [0.0], [], derivative);
        Assert.Equal(2 * 4.0, derivative[0], 14);

        var rebound = compiled.WithInputs([SampledSignal.Uniform(0, 1, [1.0, 1.0])]);
        rebound.Evaluate(0.5, [0.0], [], derivative);
        Assert.Equal(2.0, derivative[0]);
    }

    [Fact]
    public void Compile_ModelWithInputsButNoSignals_IsACallersMistake()
    {
        var model = ModelParser.Parse("state x\ninput u\nx' = u").Value;

        Assert.Throws<InvalidOperationException>(() => model.Compile());
        Assert.Throws<ArgumentOutOfRangeException>(() => model.Compile([]));
    }

    [Fact]
    public void StateJacobianEntries_Lorenz_AreTheHandDerivedExpressions()
    {
        var compiled = ModelCatalog.Lorenz.Parse().Compile();

        Assert.Equal(
            ["-sigma", "sigma", "0", "rho - z", "-1", "-x", "y", "x", "-beta"],
            compiled.StateJacobianEntries.Select(entry => entry.ToString()));
        Assert.Equal(
            ["y - x", "0", "0", "0", "x", "0", "0", "0", "-z"],
            compiled.ParameterJacobianEntries.Select(entry => entry.ToString()));
    }

    [Theory]
    [InlineData(-1.0)]
    [InlineData(1.0)]
    [InlineData(0.0)]
    public void EvaluateStateJacobian_ChuaAtABreakpoint_UsesTheSlopeOnTheRightLikeTheHandWrittenTwin(double x)
    {
        var compiled = ModelCatalog.Chua.Parse().Compile();
        var parameters = ModelCatalog.Chua.NominalParameters();
        var expected = new double[9];
        var actual = new double[9];

        new ChuaSystem().EvaluateStateJacobian(0, [x, 0.2, -0.1], parameters, expected);
        compiled.EvaluateStateJacobian(0, [x, 0.2, -0.1], parameters, actual);

        Assert.Equal(expected[0], actual[0], 14);
    }
}
