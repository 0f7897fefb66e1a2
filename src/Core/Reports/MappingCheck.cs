using Patchproof.Core.Estimation;

namespace Patchproof.Core.Reports;

/// <summary>Whether the channel mapping the fit used is the one the capture supports best.</summary>
/// <remarks>Every assignment of the recorded channels to the design's variables, with every sign, is scored by the
/// equation-error misfit (<see cref="ChannelMappingSearch"/>): the mean fraction of each derivative's variance the
/// design's terms leave unexplained. Another mapping "fits far better" when its misfit is below a tenth of the used
/// one's (our threshold: right and wrong readings of a chaotic board differ by one to two orders of magnitude, and
/// noise alone moves a misfit by far less than a factor of ten).</remarks>
/// <param name="Performed">False when the check could not run (a variable not recorded, or more channels than variables).</param>
/// <param name="Used">The mapping the fit used, for example <c>x=CH1, y=CH2, z=CH3</c>.</param>
/// <param name="UsedMisfit">Its misfit, 0 to 1.</param>
/// <param name="Best">The best-fitting mapping.</param>
/// <param name="BestMisfit">Its misfit.</param>
/// <param name="BetterMappingFound">True when <paramref name="Best"/> fits far better than <paramref name="Used"/>.</param>
/// <param name="Message">The outcome in plain words.</param>
public sealed record MappingCheck(bool Performed, string Used, double UsedMisfit, string Best, double BestMisfit, bool BetterMappingFound, string Message)
{
    /// <summary>A misfit below this fraction of the used mapping's counts as far better.</summary>
    public const double FarBetterRatio = 0.1;

    /// <summary>The result when the check cannot run.</summary>
    /// <param name="reason">Why, in plain words.</param>
    /// <returns>A result that says so.</returns>
    public static MappingCheck NotPerformed(string reason) => new(false, "", double.NaN, "", double.NaN, false, "Mapping check not performed: " + reason);

    /// <summary>Compares the used mapping with every other one.</summary>
    /// <param name="ranking">Every mapping, best first, over the channels in <paramref name="channelNames"/> order.</param>
    /// <param name="used">The used mapping: for each state, the channel index and sign.</param>
    /// <param name="stateNames">The design's variable names.</param>
    /// <param name="channelNames">The channels' names, in the ranking's channel order.</param>
    /// <returns>The check.</returns>
    public static MappingCheck Compare(IReadOnlyList<ChannelMapping> ranking, IReadOnlyList<(int Channel, int Sign)> used, IReadOnlyList<string> stateNames, IReadOnlyList<string> channelNames)
    {
        ArgumentNullException.ThrowIfNull(ranking);
        ArgumentNullException.ThrowIfNull(used);
        string Describe(IReadOnlyList<int> channels, IReadOnlyList<int> signs) =>
            string.Join(", ", stateNames.Select((name, k) => $"{name}={(signs[k] < 0 ? "-" : "")}{channelNames[channels[k]]}"));
        var match = ranking.First(m => m.ChannelOfState.SequenceEqual(used.Select(u => u.Channel)));
        var best = ranking[0];
        var usedText = Describe(used.Select(u => u.Channel).ToList(), used.Select(u => u.Sign).ToList());
        var bestText = Describe(best.ChannelOfState, best.SignOfState);
        var farBetter = best.Misfit < FarBetterRatio * match.Misfit;
        var message = farBetter
            ? $"The capture fits the mapping {bestText} far better (unexplained {100 * best.Misfit:0.##} % against {100 * match.Misfit:0.##} % for {usedText}): check which probe is on which output, and fit again with that mapping."
            : $"The mapping {usedText} fits the capture (unexplained {100 * match.Misfit:0.##} %); no other reading fits far better.";
        return new MappingCheck(true, usedText, match.Misfit, bestText, best.Misfit, farBetter, message);
    }
}
