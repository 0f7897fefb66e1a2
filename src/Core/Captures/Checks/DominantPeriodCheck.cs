namespace Patchproof.Core.Captures.Checks;

/// <summary>Checks sampling against each channel's dominant period: enough samples per period, and enough periods in the record.</summary>
/// <remarks>
/// With the dominant frequency f (see DominantFrequency) and typical interval dt: samples per period = 1 / (f dt)
/// (id <c>samples-per-period</c>, warning below <see cref="MinimumSamplesPerPeriod"/>: derivatives of a signal
/// sampled more coarsely lose accuracy quickly; common practice), and periods in the record = duration * f (id
/// <c>record-length</c>, warning below <see cref="MinimumPeriods"/>: too few oscillations to identify a system;
/// common practice).
/// </remarks>
public sealed class DominantPeriodCheck : ICaptureCheck
{
    /// <summary>Samples per dominant period below which the check warns.</summary>
    public const double MinimumSamplesPerPeriod = 20;

    /// <summary>Dominant periods in the record below which the check warns.</summary>
    public const double MinimumPeriods = 10;

    /// <inheritdoc/>
    public string Id => "samples-per-period";

    /// <inheritdoc/>
    public IEnumerable<CaptureCheckResult> Run(Capture capture, CaptureCheckContext context)
    {
        ArgumentNullException.ThrowIfNull(capture);
        var dt = capture.TimeBase.TypicalIntervalSeconds;
        var duration = capture.TimeBase.DurationSeconds;
        foreach (var channel in capture.Channels)
        {
            if (DominantFrequency.Find(channel.Samples.Span, dt) is not { } f)
            {
                continue;
            }

            var perPeriod = 1 / (f * dt);
            var periods = duration * f;
            var values = new Dictionary<string, double>
            {
                ["dominantFrequencyHertz"] = f,
                ["samplesPerPeriod"] = perPeriod,
                ["periodsInRecord"] = periods,
            };
            yield return perPeriod < MinimumSamplesPerPeriod
                ? new CaptureCheckResult(Id, DiagnosticSeverity.Warning, channel.Name,
                    $"{channel.Name} has only {CheckText.Number(perPeriod, "F1")} samples per period of its dominant frequency {CheckText.Hertz(f)}: raise the sample rate (a shorter time/div) to at least {CheckText.Number(MinimumSamplesPerPeriod, "F0")} samples per period.", values)
                : new CaptureCheckResult(Id, DiagnosticSeverity.Info, channel.Name,
                    $"{channel.Name} has {CheckText.Number(perPeriod, "F0")} samples per period of its dominant frequency {CheckText.Hertz(f)}.", values);
            yield return periods < MinimumPeriods
                ? new CaptureCheckResult("record-length", DiagnosticSeverity.Warning, channel.Name,
                    $"The record holds only {CheckText.Number(periods, "F1")} periods of {channel.Name}'s dominant frequency: too few to identify the system; record longer (a longer time/div or a deeper memory).", values)
                : new CaptureCheckResult("record-length", DiagnosticSeverity.Info, channel.Name,
                    $"The record holds {CheckText.Number(periods, "F0")} periods of {channel.Name}'s dominant frequency.", values);
        }
    }
}
