using Patchproof.Core.Models;

namespace Patchproof.Core.Tests.Models;

public sealed class TermDecomposerTests
{
    private static string[] Describe(EquationTerms equation) =>
        [.. equation.Terms.Select(term => $"{term.CoefficientText} | {term.Basis.Text}")];

    private static IReadOnlyList<EquationTerms> TermsOf(BuiltInModel model)
    {
        var terms = model.Parse().Terms();
        Assert.All(terms, equation => Assert.True(equation.IsLinearInCoefficients, equation.Reason));
        return terms;
    }

    [Fact]
    public void Terms_Lorenz_AreTheSevenTermsOfTheEquations()
    {
        // Lorenz (1963): x' = sigma (y - x), y' = rho x - x z - y, z' = x y - beta z.
        var terms = TermsOf(ModelCatalog.Lorenz);

        Assert.Equal(["sigma | y", "-sigma | x"], Describe(terms[0]));
        Assert.Equal(["rho | x", "-1 | x*z", "-1 | y"], Describe(terms[1]));
        Assert.Equal(["1 | x*y", "-beta | z"], Describe(terms[2]));
        Assert.Equal([10.0, -10.0], terms[0].Terms.Select(term => term.NominalCoefficient));
        Assert.Equal([28.0, -1.0, -1.0], terms[1].Terms.Select(term => term.NominalCoefficient));
        Assert.Equal([1.0, -8.0 / 3.0], terms[2].Terms.Select(term => term.NominalCoefficient));
        Assert.Equal(2, terms[1].Terms[1].Basis.StateDegree);
        Assert.Equal([0, 2], terms[1].Terms[1].Basis.Factors.Select(factor => factor.StateIndex));
    }

    [Fact]
    public void Terms_Rossler_IncludeAConstantTerm()
    {
        var terms = TermsOf(ModelCatalog.Rossler);

        Assert.Equal(["-1 | y", "-1 | z"], Describe(terms[0]));
        Assert.Equal(["1 | x", "a | y"], Describe(terms[1]));
        Assert.Equal(["b | 1", "1 | x*z", "-c | z"], Describe(terms[2]));
        Assert.True(terms[2].Terms[0].Basis.IsConstant);
    }

    [Fact]
    public void Terms_Chua_KeepTheFixedDiodeAsOneBasis()
    {
        var terms = TermsOf(ModelCatalog.Chua);

        Assert.Equal(["alpha | y", "-alpha | x", "-alpha | g(x)"], Describe(terms[0]));
        Assert.Equal(BasisFactorKind.Function, terms[0].Terms[2].Basis.Factors[0].Kind);
        Assert.Equal(["1 | x", "-1 | y", "1 | z"], Describe(terms[1]));
        Assert.Equal(["-beta | y"], Describe(terms[2]));
    }

    [Fact]
    public void Terms_VanDerPol_ExpandTheProductOverTheSum()
    {
        var terms = TermsOf(ModelCatalog.VanDerPol);

        Assert.Equal(["1 | y"], Describe(terms[0]));
        Assert.Equal(["mu | y", "-mu | x^2*y", "-1 | x"], Describe(terms[1]));
        Assert.Equal(3, terms[1].Terms[1].Basis.StateDegree);
    }

    [Fact]
    public void Terms_Duffing_TreatTheFixedForcingAsABasis()
    {
        var terms = TermsOf(ModelCatalog.Duffing);

        Assert.Equal(["-delta | v", "-alpha | x", "-beta | x^3", "gamma | cos(omega*t)"], Describe(terms[1]));
        Assert.Equal([-0.3, 1.0, -1.0, 0.5], terms[1].Terms.Select(term => term.NominalCoefficient));
    }

    [Fact]
    public void Terms_DampedOscillator_HaveCoefficientsThatAreProductsOfParameters()
    {
        var terms = TermsOf(ModelCatalog.DampedOscillator);

        Assert.Equal(["-2*zeta*omega0 | v", "-omega0^2 | x"], Describe(terms[1]));
        Assert.Equal(-2 * 0.1 * 2 * Math.PI, terms[1].Terms[0].NominalCoefficient, 14);
        Assert.Equal(-4 * Math.PI * Math.PI, terms[1].Terms[1].NominalCoefficient, 12);
    }

    [Fact]
    public void Terms_SprottJerkAndLotkaVolterra_AreMonomials()
    {
        var jerk = TermsOf(ModelCatalog.SprottJerk);
        var lotka = TermsOf(ModelCatalog.LotkaVolterra);

        Assert.Equal(["-A | z", "1 | y^2", "-1 | x"], Describe(jerk[2]));
        Assert.Equal(["alpha | x", "-beta | x*y"], Describe(lotka[0]));
        Assert.Equal(["delta | x*y", "-gamma | y"], Describe(lotka[1]));
    }

    [Fact]
    public void Terms_LikeTermsAreMerged_AndCancellingTermsDropped()
    {
        var model = ModelParser.Parse("state x, y\na = 2\nb = 3\nx' = a*x + b*x + y - y\ny' = (x + y)^2").Value;

        var terms = model.Terms();

        Assert.Equal(["a + b | x"], Describe(terms[0]));
        Assert.Equal(["1 | x^2", "2 | x*y", "1 | y^2"], Describe(terms[1]));
    }

    [Fact]
    public void Terms_DivisionByParameterAndByState_GoToCoefficientAndBasis()
    {
        var model = ModelParser.Parse("state x, y\ntau = 2\nx' = (y - x)/tau\ny' = x/y").Value;

        var terms = model.Terms();

        Assert.Equal(["1/tau | y", "-1/tau | x"], Describe(terms[0]));
        Assert.Equal(0.5, terms[0].Terms[0].NominalCoefficient);
        Assert.Equal(["1 | x/y"], Describe(terms[1]));
    }

    [Fact]
    public void Terms_PiecewiseWithParameterSlopes_SplitIntoSegments()
    {
        var model = ModelParser.Parse("state x\nm0 = -1\nm1 = 0.5\npwl g breaks(-1, 1) slopes(m1, m0, m1)\nx' = -g(x)").Value;

        var terms = model.Terms()[0];

        Assert.Equal(["-m1 | g[0](x)", "-m0 | g[1](x)", "-m1 | g[2](x)"], Describe(terms));
    }

    [Fact]
    public void Terms_ParameterInsideANonlinearFunction_IsNotLinearInCoefficients()
    {
        var model = ModelParser.Parse("state x\nw = 2\nx' = sin(w*x) + x").Value;

        var terms = model.Terms()[0];

        Assert.False(terms.IsLinearInCoefficients);
        Assert.Empty(terms.Terms);
        Assert.Contains("sin(w*x)", terms.Reason, StringComparison.Ordinal);
    }

    [Theory]
    [MemberData(nameof(CompiledModelTests.BuiltInNames), MemberType = typeof(CompiledModelTests))]
    public void Terms_SumOfCoefficientTimesBasis_ReproducesTheRightHandSide(string name)
    {
        // Arrange
        var builtIn = ModelCatalog.Find(name)!;
        var model = builtIn.Parse();
        var terms = model.Terms();
        var random = new Random(7);
        var parameters = model.NominalParameters();

        for (var trial = 0; trial < 200; trial++)
        {
            var state = Enumerable.Range(0, model.States.Count).Select(_ => (random.NextDouble() * 2 - 1) * 5).ToArray();
            var time = random.NextDouble() * 10;
            foreach (var equation in terms)
            {
                // Act
                var expected = Patchproof.Core.Models.Expressions.ExpressionEvaluator.Evaluate(model.Equations[equation.StateIndex].RightHandSide, time, state, parameters);
                var sum = equation.Terms.Sum(term => term.CoefficientAt(parameters) * Patchproof.Core.Models.Expressions.ExpressionEvaluator.Evaluate(term.Basis.Expression, time, state, parameters));
                var scale = equation.Terms.Sum(term => Math.Abs(term.CoefficientAt(parameters) * Patchproof.Core.Models.Expressions.ExpressionEvaluator.Evaluate(term.Basis.Expression, time, state, parameters)));

                // Assert
                Assert.True(Math.Abs(expected - sum) <= 1e-14 * Math.Max(1, scale), $"{name} {equation.StateName}: {expected:R} vs {sum:R}");
            }
        }
    }
}
