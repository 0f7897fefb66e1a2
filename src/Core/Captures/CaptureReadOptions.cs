namespace Patchproof.Core.Captures;

/// <summary>What a person states about a capture that the file cannot say: probe factors and units.</summary>
/// <remarks>
/// Keys name a channel by its name (case-insensitive) or 1-based position ("2"). A probe factor is the
/// attenuation the scope did not know about (10 for a x10 probe read on a x1 setting); samples are
/// multiplied by it. A unit ("mV", "V", "uV") applies to a channel whose file gives none, and replaces
/// the file's unit, with a warning, when the two differ. The default states nothing.
/// </remarks>
public sealed record CaptureReadOptions
{
    /// <summary>The default: no probe factors, no units.</summary>
    public static CaptureReadOptions Default { get; } = new();

    /// <summary>Probe factor per channel, each finite and greater than 0.</summary>
    public IReadOnlyDictionary<string, double> ProbeFactors { get; init; } = new Dictionary<string, double>();

    /// <summary>Unit per channel, for files that give none.</summary>
    public IReadOnlyDictionary<string, string> ChannelUnits { get; init; } = new Dictionary<string, string>();
}
