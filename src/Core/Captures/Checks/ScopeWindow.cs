using System.Globalization;

namespace Patchproof.Core.Captures.Checks;

/// <summary>A channel's vertical window on the scope screen, when the capture's metadata states it.</summary>
/// <remarks>
/// <para>Keys recognised (case-insensitive): <c>&lt;channel&gt; V/div</c>, <c>&lt;channel&gt; volts/div</c> or
/// <c>&lt;channel&gt; scale</c> for the volts per division, and <c>&lt;channel&gt; position</c> or
/// <c>&lt;channel&gt; offset</c> for the voltage at the screen's centre; values in V (or mV when the value or its
/// unit says so). The screen is taken to be 8 divisions high (common practice for bench scopes, from memory).</para>
/// <para>Scopes differ in how they define position and offset, so a window is used only when it agrees with the
/// recording: every sample inside it. Otherwise <see cref="TryRead"/> gives null and nothing is inferred.</para>
/// </remarks>
/// <param name="LowVolts">The bottom of the screen.</param>
/// <param name="HighVolts">The top of the screen.</param>
public sealed record ScopeWindow(double LowVolts, double HighVolts)
{
    /// <summary>Divisions on the screen's height.</summary>
    public const int Divisions = 8;

    /// <summary>The window of <paramref name="channel"/>, when the metadata states one that fits the samples.</summary>
    /// <param name="metadata">The capture's metadata.</param>
    /// <param name="channel">The channel name, for example <c>CH3</c>.</param>
    /// <param name="minVolts">The channel's lowest sample.</param>
    /// <param name="maxVolts">The channel's highest sample.</param>
    /// <returns>The window, or null.</returns>
    public static ScopeWindow? TryRead(IReadOnlyList<MetadataEntry> metadata, string channel, double minVolts, double maxVolts)
    {
        ArgumentNullException.ThrowIfNull(metadata);
        var perDivision = Find(metadata, channel, ["V/div", "volts/div", "scale"]);
        var centre = Find(metadata, channel, ["position", "offset"]);
        if (perDivision is not > 0 || centre is not { } middle)
        {
            return null;
        }

        var half = Divisions / 2.0 * perDivision.Value;
        var window = new ScopeWindow(middle - half, middle + half);
        var slack = 1e-6 * half;
        return minVolts >= window.LowVolts - slack && maxVolts <= window.HighVolts + slack ? window : null;
    }

    /// <summary>True when <paramref name="volts"/> lies within <paramref name="fraction"/> of the window's height of one of its edges.</summary>
    /// <param name="volts">The level.</param>
    /// <param name="fraction">The margin as a fraction of the height.</param>
    /// <returns>Whether the level is at an edge.</returns>
    public bool IsAtEdge(double volts, double fraction) =>
        volts <= LowVolts + fraction * (HighVolts - LowVolts) || volts >= HighVolts - fraction * (HighVolts - LowVolts);

    private static double? Find(IReadOnlyList<MetadataEntry> metadata, string channel, string[] suffixes)
    {
        foreach (var entry in metadata)
        {
            foreach (var suffix in suffixes)
            {
                if (!string.Equals(entry.Key.Trim(), $"{channel} {suffix}", StringComparison.OrdinalIgnoreCase))
                {
                    continue;
                }

                var text = entry.Value.Trim();
                var scale = 1.0;
                if (text.EndsWith("mV", StringComparison.OrdinalIgnoreCase) || string.Equals(entry.Unit, "mV", StringComparison.OrdinalIgnoreCase))
                {
                    scale = 1e-3;
                }

                text = text.TrimEnd('V', 'v', ' ').TrimEnd('m', ' ');
                if (double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out var value))
                {
                    return value * scale;
                }
            }
        }

        return null;
    }
}
