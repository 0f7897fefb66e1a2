namespace Patchproof.Core.Simulation.Synthesis;

/// <summary>How units appear in a capture file's header.</summary>
public enum HeaderUnits
{
    /// <summary><c>Time (s),CH1 (V)</c>.</summary>
    Parentheses,

    /// <summary><c>t [ms];CH1 [V]</c>.</summary>
    Brackets,

    /// <summary>A names row followed by a units row: <c>TIME,CH1</c> then <c>s,V</c>.</summary>
    UnitsRow,
}

/// <summary>A CSV dialect for writing captures: delimiter, decimal mark, time unit, header and metadata style.</summary>
/// <param name="Delimiter">The field delimiter, <c>,</c> or <c>;</c> or a tab.</param>
/// <param name="DecimalComma">True to write 1,25 instead of 1.25 (needs a delimiter other than a comma).</param>
/// <param name="TimeInMilliseconds">True to write the time column in ms.</param>
/// <param name="Units">How the header carries units.</param>
/// <param name="CommentMetadata">True to write metadata as <c># key: value</c> lines; false as <c>key;value</c> rows.</param>
public sealed record CaptureCsvStyle(char Delimiter = ',', bool DecimalComma = false, bool TimeInMilliseconds = false, HeaderUnits Units = HeaderUnits.Parentheses, bool CommentMetadata = true)
{
    /// <summary>Finds a style by name: <c>comma</c>, <c>semicolon</c>, <c>semicolon-decimal-comma</c>, <c>units-row</c>, <c>tab</c>.</summary>
    /// <param name="name">The name.</param>
    /// <param name="style">The style, or null.</param>
    /// <returns>True when known.</returns>
    public static bool TryFind(string? name, out CaptureCsvStyle style)
    {
        style = (name ?? "comma").Trim().ToLowerInvariant() switch
        {
            "comma" => new CaptureCsvStyle(),
            "semicolon" => new CaptureCsvStyle(';', Units: HeaderUnits.Brackets, TimeInMilliseconds: true, CommentMetadata: false),
            "semicolon-decimal-comma" => new CaptureCsvStyle(';', DecimalComma: true, Units: HeaderUnits.Brackets, CommentMetadata: false),
            "units-row" => new CaptureCsvStyle(',', Units: HeaderUnits.UnitsRow, CommentMetadata: false),
            "tab" => new CaptureCsvStyle('\t', TimeInMilliseconds: true),
            _ => null!,
        };
        return style is not null;
    }
}
