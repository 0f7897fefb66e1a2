using System.Globalization;
using Patchproof.Contracts.Captures;
using Patchproof.Core.Captures;

namespace Patchproof.Server.Apis;

/// <summary>The checks a fit's channel mapping must pass before the fit is queued: the errors name the field, <c>mapping[1].variable</c>.</summary>
/// <remarks>
/// Channels are found as the core finds them (name without regard to case, or 1-based position), so a mapping that passes here
/// also passes the fitter's own checks. Unlike the mapping check, a variable may be left out: the fit treats it as a hidden state.
/// </remarks>
internal static class FitMappingRules
{
    /// <summary>Checks a mapping against the design's variables and each capture's channels.</summary>
    /// <param name="mapping">The mapping as sent.</param>
    /// <param name="variables">The design's variables, in equation order.</param>
    /// <param name="captures">Each capture's file name and channel names.</param>
    /// <returns>The errors by field; empty when the mapping can be fitted.</returns>
    public static Dictionary<string, string[]> Check(
        IReadOnlyList<ChannelMappingEntry?> mapping,
        IReadOnlyList<string> variables,
        IReadOnlyList<(string FileName, IReadOnlyList<string> Channels)> captures)
    {
        var errors = new Dictionary<string, string[]>();
        var variablesSeen = new Dictionary<string, int>(StringComparer.Ordinal);
        var channelsSeen = new Dictionary<int, int>();
        for (var i = 0; i < mapping.Count; i++)
        {
            var entry = mapping[i];
            if (entry is null)
            {
                errors[$"mapping[{i}]"] = ["Each mapping entry names a channel, a variable and a sign."];
                continue;
            }

            var channelText = entry.Channel ?? string.Empty;
            var missingIn = captures.Where(c => Find(c.Channels, channelText) < 0).ToList();
            if (channelText.Trim().Length == 0 || missingIn.Count > 0)
            {
                var where = missingIn.Count > 0 ? missingIn[0] : captures[0];
                errors[$"mapping[{i}].channel"] = [$"{where.FileName} has no channel '{channelText}' (it has {string.Join(", ", where.Channels)})."];
            }
            else if (channelsSeen.TryGetValue(Find(captures[0].Channels, channelText), out var earlierChannel))
            {
                errors[$"mapping[{i}].channel"] = [$"Channel '{channelText}' is already mapped by mapping[{earlierChannel}]; a channel records one variable."];
            }
            else
            {
                channelsSeen[Find(captures[0].Channels, channelText)] = i;
            }

            var variable = entry.Variable ?? string.Empty;
            if (!variables.Contains(variable, StringComparer.Ordinal))
            {
                errors[$"mapping[{i}].variable"] = [$"The design has no variable '{variable}' (it has {string.Join(", ", variables)})."];
            }
            else if (variablesSeen.TryGetValue(variable, out var earlierVariable))
            {
                errors[$"mapping[{i}].variable"] = [$"Variable '{variable}' is already recorded by mapping[{earlierVariable}]; a variable is on one channel at most."];
            }
            else
            {
                variablesSeen[variable] = i;
            }

            if (entry.Sign is not (1 or -1))
            {
                errors[$"mapping[{i}].sign"] = [$"The sign is 1 or -1, not {entry.Sign.ToString(CultureInfo.InvariantCulture)}."];
            }
        }

        return errors;
    }

    private static int Find(IReadOnlyList<string> channels, string nameOrPosition) => Capture.IndexOfChannel(channels, nameOrPosition);
}
