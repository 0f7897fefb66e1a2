namespace Patchproof.Client.Models;

/// <summary>A bench's probe calibration as the bench page shows it: the gain of each channel against the reference, with
/// its uncertainty and its one-signal check.</summary>
/// <param name="BenchId">The bench.</param>
/// <param name="ReferenceChannel">The channel the others are measured against.</param>
/// <param name="CreatedAt">When the calibration was computed.</param>
/// <param name="UploadedAt">When the server stored it; fits use the newest upload.</param>
/// <param name="Note">Free text, for example the node the probes sat on; empty when none.</param>
/// <param name="SampleCount">Samples used (clipped ones left out).</param>
/// <param name="DurationSeconds">Length of the calibration record.</param>
/// <param name="SourceFiles">The capture files it came from.</param>
/// <param name="Channels">Each channel, the reference first.</param>
/// <param name="Findings">What a person should know, one sentence each.</param>
public sealed record ProbeCalibrationView(
    Guid BenchId,
    string ReferenceChannel,
    DateTimeOffset CreatedAt,
    DateTimeOffset UploadedAt,
    string Note,
    int SampleCount,
    double DurationSeconds,
    IReadOnlyList<string> SourceFiles,
    IReadOnlyList<ProbeChannelView> Channels,
    IReadOnlyList<string> Findings)
{
    /// <summary>For an absolute calibration (every probe on a square wave of known amplitude), the amplitude and the reference
    /// channel's absolute gain; null for a relative one.</summary>
    public KnownAmplitudeView? KnownAmplitude { get; init; }

    /// <summary>The one-signal check over every channel: false when one failed, true when all passed, null when the file does not record it.</summary>
    public bool? PassesOneSignalCheck
    {
        get
        {
            var checks = Channels.Where(c => !c.IsReference).Select(c => c.FollowsReference).ToList();
            return checks.Any(c => c == false) ? false : checks.Count > 0 && checks.All(c => c == true) ? true : null;
        }
    }
}

/// <summary>One channel of a probe calibration.</summary>
/// <param name="Channel">The channel name, for example "CH2".</param>
/// <param name="IsReference">True for the reference channel (gain 1 by definition).</param>
/// <param name="Gain">Its reading per volt of the reference's reading.</param>
/// <param name="GainSd">Standard deviation of <paramref name="Gain"/>.</param>
/// <param name="OffsetVolts">Its reading when the reference reads 0 V.</param>
/// <param name="OffsetSdVolts">Standard deviation of <paramref name="OffsetVolts"/>.</param>
/// <param name="Correlation">Correlation with the reference.</param>
/// <param name="ResidualRmsVolts">RMS misfit to the line against the reference.</param>
/// <param name="ExpectedResidualRmsVolts">What that misfit should be if both probes saw one signal.</param>
/// <param name="FollowsReference">The one-signal check: true passed, false failed, null not applicable or not recorded.</param>
public sealed record ProbeChannelView(
    string Channel,
    bool IsReference,
    double Gain,
    double GainSd,
    double OffsetVolts,
    double OffsetSdVolts,
    double Correlation,
    double ResidualRmsVolts,
    double ExpectedResidualRmsVolts,
    bool? FollowsReference)
{
    /// <summary>(Gain - 1) in percent.</summary>
    public double GainDeviationPercent => 100 * (Gain - 1);

    /// <summary>The gain's standard deviation in percent of the gain.</summary>
    public double GainSdPercent => Gain == 0 ? double.NaN : 100 * GainSd / Math.Abs(Gain);
}

/// <summary>The gain a fit assumed for one channel and where it came from.</summary>
/// <param name="Channel">The channel.</param>
/// <param name="Variable">The variable it records.</param>
/// <param name="Sign">+1, or -1 when recorded inverted.</param>
/// <param name="Gain">The relative gain the fit divided the channel by (1 when uncalibrated).</param>
/// <param name="GainSdPercent">The prior standard deviation the diagnosis gave that gain, in percent.</param>
/// <param name="GainSource">Where the gain came from, in words.</param>
/// <param name="IsCalibrated">True when the gain came from a probe calibration.</param>
public sealed record ChannelGainView(string Channel, string Variable, int Sign, double Gain, double GainSdPercent, string GainSource, bool IsCalibrated);

/// <summary>The square wave an absolute calibration was measured against, and what it gave the reference channel.</summary>
/// <param name="AmplitudeVolts">The stated peak-to-peak amplitude.</param>
/// <param name="AmplitudeRelativeSd">Its stated relative accuracy, one sd.</param>
/// <param name="ReferenceGain">The reference channel's absolute gain.</param>
/// <param name="ReferenceGainSd">Its sd, the amplitude's accuracy included.</param>
public sealed record KnownAmplitudeView(double AmplitudeVolts, double AmplitudeRelativeSd, double ReferenceGain, double ReferenceGainSd);

/// <summary>What a person gives with a calibration capture besides the file.</summary>
/// <param name="Note">Free text kept with the calibration, for example which node the probes sat on; null for none.</param>
/// <param name="KnownAmplitude">For a square wave of known amplitude, its peak to peak as written (<c>10V</c>); null for a relative calibration.</param>
/// <param name="AmplitudeAccuracy">The amplitude's relative accuracy as written (<c>0.1%</c>); needed with <paramref name="KnownAmplitude"/>.</param>
public sealed record CalibrationCaptureDetails(string? Note, string? KnownAmplitude = null, string? AmplitudeAccuracy = null);
