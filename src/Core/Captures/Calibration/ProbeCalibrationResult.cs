namespace Patchproof.Core.Captures.Calibration;

/// <summary>How a probe calibration went.</summary>
public enum ProbeCalibrationStatus
{
    /// <summary>Every channel saw one signal; the gains are usable.</summary>
    Calibrated,

    /// <summary>At least one channel did not record the same signal as the reference (another node, a loose ground, a delay or bandwidth difference).</summary>
    NotOneSignal,

    /// <summary>The signal swings over too few quantization steps for a gain to mean anything.</summary>
    TooLittleSignal,

    /// <summary>The capture has fewer than two voltage channels, or too few samples.</summary>
    TooFewChannels,

    /// <summary>An absolute calibration was asked for, but a channel did not record a square wave of two flat levels.</summary>
    NotTwoLevels,

    /// <summary>An absolute calibration was asked for, but too few plateaus or settled samples per level remain once the edges are left out.</summary>
    TooFewPlateauSamples,

    /// <summary>An absolute calibration was asked for, but a channel clipped: a clipped level is not the source's level.</summary>
    LevelsClipped,
}

/// <summary>The outcome of a probe calibration: the measured gains (also when a check failed, so a person can see why) and the findings.</summary>
/// <param name="Status">Whether the calibration is usable.</param>
/// <param name="Calibration">The measured gains and offsets; null when nothing could be measured.</param>
/// <param name="Findings">What a person should know, one sentence each; the reason when <paramref name="Status"/> is not <see cref="ProbeCalibrationStatus.Calibrated"/>.</param>
public sealed record ProbeCalibrationResult(ProbeCalibrationStatus Status, ProbeCalibration? Calibration, IReadOnlyList<string> Findings)
{
    /// <summary>True when the calibration may be written and used.</summary>
    public bool IsUsable => Status is ProbeCalibrationStatus.Calibrated && Calibration is not null;
}
