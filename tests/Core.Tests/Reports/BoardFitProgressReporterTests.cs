using Patchproof.Core.Estimation;
using Patchproof.Core.Reports;

namespace Patchproof.Core.Tests.Reports;

public sealed class BoardFitProgressReporterTests
{
    [Fact]
    public void Iterations_CountStartsAgainAfterARestart_FractionNeverDecreases()
    {
        // A restarted solver counts from 0 again against the iterations it has left: 0..9 of 20, then 0..4 of 10.
        var seen = new List<BoardFitProgress>();
        var reporter = new BoardFitProgressReporter(new Recorder(seen), CancellationToken.None, compares: true);

        reporter.Stage(BoardFitProgressReporter.ShootingStart, "multiple shooting");
        for (var i = 0; i < 10; i++)
        {
            reporter.Iterations!.Report(new LevenbergMarquardtIteration(i, 20, 1.0 / (i + 1)));
        }

        var beforeRestart = seen[^1].Fraction;
        for (var i = 0; i < 5; i++)
        {
            reporter.Iterations!.Report(new LevenbergMarquardtIteration(i, 10, 0.05));
        }

        AssertNeverDecreases(seen);
        Assert.Equal(beforeRestart, seen[^1].Fraction);
        Assert.InRange(beforeRestart, 0.1 + (0.75 * 9 / 20) - 1e-12, 0.1 + (0.75 * 9 / 20) + 1e-12);
    }

    [Fact]
    public void Stages_WholeFitWithComparison_RiseFromZeroToOneAndNameTheComparisonParts()
    {
        var seen = new List<BoardFitProgress>();
        var reporter = new BoardFitProgressReporter(new Recorder(seen), CancellationToken.None, compares: true);

        reporter.Stage(0, "capture checks");
        reporter.Stage(0.05, "starting values");
        reporter.Stage(BoardFitProgressReporter.ShootingStart, "multiple shooting");
        reporter.Iterations!.Report(new LevenbergMarquardtIteration(59, 60, 1));
        reporter.Stage(reporter.Checks, "structure and mapping checks");
        reporter.Stage(reporter.Diagnosis, "part diagnosis");
        reporter.ComparisonStarts();
        reporter.Comparison!.Report(new FitComparisonProgress(0.3, "correlation dimension of the capture done (1 of 12 parts)"));
        reporter.Comparison.Report(new FitComparisonProgress(1, "power spectra done (12 of 12 parts)"));
        reporter.Stage(1, "done");

        AssertNeverDecreases(seen);
        Assert.Equal(0, seen[0].Fraction);
        Assert.Equal(1, seen[^1].Fraction);
        Assert.True(seen.Single(p => p.Stage == "part diagnosis").Fraction < BoardFitProgressReporter.ComparisonStart);
        Assert.Equal(BoardFitProgressReporter.ComparisonStart + (0.3 * 0.09), seen[7].Fraction, 12);
        Assert.Equal("comparing the capture with the designs: correlation dimension of the capture done (1 of 12 parts)", seen[7].Stage);
        Assert.Equal(BoardFitProgressReporter.ComparisonEnd, seen[8].Fraction, 12);
    }

    [Fact]
    public void Stages_WithoutComparison_ShootingKeepsTheBarTo0Point95()
    {
        var reporter = new BoardFitProgressReporter(null, CancellationToken.None, compares: false);

        Assert.Equal(0.95, reporter.ShootingEnd);
        Assert.True(reporter.Checks < reporter.Diagnosis && reporter.Diagnosis < 1);
        Assert.Null(reporter.Iterations);
        Assert.Null(reporter.Comparison);
    }

    [Fact]
    public void Stage_Cancelled_ThrowsBeforeReporting()
    {
        var seen = new List<BoardFitProgress>();
        var reporter = new BoardFitProgressReporter(new Recorder(seen), new CancellationToken(true), compares: true);

        Assert.Throws<OperationCanceledException>(() => reporter.Stage(0.05, "starting values"));
        Assert.Empty(seen);
    }

    private static void AssertNeverDecreases(List<BoardFitProgress> seen)
    {
        for (var i = 1; i < seen.Count; i++)
        {
            Assert.True(seen[i].Fraction >= seen[i - 1].Fraction, $"report {i} ({seen[i].Stage}) fell from {seen[i - 1].Fraction} to {seen[i].Fraction}");
        }
    }

    /// <summary>Keeps every report, synchronously (Progress&lt;T&gt; would post them to the thread pool).</summary>
    private sealed class Recorder(List<BoardFitProgress> seen) : IProgress<BoardFitProgress>
    {
        public void Report(BoardFitProgress value) => seen.Add(value);
    }
}
