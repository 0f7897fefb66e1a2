namespace Patchproof.Core.Captures.Checks;

/// <summary>Finds channels pinned at the top or bottom of their recorded range: the scope's window or an op-amp clipped them.</summary>
/// <remarks>
/// For the highest value (and likewise the lowest): n_top samples sit exactly at it, the longest run there is
/// r samples, and n_next samples sit at the next value inside. The channel is clipped there when r is at least
/// <see cref="MinimumRun"/>, n_top / N at least <see cref="MinimumFraction"/>, and n_top at least
/// <see cref="PeakRatio"/> n_next. A smooth peak read by a quantizing scope also dwells on its top level, but
/// only about 2.4 times as long as on the level below (the dwell grows as the square root of the depth below a
/// parabolic peak), so the ratio of 4 separates the two.
/// When the metadata states the channel's screen window (<see cref="ScopeWindow"/>) and the samples fit inside it, a
/// level farther than <see cref="EdgeFraction"/> of the window's height from both edges is not a clip: a signal that
/// rests near a floor for long stretches (a Rössler z between its spikes, within one quantization step) dwells on
/// its lowest level as a clipped one would.
/// </remarks>
public sealed class ClippingCheck : ICaptureCheck
{
    /// <summary>Shortest run at the extreme that counts.</summary>
    public const int MinimumRun = 5;

    /// <summary>Smallest fraction of the record at the extreme that counts.</summary>
    public const double MinimumFraction = 0.002;

    /// <summary>How many times more samples the extreme holds than the next level inside.</summary>
    public const double PeakRatio = 4;

    /// <summary>How close to a stated window edge, as a fraction of its height, a level must be to count as clipped.</summary>
    public const double EdgeFraction = 0.02;

    /// <inheritdoc/>
    public string Id => "clipping";

    /// <inheritdoc/>
    public IEnumerable<CaptureCheckResult> Run(Capture capture, CaptureCheckContext context)
    {
        ArgumentNullException.ThrowIfNull(capture);
        foreach (var channel in capture.Channels)
        {
            var length = channel.SampleCount;
            if (length < MinimumRun)
            {
                continue;
            }

            var (_, _, min, max) = ChannelStatistics.Moments(channel.Samples.Span);
            if (min == max)
            {
                continue;
            }

            var window = ScopeWindow.TryRead(capture.Metadata, channel.Name, min, max);
            foreach (var top in new[] { true, false })
            {
                var level = (float)(top ? max : min);
                if (window is not null && !window.IsAtEdge(level, EdgeFraction))
                {
                    continue;
                }

                var (count, longest, runs, next) = Examine(channel.Samples.Span, level, top);
                var fraction = (double)count / length;
                if (longest >= MinimumRun && fraction >= MinimumFraction && count >= PeakRatio * Math.Max(1, next))
                {
                    var side = top ? "top" : "bottom";
                    yield return new CaptureCheckResult(Id, DiagnosticSeverity.Warning, channel.Name,
                        $"{channel.Name} sits at its {side} value {CheckText.Volts(level, channel.Unit)} for {CheckText.Percent(fraction)} of the record (longest run {longest} samples): the signal was clipped by the scope's vertical range or by an op-amp at its rail; widen the volts/div or check the board's swing before fitting.",
                        new Dictionary<string, double>
                        {
                            ["levelVolts"] = level,
                            ["fractionAtLevel"] = fraction,
                            ["longestRunSamples"] = longest,
                            ["runs"] = runs,
                            ["samplesAtNextLevel"] = next,
                        });
                }
            }
        }
    }

    private static (int Count, int Longest, int Runs, int Next) Examine(ReadOnlySpan<float> x, float level, bool top)
    {
        int count = 0, longest = 0, runs = 0, current = 0;
        var next = top ? float.NegativeInfinity : float.PositiveInfinity;
        foreach (var v in x)
        {
            if (v == level)
            {
                count++;
                current++;
                if (current == 1)
                {
                    runs++;
                }

                longest = Math.Max(longest, current);
            }
            else
            {
                current = 0;
                next = top ? Math.Max(next, v) : Math.Min(next, v);
            }
        }

        var nextCount = 0;
        foreach (var v in x)
        {
            if (v == next)
            {
                nextCount++;
            }
        }

        return (count, longest, runs, nextCount);
    }
}
