using System.Collections.Immutable;

namespace Patchproof.Core.Circuits.Building;

/// <summary>What the builder aims for: ranges, time scale, series and the conventions of the bench.</summary>
/// <remarks>Defaults follow common practice: machine unit 10 V, outputs clipping at 13 V on +/-15 V
/// rails, 100 kΩ as the unit-gain resistor (with 10 nF it gives 1 ms per problem time unit),
/// multipliers of 0.1 /V, a 1 V reference.</remarks>
public sealed record DesignBuildOptions
{
    /// <summary>Expected max |x| per variable in problem units; variables not listed take the model's typical range.</summary>
    public ImmutableDictionary<string, double> Ranges { get; init; } = ImmutableDictionary<string, double>.Empty;

    /// <summary>tau, seconds per problem time unit; default 1 ms.</summary>
    public double TimeScaleSeconds { get; init; } = 1e-3;

    /// <summary>The series resistors are rounded to; default E24.</summary>
    public ESeries ResistorSeries { get; init; } = ESeries.E24;

    /// <summary>The series capacitors are rounded to; default E12.</summary>
    public ESeries CapacitorSeries { get; init; } = ESeries.E12;

    /// <summary>The capacitors' tolerance; default 5 %.</summary>
    public double CapacitorTolerance { get; init; } = 0.05;

    /// <summary>The unit-gain resistor R0, ohms; the capacitor is tau / R0 rounded to its series. Default 100 kΩ.</summary>
    public double UnitResistorOhms { get; init; } = 100e3;

    /// <summary>The machine unit, volts; default 10 V.</summary>
    public double MachineUnitVolts { get; init; } = BoardDesign.DefaultMachineUnitVolts;

    /// <summary>The output limit, volts; default 13 V.</summary>
    public double OutputLimitVolts { get; init; } = BoardDesign.DefaultOutputLimitVolts;

    /// <summary>The multipliers' nominal scale factor, 1/V; default 0.1.</summary>
    public double MultiplierScalePerVolt { get; init; } = 0.1;

    /// <summary>The multipliers' tolerance; default 2 % (common practice for low-cost parts).</summary>
    public double MultiplierTolerance { get; init; } = 0.02;

    /// <summary>The magnitude of the reference voltage for constant terms, volts; default 1 V.</summary>
    public double ReferenceVolts { get; init; } = 1.0;

    /// <summary>The board id to write into the design.</summary>
    public string Board { get; init; } = string.Empty;

    /// <summary>The title to write into the design.</summary>
    public string Title { get; init; } = string.Empty;
}
