namespace Patchproof.Core.Captures.Checks;

/// <summary>A model-aware check: a channel whose variable must have a non-zero mean but averages zero was AC coupled.</summary>
/// <remarks>
/// Acts only on the <see cref="CaptureCheckContext.Expectations"/> with MustHaveNonZeroMean (for example Lorenz z,
/// whose mean over the attractor is about 23.5 in problem units). It warns when |mean| &lt; <see cref="RelativeMean"/>
/// times the rms about the mean: an AC-coupled scope input removes the mean, leaving a trace centred on 0 V.
/// </remarks>
public sealed class AcCouplingCheck : ICaptureCheck
{
    /// <summary>|mean| / rms about the mean below which the mean counts as zero.</summary>
    public const double RelativeMean = 0.05;

    /// <inheritdoc/>
    public string Id => "ac-coupling";

    /// <inheritdoc/>
    public IEnumerable<CaptureCheckResult> Run(Capture capture, CaptureCheckContext context)
    {
        ArgumentNullException.ThrowIfNull(capture);
        ArgumentNullException.ThrowIfNull(context);
        foreach (var expectation in context.Expectations.Where(e => e.MustHaveNonZeroMean))
        {
            if (capture.FindChannel(expectation.Channel) is not { SampleCount: > 0 } channel)
            {
                continue;
            }

            var (mean, rms, _, _) = ChannelStatistics.Moments(channel.Samples.Span);
            if (rms > 0 && Math.Abs(mean) < RelativeMean * rms)
            {
                yield return new CaptureCheckResult(Id, DiagnosticSeverity.Warning, channel.Name,
                    $"{channel.Name} ({expectation.Variable}) averages {CheckText.Volts(mean, channel.Unit)}, but {expectation.Variable} cannot average zero on this system: the scope input looks AC coupled; switch {channel.Name} to DC coupling and capture again.",
                    new Dictionary<string, double> { ["meanVolts"] = mean, ["rmsVolts"] = rms, ["meanOverRms"] = mean / rms });
            }
        }
    }
}
