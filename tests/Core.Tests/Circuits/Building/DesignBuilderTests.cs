using Patchproof.Core.Circuits;
using Patchproof.Core.Circuits.Boards;
using Patchproof.Core.Circuits.Building;
using Patchproof.Core.Circuits.Checking;
using Patchproof.Core.Circuits.Targets;
using Patchproof.Core.Simulation;

namespace Patchproof.Core.Tests.Circuits.Building;

public sealed class DesignBuilderTests
{
    public static TheoryData<string, string> ModelsAndSeries => new()
    {
        { "lorenz", "E12" }, { "lorenz", "E24" }, { "lorenz", "E96" },
        { "rossler", "E24" }, { "rossler", "E96" }, { "damped-oscillator", "E24" },
    };

    [Theory]
    [MemberData(nameof(ModelsAndSeries))]
    public void Propose_PartValues_SitOnTheChosenSeries(string model, string seriesName)
    {
        // IEC 60063: every resistor on the chosen series, every capacitor on the capacitor series.
        Assert.True(BuiltInTargets.TryFind(model, out var target));
        Assert.True(ESeries.TryFind(seriesName, out var series));

        var proposal = DesignBuilder.Propose(target, null, new DesignBuildOptions { ResistorSeries = series });

        Assert.All(proposal.Design.Parts.Where(part => part.Kind == PartKind.Resistor), part => Assert.True(series.Contains(part.NominalValue), $"{part.Id} {part.NominalText}"));
        Assert.All(proposal.Design.Parts.Where(part => part.Kind == PartKind.Capacitor), part => Assert.True(ESeries.E12.Contains(part.NominalValue), part.Id));
        Assert.All(proposal.Roundings, rounding => Assert.InRange(Math.Abs(rounding.CoefficientError), 0, series.HalfStep + 1e-12));
    }

    [Theory]
    [MemberData(nameof(ModelsAndSeries))]
    public void Propose_Design_RealizesItsModelWhenChecked(string model, string seriesName)
    {
        Assert.True(BuiltInTargets.TryFind(model, out var target));
        Assert.True(ESeries.TryFind(seriesName, out var series));

        var proposal = DesignBuilder.Propose(target, null, new DesignBuildOptions { ResistorSeries = series });
        var report = DesignCheck.Check(proposal.Design, target);

        Assert.True(report.RealizesModel, string.Join("\n", report.Findings));
    }

    [Fact]
    public void Propose_LorenzOneMillisecond_UsesTenNanofaradCapacitors()
    {
        // Common practice (CHECKS.md): 100 kΩ with 10 nF gives 1 ms per problem time unit.
        var proposal = DesignBuilder.Propose(BuiltInTargets.Lorenz);

        Assert.All(proposal.Design.Parts.Where(part => part.Kind == PartKind.Capacitor), part => Assert.Equal(10e-9, part.NominalValue, 1e-20));
    }

    [Fact]
    public void Simulate_GeneratedLorenzDesign_DeScaledReproducesTheModelsTrajectory()
    {
        // Over a short horizon (chaos): the ideal board, de-scaled with V = s x and t = tau T, follows
        // the model solved with the coefficients its parts realize (to 1e-6), and the nominal model within rounding.
        var target = BuiltInTargets.Lorenz;
        var proposal = DesignBuilder.Propose(target, null, new DesignBuildOptions { ResistorSeries = ESeries.E96 });
        var design = proposal.Design;
        var board = BoardOdeSystem.Create(design, BoardNonIdealities.Ideal);
        var realized = target with
        {
            Terms = [.. DesignCheck.Check(design, target).Terms.Where(row => row.Term is not null).Select(row => new TargetTerm(row.Variable, row.Basis, row.RealizedProblemCoefficient))],
        };
        var options = new DormandPrince45 { RelativeTolerance = 1e-10, AbsoluteTolerance = 1e-12 };
        const double horizon = 1.0;
        var tau = design.TimeScaleSeconds;

        var boardEnd = OdeSolver.Solve(new OdeProblem(board, board.InitialState(target), 0, horizon * tau, board.ParameterVector()), options).FinalState.ToArray();
        var impliedEnd = OdeSolver.Solve(new OdeProblem(realized.ToOdeSystem(), target.DefaultInitialState, 0, horizon, target.ParameterVector()), options).FinalState.ToArray();
        var nominalEnd = OdeSolver.Solve(new OdeProblem(target.ToOdeSystem(), target.DefaultInitialState, 0, horizon, target.ParameterVector()), options).FinalState.ToArray();

        for (var j = 0; j < 3; j++)
        {
            var deScaled = design.Variables[j].FromVolts(boardEnd[j]);
            Assert.Equal(impliedEnd[j], deScaled, 1e-6 * (1 + Math.Abs(impliedEnd[j])));
            Assert.Equal(nominalEnd[j], deScaled, 0.05 * (1 + Math.Abs(nominalEnd[j])));
        }
    }

    [Theory]
    [InlineData(0.37, 0.25)]
    [InlineData(0.5, 0.5)]
    [InlineData(0.208, 0.2)]
    [InlineData(9.9, 5)]
    [InlineData(4.2, 4)]
    public void NiceScaleAtMost_RoundsDown(double value, double expected)
    {
        Assert.Equal(expected, DesignBuilder.NiceScaleAtMost(value), 12);
    }
}
