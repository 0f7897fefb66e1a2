using Patchproof.Contracts.Reports;
using Patchproof.Core.Diagnosis;
using Patchproof.Core.Reports;

namespace Patchproof.Server.Reports;

/// <summary>Turns the core's <see cref="FitReport"/> into the wire's <see cref="FitResultDocument"/>.</summary>
internal static class FitResultMapper
{
    /// <summary>The document of one fitted capture.</summary>
    /// <param name="report">The core's report.</param>
    /// <param name="captureId">The capture that was fitted.</param>
    /// <param name="captureFileName">Its file name as uploaded.</param>
    /// <param name="serverNotes">Remarks of the server, for example that only the first of several captures was fitted.</param>
    public static FitResultDocument Map(FitReport report, Guid captureId, string captureFileName, IReadOnlyList<string> serverNotes)
    {
        var diagnosis = report.Diagnosis;
        var runnerUp = diagnosis.RunnerUp is { } next ? $"{next.Describe()} (probability {next.Probability:0.00})" : null;
        return new FitResultDocument(
            FitResultDocument.FormatName,
            FitResultDocument.CurrentVersion,
            diagnosis.Summary,
            OutcomeCode(diagnosis.Outcome),
            diagnosis.Findings.Select(f => Finding(f, diagnosis.Winner.Probability, runnerUp)).ToList(),
            report.Coefficients.Select(c => new CoefficientDocument($"d{c.Equation}/dt", c.Term, c.Unit, c.Nominal, c.Estimate, c.StandardError, c.ProblemNominal, c.ProblemEstimate, c.TouchesHiddenState)).ToList(),
            report.Offsets.Select(o => new OffsetDocument(o.Equation, o.EquivalentInputMillivolts, OffsetStandardErrorMillivolts(o), o.VoltsPerSecond)).ToList(),
            TimeScale(report),
            report.TimeConstants.Select(t => new TimeConstantDocument(t.Integrator, t.CapacitorId, t.NominalSeconds, t.EffectiveSeconds)).ToList(),
            ComparisonMapper.Invariants(report.Comparison),
            report.StructureCheck.Performed ? new StructureCheckDocument(report.StructureCheck.Passed, report.StructureCheck.Message) : null,
            ComparisonMapper.Plots(report.Comparison),
            report.Warnings,
            [.. diagnosis.Notes, .. CheckNotes(report), .. serverNotes],
            new FitRunDocument(
                captureId,
                captureFileName,
                report.Mapping.Select(m => $"{m.Channel} = {(m.Sign < 0 ? "-" : "")}{m.Variable}").ToList(),
                report.Quality.Method,
                report.Quality.Iterations,
                report.Quality.Converged,
                report.Quality.ExitReason,
                report.Quality.ElapsedSeconds,
                report.CoreVersion),
            report.Channels.Select(ChannelGain).ToList());
    }

    private static ChannelGainDocument ChannelGain(ChannelCorrection channel)
    {
        var gain = Math.Abs(channel.Gain);
        var sdPercent = gain > 0 ? 100 * channel.GainStandardError / gain : double.NaN;
        return new ChannelGainDocument(channel.Channel, channel.Variable, channel.Sign, gain, sdPercent, channel.GainSource,
            channel.IsCalibrated, channel.OffsetVolts, channel.ResidualRmsVolts);
    }

    private static IEnumerable<string> CheckNotes(FitReport report)
    {
        if (!report.StructureCheck.Performed)
        {
            yield return report.StructureCheck.Message;
        }

        yield return report.MappingCheck.Message;
        if (report.Comparison is { Computed: false } comparison)
        {
            yield return "No comparison with the simulations: " + comparison.Reason;
        }
    }

    private static FindingDocument Finding(PartFinding finding, double probability, string? runnerUp)
    {
        var verdict = finding.Verdict switch
        {
            PartVerdict.WithinTolerance => FindingVerdictCode.WithinTolerance,
            PartVerdict.Drifted or PartVerdict.OutOfTolerance => FindingVerdictCode.Drifted,
            _ => FindingVerdictCode.CannotDecide,
        };
        return new FindingDocument(
            finding.PartId,
            finding.Label,
            finding.NominalValue,
            finding.EffectiveValue,
            (finding.UpperValue - finding.LowerValue) / 2,
            finding.Unit,
            finding.Deviation,
            verdict,
            probability,
            Advice(finding, verdict),
            runnerUp,
            finding.Sentence);
    }

    private static string Advice(PartFinding finding, FindingVerdictCode verdict) => verdict switch
    {
        FindingVerdictCode.Drifted when finding.Kind is DiagnosisColumnKind.PartOffset =>
            $"Check the offset of {finding.PartId} (trim it or replace the op-amp), then capture again.",
        FindingVerdictCode.Drifted =>
            $"With the board powered down, measure {finding.PartId} out of circuit; replace it with a part of the nominal value if it reads like this, then capture again.",
        FindingVerdictCode.CannotDecide =>
            "This capture cannot settle it: record longer, or add a channel for the variable this part feeds.",
        _ => $"{finding.PartId} is within its tolerance but far from nominal: where the board must follow its design, replace it with a closer-tolerance part of the nominal value.",
    };

    private static double OffsetStandardErrorMillivolts(OffsetEstimate offset) =>
        offset.VoltsPerSecond != 0 ? Math.Abs(offset.StandardError * offset.EquivalentInputMillivolts / offset.VoltsPerSecond) : double.NaN;

    /// <summary>The common factor of every fully recorded coefficient, ln(theta_hat/theta_nom) averaged with inverse-variance weights, read as a time scale.</summary>
    private static TimeScaleDocument? TimeScale(FitReport report)
    {
        var nominalSeconds = report.TimeConstants.Count > 0 ? report.TimeConstants[0].NominalSeconds : double.NaN;
        double weights = 0, weighted = 0;
        foreach (var c in report.Coefficients.Where(c => !c.TouchesHiddenState && c.Nominal != 0 && c.Estimate / c.Nominal > 0 && c.StandardError > 0))
        {
            var sd = c.StandardError / Math.Abs(c.Estimate);
            var weight = 1 / (sd * sd);
            weights += weight;
            weighted += weight * Math.Log(c.Estimate / c.Nominal);
        }

        if (weights == 0 || !double.IsFinite(nominalSeconds))
        {
            return null;
        }

        // A faster board (coefficients larger by a factor k) runs a shorter time scale, tau / k.
        var estimate = nominalSeconds * Math.Exp(-weighted / weights);
        return new TimeScaleDocument(nominalSeconds, estimate, estimate / Math.Sqrt(weights));
    }

    private static string OutcomeCode(DiagnosisOutcome outcome) => outcome switch
    {
        DiagnosisOutcome.WithinTolerance => "withinTolerance",
        DiagnosisOutcome.PartsNamed => "partsNamed",
        DiagnosisOutcome.CannotDecide => "cannotDecide",
        _ => "noExplanationFits",
    };
}
