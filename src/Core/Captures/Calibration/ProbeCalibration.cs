namespace Patchproof.Core.Captures.Calibration;

/// <summary>The relative gains and offsets of a scope's channels, measured with every probe on one node.</summary>
/// <remarks>
/// <para>Each channel c reads y_c = <see cref="ChannelCalibration.OffsetVolts"/> + <see cref="ChannelCalibration.Gain"/> · y_ref,
/// with y_ref the reference channel's reading of the same node; the reference itself has gain 1 and offset 0. Only
/// ratios are measured: the reference probe's own gain error stays unknown (it keeps the probe tolerance).</para>
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

    /// <summary>The file format's version; raised on any incompatible change.</summary>
    public const int FormatVersion = 1;

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
