using Microsoft.Extensions.Time.Testing;
using Patchproof.Core.Circuits;
using Patchproof.Core.Dynamics;
using Patchproof.Core.Reports;

namespace Patchproof.Core.Tests.Reports;

/// <summary>Fits shared by the comparison tests: each fit takes seconds, so each board is fitted once.</summary>
public sealed class ComparedBoards
{
    private static readonly FakeTimeProvider Clock = new(new DateTimeOffset(2026, 12, 1, 12, 0, 0, TimeSpan.Zero));

    public ComparedBoards()
    {
        Design = SyntheticBoardCapture.LoadDesign("qh-l3-wren.json");
        // 50 problem time units at 500 samples a unit: 25,001 samples, more than one trace may carry.
        HealthyCapture = SyntheticBoardCapture.Simulate(Design, seed: 31, problemUnits: 50);
        Healthy = BoardFitter.Fit(Design, HealthyCapture, new BoardFitOptions(), Clock).Value;
        var resistor = Design.Integrators.Single(i => i.Variable == "y").Inputs.Single(input => input.From.TrimStart('-') == "x").ResistorId;
        var drifted = Design.WithPartValues(new Dictionary<string, double> { [resistor] = 1.12 * Design.NominalOf(resistor) });
        Drifted = BoardFitter.Fit(Design, SyntheticBoardCapture.Simulate(drifted, seed: 32, problemUnits: 50), new BoardFitOptions(), Clock).Value;
    }

    public BoardDesign Design { get; }

    public Patchproof.Core.Captures.Capture HealthyCapture { get; }

    public FitReport Healthy { get; }

    public FitReport Drifted { get; }

    public static FakeTimeProvider FixedClock => Clock;
}

public sealed class FitComparisonBuilderTests(ComparedBoards boards) : IClassFixture<ComparedBoards>
{
    [Fact]
    public void Build_CancelledWhenTheFirstPartFinishes_StopsWithOperationCanceledBeforeTheRest()
    {
        using var source = new CancellationTokenSource();
        var seen = new List<FitComparisonProgress>();
        var options = new FitComparisonOptions { Progress = new ComparisonProgressRecorder(source, seen), Cancellation = source.Token };

        Assert.ThrowsAny<OperationCanceledException>(() => FitComparisonBuilder.Build(boards.Design, boards.HealthyCapture, boards.Healthy, options));
        Assert.InRange(seen.Count, 1, 11);
    }

    [Fact]
    public void Build_WithProgress_ReportsEveryPartOnceWithARisingFraction()
    {
        var seen = new List<FitComparisonProgress>();

        var comparison = FitComparisonBuilder.Build(boards.Design, boards.HealthyCapture, boards.Healthy, new FitComparisonOptions { Progress = new ComparisonProgressRecorder(null, seen) });

        Assert.True(comparison.Computed, comparison.Reason);
        Assert.Equal(12, seen.Count);
        Assert.Equal(12, comparison.Timings.Count);
        Assert.Equal(1, seen[^1].Fraction, 12);
        Assert.All(seen.Zip(seen.Skip(1)), pair => Assert.True(pair.Second.Fraction > pair.First.Fraction));
        Assert.Equal(comparison.Timings.Select(t => t.Part + " done").Order(), seen.Select(p => p.Stage[..p.Stage.LastIndexOf(" (", StringComparison.Ordinal)]).Order());
    }

    [Fact]
    public void Fit_SyntheticLorenzBoard_ReportCarriesEveryComparisonMember()
    {
        var comparison = boards.Healthy.Comparison;

        Assert.NotNull(comparison);
        Assert.True(comparison.Computed, comparison.Reason);
        Assert.Equal("", comparison.Reason);
        var overlays = comparison.Overlays!;
        Assert.Equal(3, overlays.TimeSeries.Count);
        Assert.Equal(3, overlays.PhasePlanes.Count);
        Assert.All(overlays.TimeSeries.Concat(overlays.PhasePlanes), panel => Assert.Equal(["capture", "nominal", "fitted"], panel.Traces.Select(t => t.Role)));
        Assert.NotEmpty(overlays.RestartTimesSeconds);
        Assert.InRange(overlays.RestartIntervalLyapunovTimes, 0.49, 0.51);
        Assert.True(comparison.Horizon!.Fitted.Computed && comparison.Horizon.Nominal.Computed);
        Assert.InRange(comparison.Horizon.Fitted.MeanLyapunovTimes, 0.5, 30);
        Assert.Equal(3, comparison.ModelLyapunov!.Fitted.ExponentsPerSecond.Length);
        var fromData = comparison.CaptureLyapunov!;
        Assert.True(fromData.Computed, fromData.Reason);
        Assert.True(fromData.DelaySamples > 0 && fromData.EmbeddingDimension >= 2);
        Assert.NotNull(fromData.Fit);
        Assert.True(comparison.CorrelationDimension!.Capture.Computed && comparison.CorrelationDimension.Fitted.Computed);
        Assert.NotNull(comparison.CorrelationDimension.Capture.Fit);
        Assert.True(comparison.ReturnMap!.Computed, comparison.ReturnMap.Reason);
        Assert.Equal("z", comparison.ReturnMap.Variable);
        Assert.True(comparison.Lobes!.Computed, comparison.Lobes.Reason);
        Assert.Equal("x", comparison.Lobes.Variable);
        Assert.Equal(3, comparison.Occupancy!.Planes.Count);
        Assert.All(comparison.Occupancy.Planes, plane => Assert.Equal(64, plane.Difference.Length));
        Assert.Equal(3, comparison.Spectra.Count);
        Assert.All(comparison.Spectra, spectrum => Assert.True(spectrum.Computed && spectrum.Fitted.Length == spectrum.Capture.Length));
        Assert.All(comparison.Invariants, line => Assert.False(string.IsNullOrEmpty(line.Name)));
    }

    [Fact]
    public void Fit_CaptureLongerThanThePointBudget_NoTraceExceedsTwentyThousandPoints()
    {
        var overlays = boards.Healthy.Comparison!.Overlays!;
        Assert.True(boards.HealthyCapture.SampleCount > TraceDecimation.DefaultPointBudget);

        var traces = overlays.TimeSeries.Concat(overlays.PhasePlanes).SelectMany(panel => panel.Traces).ToList();

        Assert.All(traces, trace => Assert.InRange(trace.X.Length, 2, 20_000));
        Assert.All(traces, trace => Assert.Equal(trace.X.Length, trace.Y.Length));
    }

    [Fact]
    public void Fit_NominalLorenzBoard_ModelExponentInProblemUnitsMatchesSprott()
    {
        // Sprott, Common Chaotic Systems (1998/2004): Lorenz (10, 28, 8/3) lambda_1 = 0.9056; tolerance 0.02 (CHECKS.md).
        var nominal = boards.Healthy.Comparison!.ModelLyapunov!.Nominal;

        Assert.True(nominal.Computed, nominal.Reason);
        Assert.InRange(nominal.LargestPerProblemUnit, 0.9056 - 0.02, 0.9056 + 0.02);
        Assert.InRange(nominal.LargestPerSecond * boards.Design.TimeScaleSeconds, 0.9056 - 0.02, 0.9056 + 0.02);
        // The exponents of a flow sum to the mean divergence, -(sigma + 1 + beta) = -13.66667 for Lorenz (derived).
        Assert.InRange(nominal.ExponentsPerProblemUnit.Sum(), -13.66667 - 0.01, -13.66667 + 0.01);
    }

    [Fact]
    public void Fit_HealthyAgainstDriftedBoard_HealthyFitIsCloserInOccupancy()
    {
        var healthy = boards.Healthy.Comparison!.Occupancy!.Planes.Average(plane => plane.FittedDistance);
        var drifted = boards.Drifted.Comparison!.Occupancy!.Planes.Average(plane => plane.NominalDistance);

        Assert.True(healthy < drifted, $"healthy capture against fitted {healthy:0.000}, drifted capture against nominal {drifted:0.000}");
    }

    [Fact]
    public void Fit_HealthyAgainstDriftedBoard_FittedHealthyDesignFollowsLongerThanNominalAgainstDrift()
    {
        var healthy = boards.Healthy.Comparison!.Horizon!.Fitted;
        var drifted = boards.Drifted.Comparison!.Horizon!.Nominal;

        Assert.True(healthy.MeanSeconds > 2 * drifted.MeanSeconds, $"healthy fitted {healthy.MeanSeconds} s, drifted against nominal {drifted.MeanSeconds} s");
    }

    [Fact]
    public void Json_Comparison_RoundTripsUnchanged()
    {
        var json = FitReportJson.Write(boards.Healthy);

        var read = FitReportJson.ReadComparison(json);

        Assert.True(read.Success, read.Errors.Count > 0 ? read.Errors[0].Message : "");
        var again = FitReportJson.Write(boards.Healthy with { Comparison = read.Value });
        Assert.Equal(json, again);
        using var document = System.Text.Json.JsonDocument.Parse(json);
        Assert.True(document.RootElement.GetProperty("comparison").GetProperty("overlays").GetProperty("timeSeries").GetArrayLength() == 3);
    }

    [Fact]
    public void Fit_TwoChannelsOfAThreeStateBoard_HiddenVariableOnlyInModelTraces()
    {
        var capture = SyntheticBoardCapture.Simulate(boards.Design, seed: 33, problemUnits: 20, recorded: [0, 2]);

        var comparison = BoardFitter.Fit(boards.Design, capture, new BoardFitOptions
        {
            Mapping = [new ChannelAssignment("CH1", "x", 1), new ChannelAssignment("CH3", "z", 1)],
        }, ComparedBoards.FixedClock).Value.Comparison!;

        var y = comparison.Overlays!.TimeSeries.Single(panel => panel.Title.StartsWith("y ", StringComparison.Ordinal));
        Assert.Equal(["nominal", "fitted"], y.Traces.Select(t => t.Role));
        Assert.All(comparison.Overlays.PhasePlanes.Where(panel => panel.Title.Contains('y')), panel => Assert.DoesNotContain(panel.Traces, t => t.Role == "capture"));
        Assert.Equal(["x", "z"], comparison.Horizon!.ScoredVariables);
        Assert.Single(comparison.Occupancy!.Planes);
        Assert.Equal(2, comparison.Spectra.Count);
        Assert.Single(comparison.Settings!.HiddenVariables);
    }

    [Fact]
    public void Build_TooShortRecord_SaysWhyInsteadOfThrowing()
    {
        var capture = SyntheticBoardCapture.Simulate(boards.Design, seed: 34, problemUnits: 0.3);

        var comparison = FitComparisonBuilder.Build(boards.Design, capture, boards.Healthy);

        Assert.True(comparison.Computed);
        Assert.False(comparison.CaptureLyapunov!.Computed);
        Assert.False(string.IsNullOrEmpty(comparison.CaptureLyapunov.Reason));
        Assert.Contains("exponent from the capture", comparison.Reason, StringComparison.Ordinal);
    }

    [Fact]
    public void Fit_ComparisonSwitchedOff_ReportHasNone()
    {
        var capture = SyntheticBoardCapture.Simulate(boards.Design, seed: 35, problemUnits: 6);

        var report = BoardFitter.Fit(boards.Design, capture, new BoardFitOptions { CompareInvariants = false }, ComparedBoards.FixedClock).Value;

        Assert.Null(report.Comparison);
    }
}

/// <summary>Keeps every report; cancels the source, when one is given, at the first.</summary>
internal sealed class ComparisonProgressRecorder(CancellationTokenSource? source, List<FitComparisonProgress> seen) : IProgress<FitComparisonProgress>
{
    public void Report(FitComparisonProgress value)
    {
        seen.Add(value);
        source?.Cancel();
    }
}
