using System.Globalization;

namespace Patchproof.Core.Reports;

/// <summary>Which design variable a capture channel records, and with which sign (a board often outputs -y).</summary>
/// <param name="Channel">The channel's name or 1-based position in the capture, for example <c>CH1</c>.</param>
/// <param name="Variable">The design variable, for example <c>x</c>.</param>
/// <param name="Sign">+1, or -1 when the channel records the variable inverted.</param>
public sealed record ChannelAssignment(string Channel, string Variable, int Sign)
{
    /// <summary>Reads a mapping written as <c>CH1=x,CH2=-y,CH3=z</c>.</summary>
    /// <param name="text">The mapping text.</param>
    /// <returns>The assignments, or an error naming the item that is wrong.</returns>
    public static ParseResult<IReadOnlyList<ChannelAssignment>> ParseList(string text)
    {
        var assignments = new List<ChannelAssignment>();
        var column = 1;
        foreach (var item in text.Split(','))
        {
            var parts = item.Split('=');
            if (parts.Length != 2 || parts[0].Trim().Length == 0 || parts[1].Trim().TrimStart('-', '+').Length == 0)
            {
                return ParseResult<IReadOnlyList<ChannelAssignment>>.ForError(SourceDiagnostic.ErrorAt("--map", 1, column,
                    string.Create(CultureInfo.InvariantCulture, $"expected CHANNEL=VARIABLE or CHANNEL=-VARIABLE, found '{item.Trim()}'")));
            }

            var variable = parts[1].Trim();
            var sign = variable.StartsWith('-') ? -1 : 1;
            assignments.Add(new ChannelAssignment(parts[0].Trim(), variable.TrimStart('-', '+'), sign));
            column += item.Length + 1;
        }

        return ParseResult<IReadOnlyList<ChannelAssignment>>.ForValue(assignments);
    }

    /// <summary>The <c>CH1=x</c> form.</summary>
    public override string ToString() => $"{Channel}={(Sign < 0 ? "-" : "")}{Variable}";
}
