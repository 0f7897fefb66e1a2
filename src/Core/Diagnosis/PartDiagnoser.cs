using System.Globalization;
using MathNet.Numerics.Distributions;
using MathNet.Numerics.LinearAlgebra;

namespace Patchproof.Core.Diagnosis;

/// <summary>Names the parts that explain a board's measured coefficient deviations, with how sure it is.</summary>
/// <remarks>
/// <para>The measured rows w (log-coefficient deviations and offsets) are modelled as w = A u + e, with
/// e ~ N(0, Σ_w). A hypothesis F frees a set of at most two parts (or groups of parts this capture
/// cannot tell apart): their prior is wide (sd ln 3 for values, 50 mV for offsets), every other column
/// keeps its healthy prior. The model is linear and Gaussian, so the evidence of each hypothesis is
/// exact: w ~ N(0, M_F) with M_F = A D_F Aᵀ + Σ_w, and
/// ln p(w | F) = -½ wᵀ M_F⁻¹ w - ½ ln det(2π M_F). Each hypothesis has the prior π^|F| (1 - π)^(N - |F|).
/// The posterior of u under F has mean D_F Aᵀ M_F⁻¹ w and covariance D_F - D_F Aᵀ M_F⁻¹ A D_F.</para>
/// <para>Guards: a hypothesis is set aside when its posterior needs a part it calls healthy more than
/// one posterior sd outside that part's band. A part is named only when no all-in-tolerance explanation
/// fits (χ² p ≥ 0.01 with every part inside its band) and its interval lies outside the band; the verdict is
/// "cannot decide" when the runner-up names other parts with a posterior above 0.1.</para>
/// <para>Groups: columns whose directions, whitened by Σ_w, are parallel (|cos| &gt; 0.999) cannot be told
/// apart by this capture (a single-input integrator's resistor and capacitor, say). They are ranked as one,
/// and every member whose implied deviation is physically plausible is reported.</para>
/// <para>References: [1] C. M. Bishop, Pattern Recognition and Machine Learning (2006), §2.3.3 and §3.4
/// (linear-Gaussian marginal likelihood). [2] D. J. C. MacKay, Information Theory, Inference, and
/// Learning Algorithms (2003), ch. 28 (model comparison by evidence).</para>
/// </remarks>
public static class PartDiagnoser
{
    /// <summary>Diagnoses the problem with the default, calibrated options.</summary>
    /// <param name="problem">The measured rows, the columns and the covariance.</param>
    /// <returns>The outcome, the named parts and the ranked hypotheses.</returns>
    public static DiagnosisResult Diagnose(DiagnosisProblem problem) => Diagnose(problem, new DiagnosisOptions());

    /// <summary>Diagnoses the problem.</summary>
    /// <param name="problem">The measured rows, the columns and the covariance.</param>
    /// <param name="options">Priors and decision thresholds.</param>
    /// <returns>The outcome, the named parts and the ranked hypotheses.</returns>
    /// <exception cref="ArgumentOutOfRangeException">The covariance is not positive definite, or an option is out of range.</exception>
    public static DiagnosisResult Diagnose(DiagnosisProblem problem, DiagnosisOptions options) => Diagnose(problem, options, assessCalibration: true);

    private static DiagnosisResult Diagnose(DiagnosisProblem problem, DiagnosisOptions options, bool assessCalibration)
    {
        Preconditions.CheckArgumentRange(nameof(options), options.FaultPriorProbability is > 0 and < 1, "the fault prior probability must lie strictly between 0 and 1");
        Preconditions.CheckArgumentRange(nameof(options), options.MaxFaultsPerHypothesis is >= 0 and <= 3, "at most three parts can be freed at once");
        var model = LinearGaussianModel.Create(problem);
        var groups = FindGroups(model, problem.Columns, options.ParallelCosine);
        var unobservable = problem.Columns.Where((column, j) => column.IsFaultCandidate && !model.IsObservable(j)).Select(column => column.Id).ToList();

        var hypotheses = EnumerateHypotheses(groups.Select(group => group.Representative).ToList(), options.MaxFaultsPerHypothesis)
            .Select(freed => Evaluate(model, problem.Columns, freed, groups.Count, options))
            .ToList();
        var ranked = Normalize(hypotheses);
        var accepted = ranked.Where(h => h.Hypothesis.RejectedBecause is null).ToList();
        var winner = accepted.Count > 0 ? accepted[0] : ranked[0];
        var runnerUp = accepted.Skip(1).FirstOrDefault(h => NamesOtherParts(h.Freed, winner.Freed));
        var healthy = ranked.Single(h => h.Freed.Count == 0);

        var partGroups = groups.Select(group => new PartGroup(problem.Columns[group.Representative].Id, group.Members.Select(j => problem.Columns[j].Id).ToList())).ToList();
        var resolutions = problem.Columns.Select((column, j) => (column, j))
            .Where(pair => pair.column.IsFaultCandidate)
            .Select(pair => model.IsObservable(pair.j)
                ? new PartResolution(pair.column.Id, Evaluate(model, problem.Columns, [pair.j], groups.Count, options).Hypothesis.Posterior[pair.j].Sd, true)
                : new PartResolution(pair.column.Id, double.PositiveInfinity, false))
            .ToList();
        var nuisance = winner.Hypothesis.Posterior.Where((_, j) => !problem.Columns[j].IsFaultCandidate).ToList();
        var notes = new List<string>();
        if (unobservable.Count > 0)
        {
            notes.Add("This capture cannot see " + string.Join(", ", unobservable) + ": no measured coefficient depends on them.");
        }

        var likeliestDeviation = accepted.FirstOrDefault(h => h.Freed.Count > 0);
        var (outcome, findings, summary) = Decide(model, problem.Columns, groups, healthy, winner, runnerUp, likeliestDeviation, options, notes);
        var loose = problem.Columns.Select((column, j) => (column, j))
            .Where(pair => pair.column.Kind is DiagnosisColumnKind.ChannelGain && !pair.column.PinnedByCalibration && model.IsObservable(pair.j))
            .Select(pair => pair.j).ToList();
        if (loose.Count > 0)
        {
            var uncalibrated = loose.Where(j => problem.Columns[j].Id != DiagnosisColumn.CommonGainId).ToList();
            var calibrated = assessCalibration && uncalibrated.Count > 0 ? Diagnose(WithCalibratedGains(problem, winner.Hypothesis, uncalibrated, options), options, assessCalibration: false) : null;
            if (calibrated is not null)
            {
                resolutions = resolutions.Select(r => r with { FreedSdWithCalibration = calibrated.Resolutions.FirstOrDefault(c => c.ColumnId == r.ColumnId)?.FreedSd }).ToList();
                NoteWhatACalibrationBuys(model, problem.Columns, loose, resolutions, options, notes);
            }

            if (outcome is DiagnosisOutcome.WithinTolerance)
            {
                // After a calibration only the reference probe's own gain stays loose: it still mimics multiplier faults.
                summary += uncalibrated.Count > 0
                    ? HiddenByProbeGains(model, problem.Columns, loose, resolutions, options, "uncalibrated probe gains", "record a calibration capture to check them (docs/probe-calibration.md)")
                    : HiddenByProbeGains(model, problem.Columns, loose, resolutions, options, "the reference probe's own gain, which a calibration capture does not measure,", "check that probe against a signal of known amplitude (docs/probe-calibration.md)");
            }

            findings = findings.Select(finding => WithGainDependence(model, problem.Columns, groups, winner, loose, finding, calibrated, options)).ToList();
            if (findings.Any(finding => finding.GainDependence?.DependsOnProbeGains == true))
            {
                outcome = DiagnosisOutcome.CannotDecide;
                summary = "Cannot decide: " + string.Join(" ", findings.Select(finding => finding.Sentence));
            }
        }

        return new DiagnosisResult(outcome, summary, findings, winner.Hypothesis, runnerUp?.Hypothesis, ranked.Select(h => h.Hypothesis).ToList(), partGroups, unobservable, resolutions, nuisance, notes);
    }

    private static (DiagnosisOutcome Outcome, IReadOnlyList<PartFinding> Findings, string Summary) Decide(
        LinearGaussianModel model,
        IReadOnlyList<DiagnosisColumn> columns,
        IReadOnlyList<ColumnGroup> groups,
        ScoredHypothesis healthy,
        ScoredHypothesis winner,
        ScoredHypothesis? runnerUp,
        ScoredHypothesis? likeliestDeviation,
        DiagnosisOptions options,
        List<string> notes)
    {
        var healthyAcceptable = healthy.Hypothesis.FitPValue >= options.AcceptableHealthyPValue
            && healthy.Hypothesis.RejectedBecause is null
            && columns.Select((column, j) => (column, j)).Where(pair => pair.column.IsFaultCandidate)
                .All(pair => Math.Abs(healthy.Hypothesis.Posterior[pair.j].Mean) <= pair.column.ToleranceBand);
        if (healthyAcceptable)
        {
            var nearest = columns.Select((column, j) => (column, ratio: Math.Abs(healthy.Hypothesis.Posterior[j].Mean) / column.ToleranceBand))
                .Where(pair => pair.column.IsFaultCandidate && model.IsObservable(columns.ToList().IndexOf(pair.column)))
                .OrderByDescending(pair => pair.ratio).Take(3)
                .Select(pair => $"{pair.column.Id} at {pair.ratio * 100:0}% of its band")
                .ToList();
            if (nearest.Count > 0)
            {
                notes.Add("Nearest their tolerance edges: " + string.Join(", ", nearest) + ".");
            }

            if (healthy.Hypothesis.FitPValue < options.BorderlineHealthyPValue && likeliestDeviation is { } suspect)
            {
                notes.Add(BorderlineNote(columns, groups, healthy, suspect));
            }

            var farOff = FarFromNominal(model, columns, groups, healthy, options);
            return farOff.Count == 0
                ? (DiagnosisOutcome.WithinTolerance, [], "Every part behaves within its tolerance: the measurements fit the design as drawn.")
                : (DiagnosisOutcome.WithinTolerance, farOff,
                    "Every part behaves within its tolerance, but "
                    + string.Join(" and ", farOff.Select(f => string.Create(CultureInfo.InvariantCulture, $"{f.PartId} ({f.Deviation:+0.0;-0.0} %)")))
                    + (farOff.Count == 1 ? " sits" : " sit") + " far from nominal, enough to change the board as a fault would.");
        }

        if (winner.Hypothesis.FitPValue < options.FitCheckPValue)
        {
            return (DiagnosisOutcome.NoExplanationFits, [],
                $"No explanation with at most {options.MaxFaultsPerHypothesis} deviating parts fits the measurements (χ² p = {winner.Hypothesis.FitPValue:0.###e0}): look for a wiring fault with the structure check, or a bad capture.");
        }

        var findings = winner.Freed
            .Select(j => BuildFinding(model, columns, groups.First(group => group.Representative == j), winner.Hypothesis.Posterior, options))
            .Where(finding => finding.Verdict is not PartVerdict.WithinTolerance)
            .ToList();
        if (findings.Count == 0)
        {
            return (DiagnosisOutcome.CannotDecide, [],
                "The measurements do not fit an all-healthy board, but no part is resolved outside its tolerance: record longer or add a channel.");
        }

        if (runnerUp is not null && runnerUp.Hypothesis.Probability > options.CannotDecideRunnerUpProbability)
        {
            var undecided = findings.Select(finding => finding with { Verdict = PartVerdict.CannotDecide }).ToList();
            return (DiagnosisOutcome.CannotDecide, undecided,
                $"Cannot decide: {winner.Hypothesis.Describe()} (probability {winner.Hypothesis.Probability:0.00}) or {runnerUp.Hypothesis.Describe()} ({runnerUp.Hypothesis.Probability:0.00}). Record longer, add a channel, or measure the parts.");
        }

        if (findings.Any(finding => finding.Verdict is PartVerdict.CannotDecide))
        {
            return (DiagnosisOutcome.CannotDecide, findings, "Cannot decide: " + string.Join(" ", findings.Select(finding => finding.Sentence)));
        }

        return (DiagnosisOutcome.PartsNamed, findings, string.Join(" ", findings.Select(finding => finding.Sentence)));
    }

    /// <summary>Part values the accepted all-in-tolerance explanation puts inside their band but resolved far from nominal
    /// (a wide-tolerance part near its edge), each with the parts this capture cannot tell it from.</summary>
    private static List<PartFinding> FarFromNominal(LinearGaussianModel model, IReadOnlyList<DiagnosisColumn> columns, IReadOnlyList<ColumnGroup> groups, ScoredHypothesis healthy, DiagnosisOptions options)
    {
        var found = new List<PartFinding>();
        for (var j = 0; j < columns.Count; j++)
        {
            var column = columns[j];
            var (mean, sd) = (healthy.Hypothesis.Posterior[j].Mean, healthy.Hypothesis.Posterior[j].Sd);
            if (column.Kind is not DiagnosisColumnKind.PartValue || !model.IsObservable(j) || Math.Abs(mean) > column.ToleranceBand
                || Math.Abs(mean) - options.IntervalSigmas * sd < options.FarFromNominalBandFraction * column.ToleranceBand)
            {
                continue;
            }

            var alternatives = groups.First(group => group.Members.Contains(j)).Members
                .Where(m => m != j && columns[m].Kind is DiagnosisColumnKind.PartValue)
                .Select(m => (m, ratio: model.ImpliedRatio(j, m)))
                .Where(pair => Math.Abs(mean * pair.ratio) <= columns[pair.m].PlausibleLimit)
                .Select(pair => MakeFinding(columns[pair.m], mean * pair.ratio, sd * Math.Abs(pair.ratio), [], options))
                .ToList();
            var finding = MakeFinding(column, mean, sd, alternatives, options);
            var used = string.Create(CultureInfo.InvariantCulture, $" It uses {100 * Math.Abs(mean) / column.ToleranceBand:0} % of its band; where the board must follow its design, fit a closer-tolerance part.");
            found.Add(finding with { Sentence = finding.Sentence + used });
        }

        return found.OrderByDescending(finding => Math.Abs(finding.LogDeviation)).ToList();
    }

    private static PartFinding BuildFinding(LinearGaussianModel model, IReadOnlyList<DiagnosisColumn> columns, ColumnGroup group, IReadOnlyList<ColumnPosterior> posterior, DiagnosisOptions options)
    {
        var representative = group.Representative;
        var mean = posterior[representative].Mean;
        var sd = posterior[representative].Sd;
        var members = group.Members
            .Select(j =>
            {
                var ratio = j == representative ? 1.0 : model.ImpliedRatio(representative, j);
                return (j, mean: mean * ratio, sd: sd * Math.Abs(ratio));
            })
            .Where(member => Math.Abs(member.mean) <= columns[member.j].PlausibleLimit || member.j == representative)
            .ToList();
        // The likeliest member is the one whose implied deviation is smallest against its own tolerance.
        var primary = members
            .OrderBy(member => Math.Abs(member.mean) <= columns[member.j].PlausibleLimit ? 0 : 1)
            .ThenBy(member => Math.Abs(member.mean) / columns[member.j].ToleranceBand)
            .First();

        var alternatives = members.Where(member => member.j != primary.j && Math.Abs(member.mean) <= columns[member.j].PlausibleLimit)
            .Select(member => MakeFinding(columns[member.j], member.mean, member.sd, [], options))
            .ToList();
        return MakeFinding(columns[primary.j], primary.mean, primary.sd, alternatives, options);
    }

    private static PartFinding MakeFinding(DiagnosisColumn column, double mean, double sd, IReadOnlyList<PartFinding> alternatives, DiagnosisOptions options)
    {
        var k = options.IntervalSigmas;
        var verdict = sd > column.ToleranceBand
            ? PartVerdict.CannotDecide
            : Math.Abs(mean) - k * sd > column.ToleranceBand ? PartVerdict.OutOfTolerance
            : Math.Abs(mean) > column.ToleranceBand ? PartVerdict.Drifted
            : PartVerdict.WithinTolerance;
        var isValue = column.Kind is DiagnosisColumnKind.PartValue;
        var effective = isValue ? column.NominalValue * Math.Exp(mean) : mean;
        var (first, second) = isValue ? (column.NominalValue * Math.Exp(mean - k * sd), column.NominalValue * Math.Exp(mean + k * sd)) : (mean - k * sd, mean + k * sd);
        // A negative reference voltage turns the interval around.
        var (lower, upper) = (Math.Min(first, second), Math.Max(first, second));
        var deviation = isValue ? 100 * (Math.Exp(mean) - 1) : 1000 * mean;
        var also = alternatives.Count == 0 ? "" : " This capture cannot tell it from " + string.Join(", ", alternatives.Select(a => a.Kind is DiagnosisColumnKind.PartValue ? $"{a.PartId} ({a.Deviation:+0.0;-0.0} %)" : $"{a.PartId} ({a.Deviation:+0.0;-0.0} mV)")) + ".";
        var sentence = isValue
            ? string.Create(CultureInfo.InvariantCulture, $"{column.Id}, {EngineeringFormat.Format(column.NominalValue, column.Unit)} nominal, behaves like {EngineeringFormat.Format(effective, column.Unit)} ({deviation:+0.0;-0.0} %, interval {EngineeringFormat.Format(lower, column.Unit)} to {EngineeringFormat.Format(upper, column.Unit)}): {Describe(verdict)}.{also}")
            : string.Create(CultureInfo.InvariantCulture, $"{column.Id} shows an offset of {deviation:+0.0;-0.0} mV (± {1000 * k * sd:0.0} mV): {Describe(verdict)}.{also}");
        return new PartFinding(column.Id, column.Label, column.Kind, column.NominalValue, column.Unit, effective, lower, upper, deviation, mean, sd, verdict, alternatives, sentence);
    }

    private static string Describe(PartVerdict verdict) => verdict switch
    {
        PartVerdict.OutOfTolerance => "out of tolerance, replace it",
        PartVerdict.Drifted => "drifted past its tolerance, check it",
        PartVerdict.CannotDecide => "cannot decide, record longer or add a channel",
        _ => "within tolerance",
    };

    /// <summary>Attaches the finding's dependence on the uncalibrated probe gains; a dependent finding becomes "cannot decide" and says what a calibration would give.</summary>
    private static PartFinding WithGainDependence(
        LinearGaussianModel model,
        IReadOnlyList<DiagnosisColumn> columns,
        IReadOnlyList<ColumnGroup> groups,
        ScoredHypothesis winner,
        IReadOnlyList<int> loose,
        PartFinding finding,
        DiagnosisResult? calibrated,
        DiagnosisOptions options)
    {
        var j = columns.ToList().FindIndex(column => column.Id == finding.PartId);
        var group = groups.FirstOrDefault(g => g.Members.Contains(j));
        if (j < 0 || group is null)
        {
            return finding;
        }

        // Freed in the winner is the group's representative; a member's figures are the representative's scaled by their ratio.
        var representative = group.Representative;
        var (coefficients, cosineSquared) = model.SpanFit(representative, loose);
        var known = columns.Select((column, k) => loose.Contains(k) ? 0 : winner.Freed.Contains(k) ? column.FaultSd * column.FaultSd : column.HealthySd * column.HealthySd).ToArray();
        var sdKnown = model.Evaluate(known).Sds[representative];
        var sd = winner.Hypothesis.Posterior[representative].Sd;
        var share = sd > 0 ? Math.Clamp(1 - (sdKnown * sdKnown / (sd * sd)), 0, 1) : 0;
        var mean = winner.Hypothesis.Posterior[representative].Mean;
        var mimicking = cosineSquared >= options.GainMimicCosineSquared
            ? loose.Select((k, i) => new ChannelGainDeviation(columns[k].Id.StartsWith("gain:", StringComparison.Ordinal) ? columns[k].Id["gain:".Length..] : columns[k].Id, 100 * (Math.Exp(coefficients[i] * mean) - 1)))
                .Where(gain => Math.Abs(gain.DeviationPercent) >= 0.05).ToList()
            : [];
        var depends = mimicking.Count > 0 && share >= options.GainVarianceShare;
        var ratio = finding.LogDeviationSd > 0 && sd > 0 ? finding.LogDeviationSd / sd : 1;
        var calibratedSd = calibrated?.Resolutions.FirstOrDefault(r => r.ColumnId == finding.PartId)?.FreedSd ?? finding.LogDeviationSd;
        var calibratedWinner = calibrated?.Winner ?? winner.Hypothesis;
        var dependence = new ProbeGainDependence(depends, cosineSquared, share, mimicking, calibrated is null ? finding.LogDeviationSd : calibratedSd, calibratedWinner.Describe(), calibratedWinner.Probability);
        if (!depends)
        {
            return finding with { GainDependence = dependence };
        }

        var invariant = CultureInfo.InvariantCulture;
        var isValue = finding.Kind is DiagnosisColumnKind.PartValue;
        var deviation = isValue ? string.Create(invariant, $"{finding.Deviation:+0.0;-0.0} %") : string.Create(invariant, $"{finding.Deviation:+0.0;-0.0} mV");
        var gains = string.Join(", ", mimicking.Select(gain => string.Create(invariant, $"{(gain.Channel == "common" ? "every calibrated channel" : gain.Channel)} {gain.DeviationPercent:+0.0;-0.0} %")));
        var sentence = string.Create(invariant, $"{finding.PartId} {deviation} or probe gains {gains}: this capture cannot tell the part from the probe gains (they carry {100 * share:0} % of its uncertainty).");
        if (calibrated is not null)
        {
            var spread = isValue ? string.Create(invariant, $"± {100 * options.IntervalSigmas * calibratedSd * ratio:0.0} %") : string.Create(invariant, $"± {1000 * options.IntervalSigmas * calibratedSd:0.0} mV");
            var calibratedGroup = calibrated.Groups.FirstOrDefault(g => g.MemberIds.Contains(finding.PartId));
            var favoured = calibratedGroup is not null && calibratedWinner.FreedGroups.Contains(calibratedGroup.RepresentativeId)
                ? $"{finding.PartId} deviating"
                : calibratedWinner.Describe();
            sentence += string.Create(invariant, $" Record a calibration capture to decide (every probe on one node, docs/probe-calibration.md): with it {finding.PartId} would be resolved to {spread}, and if the probes read as this capture suggests, the evidence would favour {favoured} (probability {calibratedWinner.Probability:0.00}).");
        }
        else
        {
            sentence += " Record a calibration capture to decide (every probe on one node, docs/probe-calibration.md).";
        }

        return finding with { Verdict = PartVerdict.CannotDecide, Sentence = sentence, GainDependence = dependence };
    }

    /// <summary>The same problem as a calibration capture would leave it: the uncalibrated gains pinned to the calibrated sd around
    /// the values this capture suggests (the rows corrected by them), and a common gain, the reference probe's own error, at the probe tolerance.</summary>
    private static DiagnosisProblem WithCalibratedGains(DiagnosisProblem problem, DiagnosisHypothesis winner, IReadOnlyList<int> uncalibrated, DiagnosisOptions options)
    {
        var rows = problem.Rows.Select((row, i) => row with { Value = row.Value - uncalibrated.Sum(j => problem.Columns[j].Entries[i] * winner.Posterior[j].Mean) }).ToList();
        var columns = problem.Columns.Select((column, j) => uncalibrated.Contains(j)
            ? column with { HealthySd = options.CalibratedGainLogSd, FaultSd = options.CalibratedGainLogSd, PinnedByCalibration = true }
            : column).ToList();
        if (columns.All(column => column.Id != DiagnosisColumn.CommonGainId))
        {
            var entries = problem.Rows.Select((_, i) => uncalibrated.Sum(j => problem.Columns[j].Entries[i])).ToArray();
            var sd = uncalibrated.Max(j => problem.Columns[j].HealthySd);
            columns.Add(DiagnosisColumn.ForChannelGain("common", Math.Exp(2 * sd) - 1, entries, sd) with
            {
                Id = DiagnosisColumn.CommonGainId,
                Label = "the gain every calibrated probe shares (the reference probe's own error)",
            });
        }

        return new DiagnosisProblem(rows, columns, problem.Covariance);
    }

    /// <summary>For a within-tolerance verdict: the parts that in-tolerance probe gains can mimic and that this capture cannot
    /// check to their band, so that "within tolerance" is not read as a clean bill for them.</summary>
    private static string HiddenByProbeGains(LinearGaussianModel model, IReadOnlyList<DiagnosisColumn> columns, IReadOnlyList<int> loose, IReadOnlyList<PartResolution> resolutions, DiagnosisOptions options, string what, string advice)
    {
        // Offsets ride along: their tolerance (millivolts) leaves them nearly free on the rows they touch, so a gain pattern
        // that reproduces a part everywhere except on a constant term's row still hides that part.
        // A part the offsets mimic on their own is not the gains' doing and is left out.
        var offsets = columns.Select((column, j) => (column, j))
            .Where(pair => pair.column.Kind is DiagnosisColumnKind.PartOffset or DiagnosisColumnKind.ChannelOffset && model.IsObservable(pair.j))
            .Select(pair => pair.j).ToList();
        var span = loose.Concat(offsets).ToList();
        var hidden = columns.Select((column, j) => (column, j))
            .Where(pair => pair.column.Kind is DiagnosisColumnKind.PartValue && model.IsObservable(pair.j)
                && model.SpanFit(pair.j, span).CosineSquared >= options.GainMimicCosineSquared
                && (offsets.Count == 0 || model.SpanFit(pair.j, offsets).CosineSquared < options.GainMimicCosineSquared))
            .Select(pair => (pair.column, sd: resolutions.First(r => r.ColumnId == pair.column.Id).FreedSd))
            .Where(pair => options.IntervalSigmas * pair.sd > pair.column.ToleranceBand)
            .ToList();
        return hidden.Count == 0
            ? ""
            : string.Create(CultureInfo.InvariantCulture,
                $" But {what} could hide a deviation of up to ± {100 * options.IntervalSigmas * hidden.Max(pair => pair.sd):0.0} % in {string.Join(", ", hidden.Select(pair => pair.column.Id))}: {advice}.");
    }

    /// <summary>Names the parts that probe gains can mimic and what a calibration would resolve them to.</summary>
    private static void NoteWhatACalibrationBuys(LinearGaussianModel model, IReadOnlyList<DiagnosisColumn> columns, IReadOnlyList<int> loose, IReadOnlyList<PartResolution> resolutions, DiagnosisOptions options, List<string> notes)
    {
        var invariant = CultureInfo.InvariantCulture;
        var mimicked = columns.Select((column, j) => (column, j))
            .Where(pair => pair.column.IsFaultCandidate && model.IsObservable(pair.j) && model.SpanFit(pair.j, loose).CosineSquared >= options.GainMimicCosineSquared)
            .Select(pair => (pair.column, resolution: resolutions.First(r => r.ColumnId == pair.column.Id)))
            .Where(pair => pair.resolution.FreedSdWithCalibration is { } withCalibration && withCalibration < 0.5 * pair.resolution.FreedSd)
            .Select(pair => pair.column.Kind is DiagnosisColumnKind.PartValue
                ? string.Create(invariant, $"{pair.column.Id} ± {100 * options.IntervalSigmas * pair.resolution.FreedSdWithCalibration!.Value:0.0} % (now ± {100 * options.IntervalSigmas * pair.resolution.FreedSd:0.0} %)")
                : string.Create(invariant, $"{pair.column.Id} ± {1000 * options.IntervalSigmas * pair.resolution.FreedSdWithCalibration!.Value:0.0} mV (now ± {1000 * options.IntervalSigmas * pair.resolution.FreedSd:0.0} mV)"))
            .ToList();
        if (mimicked.Count > 0)
        {
            notes.Add("Uncalibrated probe gains can mimic " + string.Join(", ", mimicked.Select(m => m.Split(' ')[0])) + ". A calibration capture (every probe on one node) would resolve them to " + string.Join(", ", mimicked) + ".");
        }
    }

    /// <summary>Names the likeliest deviation beside a verdict of "within tolerance" that fits only just.</summary>
    private static string BorderlineNote(IReadOnlyList<DiagnosisColumn> columns, IReadOnlyList<ColumnGroup> groups, ScoredHypothesis healthy, ScoredHypothesis suspect)
    {
        var parts = suspect.Freed.Select(j =>
        {
            var members = groups.First(group => group.Representative == j).Members.Where(m => columns[m].IsFaultCandidate).Select(m => columns[m].Id).ToList();
            return members.Count > 1 ? string.Join(" or ", members) + " (this capture cannot tell them apart)" : members.Single();
        });
        return string.Create(CultureInfo.InvariantCulture,
            $"Borderline: parts within tolerance explain the measurements only just (χ² p = {healthy.Hypothesis.FitPValue:0.###}). The likeliest deviation is {string.Join(", with ", parts)}, at probability {suspect.Hypothesis.Probability:0.##} against {healthy.Hypothesis.Probability:0.##} for no deviation. Checking it on the bench would settle it (measure a resistor or capacitor with the board powered down, as your lab's rules say).");
    }

    private static bool NamesOtherParts(IReadOnlyList<int> candidate, IReadOnlyList<int> winner) =>
        !candidate.All(winner.Contains) && !winner.All(candidate.Contains);

    private static IEnumerable<IReadOnlyList<int>> EnumerateHypotheses(IReadOnlyList<int> representatives, int maxFaults)
    {
        yield return [];
        if (maxFaults >= 1)
        {
            foreach (var a in representatives)
            {
                yield return [a];
            }
        }

        if (maxFaults >= 2)
        {
            for (var i = 0; i < representatives.Count; i++)
            {
                for (var k = i + 1; k < representatives.Count; k++)
                {
                    yield return [representatives[i], representatives[k]];
                }
            }
        }

        if (maxFaults >= 3)
        {
            for (var i = 0; i < representatives.Count; i++)
            {
                for (var k = i + 1; k < representatives.Count; k++)
                {
                    for (var l = k + 1; l < representatives.Count; l++)
                    {
                        yield return [representatives[i], representatives[k], representatives[l]];
                    }
                }
            }
        }
    }

    private static ScoredHypothesis Evaluate(LinearGaussianModel model, IReadOnlyList<DiagnosisColumn> columns, IReadOnlyList<int> freed, int candidateCount, DiagnosisOptions options)
    {
        var variances = columns.Select((column, j) => freed.Contains(j) ? column.FaultSd * column.FaultSd : column.HealthySd * column.HealthySd).ToArray();
        var (logEvidence, chiSquare, means, sds) = model.Evaluate(variances);
        var posterior = columns.Select((column, j) => new ColumnPosterior(column.Id, means[j], sds[j])).ToList();
        var logPrior = freed.Count * Math.Log(options.FaultPriorProbability) + (candidateCount - freed.Count) * Math.Log(1 - options.FaultPriorProbability);
        var pValue = 1 - ChiSquared.CDF(model.RowCount, chiSquare);
        string? rejected = null;
        for (var j = 0; j < columns.Count && rejected is null; j++)
        {
            if (columns[j].IsFaultCandidate && !freed.Contains(j) && Math.Abs(means[j]) > columns[j].ToleranceBand + sds[j])
            {
                rejected = string.Create(CultureInfo.InvariantCulture, $"needs {columns[j].Id}, which it calls healthy, well outside its band (u = {means[j]:0.####}, band {columns[j].ToleranceBand:0.####})");
            }
        }

        var names = freed.Select(j => columns[j].Id).ToList();
        return new ScoredHypothesis(freed, new DiagnosisHypothesis(names, logEvidence, logPrior, 0, chiSquare, model.RowCount, pValue, rejected, posterior));
    }

    private static List<ScoredHypothesis> Normalize(List<ScoredHypothesis> hypotheses)
    {
        var accepted = hypotheses.Where(h => h.Hypothesis.RejectedBecause is null).ToList();
        var pool = accepted.Count > 0 ? accepted : hypotheses;
        var max = pool.Max(h => h.LogPosterior);
        var total = pool.Sum(h => Math.Exp(h.LogPosterior - max));
        return hypotheses
            .Select(h => pool.Contains(h) ? h with { Hypothesis = h.Hypothesis with { Probability = Math.Exp(h.LogPosterior - max) / total } } : h)
            .OrderBy(h => pool.Contains(h) ? 0 : 1)
            .ThenByDescending(h => h.LogPosterior)
            .ToList();
    }

    private static List<ColumnGroup> FindGroups(LinearGaussianModel model, IReadOnlyList<DiagnosisColumn> columns, double parallelCosine)
    {
        var groups = new List<ColumnGroup>();
        var assigned = new HashSet<int>();
        for (var i = 0; i < columns.Count; i++)
        {
            if (!columns[i].IsFaultCandidate || !model.IsObservable(i) || assigned.Contains(i))
            {
                continue;
            }

            var members = new List<int> { i };
            for (var k = i + 1; k < columns.Count; k++)
            {
                if (columns[k].IsFaultCandidate && model.IsObservable(k) && !assigned.Contains(k) && Math.Abs(model.WhitenedCosine(i, k)) > parallelCosine)
                {
                    members.Add(k);
                }
            }

            assigned.UnionWith(members);
            groups.Add(new ColumnGroup(i, members));
        }

        return groups;
    }

    private sealed record ColumnGroup(int Representative, IReadOnlyList<int> Members);

    private sealed record ScoredHypothesis(IReadOnlyList<int> Freed, DiagnosisHypothesis Hypothesis)
    {
        public double LogPosterior => Hypothesis.LogEvidence + Hypothesis.LogPrior;
    }
}
