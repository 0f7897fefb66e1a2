namespace Patchproof.Core.Captures.Calibration;

/// <summary>Settings of a probe calibration.</summary>
public sealed record ProbeCalibrationOptions
{
    /// <summary>The reference channel's name; null for the capture's first channel.</summary>
    public string? ReferenceChannel { get; init; }

    /// <summary>Contiguous blocks of the block jackknife behind the standard deviations. Default 20.</summary>
    public int JackknifeBlocks { get; init; } = 20;

    /// <summary>A residual RMS above this many times the expected one means the probes did not see one signal. Default 3.</summary>
    public double ResidualRatioLimit { get; init; } = 3;

    /// <summary>A correlation with the reference below this means the probes did not see one signal. Default 0.99.</summary>
    public double MinimumCorrelation { get; init; } = 0.99;

    /// <summary>The reference must swing over at least this many quantization steps (standard deviation) for a usable gain. Default 10.</summary>
    public double MinimumSignalSteps { get; init; } = 10;

    /// <summary>A gain further than this from 1 gets a warning about the channels' probe-factor settings. Default 0.1.</summary>
    public double GainWarningDistance { get; init; } = 0.1;

    /// <summary>The peak-to-peak amplitude (high level minus low level) of the square wave every probe recorded, when it is
    /// known: the calibration then also measures the reference channel's absolute gain. Null (the default) for a relative
    /// calibration, exactly as without it.</summary>
    public double? KnownAmplitudeVolts { get; init; }

    /// <summary>The known amplitude's relative accuracy as one standard deviation, for example 0.001 for 0.1 % (a ± limit stated
    /// as a worst case becomes limit / √3, JCGM 100:2008 section 4.3.7). Used only with <see cref="KnownAmplitudeVolts"/>.</summary>
    public double KnownAmplitudeRelativeSd { get; init; }

    /// <summary>How the square wave's levels are found (edge guard, plateau limits); its jackknife blocks are <see cref="JackknifeBlocks"/>.</summary>
    public SquareWaveLevelOptions Levels { get; init; } = new();

    /// <summary>Free text stored with the calibration, for example the node the probes sat on.</summary>
    public string Note { get; init; } = "";
}
