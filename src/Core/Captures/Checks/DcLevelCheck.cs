namespace Patchproof.Core.Captures.Checks;

/// <summary>Reports each channel's DC level (mean), range and rms about the mean.</summary>
/// <remarks>Always info (id <c>dc-level</c>): mean = (1/N) sum x_i, rms = sqrt((1/N) sum (x_i - mean)^2), in the channel's unit (volts).</remarks>
public sealed class DcLevelCheck : ICaptureCheck
{
    /// <inheritdoc/>
    public string Id => "dc-level";

    /// <inheritdoc/>
    public IEnumerable<CaptureCheckResult> Run(Capture capture, CaptureCheckContext context)
    {
        ArgumentNullException.ThrowIfNull(capture);
        foreach (var channel in capture.Channels)
        {
            if (channel.SampleCount == 0)
            {
                continue;
            }

            var (mean, rms, min, max) = ChannelStatistics.Moments(channel.Samples.Span);
            yield return new CaptureCheckResult(Id, DiagnosticSeverity.Info, channel.Name,
                $"{channel.Name} averages {CheckText.Volts(mean, channel.Unit)} and swings from {CheckText.Volts(min, channel.Unit)} to {CheckText.Volts(max, channel.Unit)} ({CheckText.Volts(rms, channel.Unit)} rms about its mean).",
                new Dictionary<string, double> { ["meanVolts"] = mean, ["minVolts"] = min, ["maxVolts"] = max, ["rmsVolts"] = rms });
        }
    }
}
