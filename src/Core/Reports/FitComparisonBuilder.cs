using System.Collections.Immutable;
using System.Diagnostics;
using System.Globalization;
using Patchproof.Core.Captures;
using Patchproof.Core.Circuits;
using Patchproof.Core.Dynamics;
using Patchproof.Core.Estimation.MultipleShooting;

namespace Patchproof.Core.Reports;

/// <summary>Compares a capture with its fitted and nominal design on what survives chaos, and keeps the plot data behind each number.</summary>
/// <remarks>
/// <para>Model: both designs are the fit's polynomial vector field in volts and seconds,
/// dV_j/dt = Σ theta_t φ_t(V) + b_j, with the nominal coefficients (offsets 0) or the fitted ones (the report's
/// coefficients and offsets). States: each recorded channel with its fitted offset removed and divided by its signed
/// gain; a variable no channel recorded is rebuilt for the restarts by inverting an observed equation, else by
/// Pecora-Carroll synchronization, with the fitted coefficients, and is never drawn as capture.</para>
/// <para>Parts, in order (docs/dynamics.md has each method's rules): the Lyapunov spectra of both designs (Benettin,
/// variational equations, re-orthonormalized every problem time unit); the overlays (simulations restarted from the
/// capture's state every half Lyapunov time of the fitted design, decimated to at most 20,000 points a trace); the
/// predictability horizon of both designs over the recorded variables; free-running simulations of both designs from
/// the capture's first state, as long as the record; Rosenstein's exponent from a delay embedding of the first
/// recorded variable; the correlation dimension of the recorded variables in the capture and in the fitted
/// simulation; the return map of successive maxima; lobe switching; phase-plane occupancy with the Hellinger
/// distance; Welch spectra. A part that cannot be computed says why and the others go on.</para>
/// <para>References: 1. G. Benettin et al., Meccanica 15 (1980) 9-30. 2. M. T. Rosenstein, J. J. Collins,
/// C. J. De Luca, Physica D 65 (1993) 117-134. 3. P. Grassberger, I. Procaccia, Physica D 9 (1983) 189-208.
/// 4. E. N. Lorenz, J. Atmos. Sci. 20 (1963) 130-141. 5. P. D. Welch, IEEE Trans. Audio Electroacoust. 15 (1967)
/// 70-73. 6. L. Le Cam, G. L. Yang, Asymptotics in Statistics (2000), ch. 3 (Hellinger distance).</para>
/// </remarks>
public static class FitComparisonBuilder
{
    private const string Decimation = "capture time series: min/max per column (10,000 columns); simulated time series: LTTB; phase planes: equal arc length; at most 20,000 points a trace";

    // Weights: the parts' shares of the stage's time on a 100,000-sample, 3-channel capture (docs/performance.md).
    private static readonly ImmutableArray<ComparisonPart> Parts =
    [
        new("Lyapunov exponent from the capture (Rosenstein)", 5),
        new("correlation dimension of the capture", 6),
        new("Lyapunov spectrum of the fitted design", 2.3),
        new("Lyapunov spectrum of the nominal design", 2.3),
        new("fitted design run over the whole record", 0.5),
        new("nominal design run over the whole record", 0.5),
        new("overlays of the capture and both designs", 1.5),
        new("predictability horizons", 0.6),
        new("correlation dimension of the fitted design's run", 6),
        new("return map and lobes", 0.3),
        new("phase-plane occupancy", 0.3),
        new("power spectra", 1.5),
    ];

    private const string HellingerWhy = "needs no time alignment (only where the orbit spends its time, so chaos does not hurt it), is a metric bounded in [0, 1] comparable across planes and boards, and stays finite where one density has empty cells";

    /// <summary>Compares <paramref name="capture"/> with the nominal design and with the design as <paramref name="report"/> fitted it.</summary>
    /// <param name="design">The board design the report was fitted with.</param>
    /// <param name="capture">The capture the report was fitted to.</param>
    /// <param name="report">The fit's report: coefficients, offsets, channel gains and offsets.</param>
    /// <param name="options">Settings; null for the defaults.</param>
    /// <returns>The comparison; parts that could not be computed say why.</returns>
    /// <exception cref="OperationCanceledException">When <see cref="FitComparisonOptions.Cancellation"/> is cancelled; the parts already started have stopped by then.</exception>
    public static FitComparison Build(BoardDesign design, Capture capture, FitReport report, FitComparisonOptions? options = null)
    {
        ArgumentNullException.ThrowIfNull(design);
        ArgumentNullException.ThrowIfNull(capture);
        ArgumentNullException.ThrowIfNull(report);
        options ??= new FitComparisonOptions();
        var stopwatch = Stopwatch.StartNew();
        if (capture.TimeBase is not UniformTimeBase timeBase)
        {
            return FitComparison.NotComputed("the capture's time base is not uniform");
        }

        var terms = design.Terms();
        if (terms.Any(term => term.Basis.Function is not null))
        {
            return FitComparison.NotComputed("the design has a function block, which the fitted model cannot simulate yet");
        }

        var variables = design.Variables.Select(v => v.Name).ToList();
        var field = new PolynomialVectorField(
            variables,
            terms.Select(t => new PolynomialTerm(variables.IndexOf(t.Variable), t.Basis.Variables.Select(v => variables.IndexOf(v)).ToList(), t.Basis.ToString())).ToList(),
            variables.Select(v => !terms.Any(t => t.Variable == v && t.Basis.IsConstant)).ToList());
        if (report.Coefficients.Count != terms.Length || report.Offsets.Count != field.OffsetEquations.Count
            || report.Offsets.Where((offset, k) => offset.Equation != variables[field.OffsetEquations[k]]).Any())
        {
            return FitComparison.NotComputed("the report's coefficients do not belong to this design");
        }

        ImmutableArray<double> nominal = [.. terms.Select(t => t.NominalCoefficient), .. field.OffsetEquations.Select(_ => 0.0)];
        ImmutableArray<double> fitted = [.. report.Coefficients.Select(c => c.Estimate), .. report.Offsets.Select(o => o.VoltsPerSecond)];
        var context = States(capture, report, variables);
        if (context is null)
        {
            return FitComparison.NotComputed("the report's channels are not in the capture, or a gain is zero");
        }

        var (observed, recordedChannels) = context.Value;
        var n = capture.SampleCount;
        var dt = timeBase.IntervalSeconds;
        var tau = design.TimeScaleSeconds;
        if (!nominal.All(double.IsFinite) || !fitted.All(double.IsFinite) || n < 16)
        {
            return FitComparison.NotComputed(n < 16 ? "the record holds fewer than 16 samples" : "the fitted coefficients are not finite");
        }

        options.Cancellation.ThrowIfCancellationRequested();
        var (reference, hiddenNote) = FullState(field, fitted, observed, variables.Count, dt);
        var recordedStates = observed.Keys.Order().ToArray();
        var hidden = Enumerable.Range(0, variables.Count).Where(j => !observed.ContainsKey(j)).Select(j => $"{variables[j]} ({hiddenNote})").ToList();
        var settings = new ComparisonSettings(tau, dt, n, recordedStates.Select(j => variables[j]).ToList(), hidden, options.SimulationTolerance, TraceDecimation.DefaultPointBudget,
            "the fit's polynomial vector field in volts and seconds: nominal coefficients with zero offsets, or the fitted coefficients and offsets");

        // The parts run as tasks (longest first) so that a machine with more than one core overlaps them; each part
        // reads only the shared arrays and writes its own result.
        var runner = new ComparisonPartRunner(Parts, options.Progress, options.Cancellation);
        try
        {
            return Compare(runner, field, nominal, fitted, reference, recordedStates, variables, recordedChannels, settings, dt, tau, options, stopwatch);
        }
        catch (OperationCanceledException)
        {
            runner.WaitForStarted();
            throw;
        }
    }

    private static FitComparison Compare(ComparisonPartRunner runner, PolynomialVectorField field, ImmutableArray<double> nominal, ImmutableArray<double> fitted, double[][] reference, int[] recordedStates,
        IReadOnlyList<string> variables, Dictionary<int, string> recordedChannels, ComparisonSettings settings, double dt, double tau, FitComparisonOptions options, Stopwatch stopwatch)
    {
        var n = reference[0].Length;
        var cancellation = runner.Cancellation;
        var reasons = new List<string>();
        var startState = reference.Select(channel => channel[0]).ToArray();
        var captureLyapunovTask = runner.Start(0, () => CaptureExponent(reference, recordedStates, variables, recordedChannels, dt, tau, cancellation));
        var captureDimensionTask = runner.Start(1, () => DimensionOf("capture", reference, recordedStates, dt, cancellation));
        var fittedSpectrumTask = runner.Start(2, () => ModelSpectrum("fitted", field, startState, fitted, tau, options));
        var nominalSpectrumTask = runner.Start(3, () => ModelSpectrum("nominal", field, startState, nominal, tau, options));
        var fittedRunTask = runner.Start(4, () => Attempt(() => RestartedSimulation.Run(field, fitted, reference, dt, 0, n, options.SimulationTolerance, cancellation)));
        var nominalRunTask = runner.Start(5, () => Attempt(() => RestartedSimulation.Run(field, nominal, reference, dt, 0, n, options.SimulationTolerance, cancellation)));
        var fittedSpectrum = runner.Await(fittedSpectrumTask);
        var lambda = fittedSpectrum.Computed && fittedSpectrum.LargestPerSecond > 0 ? fittedSpectrum.LargestPerSecond : double.NaN;
        var overlaysTask = runner.Start(6, () => Overlays(field, nominal, fitted, reference, recordedStates, variables, dt, tau, lambda, options));
        var horizonTask = runner.Start(7, () => Horizons(field, nominal, fitted, reference, recordedStates, variables, dt, tau, lambda, options));
        var fittedRun = runner.Await(fittedRunTask);
        var nominalRun = runner.Await(nominalRunTask);
        var fittedSamples = fittedRun.Value?[0].Length ?? 0;
        if (fittedSamples < n)
        {
            reasons.Add(string.Create(CultureInfo.InvariantCulture, $"the fitted design's free run stopped after {fittedSamples * dt / tau:0.#} of {n * dt / tau:0.#} problem time units{(fittedRun.Reason.Length > 0 ? ": " + fittedRun.Reason : "")}"));
        }

        var fittedFree = fittedRun.Value is { } run && run[0].Length >= n / 2 ? run : null;
        var nominalFree = nominalRun.Value is { } other && other[0].Length >= n / 2 ? other : null;
        var fittedDimensionTask = runner.Start(8, () => DimensionOf("fitted", fittedFree, recordedStates, dt, cancellation));
        var (returnMap, lobes) = runner.Run(9, () => (ReturnMapOf(reference, fittedFree, recordedStates, variables, dt, options), LobesOf(reference, fittedFree, recordedStates, variables, dt, options)));
        var occupancy = runner.Run(10, () => OccupancyOf(reference, fittedFree, nominalFree, recordedStates, variables));
        var spectra = runner.Run(11, () => recordedStates.Select(j => SpectrumOf(recordedChannels[j], variables[j], reference[j], fittedFree?[j], nominalFree?[j], dt, cancellation)).ToList());
        var nominalSpectrum = runner.Await(nominalSpectrumTask);
        var overlays = runner.Await(overlaysTask);
        var horizon = runner.Await(horizonTask);
        var captureLyapunov = runner.Await(captureLyapunovTask);
        var dimension = new DimensionComparison(recordedStates.Select(j => variables[j]).ToList(), runner.Await(captureDimensionTask), runner.Await(fittedDimensionTask));

        foreach (var (computed, reason, what) in new (bool, string, string)[]
        {
            (fittedSpectrum.Computed, fittedSpectrum.Reason, "fitted Lyapunov spectrum"),
            (nominalSpectrum.Computed, nominalSpectrum.Reason, "nominal Lyapunov spectrum"),
            (overlays.Computed, overlays.Reason, "overlays"),
            (horizon.Fitted.Computed, horizon.Fitted.Reason, "fitted horizon"),
            (horizon.Nominal.Computed, horizon.Nominal.Reason, "nominal horizon"),
            (captureLyapunov.Computed, captureLyapunov.Reason, "exponent from the capture"),
            (dimension.Capture.Computed, dimension.Capture.Reason, "capture's correlation dimension"),
            (dimension.Fitted.Computed, dimension.Fitted.Reason, "fitted correlation dimension"),
            (returnMap.Computed, returnMap.Reason, "return map"),
            (lobes.Computed, lobes.Reason, "lobes"),
            (occupancy.Computed, occupancy.Reason, "occupancy"),
        })
        {
            if (!computed)
            {
                reasons.Add($"{what}: {reason}");
            }
        }

        reasons.AddRange(spectra.Where(s => !s.Computed).Select(s => $"{s.Channel} spectrum: {s.Reason}"));
        var invariants = Summary(fittedSpectrum, nominalSpectrum, captureLyapunov, horizon, dimension, returnMap, lobes, occupancy, spectra);
        return new FitComparison(true, string.Join("; ", reasons), settings, invariants, overlays, horizon,
            new ModelLyapunovComparison("Benettin: variational equations, modified Gram-Schmidt every problem time unit", fittedSpectrum, nominalSpectrum),
            captureLyapunov, dimension, returnMap, lobes, occupancy, spectra, stopwatch.Elapsed.TotalSeconds, runner.Timings);
    }

    /// <summary>Each recorded state in volts (offset removed, signed gain divided out), and the channel naming each state.</summary>
    private static (Dictionary<int, double[]> Observed, Dictionary<int, string> Channels)? States(Capture capture, FitReport report, IReadOnlyList<string> variables)
    {
        var observed = new Dictionary<int, double[]>();
        var channels = new Dictionary<int, string>();
        foreach (var correction in report.Channels)
        {
            var channel = capture.FindChannel(correction.Channel);
            var state = variables.ToList().IndexOf(correction.Variable);
            if (channel is null || state < 0 || correction.Gain == 0 || !double.IsFinite(correction.Gain) || observed.ContainsKey(state))
            {
                return null;
            }

            var samples = channel.Samples.Span;
            var values = new double[samples.Length];
            for (var i = 0; i < values.Length; i++)
            {
                values[i] = (samples[i] - correction.OffsetVolts) / correction.Gain;
            }

            observed[state] = values;
            channels[state] = correction.Channel;
        }

        return observed.Count == 0 ? null : (observed, channels);
    }

    /// <summary>The full state per variable: recorded ones as given, hidden ones rebuilt with the fitted coefficients.</summary>
    private static (double[][] Reference, string HiddenNote) FullState(PolynomialVectorField field, ImmutableArray<double> fitted, Dictionary<int, double[]> observed, int stateCount, double dt)
    {
        var n = observed.Values.First().Length;
        var reference = new double[stateCount][];
        foreach (var (state, values) in observed)
        {
            reference[state] = values;
        }

        if (observed.Count == stateCount)
        {
            return (reference, "");
        }

        var view = observed.ToDictionary(pair => pair.Key, pair => (IReadOnlyList<double>)pair.Value);
        var note = "inverted from an observed equation with the fitted coefficients";
        var rows = HiddenStateInversion.TryRecover(field, fitted, view, dt);
        if (rows is null)
        {
            var sync = PecoraCarrollSynchronizer.Synchronize(field, fitted, view, dt);
            rows = sync.States;
            note = sync.Synchronizes ? "synchronized to the recorded channels" : "synchronized to the recorded channels, which did not converge";
        }

        for (var j = 0; j < stateCount; j++)
        {
            if (reference[j] is null)
            {
                var values = new double[n];
                for (var i = 0; i < n; i++)
                {
                    values[i] = rows[i][j];
                }

                reference[j] = values;
            }
        }

        return (reference, note);
    }

    private static ModelLyapunovEstimate ModelSpectrum(string role, PolynomialVectorField field, double[] start, ImmutableArray<double> parameters, double tau, FitComparisonOptions options)
    {
        var outcome = Attempt(() => BenettinLyapunovSpectrum.Compute(field, start, parameters.AsSpan(), options.LyapunovProblemUnits * tau, new BenettinOptions
        {
            ReorthonormalizationInterval = tau,
            Transient = options.LyapunovTransientProblemUnits * tau,
            Tolerance = options.LyapunovTolerance,
            Cancellation = options.Cancellation,
        }));
        if (outcome.Value is not { } spectrum || spectrum.Steps == 0)
        {
            return new ModelLyapunovEstimate(role, false, outcome.Value?.Problem ?? outcome.Reason, [], [], double.NaN, double.NaN, double.NaN, double.NaN, 0, 0);
        }

        var largest = spectrum.Exponents[0];
        return new ModelLyapunovEstimate(role, true, spectrum.Problem ?? "", spectrum.Exponents, [.. spectrum.Exponents.Select(e => e * tau)], largest, largest * tau,
            largest > 0 ? 1 / largest : double.NaN, spectrum.KaplanYorkeDimension, spectrum.Duration, spectrum.Duration / tau);
    }

    private static OverlayComparison Overlays(PolynomialVectorField field, ImmutableArray<double> nominal, ImmutableArray<double> fitted, double[][] reference, int[] recorded, IReadOnlyList<string> variables, double dt, double tau, double lambda, FitComparisonOptions options)
    {
        var n = reference[0].Length;
        var interval = double.IsFinite(lambda) ? options.RestartLyapunovTimes / lambda : 0.5 * tau;
        interval = Math.Clamp(interval, dt, Math.Max(dt, (n - 1) * dt));
        var outcome = Attempt(() => OverlaySeries.Build(reference, dt, field, [new OverlayDesign("nominal", nominal), new OverlayDesign("fitted", fitted)], interval, options.SimulationTolerance, options.Cancellation));
        if (outcome.Value is not { } traces)
        {
            return new OverlayComparison(false, outcome.Reason, [], [], interval, double.NaN, [], Decimation);
        }

        var roles = new[] { "capture", "nominal", "fitted" };
        var timeSeries = variables.Select((name, j) => new PlotPanel($"{name} against time", "time from the record's start (s)", $"{name} (V)",
            traces.Select((record, r) => (record, r)).Where(pair => pair.r > 0 || recorded.Contains(j))
                .Select(pair => new PlotTrace(roles[pair.r], pair.record.TimeSeries[j].X, pair.record.TimeSeries[j].Y)).ToList())).ToList();
        var planes = traces[0].PhasePlanes.Select((plane, p) => new PlotPanel($"{variables[plane.YChannel]} against {variables[plane.XChannel]}", $"{variables[plane.XChannel]} (V)", $"{variables[plane.YChannel]} (V)",
            traces.Select((record, r) => (record, r)).Where(pair => pair.r > 0 || (recorded.Contains(plane.XChannel) && recorded.Contains(plane.YChannel)))
                .Select(pair => new PlotTrace(roles[pair.r], pair.record.PhasePlanes[p].Trace.X, pair.record.PhasePlanes[p].Trace.Y)).ToList())).ToList();
        return new OverlayComparison(true, "", timeSeries, planes, interval, double.IsFinite(lambda) ? interval * lambda : double.NaN, traces[2].RestartTimes, Decimation);
    }

    private static HorizonComparison Horizons(PolynomialVectorField field, ImmutableArray<double> nominal, ImmutableArray<double> fitted, double[][] reference, int[] recorded, IReadOnlyList<string> variables, double dt, double tau, double lambda, FitComparisonOptions options)
    {
        var n = reference[0].Length;
        var maximum = Math.Min(options.HorizonMaximumProblemUnits * tau, 0.5 * (n - 1) * dt);
        var predictability = new PredictabilityOptions
        {
            Restarts = options.HorizonRestarts,
            BandStandardDeviations = options.HorizonBandStandardDeviations,
            MaximumHorizon = maximum,
            Tolerance = options.SimulationTolerance,
            ScoredStates = recorded,
            Cancellation = options.Cancellation,
        };

        HorizonEstimate Measure(string role, ImmutableArray<double> parameters)
        {
            if (maximum < 10 * dt)
            {
                return new HorizonEstimate(role, false, "the record is too short for restarts", double.NaN, double.NaN, double.NaN, double.NaN, 0, [], []);
            }

            var outcome = Attempt(() => PredictabilityHorizon.Measure(field, parameters.AsSpan(), reference, dt, 1.0, lambda, predictability));
            if (outcome.Value is not { } result)
            {
                return new HorizonEstimate(role, false, outcome.Reason, double.NaN, double.NaN, double.NaN, double.NaN, 0, [], []);
            }

            return new HorizonEstimate(role, true, "", result.MeanHorizon, result.MedianHorizon, result.MeanHorizon / tau, result.MeanHorizonLyapunovTimes, result.CensoredCount, result.RestartTimes, result.Horizons);
        }

        return new HorizonComparison(options.HorizonBandStandardDeviations, maximum, recorded.Select(j => variables[j]).ToList(), Measure("fitted", fitted), Measure("nominal", nominal));
    }

    private static CaptureLyapunovEstimate CaptureExponent(double[][] reference, int[] recorded, IReadOnlyList<string> variables, Dictionary<int, string> channels, double dt, double tau, CancellationToken cancellation)
    {
        var state = recorded[0];
        var outcome = Attempt(() => RosensteinLyapunov.EstimateFromSeries(reference[state], dt, new RosensteinOptions { Cancellation = cancellation }));
        if (outcome.Value is not { } result)
        {
            return new CaptureLyapunovEstimate(false, outcome.Reason, channels[state], variables[state], double.NaN, double.NaN, 0, 0, 0, "", [], [], 0, 0, [], [], null);
        }

        var embedding = result.Embedding;
        var reason = result.Status switch
        {
            EstimateStatus.Estimated => "",
            EstimateStatus.TooShort => "the record is too short for Rosenstein's method",
            _ => "the divergence curve has no straight stretch the rule accepts",
        };
        return new CaptureLyapunovEstimate(result.Status == EstimateStatus.Estimated, reason, channels[state], variables[state], result.LargestExponentPerSecond, result.LargestExponentPerSecond * tau,
            embedding?.Delay ?? 0, (embedding?.Delay ?? 0) * dt, embedding?.Dimension ?? 0, embedding?.DelayRule.ToString() ?? "",
            embedding?.MutualInformationBits ?? [], embedding?.FalseNeighbourFractions ?? [], result.TemporalExclusionSamples, result.ReferencePointCount,
            result.DivergenceTimesSeconds, result.MeanLogDivergence, Line(result.Fit, result.DivergenceTimesSeconds));
    }

    private static CorrelationDimensionEstimate DimensionOf(string role, double[][]? channels, int[] recorded, double dt, CancellationToken cancellation)
    {
        if (channels is null)
        {
            return new CorrelationDimensionEstimate(role, false, "the fitted design's simulation did not run", double.NaN, [], [], [], null, 0, 0);
        }

        var outcome = Attempt(() => CorrelationDimension.EstimateFromChannels(recorded.Select(j => channels[j]).ToArray(), dt, new CorrelationDimensionOptions { Cancellation = cancellation }));
        if (outcome.Value is not { } result)
        {
            return new CorrelationDimensionEstimate(role, false, outcome.Reason, double.NaN, [], [], [], null, 0, 0);
        }

        var reason = result.Status switch
        {
            EstimateStatus.Estimated => "",
            EstimateStatus.TooShort => "the record is too short for the Grassberger-Procaccia method",
            _ => "the local slopes have no shelf with enough pairs",
        };
        return new CorrelationDimensionEstimate(role, result.Status == EstimateStatus.Estimated, reason, result.Dimension, result.LogRadius, result.LogCorrelationSum, result.LocalSlopes,
            Line(result.Fit, result.LogRadius), result.TheilerWindowSamples, result.ReferencePointCount);
    }

    private static ReturnMapComparison ReturnMapOf(double[][] reference, double[][]? fittedRun, int[] recorded, IReadOnlyList<string> variables, double dt, FitComparisonOptions options)
    {
        var rule = "the recorded variable whose map of successive maxima scatters least about its two branches, relative to its range";
        var candidates = recorded;
        if (options.ReturnMapVariable is { } chosen)
        {
            var index = variables.ToList().IndexOf(chosen);
            if (!recorded.Contains(index))
            {
                return new ReturnMapComparison(false, $"'{chosen}' is not a recorded variable", chosen, "given", null, null);
            }

            candidates = [index];
            rule = "given";
        }

        var maps = candidates.Select(j => (State: j, Map: ReturnMaps.OfMaxima(reference[j], dt))).ToList();
        var shaped = maps.Where(m => m.Map.Shape is { } shape && shape.MaximumValue > shape.MinimumValue && double.IsFinite(shape.ResidualRms)).ToList();
        if (shaped.Count == 0)
        {
            var best = maps[0];
            return new ReturnMapComparison(false, $"fewer than 8 maxima of {variables[best.State]} in the record, or no shape could be fitted", variables[best.State], rule, Series("capture", best.Map), null);
        }

        var (state, map) = shaped.MinBy(m => m.Map.Shape!.ResidualRms / (m.Map.Shape.MaximumValue - m.Map.Shape.MinimumValue));
        if (fittedRun is null)
        {
            return new ReturnMapComparison(false, "the fitted design's simulation did not run", variables[state], rule, Series("capture", map), null);
        }

        return new ReturnMapComparison(true, "", variables[state], rule, Series("capture", map), Series("fitted", ReturnMaps.OfMaxima(fittedRun[state], dt)));
    }

    private static ReturnMapSeries Series(string role, ReturnMap map)
    {
        var values = map.MaximaValues;
        var current = values.Length > 1 ? values[..^1] : [];
        var next = values.Length > 1 ? values[1..] : [];
        var shape = map.Shape;
        return shape is null
            ? new ReturnMapSeries(role, current, next, false, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, false)
            : new ReturnMapSeries(role, current, next, true, shape.ApexInput, shape.ApexOutput, shape.LeftSlope, shape.RightSlope, shape.FixedPoint, shape.ResidualRms, shape.IsExpandingSingleHump);
    }

    private static LobeComparison LobesOf(double[][] reference, double[][]? fittedRun, int[] recorded, IReadOnlyList<string> variables, double dt, FitComparisonOptions options)
    {
        var candidates = recorded;
        if (options.LobeVariable is { } chosen)
        {
            var index = variables.ToList().IndexOf(chosen);
            if (!recorded.Contains(index))
            {
                return new LobeComparison(false, $"'{chosen}' is not a recorded variable", chosen, 0, null, null);
            }

            candidates = [index];
        }

        foreach (var j in candidates)
        {
            var statistics = LobeSwitching.Analyze(reference[j], dt);
            if (!statistics.IsTwoLobed)
            {
                continue;
            }

            var duration = reference[j].Length * dt;
            var capture = Lobe("capture", statistics, duration);
            if (fittedRun is null)
            {
                return new LobeComparison(false, "the fitted design's simulation did not run", variables[j], 0, capture, null);
            }

            var simulated = LobeSwitching.Analyze(fittedRun[j], dt);
            return new LobeComparison(true, "", variables[j], 0, capture, Lobe("fitted", simulated, fittedRun[j].Length * dt));
        }

        return new LobeComparison(false, "no recorded variable has two lobes about 0 V (both holding 10 % of the time, 3 switches or more)", "", 0, null, null);
    }

    private static LobeEstimate Lobe(string role, LobeStatistics statistics, double durationSeconds) =>
        new(role, statistics.SwitchCount, statistics.SwitchesPerSecond(durationSeconds), statistics.MeanResidenceSeconds(), statistics.PositiveFraction, statistics.IsTwoLobed,
            [.. statistics.PositiveResidenceSeconds, .. statistics.NegativeResidenceSeconds]);

    private static OccupancyComparison OccupancyOf(double[][] reference, double[][]? fittedRun, double[][]? nominalRun, int[] recorded, IReadOnlyList<string> variables)
    {
        const int bins = OccupancyDensities.DefaultBins;
        const double smoothing = OccupancyDensities.DefaultSmoothingCells;
        if (recorded.Length < 2)
        {
            return new OccupancyComparison(false, "one recorded variable makes no phase plane", "Hellinger", HellingerWhy, bins, smoothing, []);
        }

        if (fittedRun is null)
        {
            return new OccupancyComparison(false, "the fitted design's simulation did not run", "Hellinger", HellingerWhy, bins, smoothing, []);
        }

        var capture = recorded.Select(j => reference[j]).ToArray();
        var fitted = OccupancyDensities.Compare(capture, recorded.Select(j => fittedRun[j]).ToArray(), bins, smoothing);
        var nominal = nominalRun is null ? null : OccupancyDensities.Compare(capture, recorded.Select(j => nominalRun[j]).ToArray(), bins, smoothing);
        var planes = fitted.Select((plane, p) =>
        {
            var grid = plane.Capture;
            var xCentres = Enumerable.Range(0, bins).Select(i => grid.XMinimum + (i + 0.5) * (grid.XMaximum - grid.XMinimum) / bins).ToArray();
            var yCentres = Enumerable.Range(0, bins).Select(i => grid.YMinimum + (i + 0.5) * (grid.YMaximum - grid.YMinimum) / bins).ToArray();
            return new OccupancyPlane(variables[recorded[plane.XChannel]], variables[recorded[plane.YChannel]], plane.HellingerDistance, nominal?[p].HellingerDistance ?? double.NaN,
                xCentres, yCentres, Rows(grid.Probabilities, bins), Rows(plane.Simulation.Probabilities, bins),
                Rows([.. grid.Probabilities.Zip(plane.Simulation.Probabilities, (a, b) => a - b)], bins));
        }).ToList();
        return new OccupancyComparison(true, nominalRun is null ? "the nominal design's simulation did not run" : "", "Hellinger", HellingerWhy, bins, smoothing, planes);
    }

    private static double[][] Rows(double[] cells, int bins) =>
        [.. Enumerable.Range(0, bins).Select(row => cells[(row * bins)..((row + 1) * bins)])];

    private static ChannelSpectrum SpectrumOf(string channel, string variable, double[] capture, double[]? fitted, double[]? nominal, double dt, CancellationToken cancellation)
    {
        var segment = WelchSpectrum.DefaultSegmentLength(capture.Length);
        if (capture.Length < 64)
        {
            return new ChannelSpectrum(channel, variable, false, "fewer than 64 samples", [], [], [], [], double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, 0, 0);
        }

        var captured = WelchSpectrum.Estimate(capture, dt, segment, cancellation);
        PowerSpectrum? Of(double[]? values) => values is { } v && v.Length >= segment ? WelchSpectrum.Estimate(v, dt, segment, cancellation) : null;
        var fittedSpectrum = Of(fitted);
        var nominalSpectrum = Of(nominal);
        double Peak(PowerSpectrum? s) => s is null ? double.NaN : s.FrequenciesHertz[s.PeakBin()];
        double Mean(PowerSpectrum? s) => s is null ? double.NaN : s.MeanFrequencyHertz();
        var reason = fittedSpectrum is null ? "the fitted design's simulation did not run" : nominalSpectrum is null ? "the nominal design's simulation did not run" : "";
        return new ChannelSpectrum(channel, variable, fittedSpectrum is not null, reason, captured.FrequenciesHertz, captured.Density, fittedSpectrum?.Density ?? [], nominalSpectrum?.Density ?? [],
            Peak(captured), Peak(fittedSpectrum), Peak(nominalSpectrum), Mean(captured), Mean(fittedSpectrum), Mean(nominalSpectrum), captured.SegmentLength, captured.SegmentCount);
    }

    private static List<InvariantLine> Summary(ModelLyapunovEstimate fitted, ModelLyapunovEstimate nominal, CaptureLyapunovEstimate capture, HorizonComparison horizon, DimensionComparison dimension,
        ReturnMapComparison returnMap, LobeComparison lobes, OccupancyComparison occupancy, IReadOnlyList<ChannelSpectrum> spectra)
    {
        var lines = new List<InvariantLine>
        {
            new("largest Lyapunov exponent", "1/s", capture.LargestPerSecond, fitted.LargestPerSecond, nominal.LargestPerSecond),
            new("largest Lyapunov exponent per problem time unit", "1/unit", capture.LargestPerProblemUnit, fitted.LargestPerProblemUnit, nominal.LargestPerProblemUnit),
            new("Kaplan-Yorke dimension", "", double.NaN, fitted.KaplanYorkeDimension, nominal.KaplanYorkeDimension),
            new("predictability horizon", "s", double.NaN, horizon.Fitted.MeanSeconds, horizon.Nominal.MeanSeconds),
            new("predictability horizon in Lyapunov times", "Lyapunov times", double.NaN, horizon.Fitted.MeanLyapunovTimes, horizon.Nominal.MeanLyapunovTimes),
            new("correlation dimension", "", dimension.Capture.Dimension, dimension.Fitted.Dimension, double.NaN),
        };
        if (returnMap.Capture is { } mapOfCapture)
        {
            lines.Add(new($"return map of {returnMap.Variable} maxima: fixed point", "V", mapOfCapture.FixedPointVolts, returnMap.Fitted?.FixedPointVolts ?? double.NaN, double.NaN));
            lines.Add(new($"return map of {returnMap.Variable} maxima: apex", "V", mapOfCapture.ApexOutputVolts, returnMap.Fitted?.ApexOutputVolts ?? double.NaN, double.NaN));
        }

        if (lobes.Capture is { } lobesOfCapture)
        {
            lines.Add(new($"lobe switches of {lobes.Variable}", "1/s", lobesOfCapture.SwitchesPerSecond, lobes.Fitted?.SwitchesPerSecond ?? double.NaN, double.NaN));
            lines.Add(new($"time in the positive lobe of {lobes.Variable}", "fraction", lobesOfCapture.PositiveFraction, lobes.Fitted?.PositiveFraction ?? double.NaN, double.NaN));
        }

        lines.AddRange(occupancy.Planes.Select(plane => new InvariantLine($"Hellinger distance of the {plane.YVariable}-{plane.XVariable} occupancy to the capture", "", double.NaN, plane.FittedDistance, plane.NominalDistance)));
        lines.AddRange(spectra.Select(s => new InvariantLine($"mean frequency of {s.Channel} ({s.Variable})", "Hz", s.CaptureMeanHertz, s.FittedMeanHertz, s.NominalMeanHertz)));
        return lines;
    }

    private static FittedLine? Line(ScalingRegion? region, double[] x) =>
        region is null ? null : new FittedLine(region.FirstIndex, region.LastIndex, x[region.FirstIndex], x[region.LastIndex], region.Slope, region.Intercept);

    /// <summary>Runs one part; an argument the part rejects (a record too short for it) becomes the reason instead of an exception.</summary>
    private static (T? Value, string Reason) Attempt<T>(Func<T> part)
        where T : class
    {
        try
        {
            return (part(), "");
        }
        catch (ArgumentException exception)
        {
            return (null, exception.Message);
        }
    }
}
