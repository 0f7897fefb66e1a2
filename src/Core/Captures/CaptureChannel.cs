namespace Patchproof.Core.Captures;

/// <summary>One recorded signal of a capture, with where it came from.</summary>
/// <remarks>
/// Samples are stored as float32 (enough for 8 to 12 bit scope data); compute on them in double.
/// They are in SI units: volts for every voltage channel (millivolts in the file are converted), with the
/// probe factor the person gave already applied. A channel whose unit is not a voltage keeps its unit
/// text in <see cref="Unit"/> unconverted. The memory is shared, not copied; do not change the array behind it.
/// </remarks>
/// <param name="Name">The channel's name as the file gave it (or CH1, CH2... when the file had no header).</param>
/// <param name="Unit">The unit of <see cref="Samples"/>: "V" for voltages.</param>
/// <param name="Samples">One value per sample of the capture's time base.</param>
/// <param name="SourceFile">The file the channel was read from, as the person named it, or null.</param>
/// <param name="SourceColumn">The 1-based column of the file that held the channel; 0 when not read from a file.</param>
/// <param name="ProbeFactor">The probe attenuation the person stated and the reader applied (10 for a x10 probe); 1 when none.</param>
public sealed record CaptureChannel(string Name, string Unit, ReadOnlyMemory<float> Samples, string? SourceFile, int SourceColumn, double ProbeFactor = 1)
{
    /// <summary>Number of samples.</summary>
    public int SampleCount => Samples.Length;

    /// <summary>True when the samples are in volts.</summary>
    public bool IsVoltage => Unit == "V";
}
