namespace Patchproof.Core.Captures.Checks;

/// <summary>Estimates each channel's noise floor and its ratio to the signal.</summary>
/// <remarks>
/// Noise rms sigma from the median absolute deviation of second differences (see ChannelStatistics: for white
/// noise var(d) = 6 sigma^2, and the median ignores edges and curvature). SNR = 20 log10(rms about the mean / sigma)
/// in dB. Below <see cref="MinimumSnrDecibels"/> dB is a warning (common practice for derivative-based fitting).
/// When sigma is 0 the noise is below one quantization step.
/// </remarks>
public sealed class NoiseFloorCheck : ICaptureCheck
{
    /// <summary>Signal-to-noise ratio in dB below which the check warns.</summary>
    public const double MinimumSnrDecibels = 20;

    /// <inheritdoc/>
    public string Id => "noise-floor";

    /// <inheritdoc/>
    public IEnumerable<CaptureCheckResult> Run(Capture capture, CaptureCheckContext context)
    {
        ArgumentNullException.ThrowIfNull(capture);
        foreach (var channel in capture.Channels)
        {
            var x = channel.Samples.Span;
            if (x.Length < 3)
            {
                continue;
            }

            var (_, rms, _, _) = ChannelStatistics.Moments(x);
            var noise = ChannelStatistics.NoiseRms(x);
            if (noise == 0)
            {
                yield return new CaptureCheckResult(Id, DiagnosticSeverity.Info, channel.Name,
                    $"{channel.Name}: noise is below one quantization step.",
                    new Dictionary<string, double> { ["noiseRmsMillivolts"] = 0, ["signalRmsVolts"] = rms });
                continue;
            }

            var snr = rms > 0 ? 20 * Math.Log10(rms / noise) : double.NegativeInfinity;
            var values = new Dictionary<string, double>
            {
                ["noiseRmsMillivolts"] = noise * 1e3,
                ["signalRmsVolts"] = rms,
                ["snrDecibels"] = double.IsFinite(snr) ? snr : -999,
            };
            yield return snr < MinimumSnrDecibels
                ? new CaptureCheckResult(Id, DiagnosticSeverity.Warning, channel.Name,
                    $"{channel.Name} is noisy: {CheckText.Volts(noise, channel.Unit)} rms of noise against {CheckText.Volts(rms, channel.Unit)} rms of signal ({CheckText.Number(snr, "F1")} dB); check the probe ground lead, use the scope's averaging or a higher volts/div resolution.", values)
                : new CaptureCheckResult(Id, DiagnosticSeverity.Info, channel.Name,
                    $"{channel.Name} has {CheckText.Volts(noise, channel.Unit)} rms of noise ({CheckText.Number(snr, "F1")} dB below the signal).", values);
        }
    }
}
