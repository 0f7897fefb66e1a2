namespace Patchproof.Client.Models;

/// <summary>A board's design as the design screen edits it: equations, blocks and parts.</summary>
/// <param name="ModelName">The model the board realizes, for example "Lorenz".</param>
/// <param name="Equations">The right-hand sides in the project's equation language, one a line (for example "dx/dt = sigma*(y - x)").</param>
/// <param name="TimeScaleSeconds">Seconds of board time per problem time unit.</param>
/// <param name="Blocks">The integrators, multipliers, inverters and references.</param>
/// <param name="Parts">The parts with their nominal values and tolerances.</param>
public sealed record DesignSheet(
    string ModelName,
    IReadOnlyList<string> Equations,
    double TimeScaleSeconds,
    IReadOnlyList<DesignBlock> Blocks,
    IReadOnlyList<DesignPart> Parts)
{
    /// <summary>The design file this sheet stands for, as the server sent it; the server applies the sheet's part values to it when it checks or stores the sheet.</summary>
    public System.Text.Json.JsonElement? Document { get; init; }
}

/// <summary>One block of the board.</summary>
/// <param name="Id">Its label on the board, for example "I1" or "M2".</param>
/// <param name="Kind">"integrator", "multiplier", "inverter", "summer" or "reference".</param>
/// <param name="Output">The variable (or signal) its output carries, for example "-y".</param>
public sealed record DesignBlock(string Id, string Kind, string Output);

/// <summary>One part, with what it should be and how far it may be off.</summary>
/// <param name="Reference">Its reference designator, for example "R5".</param>
/// <param name="Kind">"resistor", "capacitor", "scale" (a multiplier's factor) or "reference".</param>
/// <param name="Block">The block it belongs to.</param>
/// <param name="Nominal">Its nominal value in <paramref name="Unit"/>.</param>
/// <param name="Unit">"Ohm", "F", "1/V" or "V".</param>
/// <param name="TolerancePercent">Its tolerance in percent (for example 1 for a 1 % resistor).</param>
public sealed record DesignPart(string Reference, string Kind, string Block, double Nominal, string Unit, double TolerancePercent)
{
    /// <summary>The nominal value with an engineering prefix: "100 kOhm", "10 nF".</summary>
    public string NominalText => EngineeringFormat.Format(Nominal, Unit);
}

/// <summary>One result of the design check, tied to the part or block it concerns.</summary>
/// <param name="Severity">How serious it is.</param>
/// <param name="Subject">The part or block it concerns ("R5", "I2"), or empty for the whole design.</param>
/// <param name="Message">One sentence a person can act on.</param>
public sealed record DesignCheckNote(CheckSeverity Severity, string Subject, string Message);

/// <summary>A built-in model a design can be generated from.</summary>
/// <param name="Id">Its identifier, for example "lorenz".</param>
/// <param name="Name">Its name, for example "Lorenz system".</param>
/// <param name="Summary">One line about it, with its usual parameters.</param>
/// <param name="Equations">Its right-hand sides in the equation language.</param>
public sealed record BuiltInModelEntry(string Id, string Name, string Summary, IReadOnlyList<string> Equations)
{
    /// <summary>True when the server can propose a design for this model.</summary>
    public bool CanGenerateDesign { get; init; } = true;
}
