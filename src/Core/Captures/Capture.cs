namespace Patchproof.Core.Captures;

/// <summary>One recording: a time base and the channels sampled on it, with the metadata that came with them.</summary>
/// <remarks>
/// Invariants: at least one channel; every channel has exactly <see cref="TimeBase"/>.SampleCount samples;
/// channel names are unique (ordinal, case-insensitive). Times are in seconds, voltage samples in volts.
/// A capture is immutable; its sample memory is shared with whoever built it.
/// </remarks>
public sealed record Capture
{
    /// <summary>Builds a capture and checks its invariants.</summary>
    /// <param name="timeBase">When each sample was taken.</param>
    /// <param name="channels">At least one channel, each with one sample per time-base sample.</param>
    /// <param name="metadata">The metadata read with the channels; may be empty.</param>
    /// <exception cref="ArgumentOutOfRangeException">No channel, a channel of the wrong length, or two channels of the same name.</exception>
    public Capture(TimeBase timeBase, IReadOnlyList<CaptureChannel> channels, IReadOnlyList<MetadataEntry> metadata)
    {
        ArgumentNullException.ThrowIfNull(timeBase);
        ArgumentNullException.ThrowIfNull(channels);
        ArgumentNullException.ThrowIfNull(metadata);
        Preconditions.CheckArgumentRange(nameof(channels), channels.Count > 0, "a capture needs at least one channel");
        Preconditions.CheckArgumentRange(nameof(channels), channels.All(c => c.SampleCount == timeBase.SampleCount), "every channel needs one sample per time-base sample");
        Preconditions.CheckArgumentRange(nameof(channels), channels.Select(c => c.Name).Distinct(StringComparer.OrdinalIgnoreCase).Count() == channels.Count, "channel names must be unique");
        TimeBase = timeBase;
        Channels = channels;
        Metadata = metadata;
    }

    /// <summary>When each sample was taken.</summary>
    public TimeBase TimeBase { get; }

    /// <summary>The channels, in file order.</summary>
    public IReadOnlyList<CaptureChannel> Channels { get; }

    /// <summary>The metadata read with the channels, in file order.</summary>
    public IReadOnlyList<MetadataEntry> Metadata { get; }

    /// <summary>Number of samples per channel.</summary>
    public int SampleCount => TimeBase.SampleCount;

    /// <summary>Finds a channel by name (case-insensitive) or by its 1-based position ("2").</summary>
    /// <param name="nameOrPosition">A channel name or a 1-based position.</param>
    /// <returns>The channel, or null when none matches.</returns>
    public CaptureChannel? FindChannel(string nameOrPosition)
    {
        ArgumentNullException.ThrowIfNull(nameOrPosition);
        var index = IndexOfChannel(Channels.Select(c => c.Name).ToList(), nameOrPosition);
        return index < 0 ? null : Channels[index];
    }

    /// <summary>Where <paramref name="nameOrPosition"/> stands among <paramref name="channelNames"/>, by the rule of
    /// <see cref="FindChannel"/>: the name without regard to case, else a 1-based position.</summary>
    /// <param name="channelNames">The channel names in file order.</param>
    /// <param name="nameOrPosition">A channel name (<c>CH2</c>) or position (<c>2</c>).</param>
    /// <returns>The 0-based index, or -1 when no channel matches.</returns>
    public static int IndexOfChannel(IReadOnlyList<string> channelNames, string nameOrPosition)
    {
        ArgumentNullException.ThrowIfNull(channelNames);
        ArgumentNullException.ThrowIfNull(nameOrPosition);
        var name = nameOrPosition.Trim();
        for (var i = 0; i < channelNames.Count; i++)
        {
            if (string.Equals(channelNames[i], name, StringComparison.OrdinalIgnoreCase))
            {
                return i;
            }
        }

        return int.TryParse(nameOrPosition, System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out var position)
            && position >= 1 && position <= channelNames.Count
            ? position - 1
            : -1;
    }
}
