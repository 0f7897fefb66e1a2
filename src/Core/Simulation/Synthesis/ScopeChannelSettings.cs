namespace Patchproof.Core.Simulation.Synthesis;

/// <summary>One scope channel of a synthetic capture: which board node it probes and how the scope sees it.</summary>
/// <remarks>The recorded value is y = Quantize(ProbeSign * ProbeGain * V + ProbeOffsetVolts + noise):
/// quantized to 2^Bits levels over the window [center - span/2, center + span/2], and clipped to the
/// window's ends (a too-tight window clips the trace).</remarks>
/// <param name="Name">The channel name in the file, for example <c>CH1</c>.</param>
/// <param name="Variable">The board variable probed.</param>
/// <param name="ProbeSign">+1, or -1 for a probe on the inverted node.</param>
/// <param name="ProbeGain">The probe and channel gain, nominally 1.</param>
/// <param name="ProbeOffsetVolts">The channel's offset, volts.</param>
/// <param name="WindowCenterVolts">The centre of the scope's vertical window, volts.</param>
/// <param name="WindowSpanVolts">The window's full span, volts (8 divisions at 2.5 V/div is 20 V).</param>
/// <param name="Bits">The converter's resolution, 8 on most scopes.</param>
public sealed record ScopeChannelSettings(
    string Name,
    string Variable,
    int ProbeSign = 1,
    double ProbeGain = 1,
    double ProbeOffsetVolts = 0,
    double WindowCenterVolts = 0,
    double WindowSpanVolts = 25,
    int Bits = 8)
{
    /// <summary>The quantization step, volts: span / (2^bits - 1).</summary>
    public double StepVolts => WindowSpanVolts / ((1 << Bits) - 1);
}
