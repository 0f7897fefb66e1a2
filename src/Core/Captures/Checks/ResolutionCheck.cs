namespace Patchproof.Core.Captures.Checks;

/// <summary>Reports the vertical resolution of each channel: distinct levels, the quantization step, the effective bits over the swing.</summary>
/// <remarks>
/// Levels and the step come from up to 2^20 evenly spread samples. A channel counts as quantized when its
/// distinct values are at most a quarter of the samples examined; the step is then the smallest gap between
/// two distinct values, and the effective bits over the swing are log2((max - min) / step + 1). Fewer than
/// <see cref="MinimumBits"/> bits is a warning (common practice: a signal should fill most of the screen of an
/// 8-bit scope). A channel with one value is an error (nothing recorded).
/// </remarks>
public sealed class ResolutionCheck : ICaptureCheck
{
    /// <summary>Effective bits over the signal's swing below which the check warns.</summary>
    public const double MinimumBits = 6;

    /// <inheritdoc/>
    public string Id => "resolution";

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

            var x = channel.Samples.Span;
            var (_, _, min, max) = ChannelStatistics.Moments(x);
            var (distinct, examined, step) = ChannelStatistics.Levels(x);
            if (distinct == 1)
            {
                yield return new CaptureCheckResult(Id, DiagnosticSeverity.Error, channel.Name,
                    $"{channel.Name} holds the single value {CheckText.Volts(min, channel.Unit)}: nothing was recorded; check the probe and the channel's coupling.",
                    new Dictionary<string, double> { ["distinctLevels"] = 1, ["levelVolts"] = min });
                continue;
            }

            if (distinct * 4 > examined)
            {
                yield return new CaptureCheckResult(Id, DiagnosticSeverity.Info, channel.Name,
                    $"{channel.Name} shows no quantization step ({distinct} distinct values in {examined}): resolution is not a concern.",
                    new Dictionary<string, double> { ["distinctLevels"] = distinct, ["samplesExamined"] = examined });
                continue;
            }

            var bits = Math.Log2(((max - min) / step) + 1);
            var values = new Dictionary<string, double>
            {
                ["distinctLevels"] = distinct,
                ["samplesExamined"] = examined,
                ["stepMillivolts"] = step * 1e3,
                ["effectiveBits"] = bits,
            };
            yield return bits < MinimumBits
                ? new CaptureCheckResult(Id, DiagnosticSeverity.Warning, channel.Name,
                    $"{channel.Name} uses only {distinct} levels in steps of {CheckText.Volts(step, channel.Unit)} (about {CheckText.Number(bits, "F1")} bits over its swing): set a smaller volts/div so the signal fills most of the screen.", values)
                : new CaptureCheckResult(Id, DiagnosticSeverity.Info, channel.Name,
                    $"{channel.Name} uses {distinct} levels in steps of {CheckText.Volts(step, channel.Unit)} (about {CheckText.Number(bits, "F1")} bits over its swing).", values);
        }
    }
}
