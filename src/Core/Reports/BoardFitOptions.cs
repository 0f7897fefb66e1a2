using Patchproof.Core.Captures.Calibration;

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

    /// <summary>A probe calibration (every probe on one node) of the scope and probes that recorded the capture; null for none.
    /// Its relative gains divide the channels it names, and their priors shrink from the probe tolerance to the calibration's; an
    /// absolute calibration (<see cref="ProbeCalibration.IsAbsolute"/>) divides them by their absolute gains and also sets the
    /// shared reference gain's prior to its measured sd.</summary>
    public ProbeCalibration? Calibration { get; init; }

    /// <summary>Log-gain sd added to a calibrated channel's own, for what the calibration capture cannot see: gain drift between the
    /// two recordings and the probe's flatness over the board's band. Default 0.002 (0.2 %, from memory).</summary>
    public double CalibrationTransferSd { get; init; } = 0.002;

    /// <summary>Shooting segment length in problem time units; 0.5 suits Lorenz-type boards (about half a Lyapunov time).</summary>
    public double SegmentProblemUnits { get; init; } = 0.5;

    /// <summary>Prior sd of each channel's DC offset, in volts. A channel offset on a state inside a product term trades
    /// exactly against that product's partner coefficient and the equation's offset, so the fit needs a prior to stay
    /// well posed; 0.1 V is generous against a scope's DC offset accuracy of a few tens of mV (from memory), so the
    /// diagnosis, with its op-amp offset tolerance, decides along that direction rather than this prior.</summary>
    public double ChannelOffsetPriorSdVolts { get; init; } = 0.1;

    /// <summary>Fewer problem time units than this make the record too short to identify a system.</summary>
    public double MinimumProblemUnits { get; init; } = 5;

    /// <summary>A channel whose residual RMS exceeds this many times its noise floor gets a warning that the fit does not
    /// describe the capture (the report's findings are then unsafe). 5 by default: a fit that describes a capture leaves
    /// about 1 to 2 (common practice: a reduced χ² well above 1 rejects the model).</summary>
    public double MisfitNoiseRatioLimit { get; init; } = 5;

    /// <summary>Told each stage of the fit, each multiple-shooting iteration and each finished part of the comparison; null for
    /// none. Reports arrive on the fitting thread and their fractions never decrease.</summary>
    public IProgress<BoardFitProgress>? Progress { get; init; }

    /// <summary>Checked between stages, between iterations and inside the comparison's parts: once cancelled, the fit stops
    /// with <see cref="OperationCanceledException"/>. Default none.</summary>
    public CancellationToken Cancellation { get; init; }

    /// <summary>True (the default) to add the comparison of invariants and overlays to the report; false for the diagnosis alone.</summary>
    public bool CompareInvariants { get; init; } = true;

    /// <summary>Settings of that comparison; its progress and cancellation are the fit's own (<see cref="Progress"/>, <see cref="Cancellation"/>).</summary>
    public FitComparisonOptions Comparison { get; init; } = new();
}

/// <summary>How far a board fit has come.</summary>
/// <param name="Fraction">Fraction done, 0 to 1, never decreasing (multiple shooting counts its iterations against the cap, so a fit that converges early jumps ahead).</param>
/// <param name="Stage">What it is doing, in words, for example "multiple shooting, iteration 12 of at most 60" or
/// "comparing the capture with the designs: correlation dimension of the capture done (5 of 12 parts)".</param>
public sealed record BoardFitProgress(double Fraction, string Stage);
