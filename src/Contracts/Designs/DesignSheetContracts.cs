using System.Text.Json;

namespace Patchproof.Contracts.Designs;

/// <summary>A design as the design screen edits it: the equations, the blocks and the parts, with the design file it stands for.</summary>
/// <remarks>
/// The design file (docs/circuits.md) holds what the screen does not show (scales, wiring, initial values); the server applies the
/// sheet's part values and tolerances to <see cref="Document"/> when it checks or stores a sheet.
/// </remarks>
/// <param name="ModelName">The model the board realizes, for example "lorenz", or empty.</param>
/// <param name="Equations">The model's right-hand sides, one a line, for example "dx/dt = sigma*(y - x)".</param>
/// <param name="TimeScaleSeconds">Seconds of board time per problem time unit.</param>
/// <param name="Blocks">The blocks, each with a label of its own.</param>
/// <param name="Parts">The parts with nominal values and tolerances.</param>
/// <param name="Document">The design file this sheet stands for.</param>
public sealed record DesignSheetDocument(
    string ModelName,
    IReadOnlyList<string> Equations,
    double TimeScaleSeconds,
    IReadOnlyList<DesignSheetBlock> Blocks,
    IReadOnlyList<DesignSheetPart> Parts,
    JsonElement? Document);

/// <summary>One block of a sheet.</summary>
/// <param name="Id">A label: I1, I2... for integrators, M for multipliers, N for inverters, S for summers, V for references, F for function blocks.</param>
/// <param name="Kind">"integrator", "summer", "inverter", "multiplier", "reference" or "function".</param>
/// <param name="Output">The node it drives, for example "-y".</param>
public sealed record DesignSheetBlock(string Id, string Kind, string Output);

/// <summary>One part of a sheet.</summary>
/// <param name="Reference">Its id in the design, for example "R5".</param>
/// <param name="Kind">"resistor", "capacitor", "scale" (a multiplier's factor) or "reference".</param>
/// <param name="Block">The label of the block it serves, or empty.</param>
/// <param name="Nominal">Its nominal value in <paramref name="Unit"/>.</param>
/// <param name="Unit">"Ohm", "F", "1/V" or "V".</param>
/// <param name="TolerancePercent">Its tolerance in percent.</param>
public sealed record DesignSheetPart(string Reference, string Kind, string Block, double Nominal, string Unit, double TolerancePercent);

/// <summary>One result of the design check.</summary>
/// <param name="Severity">"error" (must fix), "warning" (check) or "note".</param>
/// <param name="Subject">The part or block label it concerns, or empty for the whole design.</param>
/// <param name="Message">One sentence a person can act on.</param>
public sealed record DesignCheckNoteResponse(string Severity, string Subject, string Message);
