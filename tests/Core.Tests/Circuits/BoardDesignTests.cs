using System.Collections.Immutable;
using Patchproof.Core.Circuits;

namespace Patchproof.Core.Tests.Circuits;

public sealed class BoardDesignTests
{
    [Fact]
    public void Terms_InvertingIntegrator_GainIsMinusOneOverRC()
    {
        // Common practice: V_out = V_out(0) - (1/RC) * integral of V_in; 100 kΩ with 1 µF gives -10 per second.
        var design = DesignSamples.SingleIntegrator("1 µF", ("v", "R1", "100k"));

        var term = Assert.Single(design.Terms());

        Assert.Equal(-10.0, term.NominalCoefficient, 12);
        Assert.Equal("1/s", term.CoefficientUnit);
        var path = Assert.Single(term.Paths);
        Assert.Equal(-1, path.Sign);
        Assert.Equal([new PartFactor("R1", -1), new PartFactor("C1", -1)], path.Factors.OrderBy(factor => factor.PartId == "C1").ToArray());
    }

    [Fact]
    public void Terms_SummingIntegrator_WeightsAreOneOverRiC()
    {
        // Common practice: dV_out/dt = -sum V_i/(R_i C); 1 MΩ and 100 kΩ with 1 µF weigh 1 and 10 per second.
        var design = SingleTwoStateDesign("1M", "100k");

        var terms = design.Terms().Where(term => term.Variable == "v").ToDictionary(term => term.Basis.Key);

        Assert.Equal(-1.0, terms["v"].NominalCoefficient, 12);
        Assert.Equal(-10.0, terms["w"].NominalCoefficient, 12);
    }

    [Fact]
    public void Terms_ThroughInverterAndMultiplier_CarryEveryPartOnThePath()
    {
        // u = M1(-x, z) with -x from an inverter R8/R9, into R5 and C2: theta = +kappa * (R8/R9) / (R5 C2).
        var design = new BoardDesign(
            "T-2", "test", null, 1e-3,
            [new DesignVariable("x", 0.5), new DesignVariable("y", 0.5), new DesignVariable("z", 0.25)],
            [
                new Part("C1", PartKind.Capacitor, 10e-9, 0.05), new Part("C2", PartKind.Capacitor, 10e-9, 0.05), new Part("C3", PartKind.Capacitor, 10e-9, 0.05),
                new Part("R1", PartKind.Resistor, 100e3, 0.01), new Part("R2", PartKind.Resistor, 100e3, 0.01), new Part("R3", PartKind.Resistor, 100e3, 0.01),
                new Part("R5", PartKind.Resistor, 2e3, 0.01), new Part("R8", PartKind.Resistor, 200e3, 0.01), new Part("R9", PartKind.Resistor, 100e3, 0.01),
                new Part("M1", PartKind.Multiplier, 0.1, 0.02),
            ],
            [
                new IntegratorBlock("x", "C1", [new BlockInput("x", "R1")]),
                new IntegratorBlock("y", "C2", [new BlockInput("y", "R2"), new BlockInput("p", "R5")]),
                new IntegratorBlock("z", "C3", [new BlockInput("z", "R3")]),
                new SummerBlock("-x", "R8", [new BlockInput("x", "R9")]),
                new MultiplierBlock("p", "M1", "-x", "z"),
            ]);

        var term = design.Terms().Single(candidate => candidate.Variable == "y" && candidate.Basis.Key == "x*z");

        var path = Assert.Single(term.Paths);
        Assert.Equal(1, path.Sign);
        Assert.Equal(
            new Dictionary<string, int> { ["M1"] = 1, ["R8"] = 1, ["R9"] = -1, ["R5"] = -1, ["C2"] = -1 },
            path.Factors.ToDictionary(factor => factor.PartId, factor => factor.Exponent));
        Assert.Equal(0.1 * 2.0 / (2e3 * 10e-9), term.NominalCoefficient, 6);
        Assert.Equal("1/(V s)", term.CoefficientUnit);
        Assert.Equal(1.0, term.LogSensitivity("M1", design.NominalOf));
        Assert.Equal(-1.0, term.LogSensitivity("C2", design.NominalOf));
        Assert.Equal(0.0, term.LogSensitivity("R1", design.NominalOf));
    }

    [Fact]
    public void Terms_NegativeReference_GivesAPositiveConstantTerm()
    {
        var design = new BoardDesign(
            "T-3", "test", null, 1.0,
            [new DesignVariable("v", 1.0)],
            [new Part("C1", PartKind.Capacitor, 1e-6, 0.05), new Part("R1", PartKind.Resistor, 1e6, 0.01), new Part("VR1", PartKind.Reference, -1.0, 0.01)],
            [new IntegratorBlock("v", "C1", [new BlockInput("ref", "R1")]), new ReferenceBlock("ref", "VR1")]);

        var term = Assert.Single(design.Terms());

        Assert.True(term.Basis.IsConstant);
        Assert.Equal(1.0, term.NominalCoefficient, 12);
        Assert.Equal("V/s", term.CoefficientUnit);
        Assert.Equal(1, term.Paths[0].ExponentOf("VR1"));
    }

    [Fact]
    public void Terms_TwoInputsFromOneNode_MergeIntoOneTermWithTwoPaths()
    {
        var design = DesignSamples.SingleIntegrator("1 µF", ("v", "R1", "100k"), ("v", "R2", "300k"));

        var term = Assert.Single(design.Terms());

        Assert.Equal(2, term.Paths.Length);
        Assert.Equal(-10.0 - (10.0 / 3), term.NominalCoefficient, 12);
        Assert.Equal(-0.75, term.LogSensitivity("R1", design.NominalOf), 12);
        Assert.Equal(-1.0, term.LogSensitivity("C1", design.NominalOf), 12);
    }

    [Fact]
    public void ToProblemCoefficient_LorenzDemo_DeScalesToTheModelsParameters()
    {
        // V = sign * s * x and t = tau * T: c = theta * tau * prod(s_i) / s_j.
        var design = DesignSamples.Demo("qh-l3-wren.json");
        var terms = design.Terms().ToDictionary(term => $"{term.Variable}:{term.Basis.Key}");

        Assert.Equal(10.0, design.ToProblemCoefficient(terms["x:y"]), 9);
        Assert.Equal(-10.0, design.ToProblemCoefficient(terms["x:x"]), 9);
        Assert.Equal(28.0, design.ToProblemCoefficient(terms["y:x"]), 28 * ESeries.E96.HalfStep);
        Assert.Equal(-1.0, design.ToProblemCoefficient(terms["y:y"]), 9);
        Assert.Equal(-1.0, design.ToProblemCoefficient(terms["y:x*z"]), 9);
        Assert.Equal(1.0, design.ToProblemCoefficient(terms["z:x*y"]), ESeries.E96.HalfStep);
        Assert.Equal(-8.0 / 3, design.ToProblemCoefficient(terms["z:z"]), 8.0 / 3 * ESeries.E96.HalfStep);
    }

    [Fact]
    public void ToProblemCoefficient_NegativeSignVariable_FlipsTheSignOfCrossTerms()
    {
        var design = SingleTwoStateDesign("1M", "100k") with
        {
            Variables = [new DesignVariable("v", 1.0), new DesignVariable("w", 2.0, -1)],
        };
        var cross = design.Terms().Single(term => term.Variable == "v" && term.Basis.Key == "w");

        Assert.Equal(-10.0 * -2.0, design.ToProblemCoefficient(cross), 12);
    }

    private static BoardDesign SingleTwoStateDesign(string first, string second) => new(
        "T-4", "test", null, 1.0,
        [new DesignVariable("v", 1.0), new DesignVariable("w", 1.0)],
        [
            new Part("C1", PartKind.Capacitor, 1e-6, 0.05), new Part("C2", PartKind.Capacitor, 1e-6, 0.05),
            new Part("R1", PartKind.Resistor, ValueNotation.Parse(first, Quantity.Resistance), 0.01),
            new Part("R2", PartKind.Resistor, ValueNotation.Parse(second, Quantity.Resistance), 0.01),
            new Part("R3", PartKind.Resistor, 1e6, 0.01),
        ],
        [
            new IntegratorBlock("v", "C1", [new BlockInput("v", "R1"), new BlockInput("w", "R2")]),
            new IntegratorBlock("w", "C2", [new BlockInput("v", "R3")]),
        ]);
}
