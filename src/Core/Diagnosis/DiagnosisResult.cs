namespace Patchproof.Core.Diagnosis;

/// <summary>The overall answer of a diagnosis.</summary>
public enum DiagnosisOutcome
{
    /// <summary>An all-in-tolerance explanation fits: no part is named.</summary>
    WithinTolerance,

    /// <summary>One or two parts are named with confidence.</summary>
    PartsNamed,

    /// <summary>Two explanations naming different parts are both credible, or a part cannot be resolved.</summary>
    CannotDecide,

    /// <summary>No hypothesis of at most two deviating parts explains the measurements (a wiring fault, or a bad capture).</summary>
    NoExplanationFits,
}

/// <summary>The verdict on one part.</summary>
public enum PartVerdict
{
    /// <summary>The estimate lies inside the part's tolerance band.</summary>
    WithinTolerance,

    /// <summary>The estimate lies outside the band, but its interval reaches back into it.</summary>
    Drifted,

    /// <summary>The whole interval lies outside the band.</summary>
    OutOfTolerance,

    /// <summary>The capture cannot resolve the part, or another explanation is as credible.</summary>
    CannotDecide,
}

/// <summary>The posterior of one column's deviation under a hypothesis.</summary>
/// <param name="ColumnId">The column.</param>
/// <param name="Mean">Posterior mean of u (log units or volts).</param>
/// <param name="Sd">Posterior standard deviation of u.</param>
public sealed record ColumnPosterior(string ColumnId, double Mean, double Sd);

/// <summary>One explanation: a set of freed parts (or groups), its evidence and its posterior.</summary>
/// <param name="FreedGroups">The representative column ids of the freed groups; empty for "every part healthy".</param>
/// <param name="LogEvidence">ln p(w | hypothesis), exact for the linear-Gaussian model.</param>
/// <param name="LogPrior">ln of the hypothesis's prior probability.</param>
/// <param name="Probability">Posterior probability among the hypotheses that were not rejected; 0 when rejected.</param>
/// <param name="ChiSquare">wᵀ M⁻¹ w under the hypothesis.</param>
/// <param name="DegreesOfFreedom">The number of rows.</param>
/// <param name="FitPValue">P(χ² ≥ <paramref name="ChiSquare"/>).</param>
/// <param name="RejectedBecause">Why the hypothesis was set aside, or null.</param>
/// <param name="Posterior">The posterior of every column under the hypothesis.</param>
public sealed record DiagnosisHypothesis(
    IReadOnlyList<string> FreedGroups,
    double LogEvidence,
    double LogPrior,
    double Probability,
    double ChiSquare,
    int DegreesOfFreedom,
    double FitPValue,
    string? RejectedBecause,
    IReadOnlyList<ColumnPosterior> Posterior)
{
    /// <summary>A short description, for example "R5 deviates" or "every part within its prior".</summary>
    public string Describe() => FreedGroups.Count == 0 ? "every part within its prior" : string.Join(" and ", FreedGroups) + (FreedGroups.Count == 1 ? " deviates" : " deviate");
}

/// <summary>Columns that look the same to this capture and so cannot be told apart.</summary>
/// <param name="RepresentativeId">The column the hypotheses free for the whole group.</param>
/// <param name="MemberIds">Every member, the representative first.</param>
public sealed record PartGroup(string RepresentativeId, IReadOnlyList<string> MemberIds);

/// <summary>How well this capture resolves a part if it were freed on its own.</summary>
/// <param name="ColumnId">The part.</param>
/// <param name="FreedSd">Posterior sd of u with the part freed (log units or volts); infinite when unobservable.</param>
/// <param name="IsObservable">False when no measured row depends on the part.</param>
public sealed record PartResolution(string ColumnId, double FreedSd, bool IsObservable)
{
    /// <summary>The same posterior sd if a calibration capture pinned the uncalibrated probe gains; null when no gain is uncalibrated.</summary>
    public double? FreedSdWithCalibration { get; init; }
}

/// <summary>One named part: what it should be, what it behaves like, how sure, and what else could explain it.</summary>
/// <param name="PartId">The part, for example <c>R5</c>.</param>
/// <param name="Label">What a person reads.</param>
/// <param name="Kind">A value or an offset.</param>
/// <param name="NominalValue">The nominal value in <paramref name="Unit"/> (0 for an offset).</param>
/// <param name="Unit">The unit.</param>
/// <param name="EffectiveValue">What the part behaves like: nominal·e^u for a value, u for an offset (volts).</param>
/// <param name="LowerValue">Lower end of the interval, same unit.</param>
/// <param name="UpperValue">Upper end of the interval, same unit.</param>
/// <param name="Deviation">Drift in percent for a value (100·(e^u - 1)); offset in millivolts for an offset.</param>
/// <param name="LogDeviation">u, the posterior mean.</param>
/// <param name="LogDeviationSd">The posterior sd of u.</param>
/// <param name="Verdict">The verdict.</param>
/// <param name="Alternatives">Other plausible parts that this capture cannot tell apart from this one, with their implied values.</param>
/// <param name="Sentence">One sentence for the report.</param>
public sealed record PartFinding(
    string PartId,
    string Label,
    DiagnosisColumnKind Kind,
    double NominalValue,
    string Unit,
    double EffectiveValue,
    double LowerValue,
    double UpperValue,
    double Deviation,
    double LogDeviation,
    double LogDeviationSd,
    PartVerdict Verdict,
    IReadOnlyList<PartFinding> Alternatives,
    string Sentence)
{
    /// <summary>How far the finding rests on the probe gains, and what a calibration capture would buy; null when no probe gain is uncalibrated.</summary>
    public ProbeGainDependence? GainDependence { get; init; }
}

/// <summary>Everything the diagnosis concluded.</summary>
/// <param name="Outcome">The overall answer.</param>
/// <param name="Summary">One or two sentences for the top of a report.</param>
/// <param name="Findings">Named parts; when within tolerance, only parts that sit far from nominal inside a wide band (<see cref="DiagnosisOptions.FarFromNominalBandFraction"/>), else empty; findings first in a report.</param>
/// <param name="Winner">The most probable hypothesis that was not rejected.</param>
/// <param name="RunnerUp">The next most probable one naming other parts, or null.</param>
/// <param name="Hypotheses">Every hypothesis considered, most probable first.</param>
/// <param name="Groups">Groups of parts this capture cannot tell apart.</param>
/// <param name="UnobservableParts">Parts no measured row depends on.</param>
/// <param name="Resolutions">For each part, its posterior sd if freed: what this capture can resolve.</param>
/// <param name="Nuisance">Posterior of probe gains, channel offsets and time base under the winner.</param>
/// <param name="Notes">Further remarks, for example parts nearest their band edges.</param>
public sealed record DiagnosisResult(
    DiagnosisOutcome Outcome,
    string Summary,
    IReadOnlyList<PartFinding> Findings,
    DiagnosisHypothesis Winner,
    DiagnosisHypothesis? RunnerUp,
    IReadOnlyList<DiagnosisHypothesis> Hypotheses,
    IReadOnlyList<PartGroup> Groups,
    IReadOnlyList<string> UnobservableParts,
    IReadOnlyList<PartResolution> Resolutions,
    IReadOnlyList<ColumnPosterior> Nuisance,
    IReadOnlyList<string> Notes);
