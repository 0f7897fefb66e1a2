using System.Text.Json.Serialization;

namespace Patchproof.Contracts.Reports;

/// <summary>The fit engine's result document: the <c>result</c> of <c>GET /api/fits/{id}/report</c>, written in camel case.</summary>
/// <remarks>Numbers that are not finite (an uncertainty the capture cannot give) are written as the strings "NaN" and "Infinity".</remarks>
/// <param name="Format">Always <see cref="FormatName"/>.</param>
/// <param name="Version">The document's version, <see cref="CurrentVersion"/>.</param>
/// <param name="Summary">The diagnosis in one or two sentences.</param>
/// <param name="Outcome">The diagnosis's overall answer: <c>withinTolerance</c>, <c>partsNamed</c>, <c>cannotDecide</c> or <c>noExplanationFits</c>.</param>
/// <param name="Findings">The parts the diagnosis names, most probable first; when every part is within tolerance, only a part that sits far from nominal inside a wide tolerance (verdict withinTolerance), else empty.</param>
/// <param name="Coefficients">Each design term's coefficient, nominal and estimated.</param>
/// <param name="Offsets">Each integrator's offset as an equivalent input offset voltage.</param>
/// <param name="TimeScale">The board's time scale, nominal and estimated, or null.</param>
/// <param name="TimeConstants">Each integrator's time constant, the design's and the effective one.</param>
/// <param name="Invariants">Invariants of the dynamics, from the capture and from the fitted model.</param>
/// <param name="StructureCheck">Whether the design's structure explains the capture, or null when the engine did not check.</param>
/// <param name="Plots">The decimated series for the comparison plots.</param>
/// <param name="Warnings">Why the findings may be unsafe, in plain words; empty when they are safe.</param>
/// <param name="Notes">Further remarks of the diagnosis and of the server (for example which capture was fitted).</param>
/// <param name="Fitted">What was fitted, and how the fit went.</param>
/// <param name="Channels">The gain the fit assumed for each channel and where it came from; null in documents written before
/// the gains were reported.</param>
public sealed record FitResultDocument(
    string Format,
    int Version,
    string Summary,
    string Outcome,
    IReadOnlyList<FindingDocument> Findings,
    IReadOnlyList<CoefficientDocument> Coefficients,
    IReadOnlyList<OffsetDocument> Offsets,
    TimeScaleDocument? TimeScale,
    IReadOnlyList<TimeConstantDocument> TimeConstants,
    IReadOnlyList<InvariantDocument> Invariants,
    StructureCheckDocument? StructureCheck,
    PlotsDocument Plots,
    IReadOnlyList<string> Warnings,
    IReadOnlyList<string> Notes,
    FitRunDocument Fitted,
    IReadOnlyList<ChannelGainDocument>? Channels = null)
{
    /// <summary>The document's name.</summary>
    public const string FormatName = "patchproof-fit-result";

    /// <summary>The document's version; raised on any incompatible change.</summary>
    public const int CurrentVersion = 1;
}

/// <summary>What the diagnosis concluded about one part.</summary>
public enum FindingVerdictCode
{
    /// <summary>Within its tolerance.</summary>
    [JsonStringEnumMemberName("withinTolerance")]
    WithinTolerance,

    /// <summary>Outside its tolerance.</summary>
    [JsonStringEnumMemberName("drifted")]
    Drifted,

    /// <summary>The capture cannot tell.</summary>
    [JsonStringEnumMemberName("cannotDecide")]
    CannotDecide,
}

/// <summary>One part the diagnosis names.</summary>
/// <param name="Part">The part, for example "R5".</param>
/// <param name="Role">Where it sits, in words.</param>
/// <param name="Nominal">Its nominal value in <paramref name="Unit"/>.</param>
/// <param name="Effective">The value it behaves like.</param>
/// <param name="IntervalHalfWidth">Half the width of the interval around <paramref name="Effective"/>.</param>
/// <param name="Unit">The unit of the values ("Ohm", "F", "1/V", "V").</param>
/// <param name="DriftPercent">The drift in percent (for an offset: the offset in mV).</param>
/// <param name="Verdict">What the diagnosis concluded.</param>
/// <param name="Probability">The probability of the explanation that names this part, 0 to 1.</param>
/// <param name="Advice">What to do about it, in one sentence.</param>
/// <param name="RunnerUp">The next-best explanation in words, with its probability, or null.</param>
/// <param name="Sentence">The engine's full sentence about the part.</param>
public sealed record FindingDocument(
    string Part,
    string Role,
    double Nominal,
    double Effective,
    double IntervalHalfWidth,
    string Unit,
    double DriftPercent,
    [property: JsonConverter(typeof(JsonStringEnumConverter<FindingVerdictCode>))] FindingVerdictCode Verdict,
    double Probability,
    string Advice,
    string? RunnerUp,
    string Sentence);

/// <summary>One coefficient of one equation, in machine units.</summary>
/// <param name="Equation">The equation, for example "dy/dt".</param>
/// <param name="Term">The term's basis, for example "x", "x*z" or "1".</param>
/// <param name="Unit">The coefficient's unit, for example "1/s".</param>
/// <param name="Nominal">At nominal part values.</param>
/// <param name="Estimate">As fitted.</param>
/// <param name="StandardError">Its standard error.</param>
/// <param name="ProblemNominal">The nominal coefficient in problem units (for example sigma = 10).</param>
/// <param name="ProblemEstimate">The estimate in problem units.</param>
/// <param name="RestsOnPriors">True when the term touches a variable no channel recorded.</param>
public sealed record CoefficientDocument(string Equation, string Term, string Unit, double Nominal, double Estimate, double StandardError, double ProblemNominal, double ProblemEstimate, bool RestsOnPriors);

/// <summary>One integrator's offset.</summary>
/// <param name="Variable">The integrator's variable.</param>
/// <param name="EquivalentInputMillivolts">The op-amp input offset that would cause it, in mV.</param>
/// <param name="StandardErrorMillivolts">Its standard error in mV.</param>
/// <param name="VoltsPerSecond">The drift it adds at the output.</param>
public sealed record OffsetDocument(string Variable, double EquivalentInputMillivolts, double StandardErrorMillivolts, double VoltsPerSecond);

/// <summary>The board's time scale, seconds per problem time unit.</summary>
/// <param name="NominalSeconds">From the design.</param>
/// <param name="EstimateSeconds">The common factor of every fully recorded coefficient, as a time scale.</param>
/// <param name="StandardErrorSeconds">Its standard error.</param>
public sealed record TimeScaleDocument(double NominalSeconds, double EstimateSeconds, double StandardErrorSeconds);

/// <summary>One integrator's time constant.</summary>
/// <param name="Integrator">The integrator's variable.</param>
/// <param name="Capacitor">Its capacitor.</param>
/// <param name="NominalSeconds">The design's seconds per problem time unit.</param>
/// <param name="EffectiveSeconds">Scaled by the capacitor's posterior.</param>
public sealed record TimeConstantDocument(string Integrator, string Capacitor, double NominalSeconds, double EffectiveSeconds);

/// <summary>One invariant of the dynamics.</summary>
/// <param name="Name">What it is.</param>
/// <param name="FromCapture">From the capture, or null.</param>
/// <param name="FromModel">From the fitted model, or null.</param>
/// <param name="Unit">Its unit, or empty.</param>
public sealed record InvariantDocument(string Name, double? FromCapture, double? FromModel, string Unit);

/// <summary>Whether the design's structure explains the capture.</summary>
/// <param name="Passed">True when it does.</param>
/// <param name="Message">The conclusion in words.</param>
public sealed record StructureCheckDocument(bool Passed, string Message);

/// <summary>What a trace shows.</summary>
public enum TraceRoleCode
{
    /// <summary>The capture.</summary>
    [JsonStringEnumMemberName("capture")]
    Capture,

    /// <summary>The design at nominal values.</summary>
    [JsonStringEnumMemberName("nominal")]
    Nominal,

    /// <summary>The fitted model.</summary>
    [JsonStringEnumMemberName("fitted")]
    Fitted,
}

/// <summary>The comparison plots; empty lists when the engine made none.</summary>
/// <param name="PhasePlanes">One overlay per phase plane.</param>
/// <param name="TimeSeries">One overlay per channel against time.</param>
/// <param name="ReturnMap">Successive maxima, or null.</param>
/// <param name="DensityDifferences">Occupancy density differences per plane.</param>
/// <param name="Spectra">Welch spectra per channel.</param>
public sealed record PlotsDocument(
    IReadOnlyList<OverlayPlotDocument> PhasePlanes,
    IReadOnlyList<OverlayPlotDocument> TimeSeries,
    OverlayPlotDocument? ReturnMap,
    IReadOnlyList<DensityDifferenceDocument> DensityDifferences,
    IReadOnlyList<OverlayPlotDocument> Spectra)
{
    /// <summary>No plots.</summary>
    public static PlotsDocument Empty { get; } = new([], [], null, [], []);
}

/// <summary>One overlay plot.</summary>
/// <param name="Title">Its title.</param>
/// <param name="XLabel">The horizontal axis label with its unit.</param>
/// <param name="YLabel">The vertical axis label with its unit.</param>
/// <param name="Traces">At most one trace per role.</param>
public sealed record OverlayPlotDocument(string Title, string XLabel, string YLabel, IReadOnlyList<TraceDocument> Traces);

/// <summary>One decimated trace (at most 20,000 points).</summary>
/// <param name="Role">What it shows.</param>
/// <param name="X">Horizontal values.</param>
/// <param name="Y">Vertical values, as many as <paramref name="X"/>.</param>
public sealed record TraceDocument(
    [property: JsonConverter(typeof(JsonStringEnumConverter<TraceRoleCode>))] TraceRoleCode Role,
    IReadOnlyList<double> X,
    IReadOnlyList<double> Y);

/// <summary>A density difference on a grid: capture minus fitted model.</summary>
/// <param name="Title">Its title.</param>
/// <param name="XLabel">The horizontal axis label.</param>
/// <param name="YLabel">The vertical axis label.</param>
/// <param name="XCentres">Column centres.</param>
/// <param name="YCentres">Row centres.</param>
/// <param name="Difference">Rows by y, each of x-centre length.</param>
public sealed record DensityDifferenceDocument(
    string Title,
    string XLabel,
    string YLabel,
    IReadOnlyList<double> XCentres,
    IReadOnlyList<double> YCentres,
    IReadOnlyList<IReadOnlyList<double>> Difference);

/// <summary>What was fitted and how the fit went.</summary>
/// <param name="CaptureId">The capture fitted.</param>
/// <param name="CaptureFileName">Its file name as uploaded.</param>
/// <param name="Mapping">Which channel recorded which variable, for example "CH2 = -y".</param>
/// <param name="Method">The estimator.</param>
/// <param name="Iterations">Levenberg-Marquardt iterations.</param>
/// <param name="Converged">True when the fit stopped on a convergence test.</param>
/// <param name="ExitReason">Why it stopped.</param>
/// <param name="ElapsedSeconds">Wall time of the fit.</param>
/// <param name="CoreVersion">The numeric core that fitted.</param>
public sealed record FitRunDocument(Guid CaptureId, string CaptureFileName, IReadOnlyList<string> Mapping, string Method, int Iterations, bool Converged, string ExitReason, double ElapsedSeconds, string CoreVersion);

/// <summary>One channel as the fit took it: the variable it records, the gain assumed and where that gain came from.</summary>
/// <param name="Channel">The channel, for example "CH2".</param>
/// <param name="Variable">The variable it records.</param>
/// <param name="Sign">+1, or -1 when the board outputs the variable inverted.</param>
/// <param name="Gain">The channel's relative gain the fit divided it by (1 when uncalibrated), without the sign.</param>
/// <param name="GainSdPercent">The prior standard deviation the diagnosis gave that gain, in percent.</param>
/// <param name="GainSource">Where the gain and its prior came from, in words: the probe calibration, a stated prior, or the probe tolerance.</param>
/// <param name="IsCalibrated">True when the gain came from a probe calibration.</param>
/// <param name="OffsetVolts">The channel's fitted offset.</param>
/// <param name="ResidualRmsVolts">RMS misfit of the fitted model to this channel.</param>
public sealed record ChannelGainDocument(string Channel, string Variable, int Sign, double Gain, double GainSdPercent, string GainSource, bool IsCalibrated, double OffsetVolts, double ResidualRmsVolts);
