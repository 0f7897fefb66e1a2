namespace Patchproof.Contracts.Captures;

/// <summary>One channel's mapping: the model variable it shows, and its sign.</summary>
/// <param name="Channel">The channel's name in the capture, for example "CH2".</param>
/// <param name="Variable">The design's variable, for example "y".</param>
/// <param name="Sign">+1, or -1 when the channel shows the variable inverted.</param>
public sealed record ChannelMappingEntry(string Channel, string Variable, int Sign);

/// <summary>The body of <c>POST /api/captures/{id}/mapping-check</c>.</summary>
/// <param name="DesignVersion">A version of the capture's board's design.</param>
/// <param name="Mapping">The person's mapping, one entry per channel used.</param>
public sealed record MappingCheckRequest(int DesignVersion, IReadOnlyList<ChannelMappingEntry> Mapping);

/// <summary>Whether another mapping fits the design's equations clearly better than the one given.</summary>
/// <param name="AgreesWithGiven">True when no other mapping fits clearly better.</param>
/// <param name="Suggested">The best mapping found (the given one when it agrees).</param>
/// <param name="Message">The conclusion in words, with the misfits compared.</param>
public sealed record MappingCheckResponse(bool AgreesWithGiven, IReadOnlyList<ChannelMappingEntry> Suggested, string Message);
