using Microsoft.Extensions.Time.Testing;
using Patchproof.Core.Reports;

namespace Patchproof.Core.Tests.Reports;

public sealed class BoardFitOptionsTests
{
    private static readonly FakeTimeProvider Clock = new(new DateTimeOffset(2026, 12, 1, 12, 0, 0, TimeSpan.Zero));

    [Fact]
    public void Progress_OfAFit_GoesThroughEveryStageInOrderAndEndsAtOne()
    {
        var design = SyntheticBoardCapture.LoadDesign("qh-d2-dunlin.json");
        var capture = SyntheticBoardCapture.Simulate(design, seed: 21, problemUnits: 8);
        var reports = new List<BoardFitProgress>();

        var report = BoardFitter.Fit(design, capture, new BoardFitOptions { Progress = new ImmediateProgress<BoardFitProgress>(reports.Add) }, Clock).Value;

        Assert.Equal(["capture checks", "starting values", "multiple shooting"], reports.Take(3).Select(r => r.Stage));
        var iterations = reports.Where(r => r.Stage.StartsWith("multiple shooting, iteration", StringComparison.Ordinal)).ToList();
        Assert.Equal(report.Quality.Iterations, iterations.Count);
        var parts = reports.Where(r => r.Stage.StartsWith("comparing the capture with the designs: ", StringComparison.Ordinal)).ToList();
        Assert.Equal(12, parts.Count);
        Assert.Equal(["part diagnosis", "comparing the capture with the designs", "done"], reports.Where(r => !parts.Contains(r)).TakeLast(3).Select(r => r.Stage));
        Assert.Equal(reports[^13..^1], parts);
        Assert.True(reports.Zip(reports.Skip(1)).All(pair => pair.Second.Fraction >= pair.First.Fraction), "progress never goes back");
        Assert.Equal(1.0, reports[^1].Fraction);
    }

    [Fact]
    public void Cancellation_DuringMultipleShooting_StopsTheFit()
    {
        var design = SyntheticBoardCapture.LoadDesign("qh-d2-dunlin.json");
        var capture = SyntheticBoardCapture.Simulate(design, seed: 22, problemUnits: 8);
        using var cancellation = new CancellationTokenSource();
        var stages = new List<string>();
        var options = new BoardFitOptions
        {
            Cancellation = cancellation.Token,
            Progress = new ImmediateProgress<BoardFitProgress>(p =>
            {
                stages.Add(p.Stage);
                if (p.Stage.StartsWith("multiple shooting, iteration 1 ", StringComparison.Ordinal))
                {
                    cancellation.Cancel();
                }
            }),
        };

        Assert.Throws<OperationCanceledException>(() => BoardFitter.Fit(design, capture, options, Clock));
        Assert.DoesNotContain("part diagnosis", stages);
    }

    private sealed class ImmediateProgress<T>(Action<T> onReport) : IProgress<T>
    {
        public void Report(T value) => onReport(value);
    }
}
