namespace Patchproof.Core.Reports;

/// <summary>Settings of a board fit.</summary>
public sealed record BoardFitOptions
{
    /// <summary>Which channel records which variable; empty to take the channels in order for the design's variables, sign +1.</summary>
    public IReadOnlyList<ChannelAssignment> Mapping { get; init; } = [];

    /// <summary>The probes' gain tolerance when no calibration is given; about 2 % for ordinary 10x probes (common practice).</summary>
    public double ProbeGainTolerance { get; init; } = 0.02;

    /// <summary>Per-channel log-gain sd from a calibration capture, overriding <see cref="ProbeGainTolerance"/> for those channels.</summary>
    public IReadOnlyDictionary<string, double> CalibratedGainSd { get; init; } = new Dictionary<string, double>();

    /// <summary>Shooting segment length in problem time units; 0.5 suits Lorenz-type boards (about half a Lyapunov time).</summary>
    public double SegmentProblemUnits { get; init; } = 0.5;

    /// <summary>Fewer problem time units than this make the record too short to identify a system.</summary>
    public double MinimumProblemUnits { get; init; } = 5;
}
