using System.Collections.Immutable;
using Patchproof.Core.Circuits;
using Patchproof.Core.Circuits.Files;
using Patchproof.TestSupport;

namespace Patchproof.Core.Tests.Circuits;

/// <summary>Small designs for tests, and the demo designs from designs/.</summary>
internal static class DesignSamples
{
    /// <summary>One integrator (variable v, scale 1 V per unit) with the given inputs; tau 1 s.</summary>
    public static BoardDesign SingleIntegrator(string capacitor, params (string From, string ResistorId, string Value)[] inputs)
    {
        var parts = ImmutableArray.CreateBuilder<Part>();
        parts.Add(new Part("C1", PartKind.Capacitor, ValueNotation.Parse(capacitor, Quantity.Capacitance), 0.05));
        foreach (var input in inputs)
        {
            parts.Add(new Part(input.ResistorId, PartKind.Resistor, ValueNotation.Parse(input.Value, Quantity.Resistance), 0.01));
        }

        return new BoardDesign(
            "T-1",
            "test",
            null,
            1.0,
            [new DesignVariable("v", 1.0)],
            parts.ToImmutable(),
            [new IntegratorBlock("v", "C1", [.. inputs.Select(input => new BlockInput(input.From, input.ResistorId))])]);
    }

    public static BoardDesign Demo(string fileName) =>
        DesignFileReader.ReadFile(Path.Combine(ReferenceDataFiles.RepositoryRoot, "designs", fileName)).Value;
}
