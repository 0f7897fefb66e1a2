using System.Collections.Immutable;
using Patchproof.Core.Circuits;
using Patchproof.Core.Circuits.Boards;
using Patchproof.Core.Simulation;

namespace Patchproof.Core.Tests.Circuits.Boards;

public sealed class BoardOdeSystemTests
{
    [Fact]
    public void Simulate_IntegratorOneVoltForOneSecond_ReachesMinusTenVolts()
    {
        // Common practice (CHECKS.md): V_out = V_out(0) - (1/RC) * integral V_in dt; 100 kΩ, 1 µF, 1 V for 1 s -> -10 V.
        var design = new BoardDesign(
            "T-5", "test", null, 1.0,
            [new DesignVariable("v", 1.0)],
            [new Part("C1", PartKind.Capacitor, 1e-6, 0.05), new Part("R1", PartKind.Resistor, 100e3, 0.01), new Part("VR1", PartKind.Reference, 1.0, 0.01)],
            [new IntegratorBlock("v", "C1", [new BlockInput("one", "R1")], 0), new ReferenceBlock("one", "VR1")]);
        var system = BoardOdeSystem.Create(design, BoardNonIdealities.Ideal);

        var solution = OdeSolver.Solve(new OdeProblem(system, [0.0], 0, 1, system.ParameterVector()), new DormandPrince45());

        Assert.Equal(-10.0, solution.FinalState[0], 1e-12);
    }

    [Fact]
    public void EvaluateNodes_Multiplier_TransfersXYOverTenVolts()
    {
        // Common practice (CHECKS.md): W = XY / 10 V; X = 7 V, Y = -3 V -> -2.1 V.
        var design = new BoardDesign(
            "T-6", "test", null, 1.0,
            [new DesignVariable("v", 1.0)],
            [
                new Part("C1", PartKind.Capacitor, 1e-6, 0.05), new Part("R1", PartKind.Resistor, 100e3, 0.01),
                new Part("VR1", PartKind.Reference, 7.0, 0.01), new Part("VR2", PartKind.Reference, -3.0, 0.01), new Part("M1", PartKind.Multiplier, 0.1, 0.02),
            ],
            [
                new IntegratorBlock("v", "C1", [new BlockInput("w", "R1")], 0),
                new ReferenceBlock("seven", "VR1"), new ReferenceBlock("minus3", "VR2"), new MultiplierBlock("w", "M1", "seven", "minus3"),
            ]);
        var system = BoardOdeSystem.Create(design, BoardNonIdealities.Ideal);
        var nodes = new double[system.NodeNames.Count];
        var derivative = new double[1];

        system.EvaluateNodes([0.0], system.ParameterVector().AsSpan(), nodes);
        system.Evaluate(0, [0.0], system.ParameterVector().AsSpan(), derivative);

        Assert.Equal(-2.1, nodes[system.NodeNames.ToList().IndexOf("w")], 1e-14);
        Assert.Equal(21.0, derivative[0], 1e-12);
    }

    [Fact]
    public void Evaluate_GroundedInputWithOffsetAndBias_DriftsAtVosOverRCPlusIbOverC()
    {
        // Standard derivation (CHECKS.md): |dV/dt| = V_os/(RC) + I_b/C; 1 mV, 80 nA, 100 kΩ, 1 µF -> 0.01 + 0.08 = 0.09 V/s.
        var design = new BoardDesign(
            "T-7", "test", null, 1.0,
            [new DesignVariable("v", 1.0)],
            [new Part("C1", PartKind.Capacitor, 1e-6, 0.05), new Part("R1", PartKind.Resistor, 100e3, 0.01)],
            [new IntegratorBlock("v", "C1", [new BlockInput(BoardDesign.GroundNode, "R1")], 0)]);
        var system = BoardOdeSystem.Create(design, BoardNonIdealities.Ideal with
        {
            IntegratorInputOffsetsVolts = ImmutableDictionary<string, double>.Empty.Add("v", 1e-3),
            IntegratorBiasCurrentsAmperes = ImmutableDictionary<string, double>.Empty.Add("v", 80e-9),
        });
        var derivative = new double[1];

        system.Evaluate(0, [0.0], system.ParameterVector().AsSpan(), derivative);

        Assert.Equal(0.09, derivative[0], 1e-15);
    }

    [Fact]
    public void Simulate_EveryCapacitor2000pFTo470nF_SlowsTheBoardBy235()
    {
        // Common practice (CHECKS.md): the time scale follows the capacitors; 470e-9 / 2000e-12 = 235 exactly in the ideal model.
        var fast = DesignSamples.Demo("qh-l3-wren.json");
        fast = fast.WithPartValues(fast.Parts.Where(part => part.Kind == PartKind.Capacitor).ToDictionary(part => part.Id, _ => 2000e-12));
        var slow = fast.WithPartValues(fast.Parts.Where(part => part.Kind == PartKind.Capacitor).ToDictionary(part => part.Id, _ => 0.47e-6));
        var fastSystem = BoardOdeSystem.Create(fast, BoardNonIdealities.Ideal);
        var slowSystem = BoardOdeSystem.Create(slow, BoardNonIdealities.Ideal);
        ImmutableArray<double> start = [0.4, 0.4, 0.2];
        var fastEnd = 5 * 2e-4;
        var options = new DormandPrince45 { RelativeTolerance = 1e-11, AbsoluteTolerance = 1e-12 };

        var fastSolution = OdeSolver.Solve(new OdeProblem(fastSystem, start, 0, fastEnd, fastSystem.ParameterVector()), options);
        var slowSolution = OdeSolver.Solve(new OdeProblem(slowSystem, start, 0, 235 * fastEnd, slowSystem.ParameterVector()), options);

        for (var j = 0; j < 3; j++)
        {
            Assert.Equal(fastSolution.FinalState[j], slowSolution.FinalState[j], 1e-7);
        }
    }

    [Fact]
    public void Evaluate_HardClipping_HoldsAnIntegratorDrivenOutwardAtTheLimit()
    {
        // A bias current of 1 µA into 1 µF drives the output up at 1 V/s: held at +13 V, free at -13 V.
        var design = DesignSamples.SingleIntegrator("1 µF", (BoardDesign.GroundNode, "R1", "100k"));
        var system = BoardOdeSystem.Create(design, BoardNonIdealities.Ideal with
        {
            Clipping = OutputClipping.Hard,
            IntegratorBiasCurrentsAmperes = ImmutableDictionary<string, double>.Empty.Add("v", 1e-6),
        });
        var derivative = new double[1];

        system.Evaluate(0, [13.0], system.ParameterVector().AsSpan(), derivative);
        Assert.Equal(0.0, derivative[0]);

        system.Evaluate(0, [-13.0], system.ParameterVector().AsSpan(), derivative);
        Assert.Equal(1.0, derivative[0], 1e-12);
    }

    [Fact]
    public void ParameterVector_DeviatedPart_ScalesItsTermsCoefficient()
    {
        var design = DesignSamples.SingleIntegrator("1 µF", ("v", "R1", "100k"));
        var system = BoardOdeSystem.Create(design, BoardNonIdealities.Ideal);
        var derivative = new double[1];

        system.Evaluate(0, [1.0], system.ParameterVector(new Dictionary<string, double> { ["R1"] = 0.25 }).AsSpan(), derivative);

        Assert.Equal(-10.0 / 1.25, derivative[0], 1e-12);
    }
}
