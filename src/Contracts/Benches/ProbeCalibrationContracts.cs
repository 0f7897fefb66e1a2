namespace Patchproof.Contracts.Benches;

/// <summary>A probe calibration the server keeps for a bench: what <c>POST /api/benches/{benchId}/probe-calibrations</c> stored,
/// and each entry of <c>GET /api/benches/{benchId}/probe-calibrations</c>.</summary>
/// <param name="BenchId">The bench.</param>
/// <param name="ReferenceChannel">The calibration's reference channel.</param>
/// <param name="Channels">The channels it calibrates.</param>
/// <param name="CreatedAt">When the calibration was computed (from the file).</param>
/// <param name="UploadedAt">When the server stored it; fits of the bench's boards use the newest upload.</param>
public sealed record ProbeCalibrationSummary(Guid BenchId, string ReferenceChannel, IReadOnlyList<string> Channels, DateTimeOffset CreatedAt, DateTimeOffset UploadedAt)
{
    /// <summary>Free text stored with the calibration, for example the node the probes sat on; empty when none.</summary>
    public string Note { get; init; } = "";

    /// <summary>Samples the calibration used (clipped ones left out).</summary>
    public int SampleCount { get; init; }

    /// <summary>Length of the calibration record in seconds.</summary>
    public double DurationSeconds { get; init; }

    /// <summary>The capture files it came from, as named.</summary>
    public IReadOnlyList<string> SourceFiles { get; init; } = [];

    /// <summary>Each channel's gain and offset with their uncertainty and its one-signal check, the reference first.</summary>
    public IReadOnlyList<ProbeChannelCalibrationSummary> ChannelDetails { get; init; } = [];

    /// <summary>What a person should know about the calibration, one sentence each (for example a gain far from 1).</summary>
    public IReadOnlyList<string> Findings { get; init; } = [];

    /// <summary>For an absolute calibration (every probe on a square wave of known amplitude), the amplitude and the reference
    /// channel's absolute gain; null for a relative one, whose reference gain stays unknown.</summary>
    public ProbeCalibrationKnownAmplitudeSummary? KnownAmplitude { get; init; }
}

/// <summary>The known amplitude an absolute probe calibration was measured against, and what the reference channel read.</summary>
/// <param name="AmplitudeVolts">The source's stated peak-to-peak amplitude.</param>
/// <param name="AmplitudeRelativeSd">Its stated relative accuracy, one standard deviation (0.001 for 0.1 %).</param>
/// <param name="HighLevelVolts">The reference channel's reading of the upper level.</param>
/// <param name="LowLevelVolts">Its reading of the lower level.</param>
/// <param name="ReferenceGain">The reference channel's absolute gain: measured step / known amplitude. A channel's absolute gain is its <c>gain</c> times this.</param>
/// <param name="ReferenceGainSd">Its standard deviation, the amplitude's accuracy included.</param>
public sealed record ProbeCalibrationKnownAmplitudeSummary(
    double AmplitudeVolts,
    double AmplitudeRelativeSd,
    double HighLevelVolts,
    double LowLevelVolts,
    double ReferenceGain,
    double ReferenceGainSd);

/// <summary>One channel of a probe calibration as the server shows it.</summary>
/// <param name="Channel">The channel name, for example <c>CH2</c>.</param>
/// <param name="IsReference">True for the channel the others are measured against (gain 1 by definition).</param>
/// <param name="Gain">Its reading per volt of the reference's reading.</param>
/// <param name="GainSd">Standard deviation of <paramref name="Gain"/>.</param>
/// <param name="OffsetVolts">Its reading when the reference reads 0 V.</param>
/// <param name="OffsetSdVolts">Standard deviation of <paramref name="OffsetVolts"/>.</param>
/// <param name="Correlation">Correlation with the reference.</param>
/// <param name="ResidualRmsVolts">RMS of the channel's misfit to the line against the reference.</param>
/// <param name="ExpectedResidualRmsVolts">What that RMS should be if both probes saw one signal.</param>
/// <param name="FollowsReference">The one-signal check: true when the channel saw the reference's signal, false when not,
/// null for the reference itself or when the file does not record the figures the check needs.</param>
public sealed record ProbeChannelCalibrationSummary(
    string Channel,
    bool IsReference,
    double Gain,
    double GainSd,
    double OffsetVolts,
    double OffsetSdVolts,
    double Correlation,
    double ResidualRmsVolts,
    double ExpectedResidualRmsVolts,
    bool? FollowsReference);
