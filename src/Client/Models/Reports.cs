namespace Patchproof.Client.Models;

/// <summary>What the diagnosis concluded about one part.</summary>
public enum FindingVerdict
{
    /// <summary>Within its tolerance.</summary>
    WithinTolerance,

    /// <summary>Outside its tolerance: the part to look at.</summary>
    Drifted,

    /// <summary>The capture cannot tell: the interval is wider than the part's tolerance, or two parts trade against each other.</summary>
    CannotDecide,
}

/// <summary>One component-level conclusion of a fit.</summary>
/// <param name="Part">The part, for example "R5".</param>
/// <param name="Role">Where it sits, in words, for example "input resistor from x into the y integrator".</param>
/// <param name="Nominal">Its nominal value in <paramref name="Unit"/>.</param>
/// <param name="Effective">The value it behaves like.</param>
/// <param name="IntervalHalfWidth">Half the width of the interval around <paramref name="Effective"/>, same unit.</param>
/// <param name="Unit">The unit of the values.</param>
/// <param name="DriftPercent">(Effective - Nominal) / Nominal in percent.</param>
/// <param name="Verdict">What the diagnosis concluded.</param>
/// <param name="Probability">The probability of the hypothesis that names this part, 0 to 1.</param>
/// <param name="Advice">What to do about it, in one sentence.</param>
/// <param name="RunnerUp">The next-best explanation in words, with its probability, or null.</param>
public sealed record FindingView(
    string Part,
    string Role,
    double Nominal,
    double Effective,
    double IntervalHalfWidth,
    string Unit,
    double DriftPercent,
    FindingVerdict Verdict,
    double Probability,
    string Advice,
    string? RunnerUp);

/// <summary>One estimated coefficient of one equation, against its nominal.</summary>
/// <param name="Equation">The equation, for example "dy/dt".</param>
/// <param name="Term">The term's basis, for example "x" or "x*z" or "1".</param>
/// <param name="Nominal">The nominal coefficient in 1/s (machine units).</param>
/// <param name="Estimate">The estimate in 1/s.</param>
/// <param name="StandardError">Its standard error in 1/s.</param>
public sealed record CoefficientView(string Equation, string Term, double Nominal, double Estimate, double StandardError)
{
    /// <summary>(Estimate - Nominal) / Nominal in percent, or NaN for a zero nominal.</summary>
    public double DeviationPercent => Nominal == 0 ? double.NaN : 100 * (Estimate - Nominal) / Nominal;
}

/// <summary>One integrator's offset as an equivalent input offset voltage.</summary>
/// <param name="Variable">The integrator's variable.</param>
/// <param name="EquivalentInputMillivolts">The offset in mV at the integrator's input.</param>
/// <param name="StandardErrorMillivolts">Its standard error in mV.</param>
public sealed record OffsetView(string Variable, double EquivalentInputMillivolts, double StandardErrorMillivolts);

/// <summary>The board's time scale: seconds per problem time unit, nominal against estimated.</summary>
/// <param name="NominalSeconds">From the design.</param>
/// <param name="EstimateSeconds">From the fit.</param>
/// <param name="StandardErrorSeconds">Its standard error.</param>
public sealed record TimeScaleView(double NominalSeconds, double EstimateSeconds, double StandardErrorSeconds)
{
    /// <summary>(Estimate - Nominal) / Nominal in percent.</summary>
    public double DeviationPercent => NominalSeconds == 0 ? double.NaN : 100 * (EstimateSeconds - NominalSeconds) / NominalSeconds;
}

/// <summary>One invariant of the dynamics, from the capture and from the model.</summary>
/// <param name="Name">What it is, for example "largest Lyapunov exponent".</param>
/// <param name="FromCapture">The value estimated from the capture, or null.</param>
/// <param name="FromModel">The value of the fitted model, or null.</param>
/// <param name="Unit">Its unit, for example "1/s", or empty.</param>
public sealed record InvariantView(string Name, double? FromCapture, double? FromModel, string Unit);

/// <summary>Whether the design's structure explains the capture (no missing or extra term).</summary>
/// <param name="Passed">True when it does.</param>
/// <param name="Message">The check's conclusion in words.</param>
public sealed record StructureCheckView(bool Passed, string Message);

/// <summary>Everything a finished fit produced, in the order the report page shows it.</summary>
/// <param name="FitId">The fit.</param>
/// <param name="Board">The board.</param>
/// <param name="DesignVersion">The design version fitted.</param>
/// <param name="Captures">The captures fitted, with their checks.</param>
/// <param name="Summary">The diagnosis in one sentence.</param>
/// <param name="Findings">The findings, most probable first.</param>
/// <param name="Coefficients">The estimated coefficients.</param>
/// <param name="Offsets">The integrators' offsets.</param>
/// <param name="TimeScale">The time scale, or null when the report has none.</param>
/// <param name="Invariants">The invariants.</param>
/// <param name="StructureCheck">The structure check, or null.</param>
/// <param name="Plots">The decimated series for the comparison plots.</param>
/// <param name="Export">Where the report can be downloaded.</param>
public sealed record FitReportView(
    Guid FitId,
    BoardSummary Board,
    int DesignVersion,
    IReadOnlyList<CaptureEntry> Captures,
    string Summary,
    IReadOnlyList<FindingView> Findings,
    IReadOnlyList<CoefficientView> Coefficients,
    IReadOnlyList<OffsetView> Offsets,
    TimeScaleView? TimeScale,
    IReadOnlyList<InvariantView> Invariants,
    StructureCheckView? StructureCheck,
    ComparisonPlots Plots,
    ReportExportLinks Export)
{
    /// <summary>Why the findings may be unsafe, in plain words; empty when they are safe.</summary>
    public IReadOnlyList<string> Warnings { get; init; } = [];

    /// <summary>Further remarks of the diagnosis and the server.</summary>
    public IReadOnlyList<string> Notes { get; init; } = [];

    /// <summary>The gain the fit assumed for each channel and where it came from; empty in reports of older engines.</summary>
    public IReadOnlyList<ChannelGainView> Channels { get; init; } = [];

    /// <summary>Which channel the fit read as which variable, for example "CH2 = -y"; empty in reports that do not say.</summary>
    public IReadOnlyList<string> Mapping { get; init; } = [];
}
