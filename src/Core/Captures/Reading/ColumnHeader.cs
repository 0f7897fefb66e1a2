using System.Text.RegularExpressions;

namespace Patchproof.Core.Captures.Reading;

/// <summary>What a column holds.</summary>
internal enum ColumnRole
{
    /// <summary>A recorded signal.</summary>
    Channel,

    /// <summary>The time of each row.</summary>
    Time,

    /// <summary>A running sample number, not needed once the time base is known.</summary>
    SampleIndex,
}

/// <summary>A column's name and unit as the header (and units row) spelled them.</summary>
/// <param name="Name">The name without its unit.</param>
/// <param name="Unit">The unit text, or null when none was given.</param>
internal sealed partial record ColumnHeader(string Name, string? Unit)
{
    private static readonly string[] TimeNames = ["t", "time", "times", "timestamp", "time stamp", "elapsed", "elapsed time", "seconds"];

    private static readonly string[] IndexNames =
        ["index", "idx", "sample", "samples", "sample #", "sample no", "sample no.", "sample number", "n", "no", "no.", "#", "point", "pt", "pts", "row", "nr", "number"];

    /// <summary>Splits a header field such as <c>CH1 (V)</c>, <c>Voltage [mV]</c>, <c>t / ms</c> or <c>Time_s</c> into name and unit.</summary>
    public static ColumnHeader Parse(string field)
    {
        var text = field.Trim().Trim('"').Trim();
        var bracket = BracketedUnit().Match(text);
        if (bracket.Success)
        {
            return new ColumnHeader(bracket.Groups["name"].Value.Trim(), bracket.Groups["unit"].Value.Trim());
        }

        var slash = SlashOrInUnit().Match(text);
        if (slash.Success && Units.IsKnownUnit(slash.Groups["unit"].Value))
        {
            return new ColumnHeader(slash.Groups["name"].Value.Trim(), slash.Groups["unit"].Value);
        }

        var suffix = SuffixUnit().Match(text);
        if (suffix.Success)
        {
            return new ColumnHeader(suffix.Groups["name"].Value.Trim(), suffix.Groups["unit"].Value);
        }

        return new ColumnHeader(text, null);
    }

    /// <summary>Decides the role from the name and unit.</summary>
    public ColumnRole Role
    {
        get
        {
            var name = Name.Trim().ToLowerInvariant();
            if ((Unit is not null && Units.SecondsPer(Unit) is not null) || TimeNames.Contains(name))
            {
                return ColumnRole.Time;
            }

            return IndexNames.Contains(name) && string.IsNullOrEmpty(Unit) ? ColumnRole.SampleIndex : ColumnRole.Channel;
        }
    }

    [GeneratedRegex(@"^(?<name>.*?)\s*[\(\[\{]\s*(?<unit>[^\(\)\[\]\{\}]*?)\s*[\)\]\}]$")]
    private static partial Regex BracketedUnit();

    [GeneratedRegex(@"^(?<name>.+?)\s*(?:/|\s+in\s+)\s*(?<unit>\S+)$")]
    private static partial Regex SlashOrInUnit();

    [GeneratedRegex(@"^(?<name>.+?)[_ ](?<unit>s|ms|us|µs|μs|ns|V|mV|uV|µV|μV)$")]
    private static partial Regex SuffixUnit();
}
