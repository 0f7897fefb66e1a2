using Patchproof.Core.Circuits;
using TermBasis = Patchproof.Core.Circuits.TermBasis;
using Patchproof.Core.Circuits.Boards;
using Patchproof.Core.Circuits.Building;
using Patchproof.Core.Circuits.Checking;
using Patchproof.Core.Circuits.Targets;
using Patchproof.Core.Models;
using Patchproof.Core.Simulation;

namespace Patchproof.Core.Tests.Circuits.Targets;

public sealed class ModelTargetsTests
{
    public static TheoryData<string, string> QuadraticModelsAndSeries => new()
    {
        { "lotka-volterra", "E24" }, { "lotka-volterra", "E96" }, { "sprott-jerk", "E24" }, { "sprott-jerk", "E96" },
    };

    private static TargetSystem CatalogTarget(string name)
    {
        var result = ModelTargets.FromCatalog(name);
        Assert.NotNull(result);
        Assert.True(result.IsRealizable, string.Join("\n", result.Refusals));
        return result.Target!;
    }

    private static ModelTargetResult FromText(string text) =>
        ModelTargets.FromModel(ModelParser.Parse(text, "own.model").Value, "own");

    [Theory]
    [MemberData(nameof(QuadraticModelsAndSeries))]
    public void Propose_QuadraticCatalogModel_PartsSitOnTheChosenSeriesAndTheCheckPasses(string model, string seriesName)
    {
        // IEC 60063: every resistor on the chosen series, every capacitor on E12.
        var target = CatalogTarget(model);
        Assert.True(ESeries.TryFind(seriesName, out var series));

        var proposal = DesignBuilder.Propose(target, null, new DesignBuildOptions { ResistorSeries = series });

        Assert.All(proposal.Design.Parts.Where(part => part.Kind == PartKind.Resistor), part => Assert.True(series.Contains(part.NominalValue), $"{part.Id} {part.NominalText}"));
        Assert.All(proposal.Design.Parts.Where(part => part.Kind == PartKind.Capacitor), part => Assert.True(ESeries.E12.Contains(part.NominalValue), part.Id));
        Assert.All(proposal.Roundings, rounding => Assert.InRange(Math.Abs(rounding.CoefficientError), 0, series.HalfStep + 1e-12));
        Assert.True(DesignCheck.Check(proposal.Design, target).RealizesModel);
    }

    [Theory]
    [InlineData("lotka-volterra", 1.0)]
    [InlineData("sprott-jerk", 1.0)]
    public void Simulate_GeneratedDesign_DeScaledReproducesTheModelsOwnTrajectory(string model, double horizon)
    {
        // As for Lorenz in DesignBuilderTests: the ideal board, de-scaled with V = s x and t = tau T
        // (amplitude and time scaling, common practice), follows the model solved with the coefficients
        // its parts realize (to 1e-6), and the catalog model's own equations (compiled from its text,
        // not from the target) within the E96 rounding. Equations: Lotka (1925) / Volterra (1926);
        // J. C. Sprott, Phys. Lett. A 228 (1997) 271-274, A = 2.017.
        var builtIn = ModelCatalog.Find(model)!;
        var target = CatalogTarget(model);
        var design = DesignBuilder.Propose(target, null, new DesignBuildOptions { ResistorSeries = ESeries.E96 }).Design;
        var board = BoardOdeSystem.Create(design, BoardNonIdealities.Ideal);
        var realized = target with
        {
            Terms = [.. DesignCheck.Check(design, target).Terms.Where(row => row.Term is not null).Select(row => new TargetTerm(row.Variable, row.Basis, row.RealizedProblemCoefficient))],
        };
        var own = builtIn.Parse().Compile();
        var options = new DormandPrince45 { RelativeTolerance = 1e-10, AbsoluteTolerance = 1e-12 };
        var tau = design.TimeScaleSeconds;
        var start = builtIn.DefaultInitialState.ToArray();

        var boardEnd = OdeSolver.Solve(new OdeProblem(board, board.InitialState(target), 0, horizon * tau, board.ParameterVector()), options).FinalState.ToArray();
        var impliedEnd = OdeSolver.Solve(new OdeProblem(realized.ToOdeSystem(), target.DefaultInitialState, 0, horizon, target.ParameterVector()), options).FinalState.ToArray();
        var modelEnd = OdeSolver.Solve(new OdeProblem(own, [.. start], 0, horizon, [.. builtIn.NominalParameters()]), options).FinalState.ToArray();

        Assert.Equal(start, target.DefaultInitialState.ToArray());
        for (var j = 0; j < start.Length; j++)
        {
            var deScaled = design.Variables[j].FromVolts(boardEnd[j]);
            Assert.Equal(impliedEnd[j], deScaled, 1e-6 * (1 + Math.Abs(impliedEnd[j])));
            Assert.Equal(modelEnd[j], deScaled, 0.05 * (1 + Math.Abs(modelEnd[j])));
            Assert.NotEqual(start[j], modelEnd[j], 1e-3);
        }
    }

    [Fact]
    public void FromCatalog_Lorenz_HasTheHandWrittenTargetsNominalCoefficients()
    {
        // E. N. Lorenz, J. Atmos. Sci. 20 (1963) 130-141: sigma = 10, rho = 28, beta = 8/3; both targets
        // must give x' = sigma (y - x), y' = rho x - y - x z, z' = x y - beta z term by term.
        var generic = CatalogTarget("lorenz");
        var hand = BuiltInTargets.Lorenz;

        static Dictionary<string, (double Value, string? Parameter)> Coefficients(TargetSystem target) =>
            target.Terms.ToDictionary(term => $"{term.Variable}: {term.Basis.Key}", term => (term.Coefficient(name => target.ParameterValue(name)), term.Parameter));

        var expected = Coefficients(hand);
        var actual = Coefficients(generic);
        Assert.Equal(expected.Keys.Order(), actual.Keys.Order());
        foreach (var (key, (value, parameter)) in expected)
        {
            Assert.Equal(value, actual[key].Value, 1e-12);
            Assert.Equal(parameter, actual[key].Parameter);
        }

        Assert.Equal(hand.Variables, generic.Variables);
        Assert.Equal(hand.ParameterVector(), generic.ParameterVector());
    }

    [Fact]
    public void FromCatalog_LorenzRanges_AreFoundBySimulatingItsOwnTrajectory()
    {
        // Lorenz (1963): on the attractor |z| reaches the high 40s and |x| about 20 (from memory); the ranges
        // come from simulation, so they must lie near the hand-written target's rounded-up figures.
        var generic = CatalogTarget("lorenz");

        for (var j = 0; j < 3; j++)
        {
            Assert.InRange(generic.TypicalRanges[j], 0.7 * BuiltInTargets.Lorenz.TypicalRanges[j], 1.2 * BuiltInTargets.Lorenz.TypicalRanges[j]);
        }
    }

    [Fact]
    public void FromCatalog_VanDerPol_RefusesTheCubicTermNamingEquationAndTerm()
    {
        var result = ModelTargets.FromCatalog("van-der-pol")!;

        var refusal = Assert.Single(result.Refusals);
        Assert.Null(result.Target);
        Assert.Equal("y", refusal.Variable);
        Assert.Contains("x^2*y", refusal.Term, StringComparison.Ordinal);
        Assert.Contains("two inputs", refusal.Reason, StringComparison.Ordinal);
        Assert.StartsWith("equation y' (line 5), term ", refusal.ToString(), StringComparison.Ordinal);
    }

    [Fact]
    public void FromModel_SineTerm_IsRefusedAsNotPolynomial()
    {
        var result = FromText("state x = 1, y = 0\nk = 2\nx' = y\ny' = -k*sin(x)\n");

        var refusal = Assert.Single(result.Refusals);
        Assert.Equal("y", refusal.Variable);
        Assert.Equal(4, refusal.Line);
        Assert.Contains("sin(x)", refusal.Term, StringComparison.Ordinal);
        Assert.Contains("not a polynomial", refusal.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void FromModel_RecordedInput_IsRefusedNamingTheInput()
    {
        var result = FromText("state x = 0\ninput u\na = 1\nx' = -a*x + u\n");

        var refusal = Assert.Single(result.Refusals);
        Assert.Equal("x", refusal.Variable);
        Assert.Equal("(1) * u", refusal.Term);
        Assert.Contains("recorded input u", refusal.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void FromModel_CoefficientOfTwoParametersOrNotProportional_IsRefused()
    {
        var product = FromText("state x = 1\na = 2\nb = 3\nx' = -a*b*x\n");
        var square = FromText("state x = 1\na = 2\nx' = -a^2*x\n");
        var offset = FromText("state x = 1\na = 2\nx' = -(a + 1)*x\n");

        Assert.Contains("reads a and b", Assert.Single(product.Refusals).Reason, StringComparison.Ordinal);
        Assert.Contains("not proportional to a", Assert.Single(square.Refusals).Reason, StringComparison.Ordinal);
        Assert.Contains("not proportional to a", Assert.Single(offset.Refusals).Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void FromModel_ScaledParameterAndConstantTerms_KeepTheParameterAndTheirFactor()
    {
        var result = FromText("state x = 1, y = 0\nk = 4\nconst h = 0.5\nx' = y\ny' = -h*k*x - 0.3*y + 2\n");

        var target = result.Target!;
        Assert.Equal(new TargetTerm("y", TermBasis.Product("x"), -0.5, "k"), target.Terms.Single(term => term.Variable == "y" && term.Basis.Key == "x"));
        Assert.Equal(-0.3, target.Terms.Single(term => term.Basis.Key == "y" && term.Variable == "y").Factor, 12);
        Assert.Equal(2, target.Terms.Single(term => term.Basis.IsConstant).Factor, 12);
        Assert.Equal([1.0, 0.0], target.DefaultInitialState.ToArray());
    }

    [Fact]
    public void FromCatalog_ChuaAndDuffing_AreRefusedWithTheirReasons()
    {
        var chua = ModelTargets.FromCatalog("chua")!;
        var duffing = ModelTargets.FromCatalog("duffing")!;

        Assert.Contains(chua.Refusals, refusal => refusal.Variable == "x" && refusal.Reason.Contains("piecewise-linear", StringComparison.Ordinal));
        Assert.Contains(duffing.Refusals, refusal => refusal.Term.Contains("x^3", StringComparison.Ordinal));
        Assert.Contains(duffing.Refusals, refusal => refusal.Reason.Contains("time t", StringComparison.Ordinal) || refusal.Term.Contains("cos", StringComparison.Ordinal));
    }

    [Fact]
    public void DesignTargets_FindsHandWrittenFirstThenRealizableCatalogModels()
    {
        Assert.Equal(["lorenz", "rossler", "damped-oscillator", "sprott-jerk", "lotka-volterra"], DesignTargets.Names().ToArray());
        Assert.Equal(DesignTargets.Names(), DesignTargets.All.Select(target => target.Name));
        Assert.True(DesignTargets.TryFind("lorenz", out var lorenz));
        Assert.Same(BuiltInTargets.Lorenz, lorenz);
        Assert.True(DesignTargets.TryFind("damped-oscillator", out var oscillator));
        Assert.Same(BuiltInTargets.DampedOscillator, oscillator);
        Assert.True(DesignTargets.TryFind("Lotka-Volterra", out var predator));
        Assert.Equal("lotka-volterra", predator.Name);
        Assert.False(DesignTargets.TryFind("chua", out _));
        Assert.False(DesignTargets.TryFind("van-der-pol", out _));
    }
}
