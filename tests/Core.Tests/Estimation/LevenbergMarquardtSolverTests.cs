using Patchproof.Core.Estimation;

namespace Patchproof.Core.Tests.Estimation;

public sealed class LevenbergMarquardtSolverTests
{
    // Rosenbrock's function as a least-squares problem: r1 = 10 (p2 - p1^2), r2 = 1 - p1, start (-1.2, 1), minimum
    // (1, 1) with S = 0 (J. J. More, B. S. Garbow, K. E. Hillstrom, Testing unconstrained optimization software,
    // ACM TOMS 7 (1981) 17-41, problem 1).
    private static readonly NonlinearLeastSquaresProblem Rosenbrock = new(2, 2, (p, r) =>
    {
        r[0] = 10 * (p[1] - (p[0] * p[0]));
        r[1] = 1 - p[0];
    });

    [Fact]
    public void Minimize_WithProgress_ReportsEveryIterationInOrderWithFallingCost()
    {
        var reports = new List<LevenbergMarquardtIteration>();
        var options = new LevenbergMarquardtOptions { Progress = new ImmediateProgress<LevenbergMarquardtIteration>(reports.Add) };

        var result = new LevenbergMarquardtFitter(options).Fit(Rosenbrock, [-1.2, 1]);

        Assert.True(result.IsConverged, result.ExitReason.ToString());
        Assert.Equal(1, result.Parameters[0], 6);
        Assert.Equal(Enumerable.Range(0, result.Iterations), reports.Select(r => r.Iteration));
        Assert.All(reports, r => Assert.Equal(options.MaxIterations, r.MaxIterations));
        Assert.Equal(24.2, reports[0].Cost, 10); // S at the start: 10^2 (1 - 1.44)^2 + 2.2^2 = 19.36 + 4.84
        Assert.True(reports.Zip(reports.Skip(1)).All(pair => pair.Second.Cost <= pair.First.Cost), "the accepted cost never rises");
    }

    [Fact]
    public void Minimize_CancelledMidway_StopsBeforeTheNextIteration()
    {
        using var cancellation = new CancellationTokenSource();
        var seen = 0;
        var options = new LevenbergMarquardtOptions
        {
            Cancellation = cancellation.Token,
            Progress = new ImmediateProgress<LevenbergMarquardtIteration>(r =>
            {
                seen = r.Iteration + 1;
                if (r.Iteration == 2)
                {
                    cancellation.Cancel();
                }
            }),
        };

        Assert.Throws<OperationCanceledException>(() => new LevenbergMarquardtFitter(options).Fit(Rosenbrock, [-1.2, 1]));
        Assert.Equal(3, seen);
    }

    /// <summary>Hands each report to a callback on the reporting thread (unlike <see cref="Progress{T}"/>, which posts).</summary>
    private sealed class ImmediateProgress<T>(Action<T> onReport) : IProgress<T>
    {
        public void Report(T value) => onReport(value);
    }
}
