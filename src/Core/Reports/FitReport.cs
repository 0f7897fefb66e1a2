using Patchproof.Core.Captures.Checks;
using Patchproof.Core.Diagnosis;
using Patchproof.Core.Estimation;

namespace Patchproof.Core.Reports;

/// <summary>Everything one fit of a design against a capture produced: findings first, then what backs them.</summary>
/// <remarks>Serialized by <see cref="FitReportJson"/> as the documented, versioned <c>patchproof-fit-report</c> format.</remarks>
/// <param name="Board">The board id, for example <c>QH-L4</c>.</param>
/// <param name="Title">The board's name.</param>
/// <param name="CoreVersion">The numeric core that produced the report.</param>
/// <param name="CreatedAt">When the report was made.</param>
/// <param name="Capture">What was read.</param>
/// <param name="Mapping">Which channel recorded which variable.</param>
/// <param name="CaptureChecks">The capture checks.</param>
/// <param name="Diagnosis">The part diagnosis.</param>
/// <param name="Coefficients">Each design term: nominal and estimated coefficient.</param>
/// <param name="Offsets">Each integrator's fitted offset.</param>
/// <param name="Channels">Each channel's fitted offset and gain, and its residual.</param>
/// <param name="TimeConstants">Each integrator's effective time constant.</param>
/// <param name="Quality">How the fit went.</param>
/// <param name="Warnings">Why the findings may be unsafe, in plain words; empty when they are safe.</param>
public sealed record FitReport(
    string Board,
    string Title,
    string CoreVersion,
    DateTimeOffset CreatedAt,
    CaptureSummary Capture,
    IReadOnlyList<ChannelAssignment> Mapping,
    IReadOnlyList<CaptureCheckResult> CaptureChecks,
    DiagnosisResult Diagnosis,
    IReadOnlyList<CoefficientEstimate> Coefficients,
    IReadOnlyList<OffsetEstimate> Offsets,
    IReadOnlyList<ChannelCorrection> Channels,
    IReadOnlyList<TimeConstantEstimate> TimeConstants,
    FitQuality Quality,
    IReadOnlyList<string> Warnings)
{
    /// <summary>The report format's name.</summary>
    public const string FormatName = "patchproof-fit-report";

    /// <summary>The report format's version; raised on any incompatible change.</summary>
    public const int FormatVersion = 1;

    /// <summary>Whether the board computes the design's terms and no others (equation-error regression on an extended library).</summary>
    public StructureCheckResult StructureCheck { get; init; } = Estimation.StructureCheck.NotPerformed("not run");

    /// <summary>Whether another reading of the channels fits the capture far better than the one used.</summary>
    public MappingCheck MappingCheck { get; init; } = MappingCheck.NotPerformed("not run");

    /// <summary>The capture compared with the nominal and fitted design on invariants that survive chaos, with the plot data behind them; null when the fit was asked not to compare (<see cref="BoardFitOptions.CompareInvariants"/>).</summary>
    public FitComparison? Comparison { get; init; }

    /// <summary>True when nothing makes the findings unsafe.</summary>
    public bool FindingsAreSafe => Warnings.Count == 0;
}

/// <summary>What was read from the capture.</summary>
/// <param name="SampleCount">Samples per channel.</param>
/// <param name="IntervalSeconds">The sample interval.</param>
/// <param name="DurationSeconds">The record length.</param>
/// <param name="ProblemTimeUnits">The record length in the design's problem time units.</param>
/// <param name="ChannelNames">The channels in the capture.</param>
public sealed record CaptureSummary(int SampleCount, double IntervalSeconds, double DurationSeconds, double ProblemTimeUnits, IReadOnlyList<string> ChannelNames);

/// <summary>One design term's coefficient: what the parts say and what the board computes.</summary>
/// <param name="Equation">The integrator's variable, for example <c>y</c>.</param>
/// <param name="Term">The basis, for example <c>x*z</c>.</param>
/// <param name="Unit">The coefficient's unit in machine terms, for example <c>1/s</c>.</param>
/// <param name="Nominal">theta at nominal part values.</param>
/// <param name="Estimate">theta as fitted.</param>
/// <param name="StandardError">Its standard error.</param>
/// <param name="DeviationPercent">100 (estimate/nominal - 1).</param>
/// <param name="ProblemNominal">The nominal coefficient in problem units (for example sigma = 10).</param>
/// <param name="ProblemEstimate">The estimate in problem units.</param>
/// <param name="TouchesHiddenState">True when the term involves a variable no channel recorded: its value rests on priors.</param>
public sealed record CoefficientEstimate(string Equation, string Term, string Unit, double Nominal, double Estimate, double StandardError, double DeviationPercent, double ProblemNominal, double ProblemEstimate, bool TouchesHiddenState);

/// <summary>An integrator's fitted offset.</summary>
/// <param name="Equation">The integrator's variable.</param>
/// <param name="VoltsPerSecond">b_j, the drift it adds.</param>
/// <param name="StandardError">Its standard error.</param>
/// <param name="EquivalentInputMillivolts">b_j / Σ 1/(R_i C): the op-amp input offset that would cause it.</param>
public sealed record OffsetEstimate(string Equation, double VoltsPerSecond, double StandardError, double EquivalentInputMillivolts);

/// <summary>A channel's corrections and fit.</summary>
/// <param name="Channel">The channel.</param>
/// <param name="Variable">The variable it records.</param>
/// <param name="Sign">The mapping's sign.</param>
/// <param name="OffsetVolts">Its fitted offset.</param>
/// <param name="OffsetStandardError">Its standard error.</param>
/// <param name="Gain">The gain (signed) the fit assumed: the mapping's sign times the calibrated relative gain, or times 1.</param>
/// <param name="GainStandardError">The prior sd the diagnosis gave that gain, in the gain's units.</param>
/// <param name="GainSource">Where the gain and its prior came from: a calibration, a stated prior, or the probe tolerance.</param>
/// <param name="ResidualRmsVolts">RMS misfit of the fitted model to this channel.</param>
/// <param name="IsCalibrated">True when <paramref name="Gain"/> came from a probe calibration.</param>
public sealed record ChannelCorrection(string Channel, string Variable, int Sign, double OffsetVolts, double OffsetStandardError, double Gain, double GainStandardError, string GainSource, double ResidualRmsVolts, bool IsCalibrated = false);

/// <summary>An integrator's time constant: the design's and what the board shows.</summary>
/// <param name="Integrator">The integrator's variable.</param>
/// <param name="CapacitorId">Its capacitor.</param>
/// <param name="NominalSeconds">The design's seconds per problem time unit.</param>
/// <param name="EffectiveSeconds">The same scaled by the capacitor's posterior, C_eff / C_nom.</param>
public sealed record TimeConstantEstimate(string Integrator, string CapacitorId, double NominalSeconds, double EffectiveSeconds);

/// <summary>How the fit went.</summary>
/// <param name="Method">The estimator, for example "multiple shooting".</param>
/// <param name="Segments">Shooting segments.</param>
/// <param name="SegmentSeconds">Segment length.</param>
/// <param name="Iterations">Levenberg-Marquardt iterations.</param>
/// <param name="ExitReason">Why it stopped.</param>
/// <param name="Converged">True when it stopped on a convergence test.</param>
/// <param name="VarianceInflation">How much the covariance was widened for correlated residuals.</param>
/// <param name="HiddenVariables">Variables no channel recorded, and how they were started.</param>
/// <param name="ElapsedSeconds">Wall time of the fit.</param>
public sealed record FitQuality(string Method, int Segments, double SegmentSeconds, int Iterations, string ExitReason, bool Converged, double VarianceInflation, IReadOnlyList<string> HiddenVariables, double ElapsedSeconds);
