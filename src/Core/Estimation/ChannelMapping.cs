namespace Patchproof.Core.Estimation;

/// <summary>One way to read the capture's channels as the model's states: which channel carries each state, and with which sign.</summary>
/// <remarks>State k = <see cref="SignOfState"/>[k] * channel <see cref="ChannelOfState"/>[k]. <see cref="Misfit"/> is
/// the mean over equations of RSS_j / TSS_j of the equation-error fit under this reading: the fraction of each
/// derivative's variance the design's terms cannot explain (0 is perfect, 1 is no better than a constant).
/// Flipping a channel's sign changes no misfit when the coefficients are free (the fit flips the coefficients'
/// signs instead), so signs are told apart only by <see cref="SignDisagreements"/> with the design's nominal values.</remarks>
/// <param name="ChannelOfState">For each state, the channel index that carries it.</param>
/// <param name="SignOfState">For each state, +1 or -1 (an inverting probe or an inverted output).</param>
/// <param name="Misfit">The mean unexplained fraction, in [0, 1].</param>
/// <param name="SignDisagreements">How many fitted coefficients have the opposite sign to the design's nominal value (0 when no nominal values were given).</param>
public sealed record ChannelMapping(IReadOnlyList<int> ChannelOfState, IReadOnlyList<int> SignOfState, double Misfit, int SignDisagreements)
{
    /// <summary>A readable form such as <c>x=CH1, y=-CH3, z=CH2</c> (channels counted from 1).</summary>
    /// <param name="stateNames">The state names in order.</param>
    /// <returns>The description.</returns>
    public string Describe(IReadOnlyList<string> stateNames)
    {
        ArgumentNullException.ThrowIfNull(stateNames);
        return string.Join(", ", ChannelOfState.Select((channel, k) => $"{stateNames[k]}={(SignOfState[k] < 0 ? "-" : string.Empty)}CH{channel + 1}"));
    }
}
