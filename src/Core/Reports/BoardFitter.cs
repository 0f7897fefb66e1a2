using System.Diagnostics;
using System.Globalization;
using Patchproof.Core.Captures;
using Patchproof.Core.Captures.Checks;
using Patchproof.Core.Circuits;
using Patchproof.Core.Diagnosis;
using Patchproof.Core.Estimation;
using Patchproof.Core.Estimation.MultipleShooting;

namespace Patchproof.Core.Reports;

/// <summary>Fits a board design to a capture and says which part drifted: the whole path from samples to findings.</summary>
/// <remarks>
/// <para>Steps: capture checks; the channel mapping; the design's terms as a polynomial vector field in volts and
/// seconds; noise per channel from second differences (floored by the quantization step / √12); clipped stretches
/// masked; hidden variables started by inverting an observed equation (Pecora-Carroll synchronization as the
/// fallback) and their amplitude pinned by part-tolerance priors; multiple shooting from the nominal coefficients;
/// then the part diagnosis on the fitted coefficients and offsets.</para>
/// <para>Findings are marked unsafe (the report's warnings) when the capture clipped, the record is too short, the fit
/// did not converge, or no explanation fits.</para>
/// </remarks>
public static class BoardFitter
{
    /// <summary>Fits <paramref name="design"/> to <paramref name="capture"/>.</summary>
    /// <param name="design">The board as drawn.</param>
    /// <param name="capture">The recording.</param>
    /// <param name="options">Mapping, probe gains, segment length.</param>
    /// <param name="clock">Stamps the report.</param>
    /// <returns>The report, or the errors that make the inputs unusable together (an unknown channel or variable, a non-uniform time base, an unsupported block).</returns>
    /// <exception cref="OperationCanceledException">When <see cref="BoardFitOptions.Cancellation"/> is cancelled.</exception>
    public static ParseResult<FitReport> Fit(BoardDesign design, Capture capture, BoardFitOptions options, TimeProvider clock)
    {
        var progress = new BoardFitProgressReporter(options.Progress, options.Cancellation, options.CompareInvariants);
        progress.Stage(0, "capture checks");
        var stopwatch = Stopwatch.StartNew();
        if (capture.TimeBase is not UniformTimeBase timeBase)
        {
            return Error("capture", "the capture's time base is not uniform; the fit needs evenly spaced samples");
        }

        var terms = design.Terms();
        if (terms.Any(term => term.Basis.Function is not null))
        {
            return Error("design", "the design has a function block (piecewise-linear); fitting such boards is not supported yet");
        }

        var variables = design.Variables.Select(v => v.Name).ToList();
        var mapping = options.Mapping.Count > 0
            ? options.Mapping
            : capture.Channels.Take(variables.Count).Select((channel, i) => new ChannelAssignment(channel.Name, variables[i], 1)).ToList();
        var channelIndex = new List<(ChannelAssignment Assignment, CaptureChannel Channel, int State)>();
        foreach (var assignment in mapping)
        {
            var channel = capture.FindChannel(assignment.Channel);
            if (channel is null)
            {
                return Error("--map", $"the capture has no channel '{assignment.Channel}' (it has {string.Join(", ", capture.Channels.Select(c => c.Name))})");
            }

            var state = variables.IndexOf(assignment.Variable);
            if (state < 0)
            {
                return Error("--map", $"the design has no variable '{assignment.Variable}' (it has {string.Join(", ", variables)})");
            }

            channelIndex.Add((assignment, channel, state));
        }

        if (channelIndex.Select(c => c.State).Distinct().Count() != channelIndex.Count)
        {
            return Error("--map", "two channels are mapped to one variable");
        }

        var checks = CaptureInspection.Run(capture);
        progress.Stage(0.05, "starting values");
        var warnings = new List<string>();
        var clipped = checks.Where(check => check.Id == "clipping").ToList();
        foreach (var check in clipped)
        {
            warnings.Add($"{check.Channel} clipped: the fit left out the clipped stretches, but the findings rest on less data and may be biased. Record again with a wider vertical range.");
        }

        var problemUnits = timeBase.DurationSeconds / design.TimeScaleSeconds;
        if (problemUnits < options.MinimumProblemUnits)
        {
            warnings.Add($"The record spans only {problemUnits:0.#} problem time units; at least {options.MinimumProblemUnits:0} are needed to identify the system. Record longer.");
        }

        var hasConstant = variables.Select(v => terms.Any(t => t.Variable == v && t.Basis.IsConstant)).ToList();
        var field = new PolynomialVectorField(
            variables,
            terms.Select(t => new PolynomialTerm(variables.IndexOf(t.Variable), t.Basis.Variables.Select(v => variables.IndexOf(v)).ToList(), t.Basis.ToString())).ToList(),
            hasConstant.Select(has => !has).ToList());
        var nominal = terms.Select(t => t.NominalCoefficient).Concat(field.OffsetEquations.Select(_ => 0.0)).ToArray();

        var gains = ProbeGainPriors.For(options, channelIndex.Select(c => c.Channel.Name));
        var shootingChannels = channelIndex.Select(entry =>
        {
            var samples = entry.Channel.Samples.Span.ToArray().Select(v => (double)v).ToArray();
            var clipLevels = clipped.Where(check => check.Channel == entry.Channel.Name).Select(check => check.Values["levelVolts"]).ToList();
            var excluded = samples.Select(v => clipLevels.Any(level => Math.Abs(v - level) <= 1e-6 * Math.Max(1, Math.Abs(level)))).ToArray();
            // Gains stay at their assumed values in the fit; the diagnosis carries them as nuisance columns with their prior.
            return new ShootingChannel(entry.Channel.Name, entry.State, entry.Assignment.Sign * gains.GainOf(entry.Channel.Name), NoiseSd(samples), samples)
            {
                Excluded = excluded.Any(x => x) ? excluded : null,
            };
        }).ToList();

        var observed = shootingChannels.ToDictionary(c => c.StateIndex, c => (IReadOnlyList<double>)c.Samples.Select(v => v / c.NominalGain).ToArray());
        var hidden = Enumerable.Range(0, variables.Count).Where(j => !observed.ContainsKey(j)).ToList();
        IReadOnlyList<double[]>? guess = null;
        var hiddenNotes = new List<string>();
        var priors = new List<ParameterPrior>();
        if (hidden.Count > 0)
        {
            guess = HiddenStateInversion.TryRecover(field, nominal, observed, timeBase.IntervalSeconds);
            var how = "inverted from an observed equation";
            if (guess is null)
            {
                var sync = PecoraCarrollSynchronizer.Synchronize(field, nominal, observed, timeBase.IntervalSeconds, design.MachineUnitVolts * 0.1);
                guess = sync.States;
                how = sync.Synchronizes ? "synchronized to the observed channels" : "synchronized to the observed channels, which did not converge";
                if (!sync.Synchronizes)
                {
                    warnings.Add("The hidden variables could not be synchronized to the recorded channels; record another channel.");
                }
            }

            hiddenNotes.AddRange(hidden.Select(j => $"{variables[j]} ({how})"));
            for (var t = 0; t < terms.Length; t++)
            {
                var tolerance = Math.Sqrt(terms[t].PartIds.Sum(id => Math.Pow(Math.Log(1 + (design.FindPart(id)?.Tolerance ?? 0.01)) / 3, 2)));
                priors.Add(new ParameterPrior(t, nominal[t], Math.Max(tolerance, 1e-3) * Math.Abs(nominal[t])));
            }
        }

        var segmentSeconds = options.SegmentProblemUnits * design.TimeScaleSeconds;
        progress.Stage(BoardFitProgressReporter.ShootingStart, "multiple shooting");
        var shooting = new MultipleShootingOptions { SegmentSeconds = segmentSeconds, ParameterPriors = priors, ChannelOffsetPriorSdVolts = options.ChannelOffsetPriorSdVolts };
        shooting = shooting with { Solver = shooting.Solver with { Progress = progress.Iterations, Cancellation = options.Cancellation } };
        var start = hidden.Count > 0 ? null : EquationErrorStartOf(design, field, shootingChannels, timeBase.IntervalSeconds);
        if (start is not null)
        {
            shooting = shooting with { Solver = shooting.Solver with { InitialDamping = MultipleShootingOptions.NearStartDamping } };
        }

        var fit = start is null
            ? MultipleShootingEstimator.Fit(field, nominal, shootingChannels, 0, timeBase.IntervalSeconds, shooting, guess)
            : MultipleShootingEstimator.Fit(field, start.Parameters, shootingChannels, 0, timeBase.IntervalSeconds, shooting, guess,
                shootingChannels.Select(c => start.StateOffsets[c.StateIndex] * c.NominalGain).ToList());
        if (!fit.Converged)
        {
            warnings.Add($"The fit stopped before converging ({fit.ExitReason}); treat its numbers as rough.");
        }

        warnings.AddRange(MisfitWarnings(shootingChannels, fit, options.MisfitNoiseRatioLimit));

        progress.Stage(progress.Checks, "structure and mapping checks");
        var structure = hidden.Count > 0
            ? StructureCheck.NotPerformed($"it needs every variable recorded, and {string.Join(", ", hidden.Select(j => variables[j]))} was not.")
            : CheckStructure(design, terms, variables, shootingChannels, fit, timeBase.IntervalSeconds);
        var mappingCheck = hidden.Count > 0
            ? MappingCheck.NotPerformed("it needs every variable recorded.")
            : CheckMapping(design, terms, variables, shootingChannels, timeBase.IntervalSeconds, structure);
        if (mappingCheck.BetterMappingFound)
        {
            warnings.Add(mappingCheck.Message);
        }

        if (structure.Findings.Count > 0)
        {
            warnings.Add("The board does not compute the design's equations (see the structure check): fix the wiring before trusting any part finding.");
        }

        progress.Stage(progress.Diagnosis, "part diagnosis");
        var channelOfVariable = channelIndex.ToDictionary(c => c.Assignment.Variable, c => c.Channel.Name);
        var diagnosisProblem = DesignDiagnosisBuilder.Build(design, terms, field, fit, channelOfVariable, gains.LogSds, gains.CalibratedChannels, gains.CommonLogSd, gains.CommonIsMeasured);
        var diagnosis = PartDiagnoser.Diagnose(diagnosisProblem);
        if (diagnosis.Outcome is DiagnosisOutcome.NoExplanationFits)
        {
            warnings.Add("No explanation by one or two drifted parts fits: suspect a wiring fault or a bad capture.");
        }

        var report = new FitReport(
            design.Board,
            design.Title,
            CoreAssembly.Version,
            clock.GetUtcNow(),
            new CaptureSummary(capture.SampleCount, timeBase.IntervalSeconds, timeBase.DurationSeconds, problemUnits, capture.Channels.Select(c => c.Name).ToList()),
            mapping,
            checks,
            diagnosis,
            Coefficients(design, terms, fit, observed.Keys.Select(j => variables[j]).ToHashSet()),
            Offsets(design, field, fit, variables),
            channelIndex.Select((entry, c) => new ChannelCorrection(entry.Channel.Name, entry.Assignment.Variable, entry.Assignment.Sign,
                fit.ChannelOffsetsVolts[c], fit.ChannelOffsetStandardErrors[c], fit.ChannelGains[c], Math.Abs(fit.ChannelGains[c]) * gains.LogSdOf(entry.Channel.Name), gains.SourceOf(entry.Channel.Name),
                fit.ResidualRmsVolts[c], gains.IsCalibrated(entry.Channel.Name))).ToList(),
            TimeConstants(design, diagnosis),
            new FitQuality("multiple shooting", fit.SegmentStates.Count, segmentSeconds, fit.Iterations, fit.ExitReason.ToString(), fit.Converged, fit.VarianceInflation, hiddenNotes, stopwatch.Elapsed.TotalSeconds),
            warnings)
        {
            StructureCheck = structure,
            MappingCheck = mappingCheck,
        };
        if (options.CompareInvariants)
        {
            progress.ComparisonStarts();
            var comparison = options.Comparison with { Progress = progress.Comparison, Cancellation = options.Cancellation };
            report = report with { Comparison = FitComparisonBuilder.Build(design, capture, report, comparison) };
        }

        progress.Stage(1, "done");
        return ParseResult<FitReport>.ForValue(report);
    }

    /// <summary>One warning per channel whose fitted residual is many times its noise floor.</summary>
    /// <remarks>A fit that describes the capture leaves residuals near the noise (a reduced χ² near 1); one that leaves
    /// many times more does not describe it, whatever its parts say: most often a channel read as the wrong variable or
    /// with the wrong sign, else a wiring fault or a disturbed recording.</remarks>
    private static IEnumerable<string> MisfitWarnings(List<ShootingChannel> channels, MultipleShootingResult fit, double limit)
    {
        for (var c = 0; c < channels.Count; c++)
        {
            var ratio = fit.ResidualRmsVolts[c] / channels[c].NoiseSdVolts;
            if (ratio > limit)
            {
                yield return string.Create(CultureInfo.InvariantCulture,
                    $"The fitted design does not reproduce {channels[c].Name}: its residual is {fit.ResidualRmsVolts[c] * 1e3:0.#} mV rms against a noise floor of {channels[c].NoiseSdVolts * 1e3:0.#} mV ({ratio:0}x). Check which channel records which variable, and its sign (the channel mapping), then the wiring; the findings are unsafe.");
            }
        }
    }

    /// <summary>Equation-error starting values (coefficients, offsets, channel offsets in closed form) for a fully recorded board.</summary>
    /// <remarks>Null when the regression cannot run or explains less than 90 % of some derivative: then the shooting starts from the nominal design.</remarks>
    private static EquationErrorStartResult? EquationErrorStartOf(BoardDesign design, PolynomialVectorField field, List<ShootingChannel> channels, double intervalSeconds)
    {
        var states = new double[field.StateCount][];
        var excluded = new bool[channels[0].Samples.Count];
        foreach (var channel in channels)
        {
            states[channel.StateIndex] = channel.Samples.Select(v => v / channel.NominalGain).ToArray();
            for (var i = 0; i < excluded.Length && channel.Excluded is { } mask; i++)
            {
                excluded[i] |= mask[i];
            }
        }

        var tau = design.TimeScaleSeconds;
        var options = new EquationErrorOptions { MaxWindowDuration = 0.05 * tau, BatchDuration = tau, Excluded = excluded };
        var start = EquationErrorStart.TryEstimate(field, states, intervalSeconds, options);
        return start is not null && start.RSquared.All(r => r >= 0.9) ? start : null;
    }

    /// <summary>Each variable's design terms, constants left out, as regression terms over the variables' indices.</summary>
    private static List<IReadOnlyList<RegressionTerm>> RegressionTerms(IReadOnlyList<DesignTerm> terms, List<string> variables) =>
        variables.Select(v => (IReadOnlyList<RegressionTerm>)terms.Where(t => t.Variable == v && !t.Basis.IsConstant)
            .Select(t => new RegressionTerm(t.Basis.ToString(), t.Basis.Variables.Select(name => variables.IndexOf(name)).ToList())).ToList()).ToList();

    /// <summary>The mapping check over the recorded channels, in problem time units, with the structure check's filter.</summary>
    private static MappingCheck CheckMapping(BoardDesign design, IReadOnlyList<DesignTerm> terms, List<string> variables, List<ShootingChannel> channels, double intervalSeconds, StructureCheckResult structure)
    {
        var ordered = channels.OrderBy(c => c.StateIndex).ToList();
        var samples = ordered.Select(c => c.Samples.ToArray()).ToList();
        var equations = RegressionTerms(terms, variables);
        var nominal = variables.Select(v => (IReadOnlyList<double>)terms.Where(t => t.Variable == v && !t.Basis.IsConstant).Select(t => t.NominalCoefficient).ToList()).ToList();
        var options = new EquationErrorOptions { Filter = structure.Performed ? (structure.FilterHalfWidth, structure.FilterOrder) : null };
        var ranking = ChannelMappingSearch.Rank(samples, intervalSeconds / design.TimeScaleSeconds, equations, nominal, options);
        var used = ordered.Select((c, k) => (k, Math.Sign(c.NominalGain))).ToList();
        return MappingCheck.Compare(ranking, used, variables, ordered.Select(c => c.Name).ToList());
    }

    /// <summary>The structure check on the channels corrected by the fit's offsets and gains, in problem time units.</summary>
    private static StructureCheckResult CheckStructure(BoardDesign design, IReadOnlyList<DesignTerm> terms, List<string> variables, List<ShootingChannel> channels, MultipleShootingResult fit, double intervalSeconds)
    {
        var states = new double[variables.Count][];
        var excluded = new bool[channels[0].Samples.Count];
        for (var c = 0; c < channels.Count; c++)
        {
            var channel = channels[c];
            var offset = fit.ChannelOffsetsVolts[c];
            var gain = fit.ChannelGains[c];
            states[channel.StateIndex] = channel.Samples.Select(v => (v - offset) / gain).ToArray();
            for (var i = 0; i < excluded.Length && channel.Excluded is { } mask; i++)
            {
                excluded[i] |= mask[i];
            }
        }

        var tau = design.TimeScaleSeconds;
        var equations = RegressionTerms(terms, variables);
        var nominal = variables.Select(v => (IReadOnlyList<double>)terms.Where(t => t.Variable == v && !t.Basis.IsConstant).Select(t => t.NominalCoefficient * tau).ToList()).ToList();
        return StructureCheck.Run(states, variables, intervalSeconds / tau, equations, nominal, fitOptions: new EquationErrorOptions { Excluded = excluded });
    }

    private static List<CoefficientEstimate> Coefficients(BoardDesign design, IReadOnlyList<DesignTerm> terms, MultipleShootingResult fit, HashSet<string> observed) =>
        terms.Select((term, t) => new CoefficientEstimate(
            term.Variable,
            term.Basis.ToString(),
            term.CoefficientUnit,
            term.NominalCoefficient,
            fit.Parameters[t],
            fit.StandardErrors[t],
            100 * (fit.Parameters[t] / term.NominalCoefficient - 1),
            design.ToProblemCoefficient(term),
            design.ToProblemCoefficient(term, fit.Parameters[t]),
            !observed.Contains(term.Variable) || !term.Basis.Variables.All(observed.Contains))).ToList();

    private static List<OffsetEstimate> Offsets(BoardDesign design, PolynomialVectorField field, MultipleShootingResult fit, IReadOnlyList<string> variables) =>
        field.OffsetEquations.Select((equation, k) =>
        {
            var integrator = design.Integrators.First(i => i.Variable == variables[equation]);
            var capacitance = design.NominalOf(integrator.CapacitorId);
            var conductance = integrator.Inputs.Sum(input => 1 / (design.NominalOf(input.ResistorId) * capacitance));
            var value = fit.Parameters[field.TermCount + k];
            return new OffsetEstimate(variables[equation], value, fit.StandardErrors[field.TermCount + k], 1000 * value / conductance);
        }).ToList();

    private static List<TimeConstantEstimate> TimeConstants(BoardDesign design, DiagnosisResult diagnosis) =>
        design.Integrators.Select(integrator =>
        {
            var posterior = diagnosis.Winner.Posterior.FirstOrDefault(p => p.ColumnId == integrator.CapacitorId);
            return new TimeConstantEstimate(integrator.Variable, integrator.CapacitorId, design.TimeScaleSeconds, design.TimeScaleSeconds * Math.Exp(posterior?.Mean ?? 0));
        }).ToList();

    /// <summary>Noise sd from the median absolute second difference (smooth signals cancel in it), floored by the quantization step / √12.</summary>
    private static double NoiseSd(double[] samples)
    {
        var differences = new double[Math.Max(1, samples.Length - 2)];
        for (var i = 1; i + 1 < samples.Length; i++)
        {
            differences[i - 1] = Math.Abs(samples[i + 1] - 2 * samples[i] + samples[i - 1]);
        }

        Array.Sort(differences);
        var fromDifferences = differences[differences.Length / 2] / (0.6745 * Math.Sqrt(6));
        var distinct = samples.Distinct().OrderBy(v => v).ToArray();
        var step = double.PositiveInfinity;
        for (var i = 1; i < distinct.Length; i++)
        {
            step = Math.Min(step, distinct[i] - distinct[i - 1]);
        }

        var quantization = double.IsFinite(step) ? step / Math.Sqrt(12) : 0;
        var noise = Math.Max(fromDifferences, quantization);
        return noise > 0 ? noise : 1e-6;
    }

    private static ParseResult<FitReport> Error(string field, string message) =>
        ParseResult<FitReport>.ForError(SourceDiagnostic.ErrorAt(field, 0, 0, message));
}
