using Patchproof.Core.Circuits;
using Patchproof.Core.Circuits.Checking;
using Patchproof.Core.Circuits.Targets;

namespace Patchproof.Core.Tests.Circuits.Checking;

public sealed class DesignCheckTests
{
    [Fact]
    public void Check_LorenzDemo_RealizesTheModelWithinRounding()
    {
        var design = DesignSamples.Demo("qh-l3-wren.json");

        var report = DesignCheck.Check(design, BuiltInTargets.Lorenz);

        Assert.True(report.RealizesModel, string.Join("\n", report.Findings));
        Assert.Equal(7, report.Terms.Length);
        var rho = report.ImpliedParameters.Single(parameter => parameter.Name == "rho");
        Assert.Equal(28.0, rho.Value, 28 * ESeries.E96.HalfStep);
        var sigma = report.ImpliedParameters.Single(parameter => parameter.Name == "sigma");
        Assert.Equal(2, sigma.PerTerm.Length);
    }

    [Fact]
    public void Check_ResistorFarOff_NamesTheTerm()
    {
        var design = DesignSamples.Demo("qh-l3-wren.json");
        var off = design.WithPartValues(new Dictionary<string, double> { ["R3"] = 3.57e3 * 1.1 });

        var report = DesignCheck.Check(off, BuiltInTargets.Lorenz);

        var finding = Assert.Single(report.Findings, finding => finding.IsError);
        Assert.Equal(DesignFindingKind.WrongValue, finding.Kind);
        Assert.Equal("dy/dt: x", finding.Subject);
    }

    [Fact]
    public void Check_MissingInverter_IsAWrongSign()
    {
        var design = DesignSamples.Demo("qh-l3-wren.json");
        var x = design.Blocks.OfType<IntegratorBlock>().Single(block => block.Variable == "x");
        var rewired = design with
        {
            Blocks = design.Blocks.Replace(x, x with { Inputs = [new BlockInput("y", "R1"), x.Inputs[1]] }),
        };

        var report = DesignCheck.Check(rewired, BuiltInTargets.Lorenz);

        Assert.Contains(report.Findings, finding => finding.Kind == DesignFindingKind.WrongSign && finding.Subject == "dx/dt: y");
        Assert.Contains(report.Findings, finding => finding.Kind == DesignFindingKind.UnusedPart && finding.Subject == "R11");
    }

    [Fact]
    public void Check_DroppedInput_IsAMissingTerm()
    {
        var design = DesignSamples.Demo("qh-l3-wren.json");
        var z = design.Blocks.OfType<IntegratorBlock>().Single(block => block.Variable == "z");
        var open = design with { Blocks = design.Blocks.Replace(z, z with { Inputs = [z.Inputs[1]] }) };

        var report = DesignCheck.Check(open, BuiltInTargets.Lorenz);

        Assert.Contains(report.Findings, finding => finding.Kind == DesignFindingKind.MissingTerm && finding.Subject == "dz/dt: x*y");
        Assert.Contains(report.Findings, finding => finding.Kind == DesignFindingKind.UnusedPart && finding.Subject == "R6");
        Assert.False(report.RealizesModel);
    }

    [Fact]
    public void Check_WireToTheWrongIntegrator_IsAnExtraTerm()
    {
        var design = DesignSamples.Demo("qh-l3-wren.json");
        var z = design.Blocks.OfType<IntegratorBlock>().Single(block => block.Variable == "z");
        var miswired = design with { Blocks = design.Blocks.Replace(z, z with { Inputs = [z.Inputs[0], new BlockInput("y", "R7")] }) };

        var report = DesignCheck.Check(miswired, BuiltInTargets.Lorenz);

        Assert.Contains(report.Findings, finding => finding.Kind == DesignFindingKind.ExtraTerm && finding.Subject == "dz/dt: y");
        Assert.Contains(report.Findings, finding => finding.Kind == DesignFindingKind.MissingTerm && finding.Subject == "dz/dt: z");
    }
}
