namespace Patchproof.Core.Captures.Calibration;

/// <summary>The relative gains and offsets of a scope's channels, measured with every probe on one node.</summary>
/// <remarks>
/// <para>Each channel c reads y_c = <see cref="ChannelCalibration.OffsetVolts"/> + <see cref="ChannelCalibration.Gain"/> · y_ref,
/// with y_ref the reference channel's reading of the same node; the reference itself has gain 1 and offset 0. Only
/// ratios are measured: the reference probe's own gain error stays unknown (it keeps the probe tolerance).</para>
/// <para>When the capture was a square wave of known amplitude (<see cref="ProbeCalibrationOptions.KnownAmplitudeVolts"/>),
/// <see cref="Absolute"/> also holds the reference channel's own gain, so that every channel's absolute gain is
/// <see cref="AbsoluteGainOf"/> = its relative gain times the reference's.</para>
/// <para>Written and read as the versioned <c>patchproof-probe-calibration</c> JSON file (<see cref="ProbeCalibrationFile"/>,
/// docs/probe-calibration.md).</para>
/// </remarks>
/// <param name="ReferenceChannel">The channel the others are measured against, for example <c>CH1</c>.</param>
/// <param name="Channels">Every channel, the reference first.</param>
/// <param name="SampleCount">Samples used (clipped samples left out).</param>
/// <param name="DurationSeconds">Length of the calibration record.</param>
/// <param name="SourceFiles">The capture files it came from, as named.</param>
/// <param name="CreatedAt">When the calibration was computed.</param>
/// <param name="Note">Free text from the person, for example which node the probes sat on; empty when none.</param>
public sealed record ProbeCalibration(
    string ReferenceChannel,
    IReadOnlyList<ChannelCalibration> Channels,
    int SampleCount,
    double DurationSeconds,
    IReadOnlyList<string> SourceFiles,
    DateTimeOffset CreatedAt,
    string Note)
{
    /// <summary>The file format's name.</summary>
    public const string FormatName = "patchproof-probe-calibration";

    /// <summary>The file format's version; raised on any incompatible change (absolute gains were a compatible addition).</summary>
    public const int FormatVersion = 1;

    /// <summary>The reference channel's absolute gain, measured against a square wave of known amplitude; null for a relative calibration.</summary>
    public KnownAmplitudeReference? Absolute { get; init; }

    /// <summary>True when the gains are absolute: the reference channel's own gain was measured against a known amplitude.</summary>
    public bool IsAbsolute => Absolute is not null;

    /// <summary>A channel's absolute gain (its reading per volt at the probe tip): the relative gain times the reference's absolute gain.</summary>
    /// <param name="channel">One of this calibration's channels.</param>
    /// <returns>The absolute gain, or the relative one when the calibration is relative.</returns>
    public double AbsoluteGainOf(ChannelCalibration channel)
    {
        ArgumentNullException.ThrowIfNull(channel);
        return channel.Gain * (Absolute?.ReferenceGain ?? 1);
    }

    /// <summary>The calibration of a channel by name (case-insensitive), or null.</summary>
    /// <param name="channel">The channel name.</param>
    public ChannelCalibration? Find(string channel) =>
        Channels.FirstOrDefault(c => string.Equals(c.Channel, channel, StringComparison.OrdinalIgnoreCase));
}

/// <summary>One channel's gain and offset relative to the reference channel, with their uncertainty and how well the line fitted.</summary>
/// <param name="Channel">The channel name.</param>
/// <param name="Gain">Its reading per volt of the reference's reading (1 for the reference).</param>
/// <param name="GainSd">Standard deviation of <paramref name="Gain"/> (block jackknife; 0 for the reference).</param>
/// <param name="OffsetVolts">Its reading when the reference reads 0 V (0 for the reference).</param>
/// <param name="OffsetSdVolts">Standard deviation of <paramref name="OffsetVolts"/>.</param>
/// <param name="Correlation">Pearson correlation of the channel with the reference (1 for the reference).</param>
/// <param name="ResidualRmsVolts">RMS of y_c - offset - gain·y_ref.</param>
/// <param name="ExpectedResidualRmsVolts">What that RMS should be if both probes saw one signal: √(σ_c² + gain²·σ_ref²), each σ at least the quantization step / √12.</param>
/// <param name="QuantizationStepVolts">The channel's smallest step between recorded levels.</param>
public sealed record ChannelCalibration(
    string Channel,
    double Gain,
    double GainSd,
    double OffsetVolts,
    double OffsetSdVolts,
    double Correlation,
    double ResidualRmsVolts,
    double ExpectedResidualRmsVolts,
    double QuantizationStepVolts)
{
    /// <summary>ln(<see cref="Gain"/>)'s standard deviation: GainSd / Gain.</summary>
    public double LogGainSd => GainSd / Math.Abs(Gain);
}

/// <summary>The reference channel's absolute gain from a square wave of known peak-to-peak amplitude.</summary>
/// <remarks>Gain = measured step / known step; its sd combines the measurement's (block jackknife and the quantization error
/// the averaging cannot remove, <see cref="SquareWaveLevels"/>) and the amplitude's stated accuracy in quadrature.</remarks>
/// <param name="KnownAmplitudeVolts">The source's peak-to-peak amplitude (high level minus low level), as stated.</param>
/// <param name="KnownAmplitudeRelativeSd">The amplitude's relative accuracy, one standard deviation (0.001 for 0.1 %).</param>
/// <param name="HighLevelVolts">The reference channel's reading of the upper level.</param>
/// <param name="LowLevelVolts">Its reading of the lower level.</param>
/// <param name="MeasuredAmplitudeSdVolts">The sd of the measured step (jackknife and residual quantization), without the amplitude's accuracy.</param>
/// <param name="PlateauSampleCount">Settled samples on both levels together.</param>
/// <param name="ReferenceGain">The reference channel's reading per volt at the probe tip: measured step / known step.</param>
/// <param name="ReferenceGainSd">Its standard deviation, amplitude accuracy included.</param>
public sealed record KnownAmplitudeReference(
    double KnownAmplitudeVolts,
    double KnownAmplitudeRelativeSd,
    double HighLevelVolts,
    double LowLevelVolts,
    double MeasuredAmplitudeSdVolts,
    int PlateauSampleCount,
    double ReferenceGain,
    double ReferenceGainSd)
{
    /// <summary>The measured peak-to-peak step on the reference channel.</summary>
    public double MeasuredAmplitudeVolts => HighLevelVolts - LowLevelVolts;

    /// <summary>ln(<see cref="ReferenceGain"/>)'s standard deviation.</summary>
    public double ReferenceLogGainSd => ReferenceGainSd / Math.Abs(ReferenceGain);

    /// <summary>The reference gain from a measured step: gain = step / known, relative sd √((sd_step / step)² + accuracy²).</summary>
    /// <param name="knownAmplitudeVolts">The known peak-to-peak amplitude.</param>
    /// <param name="knownAmplitudeRelativeSd">Its relative accuracy (one sd).</param>
    /// <param name="levels">The reference channel's measured levels.</param>
    public static KnownAmplitudeReference From(double knownAmplitudeVolts, double knownAmplitudeRelativeSd, SquareWaveMeasurement levels)
    {
        ArgumentNullException.ThrowIfNull(levels);
        var gain = levels.StepVolts / knownAmplitudeVolts;
        var relative = Math.Sqrt(Math.Pow(levels.StepSdVolts / levels.StepVolts, 2) + (knownAmplitudeRelativeSd * knownAmplitudeRelativeSd));
        return new KnownAmplitudeReference(knownAmplitudeVolts, knownAmplitudeRelativeSd, levels.HighLevelVolts, levels.LowLevelVolts, levels.StepSdVolts,
            levels.HighSamples + levels.LowSamples, gain, gain * relative);
    }
}
